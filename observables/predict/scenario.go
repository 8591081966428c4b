package predict

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"

	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
	"ricochet/observables/convention"
	"ricochet/observables/scan"
	"ricochet/observables/scenario"
)

// Spec is a compiled [prediction] table (scenario.PredictionSpec): the
// conventions, the formulas and the table of values.
type Spec struct {
	Conventions Conventions
	// Formulas are the predictions given as formulas (Formula set).
	Formulas []Prediction
	// Table is the table of predicted values, nil when none is given.
	Table *Table
}

// Observables lists the predicted observables: the formulas', then the
// table's.
func (sp *Spec) Observables() []Observable {
	var out []Observable
	for _, p := range sp.Formulas {
		out = append(out, p.Observable)
	}
	if sp.Table != nil {
		out = append(out, sp.Table.Observables...)
	}
	return out
}

// CompileSpec parses the conventions and compiles the formulas of a
// [prediction] table; dir is the directory a relative table path is read
// from. Every error is a one-line scenario.InputError naming the field
// (prediction.units, prediction.dp_b, …) and what is allowed; a bad
// formula's error names the column of the fault.
func CompileSpec(p *scenario.PredictionSpec, dir string) (*Spec, error) {
	sp := &Spec{}
	c := &sp.Conventions
	var err error
	if c.Signature, err = convention.ParseSignature(p.Signature); err != nil {
		return nil, scenario.Badf("prediction.signature = %q; allowed: -+++, +---", p.Signature)
	}
	if c.Index, err = ParseIndex(p.Index); err != nil {
		return nil, scenario.Badf("prediction.index = %q; allowed: upper, lower", p.Index)
	}
	if c.Units, err = convention.ParseUnits(p.Units); err != nil {
		return nil, scenario.Badf("prediction.units = %q; allowed: gaussian, heaviside-lorentz", p.Units)
	}
	if c.Impact, err = convention.ParseImpact(p.Impact); err != nil {
		return nil, scenario.Badf("prediction.impact = %q; allowed: covariant, j, eikonal", p.Impact)
	}
	if c.OppositeSpin, err = ParseSpinSense(p.SpinSign); err != nil {
		return nil, scenario.Badf("prediction.spin_sign = %q; allowed: + (a spin along +z is angular momentum along +z) or -", p.SpinSign)
	}
	if c.Body, err = ParseBody(p.Body); err != nil {
		return nil, scenario.Badf("prediction.body = %q; allowed: probe, source", p.Body)
	}
	if c.Order, err = ParseOrder(p.Order); err != nil {
		return nil, scenario.Badf("prediction.order = %q; allowed: first, next", p.Order)
	}
	if p.Signature != "" && c.Index == Upper && c.Signature != convention.MostlyPlus {
		// Contravariant components do not depend on the signature; say so
		// rather than ignore the field silently.
		return nil, scenario.Badf("prediction.signature = %q matters only for covariant components; allowed with index = \"lower\" (or leave it out)", p.Signature)
	}
	names, srcs := p.Formulas()
	for k, name := range names {
		o, _ := ParseObservable(name)
		f, err := Compile("prediction."+name, srcs[k])
		if err != nil {
			return nil, scenario.Badf("%s", strings.TrimPrefix(err.Error(), "predict: "))
		}
		sp.Formulas = append(sp.Formulas, Prediction{Observable: o, Formula: f})
	}
	if p.Table != "" {
		path := p.Table
		if !filepath.IsAbs(path) && dir != "" {
			path = filepath.Join(dir, path)
		}
		f, err := os.Open(path)
		if err != nil {
			return nil, scenario.Badf("prediction.table: %v", err)
		}
		defer f.Close()
		if sp.Table, err = ReadTable(f, p.Table); err != nil {
			return nil, err
		}
	}
	return sp, sp.checkDuplicates()
}

// AddTable adds a table of values to the spec.
func (sp *Spec) AddTable(t *Table) error {
	if sp.Table != nil {
		return scenario.Badf("%s: a second table of values (%s is given already); allowed: one table", t.Origin, sp.Table.Origin)
	}
	sp.Table = t
	return sp.checkDuplicates()
}

func (sp *Spec) checkDuplicates() error {
	seen := map[Observable]bool{}
	for _, o := range sp.Observables() {
		if seen[o] {
			return scenario.Badf("prediction.%s: predicted twice (as a formula and in the table); allowed: one prediction per observable", o)
		}
		seen[o] = true
	}
	return nil
}

