package spacetime

import (
	"fmt"
	"math"

	"ricochet/background/jet"
)

// KerrNewmanNUT is the Kerr–Newman–Taub–NUT spacetime of mass M, spin
// parameter A, electric charge Q, magnetic charge P and NUT parameter N
// (Demiański & Newman 1966; Carter 1968; Miller 1973; Plebański 1975;
// Griffiths & Podolský, Exact Space-Times, 2009, Ch. 12 and §16.1; from
// memory). In Boyer–Lindquist-type coordinates (t, r, θ, φ),
//
//	ds² = −(Δ/Σ)(dt − χ dφ)² + (sin²θ/Σ)(a dt − Ω dφ)² + Σ(dr²/Δ + dθ²),
//	Σ = r² + (N + a cos θ)²,   Δ = r² − 2Mr + a² − N² + Q² + P²,
//	χ = a sin²θ − 2N(cos θ + C),   Ω = r² + a² + N² − 2aNC,
//	A = −([Q r − P(N + a cos θ)]/Σ)(dt − χ dφ) − P(cos θ + C) dφ,
//
// with C = StringGauge. Ω − aχ = Σ holds for every C: the family over C is
// one spacetime in the coordinates t_C = t_0 − 2NCφ (the C-dependence of Ω
// makes this exact also for a ≠ 0; with Ω = r² + a² + N² for all C the
// metric would not be a coordinate transform of the C = 0 one). The
// electric potential is the Kerr–Newman–NUT potential of the same
// references; the Einstein–Maxwell equations are checked in the tests.
//
// Magnetic charge. The dyonic member has the metric of the electric one
// with Q² → Q² + P² and the field duality-rotated, F = cos α F_e +
// sin α *F_e with F_e the field of charge √(Q² + P²) and Q + iP =
// √(Q² + P²) e^{iα} (*F_μν = ½√−g ε_μνρσ F^ρσ, ε_0123 = +1, as for
// DyonicKerrNewman). The magnetic part of A is Plebański's
// −g p(dτ + r² dσ)/(r² + p²) with p = N + a cos θ, g = −P, written in
// (t, φ) through dτ − p²dσ = U, dτ + r²dσ = V/a and Σ dφ = aU − V: it is
// (P p/Σ) U − P cos θ dφ up to the constant multiple P(N/a) dφ, and the
// constant −PC dφ puts its Dirac string on the half-axes of the Misner
// string: A_φ vanishes on θ = π for C = +1 and on θ = 0 for C = −1, so for
// C = ±1 one half-axis carries both strings and the other is regular, and
// for C = 0 both carry half of each. At N = 0, C = −1 this is the
// potential of DyonicKerrNewman (string on −z). The potential, not the
// field, is singular on the strings; paths keep away from them
// (NearString, also for N = 0 when P ≠ 0).
//
// The metric is expressed in asymptotically Cartesian coordinates
// (t, x, y, z) with
//
//	x = √(r² + a²) sin θ cos φ,  y = √(r² + a²) sin θ sin φ,  z = r cos θ,
//
// inverted by the Kerr–Schild quartic r⁴ − (x² + y² + z² − a²)r² − a²z² = 0,
// cos θ = z/r, φ = atan2(y, x). The coordinate one-forms are composed in jet
// arithmetic from their closed forms
//
//	dr = r(r²(x dx + y dy + z dz) + a²z dz)/(r⁴ + a²z²),
//	d(cos θ) = (dz − cos θ dr)/r,   dφ = (x dy − y dx)/(x² + y²),
//
// so jets of order K of (x, y, z) give the metric to order K. At N = 0 it
// is Kerr–Newman in Boyer–Lindquist form, with A > 0 meaning angular
// momentum M·A along +z as for KerrNewman.
//
// Misner string. The axis is regular where χ vanishes:
// χ(θ = 0) = −2N(1 + C) and χ(θ = π) = 2N(1 − C). Hence
//
//	C = +1: string on the half-axis θ = 0 (z > 0); θ = π regular,
//	C = −1: string on the half-axis θ = π (z < 0); θ = 0 regular,
//	C =  0: half-strength strings on both half-axes,
//
// and any other C puts strings on both. Events on the axis itself
// (x = y = 0) are outside the chart (dφ is singular there), regular half-axis
// included. Super-extremal parameters are allowed; the outer horizon is at
// Δ = 0, r₊ = M + √(M² − a² + N² − Q²).
type KerrNewmanNUT struct {
	M, A, Q, N  float64
	StringGauge float64
	P           float64 // magnetic charge (Gaussian units)
}

