package scenario

import (
	"errors"
	"math"
	"math/cmplx"
	"strings"
	"testing"
)

// base is a small valid flat-space scenario with a root-Kerr source.
const base = `
[background]
kind = "root-kerr"
charge = 0.01
spin = [0, 0, 0.3]
[probe]
kind = "root-kerr"
charge = 1
spin = [0.2, 0, 0]
[kinematics]
gamma = 1.5
`

func parseValid(t *testing.T, text string) (*Scenario, error) {
	t.Helper()
	s, err := Parse([]byte(text), "test.toml")
	if err != nil {
		t.Fatal(err)
	}
	return s, s.Validate()
}

// TestAxesBadInput: every malformed [[scan.axis]] table is refused with a
// one-line InputError naming the field.
func TestAxesBadInput(t *testing.T) {
	cases := []struct{ axes, want string }{
		{`param = "colour"` + "\nvalues = [1]", `scan.axis[0].param = "colour"; allowed: coupling, gamma`},
		{`values = [1]`, "scan.axis[0].param is missing"},
		{`param = "gamma"` + "\nspacing = \"cubic\"\nmin = 1.1\nmax = 2\npoints = 3", `scan.axis[0].spacing = "cubic"`},
		{`param = "gamma"` + "\nmin = 1.1\nmax = 2\npoints = 1", "scan.axis[0].points = 1; allowed: 2 ≤ points ≤ 10000"},
		{`param = "gamma"` + "\nmin = 2\nmax = 1.1\npoints = 3", "scan.axis[0]: min = 2, max = 1.1; allowed: finite min < max"},
		{`param = "b"` + "\nspacing = \"log\"\nmin = 0\nmax = 2\npoints = 3", "scan.axis[0].min = 0; allowed for spacing log"},
		{`param = "gamma"` + "\nvalues = [1.5]\nmin = 1", "allowed: values or min, max and points, not both"},
		{`param = "gamma"` + "\nspacing = \"linear\"\nvalues = [1.5]", `allowed: values with spacing = "list"`},
		{`param = "gamma"` + "\nvalues = []", "scan.axis[0].points = 0"},
		{`param = "coupling"` + "\nvalues = [0.1, 0.01]", "allowed: increasing couplings"},
		{`param = "coupling"` + "\nvalues = [0.01]", "allowed: at least 2 values"},
	}
	for _, c := range cases {
		_, err := parseValid(t, base+"[[scan.axis]]\n"+c.axes+"\n")
		var ie InputError
		if !errors.As(err, &ie) || !strings.Contains(err.Error(), c.want) || strings.Contains(err.Error(), "\n") {
			t.Errorf("%q: got %v, want an InputError containing %q", c.axes, err, c.want)
		}
	}
	_, err := parseValid(t, base+"[scan]\neps_min = 1e-3\n[[scan.axis]]\nparam = \"coupling\"\nvalues = [0.01, 0.1]\n")
	if err == nil || !strings.Contains(err.Error(), "replaces scan.eps_min") {
		t.Errorf("coupling axis with eps_min: %v", err)
	}
	_, err = parseValid(t, base+"[[scan.axis]]\nparam = \"gamma\"\nvalues = [2]\n[[scan.axis]]\nparam = \"v\"\nvalues = [0.5]\n")
	if err == nil || !strings.Contains(err.Error(), "gamma or for v") {
		t.Errorf("gamma and v axes: %v", err)
	}
	// A slice that does not validate names the axis value.
	s, err := parseValid(t, base+"[[scan.axis]]\nparam = \"v\"\nvalues = [0.5, 1.5]\n")
	if err != nil {
		t.Fatal(err)
	}
	if _, err := s.ValidateSlices(); err == nil || !strings.Contains(err.Error(), "v = 1.5") || !strings.Contains(err.Error(), "kinematics.v = 1.5") {
		t.Errorf("bad slice: %v", err)
	}
	// a_over_m needs a spinning curved background.
	if _, err := s.WithParams([]float64{0.5}); err != nil {
		t.Fatal(err)
	}
	s.Scan.Axes = []AxisSpec{{Param: "a_over_m", Spacing: "list", Values: []float64{0.5}}}
	s.Kinematics.V = 0
	if _, err := s.ValidateSlices(); err == nil || !strings.Contains(err.Error(), "allowed for an a_over_m axis") {
		t.Errorf("a_over_m on root-kerr: %v", err)
	}
}

