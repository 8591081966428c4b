package scenario

import (
	"errors"
	"math"
	"strings"
	"testing"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables/leading"
)

// kerrDixon is a small valid scenario of a spinning probe in Kerr.
const kerrDixon = `
[background]
kind = "kerr"
mass = 0.01
spin = [0, 0, 0.3]
[probe]
kind = "dixon"
spin = [0.1, -0.2, 0.25]
[kinematics]
gamma = 1.4
`

// TestCurvedProbeBadInput: every malformed spinning probe on a curved
// background is refused with a one-line InputError naming the field.
func TestCurvedProbeBadInput(t *testing.T) {
	cases := []struct{ text, want string }{
		{strings.Replace(kerrDixon, `kind = "dixon"`, `kind = "bmt"`, 1), `probe.kind = "bmt"; allowed for a curved background: geodesic, dixon`},
		{kerrDixon + "nut = 0.1\n", ""},
		{strings.Replace(kerrDixon, "spin = [0.1", "nut = 0.2\nspin = [0.1", 1), "probe.nut = 0.2; allowed: 0 for background kind kerr"},
		{strings.Replace(kerrDixon, "spin = [0.1", "magnetic_charge = 0.2\nspin = [0.1", 1), "probe.magnetic_charge = 0.2; allowed: 0 on curved backgrounds"},
		{strings.Replace(kerrDixon, `kind = "dixon"`, `kind = "geodesic"`, 1), "allowed: none for kind geodesic (mass and charge only"},
		{kerrDixon + "[scan]\nhold = \"a_over_q\"\n", `scan.hold = "a_over_q"; allowed: a_over_b, a_over_m`},
		{strings.Replace(kerrDixon, `kind = "kerr"`, `kind = "schwarzschild"`, 1), "allowed: [0, 0, 0] for kind schwarzschild"},
		{strings.Replace(strings.Replace(kerrDixon, `kind = "kerr"`, `kind = "schwarzschild"`, 1), "spin = [0, 0, 0.3]\n", "", 1) + "[scan]\nhold = \"a_over_m\"\n", `allowed: a_over_m only for a spinning curved background`},
	}
	for _, c := range cases {
		s, err := Parse([]byte(c.text), "test.toml")
		if c.want == "" {
			// kinematics.nut is not a key: the strict decoder refuses it.
			if err == nil {
				t.Errorf("%q: unknown key accepted", c.text)
			}
			continue
		}
		if err != nil {
			t.Fatal(err)
		}
		err = s.Validate()
		var ie InputError
		if !errors.As(err, &ie) || !strings.Contains(err.Error(), c.want) || strings.Contains(err.Error(), "\n") {
			t.Errorf("got %v, want an InputError containing %q", err, c.want)
		}
	}
}

// TestHoldSpinPerMass: with scan.hold = "a_over_m" the background keeps
// a/M as ε varies (a black hole at every point of the scan), with the
// default a_over_b it keeps a/b and turns super-extremal at small ε, and
// the scan warning says so.
func TestHoldSpinPerMass(t *testing.T) {
	s, err := parseValid(t, strings.Replace(kerrDixon, "spin = [0, 0, 0.3]", "spin = [0, 0, 0.009]", 1)+"[scan]\nhold = \"a_over_m\"\n")
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range []float64{1e-4, 0.05} {
		bg := s.WithEpsilon(e).Background
		if r := bg.Spin[2] / bg.Mass; math.Abs(r-0.9) > 1e-14 {
			t.Errorf("eps %g: a/M = %.16g, want 0.9", e, r)
		}
	}
	if w := s.ScanWarning(); w != "" {
		t.Errorf("a_over_m scan of a/M = 0.9: warning %q", w)
	}
	s, err = parseValid(t, kerrDixon)
	if err != nil {
		t.Fatal(err)
	}
	if s.Scan.Hold != "a_over_b" || s.WithEpsilon(1e-3).Background.Spin[2] != 0.3 {
		t.Errorf("default hold %q, spin at eps 1e-3: %v", s.Scan.Hold, s.WithEpsilon(1e-3).Background.Spin)
	}
	// a = 0.3 b: super-extremal wherever M < 0.3 b, here at all 13 points.
	if w := s.ScanWarning(); !strings.Contains(w, "super-extremal") || !strings.Contains(w, "at 13 of 13 points") {
		t.Errorf("a_over_b warning %q", w)
	}
}