// ValidFor reports, as an InputError, predictions the scenario cannot
// check: a spin kick of a spinless probe, a source's spin kick, a table
// column that is not a parameter axis of the scenario, no prediction at
// all.
func (sp *Spec) ValidFor(s *scenario.Scenario) error {
	if len(sp.Observables()) == 0 {
		return scenario.Badf("prediction: no observable predicted; allowed: formulas dp_X, da_X (X = t, l, b, n) or a table of values")
	}
	for _, o := range sp.Observables() {
		if o.Kick == 1 && !s.Spinning() {
			return scenario.Badf("prediction.%s: probe kind %s has no spin; allowed: dp_t, dp_l, dp_b, dp_n", o, s.Probe.Kind)
		}
		if err := sp.Conventions.validFor(o); err != nil {
			return scenario.Badf("prediction.body = \"source\": %s predicted; allowed: impulses dp_X only (the source's spin kick is not computed)", o)
		}
	}
	if t := sp.Table; t != nil {
		axes := map[string]bool{}
		var names []string
		for _, a := range s.ParamAxes() {
			axes[a.Param] = true
			names = append(names, a.Param)
		}
		for _, p := range t.Params {
			if !axes[p] {
				allowed := "eps and dp_X, da_X (X = t, l, b, n)"
				if len(names) > 0 {
					allowed += " and the scenario's axes " + strings.Join(names, ", ")
				}
				return scenario.Badf("%s: column %q; allowed: %s", t.Origin, p, allowed)
			}
		}
		if len(names) > 0 && len(t.Params) != len(names) {
			return scenario.Badf("%s: the scenario has axes %s; allowed: a table with one column per axis", t.Origin, strings.Join(names, ", "))
		}
	}
	return nil
}

// Short-scan sizes: DefaultCouplings couplings from the given one down by
// successive halvings (see Couplings), at least MinCouplings (the fit of
// residual/ε needs degree 1 with three points to spare) and at most
// MaxCouplings.
const (
	DefaultCouplings = 9
	MinCouplings     = 5
	MaxCouplings     = 40
)

// ShortScan returns a copy of a validated scenario whose scan is the short
// scan of a verification: n couplings (0 means DefaultCouplings) from the
// scenario's own |ε| down by successive factors 2, exact (a coupling axis
// listing them, in increasing order). The scenario's own coupling axis is
// replaced; other parameter axes are kept, each of their combinations
// being one configuration.
func ShortScan(s *scenario.Scenario, n int) (*scenario.Scenario, error) {
	if n == 0 {
		n = DefaultCouplings
	}
	if n < MinCouplings || n > MaxCouplings {
		return nil, scenario.Badf("couplings = %d; allowed: %d ≤ couplings ≤ %d", n, MinCouplings, MaxCouplings)
	}
	c := *s
	eps := math.Abs(s.Epsilon())
	c.Scan.EpsMax = eps
	c.Scan.EpsMin = eps / math.Pow(2, float64(n-1))
	c.Scan.Points = n
	// A coupling axis listing the values keeps them exact: eps/2^k, where
	// a log-spaced grid would round them.
	grid := make([]float64, n)
	for k := range grid {
		grid[k] = eps / math.Pow(2, float64(n-1-k))
	}
	c.Scan.Axes = []scenario.AxisSpec{{Param: "coupling", Spacing: "list", Values: grid}}
	for _, a := range s.Scan.Axes {
		if a.Param != "coupling" {
			c.Scan.Axes = append(c.Scan.Axes, a)
		}
	}
	return &c, nil
}

// QuantitiesOf returns the quantities a formula reads for scenario s (at
// its coupling) with the incoming momentum pin and impact-parameter
// four-vector b of its event.
func QuantitiesOf(s *scenario.Scenario, pin, b vec.Vec4) Quantities {
	bg, pr, k := s.Background, s.Probe, s.Kinematics
	q := Quantities{Gamma: k.Gamma, V: k.V, B: b.Spatial().Norm(), Mass: pr.Mass,
		Charge: pr.Charge, MagneticCharge: pr.MagneticCharge,
		SourceCharge: bg.Charge, SourceMagneticCharge: bg.MagneticCharge, SourceMass: bg.Mass, NUT: bg.NUT,
		Eps: s.Epsilon(), Electromagnetic: s.Electromagnetic(),
		SourceSpin: vec.Vec3(bg.Spin), Frame: observables.NewFrame(pin, b)}
	if s.Spinning() {
		q.ProbeSpin = vec.Vec3(pr.Spin)
	}
	return q
}

