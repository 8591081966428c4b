package rk

import (
	"fmt"
	"math"
	"testing"
)

// Work–precision on the Kepler problem at eccentricity 0.9 over one period
// (Hairer, Nørsett & Wanner 1993, §II.10, Fig. 10.x style diagrams, from
// memory): right-hand-side evaluations against the final position error.

var keplerY0 = keplerExact(0.9, 0)

func keplerRun(s *Solver) (evals int, err float64) {
	y0 := keplerY0
	res := s.Solve(kepler, 0, y0, 2*math.Pi, nil)
	// After one period the exact state is the initial one (pericenter).
	return res.Evaluations, math.Hypot(res.Y[0]-y0[0], res.Y[1]-y0[1])
}

func BenchmarkWorkPrecision(b *testing.B) {
	for _, tab := range methods() {
		for _, tol := range []float64{1e-6, 1e-8, 1e-10, 1e-12, 1e-14} {
			b.Run(fmt.Sprintf("%s/tol=%g", tab.Name, tol), func(b *testing.B) {
				s := NewSolver(4, &Settings{Method: tab, RelTol: tol})
				var evals int
				var err float64
				b.ReportAllocs()
				for i := 0; i < b.N; i++ {
					evals, err = keplerRun(s)
				}
				b.ReportMetric(float64(evals), "evals/op")
				b.ReportMetric(math.Log10(err), "log10(error)")
			})
		}
	}
}

func TestWorkPrecisionTable(t *testing.T) {
	// Prints, for each method, the fewest evaluations over a tolerance
	// scan (10^(−k/4), k = 16…60) that reach final position errors of
	// 1e-8 and 1e-12 on Kepler e = 0.9 over one period. Asserts that every
	// method reaches 1e-8, and that the 8th-order DormandPrince853 needs fewer
	// evaluations than both 5th-order pairs at 1e-12 (high order wins at
	// stringent tolerances: Hairer, Nørsett & Wanner 1993, §II.10).
	if testing.Short() {
		t.Skip("work–precision scan skipped in -short mode")
	}
	targets := []float64{1e-8, 1e-12}
	best := map[string][]int{}
	for _, tab := range methods() {
		need := []int{-1, -1}
		for k := 16; k <= 60; k++ {
			tol := math.Pow(10, -float64(k)/4)
			evals, err := keplerRun(NewSolver(4, &Settings{Method: tab, RelTol: tol}))
			for i, target := range targets {
				if err <= target && (need[i] < 0 || evals < need[i]) {
					need[i] = evals
				}
			}
		}
		best[tab.Name] = need
		t.Logf("%-16s evaluations for error ≤ 1e-8: %6d   ≤ 1e-12: %6d", tab.Name, need[0], need[1])
		if need[0] < 0 {
			t.Errorf("%s never reaches 1e-8", tab.Name)
		}
	}
	d := best["DormandPrince853"][1]
	for _, name := range []string{"DormandPrince54", "Tsitouras54"} {
		if o := best[name][1]; d < 0 || (o >= 0 && d >= o) {
			t.Errorf("DormandPrince853 needs %d evaluations for 1e-12, %s %d", d, name, o)
		}
	}
}
