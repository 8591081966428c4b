package rk

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// Test problems with exact or published reference solutions.

// kepler is the two-body problem d²q/dt² = −q/|q|³ with state (q1, q2, p1, p2)
// (Hairer, Nørsett & Wanner 1993, §II.10, problem (10.1), from memory).
func kepler(_ float64, y, dy []float64) {
	r2 := y[0]*y[0] + y[1]*y[1]
	r3 := r2 * math.Sqrt(r2)
	dy[0] = y[2]
	dy[1] = y[3]
	dy[2] = -y[0] / r3
	dy[3] = -y[1] / r3
}

// keplerExact returns the state at time t of the Kepler orbit with
// semi-major axis 1 and eccentricity e that is at pericenter (1−e, 0) at
// t = 0 moving in +q2 (period 2π). It solves Kepler's equation
// E − e sin E = t by Newton's method (Kepler 1609; e.g. Goldstein,
// Classical Mechanics, §3.8):
//
//	q = (cos E − e, √(1−e²) sin E),  p = (−sin E, √(1−e²) cos E)/(1 − e cos E)
func keplerExact(e, t float64) []float64 {
	m := math.Mod(t, 2*math.Pi)
	ea := m
	if e > 0.8 {
		ea = math.Pi
	}
	for i := 0; i < 100; i++ {
		d := (ea - e*math.Sin(ea) - m) / (1 - e*math.Cos(ea))
		ea -= d
		if math.Abs(d) < 1e-16 {
			break
		}
	}
	s, c := math.Sincos(ea)
	w := math.Sqrt(1 - e*e)
	den := 1 - e*c
	return []float64{c - e, w * s, -s / den, w * c / den}
}

// keplerInvariants returns the energy |p|²/2 − 1/|q| and the angular
// momentum q1 p2 − q2 p1.
func keplerInvariants(y []float64) (energy, angmom float64) {
	return 0.5*(y[2]*y[2]+y[3]*y[3]) - 1/math.Hypot(y[0], y[1]), y[0]*y[3] - y[1]*y[2]
}

// arenstorf is the restricted three-body problem of Arenstorf (Hairer,
// Nørsett & Wanner 1993, §II.0, eq. (0.1)) with state (y1, y2, y1', y2').
func arenstorf(_ float64, y, dy []float64) {
	const mu = 0.012277471
	const mup = 1 - mu
	d1 := math.Pow((y[0]+mu)*(y[0]+mu)+y[1]*y[1], 1.5)
	d2 := math.Pow((y[0]-mup)*(y[0]-mup)+y[1]*y[1], 1.5)
	dy[0] = y[2]
	dy[1] = y[3]
	dy[2] = y[0] + 2*y[3] - mup*(y[0]+mu)/d1 - mu*(y[0]-mup)/d2
	dy[3] = y[1] - 2*y[2] - mup*y[1]/d1 - mu*y[1]/d2
}

// Initial value and period of the Arenstorf orbit (Hairer, Nørsett & Wanner
// 1993, §II.0, eq. (0.2)).
var (
	arenstorfY0 = []float64{0.994, 0, 0, -2.00158510637908252240537862224}
	arenstorfT  = 17.0652165601579625588917206249
)

func maxAbsDiff(a, b []float64) float64 {
	var m float64
	for i := range a {
		m = math.Max(m, math.Abs(a[i]-b[i]))
	}
	return m
}

func maxAbs(a []float64) float64 {
	var m float64
	for _, x := range a {
		m = math.Max(m, math.Abs(x))
	}
	return m
}

func TestArenstorf(t *testing.T) {
	// The orbit is periodic with period T (HNW 1993, §II.0): y(T) = y(0).
	cases := []struct {
		tab    *Tableau
		rtol   float64
		tol    float64 // bound on max |y(T) − y(0)|
		reason string
	}{
		{DormandPrince853(), 1e-14, 1e-9, "brief's target; orbit passes within 0.01 of the moon where errors amplify ~1e3"},
		{DormandPrince54(), 1e-13, 1e-8, "5th order near its rounding floor: 1e-13 tolerance leaves ~1e-9 after amplification"},
		{Tsitouras54(), 1e-13, 1e-8, "as for DormandPrince54"},
	}
	for _, c := range cases {
		s := NewSolver(4, &Settings{Method: c.tab, RelTol: c.rtol})
		res := s.Solve(arenstorf, 0, arenstorfY0, arenstorfT, nil)
		if res.Status != StatusSuccess {
			t.Fatalf("%s: %v", c.tab.Name, res.Status)
		}
		d := maxAbsDiff(res.Y, arenstorfY0)
		t.Logf("%s rtol %g: |y(T)−y(0)| = %.3g, %d evaluations", c.tab.Name, c.rtol, d, res.Evaluations)
		if d > c.tol {
			t.Errorf("%s: |y(T)−y(0)| = %.3g > %g (%s)", c.tab.Name, d, c.tol, c.reason)
		}
	}
}

