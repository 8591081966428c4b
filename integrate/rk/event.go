package rk

import "math"

// Event is a zero crossing of G(t, y), located on the dense output to about
// machine precision in t (Brent 1973).
type Event struct {
	// G is the event function; it must not retain y.
	G func(t float64, y []float64) float64
	// Direction selects crossings: 0 any; +1 only G rising through 0;
	// −1 only G falling through 0 (in the direction of integration).
	Direction int
	// Terminal stops the integration at the located root.
	Terminal bool
	// AtStep, for a terminal event, stops the integration at the end of
	// the accepted step in which G changes sign, without locating the
	// root (no dense output, no root iterations): for a stop condition
	// such as "beyond a radius" that needs no exact crossing point.
	AtStep bool
}

// checkEvents looks for sign changes of the event functions over the last
// accepted step ending at tNew (state in s.y), reports them through OnEvent
// in order of time, and returns the first terminal one. The state at that
// root is left in s.yRoot.
func (s *Solver) checkEvents(tNew float64) (index int, tRoot float64, stop bool) {
	s.hits = s.hits[:0]
	for i := range s.events {
		ev := &s.events[i]
		g0 := s.gOld[i]
		g1 := ev.G(tNew, s.y)
		s.gOld[i] = g1
		rising := g0 < 0 && g1 >= 0
		falling := g0 > 0 && g1 <= 0
		if !(rising && ev.Direction >= 0 || falling && ev.Direction <= 0) {
			continue
		}
		var th float64
		if g1 == 0 || (ev.AtStep && ev.Terminal) {
			th = 1
		} else {
			th = brent(func(th float64) float64 {
				s.Interpolate(s.tOld+th*s.h, s.yEv)
				return ev.G(s.tOld+th*s.h, s.yEv)
			}, 0, 1, g0, g1, 2*eps*math.Max(1, math.Abs(s.tOld/s.h)))
		}
		// Insert in order of θ (few events: insertion sort).
		s.hits = append(s.hits, hit{i, th})
		for j := len(s.hits) - 1; j > 0 && s.hits[j].t < s.hits[j-1].t; j-- {
			s.hits[j], s.hits[j-1] = s.hits[j-1], s.hits[j]
		}
	}
	for _, ht := range s.hits {
		tr := s.tOld + ht.t*s.h
		if ht.t == 1 {
			tr = tNew
			copy(s.yRoot, s.y)
		} else {
			s.Interpolate(tr, s.yRoot)
		}
		if s.OnEvent != nil {
			s.OnEvent(ht.index, tr, s.yRoot)
		}
		if s.events[ht.index].Terminal {
			return ht.index, tr, true
		}
	}
	return -1, 0, false
}

// brent returns a root of g in [a, b] given g(a) = fa and g(b) = fb of
// opposite signs, to the absolute tolerance tol (plus 2 ulp), by Brent's
// method: inverse quadratic interpolation, secant and bisection safeguards
// (R. P. Brent, Algorithms for Minimization without Derivatives, 1973,
// ch. 4, procedure zero; from memory).
func brent(g func(float64) float64, a, b, fa, fb, tol float64) float64 {
	c, fc := a, fa
	d := b - a
	e := d
	for iter := 0; iter < 200; iter++ {
		if (fb > 0 && fc > 0) || (fb < 0 && fc < 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*eps*math.Abs(b) + 0.5*tol
		m := 0.5 * (c - b)
		if math.Abs(m) <= tol1 || fb == 0 {
			return b
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			var p, q float64
			sv := fb / fa
			if a == c {
				// Secant.
				p = 2 * m * sv
				q = 1 - sv
			} else {
				// Inverse quadratic interpolation.
				qa := fa / fc
				r := fb / fc
				p = sv * (2*m*qa*(qa-r) - (b-a)*(r-1))
				q = (qa - 1) * (r - 1) * (sv - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < math.Min(3*m*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d = m
				e = m
			}
		} else {
			d = m
			e = m
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else if m > 0 {
			b += tol1
		} else {
			b -= tol1
		}
		fb = g(b)
	}
	return b
}