// TestNUTProbeDuality: a NUT-charged spinning probe is integrated in the
// background whose complex mass is rotated by the probe's, M′ − iN′ =
// (m + in)(M − iN)/m; its first-order prediction (the closed form with the
// probe's own NUT phase, leading.SpinImpulse1PM) equals the closed form
// of a NUT-free probe in that rotated background, which is the statement
// that the linearized coupling depends on (m + in)(M − iN) only.
func TestNUTProbeDuality(t *testing.T) {
	s, err := LoadBuiltin("ktn-spinning-nut")
	if err != nil {
		t.Fatal(err)
	}
	if err := s.Validate(); err != nil {
		t.Fatal(err)
	}
	ev, err := s.Build()
	if err != nil {
		t.Fatal(err)
	}
	d, ok := ev.Model.(*integrate.Dixon)
	if !ok {
		t.Fatalf("model %T, want *integrate.Dixon", ev.Model)
	}
	k := d.Metric.(spacetime.KerrNewmanNUT)
	bg, pr := s.Background, s.Probe
	want := complex(pr.Mass, pr.NUT) * complex(bg.Mass, -bg.NUT) / complex(pr.Mass, 0)
	if math.Abs(k.M-real(want)) > 1e-16 || math.Abs(k.N+imag(want)) > 1e-16 || k.A != bg.Spin[2] || k.StringGauge != bg.StringGauge {
		t.Errorf("integrated metric %+v, want M − iN = %v", k, want)
	}
	dp, da, _ := ev.FirstOrder(s)
	u := ev.In.P.Scale(1 / pr.Mass)
	dp2, da2 := leading.SpinImpulse1PM(leading.GravSpinProbe{M: pr.Mass, A: ev.In.A, Body: leading.DipoleBody},
		leading.GravSource{M: k.M, N: k.N, A: vec.Vec3{0, 0, k.A}}, u, ev.In.B)
	// Rounding: the two evaluations differ in the order of products.
	for i := 0; i < 4; i++ {
		if math.Abs(dp[i]-dp2[i]) > 1e-15 || math.Abs(da[i]-da2[i]) > 1e-15 {
			t.Errorf("component %d: NUT probe dp %g da %g, rotated background dp %g da %g", i, dp[i], da[i], dp2[i], da2[i])
		}
	}
}

// TestTiltedBackgroundSpin: a curved background may spin in any
// direction: the event turns the family's metric (integrate.Rotated) so
// that its axis is along background.spin, the first order uses the spin
// vector as given, and scan.hold = "a_over_m" keeps both |a|/M and the
// direction.
func TestTiltedBackgroundSpin(t *testing.T) {
	text := strings.Replace(kerrDixon, "spin = [0, 0, 0.3]", "spin = [0.006, 0, 0.008]", 1) + "[scan]\nhold = \"a_over_m\"\n"
	s, err := parseValid(t, text)
	if err != nil {
		t.Fatal(err)
	}
	ev, err := s.Build()
	if err != nil {
		t.Fatal(err)
	}
	r, ok := ev.Model.(*integrate.Rotated)
	if !ok {
		t.Fatalf("model %T, want *integrate.Rotated", ev.Model)
	}
	// exact: n = (0.6, 0, 0.8), |a| = 0.01 = M.
	if n := r.Axis(); math.Abs(n[0]-0.6) > 1e-15 || n[1] != 0 || math.Abs(n[2]-0.8) > 1e-15 {
		t.Errorf("axis %v, want (0.6, 0, 0.8)", n)
	}
	if k := r.Inner.(*integrate.Dixon).Metric.(spacetime.KerrNewman); math.Abs(k.A-0.01) > 1e-17 {
		t.Errorf("inner metric %+v, want a = 0.01", k)
	}
	bg := s.WithEpsilon(0.05).Background
	if math.Abs(bg.Spin[0]-0.03) > 1e-16 || bg.Spin[1] != 0 || math.Abs(bg.Spin[2]-0.04) > 1e-16 {
		t.Errorf("a_over_m at eps 0.05: spin %v, want [0.03 0 0.04]", bg.Spin)
	}
}
