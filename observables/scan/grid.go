package scan

import (
	"math"

	"ricochet/observables/scenario"
)

// Grid returns n log-spaced couplings from lo to hi, both included:
//
//	ε_k = lo (hi/lo)^{k/(n−1)},  k = 0 … n−1,
//
// with the last point set to hi exactly.
func Grid(lo, hi float64, n int) []float64 {
	g := make([]float64, n)
	for i := range g {
		g[i] = lo * math.Pow(hi/lo, float64(i)/float64(n-1))
	}
	g[n-1] = hi
	return g
}

// EpsGrid returns the coupling grid of a validated scenario.
func EpsGrid(s *scenario.Scenario) []float64 {
	return Grid(s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points)
}
