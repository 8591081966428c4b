package scan

import (
	"bytes"
	"encoding/json"
	"math"
	"strconv"

	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
	"ricochet/observables/scenario"
)

// Float is a float64 whose JSON form round-trips exactly (shortest
// decimal) and carries NaN and ±Inf as the strings "NaN", "+Inf", "-Inf".
type Float float64

// MarshalJSON implements json.Marshaler.
func (x Float) MarshalJSON() ([]byte, error) {
	f := float64(x)
	switch {
	case math.IsNaN(f):
		return []byte(`"NaN"`), nil
	case math.IsInf(f, 1):
		return []byte(`"+Inf"`), nil
	case math.IsInf(f, -1):
		return []byte(`"-Inf"`), nil
	}
	return strconv.AppendFloat(nil, f, 'g', -1, 64), nil
}

// UnmarshalJSON implements json.Unmarshaler.
func (x *Float) UnmarshalJSON(b []byte) error {
	s := string(bytes.Trim(b, `"`))
	f, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return err
	}
	*x = Float(f)
	return nil
}

// Vec4 is a four-vector whose components have the JSON form of Float.
type Vec4 vec.Vec4

// MarshalJSON implements json.Marshaler.
func (v Vec4) MarshalJSON() ([]byte, error) {
	return json.Marshal([4]Float{Float(v[0]), Float(v[1]), Float(v[2]), Float(v[3])})
}

// UnmarshalJSON implements json.Unmarshaler.
func (v *Vec4) UnmarshalJSON(b []byte) error {
	var n [4]Float
	if err := json.Unmarshal(b, &n); err != nil {
		return err
	}
	*v = Vec4{float64(n[0]), float64(n[1]), float64(n[2]), float64(n[3])}
	return nil
}

// Record is everything computed at one point of a scan, in the library's
// own conventions (Gaussian units, covariant b, contravariant components in
// the source frame): observables and output conventions are applied when a
// Result is made (Analyze), so a recorded scan serves any of them.
type Record struct {
	Index int `json:"i"` // global job index (Plan)
	// Hash is the hash of the scan the record belongs to (Plan.Hash).
	Hash string `json:"hash,omitempty"`
	// Model names the completion of a spread scan (empty otherwise).
	Model string `json:"model,omitempty"`
	// Params are the values of the parameter axes (Plan.Params).
	Params []Float `json:"params,omitempty"`
	Eps    Float   `json:"eps"` // |ε| of the grid (Gaussian, covariant b)
	// Status is the outcome (integrate.Status), or "failed" when the
	// event could not be built or integrated, with the reason in Error.
	Status string `json:"status"`
	Error  string `json:"error,omitempty"`
	// Asymptotic data and results.
	PIn         Vec4 `json:"p_in"`
	AIn         Vec4 `json:"a_in"`
	B           Vec4 `json:"b"`
	POut        Vec4 `json:"p_out"`
	AOut        Vec4 `json:"a_out"`
	Impulse     Vec4 `json:"dp"`
	ImpulseErr  Vec4 `json:"dp_err"`
	SpinKick    Vec4 `json:"da"`
	SpinKickErr Vec4 `json:"da_err"`
	// ImpulseErrIso and SpinKickErrIso: the parts of the spatial bars
	// that bound the norm of the error (integrate.Outcome.ImpulseErrIso).
	ImpulseErrIso  Float   `json:"dp_err_iso"`
	SpinKickErrIso Float   `json:"da_err_iso"`
	FirstDp        [3]Vec4 `json:"dp1"` // first order at the covariant b, b_J, b_eik
	FirstDa        [3]Vec4 `json:"da1"`
	BJ             Float   `json:"b_j"`
	BEik           Float   `json:"b_eik"`
	TolErr         Float   `json:"err_tol"`
	TruncErr       Float   `json:"err_truncation"`
	Drift          Float   `json:"drift"`
	Evals          int     `json:"evals"`
	Radius         Float   `json:"radius"`
	// Second is the second-order prediction at the covariant b
	// (integrate.SecondOrder), nil when the model has none.
	Second *SecondRecord `json:"second,omitempty"`
}

