package scenario

import (
	"fmt"
	"math"
	"math/cmplx"
	"slices"
	"strings"
)

// AxisSpec is one axis of a multi-parameter scan, a [[scan.axis]] table:
//
//	[[scan.axis]]
//	param = "gamma"       # see Params
//	spacing = "linear"    # log, linear or list (default: list when values are given, else linear)
//	min = 1.1
//	max = 3
//	points = 5
//	# or: values = [1.1, 1.5, 2, 3]
//
// Grid gives its values.
type AxisSpec struct {
	Param   string    `toml:"param"`
	Spacing string    `toml:"spacing"`
	Min     float64   `toml:"min"`
	Max     float64   `toml:"max"`
	Points  int       `toml:"points"`
	Values  []float64 `toml:"values"`
}

// Params lists the parameters an axis may vary, with what they set.
// Angles are in degrees; spins are lengths in the units of b, rest-frame
// vectors (a = S/m) given by magnitude, polar angle θ from +z and azimuth
// φ from +x; a zero spin given a magnitude points along +z.
var Params = []struct{ Name, Doc string }{
	{"coupling", "|ε| (replaces scan.eps_min, eps_max and points)"},
	{"gamma", "kinematics.gamma (Lorentz factor at infinity)"},
	{"v", "kinematics.v (speed at infinity)"},
	{"b", "kinematics.b (impact parameter; spins keep their lengths)"},
	{"probe_spin", "|probe.spin|"},
	{"probe_spin_theta", "polar angle of probe.spin from +z, degrees"},
	{"probe_spin_phi", "azimuth of probe.spin from +x, degrees"},
	{"source_spin", "|background.spin|"},
	{"source_spin_theta", "polar angle of background.spin from +z, degrees"},
	{"source_spin_phi", "azimuth of background.spin from +x, degrees"},
	{"a_over_m", "|background.spin| = a_over_m × mass along its direction (+z if zero), kept as ε varies (curved kinds with spin)"},
	{"duality_phase", "phase of the coupling, degrees: arg (q − ig)(Q + iP) (flat) or arg (M + iN) (curved)"},
}

func paramNames() string {
	var n []string
	for _, p := range Params {
		n = append(n, p.Name)
	}
	return strings.Join(n, ", ")
}

// MaxJobs bounds the number of points of a scan (all axes and models).
const MaxJobs = 10_000_000

// Grid returns the values of a validated axis, in order: min … max for
// log and linear spacing (both ends included exactly), the values as
// given for a list.
func (a AxisSpec) Grid() []float64 {
	switch a.Spacing {
	case "list":
		return slices.Clone(a.Values)
	case "log":
		return LogGrid(a.Min, a.Max, a.Points)
	}
	g := make([]float64, a.Points)
	for i := range g {
		g[i] = a.Min + (a.Max-a.Min)*float64(i)/float64(a.Points-1)
	}
	g[a.Points-1] = a.Max
	return g
}

// LogGrid returns n log-spaced values from lo to hi, both included:
//
//	x_k = lo (hi/lo)^{k/(n−1)},  k = 0 … n−1,
//
// with the last point set to hi exactly.
func LogGrid(lo, hi float64, n int) []float64 {
	g := make([]float64, n)
	for i := range g {
		g[i] = lo * math.Pow(hi/lo, float64(i)/float64(n-1))
	}
	g[n-1] = hi
	return g
}

// CouplingGrid returns the couplings |ε| of a validated scenario's scan:
// its coupling axis if it has one, else eps_min … eps_max log-spaced.
func (s *Scenario) CouplingGrid() []float64 {
	for _, a := range s.Scan.Axes {
		if a.Param == "coupling" {
			return a.Grid()
		}
	}
	return LogGrid(s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points)
}

// ParamAxes returns the scan's axes other than the coupling, in the order
// given.
func (s *Scenario) ParamAxes() []AxisSpec {
	var out []AxisSpec
	for _, a := range s.Scan.Axes {
		if a.Param != "coupling" {
			out = append(out, a)
		}
	}
	return out
}

