package rk

import (
	"math"
	"testing"
)

// TestWeighDefaultEquivalent: a Weigh that reproduces the documented
// component-wise scaling must give the same steps and the same result as
// no Weigh at all, on the Kepler problem at e = 0.9 (Hairer, Nørsett &
// Wanner 1993, §II.10, from memory) checked against Kepler's equation.
func TestWeighDefaultEquivalent(t *testing.T) {
	const rtol = 1e-11
	y0 := keplerExact(0.9, 0)
	tEnd := 2 * math.Pi
	want := keplerExact(0.9, tEnd)
	plain := NewSolver(4, &Settings{RelTol: rtol})
	r0 := plain.Solve(kepler, 0, y0, tEnd, nil)
	weighed := NewSolver(4, &Settings{RelTol: rtol, Weigh: func(y, yNew, e []float64) {
		for i := range e {
			e[i] /= rtol + rtol*math.Max(math.Abs(y[i]), math.Abs(yNew[i]))
		}
	}})
	r1 := weighed.Solve(kepler, 0, y0, tEnd, nil)
	if r0.Stats != r1.Stats {
		t.Errorf("stats differ: %+v vs %+v", r0.Stats, r1.Stats)
	}
	for i := range r0.Y {
		if r0.Y[i] != r1.Y[i] {
			t.Errorf("y[%d]: %v vs %v", i, r0.Y[i], r1.Y[i])
		}
	}
	// Both follow the exact orbit to the tolerance times the pericentre
	// amplification (≲ 100 per period, as in TestKeplerEccentric).
	if d := math.Hypot(r1.Y[0]-want[0], r1.Y[1]-want[1]); d > 100*rtol*10 {
		t.Errorf("position error %.3g", d)
	}
}

// TestStepBound: every accepted step respects a state-dependent bound,
// here |h| ≤ 0.05 (1 + r) on the Kepler orbit, and the orbit is still
// followed to its exact solution.
func TestStepBound(t *testing.T) {
	y0 := keplerExact(0.9, 0)
	tEnd := 2 * math.Pi
	want := keplerExact(0.9, tEnd)
	bound := func(_ float64, y []float64) float64 { return 0.05 * (1 + math.Hypot(y[0], y[1])) }
	s := NewSolver(4, &Settings{RelTol: 1e-12, StepBound: bound})
	tPrev := 0.0
	yPrev := append([]float64(nil), y0...)
	worst := 0.0
	s.Observe = func(tt float64, y []float64) {
		if r := (tt - tPrev) / bound(tPrev, yPrev); r > worst {
			worst = r
		}
		tPrev = tt
		copy(yPrev, y)
	}
	res := s.Solve(kepler, 0, y0, tEnd, nil)
	if res.Status != StatusSuccess {
		t.Fatal(res.Status)
	}
	if worst > 1+1e-12 {
		t.Errorf("a step exceeded the bound by the factor %v", worst)
	}
	if d := math.Hypot(res.Y[0]-want[0], res.Y[1]-want[1]); d > 1e-9 {
		t.Errorf("position error %.3g", d)
	}
}