// Name implements Metric.
func (k KerrNewmanNUT) Name() string {
	if k.P != 0 {
		return fmt.Sprintf("dyonic Kerr–Newman–Taub–NUT M=%g a=%g Q=%g P=%g N=%g C=%g", k.M, k.A, k.Q, k.P, k.N, k.StringGauge)
	}
	return fmt.Sprintf("Kerr–Newman–Taub–NUT M=%g a=%g Q=%g N=%g C=%g", k.M, k.A, k.Q, k.N, k.StringGauge)
}

// chargeSq returns Q² + P², the charge term of Δ.
func (k KerrNewmanNUT) chargeSq() float64 { return k.Q*k.Q + k.P*k.P }

// Radius returns the radial coordinate r ≥ 0 of the event x.
func (k KerrNewmanNUT) Radius(x [4]float64) float64 { return ksRadiusFloat(x, k.A) }

// Horizon returns the outer horizon radius r₊ = M + √(M² − a² + N² − Q² − P²)
// and true, or 0 and false when Δ has no positive root.
func (k KerrNewmanNUT) Horizon() (float64, bool) {
	d := k.M*k.M - k.A*k.A + k.N*k.N - k.chargeSq()
	if d < 0 {
		return 0, false
	}
	rp := k.M + math.Sqrt(d)
	if rp <= 0 {
		return 0, false
	}
	return rp, true
}

// Inside reports whether x lies inside the outer horizon, r < r₊.
func (k KerrNewmanNUT) Inside(x [4]float64) bool {
	rp, ok := k.Horizon()
	return ok && k.Radius(x) < rp
}

// CrossesDisk reports whether the straight segment from p to q crosses the
// disk z = 0, x² + y² < a² (r = 0 of the chart).
func (k KerrNewmanNUT) CrossesDisk(p, q [4]float64) bool { return crossesDisk(p, q, k.A) }

// NearString reports whether x lies within coordinate distance tol of a
// half-axis carrying a Misner string or the Dirac string of the magnetic
// potential (see the type documentation; both lie on the same half-axes).
// It is false for N = P = 0.
func (k KerrNewmanNUT) NearString(x [4]float64, tol float64) bool {
	if k.N == 0 && k.P == 0 || math.Hypot(x[1], x[2]) >= tol {
		return false
	}
	if x[3] >= 0 && k.StringGauge != -1 {
		return true
	}
	if x[3] <= 0 && k.StringGauge != 1 {
		return true
	}
	return false
}

// kntnParts holds the jets shared by the exact and linear metrics.
type kntnParts struct {
	r, r2, c, s2 jet.Jet
	dr, dc, dphi [4]jet.Jet
}

func (p *kntnParts) build(x *[4]jet.Jet, a float64) {
	X, Y, Z := &x[1], &x[2], &x[3]
	o := X.Order()
	var den, t, rho2 jet.Jet
	ksRadius(&p.r, &p.r2, X, Y, Z, a)
	p.c.Div(Z, &p.r)
	rho2.Mul(X, X)
	rho2.AddMul(Y, Y)
	t.AddConst(&p.r2, a*a)
	p.s2.Div(&rho2, &t)
	// dr_i = r(r² x_i + a² z δ_i3)/(r⁴ + a²z²).
	den.Mul(&p.r2, &p.r2)
	t.Mul(Z, Z)
	den.AddScaled(&den, a*a, &t)
	t.Div(&p.r, &den) // r/(r⁴ + a²z²)
	var q jet.Jet
	q.Mul(&t, &p.r2)
	p.dr[0].SetConst(o, 0)
	p.dr[1].Mul(&q, X)
	p.dr[2].Mul(&q, Y)
	p.dr[3].Mul(&q, Z)
	q.Mul(&t, Z)
	p.dr[3].AddScaled(&p.dr[3], a*a, &q)
	// dc_i = (δ_i3 − c dr_i)/r.
	var ir jet.Jet
	ir.Inv(&p.r)
	for i := 0; i < 4; i++ {
		p.dc[i].Mul(&p.c, &p.dr[i])
		p.dc[i].Neg(&p.dc[i])
		if i == 3 {
			p.dc[i].AddConst(&p.dc[i], 1)
		}
		p.dc[i].Mul(&p.dc[i], &ir)
	}
	// dφ = (x dy − y dx)/(x² + y²).
	rho2.Inv(&rho2)
	p.dphi[0].SetConst(o, 0)
	p.dphi[1].Mul(Y, &rho2)
	p.dphi[1].Neg(&p.dphi[1])
	p.dphi[2].Mul(X, &rho2)
	p.dphi[3].SetConst(o, 0)
}

