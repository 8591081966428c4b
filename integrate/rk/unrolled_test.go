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
				s.fix = nil // TestFixedStepForStep
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

// TestFixedStepForStep: the fixed-size steppers of the default pair (for
// the dimensions of gen_unrolled.go's fixedDims) take the same steps as
// the generic tableau-driven stepper, with Weights (the only error scaling
// they replace) and without, on direct sums of published test problems of
// those dimensions: Kepler orbits at e = 0.9 and 0.5 (Hairer, Nørsett &
// Wanner 1993, §II.10) and the Arenstorf orbit (§II.0), plus a carried
// clock (Settings.Carried) for the odd dimensions. Bit for bit on amd64
// (the same operations in the same order), a few ulp elsewhere (fused
// multiply–adds).
func TestFixedStepForStep(t *testing.T) {
	tol := 0.0
	if runtime.GOARCH != "amd64" {
		tol = 1e-13
	}
	weights := func(y, yNew, w []float64) {
		for i := range w {
			w[i] = 1 / (1e-11 * (1 + math.Max(math.Abs(y[i]), math.Abs(yNew[i]))))
		}
	}
	// The blocks are integrated side by side; a carried clock (dy = 1)
	// comes last.
	type block struct {
		f  Func
		y0 []float64
	}
	blocks := []block{{kepler, keplerExact(0.9, 0)}, {arenstorf, arenstorfY0}, {kepler, keplerExact(0.5, 0)}}
	for _, d := range []struct{ blocks, carried int }{{2, 0}, {2, 1}, {3, 0}, {3, 1}} {
		n := 4*d.blocks + d.carried
		f := func(tt float64, y, dy []float64) {
			for b := 0; b < d.blocks; b++ {
				blocks[b].f(tt, y[4*b:4*b+4], dy[4*b:4*b+4])
			}
			if d.carried == 1 {
				dy[n-1] = 1
			}
		}
		y0 := make([]float64, n)
		for b := 0; b < d.blocks; b++ {
			copy(y0[4*b:], blocks[b].y0)
		}
		for _, wt := range []func(y, yNew, w []float64){nil, weights} {
			run := func(generic bool) ([][]float64, Stats) {
				s := NewSolver(n, &Settings{RelTol: 1e-11, Weights: wt, Carried: d.carried})
				if s.fix == nil {
					t.Fatalf("dimension %d, carried %d: no fixed-size stepper", n, d.carried)
				}
				if generic {
					s.kern, s.fix = nil, nil
				}
				var steps [][]float64
				s.Observe = func(tt float64, y []float64) {
					steps = append(steps, append([]float64{tt}, y...))
				}
				res := s.Solve(f, 0, y0, arenstorfT, nil)
				return steps, res.Stats
			}
			a, sa := run(false)
			b, sb := run(true)
			if sa != sb || len(a) != len(b) {
				t.Fatalf("dimension %d: stats %+v (fixed) vs %+v (generic)", n, sa, sb)
			}
			for i := range a {
				for j := range a[i] {
					if dd := math.Abs(a[i][j] - b[i][j]); dd > tol*math.Max(1, math.Abs(b[i][j])) {
						t.Fatalf("dimension %d: step %d component %d: %v (fixed) vs %v (generic)", n, i, j, a[i][j], b[i][j])
					}
				}
			}
			t.Logf("dimension %d, carried %d (weights %v): %d identical steps", n, d.carried, wt != nil, len(a))
		}
	}
	// Reuse picks the stepper for the new carried count.
	s := NewSolver(9, &Settings{Carried: 1})
	if s = Reuse(s, 9, &Settings{}); s.fix != nil {
		t.Error("dimension 9 without carried components: fixed-size stepper for 8 controlled")
	}
}
