package integrate

import (
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/validate/exact"
)

// TestGeodesicDyonicReissnerNordstrom checks the integrated impulse of a
// charged test particle off a dyonic Reissner–Nordström background
// against the exact solution (the planar Reissner–Nordström radial
// problem on the Poincaré cone; validate/exact.DyonicReissnerNordstrom,
// Poincaré 1896 and Reissner 1916, Nordström 1918), including M = 0 and
// the strong magnetic coupling |qP|/(m b) = 0.1.
func TestGeodesicDyonicReissnerNordstrom(t *testing.T) {
	cases := []struct{ v, M, Q, P, qm float64 }{
		{0.6, 0.01, 0.005, 0.008, 1},
		{0.6, 0.01, -0.01, 0.02, -2},
		{0.9, 0.02, 0, 0.01, 5},
		{0.5, 0, 0.004, -0.006, 3}, // M = 0: the (Q² + P²) geometry alone
		{0.8, 1e-3, 0.002, 0.05, 2},
	}
	for _, c := range cases {
		ex, err := exact.DyonicReissnerNordstrom(c.v, 1, c.M, c.Q, c.P, c.qm)
		if err != nil {
			t.Fatal(err)
		}
		g := &Geodesic{Metric: spacetime.DyonicReissnerNordstrom(c.M, c.Q, c.P), M: 1, Q: c.qm}
		d, out := scatterExact(t, g, c.v, ex)
		t.Logf("%+v: χ = %.6f out-of-plane %.3e rel. error %.2e energy drift %.1e", c, ex.Chi, ex.Dir[2], d, out.Drift.Energy)
		if d > 1e-10 { // design target for the exact checks
			t.Errorf("%+v: relative error %.3g > 1e-10", c, d)
		}
	}
}

// TestDyonicFirstOrderDuality: at first order the electromagnetic part of
// the impulse depends on the charges only through (q − ig)(Q + iP)
// (DESIGN duality; Poincaré 1896 and Lorentz force, from memory), so the
// straight-line quadrature of an electric probe q off the dyonic
// Kerr–Newman field (Q, P), less the neutral probe's gravitational part,
// equals the flat-space first order of a dyon probe (q cos α, −q sin α),
// Q + iP = |Q + iP| e^{iα}, off the root-Kerr field of charge |Q + iP|
// with the same spin (the Kerr–Newman field at G → 0, Newman & Janis
// 1965): two different codes (jets of the curved potential with its Dirac
// string against the flat complex field).
func TestDyonicFirstOrderDuality(t *testing.T) {
	const m, b, q = 1.2, 1.0, 0.7
	worst := 0.0
	for _, k := range []spacetime.DyonicKerrNewman{
		{M: 0.3, A: 0.4, Q: 0.2, P: 0.5},
		{M: 0.1, A: -0.6, Q: -0.3, P: 0.25},
		{M: 0.2, Q: 0.1, P: -0.4},
	} {
		z := math.Hypot(k.Q, k.P)
		ca, sa := k.Q/z, k.P/z
		for _, gamma := range []float64{1.1, 2.5} {
			for _, d := range genericDirs {
				in, err := IncomingDir(m, gamma, b, d[0], d[1], vec.Vec3{})
				if err != nil {
					t.Fatal(err)
				}
				charged, _ := FirstOrder(&Geodesic{Metric: k, M: m, Q: q, Linear: true}, in, 0)
				neutral, _ := FirstOrder(&Geodesic{Metric: k, M: m, Linear: true}, in, 0)
				flat, _ := FirstOrder(&Charge{Field: em.RootKerr{Q: z, A: vec.Vec3{0, 0, k.A}}, M: m, Q: q * ca, G: -q * sa}, in, 0)
				got := charged.Sub(neutral)
				e := got.Sub(flat).Spatial().Norm() / flat.Spatial().Norm()
				worst = math.Max(worst, e)
				// Both quadratures converge geometrically to ~1e-13
				// (TestFirstOrderCurved).
				if e > 1e-11 {
					t.Errorf("%s γ = %g dir %v: curved EM first order %v, flat dyon %v, rel. diff %.2e", k.Name(), gamma, d[0], got, flat, e)
				}
			}
		}
	}
	t.Logf("worst relative difference curved dyonic vs flat dyon first order: %.2e", worst)
}
