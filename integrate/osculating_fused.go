package integrate

import (
	"math"

	"ricochet/integrate/rk"
)

//go:generate go run gen_fused.go

// Fused right-hand sides of the scattering driver.
//
// A spinless point probe whose velocity is p/m (momentumVelocity) and
// whose force depends on the position and momentum alone can give its
// force as a pointForce. Its right-hand side in the model's variables is
// then pointDeriv, and the driver's right-hand side in the osculating
// variables is osculating.deriv around it: a model with a pointForce needs
// nothing else. For the point forces listed in gen_fused.go, the
// generator writes fused.go: osculating.deriv with the body of the force
// method written into it, one function per force type, so that the
// model's state and derivative never pass through memory, the call and
// the frame and velocity branches drop out, and the compiler shares the
// common subexpressions (|x⃗|², |p⃗|²) of the two. The fused function does
// the same floating-point operations as the generic path
// (TestFusedBitForBit).
type pointForce interface {
	// force returns dp^μ/dτ at the position x⃗ (r2 = |x⃗|², r = |x⃗|) for
	// the momentum p. Implementations list the parameters and named
	// results under these names and end in a bare return, their only
	// one (gen_fused.go copies the body).
	force(x1, x2, x3, r2, r, p0, p1, p2, p3 float64) (f0, f1, f2, f3 float64)
}

// pointForcer is implemented by models whose right-hand side, for their
// parameters as they are at the time of the call, is pointDeriv of a
// pointForce; pointForce returns nil where it is not.
type pointForcer interface {
	pointForce() pointForce
}

// pointDeriv returns the right-hand side dx^μ/dτ = p^μ/m,
// dp^μ/dτ = k.force(x⃗, p) for a probe of mass m.
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
		dy[IP], dy[IP+1], dy[IP+2], dy[IP+3] = k.force(x1, x2, x3, r2, r, p0, p1, p2, p3)
	}
}

// rkFunc returns the right-hand side of the integration in the
// osculating variables: the fused function of the model's point force
// when fused.go has one and the motion frame is the frame of record,
// otherwise osculating.deriv.
func (o *osculating) rkFunc() rk.Func {
	if o.ident && o.dim == IA && o.pv && o.sv == nil {
		if pf, ok := o.m.(pointForcer); ok {
			if k := pf.pointForce(); k != nil {
				if f := o.fused(k); f != nil {
					return f
				}
			}
		}
	}
	return func(_ float64, Z, dZ []float64) { o.deriv(Z, dZ) }
}