// addSym adds s·(u⊗v + v⊗u)/2 to g (upper triangle only).
func addSym(g *[4][4]jet.Jet, s *jet.Jet, u, v *[4]jet.Jet) {
	var t, w jet.Jet
	for m := 0; m < 4; m++ {
		for n := m; n < 4; n++ {
			t.Mul(&u[m], &v[n])
			w.Mul(&u[n], &v[m])
			t.Add(&t, &w)
			t.Scale(0.5, &t)
			w.Mul(s, &t)
			g[m][n].Add(&g[m][n], &w)
		}
	}
}

func symmetrize(g *[4][4]jet.Jet) {
	for m := 0; m < 4; m++ {
		for n := m + 1; n < 4; n++ {
			g[n][m].Set(&g[m][n])
		}
	}
}

// Eval implements Metric. The metric is formed as η + h with h the exact
// difference from the flat metric of the same oblate spheroidal
// coordinates (Σ₀ = r² + a²c², Δ₀ = Ω₀ = r² + a², χ₀ = a sin²θ,
// U₀ = dt − χ₀ dφ, V₀ = a dt − Ω₀ dφ; c = cos θ) and the exact variations
// δΣ = N² + 2aNc, δΔ = −2Mr − N² + Q² + P², δχ = −2N(c + C),
// δΩ = N² − 2aNC:
//
//	h = δk_UU U₀U₀ + 2(Δ/Σ) δχ dφ⊙U₀ − (Δ/Σ) δχ² dφ²
//	    + δk_VV V₀V₀ − 2(sin²θ/Σ) δΩ dφ⊙V₀ + (sin²θ/Σ) δΩ² dφ²
//	    + δk_r dr² + (δΣ/sin²θ) dc²,
//	δk_UU = (Δ₀δΣ − Σ₀δΔ)/(ΣΣ₀),  δk_VV = −sin²θ δΣ/(ΣΣ₀),
//	δk_r = (Δ₀δΣ − Σ₀δΔ)/(ΔΔ₀),
//
// (U = U₀ − δχ dφ, V = V₀ − δΩ dφ), which is the metric of the type
// comment term by term. Summed as written there, its four terms of order
// one cancel to η up to O(M/r) and leave a rounding of ~1e-16 in h and
// its derivatives, a relative error growing like r/M.
func (k KerrNewmanNUT) Eval(x *[4]jet.Jet, g *[4][4]jet.Jet, A *[4]jet.Jet) {
	o := x[0].Order()
	a, N, C := k.A, k.N, k.StringGauge
	var p kntnParts
	p.build(x, a)
	var sig, del, chi, om, t, s jet.Jet
	var sig0, ra2, dSig, dDel, dChi, nUU, isig0, cc jet.Jet
	// Σ = r² + (N + a c)², Δ = r² − 2Mr + a² − N² + Q² + P².
	t.Scale(a, &p.c)
	t.AddConst(&t, N)
	sig.Mul(&t, &t)
	sig.Add(&sig, &p.r2)
	del.AddScaled(&p.r2, -2*k.M, &p.r)
	del.AddConst(&del, a*a-N*N+k.chargeSq())
	// Flat values and exact variations.
	cc.Mul(&p.c, &p.c)
	sig0.AddScaled(&p.r2, a*a, &cc)
	ra2.AddConst(&p.r2, a*a)
	dSig.Scale(2*a*N, &p.c)
	dSig.AddConst(&dSig, N*N)
	dDel.Scale(-2*k.M, &p.r)
	dDel.AddConst(&dDel, -N*N+k.chargeSq())
	dChi.Scale(-2*N, &p.c)
	dChi.AddConst(&dChi, -2*N*C)
	dOm := N*N - 2*a*N*C
	// χ = χ₀ + δχ (for the potential), χ₀ = a s², Ω₀ = r² + a².
	var chi0 jet.Jet
	chi0.Scale(a, &p.s2)
	chi.Add(&chi0, &dChi)
	om.Set(&ra2)
	// U₀ = dt − χ₀ dφ, V₀ = a dt − Ω₀ dφ, and U = U₀ − δχ dφ.
	var U0, V0, U [4]jet.Jet
	for i := 0; i < 4; i++ {
		U0[i].Mul(&chi0, &p.dphi[i])
		U0[i].Neg(&U0[i])
		V0[i].Mul(&om, &p.dphi[i])
		V0[i].Neg(&V0[i])
		U[i].Mul(&chi, &p.dphi[i])
		U[i].Neg(&U[i])
	}
	U0[0].AddConst(&U0[0], 1)
	V0[0].AddConst(&V0[0], a)
	U[0].AddConst(&U[0], 1)
	for m := 0; m < 4; m++ {
		for n := m; n < 4; n++ {
			g[m][n].SetConst(o, 0)
		}
	}
	var isig, ddel, sv jet.Jet
	isig.Inv(&sig)
	isig0.Inv(&sig0)
	nUU.Mul(&ra2, &dSig)
	t.Mul(&sig0, &dDel)
	nUU.Sub(&nUU, &t)
	// δk_UU U₀U₀.
	s.Mul(&nUU, &isig)
	s.Mul(&s, &isig0)
	addSym(g, &s, &U0, &U0)
	// 2(Δ/Σ) δχ dφ⊙U₀.
	ddel.Mul(&del, &isig) // Δ/Σ
	s.Mul(&ddel, &dChi)
	s.Scale(2, &s)
	addSym(g, &s, &p.dphi, &U0)
	// δk_VV V₀V₀.
	sv.Mul(&p.s2, &isig) // sin²θ/Σ
	s.Mul(&sv, &dSig)
	s.Mul(&s, &isig0)
	s.Neg(&s)
	addSym(g, &s, &V0, &V0)
	// −2(sin²θ/Σ) δΩ dφ⊙V₀.
	s.Scale(-2*dOm, &sv)
	addSym(g, &s, &p.dphi, &V0)
	// (−(Δ/Σ) δχ² + (sin²θ/Σ) δΩ²) dφ².
	s.Mul(&dChi, &dChi)
	s.Mul(&s, &ddel)
	s.Neg(&s)
	s.AddScaled(&s, dOm*dOm, &sv)
	addSym(g, &s, &p.dphi, &p.dphi)
	// δk_r dr², δk_c dc².
	s.Div(&nUU, &del)
	t.Inv(&ra2)
	s.Mul(&s, &t)
	addSym(g, &s, &p.dr, &p.dr)
	s.Div(&dSig, &p.s2)
	addSym(g, &s, &p.dc, &p.dc)
	g[0][0].AddConst(&g[0][0], -1)
	for i := 1; i < 4; i++ {
		g[i][i].AddConst(&g[i][i], 1)
	}
	symmetrize(g)
	setPotential(A, k.Q, k.P, N, a, C, o, &p, &isig, &U)
}

