package spacetime

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestKerrNewmanNUTAccelClosedForm checks the closed-form geodesic and
// Lorentz accelerations of KerrNewmanNUT.Accel against the Christoffel
// symbols and field of the jet path (automatic differentiation in four
// variables, itself checked against the Kerr Kretschmann scalar and the
// Einstein–Maxwell equations in curvature_test.go) at random events and
// velocities, for every string gauge, both spin signs, charged and not,
// super-extremal included.
func TestKerrNewmanNUTAccelClosedForm(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 32))
	worstG, worstL := 0.0, 0.0
	for _, m := range []KerrNewmanNUT{
		{M: 1, N: 0.5},
		{M: 1, A: 0.6, N: 0.4, StringGauge: 1},
		{M: 0.8, A: -0.5, Q: 0.3, N: -0.7, StringGauge: -1},
		{M: 1, A: 0.5, Q: 0.6, N: 0.3, StringGauge: 0.3},
		{M: 1, A: 0.7},
		{M: 0.01, A: 0.4, Q: 0.005, N: 0.01},
		{M: 0.5, A: 1.3, Q: 0.2, N: 0.2},
		{M: 1, A: 0.5, Q: 0.6, P: -0.8, N: 0.3, StringGauge: 1},
		{M: 0.4, A: -0.7, P: 0.9, N: -0.5, StringGauge: 0.2},
		{M: 0.8, A: 0.3, Q: 0.1, P: 0.4, StringGauge: -1},
	} {
		ref := newJetEvaluator(m, 1, false)
		for _, x := range randomEvents(rng, 200, m.A, 2.5, 50) {
			var p Point
			ref.Eval(x, &p)
			u := [4]float64{1 + rng.Float64(), rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()}
			geo, lor := m.Accel(x, u)
			var wg, wl [4]float64
			var sg, sl float64 // scales: the largest term of each sum
			for mu := 0; mu < 4; mu++ {
				for al := 0; al < 4; al++ {
					for be := 0; be < 4; be++ {
						v := p.Gamma[mu][al][be] * u[al] * u[be]
						wg[mu] -= v
						sg = math.Max(sg, math.Abs(v))
					}
					for nu := 0; nu < 4; nu++ {
						v := p.GInv[mu][al] * p.F[al][nu] * u[nu]
						wl[mu] += v
						sl = math.Max(sl, math.Abs(v))
					}
				}
			}
			// The closed form works in the (t, r, c, φ) chart, whose
			// flat-space terms, of size |u⃗|²/r, cancel in the push-forward:
			// its rounding is relative to those, not to Γuu ∝ M.
			r := m.Radius(x)
			sg = math.Max(sg, (u[1]*u[1]+u[2]*u[2]+u[3]*u[3])/r)
			for mu := 0; mu < 4; mu++ {
				eg := math.Abs(geo[mu]-wg[mu]) / sg
				worstG = math.Max(worstG, eg)
				// Both exact; rounding of sums of ~10² terms of a few ulp,
				// amplified up to ~10-fold near the axis (sin²θ ≥ 0.1 here).
				if eg > 1e-13 {
					t.Errorf("%s at %v: geodesic acceleration[%d] %v, jets %v (rel %.3g)", m.Name(), x, mu, geo[mu], wg[mu], eg)
				}
				if sl > 0 {
					el := math.Abs(lor[mu]-wl[mu]) / sl
					worstL = math.Max(worstL, el)
					// No flat-space part: rounding relative to the terms.
					if el > 1e-13 {
						t.Errorf("%s at %v: Lorentz term[%d] %v, jets %v (rel %.3g)", m.Name(), x, mu, lor[mu], wl[mu], el)
					}
				} else if lor[mu] != 0 {
					t.Errorf("%s: Lorentz term without charge", m.Name())
				}
			}
		}
	}
	t.Logf("closed form vs jets: worst relative difference geodesic %.2g, Lorentz %.2g", worstG, worstL)
}
