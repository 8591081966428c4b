package spacetime

import (
	"math"
	"testing"
)

// TestKerrSchildClosedForm checks the closed-form Kerr–Schild data and the
// accelerations derived from them against the automatic differentiation
// of the metric (Evaluator, whose curvature is itself checked against the
// Kerr Kretschmann scalar and the Einstein equations): the metric, the
// potential, the geodesic acceleration −Γ^μ_αβ u^α u^β and the Lorentz
// term g^μα F_αν u^ν, for the Schwarzschild, Reissner–Nordström, Kerr and
// Kerr–Newman members (one super-extremal) at events on and off the
// equatorial plane.
func TestKerrSchildClosedForm(t *testing.T) {
	metrics := []KerrNewman{
		Schwarzschild(1),
		ReissnerNordstrom(1, 0.6),
		Kerr(1, 0.7),
		{M: 1, A: -0.5, Q: 0.4},
		{M: 0.3, A: 1.2, Q: 0.5},
	}
	events := [][4]float64{
		{0, 7, -3, 2},
		{1.5, -4, 5, -6},
		{0, 3, 1, 0},
		{-2, 0.5, -2.5, 1.8},
		{0, 40, 25, -12},
	}
	us := [][4]float64{
		{1.3, 0.4, -0.6, 0.5},
		{2.1, -1.2, 0.3, 1.4},
	}
	worstG, worstL := 0.0, 0.0
	defer func() { t.Logf("largest relative differences: geodesic %.2g, Lorentz %.2g", worstG, worstL) }()
	for _, k := range metrics {
		ev := NewEvaluator(k, 1)
		var pt Point
		var ks KerrSchildPoint
		for _, x := range events {
			ev.Eval(x, &pt)
			k.KerrSchild(x, &ks)
			for _, u := range us {
				geo, lor := ks.Accel(u)
				vl, A := ks.Lower(u)
				var scale, scaleA float64
				var want, wantL, wantV [4]float64
				for m := 0; m < 4; m++ {
					var fu [4]float64
					for a := 0; a < 4; a++ {
						for b := 0; b < 4; b++ {
							want[m] -= pt.Gamma[m][a][b] * u[a] * u[b]
						}
						wantV[m] += pt.G[m][a] * u[a]
						for n := 0; n < 4; n++ {
							fu[a] += pt.F[a][n] * u[n]
						}
					}
					for a := 0; a < 4; a++ {
						wantL[m] += pt.GInv[m][a] * fu[a]
					}
					scale = math.Max(scale, math.Abs(want[m]))
					scaleA = math.Max(scaleA, math.Abs(wantL[m])+math.Abs(pt.A[m]))
				}
				for m := 0; m < 4; m++ {
					worstG = math.Max(worstG, math.Abs(geo[m]-want[m])/scale)
					if scaleA > 0 {
						worstL = math.Max(worstL, math.Abs(lor[m]-wantL[m])/scaleA)
					}
					// Both sides are exact; the tolerance is rounding in
					// the two orders of evaluation (a few ulp of the
					// largest component, amplified near r ~ a).
					if d := math.Abs(geo[m] - want[m]); d > 1e-13*scale {
						t.Errorf("%v at %v u=%v: geodesic acceleration[%d] = %.16g, AD %.16g", k, x, u, m, geo[m], want[m])
					}
					if d := math.Abs(lor[m] - wantL[m]); d > 1e-13*math.Max(scaleA, 1e-300) {
						t.Errorf("%v at %v u=%v: Lorentz term[%d] = %.16g, AD %.16g", k, x, u, m, lor[m], wantL[m])
					}
					if d := math.Abs(vl[m] - wantV[m]); d > 1e-14*math.Abs(u[0]) {
						t.Errorf("%v at %v: lowered velocity[%d] = %.16g, AD %.16g", k, x, m, vl[m], wantV[m])
					}
					if d := math.Abs(A[m] - pt.A[m]); d > 1e-15 {
						t.Errorf("%v at %v: A[%d] = %.16g, AD %.16g", k, x, m, A[m], pt.A[m])
					}
				}
			}
		}
	}
}