// validateAxes checks the [[scan.axis]] tables and fills their spacing;
// a coupling axis sets eps_min, eps_max and points.
func (s *Scenario) validateAxes() error {
	seen := map[string]bool{}
	slicesN := 1
	for k := range s.Scan.Axes {
		a := &s.Scan.Axes[k]
		field := fmt.Sprintf("scan.axis[%d]", k)
		known := false
		for _, p := range Params {
			known = known || p.Name == a.Param
		}
		switch {
		case a.Param == "":
			return Badf("%s.param is missing; allowed: %s", field, paramNames())
		case !known:
			return Badf("%s.param = %q; allowed: %s", field, a.Param, paramNames())
		case seen[a.Param]:
			return Badf("%s.param = %q: that parameter has an axis already; allowed: one axis per parameter", field, a.Param)
		}
		seen[a.Param] = true
		if a.Spacing == "" {
			a.Spacing = "linear"
			if len(a.Values) > 0 {
				a.Spacing = "list"
			}
		}
		switch a.Spacing {
		case "list":
			if a.Min != 0 || a.Max != 0 || a.Points != 0 {
				return Badf("%s: values = %v with min = %g, max = %g, points = %d; allowed: values or min, max and points, not both", field, a.Values, a.Min, a.Max, a.Points)
			}
			if len(a.Values) < 1 || len(a.Values) > 10000 {
				return Badf("%s.values has %d entries; allowed: 1 to 10000", field, len(a.Values))
			}
			for _, x := range a.Values {
				if !finite(x) {
					return Badf("%s.values: %g; allowed: finite numbers", field, x)
				}
			}
		case "log", "linear":
			if len(a.Values) > 0 {
				return Badf("%s: values with spacing = %q; allowed: values with spacing = \"list\" (or omitted)", field, a.Spacing)
			}
			if a.Points < 2 || a.Points > 10000 {
				return Badf("%s.points = %d; allowed: 2 ≤ points ≤ 10000", field, a.Points)
			}
			if !finite(a.Min) || !finite(a.Max) || !(a.Max > a.Min) {
				return Badf("%s: min = %g, max = %g; allowed: finite min < max", field, a.Min, a.Max)
			}
			if a.Spacing == "log" && !(a.Min > 0) {
				return Badf("%s.min = %g; allowed for spacing log: 0 < min < max", field, a.Min)
			}
		default:
			return Badf("%s.spacing = %q; allowed: log, linear, list", field, a.Spacing)
		}
		g := a.Grid()
		if a.Param == "coupling" {
			lo, hi := slices.Min(g), slices.Max(g)
			sc := &s.Scan
			if (sc.EpsMin != 0 && sc.EpsMin != lo) || (sc.EpsMax != 0 && sc.EpsMax != hi) || (sc.Points != 0 && sc.Points != len(g)) {
				return Badf("%s: the coupling axis replaces scan.eps_min, eps_max and points; give one or the other", field)
			}
			if len(g) < 2 || !(lo > 0) {
				return Badf("%s: coupling values %v; allowed: at least 2 values, all > 0", field, g)
			}
			for i := 1; i < len(g); i++ {
				if !(g[i] > g[i-1]) {
					return Badf("%s.values: %g after %g; allowed: increasing couplings", field, g[i], g[i-1])
				}
			}
			sc.EpsMin, sc.EpsMax, sc.Points = lo, hi, len(g)
			continue
		}
		slicesN *= len(g)
		if slicesN > MaxJobs {
			return Badf("scan.axis: %d or more parameter combinations; allowed: at most %d", slicesN, MaxJobs)
		}
	}
	if seen["gamma"] && seen["v"] {
		return Badf("scan.axis: axes for gamma and for v; allowed: an axis for gamma or for v, not both")
	}
	return nil
}

// ValidateSlices checks every combination of the parameter axes of a
// validated scenario (the coupling at its given value), so that a scan
// fails on bad input before any integration; it returns the slice
// scenarios in enumeration order (SliceIndex).
func (s *Scenario) ValidateSlices() ([]*Scenario, error) {
	axes := s.ParamAxes()
	if len(axes) == 0 {
		return []*Scenario{s}, nil
	}
	grids := make([][]float64, len(axes))
	n := 1
	for k, a := range axes {
		grids[k] = a.Grid()
		n *= len(grids[k])
	}
	if n*s.Scan.Points > MaxJobs {
		return nil, Badf("scan: %d points; allowed: at most %d", n*s.Scan.Points, MaxJobs)
	}
	out := make([]*Scenario, n)
	vals := make([]float64, len(axes))
	for i := range out {
		rem := i
		for k := len(axes) - 1; k >= 0; k-- {
			vals[k] = grids[k][rem%len(grids[k])]
			rem /= len(grids[k])
		}
		c, err := s.WithParams(vals)
		if err != nil {
			return nil, err
		}
		out[i] = c
	}
	return out, nil
}

