package spacetime

import (
	"fmt"
	"math"

	"ricochet/background/jet"
)

// KerrNewman is the Kerr–Newman spacetime of mass M, spin parameter A
// (angular momentum J = M·A along +z) and electric charge Q, in Cartesian
// Kerr–Schild coordinates (Kerr 1963; Kerr & Schild 1965; Debney, Kerr &
// Schild 1969 for the charged form; from memory):
//
//	g_μν = η_μν + f l_μ l_ν,     f = r²(2Mr − Q²)/(r⁴ + a²z²),
//	l_μ  = (1, (rx + ay)/(r² + a²), (ry − ax)/(r² + a²), z/r),
//	A_μ  = −(Q r³/(r⁴ + a²z²)) l_μ,
//
// where r ≥ 0 is the Boyer–Lindquist radius, the root of
//
//	r⁴ − (x² + y² + z² − a²) r² − a²z² = 0.
//
// l is null for both η and g. Far away A_0 → −Q/r (Φ = Q/r, E = Q r̂/r² in
// Gaussian units) and g_{0i} contains the frame-dragging term
// 2J(y, −x, 0)/r³ with J = Ma (Misner, Thorne & Wheeler 1973, eq. 19.5,
// from memory), so A > 0 means angular momentum along +z.
//
// Members: Schwarzschild (A = Q = 0), Reissner–Nordström (A = 0), Kerr
// (Q = 0), and flat space (M = Q = 0). Super-extremal parameters
// (A² + Q² > M²) are allowed: there is then no horizon, and the ring
// singularity x² + y² = a², z = 0 is naked.
//
// The metric is regular except on the ring; the disk z = 0, x² + y² < a²
// is where r → 0 and the coordinates pass to the r < 0 sheet, which this
// type does not represent: a path crossing the disk is to be reported
// (CrossesDisk), not continued.
type KerrNewman struct {
	M, A, Q float64
}

// Schwarzschild returns the Schwarzschild member of mass m.
func Schwarzschild(m float64) KerrNewman { return KerrNewman{M: m} }

// ReissnerNordstrom returns the Reissner–Nordström member of mass m and
// charge q.
func ReissnerNordstrom(m, q float64) KerrNewman { return KerrNewman{M: m, Q: q} }

// Kerr returns the Kerr member of mass m and spin parameter a.
func Kerr(m, a float64) KerrNewman { return KerrNewman{M: m, A: a} }

// Name implements Metric.
func (k KerrNewman) Name() string {
	return fmt.Sprintf("Kerr–Newman (Kerr–Schild) M=%g a=%g Q=%g", k.M, k.A, k.Q)
}

// ksRadius sets r and r2 = r² to the Kerr–Schild radius of (x, y, z) for
// spin parameter a, choosing the cancellation-free form of the root
//
//	r² = ½(w + √(w² + 4a²z²)) = 2a²z²/(√(w² + 4a²z²) − w),  w = x² + y² + z² − a².
func ksRadius(r, r2, x, y, z *jet.Jet, a float64) {
	var w, d, t jet.Jet
	w.Mul(x, x)
	w.AddMul(y, y)
	w.AddMul(z, z)
	w.AddConst(&w, -a*a)
	d.Mul(&w, &w)
	t.Mul(z, z)
	d.AddScaled(&d, 4*a*a, &t)
	d.Sqrt(&d)
	if w.Value() >= 0 {
		r2.Add(&w, &d)
		r2.Scale(0.5, r2)
	} else {
		d.Sub(&d, &w)
		r2.Scale(2*a*a, &t)
		r2.Div(r2, &d)
	}
	r.Sqrt(r2)
}

// Radius returns the Boyer–Lindquist radius r ≥ 0 of the event x.
func (k KerrNewman) Radius(x [4]float64) float64 { return ksRadiusFloat(x, k.A) }

// ksRadiusFloat is ksRadius in plain floating point, with the same
// cancellation-free branches.
func ksRadiusFloat(x [4]float64, a float64) float64 {
	X, Y, Z := x[1], x[2], x[3]
	w := X*X + Y*Y + Z*Z - a*a
	if a == 0 {
		return math.Sqrt(w)
	}
	t := Z * Z
	d := math.Sqrt(w*w + 4*a*a*t)
	var r2 float64
	if w >= 0 {
		r2 = 0.5 * (w + d)
	} else {
		r2 = 2 * a * a * t / (d - w)
	}
	return math.Sqrt(r2)
}

// Horizon returns the outer horizon radius r₊ = M + √(M² − a² − Q²) and
// true, or 0 and false when there is no horizon (a² + Q² > M², or M ≤ 0).
func (k KerrNewman) Horizon() (float64, bool) {
	d := k.M*k.M - k.A*k.A - k.Q*k.Q
	if d < 0 || k.M <= 0 {
		return 0, false
	}
	return k.M + math.Sqrt(d), true
}

