package fit_test

import (
	"fmt"
	"math"

	"ricochet/observables/fit"
	"ricochet/validate/exact"
)

// darwinScan returns the deflection angle χ(ε) of Darwin's exact
// relativistic Coulomb solution (Darwin 1913; validate/exact) at
// n log-spaced couplings from 1e-3 to 1e-3·span as fit input: first order c₁ε, residual χ − c₁ε,
// and σ of a few units of rounding.
func darwinScan(v float64, n int, span float64) []fit.Point {
	c1, _, _ := exact.DarwinSeries(v)
	var pts []fit.Point
	for k := range n {
		eps := 1e-3 * math.Pow(span, float64(k)/float64(n-1))
		sc, err := exact.Darwin(v, eps)
		if err != nil {
			panic(err)
		}
		first := c1 * eps
		pts = append(pts, fit.Point{Eps: eps, First: first, Residual: sc.Chi - first, Sigma: 4e-16 * math.Abs(sc.Chi)})
	}
	return pts
}

// The residual of the first-order Coulomb deflection scales as ε²: the
// leading correction is the relativistic c₂ε² of Darwin's series.
func ExampleExponent() {
	e, err := fit.Exponent(darwinScan(0.6, 15, 30), nil)
	if err != nil {
		panic(err)
	}
	fmt.Printf("n = %.3f, |n - 2| < 3σ: %v\n", e.N, math.Abs(e.N-2) < 3*e.SigmaN)
	// Output:
	// n = 2.000, |n - 2| < 3σ: true
}

// The ε → 0 limit of residual/ε² is Darwin's c₂ = −π/(2(γv)²).
func ExampleNextOrder() {
	v := 0.6
	n, err := fit.NextOrder(darwinScan(v, 15, 30), nil)
	if err != nil {
		panic(err)
	}
	_, c2, _ := exact.DarwinSeries(v)
	fmt.Printf("c2 = %.5f (Darwin %.5f), covered: %v\n", n.C2, c2, math.Abs(n.C2-c2) < 3*n.SigmaC2)
	// Output:
	// c2 = -2.79253 (Darwin -2.79253), covered: true
}

// The coupling where the first-order prediction is off by 1 % and 10 %.
func ExampleBreakdown() {
	bs, err := fit.Breakdown(darwinScan(0.6, 15, 300), nil)
	if err != nil {
		panic(err)
	}
	for _, b := range bs {
		fmt.Printf("%g %%: found %v, eps = %.3g\n", 100*b.Threshold, b.Found, b.Eps)
	}
	// Output:
	// 1 %: found true, eps = 0.016
	// 10 %: found true, eps = 0.161
}
