package scan

import (
	"fmt"
	"math"
	"strings"

	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
	"ricochet/observables/convention"
	"ricochet/observables/scenario"
)

// Observable is one column of a scan: a frame component of the impulse
// Δp or the spin kick Δa, or a component of the spin-tensor kick ΔS.
// Frame indices: 0 = t, 1 = l (incoming direction), 2 = b (impact
// direction), 3 = n = l × b.
type Observable struct {
	Name   string // as printed, e.g. "dp_b", "da_n", "dS_lb"
	Spin   bool   // a spin kick (Δa or ΔS) rather than the impulse
	Tensor bool   // a spin-tensor component ΔS^{IJ} (needs Spin)
	I, J   int    // frame indices (J for Tensor only)
}

// Point is one row of a series, in the chosen output conventions.
type Point struct {
	Eps      float64 `json:"eps"`
	Status   string  `json:"status"`
	Numeric  float64 `json:"numeric"`
	First    float64 `json:"first_order"`
	Residual float64 `json:"residual"`
	Ratio    float64 `json:"residual_over_eps2"`
	Err      float64 `json:"error"`
	TolErr   float64 `json:"error_tolerance"`
	TruncErr float64 `json:"error_truncation"`
	Drift    float64 `json:"max_drift"`
	Evals    int     `json:"rhs_evaluations"`
	// Second is the prediction through second order (first + second,
	// integrate.SecondOrder) with its error SecondErr, and Residual2 =
	// Numeric − Second; NaN when the model has no second order or the
	// impact parameter is not the covariant one (the conversion to b_J or
	// the eikonal b changes the second order).
	Second    float64 `json:"second_order"`
	SecondErr float64 `json:"second_order_error"`
	Residual2 float64 `json:"residual_after_second"`
}

// OK reports whether the point scattered (and so carries numbers; its
// first order, residuals and second order are NaN where the first-order
// formula does not apply, scenario.Event.FirstOrderApplies).
func (p Point) OK() bool { return p.Status == integrate.StatusScattered.String() }

// Sigma is the fit weight of a row, a standard error: the numerical error
// bar (a bound, see integrate.Outcome.ImpulseErr) over
// integrate.BoundSigmas, with a floor of one unit in the last place of the
// numeric value to keep it positive (rounding of the result itself).
func (p Point) Sigma() float64 {
	sig := math.Max(p.Err/integrate.BoundSigmas, 2.2e-16*math.Abs(p.Numeric))
	if !(sig > 0) {
		sig = 1e-300
	}
	return sig
}

