package integrate

import (
	"sync"

	"gonum.org/v1/gonum/integrate/quad"

	"ricochet/background/vec"
)

// Straight-line quadrature of the first-order force and torque.
//
// Along the line x(σ) = x₀ + (p/m) σ with p and a frozen, the first-order
// change of momentum and spin is ∫ f(σ) dσ, where f = (dp/dτ, da/dτ) from
// the model's own Deriv. On a half line σ ∈ [0, ∞) we substitute
//
//	σ = L w/(1 − w),  dσ = L dw/(1 − w)²,  w ∈ [0, 1),
//
// with L the proper time to cover the scale of the problem. Forces falling
// like 1/r² make the integrand finite at w = 1, and the nearest complex
// singularity of the integrand stays at distance O(1) from [0, 1], so
// Gauss–Legendre quadrature (gonum quad.Legendre) converges geometrically.

var (
	glMu    sync.Mutex
	glCache = map[int][2][]float64{}
)

// legendre returns n Gauss–Legendre nodes and weights on [0, 1].
func legendre(n int) (x, w []float64) {
	glMu.Lock()
	defer glMu.Unlock()
	if c, ok := glCache[n]; ok {
		return c[0], c[1]
	}
	x = make([]float64, n)
	w = make([]float64, n)
	quad.Legendre{}.FixedLocations(x, w, 0, 1)
	glCache[n] = [2][]float64{x, w}
	return x, w
}

// lineWork is scratch storage for line integrals.
type lineWork struct {
	y, dy []float64
	// f is the model's right-hand side on the line: its LinearDeriv if it
	// has one, else derivOf (the closed form of DerivFunc where there is
	// one: for a geodesic the Kerr–Schild closed form rather than the
	// automatic differentiation of Deriv, 4 times faster).
	f func(y, dy []float64)
}

func newLineWork(m Model) *lineWork {
	dim := m.Dim()
	w := &lineWork{y: make([]float64, dim), dy: make([]float64, dim)}
	if l, ok := m.(linearDeriver); ok {
		w.f = l.LinearDeriv
	} else {
		w.f = derivOf(m)
	}
	return w
}

// halfLine integrates the model's momentum and spin derivatives along
// x(σ) = x0 + (p/m) dir σ, σ ∈ [0, ∞), with p and a frozen at their values
// in y0, dir = ±1. It returns the integrals of dp/dτ and da/dτ (oriented so
// that for dir = −1 the result is ∫_{−∞}^0) and the first moment
// ∫ (|σ| dp/dτ + m w) dσ, whose projection transverse to the motion is m
// times the first-order displacement accumulated on the half line (w the
// hidden-momentum velocity of splitVelocity models, zero for the others).
func halfLine(m Model, y0 []float64, dir, L float64, n int, w *lineWork) (dp, da, mom vec.Vec4) {
	xs, ws := legendre(n)
	mass := m.Mass()
	sv, hidden := m.(splitVelocity)
	copy(w.y, y0)
	for k, xk := range xs {
		den := 1 - xk
		sig := L * xk / den
		jac := L / (den * den) * ws[k]
		for i := 0; i < 4; i++ {
			w.y[IX+i] = y0[IX+i] + dir*sig*y0[IP+i]/mass
		}
		w.f(w.y, w.dy)
		for i := 0; i < 4; i++ {
			dp[i] += jac * w.dy[IP+i]
			// First moment of the force plus, for models with a
			// hidden-momentum velocity α p + w (splitVelocity), m times
			// w: together m times the displacement from the straight line
			// (the change of α along the frozen line is along-track).
			mom[i] += jac * sig * w.dy[IP+i]
			if hidden {
				_, wv := sv.VelocitySplit()
				mom[i] += jac * mass * wv[i]
			}
			if len(w.dy) > IA+i {
				da[i] += jac * w.dy[IA+i]
			}
		}
	}
	return dp, da, mom
}

// linearDeriver is implemented by models whose Deriv contains terms of
// second order in the coupling that a straight-line quadrature of the
// first-order force and torque must not see (the velocity correction of a
// spin supplementary condition): LinearDeriv writes the right-hand side to
// first order.
type linearDeriver interface {
	LinearDeriv(y, dy []float64)
}

// lineDeriv is the right-hand side used on straight lines: the model's
// LinearDeriv if it has one, else Deriv.
func lineDeriv(m Model, y, dy []float64) {
	if l, ok := m.(linearDeriver); ok {
		l.LinearDeriv(y, dy)
		return
	}
	m.Deriv(y, dy)
}

// transverse returns the part of v orthogonal to the time direction and to
// the spatial direction of p (the projection Π onto the plane orthogonal to
// both the background's and the probe's four-velocities).
func transverse(v, p vec.Vec4) vec.Vec4 {
	n := p.Spatial().Unit()
	s := v.Spatial()
	s = s.Sub(n.Scale(n.Dot(s)))
	return vec.FromSpatial(0, s)
}

// FirstOrder returns the first-order impulse Δp^μ and spin kick Δa^μ of the
// model on the undeflected straight line of in, by Gauss–Legendre
// quadrature of its own force and torque with momentum and spin frozen at
// their incoming values: the generic first-order evaluator that checks the
// closed forms of observables/leading and covers models without one. n is
// the number of nodes per half line (0: 96). The line is split at the point
// of closest approach and mapped with the encounter time scale b/K.
func FirstOrder(m Model, in InState, n int) (dp, da vec.Vec4) {
	if n <= 0 {
		n = 96
	}
	y := make([]float64, m.Dim())
	put(y, IX, in.B)
	put(y, IP, in.P)
	put(y, IA, in.A)
	K := in.P.Spatial().Norm() / m.Mass()
	L := in.ImpactParameter() / K
	w := newLineWork(m)
	p1, a1, _ := halfLine(m, y, 1, L, n, w)
	p2, a2, _ := halfLine(m, y, -1, L, n, w)
	return p1.Add(p2), a1.Add(a2)
}
