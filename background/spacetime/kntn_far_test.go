package spacetime

import (
	"math"
	"testing"
)

// TestKerrNewmanNUTFarField checks that the Christoffel symbols of the
// exact Kerr–Newman–Taub–NUT metric keep their relative precision far from
// the source: against the linearized metric (EvalLinear, an independent
// formulation without terms of order one that cancel) the exact Γ differs
// at O((M + |N| + |a|)/r) relative, the terms of second order in the
// couplings, plus rounding. Before the metric was formed as η + h its
// four terms of order one cancelled to η, and Γ carried a relative
// rounding of ~1e-16 r/M (measured: 1e-5 at r = 1e9, M = 0.01, on
// directions off the equatorial plane; the geodesic force, and with it the
// start of the paths past a tilted background, went noisy). Every path of
// Evaluator is checked, the closed form of order 2 (kntnFirst), Taylor
// arithmetic at order 3 and jets, and the closed-form geodesic
// acceleration Accel (before: 8e-7 relative at r = 1e8).
func TestKerrNewmanNUTFarField(t *testing.T) {
	var largest float64 // the largest difference relative to its bound
	dirs := [][3]float64{{0.3, -0.5, 0.81}, {-0.77, 0.2, -0.6}, {0.9, 0.4, 0.17}}
	for _, m := range []KerrNewmanNUT{
		{M: 0.01, A: 0.007, N: 0.004, StringGauge: 1},
		{M: 0.01, A: -0.005, N: 0.003, Q: 0.002, StringGauge: -1},
		{M: 0.01, A: 0.007},
	} {
		lin := NewLinearEvaluator(m, 1)
		paths := []struct {
			name string
			ev   *Evaluator
		}{
			{"closed form", NewEvaluator(m, 2)},
			{"Taylor", NewEvaluator(m, 3)},
			{"jets", newJetEvaluator(m, 1, false)},
		}
		for _, r := range []float64{1e4, 1e6, 1e8, 1e10} {
			for _, d := range dirs {
				n := math.Sqrt(d[0]*d[0] + d[1]*d[1] + d[2]*d[2])
				x := [4]float64{0, r * d[0] / n, r * d[1] / n, r * d[2] / n}
				var pl Point
				lin.Eval(x, &pl)
				var scale float64
				for _, a := range pl.Gamma {
					for _, b := range a {
						for _, v := range b {
							scale = math.Max(scale, math.Abs(v))
						}
					}
				}
				// Second order in the couplings, relative O(coupling/r),
				// with a factor 10 for the number of terms; rounding 1e-14.
				tol := 10*(m.M+math.Abs(m.N)+math.Abs(m.A)+math.Abs(m.Q))/r + 1e-14
				// The closed-form geodesic acceleration against −Γ u u of
				// the linearized metric, for a fast generic velocity.
				u := [4]float64{1.6, 1.0, -0.5, 0.5}
				geo, _ := m.Accel(x, u)
				var wa, sa float64
				for mu := 0; mu < 4; mu++ {
					var v float64
					for a := 0; a < 4; a++ {
						for b := 0; b < 4; b++ {
							v -= pl.Gamma[mu][a][b] * u[a] * u[b]
						}
					}
					wa = math.Max(wa, math.Abs(v-geo[mu]))
					sa = math.Max(sa, math.Abs(v))
				}
				largest = math.Max(largest, wa/sa/tol)
				if wa/sa > tol {
					t.Errorf("%s, Accel, r = %g: differs from the linearized −Γuu by %.2e relative, want ≤ %.1e", m.Name(), r, wa/sa, tol)
				}
				for _, p := range paths {
					var pe Point
					p.ev.Eval(x, &pe)
					var worst float64
					for i := range pe.Gamma {
						for j := range pe.Gamma[i] {
							for k := range pe.Gamma[i][j] {
								worst = math.Max(worst, math.Abs(pe.Gamma[i][j][k]-pl.Gamma[i][j][k]))
							}
						}
					}
					largest = math.Max(largest, worst/scale/tol)
					if worst/scale > tol {
						t.Errorf("%s, %s, r = %g: Γ differs from the linearized Γ by %.2e relative, want ≤ %.1e", m.Name(), p.name, r, worst/scale, tol)
					}
				}
			}
		}
	}
	t.Logf("largest difference / bound: %.2g", largest)
}
