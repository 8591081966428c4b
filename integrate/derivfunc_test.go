package integrate

import (
	"math"
	"math/rand"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// TestDerivFuncs: every specialised right-hand side (DerivFuncer) agrees
// with the model's general Deriv — complex field arithmetic for the
// charge, the Kerr–Schild data or the automatic differentiation of the
// metric for geodesics — at random states, to rounding (internal
// consistency; the general forms are checked against exact solutions
// elsewhere). A model family without a specialised form must return nil.
func TestDerivFuncs(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	models := []Model{
		&Charge{Field: em.Coulomb{Q: 0.7}, M: 1.3, Q: -0.4},
		&Charge{Field: em.Dyon{Q: 0.2, P: -0.5}, M: 0.8, Q: 0.3, G: 0.6},
		&Charge{Field: em.Monopole{P: 0.4}, M: 1, Q: 1},
		&Charge{Field: em.RootKerr{Q: 0.3, P: 0.1}, M: 1, Q: 1, G: -0.2},
		&Geodesic{Metric: spacetime.Schwarzschild(0.3), M: 1.2},
		&Geodesic{Metric: spacetime.ReissnerNordstrom(0.3, 0.2), M: 0.9, Q: -0.7},
		&Geodesic{Metric: spacetime.KerrNewman{M: 0.3, A: 0.2, Q: 0.1}, M: 1, Q: 0.5},
		&Geodesic{Metric: spacetime.KerrNewmanNUT{M: 0.3, A: 0.2, Q: 0.1, N: 0.2, StringGauge: 1}, M: 1, Q: 0.5},
		&Geodesic{Metric: spacetime.KerrNewmanNUT{M: 0.3, A: -0.4, N: -0.1, StringGauge: 0.3}, M: 1.1},
	}
	for _, m := range models {
		f := m.(DerivFuncer).DerivFunc()
		if f == nil {
			t.Fatalf("%s: no specialised right-hand side", m.Name())
		}
		// The automatic differentiation as the second reference for
		// geodesics (the Kerr–Schild path is what Deriv uses).
		var ad Model
		if g, ok := m.(*Geodesic); ok {
			ad = &Geodesic{Metric: autodiffOnly{g.Metric}, M: g.M, Q: g.Q}
		}
		worst := 0.0
		for k := 0; k < 200; k++ {
			y := make([]float64, 8)
			dir := vec.Vec3{rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()}.Unit()
			x := dir.Scale(2 + 50*rng.Float64())
			put(y, IX, vec.FromSpatial(rng.Float64(), x))
			put(y, IP, vec.Vec4{0, rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()})
			m.Normalize(y, 0)
			a, b := make([]float64, 8), make([]float64, 8)
			f(y, a)
			m.Deriv(y, b)
			refs := [][]float64{b}
			if ad != nil {
				c := make([]float64, 8)
				ad.Deriv(y, c)
				refs = append(refs, c)
			}
			// Both NUT forms work in the (r, cos θ, φ) chart, singular on
			// the axis: their rounding grows as 1/sin²θ, which the random
			// directions bring up to ~10³, and is relative to the chart's
			// flat-space terms |p⃗|²/(m r), which cancel.
			amp, flat := 1.0, 0.0
			if g, ok := m.(*Geodesic); ok && isNUT(g.Metric) {
				amp = x.Dot(x) / (x[0]*x[0] + x[1]*x[1])
				flat = (y[IP+1]*y[IP+1] + y[IP+2]*y[IP+2] + y[IP+3]*y[IP+3]) / (g.M * math.Sqrt(x.Dot(x)))
			}
			for _, ref := range refs {
				scale := flat
				for i := IP; i < IP+4; i++ {
					scale = math.Max(scale, math.Abs(ref[i]))
				}
				scale *= amp
				for i := range a {
					s := scale
					if i < IP {
						s = math.Max(1, math.Abs(ref[i]))
					}
					worst = math.Max(worst, math.Abs(a[i]-ref[i])/s)
				}
			}
		}
		t.Logf("%-50s largest relative difference %.1e", m.Name(), worst)
		// Rounding of a few dozen operations on O(1) numbers; r ≥ 2
		// keeps away from the horizon, where the forms lose precision
		// differently.
		if worst > 1e-13 {
			t.Errorf("%s: specialised right-hand side differs by %.2g", m.Name(), worst)
		}
	}
	if (&Charge{Field: em.RootKerr{Q: 1, A: vec.Vec3{0, 0, 1}}, M: 1, Q: 1}).DerivFunc() != nil {
		t.Error("shifted root-Kerr field: want no real-arithmetic path")
	}
	if (&Geodesic{Metric: spacetime.Schwarzschild(1), M: 1, Linear: true}).DerivFunc() != nil {
		t.Error("linearised geodesic: want no specialised path")
	}
}

// autodiffOnly hides a metric's closed-form Kerr–Schild data, so that
// Geodesic falls back to the automatic differentiation.
type autodiffOnly struct{ spacetime.Metric }

func isNUT(m spacetime.Metric) bool {
	_, ok := m.(spacetime.KerrNewmanNUT)
	return ok
}