func TestKeplerEccentric(t *testing.T) {
	// Kepler e = 0.9 over 5 periods against Kepler's equation; energy
	// −1/2 and angular momentum √(1−e²) are exact invariants.
	const e = 0.9
	const periods = 5
	y0 := keplerExact(e, 0)
	tEnd := periods * 2 * math.Pi
	want := keplerExact(e, tEnd)
	e0, l0 := -0.5, math.Sqrt(1-e*e)
	for _, tab := range methods() {
		s := NewSolver(4, &Settings{Method: tab, RelTol: 1e-12})
		res := s.Solve(kepler, 0, y0, tEnd, nil)
		if res.Status != StatusSuccess {
			t.Fatalf("%s: %v", tab.Name, res.Status)
		}
		errPos := math.Hypot(res.Y[0]-want[0], res.Y[1]-want[1])
		en, l := keplerInvariants(res.Y)
		t.Logf("%s: position error %.3g, energy drift %.3g, angular momentum drift %.3g, %d evaluations",
			tab.Name, errPos, en-e0, l-l0, res.Evaluations)
		// The phase error grows linearly with time and the pericenter
		// passage (speed √19 ≈ 4.4) amplifies it: 5 periods × ~30 steps
		// per pericenter × 1e-12 tolerance × amplification ≲ 100 gives
		// ≲ 1e-8.
		if errPos > 1e-8 {
			t.Errorf("%s: position error %.3g > 1e-8", tab.Name, errPos)
		}
		// Invariants are not propagated: they drift like the error itself.
		if math.Abs(en-e0) > 1e-8 || math.Abs(l-l0) > 1e-8 {
			t.Errorf("%s: invariant drift energy %.3g, angular momentum %.3g > 1e-8", tab.Name, en-e0, l-l0)
		}
	}
}

// nonNormal is a 4×4 non-normal matrix: a rotation block with a strongly
// coupled, nilpotent-like upper part (eigenvalues −0.1 ± 2i, −0.5, −1).
var nonNormal = mat.NewDense(4, 4, []float64{
	-0.1, 2, 5, 0,
	-2, -0.1, 0, 8,
	0, 0, -0.5, 10,
	0, 0, 0, -1,
})

func linear(_ float64, y, dy []float64) {
	for i := 0; i < 4; i++ {
		var s float64
		for j := 0; j < 4; j++ {
			s += nonNormal.At(i, j) * y[j]
		}
		dy[i] = s
	}
}

// linearExact returns exp(tA) y0 by gonum's Padé-based matrix exponential
// ((*mat.Dense).Exp, Higham 2005).
func linearExact(t float64, y0 []float64) []float64 {
	var ta, e mat.Dense
	ta.Scale(t, nonNormal)
	e.Exp(&ta)
	var out mat.VecDense
	out.MulVec(&e, mat.NewVecDense(4, append([]float64(nil), y0...)))
	return out.RawVector().Data
}

func TestLinearNonNormal(t *testing.T) {
	y0 := []float64{1, -0.5, 0.25, 1}
	const t1 = 6.0
	want := linearExact(t1, y0)
	scale := 0.0
	for _, tt := range []float64{0, 1, 2, 3, 4, 5, 6} {
		scale = math.Max(scale, maxAbs(linearExact(tt, y0)))
	}
	for _, tab := range methods() {
		s := NewSolver(4, &Settings{Method: tab, RelTol: 1e-12})
		res := s.Solve(linear, 0, y0, t1, nil)
		if res.Status != StatusSuccess {
			t.Fatalf("%s: %v", tab.Name, res.Status)
		}
		d := maxAbsDiff(res.Y, want)
		t.Logf("%s: error %.3g (solution scale %.3g), %d evaluations", tab.Name, d, scale, res.Evaluations)
		// Tolerance 1e-12 relative to a solution of size ~scale, the
		// transient growth of the non-normal part amplifies local errors
		// by ≲ 10, and mat.Exp is accurate to ~1e-14 relative.
		if d > 1e-11*scale {
			t.Errorf("%s: error %.3g > 1e-11·%.3g", tab.Name, d, scale)
		}
	}
}