// Inside reports whether x lies inside the outer horizon, r < r₊. It is
// false for every event when there is no horizon.
func (k KerrNewman) Inside(x [4]float64) bool {
	rp, ok := k.Horizon()
	return ok && k.Radius(x) < rp
}

// CrossesDisk reports whether the straight segment from p to q crosses the
// disk z = 0, x² + y² < a² bounded by the ring singularity.
func (k KerrNewman) CrossesDisk(p, q [4]float64) bool {
	return crossesDisk(p, q, k.A)
}

func crossesDisk(p, q [4]float64, a float64) bool {
	if a == 0 || (p[3] > 0) == (q[3] > 0) && p[3] != 0 && q[3] != 0 {
		return false
	}
	if p[3] == q[3] {
		return p[3] == 0 && (p[1]*p[1]+p[2]*p[2] < a*a || q[1]*q[1]+q[2]*q[2] < a*a)
	}
	s := p[3] / (p[3] - q[3])
	x := p[1] + s*(q[1]-p[1])
	y := p[2] + s*(q[2]-p[2])
	return x*x+y*y < a*a
}

// RingDistance returns the Euclidean coordinate distance from x to the
// ring x² + y² = a², z = 0.
func (k KerrNewman) RingDistance(x [4]float64) float64 {
	rho := math.Hypot(x[1], x[2])
	return math.Hypot(rho-math.Abs(k.A), x[3])
}

// ksNull sets l to the Kerr–Schild null covector and returns through den
// the jet r⁴ + a²z².
func ksNull(l *[4]jet.Jet, den, r, r2, x, y, z *jet.Jet, a float64) {
	var ra, t jet.Jet
	o := r.Order()
	ra.AddConst(r2, a*a)
	ra.Inv(&ra)
	l[0].SetConst(o, 1)
	t.Mul(r, x)
	t.AddScaled(&t, a, y)
	l[1].Mul(&t, &ra)
	t.Mul(r, y)
	t.AddScaled(&t, -a, x)
	l[2].Mul(&t, &ra)
	l[3].Div(z, r)
	den.Mul(r2, r2)
	t.Mul(z, z)
	den.AddScaled(den, a*a, &t)
}

func (k KerrNewman) eval(x *[4]jet.Jet, g *[4][4]jet.Jet, A *[4]jet.Jet, linear bool) {
	o := x[0].Order()
	var r, r2, den, f, s, t jet.Jet
	var l [4]jet.Jet
	ksRadius(&r, &r2, &x[1], &x[2], &x[3], k.A)
	ksNull(&l, &den, &r, &r2, &x[1], &x[2], &x[3], k.A)
	den.Inv(&den)
	// f = r²(2Mr − Q²)/(r⁴ + a²z²); linear: 2M r³/(r⁴ + a²z²).
	t.Scale(2*k.M, &r)
	if !linear {
		t.AddConst(&t, -k.Q*k.Q)
	}
	t.Mul(&t, &r2)
	f.Mul(&t, &den)
	for m := 0; m < 4; m++ {
		t.Mul(&f, &l[m])
		for n := m; n < 4; n++ {
			g[m][n].Mul(&t, &l[n])
			if !linear && m == n {
				g[m][n].AddConst(&g[m][n], eta[m])
			}
			if n != m {
				g[n][m].Set(&g[m][n])
			}
		}
	}
	if k.Q == 0 {
		for m := range A {
			A[m].SetConst(o, 0)
		}
		return
	}
	s.Mul(&r2, &r)
	s.Mul(&s, &den)
	s.Scale(-k.Q, &s)
	for m := range A {
		A[m].Mul(&s, &l[m])
	}
}

// Eval implements Metric.
func (k KerrNewman) Eval(x *[4]jet.Jet, g *[4][4]jet.Jet, A *[4]jet.Jet) {
	k.eval(x, g, A, false)
}

// EvalLinear implements Linearizable. First order keeps the terms linear in
// M and in Q and all orders in the spin parameter a, which is not a
// coupling:
//
//	h_μν = (2M r³/(r⁴ + a²z²)) l_μ l_ν,   A_μ = −(Q r³/(r⁴ + a²z²)) l_μ.
//
// The Q² term of f is dropped: in G = 1 units it is G·Q², second order in
// the coupling when Q is counted like M. At Q = 0 the Kerr–Schild metric is
// exactly linear in M, so h is then the exact g − η; the linear geometry
// still differs from the exact one through g^{-1} and the ΓΓ terms.
func (k KerrNewman) EvalLinear(x *[4]jet.Jet, h *[4][4]jet.Jet, A *[4]jet.Jet) {
	k.eval(x, h, A, true)
}
