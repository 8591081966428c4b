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
	s, ev := buildBuiltin(t, "ktn-spinning-nut")
	d, ok := ev.Model.(*integrate.Dixon)
	if !ok {
		t.Fatalf("model %T, want *integrate.Dixon", ev.Model)
	}
	k := checkRotatedNUT(t, s, d.Metric)
	if k.A != s.Background.Spin[2] {
		t.Errorf("integrated metric %+v, want a = %g", k, s.Background.Spin[2])
	}
	pr := s.Probe
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

// buildBuiltin loads, validates and builds a built-in scenario.
func buildBuiltin(t *testing.T, name string) (*Scenario, Event) {
	t.Helper()
	s, err := LoadBuiltin(name)
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
	return s, ev
}

// checkRotatedNUT checks that a NUT-charged probe's event integrates the
// background duality-rotated to M′ − iN′ = (m + in)(M − iN)/m, and
// returns that metric.
func checkRotatedNUT(t *testing.T, s *Scenario, m spacetime.Metric) spacetime.KerrNewmanNUT {
	t.Helper()
	k := m.(spacetime.KerrNewmanNUT)
	bg, pr := s.Background, s.Probe
	want := complex(pr.Mass, pr.NUT) * complex(bg.Mass, -bg.NUT) / complex(pr.Mass, 0)
	if math.Abs(k.M-real(want)) > 1e-16 || math.Abs(k.N+imag(want)) > 1e-16 || k.StringGauge != bg.StringGauge {
		t.Errorf("integrated metric %+v, want M − iN = %v", k, want)
	}
	return k
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

// TestKerrProbeSpread: the spread of probe kind kerr-probe builds the two
// completions of the Kerr probe and the Dixon bodies without and with
// C_ES² = 1, each with its own first-order closed form
// (leading.SpinImpulse1PM with KerrBody, DipoleBody, QuadrupoleBody), in
// the tilted built-in scenario.
func TestKerrProbeSpread(t *testing.T) {
	s, err := LoadBuiltin("kerr-test-hole")
	if err != nil {
		t.Fatal(err)
	}
	if err := s.Validate(); err != nil {
		t.Fatal(err)
	}
	names := s.SpreadMembers()
	if len(names) != 4 {
		t.Fatalf("members %q", names)
	}
	var first [4]vec.Vec4
	for k := range names {
		ev, err := s.BuildMember(k)
		if err != nil {
			t.Fatal(err)
		}
		dp, _, src := ev.FirstOrder(s)
		first[k] = dp
		t.Logf("%s: %s; first order %v (%s)", names[k], ev.Model.Name(), dp, src)
	}
	// The members differ at O(a²) (dipole) and O(a³) (quadrupole), a/b ≈ 0.3:
	// distinct numbers, the quadrupole body the closer one.
	if first[1] != first[0] {
		t.Errorf("the two Kerr-probe completions: first orders %v and %v, want the same closed form", first[0], first[1])
	}
	d1, d2 := first[2].Sub(first[0]).Spatial().Norm(), first[3].Sub(first[0]).Spatial().Norm()
	if !(d2 < d1) || d2 == 0 {
		t.Errorf("first orders %v: |dipole − kerr| = %.3g, |quadrupole − kerr| = %.3g", first, d1, d2)
	}
	if _, err := s.BuildMember(4); err == nil {
		t.Error("member 4 built")
	}
}

// TestKerrProbeValidate: probe kind kerr-probe takes mass, spin and a NUT
// charge only, the NUT charge on a NUT background only; the errors name
// the field.
func TestKerrProbeValidate(t *testing.T) {
	for _, c := range []struct {
		edit func(s *Scenario)
		want string
	}{
		{func(s *Scenario) { s.Probe.CES2 = 1 }, "kerr-probe takes mass, spin and nut only"},
		{func(s *Scenario) { s.Probe.Charge = 0.1 }, "kerr-probe takes mass, spin and nut only"},
		{func(s *Scenario) { s.Probe.NUT = 0.1 }, "probe.nut = 0.1; allowed: 0 for background kind kerr"},
		{func(s *Scenario) { s.Probe.NUT = math.Inf(1) }, "probe.nut = +Inf; allowed: a finite number"},
	} {
		s, err := LoadBuiltin("kerr-test-hole")
		if err != nil {
			t.Fatal(err)
		}
		c.edit(s)
		if err := s.Validate(); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("error %v, want %q", err, c.want)
		}
	}
}

