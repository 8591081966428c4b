package rk

import (
	"math"
	"testing"
)

// oscillator is d²y/dt² = −y with state (y, y'); from (0, 1) the exact solution
// is y = sin t.
func oscillator(_ float64, y, dy []float64) {
	dy[0] = y[1]
	dy[1] = -y[0]
}

func TestEventLocation(t *testing.T) {
	// Zeros of sin t are kπ (exact). Falling crossings of y = sin t are at
	// π, 3π, …; rising ones at 2π, 4π, ….
	cases := []struct {
		name      string
		direction int
		wantT     float64
	}{
		{"any", 0, math.Pi},
		{"falling", -1, math.Pi},
		{"rising", +1, 2 * math.Pi},
	}
	for _, tab := range methods() {
		for _, c := range cases {
			s := NewSolver(2, &Settings{Method: tab, RelTol: 1e-13})
			ev := []Event{{G: func(_ float64, y []float64) float64 { return y[0] }, Direction: c.direction, Terminal: true}}
			res := s.Solve(oscillator, 0, []float64{0, 1}, 10, ev)
			if res.Status != StatusEvent || res.Event != 0 {
				t.Fatalf("%s %s: status %v event %d", tab.Name, c.name, res.Status, res.Event)
			}
			// 1e-12: the root is found to ~1 ulp on the dense output,
			// whose own error at tolerance 1e-13 is ~1e-13 over a few
			// steps; |y'| = 1 at the root converts state error to time
			// error one to one.
			if d := math.Abs(res.T - c.wantT); d > 1e-12 {
				t.Errorf("%s %s: root at %.17g, want %.17g (diff %.3g)", tab.Name, c.name, res.T, c.wantT, d)
			}
			// The state returned is the state at the root: (0, cos T).
			if math.Abs(res.Y[0]) > 1e-12 || math.Abs(res.Y[1]-math.Cos(c.wantT)) > 1e-12 {
				t.Errorf("%s %s: state at root %v", tab.Name, c.name, res.Y)
			}
		}
	}
}

func TestEventNonTerminal(t *testing.T) {
	// Non-terminal events are reported in order and do not stop the run:
	// zeros of sin t in (0, 10) are π, 2π, 3π (exact); zeros of cos t are
	// π/2, 3π/2, 5π/2.
	s := NewSolver(2, &Settings{RelTol: 1e-13})
	type rec struct {
		i int
		t float64
	}
	var got []rec
	s.OnEvent = func(i int, t float64, _ []float64) { got = append(got, rec{i, t}) }
	ev := []Event{
		{G: func(_ float64, y []float64) float64 { return y[0] }},
		{G: func(_ float64, y []float64) float64 { return y[1] }},
	}
	res := s.Solve(oscillator, 0, []float64{0, 1}, 10, ev)
	if res.Status != StatusSuccess || res.T != 10 {
		t.Fatalf("status %v at %v", res.Status, res.T)
	}
	want := []rec{{1, math.Pi / 2}, {0, math.Pi}, {1, 3 * math.Pi / 2}, {0, 2 * math.Pi}, {1, 5 * math.Pi / 2}, {0, 3 * math.Pi}}
	if len(got) != len(want) {
		t.Fatalf("got %d events %v, want %d", len(got), got, len(want))
	}
	for k := range want {
		// 1e-12 as in TestEventLocation.
		if got[k].i != want[k].i || math.Abs(got[k].t-want[k].t) > 1e-12 {
			t.Errorf("event %d: got %v, want %v", k, got[k], want[k])
		}
	}
}

func TestEventBackward(t *testing.T) {
	// Backward from t = 4 (state (sin 4, cos 4)): the first zero of sin t
	// met is π (exact).
	s := NewSolver(2, &Settings{RelTol: 1e-13})
	ev := []Event{{G: func(_ float64, y []float64) float64 { return y[0] }, Terminal: true}}
	res := s.Solve(oscillator, 4, []float64{math.Sin(4), math.Cos(4)}, -10, ev)
	if res.Status != StatusEvent || math.Abs(res.T-math.Pi) > 1e-12 {
		t.Errorf("backward event: %v at %.17g, want π", res.Status, res.T)
	}
}

func TestInterpolateAfterSolve(t *testing.T) {
	// The dense output of the last step reproduces sin t, cos t to the
	// accuracy of the run (exact solution; 1e-11 = 100 × tolerance).
	s := NewSolver(2, &Settings{RelTol: 1e-13})
	res := s.Solve(oscillator, 0, []float64{0, 1}, 3, nil)
	if res.Status != StatusSuccess {
		t.Fatal(res.Status)
	}
	y := make([]float64, 2)
	for _, tt := range []float64{s.tOld, s.tOld + 0.5*s.h, 3} {
		s.Interpolate(tt, y)
		if math.Abs(y[0]-math.Sin(tt)) > 1e-11 || math.Abs(y[1]-math.Cos(tt)) > 1e-11 {
			t.Errorf("Interpolate(%v) = %v, want (%v, %v)", tt, y, math.Sin(tt), math.Cos(tt))
		}
	}
}

// TestEventAtStep: a terminal AtStep event stops at the end of the first
// accepted step past the crossing, without root finding: the state there
// is the solver's own (exp(t) for y' = y, exact solution e^t to the
// tolerance), past the crossing, and no dense-output stages are spent.
func TestEventAtStep(t *testing.T) {
	f := func(_ float64, y, dy []float64) { dy[0] = y[0] }
	ev := []Event{{G: func(_ float64, y []float64) float64 { return y[0] - 10 }, Terminal: true, AtStep: true}}
	s := NewSolver(1, &Settings{RelTol: 1e-12})
	res := s.Solve(f, 0, []float64{1}, 100, ev)
	if res.Status != StatusEvent || res.Event != 0 {
		t.Fatalf("status %v event %d", res.Status, res.Event)
	}
	if !(res.Y[0] >= 10) || math.Abs(res.Y[0]-math.Exp(res.T)) > 1e-10*res.Y[0] {
		t.Errorf("stopped at t = %v with y = %v (exact e^t = %v), want y ≥ 10", res.T, res.Y[0], math.Exp(res.T))
	}
	// One evaluation for the start, one for the starting-step algorithm
	// and 12 per attempted step (13 stages, the last FSAL): no extra
	// dense-output stages.
	if want := 2 + 12*(res.Accepted+res.Rejected); res.Evaluations != want {
		t.Errorf("evaluations %d, want %d", res.Evaluations, want)
	}
}
