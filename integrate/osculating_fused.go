package integrate

import (
	"math"

	"ricochet/integrate/rk"
)

//go:generate go run gen_fused.go

// Point-force right-hand sides of the scattering driver.
//
// A spinless point probe whose velocity is p/m (momentumVelocity) and
// whose force depends on the position and momentum alone can give its
// force as a pointForce, split into a central part s x⃗ and the rest g⃗.
// Its right-hand side in the model's variables is then pointDeriv, and in
// the osculating variables, for the frame of record, derivPoint: a model
// with a pointForce needs nothing else. For the point forces listed in
// gen_fused.go, the generator writes fused.go: derivPoint with the body of
// the force method written in place of its call, one function per force
// type, so that the call drops out and the compiler shares the common
// subexpressions of the two. A fused function does the operations of
// derivPoint in the same order (TestFusedBitForBit).
type pointForce interface {
	// force returns dp⁰/dτ = f0 and dp⃗/dτ = s x⃗ + g⃗ at the position x⃗
	// (r2 = |x⃗|², r = |x⃗|) for the momentum p. Implementations name the
	// parameters and results so and end in a bare return, their only one
	// (gen_fused.go copies the body).
	force(x1, x2, x3, r2, r, p0, p1, p2, p3 float64) (f0, s, g1, g2, g3 float64)
}

// pointForcer is implemented by models whose right-hand side, for their
// parameters as they are at the time of the call, is pointDeriv of a
// pointForce; pointForce returns nil where it is not.
type pointForcer interface {
	pointForce() pointForce
}

// pointDeriv returns the right-hand side dx^μ/dτ = p^μ/m,
// dp^μ/dτ = k.force(x⃗, p) for a probe of mass m.
//
// Not inlined (go:noinline): a closure made in a function that is inlined
// into its caller is compiled without the intrinsics and inlining of the
// calls in its body (measured, Go 1.26: math.Sqrt and math.Abs become
// calls, which spill every live register), and this one runs per stage
// or per step.
//
//go:noinline
func pointDeriv(m float64, k pointForce) func(y, dy []float64) {
	im := 1 / m
	return func(y, dy []float64) {
		_ = y[IP+3]
		_ = dy[IP+3]
		x1, x2, x3 := y[IX+1], y[IX+2], y[IX+3]
		p0, p1, p2, p3 := y[IP], y[IP+1], y[IP+2], y[IP+3]
		dy[IX], dy[IX+1], dy[IX+2], dy[IX+3] = p0*im, p1*im, p2*im, p3*im
		r2 := x1*x1 + x2*x2 + x3*x3
		r := math.Sqrt(r2)
		f0, s, g1, g2, g3 := k.force(x1, x2, x3, r2, r, p0, p1, p2, p3)
		dy[IP], dy[IP+1], dy[IP+2], dy[IP+3] = f0, s*x1+g1, s*x2+g2, s*x3+g3
	}
}