// TestKerrProbeNUT: the built-in ktn-test-hole (a NUT-charged Kerr probe
// past a tilted Kerr–Taub–NUT black hole) integrates the NUT-free Kerr
// probe in the background duality-rotated to M′ − iN′ = (m + in)(M − iN)/m;
// its first order is the closed form of the Kerr body exact in both
// spins with both phases (leading.SpinImpulse1PM with the probe's N; Vines
// 2017 with the mass–NUT phase), which equals the straight-line quadrature
// of the first-order force and torque of the Kerr probe in the linearized
// rotated background (≤ 1e-12 relative); and its O(a) truncation is the
// Dixon body with the same NUT charge: the difference of their first
// orders falls by 4 per halving of the probe spin.
func TestKerrProbeNUT(t *testing.T) {
	s, ev := buildBuiltin(t, "ktn-test-hole")
	rot, ok := ev.Model.(*integrate.Rotated)
	if !ok {
		t.Fatalf("model %T, want a turned background", ev.Model)
	}
	kd, ok := rot.Inner.(*integrate.KerrDixon)
	if !ok {
		t.Fatalf("inner model %T, want *integrate.KerrDixon", rot.Inner)
	}
	k := checkRotatedNUT(t, s, kd.Metric)
	bg, pr := s.Background, s.Probe
	dp, da, src := ev.FirstOrder(s)
	lin, err := integrate.NewRotated(&integrate.KerrProbe{Metric: k, M: pr.Mass, Linear: true}, vec.Vec3(bg.Spin))
	if err != nil {
		t.Fatal(err)
	}
	qp, qa := integrate.FirstOrder(lin, ev.In, 400)
	e4 := func(v vec.Vec4) float64 { return math.Sqrt(v[0]*v[0] + v[1]*v[1] + v[2]*v[2] + v[3]*v[3]) }
	ep, ea := e4(qp.Sub(dp))/e4(dp), e4(qa.Sub(da))/e4(da)
	t.Logf("first order (%s): quadrature vs closed form Δp %.2e, Δa %.2e", src, ep, ea)
	// The quadrature converges geometrically; at 400 nodes per half line
	// it is at rounding.
	if ep > 1e-12 || ea > 1e-12 {
		t.Errorf("quadrature Δp %v Δa %v, closed form %v %v (rel. %.2e, %.2e)", qp, qa, dp, da, ep, ea)
	}
	diff := func(scale float64) (float64, float64) {
		c := *s
		c.Probe.Spin = [3]float64{scale * pr.Spin[0], scale * pr.Spin[1], scale * pr.Spin[2]}
		e1, err := c.Build()
		if err != nil {
			t.Fatal(err)
		}
		p1, a1, _ := e1.FirstOrder(&c)
		c.Probe.Kind, c.Probe.Gyro = "dixon", 2
		e2, err := c.buildCurved()
		if err != nil {
			t.Fatal(err)
		}
		p2, a2, _ := e2.FirstOrder(&c)
		return e4(p1.Sub(p2)), e4(a1.Sub(a2))
	}
	p1, a1 := diff(0.2)
	p2, a2 := diff(0.1)
	t.Logf("Kerr probe − dixon (same NUT charge), first order: ratios at halved spin Δp %.3f, Δa %.3f", p1/p2, a1/a2)
	// O(a²) remainders; the next term is smaller by O(|a|/b) ≈ 0.06: 15 %.
	for _, r := range []float64{p1 / p2, a1 / a2} {
		if math.Abs(r/4-1) > 0.15 {
			t.Errorf("ratio %.3f, want 4", r)
		}
	}
}