func TestBackward(t *testing.T) {
	// Integrating back from the exact state at t = 3π must recover the
	// pericenter state at t = 0 (Kepler's equation, e = 0.5). Kepler is
	// time-reversible, y ↦ (q, −p): the backward run must agree with the
	// forward run of the mirrored orbit up to rounding of t.
	const e = 0.5
	tStart := 3 * math.Pi
	y1 := keplerExact(e, tStart)
	want := keplerExact(e, 0)
	mirror := func(y []float64) []float64 { return []float64{y[0], y[1], -y[2], -y[3]} }
	scale := math.Sqrt((1 + e) / (1 - e))
	for _, tab := range methods() {
		const tol = 1e-12
		s := NewSolver(4, &Settings{Method: tab, RelTol: tol})
		res := s.Solve(kepler, tStart, y1, 0, nil)
		if res.Status != StatusSuccess || res.T != 0 {
			t.Fatalf("%s: %v at T = %v", tab.Name, res.Status, res.T)
		}
		back := append([]float64(nil), res.Y...)
		d := maxAbsDiff(back, want)
		// Per-step errors ≤ tol·scale accumulate over N steps and Kepler's
		// energy-dependent period turns them into a growing phase error
		// (δT/T = 3δE): global ≤ 10·N·tol·scale (see
		// TestErrorEstimateBoundsError).
		bound := 10 * float64(res.Accepted) * tol * scale
		fwd := NewSolver(4, &Settings{Method: tab, RelTol: tol}).Solve(kepler, 0, mirror(y1), tStart, nil)
		m := maxAbsDiff(back, mirror(fwd.Y))
		t.Logf("%s backward: error %.3g (bound %.3g), |backward − mirrored forward| = %.3g", tab.Name, d, bound, m)
		if d > bound {
			t.Errorf("%s backward: error %.3g > %.3g", tab.Name, d, bound)
		}
		// Same steps in exact arithmetic; only t (3π − … versus 0 + …) is
		// rounded differently, which moves the last step by ~1 ulp of 3π.
		// 1e-3·bound leaves room for that without hiding a sign error.
		if m > 1e-3*bound {
			t.Errorf("%s: backward and mirrored forward runs differ by %.3g", tab.Name, m)
		}
	}
}

func TestErrorEstimateBoundsError(t *testing.T) {
	// (a) Local: on y' = Ay the exact flow from any state is exp(hA)y, so
	// the true local error of every accepted step is known. The estimate
	// measures the embedded (lower-order) solution while the propagated one
	// is of higher order (local extrapolation), so the true local error of
	// accepted steps must satisfy the acceptance test itself: scaled RMS
	// norm ≤ 1 (factor 1).
	// (b) Global, contractive linear system: the eigenvalues have negative
	// real parts, so local errors are damped rather than accumulated; the
	// non-normal transient can amplify them by the growth of ‖exp(tA)‖
	// relative to the solution, a few: global ≤ 5·tol·scale.
	y0 := []float64{1, -0.5, 0.25, 1}
	const t1 = 6.0
	scale := 0.0
	for _, tt := range []float64{0, 1, 2, 3, 4, 5, 6} {
		scale = math.Max(scale, maxAbs(linearExact(tt, y0)))
	}
	want := linearExact(t1, y0)
	for _, tab := range methods() {
		for _, tol := range []float64{1e-4, 1e-6, 1e-8, 1e-10} {
			s := NewSolver(4, &Settings{Method: tab, RelTol: tol})
			worst := 0.0
			s.Observe = func(_ float64, y []float64) {
				ex := linearExact(s.h, s.yOld)
				var sum float64
				for i := range y {
					sc := tol + tol*math.Max(math.Abs(s.yOld[i]), math.Abs(y[i]))
					d := (y[i] - ex[i]) / sc
					sum += d * d
				}
				worst = math.Max(worst, math.Sqrt(sum/float64(len(y))))
			}
			res := s.Solve(linear, 0, y0, t1, nil)
			g := maxAbsDiff(res.Y, want) / (tol * scale)
			t.Logf("%s tol %g: worst local error %.3g·tol, global %.3g·tol·scale, %d steps", tab.Name, tol, worst, g, res.Accepted)
			if worst > 1 {
				t.Errorf("%s tol %g: true local error %.3g exceeds the acceptance bound", tab.Name, tol, worst)
			}
			if g > 5 {
				t.Errorf("%s tol %g: global error %.3g·tol·scale > 5", tab.Name, tol, g)
			}
		}
	}

	// (c) Global, conservative Kepler e = 0.5, one period: nothing damps
	// the N local errors (each ≤ tol·scale by (a)), and an energy error δE
	// becomes a phase drift δT/T = 3δE, amplified up to ~2π·3 over one
	// orbit: global ≤ 10·N·tol·scale, with scale = max|y| = √3.
	const e = 0.5
	tEnd := 2 * math.Pi
	ky0 := keplerExact(e, 0)
	kwant := keplerExact(e, tEnd)
	kscale := math.Sqrt((1 + e) / (1 - e))
	for _, tab := range methods() {
		for _, tol := range []float64{1e-6, 1e-8, 1e-10} {
			s := NewSolver(4, &Settings{Method: tab, RelTol: tol})
			res := s.Solve(kepler, 0, ky0, tEnd, nil)
			n := float64(res.Accepted)
			ratio := maxAbsDiff(res.Y, kwant) / (tol * kscale)
			t.Logf("%s Kepler tol %g: global error %.3g·tol·scale = %.3g·N·tol·scale (N = %d)", tab.Name, tol, ratio, ratio/n, res.Accepted)
			if ratio > 10*n {
				t.Errorf("%s Kepler tol %g: global error %.3g·tol·scale > 10·N", tab.Name, tol, ratio)
			}
		}
	}
}
