package fit_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"ricochet/observables/fit"
	"ricochet/validate/exact"
)

// darwinPoints returns n log-spaced points of the exact Darwin deflection
// (Darwin 1913) at v = 0.6 minus its first-order term, over
// 1e-4 ≤ ε ≤ 0.3, with σ of a few ulp of the deflection and Gaussian
// noise of that size.
func darwinPoints(tb testing.TB, n int) []fit.Point {
	tb.Helper()
	const v = 0.6
	c1, _, _ := exact.DarwinSeries(v)
	rng := rand.New(rand.NewPCG(uint64(n), 7))
	pts := make([]fit.Point, 0, n)
	for _, e := range logspace(1e-4, 0.3, n) {
		d, err := exact.Darwin(v, e)
		if err != nil {
			tb.Fatal(err)
		}
		sigma := 4e-16 * math.Abs(d.Chi)
		pts = append(pts, fit.Point{Eps: e, First: c1 * e, Residual: d.Chi - c1*e + sigma*rng.NormFloat64(), Sigma: sigma})
	}
	return pts
}

// BenchmarkFits10000: every fit of a 10000-point scan (exponent with its
// automatic window, next-order coefficient, breakdown couplings). The
// target is well under 2 s: the window search is bounded (at most
// 8 log₂ n + 64 windows) and one Givens pass serves all of them.
func BenchmarkFits10000(b *testing.B) {
	pts := darwinPoints(b, 10000)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := fit.Exponent(pts, nil); err != nil {
			b.Fatal(err)
		}
		if _, err := fit.NextOrder(pts, nil); err != nil {
			b.Fatal(err)
		}
		if _, err := fit.Breakdown(pts, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkFits64: the same for a scan of typical size.
func BenchmarkFits64(b *testing.B) {
	pts := darwinPoints(b, 64)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		fit.Exponent(pts, nil)
		fit.NextOrder(pts, nil)
		fit.Breakdown(pts, nil)
	}
}

// TestLargeScan: on 10000 points of the exact Darwin deflection (series in
// exact.DarwinSeries) the exponent 2 and the coefficients c2, c3 lie
// within 2σ of the fitted values.
func TestLargeScan(t *testing.T) {
	pts := darwinPoints(t, 10000)
	_, c2, c3 := exact.DarwinSeries(0.6)
	e, err := fit.Exponent(pts, nil)
	if err != nil {
		t.Fatal(err)
	}
	n, err := fit.NextOrder(pts, nil)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("n = %.12g ± %.2g (%d points, χ²/dof %.3g); c2 = %.14g ± %.2g, c3 = %.12g ± %.2g (degree %d, %d points, χ²/dof %.3g); exact c2 = %.14g, c3 = %.12g",
		e.N, e.SigmaN, e.Used, e.ReducedChi2(), n.C2, n.SigmaC2, n.C3, n.SigmaC3, n.Degree, n.Used, n.ReducedChi2(), c2, c3)
	if math.Abs(e.N-2) > 2*e.SigmaN {
		t.Errorf("exponent %v ± %v", e.N, e.SigmaN)
	}
	if math.Abs(n.C2-c2) > 2*n.SigmaC2 || math.Abs(n.C3-c3) > 2*n.SigmaC3 {
		t.Errorf("c2 = %v ± %v, c3 = %v ± %v; want %v, %v", n.C2, n.SigmaC2, n.C3, n.SigmaC3, c2, c3)
	}
}