// EvalLinear implements Linearizable. First order keeps the terms linear in
// M, N and Q, all orders in the spin parameter a (not a coupling); N², MN,
// Q² and QN, QM terms are dropped. With the flat values Σ₀ = r² + a²cos²θ,
// Δ₀ = r² + a², χ₀ = a sin²θ, Ω₀ = r² + a², U₀ = dt − χ₀dφ,
// V₀ = a dt − Ω₀dφ and the first-order variations
//
//	δΔ = −2Mr,  δΣ = 2aN cos θ,  δχ = −2N(cos θ + C),  δΩ = −2aNC,
//
// the perturbation is
//
//	h = (−δΔ/Σ₀ + Δ₀δΣ/Σ₀²) U₀U₀ + 2(Δ₀/Σ₀) δχ dφ⊙U₀ − (sin²θ δΣ/Σ₀²) V₀V₀
//	    − 2(sin²θ/Σ₀) δΩ dφ⊙V₀ + (δΣ/Δ₀ − Σ₀δΔ/Δ₀²) dr² + (δΣ/sin²θ) d(cos θ)²,
//
// (u⊙v = ½(u⊗v + v⊗u)) and A = −((Q r − P a cos θ)/Σ₀) U₀ − P(cos θ + C) dφ,
// the flat-space (dyonic root-Kerr) potential.
func (k KerrNewmanNUT) EvalLinear(x *[4]jet.Jet, h *[4][4]jet.Jet, A *[4]jet.Jet) {
	o := x[0].Order()
	a, N, C := k.A, k.N, k.StringGauge
	var p kntnParts
	p.build(x, a)
	var sig0, del0, isig, dDel, dSig, dChi, s, t jet.Jet
	t.Mul(&p.c, &p.c)
	sig0.AddScaled(&p.r2, a*a, &t)
	isig.Inv(&sig0)
	del0.AddConst(&p.r2, a*a)
	dDel.Scale(-2*k.M, &p.r)
	dSig.Scale(2*a*N, &p.c)
	dChi.Scale(-2*N, &p.c)
	dChi.AddConst(&dChi, -2*N*C)
	dOm := -2 * a * N * C
	var U, V [4]jet.Jet
	for i := 0; i < 4; i++ {
		t.Mul(&p.s2, &p.dphi[i])
		U[i].Scale(-a, &t)
		V[i].Mul(&del0, &p.dphi[i])
		V[i].Neg(&V[i])
	}
	U[0].AddConst(&U[0], 1)
	V[0].AddConst(&V[0], a)
	for m := 0; m < 4; m++ {
		for n := m; n < 4; n++ {
			h[m][n].SetConst(o, 0)
		}
	}
	// (−δΔ/Σ₀ + Δ₀δΣ/Σ₀²) U₀U₀
	s.Mul(&del0, &dSig)
	s.Mul(&s, &isig)
	s.Sub(&s, &dDel)
	s.Mul(&s, &isig)
	addSym(h, &s, &U, &U)
	// 2(Δ₀/Σ₀) δχ dφ⊙U₀
	s.Mul(&del0, &isig)
	s.Mul(&s, &dChi)
	s.Scale(2, &s)
	addSym(h, &s, &p.dphi, &U)
	// −(sin²θ δΣ/Σ₀²) V₀V₀
	s.Mul(&p.s2, &dSig)
	s.Mul(&s, &isig)
	s.Mul(&s, &isig)
	s.Neg(&s)
	addSym(h, &s, &V, &V)
	// −2(sin²θ/Σ₀) δΩ dφ⊙V₀
	s.Mul(&p.s2, &isig)
	s.Scale(-2*dOm, &s)
	addSym(h, &s, &p.dphi, &V)
	// (δΣ/Δ₀ − Σ₀δΔ/Δ₀²) dr²
	var idel jet.Jet
	idel.Inv(&del0)
	s.Mul(&sig0, &dDel)
	s.Mul(&s, &idel)
	s.Sub(&dSig, &s)
	s.Mul(&s, &idel)
	addSym(h, &s, &p.dr, &p.dr)
	// (δΣ/sin²θ) dc²
	s.Div(&dSig, &p.s2)
	addSym(h, &s, &p.dc, &p.dc)
	symmetrize(h)
	setPotential(A, k.Q, k.P, 0, a, C, o, &p, &isig, &U)
}

