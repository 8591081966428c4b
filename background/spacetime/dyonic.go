package spacetime

import (
	"fmt"
	"math"

	"ricochet/background/jet"
)

// DyonicKerrNewman is the Kerr–Newman spacetime of mass M, spin parameter
// A (along +z), electric charge Q and magnetic charge P, in the Cartesian
// Kerr–Schild coordinates of KerrNewman. Its metric is that of KerrNewman
// with Q² → Q² + P², and its field is the electric Kerr–Newman field
// duality-rotated, F = cos α F_e + sin α *F_e with F_e the field of charge
// √(Q² + P²) and Q + iP = √(Q² + P²) e^{iα} (Carter 1968; Griffiths &
// Podolský 2009, §11.1; both from memory). Here *F_μν = ½√−g ε_μνρσ F^ρσ
// with ε_0123 = +1 maps (E, B) to (−B, E), so far away E + iB →
// (Q + iP) r̂/r².
//
// The potential is A = A_e + A_m with A_e that of KerrNewman at charge Q
// and, in Boyer–Lindquist-type (r, θ, φ), the magnetic part
//
//	A_m = P [a cos θ/Σ dt + (1 − cos θ)(r² − a² cos θ)/Σ dφ],  Σ = r² + a² cos²θ,
//
// which is Carter's (P cos θ/Σ)(a dt − (r² + a²) dφ) plus the gauge term
// P dφ that moves its Dirac string to the negative z axis (θ = π) only. In
// the Kerr–Schild coordinates the pure-gauge dr terms cancel, and
//
//	A_m0 = P a z r/(r⁴ + a²z²),
//	(A_m1, A_m2, A_m3) = W (−y, x, 0),  W = P r²(r³ − a²z)/((r⁴ + a²z²)(r² + a²)(r + z)).
//
// At a = 0 this is the Dirac monopole potential P(x dy − y dx)/(r(r + z)).
// For z < 0 W is evaluated as P(r³ − a²z)(r − z)/((r⁴ + a²z²)ρ²),
// ρ² = x² + y² (the same function), so that r + z does not cancel near
// the string; the curl of the string term still cancels, at relative
// O(ε_mach r²/ρ²) at distance ρ from it (measured: F to 5e-12 at ρ = r/100
// and 4e-10 at r/1000; with r + z it was 2e-8 at r/100).
// The potential (not the field) is singular on the string x = y = 0,
// z < 0; the Killing angular momentum built from it is conserved along
// any path that does not cross the string. A does not depend on M, so
// the linearization keeps it whole.
type DyonicKerrNewman struct {
	M, A, Q, P float64
}

// DyonicReissnerNordstrom returns the static member of mass m, electric
// charge q and magnetic charge p.
func DyonicReissnerNordstrom(m, q, p float64) DyonicKerrNewman {
	return DyonicKerrNewman{M: m, Q: q, P: p}
}

// metric returns the electric Kerr–Newman spacetime of the same metric:
// charge √(Q² + P²).
func (k DyonicKerrNewman) metric() KerrNewman {
	return KerrNewman{M: k.M, A: k.A, Q: math.Hypot(k.Q, k.P)}
}

// Name implements Metric.
func (k DyonicKerrNewman) Name() string {
	return fmt.Sprintf("dyonic Kerr–Newman (Kerr–Schild) M=%g a=%g Q=%g P=%g", k.M, k.A, k.Q, k.P)
}

// Radius returns the Boyer–Lindquist radius r ≥ 0 of the event x.
func (k DyonicKerrNewman) Radius(x [4]float64) float64 { return ksRadiusFloat(x, k.A) }

// Horizon returns the outer horizon radius r₊ = M + √(M² − a² − Q² − P²)
// and true, or 0 and false when there is none.
func (k DyonicKerrNewman) Horizon() (float64, bool) { return k.metric().Horizon() }

// Inside reports whether x lies inside the outer horizon.
func (k DyonicKerrNewman) Inside(x [4]float64) bool { return k.metric().Inside(x) }

// CrossesDisk reports whether the straight segment from p to q crosses the
// branch disk bounded by the ring singularity.
func (k DyonicKerrNewman) CrossesDisk(p, q [4]float64) bool { return crossesDisk(p, q, k.A) }

// RingDistance returns the Euclidean coordinate distance from x to the
// ring.
func (k DyonicKerrNewman) RingDistance(x [4]float64) float64 {
	return k.metric().RingDistance(x)
}

