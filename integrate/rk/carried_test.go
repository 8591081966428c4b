package rk

import (
	"math"
	"testing"
)

// TestCarried: a component carried along (Settings.Carried) leaves the
// steps and the other components bit for bit as they are without it, with
// the default scaling and with Weights, and is itself integrated (here the
// clock dc/dt = 1, which every Runge–Kutta method integrates exactly up to
// rounding). Problem: the Kepler orbit of Hairer, Nørsett & Wanner (1993,
// §II.10, eccentricity 0.5), as in problems_test.go.
func TestCarried(t *testing.T) {
	const e = 0.5
	y0 := []float64{1 - e, 0, 0, math.Sqrt((1 + e) / (1 - e))}
	kepler := func(_ float64, y, dy []float64) {
		r := math.Hypot(y[0], y[1])
		r3 := r * r * r
		dy[0], dy[1], dy[2], dy[3] = y[2], y[3], -y[0]/r3, -y[1]/r3
		if len(dy) > 4 {
			dy[4] = 1
		}
	}
	weights := func(y, yNew, w []float64) {
		for i := 0; i < 4; i++ {
			w[i] = 1 / (1e-10 + 1e-10*math.Max(math.Abs(y[i]), math.Abs(yNew[i])))
		}
	}
	for _, wt := range []func(y, yNew, w []float64){nil, weights} {
		var steps [2][][]float64
		var res [2]Result
		for k, n := range []int{4, 5} {
			set := &Settings{RelTol: 1e-10, Weights: wt, Carried: n - 4}
			if wt != nil && n == 5 {
				set.Weights = func(y, yNew, w []float64) { weights(y, yNew, w); w[4] = 7 } // ignored
			}
			s := NewSolver(n, set)
			s.Observe = func(t float64, y []float64) { steps[k] = append(steps[k], append([]float64{t}, y[:4]...)) }
			y := append([]float64(nil), y0...)
			if n == 5 {
				y = append(y, 0)
			}
			res[k] = s.Solve(kepler, 0, y, 2*math.Pi, nil)
			if res[k].Status != StatusSuccess {
				t.Fatalf("status %v", res[k].Status)
			}
		}
		if res[0].Stats != res[1].Stats || len(steps[0]) != len(steps[1]) {
			t.Fatalf("weights %v: stats %+v vs %+v", wt != nil, res[0].Stats, res[1].Stats)
		}
		for i := range steps[0] {
			for j := range steps[0][i] {
				if steps[0][i][j] != steps[1][i][j] {
					t.Fatalf("step %d component %d: %v vs %v", i, j, steps[0][i][j], steps[1][i][j])
				}
			}
		}
		// The clock: 2π to rounding of the sum of the steps.
		if c := res[1].Y[4]; math.Abs(c-2*math.Pi) > 1e-12 {
			t.Errorf("carried clock %v, want 2π", c)
		}
	}
}

// TestReuse: a Solver reused with other settings (Reuse) integrates
// exactly as a new one with those settings, and one of another dimension
// or method is not reused. Problem: the Kepler orbit (eccentricity 0.5)
// of TestCarried.
func TestReuse(t *testing.T) {
	const e = 0.5
	y0 := []float64{1 - e, 0, 0, math.Sqrt((1 + e) / (1 - e))}
	kepler := func(_ float64, y, dy []float64) {
		r := math.Hypot(y[0], y[1])
		r3 := r * r * r
		dy[0], dy[1], dy[2], dy[3] = y[2], y[3], -y[0]/r3, -y[1]/r3
	}
	var old *Solver
	for _, tol := range []float64{1e-6, 1e-10, 1e-8} {
		set := &Settings{RelTol: tol, Predictive: tol < 1e-7}
		fresh := NewSolver(4, set).Solve(kepler, 0, y0, 2*math.Pi, nil)
		a := fresh.Stats
		ya := append([]float64(nil), fresh.Y...)
		s := Reuse(old, 4, set)
		if old != nil && s != old {
			t.Error("compatible solver not reused")
		}
		got := s.Solve(kepler, 0, y0, 2*math.Pi, nil)
		if got.Stats != a {
			t.Fatalf("tol %g: stats %+v, fresh %+v", tol, got.Stats, a)
		}
		for i := range ya {
			if got.Y[i] != ya[i] {
				t.Fatalf("tol %g: y[%d] = %v, fresh %v", tol, i, got.Y[i], ya[i])
			}
		}
		old = s
	}
	if Reuse(old, 5, nil) == old || Reuse(old, 4, &Settings{Method: DormandPrince54()}) == old {
		t.Error("solver of another dimension or method reused")
	}
}