// setPotential writes the dyonic Kerr–Newman–NUT potential
//
//	A_μ = −([Q r − P(N + a cos θ)]/Σ) U_μ − P(cos θ + C) dφ_μ,
//
// with U = dt − χ dφ, given 1/Σ (zero when Q = P = 0). Eval passes the
// exact Σ, U and N; EvalLinear passes their N = 0 values, since A is
// already of first order in the charges (P N is of second order).
func setPotential(A *[4]jet.Jet, q, pm, N, a, C float64, o int, p *kntnParts, isig *jet.Jet, U *[4]jet.Jet) {
	if q == 0 && pm == 0 {
		for m := range A {
			A[m].SetConst(o, 0)
		}
		return
	}
	var s, t jet.Jet
	// s = −(Q r − P(N + a c))/Σ.
	s.Scale(-q, &p.r)
	if pm != 0 {
		t.Scale(a, &p.c)
		t.AddConst(&t, N)
		s.AddScaled(&s, pm, &t)
	}
	s.Mul(&s, isig)
	for m := range A {
		A[m].Mul(&s, &U[m])
	}
	if pm == 0 {
		return
	}
	// −P(c + C) dφ.
	t.AddConst(&p.c, C)
	t.Scale(-pm, &t)
	for m := range A {
		var w jet.Jet
		w.Mul(&t, &p.dphi[m])
		A[m].Add(&A[m], &w)
	}
}
