package rk

import (
	"math"
	"testing"
)

func TestStatusMaxSteps(t *testing.T) {
	s := NewSolver(2, &Settings{MaxSteps: 5, RelTol: 1e-12})
	res := s.Solve(oscillator, 0, []float64{0, 1}, 100, nil)
	if res.Status != StatusMaxSteps || res.Status.Err() == nil {
		t.Fatalf("status %v, want MaxSteps", res.Status)
	}
	if n := res.Accepted + res.Rejected; n != 5 {
		t.Errorf("%d attempted steps, want 5", n)
	}
	// The returned state is the last accepted one: y = sin T (exact),
	// within 100 × tolerance.
	if math.Abs(res.Y[0]-math.Sin(res.T)) > 1e-10 {
		t.Errorf("state %v at T = %v", res.Y, res.T)
	}
}

func TestStatusNonFinite(t *testing.T) {
	// A right-hand side that returns NaN everywhere (at the start) and one
	// that returns NaN beyond t = 1 (every trial step across t = 1 fails
	// until the step is too small to make progress).
	nanAll := func(_ float64, _, dy []float64) { dy[0] = math.NaN() }
	nanLater := func(t float64, _, dy []float64) {
		dy[0] = 1
		if t > 1 {
			dy[0] = math.NaN()
		}
	}
	for _, c := range []struct {
		name string
		f    Func
		maxT float64
	}{{"at start", nanAll, 0}, {"after t = 1", nanLater, 1}} {
		s := NewSolver(1, nil)
		res := s.Solve(c.f, 0, []float64{0}, 2, nil)
		if res.Status != StatusNonFinite || res.Status.Err() == nil {
			t.Errorf("%s: status %v, want NonFinite", c.name, res.Status)
		}
		if res.T > c.maxT || math.IsNaN(res.Y[0]) {
			t.Errorf("%s: stopped at %v with %v", c.name, res.T, res.Y)
		}
	}
}

func TestStatusStepTooSmall(t *testing.T) {
	// y' = y², y(0) = 1 has the solution 1/(1 − t), which blows up at t = 1
	// (exact): the step must shrink below the resolution of t before 1.
	s := NewSolver(1, &Settings{RelTol: 1e-10})
	res := s.Solve(func(_ float64, y, dy []float64) { dy[0] = y[0] * y[0] }, 0, []float64{1}, 2, nil)
	if res.Status != StatusStepTooSmall || res.Status.Err() == nil {
		t.Fatalf("status %v at %v, want StepTooSmall", res.Status, res.T)
	}
	// The numerical solution blows up where the exact one does, up to the
	// accumulated relative error (~1e-10 per unit time, times the
	// amplification 1/(1−t)² of a time shift): |T − 1| < 1e-8, and the
	// state is huge there (1/(1−t) > 1e8 for |1 − t| < 1e-8).
	t.Logf("stopped at T = %.17g with y = %.3g after %d steps", res.T, res.Y[0], res.Accepted+res.Rejected)
	if math.Abs(res.T-1) > 1e-8 || !(res.Y[0] > 1e8) {
		t.Errorf("stopped at %v with y = %v, want T ≈ 1 and y > 1e8", res.T, res.Y[0])
	}
}

func TestStatusStrings(t *testing.T) {
	for _, c := range []struct {
		s    Status
		name string
		ok   bool
	}{
		{StatusSuccess, "Success", true}, {StatusEvent, "Event", true},
		{StatusStepTooSmall, "StepTooSmall", false}, {StatusMaxSteps, "MaxSteps", false},
		{StatusNonFinite, "NonFinite", false},
	} {
		if c.s.String() != c.name || (c.s.Err() == nil) != c.ok {
			t.Errorf("%d: %q %v", c.s, c.s.String(), c.s.Err())
		}
	}
}

func TestZeroAllocations(t *testing.T) {
	// A reused Solver allocates nothing per Solve (events included).
	s := NewSolver(4, &Settings{RelTol: 1e-10})
	y0 := keplerExact(0.9, 0)
	ev := []Event{{G: func(_ float64, y []float64) float64 { return y[1] }}}
	run := func() { s.Solve(kepler, 0, y0, 4*math.Pi, ev) }
	run()
	if n := testing.AllocsPerRun(10, run); n != 0 {
		t.Errorf("%v allocations per Solve, want 0", n)
	}
}

func TestPanics(t *testing.T) {
	mustPanic := func(name string, f func()) {
		defer func() {
			if recover() == nil {
				t.Errorf("%s: no panic", name)
			}
		}()
		f()
	}
	mustPanic("dim 0", func() { NewSolver(0, nil) })
	mustPanic("len(y0)", func() { NewSolver(2, nil).Solve(oscillator, 0, []float64{1}, 1, nil) })
	mustPanic("Interpolate before Solve", func() { NewSolver(2, nil).Interpolate(0, make([]float64, 2)) })
}
