package rk

import (
	"math"
	"runtime"
	"testing"
)

// TestUnrolledStepForStep: the generated stepper of each built-in pair
// takes the same steps as the generic tableau-driven one on the Kepler
// problem at e = 0.9 (Hairer, Nørsett & Wanner 1993, §II.10, from
// memory), with the default error scaling and with Weights. On amd64 the
// two execute the same floating-point operations in the same order, so
// every accepted state must agree bit for bit; elsewhere the compiler may
// fuse multiply–adds differently in the two, and a few ulp are allowed.
func TestUnrolledStepForStep(t *testing.T) {
	tol := 0.0
	if runtime.GOARCH != "amd64" {
		tol = 1e-13
	}
	weights := func(y, yNew, w []float64) {
		for i := range w {
			w[i] = 1 / (1e-11 * (1 + math.Max(math.Abs(y[i]), math.Abs(yNew[i]))))
		}
	}
	for _, tab := range methods() {
		for _, wt := range []func(y, yNew, w []float64){nil, weights} {
			run := func(generic bool) ([][]float64, Stats) {
				s := NewSolver(4, &Settings{Method: tab, RelTol: 1e-11, Weights: wt})
				if s.kern == nil {
					t.Fatalf("%s: no generated stepper", tab.Name)
				}
				if generic {
					s.kern = nil
				}
				var steps [][]float64
				s.Observe = func(tt float64, y []float64) {
					steps = append(steps, append([]float64{tt}, y...))
				}
				res := s.Solve(kepler, 0, keplerExact(0.9, 0), 2*math.Pi, nil)
				return steps, res.Stats
			}
			a, sa := run(false)
			b, sb := run(true)
			if sa != sb || len(a) != len(b) {
				t.Fatalf("%s: stats %+v (generated) vs %+v (generic)", tab.Name, sa, sb)
			}
			for i := range a {
				for j := range a[i] {
					if d := math.Abs(a[i][j] - b[i][j]); d > tol*math.Max(1, math.Abs(b[i][j])) {
						t.Fatalf("%s: step %d component %d: %v (generated) vs %v (generic)", tab.Name, i, j, a[i][j], b[i][j])
					}
				}
			}
			t.Logf("%s (weights %v): %d identical steps", tab.Name, wt != nil, len(a))
		}
	}
	// A modified tableau must not use the generated stepper.
	tab := DormandPrince853()
	tab.B[0] += 1e-17
	tab.B[5] -= 1e-16
	if NewSolver(2, &Settings{Method: tab}).kern != nil {
		t.Error("modified tableau runs on the generated stepper")
	}
}