// PointOf turns a record of a scan into a Point; s is the scenario at the
// record's coupling (s.WithEpsilon of the record's ε). The first order is
// the library's at the covariant impact parameter.
func PointOf(s *scenario.Scenario, r scan.Record) Point {
	q := QuantitiesOf(s, vec.Vec4(r.PIn), vec.Vec4(r.B))
	pt := Point{Eps: float64(r.Eps), Quantities: q}
	if r.Status != integrate.StatusScattered.String() {
		pt.Status = r.Status
		return pt
	}
	pt.ImpactJ, pt.ImpactEikonal = float64(r.BJ), float64(r.BEik)
	pt.fill(vec.Vec4(r.Impulse), vec.Vec4(r.ImpulseErr), vec.Vec4(r.FirstDp[0]),
		vec.Vec4(r.SpinKick), vec.Vec4(r.SpinKickErr), vec.Vec4(r.FirstDa[0]),
		[2]float64{float64(r.ImpulseErrIso), float64(r.SpinKickErrIso)})
	return pt
}

// Configuration is one configuration of a verification: the parameter
// values of a multi-parameter scenario, the points of its short scan and
// the verdicts.
type Configuration struct {
	// Scenario is the configuration's scenario at its given coupling.
	Scenario *scenario.Scenario `json:"-"`
	// Axes and Params name and give the parameter values (none for a
	// plain scenario).
	Axes    []string  `json:"axes,omitempty"`
	Params  []float64 `json:"params,omitempty"`
	Points  []Point   `json:"-"`
	Results []Result  `json:"results"`
}

// Label describes the configuration's parameters ("gamma = 1.5"), or ""
// for a plain scenario.
func (c Configuration) Label() string {
	var parts []string
	for k, a := range c.Axes {
		parts = append(parts, fmt.Sprintf("%s = %.6g", a, c.Params[k]))
	}
	return strings.Join(parts, ", ")
}

// Evaluate checks the predictions of sp against the records of the short
// scan of s (ShortScan; scan.Run, in job order): one Configuration per
// combination of the parameter axes, each classified and diagnosed by
// Check. Every error is bad input (InputError): a table that does not fit
// the scan, a prediction the scenario cannot check, a formula that cannot
// be evaluated at a point.
func Evaluate(s *scenario.Scenario, recs []scan.Record, sp *Spec, set *Settings) ([]Configuration, error) {
	if err := sp.ValidFor(s); err != nil {
		return nil, err
	}
	plan, err := scan.NewPlan(s, nil, "")
	if err != nil {
		return nil, err
	}
	if len(recs) != plan.Jobs() {
		return nil, fmt.Errorf("predict: %d records for a scan of %d points", len(recs), plan.Jobs())
	}
	cfgs := make([]Configuration, plan.Slices())
	for k := range cfgs {
		cfgs[k].Scenario = plan.Slice(k)
		cfgs[k].Params = plan.Params(k)
		for _, a := range plan.Axes {
			cfgs[k].Axes = append(cfgs[k].Axes, a.Param)
		}
	}
	for _, r := range recs {
		_, slice, _ := plan.Locate(r.Index)
		sc := plan.Slice(slice).WithEpsilon(float64(r.Eps))
		cfgs[slice].Points = append(cfgs[slice].Points, PointOf(sc, r))
	}
	var used map[int]bool
	if sp.Table != nil {
		used = map[int]bool{}
	}
	for k := range cfgs {
		c := &cfgs[k]
		preds := append([]Prediction(nil), sp.Formulas...)
		if t := sp.Table; t != nil {
			for j, o := range t.Observables {
				preds = append(preds, Prediction{Observable: o, Values: t.values(j, c.Points, c.Axes, c.Params, used)})
			}
		}
		if c.Results, err = Check(preds, sp.Conventions, c.Points, set); err != nil {
			// A formula that cannot be evaluated (a complex or infinite
			// value) is the input's fault.
			return nil, scenario.Badf("%s", strings.TrimPrefix(err.Error(), "predict: "))
		}
	}
	if t := sp.Table; t != nil {
		for i, row := range t.rows {
			if !used[i] {
				return nil, scenario.Badf("%s: line %d: eps = %g%s is not a point of the short scan; allowed: the couplings %s (|eps| of the scenario halved successively)",
					t.Origin, row.line, row.eps, t.paramNote(row.params), couplingList(plan.Eps))
			}
		}
	}
	return cfgs, nil
}

func couplingList(eps []float64) string {
	var s []string
	for k := len(eps) - 1; k >= 0; k-- {
		s = append(s, fmt.Sprintf("%.10g", eps[k]))
	}
	return strings.Join(s, ", ")
}