// Derive reads one observable off a record in the conventions conv.
func Derive(s *scenario.Scenario, r Record, o Observable, conv convention.Set) Point {
	// Numbers that an outcome does not give stay NaN (null in JSON,
	// empty in CSV), never zero.
	nan := math.NaN()
	p := Point{Status: r.Status, Evals: r.Evals,
		Numeric: nan, First: nan, Residual: nan, Ratio: nan, Err: nan, TolErr: nan, TruncErr: nan,
		Drift: nan, Second: nan, SecondErr: nan, Residual2: nan}
	if r.Status == StatusFailed {
		p.Status = r.Error
	}
	bcov := vec.Vec4(r.B).Spatial().Norm()
	bdef := [3]float64{bcov, float64(r.BJ), float64(r.BEik)}[conv.Impact]
	if !(bdef > 0) {
		bdef = bcov
	}
	p.Eps = conv.Units.Coupling(float64(r.Eps)*bcov/bdef, s.Electromagnetic())
	if r.Status != integrate.StatusScattered.String() {
		return p
	}
	fr := observables.NewFrame(vec.Vec4(r.PIn), vec.Vec4(r.B))
	k := int(conv.Impact)
	frameVec := func(v Vec4) vec.Vec4 { return vec.Vec4(fr.Components(vec.Vec4(v))) }
	switch {
	case o.Tensor:
		// Frame components of S^{μν} = ε^{μνρσ}p_ρ a_σ (the frame is
		// orthonormal and right-handed, so S is built from the frame
		// components of p and a); the first order is the linear part
		// S(Δp₁, a_in) + S(p_in, Δa₁); the error is the linear propagation
		// of the error bars of p_out and a_out.
		pin, ain := frameVec(r.PIn), frameVec(r.AIn)
		pout, aout := frameVec(r.POut), frameVec(r.AOut)
		kick := convention.TensorDiff(convention.SpinTensor(pout, aout), convention.SpinTensor(pin, ain))
		first := convention.SpinTensorKick1(pin, ain, frameVec(r.FirstDp[k]), frameVec(r.FirstDa[k]))
		p.Numeric, p.First = kick[o.I][o.J], first[o.I][o.J]
		p.Err = convention.SpinTensorErr(pout, aout, fr.Err(vec.Vec4(r.ImpulseErr), float64(r.ImpulseErrIso)), fr.Err(vec.Vec4(r.SpinKickErr), float64(r.SpinKickErrIso)))[o.I][o.J]
	case o.Spin:
		p.Numeric = fr.Components(vec.Vec4(r.SpinKick))[o.I]
		p.First = fr.Components(vec.Vec4(r.FirstDa[k]))[o.I]
		p.Err = fr.Err(vec.Vec4(r.SpinKickErr), float64(r.SpinKickErrIso))[o.I]
	default:
		p.Numeric = fr.Components(vec.Vec4(r.Impulse))[o.I]
		p.First = fr.Components(vec.Vec4(r.FirstDp[k]))[o.I]
		p.Err = fr.Err(vec.Vec4(r.ImpulseErr), float64(r.ImpulseErrIso))[o.I]
	}
	p.Residual = p.Numeric - p.First
	p.Ratio = p.Residual / (p.Eps * p.Eps)
	p.Second, p.SecondErr, p.Residual2 = secondOrder(r, o, conv, fr, p.First)
	p.TolErr, p.TruncErr, p.Drift = float64(r.TolErr), float64(r.TruncErr), float64(r.Drift)
	return p
}

// secondOrder returns the prediction through second order of one
// observable, its error and the residual after it (NaN without a second
// order or at a non-covariant impact parameter). For the spin-tensor
// kick the second order of S = ε p a is S(Δp₂, a) + S(p, Δa₂) + S(Δp₁, Δa₁).
func secondOrder(r Record, o Observable, conv convention.Set, fr observables.Frame, first float64) (second, sigma, res2 float64) {
	nan := math.NaN()
	if r.Second == nil || conv.Impact != convention.Covariant {
		return nan, nan, nan
	}
	sec := r.Second
	frameVec := func(v Vec4) vec.Vec4 { return vec.Vec4(fr.Components(vec.Vec4(v))) }
	var d2, e2, num float64
	switch {
	case o.Tensor:
		pin, ain := frameVec(r.PIn), frameVec(r.AIn)
		t := convention.SpinTensorKick1(pin, ain, frameVec(sec.Dp), frameVec(sec.Da))
		c := convention.SpinTensor(frameVec(r.FirstDp[0]), frameVec(r.FirstDa[0]))
		d2 = t[o.I][o.J] + c[o.I][o.J]
		e2 = convention.SpinTensorErr(pin, ain, fr.Err(vec.Vec4(sec.DpErr), 0), fr.Err(vec.Vec4(sec.DaErr), 0))[o.I][o.J]
		pout, aout := frameVec(r.POut), frameVec(r.AOut)
		num = convention.TensorDiff(convention.SpinTensor(pout, aout), convention.SpinTensor(pin, ain))[o.I][o.J]
	case o.Spin:
		d2 = fr.Components(vec.Vec4(sec.Da))[o.I]
		e2 = fr.Err(vec.Vec4(sec.DaErr), 0)[o.I]
		num = fr.Components(vec.Vec4(r.SpinKick))[o.I]
	default:
		d2 = fr.Components(vec.Vec4(sec.Dp))[o.I]
		e2 = fr.Err(vec.Vec4(sec.DpErr), 0)[o.I]
		num = fr.Components(vec.Vec4(r.Impulse))[o.I]
	}
	second = first + d2
	return second, e2, num - second
}

// Series is one column group of a scan: one model and one observable over
// the coupling grid, at one combination of the parameter axes (Params, in
// the order of Result.Axes; none for a plain coupling scan). A scan result
// is a list of series so that further models, observables or slices add
// columns without changing the writers.
type Series struct {
	Model      string    `json:"model"`
	Observable string    `json:"observable"`
	Params     []float64 `json:"params,omitempty"`
	Points     []Point   `json:"points"`
	Fits       Fits      `json:"fits"`
	// Scenario is the scenario of the series' slice.
	Scenario *scenario.Scenario `json:"-"`
}