// SecondRecord is the second-order impulse and spin kick of a point (the
// terms of order ε², to be added to the first order) with their error
// estimates and cost.
type SecondRecord struct {
	Dp    Vec4 `json:"dp2"`
	DpErr Vec4 `json:"dp2_err"`
	Da    Vec4 `json:"da2"`
	DaErr Vec4 `json:"da2_err"`
	Evals int  `json:"evals"`
}

// StatusFailed is the status of a record whose event could not be built or
// integrated (Record.Error says why).
const StatusFailed = "failed"

// RunPoint integrates point i of a scan, the scenario s already at the
// coupling eps (s.WithEpsilon(eps)), with the scenario's own model
// (member < 0) or the given member of the root-Kerr family
// (scenario.FamilyNames). A failure to build or integrate the event is
// recorded as StatusFailed with its reason, never returned as numbers. The
// record's Hash and Params are left to the caller (Plan.Point).
func RunPoint(s *scenario.Scenario, i int, eps float64, member int) Record {
	r := Record{Index: i, Eps: Float(eps)}
	ev, err := s.BuildMember(member)
	if err != nil {
		r.Status, r.Error = StatusFailed, err.Error()
		return r
	}
	if member >= 0 {
		r.Model = ev.Model.Name()
	}
	r.PIn, r.AIn, r.B = Vec4(ev.In.P), Vec4(ev.In.A), Vec4(ev.In.B)
	out, err := integrate.Scatter(ev.Model, ev.In, s.Settings())
	if err != nil {
		r.Status, r.Error = StatusFailed, err.Error()
		return r
	}
	r.Status = out.Status.String()
	r.Evals = out.Evals
	if out.Status != integrate.StatusScattered {
		return r
	}
	r.POut, r.AOut = Vec4(out.POut), Vec4(out.AOut)
	r.Impulse, r.ImpulseErr = Vec4(out.Impulse), Vec4(out.ImpulseErr)
	r.SpinKick, r.SpinKickErr = Vec4(out.SpinKick), Vec4(out.SpinKickErr)
	r.ImpulseErrIso, r.SpinKickErrIso = Float(out.ImpulseErrIso), Float(out.SpinKickErrIso)
	r.TolErr, r.TruncErr, r.Radius = Float(out.TolErr), Float(out.TruncErr), Float(out.Radius)
	bcov := ev.In.B.Spatial().Norm()
	r.BJ = Float(observables.ImpactParameterJ(ev.In.P, ev.In.B))
	r.BEik = Float(observables.EikonalImpactParameter(ev.In.P, out.POut, ev.In.B))
	// The first-order prediction at each impact-parameter definition: the
	// same formula with b rescaled to b_def (spins and charges fixed).
	for k, bd := range []float64{bcov, float64(r.BJ), float64(r.BEik)} {
		e := ev
		e.In.B = ev.In.B.Scale(bd / bcov)
		dp, da, _ := e.FirstOrder(s)
		r.FirstDp[k], r.FirstDa[k] = Vec4(dp), Vec4(da)
	}
	if so, err := integrate.SecondOrder(ev.Model, ev.In, nil); err == nil && so.Status == integrate.StatusScattered {
		r.Second = &SecondRecord{Dp: Vec4(so.Impulse2), DpErr: Vec4(so.Impulse2Err), Da: Vec4(so.SpinKick2), DaErr: Vec4(so.SpinKick2Err), Evals: so.Evals}
	}
	d := out.Drift
	drift := math.Max(math.Max(d.MassShell, d.SpinOrth), d.SpinNorm)
	if d.EnergyExact {
		drift = math.Max(drift, d.Energy)
	}
	if !math.IsNaN(d.AngularMomentumZ) {
		drift = math.Max(drift, d.AngularMomentumZ)
	}
	r.Drift = Float(drift)
	return r
}