// TestAxisGrid: log and linear grids hit both ends exactly and are
// log- or evenly spaced; lists come back as given; the coupling axis
// replaces the default grid.
func TestAxisGrid(t *testing.T) {
	lin := AxisSpec{Spacing: "linear", Min: 1.1, Max: 3, Points: 5}.Grid()
	lg := AxisSpec{Spacing: "log", Min: 1e-4, Max: 0.1, Points: 4}.Grid()
	if lin[0] != 1.1 || lin[4] != 3 || math.Abs(lin[2]-2.05) > 1e-15 {
		t.Errorf("linear grid %v", lin)
	}
	if lg[0] != 1e-4 || lg[3] != 0.1 || math.Abs(lg[1]/1e-3-1) > 1e-14 {
		t.Errorf("log grid %v", lg)
	}
	s, err := parseValid(t, base+"[[scan.axis]]\nparam = \"coupling\"\nvalues = [0.001, 0.01, 0.05]\n")
	if err != nil {
		t.Fatal(err)
	}
	if g := s.CouplingGrid(); len(g) != 3 || g[2] != 0.05 || s.Scan.Points != 3 || s.Scan.EpsMax != 0.05 {
		t.Errorf("coupling axis grid %v, scan %+v", g, s.Scan)
	}
	// Slices keep the coupling axis.
	sl, err := s.WithParams(nil)
	if err != nil || len(sl.CouplingGrid()) != 3 || sl.CouplingGrid()[1] != 0.01 {
		t.Errorf("slice coupling grid: %v %v", err, sl)
	}
}

// TestWithParams: each parameter sets what it says, exactly where exact
// values are possible.
func TestWithParams(t *testing.T) {
	s, err := parseValid(t, base)
	if err != nil {
		t.Fatal(err)
	}
	set := func(param string, x float64) *Scenario {
		c := *s
		c.Scan.Axes = []AxisSpec{{Param: param, Spacing: "list", Values: []float64{x}}}
		sl, err := c.ValidateSlices()
		if err != nil {
			t.Fatalf("%s = %g: %v", param, x, err)
		}
		return sl[0]
	}
	if c := set("v", 0.6); math.Abs(c.Kinematics.Gamma-1.25) > 1e-15 {
		t.Errorf("v = 0.6: gamma %v, want 1.25", c.Kinematics.Gamma)
	}
	if c := set("gamma", 1.25); math.Abs(c.Kinematics.V-0.6) > 1e-15 {
		t.Errorf("gamma = 1.25: v %v, want 0.6", c.Kinematics.V)
	}
	if c := set("probe_spin", 0.5); c.Probe.Spin != [3]float64{0.5, 0, 0} {
		t.Errorf("probe_spin = 0.5: %v", c.Probe.Spin)
	}
	if c := set("probe_spin_theta", 0); c.Probe.Spin != [3]float64{0, 0, 0.2} {
		t.Errorf("probe_spin_theta = 0: %v", c.Probe.Spin)
	}
	if c := set("source_spin_phi", 90); math.Abs(c.Background.Spin[2]-0.3) > 1e-16 || c.Background.Spin[0] != 0 {
		t.Errorf("source_spin_phi = 90 of a spin along z: %v (the azimuth of a polar vector changes nothing)", c.Background.Spin)
	}
	if c := set("source_spin_theta", 90); math.Abs(c.Background.Spin[0]-0.3) > 1e-16 || c.Background.Spin[2] != 0 {
		t.Errorf("source_spin_theta = 90: %v", c.Background.Spin)
	}
	// The duality phase rotates the coupling, keeping |ε|.
	for _, deg := range []float64{30, 90, -60} {
		c := set("duality_phase", deg)
		got := cmplx.Phase(c.Coupling()) * 180 / math.Pi
		if math.Abs(got-deg) > 1e-12 || math.Abs(math.Abs(c.Epsilon())-math.Abs(s.Epsilon())) > 1e-15 {
			t.Errorf("duality_phase = %g: phase %g, |ε| %g (was %g)", deg, got, c.Epsilon(), s.Epsilon())
		}
	}
	// a_over_m keeps a/M fixed as WithEpsilon rescales M.
	k, err := parseValid(t, "[background]\nkind = \"kerr\"\nmass = 0.01\nspin = [0, 0, 0.005]\n[probe]\nkind = \"geodesic\"\n[kinematics]\ngamma = 2\n[[scan.axis]]\nparam = \"a_over_m\"\nvalues = [0.7]\n")
	if err != nil {
		t.Fatal(err)
	}
	sl, err := k.ValidateSlices()
	if err != nil {
		t.Fatal(err)
	}
	for _, eps := range []float64{1e-3, 0.05} {
		c := sl[0].WithEpsilon(eps)
		if math.Abs(c.Background.Spin[2]/c.Background.Mass-0.7) > 1e-15 || math.Abs(c.Background.Mass-eps) > 1e-17 {
			t.Errorf("a_over_m = 0.7 at ε = %g: M = %g, a = %g", eps, c.Background.Mass, c.Background.Spin[2])
		}
	}
}