// WithParams returns a validated copy of s with the parameter axes
// (ParamAxes, in order) set to vals. Its error names the axis and value.
func (s *Scenario) WithParams(vals []float64) (*Scenario, error) {
	axes := s.ParamAxes()
	c := *s
	// A slice is a coupling scan: it keeps only the coupling axis.
	c.Scan.Axes = nil
	for _, a := range s.Scan.Axes {
		if a.Param == "coupling" {
			c.Scan.Axes = []AxisSpec{a}
		}
	}
	for k, a := range axes {
		if err := c.set(a.Param, vals[k]); err != nil {
			return nil, Badf("scan.axis %s = %g: %v", a.Param, vals[k], err)
		}
	}
	// Validation derives v from gamma: keep gamma only, as a scenario file
	// gives it.
	if c.Kinematics.Gamma != 0 {
		c.Kinematics.V = 0
	}
	if err := c.Validate(); err != nil {
		return nil, Badf("scan.axis at %s: %v", describe(axes, vals), err)
	}
	return &c, nil
}

func describe(axes []AxisSpec, vals []float64) string {
	var parts []string
	for k, a := range axes {
		parts = append(parts, fmt.Sprintf("%s = %g", a.Param, vals[k]))
	}
	return strings.Join(parts, ", ")
}

// set sets one parameter (Params) of a validated scenario.
func (s *Scenario) set(param string, x float64) error {
	deg := x * math.Pi / 180
	switch param {
	case "gamma":
		s.Kinematics.Gamma, s.Kinematics.V = x, 0
	case "v":
		s.Kinematics.Gamma, s.Kinematics.V = 0, x
	case "b":
		s.Kinematics.B = x
		s.MarkGiven("kinematics.b")
	case "probe_spin", "probe_spin_theta", "probe_spin_phi":
		s.Probe.Spin = setSpherical(s.Probe.Spin, param[len("probe_spin"):], x, deg)
	case "source_spin", "source_spin_theta", "source_spin_phi":
		s.Background.Spin = setSpherical(s.Background.Spin, param[len("source_spin"):], x, deg)
	case "a_over_m":
		switch s.Background.Kind {
		case "kerr", "kerr-newman", "kerr-taub-nut":
		default:
			return fmt.Errorf("background.kind = %q; allowed for an a_over_m axis: a curved background with spin (kerr, kerr-newman, kerr-taub-nut)", s.Background.Kind)
		}
		d := unitOrZ(s.Background.Spin)
		a := x * s.Background.Mass
		s.Background.Spin = [3]float64{a * d[0], a * d[1], a * d[2]}
		s.spinPerMass, s.spinDir = x, d
		s.Scan.Hold = "a_over_m"
	case "duality_phase":
		rot := cmplx.Rect(1, deg)
		if s.Background.Curved() {
			m := complex(cmplx.Abs(complex(s.Background.Mass, s.Background.NUT)), 0) * rot
			s.Background.Mass, s.Background.NUT = real(m), imag(m)
			break
		}
		c := s.Coupling()
		if c == 0 {
			return fmt.Errorf("the coupling vanishes")
		}
		q := complex(s.Background.Charge, s.Background.MagneticCharge) * rot * complex(cmplx.Abs(c), 0) / c
		s.Background.Charge, s.Background.MagneticCharge = real(q), imag(q)
	}
	return nil
}

// setSpherical replaces the magnitude (part ""), polar angle ("_theta")
// or azimuth ("_phi") of v.
func setSpherical(v [3]float64, part string, x, rad float64) [3]float64 {
	r := math.Sqrt(v[0]*v[0] + v[1]*v[1] + v[2]*v[2])
	th, ph := 0.0, 0.0
	if r > 0 {
		th, ph = math.Acos(v[2]/r), math.Atan2(v[1], v[0])
	}
	switch part {
	case "":
		r = x
	case "_theta":
		th = rad
	case "_phi":
		ph = rad
	}
	st, ct := math.Sincos(th)
	sp, cp := math.Sincos(ph)
	out := [3]float64{r * st * cp, r * st * sp, r * ct}
	// Exact zeros where the angles put them (sin π ≠ 0 in floating point).
	for i := range out {
		if math.Abs(out[i]) < 1e-15*r {
			out[i] = 0
		}
	}
	return out
}