// eval writes the metric (h in linear mode) and the dyonic potential.
func (k DyonicKerrNewman) eval(x *[4]jet.Jet, g *[4][4]jet.Jet, A *[4]jet.Jet, linear bool) {
	kn := KerrNewman{M: k.M, A: k.A, Q: math.Hypot(k.Q, k.P)}
	kn.eval(x, g, A, linear)
	if kn.Q != 0 {
		for m := range A {
			A[m].Scale(k.Q/kn.Q, &A[m])
		}
	}
	if k.P == 0 {
		return
	}
	a := k.A
	var r, r2, den, s, t, w jet.Jet
	ksRadius(&r, &r2, &x[1], &x[2], &x[3], a)
	den.Mul(&r2, &r2)
	t.Mul(&x[3], &x[3])
	den.AddScaled(&den, a*a, &t)
	den.Inv(&den)
	// A_m0 = P a z r/(r⁴ + a²z²).
	s.Mul(&x[3], &r)
	s.Mul(&s, &den)
	s.Scale(k.P*a, &s)
	A[0].Add(&A[0], &s)
	// W = P r²(r³ − a²z)/((r⁴ + a²z²)(r² + a²)(r + z)), and for z < 0,
	// where r + z cancels near the string, the same function as
	// P (r³ − a²z)(r − z)/((r⁴ + a²z²) ρ²) by r² − z² = r²ρ²/(r² + a²).
	w.Mul(&r2, &r)
	w.AddScaled(&w, -a*a, &x[3])
	w.Mul(&w, &den)
	if x[3].Value() >= 0 {
		w.Mul(&w, &r2)
		t.AddConst(&r2, a*a)
		w.Div(&w, &t)
		t.Add(&r, &x[3])
		w.Div(&w, &t)
	} else {
		t.Sub(&r, &x[3])
		w.Mul(&w, &t)
		t.Mul(&x[1], &x[1])
		t.AddMul(&x[2], &x[2])
		w.Div(&w, &t)
	}
	w.Scale(k.P, &w)
	t.Mul(&w, &x[2])
	A[1].Sub(&A[1], &t)
	t.Mul(&w, &x[1])
	A[2].Add(&A[2], &t)
}

// Eval implements Metric.
func (k DyonicKerrNewman) Eval(x *[4]jet.Jet, g *[4][4]jet.Jet, A *[4]jet.Jet) {
	k.eval(x, g, A, false)
}

// EvalLinear implements Linearizable: h of KerrNewman (the (Q² + P²)
// term of f is second order and dropped) and the whole potential.
func (k DyonicKerrNewman) EvalLinear(x *[4]jet.Jet, h *[4][4]jet.Jet, A *[4]jet.Jet) {
	k.eval(x, h, A, true)
}

// evalStatic implements staticMetric with the same formulas as eval.
func (k DyonicKerrNewman) evalStatic(x *[3]tay, g *[4][4]tay, A *[4]tay, linear bool) {
	kn := KerrNewman{M: k.M, A: k.A, Q: math.Hypot(k.Q, k.P)}
	kn.evalStatic(x, g, A, linear)
	if kn.Q != 0 {
		for m := range A {
			A[m].scale(k.Q/kn.Q, &A[m])
		}
	}
	if k.P == 0 {
		return
	}
	a := k.A
	var r, r2, den, s, t, w tay
	tayRadius(&r, &r2, x, a)
	den.mul(&r2, &r2)
	t.mul(&x[2], &x[2])
	den.addScaled(&den, a*a, &t)
	den.inv(&den)
	s.mul(&x[2], &r)
	s.mul(&s, &den)
	s.scale(k.P*a, &s)
	A[0].add(&A[0], &s)
	w.mul(&r2, &r)
	w.addScaled(&w, -a*a, &x[2])
	w.mul(&w, &den)
	if x[2].c[0] >= 0 {
		w.mul(&w, &r2)
		t.addConst(&r2, a*a)
		w.div(&w, &t)
		t.add(&r, &x[2])
		w.div(&w, &t)
	} else {
		var u tay
		t.sub(&r, &x[2])
		w.mul(&w, &t)
		t.mul(&x[0], &x[0])
		u.mul(&x[1], &x[1])
		t.add(&t, &u)
		w.div(&w, &t)
	}
	w.scale(k.P, &w)
	t.mul(&w, &x[1])
	A[1].sub(&A[1], &t)
	t.mul(&w, &x[0])
	A[2].add(&A[2], &t)
}