// Result is a complete scan in the chosen output conventions.
type Result struct {
	Scenario *scenario.Scenario
	Given    string // the scenario as given (TOML text)
	Conv     convention.Set
	// Axes names the parameter axes of a multi-parameter scan, in the
	// order of Series.Params.
	Axes   []string
	Series []Series
	// Expect is the formula the next-order coefficient is compared with
	// (Options.Expect).
	Expect *Formula
	// Spread summarises a spread scan, one entry per observable (and
	// slice).
	Spread []SpreadSummary
	// Warnings are one-line warnings about the scan as a whole, such as a
	// background that is super-extremal at some of its points
	// (scenario.Scenario.ScanWarning), one per slice that has one.
	Warnings []string
}

// Options chooses what Analyze makes of the records of a scan.
type Options struct {
	Observables []Observable
	// Conv is the set of output conventions; the zero value is the
	// library's own.
	Conv convention.Set
	// Fit configures the fits of every series.
	Fit FitSettings
	// Members are the models of a spread scan, as given to Run (nil: the
	// scenario's own model).
	Members []string
	// Expect, if set, is a formula for the next-order coefficient of
	// every series, compared with the fits by Trends.
	Expect *Formula
}

// Analyze turns the records of a whole scan (in job order, as Run or
// Merge return them) into series per observable, slice and model, in that
// order of nesting, each with its fits, and for a spread scan the spread
// of each observable's next-order coefficient per slice. Records are
// matched to points by their index, so a record list with gaps leaves
// the missing points with an empty status.
func Analyze(s *scenario.Scenario, given string, recs []Record, opt *Options) Result {
	if opt == nil {
		opt = &Options{}
	}
	res := Result{Scenario: s, Given: given, Conv: opt.Conv, Expect: opt.Expect}
	p, err := NewPlan(s, opt.Members, "")
	if err != nil {
		return res
	}
	for _, a := range p.Axes {
		res.Axes = append(res.Axes, a.Param)
	}
	models := opt.Members
	if len(models) == 0 {
		model := s.Probe.Kind
		if ev, err := s.Build(); err == nil {
			model = ev.Model.Name()
		}
		models = []string{model}
	}
	byIndex := make(map[int]Record, len(recs))
	for _, r := range recs {
		byIndex[r.Index] = r
	}
	ne, ns := len(p.Eps), p.Slices()
	for sl := range ns {
		if w := p.Slice(sl).ScanWarning(); w != "" {
			if len(res.Axes) > 0 {
				w = "slice " + describeParams(res.Axes, p.Params(sl)) + ": " + w
			}
			res.Warnings = append(res.Warnings, w)
		}
	}
	for _, o := range opt.Observables {
		for sl := range ns {
			sc := p.Slice(sl)
			var group []Series
			for k, model := range models {
				sr := Series{Model: model, Observable: o.Name, Params: p.Params(sl), Scenario: sc}
				for e := range ne {
					r, ok := byIndex[(k*ns+sl)*ne+e]
					if !ok {
						r = Record{Index: (k*ns+sl)*ne + e, Eps: Float(p.Eps[e])}
					}
					sr.Points = append(sr.Points, Derive(sc, r, o, opt.Conv))
				}
				fs := opt.Fit
				fs.DirectVaries = sc.Scan.Hold == "a_over_m" && sc.Background.Spin[2] != 0
				sr.Fits = Fit(sr.Points, &fs)
				group = append(group, sr)
			}
			res.Series = append(res.Series, group...)
			if len(opt.Members) > 0 {
				sum := spreadOf(o.Name, group)
				sum.Params = p.Params(sl)
				res.Spread = append(res.Spread, sum)
			}
		}
	}
	return res
}

// describeParams names a slice of a multi-parameter scan.
func describeParams(axes []string, vals []float64) string {
	var b strings.Builder
	for k, a := range axes {
		if k > 0 {
			b.WriteString(", ")
		}
		fmt.Fprintf(&b, "%s = %g", a, vals[k])
	}
	return b.String()
}