// derivPoint is osculating.deriv for a model of dimension 8 with the
// point force k, in the frame of record. With the force split as
// F⃗ = s x⃗ + g⃗ and x⃗ = λ p̂ + β⃗, the central part contributes
//
//	F⃗ − (F⃗·p̂) p̂ = s β⃗⊥ + g⃗ − (g⃗·p̂) p̂,   β⃗⊥ = β⃗ − (β⃗·p̂) p̂,
//	β⃗·ω⃗ |p⃗| = s β⃗·β⃗⊥ + β⃗·g⃗ − (g⃗·p̂)(β⃗·p̂),
//
// the same quantities as in osculating.deriv without the cancellation of
// the along-track part s λ p̂ (of order R on the far legs). Everything
// that does not depend on the force (β⃗⊥, dζ/dλ, the factors that
// multiply s and g⃗ in dZ) is formed before it is known, off the chain of
// dependent operations from one stage to the next, which then runs from
// the force to dZ through one multiplication (and an addition for the
// non-central part).
func (o *osculating) derivPoint(k pointForce, Z, dZ []float64) {
	_ = Z[zP+3]
	_ = dZ[zP+3]
	p1, p2, p3 := o.pinN+Z[zP+1], Z[zP+2], Z[zP+3]
	pn := math.Sqrt(p1*p1 + p2*p2 + p3*p3)
	ipn := 1 / pn
	c, s2, s3 := p1*ipn, p2*ipn, p3*ipn
	// λ = 2bζ/(1 − ζ²) and dζ/dλ = (1 − ζ²)²/(2b(1 + ζ²)) (alongTrack).
	z := Z[zW]
	omz := (1 - z) * (1 + z)
	lam := 2 * o.b * z / omz
	ibc := omz * omz / (2 * o.b * (1 + z*z))
	b1, b2, b3 := Z[zB], Z[zB+1], Z[zB+2]
	x1, x2, x3 := lam*c+b1, lam*s2+b2, lam*s3+b3
	bp := b1*c + b2*s2 + b3*s3
	t1, t2, t3 := b1-bp*c, b2-bp*s2, b3-bp*s3
	bt := b1*t1 + b2*t2 + b3*t3
	p0 := o.p0 + Z[zP]
	// |x⃗|² = λ(λ + 2 β⃗·p̂) + |β⃗|², which waits for λ and p̂ through
	// fewer operations than the sum of the squares of x⃗.
	r2 := lam*(lam+2*bp) + (b1*b1 + b2*b2 + b3*b3)
	r := math.Sqrt(r2)
	h := r2 * o.iKb // dτ/dσ
	hc := h * ibc
	// The factors that multiply the force in dZ, formed while the force
	// is computed: dβ⃗/dσ = −(s/|p⃗|)(β⃗·β⃗⊥ p̂ + λ β⃗⊥) dτ/dσ for the central
	// part, and so on.
	hp := h * ipn
	q1, q2, q3 := (bt*c+lam*t1)*hp, (bt*s2+lam*t2)*hp, (bt*s3+lam*t3)*hp
	qw := bt * hc * ipn
	xh1, xh2, xh3 := x1*h, x2*h, x3*h
	f0, s, g1, g2, g3 := k.force(x1, x2, x3, r2, r, p0, p1, p2, p3)
	ga := g1*c + g2*s2 + g3*s3
	gw1, gw2, gw3 := (g1-ga*c)*ipn, (g2-ga*s2)*ipn, (g3-ga*s3)*ipn
	gbw := ((b1*g1 + b2*g2 + b3*g3) - ga*bp) * ipn
	if len(dZ) > IA {
		dZ[IA] = p0 * o.imass * h
	}
	dZ[zW] = pn*o.imass*hc + s*qw + gbw*hc
	dZ[zB] = -(s*q1 + (gbw*c+lam*gw1)*h)
	dZ[zB+1] = -(s*q2 + (gbw*s2+lam*gw2)*h)
	dZ[zB+2] = -(s*q3 + (gbw*s3+lam*gw3)*h)
	dZ[zP] = f0 * h
	dZ[zP+1] = s*xh1 + g1*h
	dZ[zP+2] = s*xh2 + g2*h
	dZ[zP+3] = s*xh3 + g3*h
}

// rkFunc returns the right-hand side of the integration in the
// osculating variables: for a model with a point force in the frame of
// record its fused function (fused.go) or derivPoint, otherwise
// osculating.deriv.
//
// Not inlined (go:noinline): a closure made in a function that is inlined
// into its caller is compiled without the intrinsics and inlining of the
// calls in its body (measured, Go 1.26: math.Sqrt and math.Abs become
// calls, which spill every live register), and this one runs per stage
// or per step.
//
//go:noinline
func (o *osculating) rkFunc() rk.Func {
	if o.ident && o.dim == IA && o.pv && o.sv == nil {
		if pf, ok := o.m.(pointForcer); ok {
			if k := pf.pointForce(); k != nil {
				if f := o.fused(k); f != nil {
					return f
				}
				return func(_ float64, Z, dZ []float64) { o.derivPoint(k, Z, dZ) }
			}
		}
	}
	return func(_ float64, Z, dZ []float64) { o.deriv(Z, dZ) }
}
