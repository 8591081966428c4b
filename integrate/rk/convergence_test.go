package rk

import (
	"math"
	"testing"
)

// fixedSteps integrates with n equal steps from (t0, y0) to t1, without error
// control, leaving the result in s.y. After each step, step(tOld, h) is
// called with the dense output of that step available.
func fixedSteps(s *Solver, f Func, t0 float64, y0 []float64, t1 float64, n int, step func(tOld, h float64)) []float64 {
	copy(s.y, y0)
	s.f = f
	h := (t1 - t0) / float64(n)
	for i := 0; i < n; i++ {
		t := t0 + float64(i)*h
		f(t, s.y, s.k[0])
		s.attempt(f, t, h)
		s.tOld, s.h = t, h
		s.y, s.yOld, s.yNew = s.yNew, s.y, s.yOld
		s.step, s.dense = true, false
		if step != nil {
			step(t, h)
		}
	}
	return s.y
}

// slope returns the least-squares slope of log(err) against log(h).
func slope(h, err []float64) float64 {
	var sx, sy, sxx, sxy float64
	n := float64(len(h))
	for i := range h {
		x, y := math.Log(h[i]), math.Log(err[i])
		sx += x
		sy += y
		sxx += x * x
		sxy += x * y
	}
	return (n*sxy - sx*sy) / (n*sxx - sx*sx)
}

// Step counts for the fixed-step runs, chosen so that the errors lie
// between ~1e-3 (asymptotic regime) and ~1e-12 (above rounding).
var convergenceSteps = map[string][]int{
	"DormandPrince54":  {40, 80, 160, 320},
	"Tsitouras54":      {40, 80, 160, 320},
	"DormandPrince853": {20, 30, 45, 68},
}

func TestConvergenceOrder(t *testing.T) {
	// Global error of a method of order p with fixed steps h is C·h^p + …
	// (Hairer, Nørsett & Wanner 1993, Theorem II.3.6): the fitted log-log
	// slope must be within 0.3 of p (the brief's acceptance window, which
	// absorbs the next term of the error expansion). Kepler e = 0.5 over
	// half a period, exact by Kepler's equation.
	const e = 0.5
	tEnd := math.Pi
	y0 := keplerExact(e, 0)
	want := keplerExact(e, tEnd)
	for _, tab := range methods() {
		s := NewSolver(4, &Settings{Method: tab})
		var hs, errs []float64
		for _, n := range convergenceSteps[tab.Name] {
			y := fixedSteps(s, kepler, 0, y0, tEnd, n, nil)
			hs = append(hs, tEnd/float64(n))
			errs = append(errs, maxAbsDiff(y, want))
		}
		p := slope(hs, errs)
		t.Logf("%s: errors %.3g, slope %.3f (order %d)", tab.Name, errs, p, tab.Order)
		if math.Abs(p-float64(tab.Order)) > 0.3 {
			t.Errorf("%s: observed order %.3f, want %d ± 0.3", tab.Name, p, tab.Order)
		}
	}
}

func TestDenseConvergenceOrder(t *testing.T) {
	// A continuous extension of order q has local error O(h^(q+1)) at
	// interior points (Hairer, Nørsett & Wanner 1993, §II.6): one step from
	// the exact state, compared with the exact solution at θ = 0.3, 0.5,
	// 0.8, must show slope q+1 ± 0.3. Kepler e = 0.5 from t = 2.5 (near
	// apocenter, where the asymptotic regime starts at larger h).
	const e = 0.5
	const t0 = 2.5
	y0 := keplerExact(e, t0)
	steps := map[string][]float64{
		"DormandPrince54":  {0.4, 0.2, 0.1, 0.05},
		"Tsitouras54":      {0.4, 0.2, 0.1, 0.05},
		"DormandPrince853": {0.6, 0.4, 0.28, 0.2},
	}
	y := make([]float64, 4)
	for _, tab := range methods() {
		s := NewSolver(4, &Settings{Method: tab})
		var hs, errs []float64
		for _, h := range steps[tab.Name] {
			var worst float64
			fixedSteps(s, kepler, t0, y0, t0+h, 1, func(tOld, h float64) {
				for _, th := range []float64{0.3, 0.5, 0.8} {
					s.Interpolate(tOld+th*h, y)
					worst = math.Max(worst, maxAbsDiff(y, keplerExact(e, tOld+th*h)))
				}
			})
			hs = append(hs, h)
			errs = append(errs, worst)
		}
		p := slope(hs, errs)
		t.Logf("%s dense: errors %.3g, slope %.3f (dense order %d)", tab.Name, errs, p, tab.DenseOrder)
		if math.Abs(p-float64(tab.DenseOrder+1)) > 0.3 {
			t.Errorf("%s dense: local slope %.3f, want %d ± 0.3", tab.Name, p, tab.DenseOrder+1)
		}
	}
}
