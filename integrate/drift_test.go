package integrate

import (
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// TestDriftSampling: the drift monitoring on every monitorEvery-th
// accepted step and at the stop (Drift) finds the same largest
// violations as monitoring every step, to within a factor of two (the
// documented claim; a sampled maximum can only be smaller), for spinless
// and spinning models in flat and curved backgrounds. Internal
// consistency of the monitoring; the violations themselves are checked
// against the conservation laws elsewhere.
func TestDriftSampling(t *testing.T) {
	spin := vec.Vec3{0, 0.3, 0.4}
	cases := []struct {
		m    Model
		v, b float64
		a    vec.Vec3
	}{
		{&Charge{Field: em.Coulomb{Q: 1}, M: 1, Q: 1}, 0.6, 10, vec.Vec3{}},
		{&Geodesic{Metric: spacetime.Schwarzschild(1), M: 1}, 0.5, 30, vec.Vec3{}},
		{&Geodesic{Metric: spacetime.KerrNewman{M: 1, A: 0.6, Q: 0.2}, M: 1, Q: 0.3}, 0.5, 30, vec.Vec3{}},
		{&BMT{Field: em.Coulomb{Q: 1}, M: 1, Q: 1, Gyro: 2}, 0.6, 10, spin},
		{&RootKerr{Field: em.RootKerr{Q: 1}, M: 1, Q: 1}, 0.6, 10, spin},
		{&Dixon{Metric: spacetime.Schwarzschild(1), M: 1, Gyro: 2}, 0.5, 30, spin},
	}
	defer func(n int) { monitorEvery = n }(monitorEvery)
	for _, c := range cases {
		in, err := Incoming(1, 1/math.Sqrt(1-c.v*c.v), c.b, c.a)
		if err != nil {
			t.Fatal(err)
		}
		var d [2]Drift
		for k, every := range []int{1, 4} {
			monitorEvery = every
			o, err := Scatter(c.m, in, &Settings{Tol: 1e-11, Radius: 1e3, SingleRun: true})
			if err != nil || o.Status != StatusScattered {
				t.Fatalf("%s: %v %v", c.m.Name(), err, o.Status)
			}
			d[k] = o.Drift
		}
		pairs := [][2]float64{{d[0].MassShell, d[1].MassShell}, {d[0].SpinOrth, d[1].SpinOrth},
			{d[0].SpinNorm, d[1].SpinNorm}, {d[0].Energy, d[1].Energy}, {d[0].AngularMomentumZ, d[1].AngularMomentumZ}}
		t.Logf("%-12s every step %+v", c.m.Name(), d[0])
		t.Logf("%-12s sampled    %+v", c.m.Name(), d[1])
		for i, p := range pairs {
			if math.IsNaN(p[0]) && math.IsNaN(p[1]) {
				continue
			}
			// Violations at the rounding level (below 1e-15; for J_z,
			// formed from x⃗ × p⃗ with |x⃗| up to R = 1e3 b, below
			// 4e-16 R/b relative to |p⃗| b) carry no information about
			// where they peak.
			floor := 1e-15
			if i == 4 {
				floor = 4e-16 * 1e3
			}
			if p[1] < p[0]/2 && p[0] > floor {
				t.Errorf("%s: drift %d sampled %.2e, every step %.2e", c.m.Name(), i, p[1], p[0])
			}
		}
	}
}

// TestObserveChangesNothing: watching the main run (Settings.Observe, for
// which the coordinate time is integrated as well) leaves the outcome bit
// for bit as it is without an observer, and the observed time grows along
// the path.
func TestObserveChangesNothing(t *testing.T) {
	for _, c := range budgetCases() {
		in, err := Incoming(1, 1/math.Sqrt(1-c.v*c.v), c.b, vec.Vec3{})
		if err != nil {
			t.Fatal(err)
		}
		set := &Settings{Tol: 1e-11, Radius: 1e3}
		a, err := Scatter(c.m, in, set)
		if err != nil {
			t.Fatal(err)
		}
		last, steps := math.Inf(-1), 0
		set.Observe = func(_ float64, y []float64) {
			if !(y[IX] > last) {
				t.Errorf("%s: time %v after %v", c.name, y[IX], last)
			}
			last = y[IX]
			steps++
		}
		b, err := Scatter(c.m, in, set)
		if err != nil {
			t.Fatal(err)
		}
		if a.Impulse != b.Impulse || a.ImpulseErr != b.ImpulseErr || a.Stats != b.Stats {
			t.Errorf("%s: with observer %v ± %v (%+v), without %v ± %v (%+v)", c.name,
				b.Impulse, b.ImpulseErr, b.Stats, a.Impulse, a.ImpulseErr, a.Stats)
		}
		if steps != a.Stats.Accepted {
			t.Errorf("%s: %d observed steps, %d accepted", c.name, steps, a.Stats.Accepted)
		}
	}
}
