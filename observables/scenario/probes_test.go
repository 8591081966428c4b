package scenario_test

import (
	"strings"
	"testing"

	"ricochet/integrate"
	"ricochet/observables/scenario"
)

func spinningScenario(t *testing.T, bg, probe string) *scenario.Scenario {
	t.Helper()
	s, err := scenario.Parse([]byte(`
name = "probe-test"
[background]
`+bg+`
[probe]
`+probe+`
[kinematics]
gamma = 1.6
b = 1.2
`), "probe-test.toml")
	if err != nil {
		t.Fatal(err)
	}
	if err := s.Validate(); err != nil {
		t.Fatal(err)
	}
	return s
}

// TestDixonProbe: kind dixon builds the flat-space Dixon body with its g;
// its first-order impulse is the closed form of the BMT probe with the
// Stern–Gerlach force (Bargmann, Michel & Telegdi 1959; observables/leading
// EMBMTImpulse) at finite spin, here against the quadrature of the body's
// own first-order force (1e-13: quadrature and closed form round at
// ~1e-15 of quantities of order one); its spin kick is the quadrature,
// which differs from the linear-in-spin closed form at O(a²).
func TestDixonProbe(t *testing.T) {
	s := spinningScenario(t, `kind = "dyon"
charge = 0.04
magnetic_charge = 0.03`, `kind = "dixon"
charge = 1.0
gyro = 1.3
spin = [0.1, -0.2, 0.3]`)
	if !s.Spinning() {
		t.Error("dixon probe not spinning")
	}
	ev, err := s.Build()
	if err != nil {
		t.Fatal(err)
	}
	d, ok := ev.Model.(*integrate.Dixon)
	if !ok || d.Gyro != 1.3 || d.Metric != nil {
		t.Fatalf("model %T %+v", ev.Model, ev.Model)
	}
	dp, da, src := ev.FirstOrder(s)
	qp, qa := integrate.FirstOrder(ev.Model, ev.In, 0)
	if e := dp.Sub(qp).Spatial().Norm() / qp.Spatial().Norm(); e > 1e-13 {
		t.Errorf("impulse: closed form %v, quadrature %v (rel %.2g)", dp, qp, e)
	}
	if da != qa || !strings.Contains(src, "BMT") {
		t.Errorf("spin kick %v, quadrature %v; source %q", da, qa, src)
	}
	// A root-Kerr source with spin: quadrature for both.
	s = spinningScenario(t, `kind = "root-kerr"
charge = 0.04
spin = [0, 0, 0.2]`, `kind = "dixon"
charge = 1.0
spin = [0.1, -0.2, 0.3]`)
	ev, _ = s.Build()
	if _, _, src := ev.FirstOrder(s); !strings.Contains(src, "quadrature of the first-order force") {
		t.Errorf("spinning source: %q", src)
	}
	if ev.Model.(*integrate.Dixon).Gyro != 2 {
		t.Errorf("default gyro %v", ev.Model.(*integrate.Dixon).Gyro)
	}
}

// TestRootKerrBodyProbe: kind root-kerr-body builds the body; its
// prediction is the complex-shifted closed form (Newman–Janis), equal to
// the quadrature of its own first-order force and torque (1e-13, as
// above).
func TestRootKerrBodyProbe(t *testing.T) {
	s := spinningScenario(t, `kind = "root-kerr"
charge = 0.05
spin = [0.0, 0.15, 0.3]`, `kind = "root-kerr-body"
charge = 1.0
spin = [0.2, 0.0, 0.1]`)
	ev, err := s.Build()
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := ev.Model.(*integrate.RootKerrBody); !ok {
		t.Fatalf("model %T", ev.Model)
	}
	dp, da, src := ev.FirstOrder(s)
	qp, qa := integrate.FirstOrder(ev.Model, ev.In, 0)
	if e := dp.Sub(qp).Spatial().Norm() / qp.Spatial().Norm(); e > 1e-13 || !strings.Contains(src, "closed form") {
		t.Errorf("impulse: %v, quadrature %v (rel %.2g), %q", dp, qp, e, src)
	}
	if e := da.Sub(qa).Spatial().Norm() / qa.Spatial().Norm(); e > 1e-13 {
		t.Errorf("spin kick: %v, quadrature %v (rel %.2g)", da, qa, e)
	}
	if !scenario.CanonicalMember("root-kerr-body") || !scenario.CanonicalMember("dixon") || scenario.CanonicalMember("bmt") || scenario.CanonicalMember("root-kerr") {
		t.Error("CanonicalMember labels")
	}
}

// TestGyroKinds: gyro is accepted for bmt and dixon only.
func TestGyroKinds(t *testing.T) {
	s, _ := scenario.Parse([]byte("[background]\nkind = \"coulomb\"\ncharge = 0.1\n[probe]\nkind = \"root-kerr-body\"\ncharge = 1\ngyro = 2.2\n[kinematics]\ngamma = 2\n"), "x.toml")
	if err := s.Validate(); err == nil || !strings.Contains(err.Error(), "bmt and dixon") {
		t.Errorf("gyro on root-kerr-body: %v", err)
	}
}
