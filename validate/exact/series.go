package exact

import (
	"fmt"
	"math"

	"ricochet/background/jet"
	"ricochet/background/vec"
)

// DyonSeries returns the first- and second-order parts of the impulse per
// unit mass Δp⃗/m of Dyon (Poincaré 1896 for the charge–monopole cone; the
// dyon–dyon cone as derived there) in the couplings κ = qQ + gP and
// μ = qP − gQ: first is homogeneous of degree one in (κ, μ), second of
// degree two, and Δp⃗/m = first + second + O(3).
//
// Derivation (ours, from the closed form of Dyon). With μ̃ = μ/L,
// L = γ m v b, and ε = κ/(m b), the cone gives Ĵ × ê_in = ŷ and
//
//	n̂_out = [(−μ̃² − cos Φ) x̂ + μ̃ (1 − cos Φ) ẑ]/(1 + μ̃²) + sin Φ/√(1 + μ̃²) ŷ,
//
// Φ = √(1 + μ̃²)(π − χ_D), χ_D = c₁ε + c₂ε² + … (DarwinSeries). To second
// order Φ = π − χ_D + π μ̃²/2, so cos Φ = −1 + c₁²ε²/2 and
// sin Φ = c₁ε + c₂ε² − π μ̃²/2, whence, with p = γ v,
//
//	first  = p (0, c₁ ε, 2 μ̃),
//	second = p (−2 μ̃² − c₁² ε²/2, c₂ ε² − π μ̃²/2, 0).
//
// The monopole's second-order pull towards the source, −π μ̃²/2, comes from
// the cone's opening: the probe turns by more than π about Ĵ. The mass
// shell, 2 second_x p + first_y² + first_z² = 0, holds term by term.
func DyonSeries(v, b, m float64, probe, source Charge) (first, second vec.Vec3, err error) {
	g, err := gammaOf(v)
	if err != nil {
		return first, second, err
	}
	if err := checkB(b); err != nil {
		return first, second, err
	}
	if !(m > 0) {
		return first, second, fmt.Errorf("exact: probe mass m = %v must be positive", m)
	}
	kappa := probe.Electric*source.Electric + probe.Magnetic*source.Magnetic
	mu := probe.Electric*source.Magnetic - probe.Magnetic*source.Electric
	c1, c2, _ := DarwinSeries(v)
	p := g * v
	eps := kappa / (m * b)
	mt := mu / (p * m * b)
	first = vec.Vec3{0, c1 * eps, 2 * mt}.Scale(p)
	second = vec.Vec3{-2*mt*mt - c1*c1*eps*eps/2, c2*eps*eps - math.Pi*mt*mt/2, 0}.Scale(p)
	return first, second, nil
}

// Series2 holds the first two coefficients of a weak-coupling expansion,
// χ = C1 λ + C2 λ² + O(λ³), with error estimates of the quadrature.
type Series2 struct {
	C1, C2       float64
	C1Err, C2Err float64
}

// Coefficients of a jet in the expansion variable (variable 0).
var (
	ord1 = [jet.NumVars]int{1, 0, 0, 0}
	ord2 = [jet.NumVars]int{2, 0, 0, 0}
)

// seriesArgs checks the arguments of the series of the radial
// quadratures and returns γ.
func seriesArgs(v, alpha float64) (float64, error) {
	g, err := gammaOf(v)
	if err != nil {
		return 0, err
	}
	if !(math.Abs(alpha) < 1) {
		return 0, fmt.Errorf("exact: weak-field series needs a ring parameter |α| < 1, have %v", alpha)
	}
	return g, nil
}

// seriesQuad integrates the first- and second-order Taylor coefficients of
// a jet-valued integrand with the graded rule of radialProblem (one pass
// per coefficient, so each is integrated with its own error estimate).
func seriesQuad(f func(t, omt float64) *jet.Jet, scale float64) Series2 {
	var s Series2
	s.C1, s.C1Err = gradedQuad(func(t, omt float64) float64 { return f(t, omt).Coeff(ord1) })
	s.C2, s.C2Err = gradedQuad(func(t, omt float64) float64 { return f(t, omt).Coeff(ord2) })
	s.C1, s.C1Err, s.C2, s.C2Err = scale*s.C1, math.Abs(scale)*s.C1Err, scale*s.C2, math.Abs(scale)*s.C2Err
	return s
}

// KerrEquatorialSeries returns the first two coefficients of the expansion
// of the KerrEquatorial deflection in μ = M/b at fixed α = a/b (spin along
// +z, so α > 0 is retrograde in the frame of record) and speed v,
//
//	χ = C1 μ + C2 μ² + O(μ³),
//
// exact in α, by Taylor-expanding the radial quadrature itself
// (radialSeries). At α = 0 the coefficients are the Einstein and
// Westpfahl values of SchwarzschildPM (checked in the tests). |α| < 1 is
// required (for |α| ≥ 1 the undeflected line meets the ring).
func KerrEquatorialSeries(v, alpha float64) (Series2, error) {
	g, err := seriesArgs(v, alpha)
	if err != nil {
		return Series2{}, err
	}
	al := -alpha
	p2 := g * g * v * v
	w := 1 - al/v
	// Φ − 1 = x(2μα/v − α² x)/(1 − 2μx + α²x²).
	var num, den, tmp jet.Jet
	phiM1 := func(mu, x, out *jet.Jet) {
		num.Scale(2*al/v, mu)
		tmp.Scale(al*al, x)
		num.Sub(&num, &tmp)
		num.Mul(&num, x)
		den.Mul(mu, x)
		den.Scale(-2, &den)
		tmp.Mul(x, x)
		tmp.Scale(al*al, &tmp)
		den.Add(&den, &tmp)
		den.AddConst(&den, 1)
		out.Div(&num, &den)
	}
	d := [5][3]float64{1: {0, 2 / p2}, 2: {al * al}, 3: {0, 2 * w * w}}
	return radialSeries(d, phiM1, 1/math.Sqrt((1-al)*(1+al))), nil
}

// ReissnerNordstromSeries returns the first two coefficients of the
// expansion of the ReissnerNordstrom deflection of a probe of charge-to-
// mass ratio qm when the hole's mass and charge are scaled together,
// (M, Q) → λ(M, Q), at fixed speed v and impact parameter b,
//
//	χ = C1 λ + C2 λ² + O(λ³),
//
// so that the gravitational coupling M/b and the electromagnetic one
// qm Q/b are of first order and Q²/b² (in the metric) of second; by the
// Taylor-expanded radial quadrature (radialSeries).
func ReissnerNordstromSeries(v, b, M, Q, qm float64) (Series2, error) {
	g, err := seriesArgs(v, 0)
	if err != nil {
		return Series2{}, err
	}
	if err := checkB(b); err != nil {
		return Series2{}, err
	}
	mu, nu, lam := M/b, Q/b, qm*Q/b
	p2 := g * g * v * v
	d := [5][3]float64{1: {0, 2 * (mu - g*lam) / p2}, 2: {0, 0, (lam - nu) * (lam + nu) / p2}, 3: {0, 2 * mu}, 4: {0, 0, -nu * nu}}
	return radialSeries(d, nil, 1), nil
}

// radialSeries expands the deflection χ = 2∫₀^{x_t} Φ dx/√C − π of a
// radialProblem whose coefficients are polynomials in the expansion
// parameter λ, d_k = d[k][0] + d[k][1] λ + d[k][2] λ², with Φ − 1 given
// by phiM1(λ, x) (nil: Φ = 1), to second order in λ. The turning point
// x_t(λ) is found by Newton's method in truncated Taylor arithmetic in λ
// (background/jet) from the zero-coupling root xt0, and the subtracted
// integrand of radialProblem.deflection, analytic in λ at fixed t after
// the substitution x = x_t(1 − t²), is expanded and integrated
// coefficient by coefficient with the graded Gauss–Legendre rule.
func radialSeries(d [5][3]float64, phiM1 func(lam, x, out *jet.Jet), xt0 float64) Series2 {
	const K = 2
	var lam jet.Jet
	lam.SetVar(K, 0, 0)
	var dj [5]jet.Jet
	for k := 1; k <= 4; k++ {
		dj[k].Mul(&lam, &lam)
		dj[k].Scale(d[k][2], &dj[k])
		var t jet.Jet
		t.Scale(d[k][1], &lam)
		dj[k].Add(&dj[k], &t)
		dj[k].AddConst(&dj[k], d[k][0])
	}
	// C(x) = 1 + x(d1 + x((d2 − 1) + x(d3 + x d4))) and C'(x), Newton.
	var x, c, cp, t1 jet.Jet
	x.SetConst(K, xt0)
	for it := 0; it < 4; it++ {
		c.Mul(&x, &dj[4])
		cp.Scale(4, &c)
		c.Add(&c, &dj[3])
		t1.Scale(3, &dj[3])
		cp.Add(&cp, &t1)
		c.Mul(&c, &x)
		cp.Mul(&cp, &x)
		c.Add(&c, &dj[2])
		c.AddConst(&c, -1)
		t1.Scale(2, &dj[2])
		cp.Add(&cp, &t1)
		cp.AddConst(&cp, -2)
		c.Mul(&c, &x)
		cp.Mul(&cp, &x)
		c.Add(&c, &dj[1])
		cp.Add(&cp, &dj[1])
		c.Mul(&c, &x)
		c.AddConst(&c, 1)
		t1.Div(&c, &cp)
		x.Sub(&x, &t1)
	}
	xt := x
	// Backward deflation of C by (x_t − x), as in radialProblem.deflection:
	// d0 = −(d1 + d2 x_t + d3 x_t² + d4 x_t³).
	var dd0, dd1, g2, g3, sq jet.Jet
	dd0.Mul(&dj[4], &xt)
	dd0.Add(&dd0, &dj[3])
	dd0.Mul(&dd0, &xt)
	dd0.Add(&dd0, &dj[2])
	dd0.Mul(&dd0, &xt)
	dd0.Add(&dd0, &dj[1])
	dd0.Neg(&dd0)
	dd1.Add(&dj[1], &dd0)
	dd1.Div(&dd1, &xt)
	g2.Add(&dj[2], &dd1)
	g2.Div(&g2, &xt)
	g3.Add(&dj[3], &g2)
	g3.Div(&g3, &xt)
	sq.Sqrt(&xt)
	var xx, h, dd, gg, sg, sh, den, phi, out jet.Jet
	f := func(t, omt float64) *jet.Jet {
		xx.Scale(omt*(1+t), &xt)
		h.Add(&xt, &xx)
		// dd = d0 + x(d1' + x(g2 + x g3))
		dd.Mul(&xx, &g3)
		dd.Add(&dd, &g2)
		dd.Mul(&dd, &xx)
		dd.Add(&dd, &dd1)
		dd.Mul(&dd, &xx)
		dd.Add(&dd, &dd0)
		gg.Add(&h, &dd)
		sg.Sqrt(&gg)
		sh.Sqrt(&h)
		// −dd/(sg sh (sg + sh)) + (Φ − 1)/sg
		den.Add(&sg, &sh)
		den.Mul(&den, &sh)
		den.Mul(&den, &sg)
		out.Div(&dd, &den)
		out.Neg(&out)
		if phiM1 != nil {
			phiM1(&lam, &xx, &phi)
			phi.Div(&phi, &sg)
			out.Add(&out, &phi)
		}
		out.Mul(&out, &sq)
		out.Scale(2, &out)
		return &out
	}
	return seriesQuad(f, 2)
}

// RootKerrAlignedSeries returns the first two coefficients of the
// expansion of the RootKerrAligned deflection in ε = κ/(m b) at fixed
// total ring parameter α = (a_source + a_probe)/b and speed v,
//
//	χ = C1 ε + C2 ε² + O(ε³),
//
// exact in α, by the same Taylor expansion of the quadrature as
// KerrEquatorialSeries (turning point by Newton's method in truncated
// Taylor arithmetic, integrand of alignedProblem expanded coefficient by
// coefficient). At α = 0 it is DarwinSeries (checked in the tests).
// |α| < 1 is required.
func RootKerrAlignedSeries(v, alpha float64) (Series2, error) {
	g, err := seriesArgs(v, alpha)
	if err != nil {
		return Series2{}, err
	}
	const K = 2
	eta := 1 / v
	a := alpha
	var k jet.Jet
	k.SetVar(K, 0, 0)
	k.Scale(1/(g*v), &k)
	var sS, u, up, w, c, cp, t1, t2 jet.Jet
	// S(x) = √(1 − α²x²), u = k x/S, u' = k/S³.
	eval := func(x *jet.Jet, withDeriv bool) {
		t1.Mul(x, x)
		t1.Scale(-a*a, &t1)
		t1.AddConst(&t1, 1)
		sS.Sqrt(&t1)
		u.Mul(&k, x)
		u.Div(&u, &sS)
		// w = (1 + αu) x
		w.Scale(a, &u)
		w.AddConst(&w, 1)
		w.Mul(&w, x)
		// C = 1 − 2ηu + u² − w²
		c.Mul(&u, &u)
		t2.Scale(-2*eta, &u)
		c.Add(&c, &t2)
		c.AddConst(&c, 1)
		t2.Mul(&w, &w)
		c.Sub(&c, &t2)
		if !withDeriv {
			return
		}
		// C' = u'(−2η + 2u − 2αwx) − 2(1 + αu) w
		up.Mul(&sS, &sS)
		up.Mul(&up, &sS)
		up.Div(&k, &up)
		t1.Mul(&w, x)
		t1.Scale(-2*a, &t1)
		t2.Scale(2, &u)
		t1.Add(&t1, &t2)
		t1.AddConst(&t1, -2*eta)
		cp.Mul(&up, &t1)
		t1.Scale(a, &u)
		t1.AddConst(&t1, 1)
		t1.Mul(&t1, &w)
		t1.Scale(-2, &t1)
		cp.Add(&cp, &t1)
	}
	var xt jet.Jet
	xt.SetConst(K, 1)
	for it := 0; it < 4; it++ {
		eval(&xt, true)
		t1.Div(&c, &cp)
		xt.Sub(&xt, &t1)
	}
	eval(&xt, false)
	var st, ut, wt, sq jet.Jet
	st.Set(&sS)
	ut.Set(&u)
	wt.Set(&w)
	sq.Sqrt(&xt)
	var x, s, uu, ww, du, dw, D, H, phi, out, tmp jet.Jet
	f := func(t, omt float64) *jet.Jet {
		x.Scale(omt*(1+t), &xt)
		tmp.Mul(&x, &x)
		tmp.Scale(-a*a, &tmp)
		tmp.AddConst(&tmp, 1)
		s.Sqrt(&tmp)
		uu.Mul(&k, &x)
		uu.Div(&uu, &s)
		ww.Scale(a, &uu)
		ww.AddConst(&ww, 1)
		ww.Mul(&ww, &x)
		// du = k (x + x_t)/((x s_t + x_t s) s s_t)
		du.Add(&x, &xt)
		du.Mul(&du, &k)
		tmp.Mul(&x, &st)
		D.Mul(&xt, &s)
		tmp.Add(&tmp, &D)
		tmp.Mul(&tmp, &s)
		tmp.Mul(&tmp, &st)
		du.Div(&du, &tmp)
		// dw = 1 + α(u + x_t du)
		dw.Mul(&xt, &du)
		dw.Add(&dw, &uu)
		dw.Scale(a, &dw)
		dw.AddConst(&dw, 1)
		// D = −du(−2η + u + u_t) + dw(w + w_t)
		tmp.Add(&uu, &ut)
		tmp.AddConst(&tmp, -2*eta)
		D.Mul(&du, &tmp)
		D.Neg(&D)
		tmp.Add(&ww, &wt)
		tmp.Mul(&tmp, &dw)
		D.Add(&D, &tmp)
		H.Add(&xt, &x)
		// 2√x_t (Φ/√D − 1/√H), Φ = 1 + αu
		phi.Scale(a, &uu)
		phi.AddConst(&phi, 1)
		tmp.Sqrt(&D)
		out.Div(&phi, &tmp)
		tmp.Sqrt(&H)
		tmp.Inv(&tmp)
		out.Sub(&out, &tmp)
		out.Mul(&out, &sq)
		out.Scale(2, &out)
		return &out
	}
	return seriesQuad(f, -2), nil
}

// SpinOrbitSeries holds the expansion of the CoulombSpinOrbit deflection
// in the coupling ε and the probe spin a to second order in ε and linear
// order in a,
//
//	χ = C10 ε + C20 ε² + (C11 ε + C21 ε²) a + O(ε³, a²),
//
// with quadrature error estimates.
type SpinOrbitSeries struct {
	C10, C20, C11, C21             float64
	C10Err, C20Err, C11Err, C21Err float64
}

// CoulombSpinOrbitSeries returns the expansion of CoulombSpinOrbit
// (canonical Thomas–BMT spin–orbit Hamiltonian, linear in spin, with the
// Newton–Wigner to covariant impact-parameter shift; see there) in ε and
// a, at speed v and gyromagnetic ratio g, by Taylor-expanding its radial
// quadrature in both (truncated Taylor arithmetic of background/jet in two
// variables): the turning point u_t(ε, a) by Newton's method, the
// integrand of the sweep, analytic in (ε, a) at fixed t after
// u = u_t(1 − t²), coefficient by coefficient with the graded
// Gauss–Legendre rule. At a = 0 it is DarwinSeries (checked in the
// tests).
func CoulombSpinOrbitSeries(v, g float64) (SpinOrbitSeries, error) {
	gam, err := gammaOf(v)
	if err != nil {
		return SpinOrbitSeries{}, err
	}
	if math.IsNaN(g) || math.IsInf(g, 0) {
		return SpinOrbitSeries{}, fmt.Errorf("exact: gyromagnetic ratio g = %v invalid", g)
	}
	const K = 3
	E := gam
	var k, S, L jet.Jet
	k.SetVar(K, 0, 0)
	S.SetVar(K, 0, 1)
	// L = −(1 − (γ − 1) a/(γ v)) γ v
	L.Scale((gam-1)/(gam*v), &S)
	L.AddConst(&L, -1)
	L.Scale(gam*v, &L)
	var e, hu, hp, fu, fp, t1, t2, kS jet.Jet
	kS.Mul(&k, &S)
	// h(u) = g/2 − 1 + 1/(E − k u + 1); e = E − k u.
	hOf := func(u *jet.Jet) {
		e.Mul(&k, u)
		e.Neg(&e)
		e.AddConst(&e, E)
		t1.AddConst(&e, 1)
		hu.Inv(&t1)
		hp.Mul(&hu, &hu)
		hp.Mul(&hp, &k) // h' = k/(e + 1)²
		hu.AddConst(&hu, g/2-1)
	}
	var u jet.Jet
	u.SetConst(K, 1)
	for it := 0; it < 5; it++ {
		hOf(&u)
		// f = e² − 1 − L²u² + 2 L kS u³ h
		var u2, u3 jet.Jet
		u2.Mul(&u, &u)
		u3.Mul(&u2, &u)
		fu.Mul(&e, &e)
		fu.AddConst(&fu, -1)
		t1.Mul(&L, &L)
		t2.Mul(&t1, &u2)
		fu.Sub(&fu, &t2)
		t2.Mul(&L, &kS)
		t2.Scale(2, &t2)
		var w jet.Jet
		w.Mul(&u3, &hu)
		w.Mul(&w, &t2)
		fu.Add(&fu, &w)
		// f' = −2k e − 2L²u + 2L kS (3u²h + u³h')
		fp.Mul(&k, &e)
		fp.Scale(-2, &fp)
		t1.Mul(&L, &L)
		t1.Mul(&t1, &u)
		t1.Scale(2, &t1)
		fp.Sub(&fp, &t1)
		w.Mul(&u2, &hu)
		w.Scale(3, &w)
		var w2 jet.Jet
		w2.Mul(&u3, &hp)
		w.Add(&w, &w2)
		w.Mul(&w, &t2)
		fp.Add(&fp, &w)
		t1.Div(&fu, &fp)
		u.Sub(&u, &t1)
	}
	ut := u
	var gt, c jet.Jet
	gt.Mul(&k, &ut)
	gt.Neg(&gt)
	gt.AddConst(&gt, E) // E − k u_t
	c.Scale(2, &kS)
	var x, q, a1, a2, out, s2 jet.Jet
	f := func(t, omt float64) *jet.Jet {
		x.Scale(omt*(1+t), &ut)
		hOf(&x) // e = E − k x, hu = h(x)
		// q = k(2E − k(x + u_t)) + L²(x + u_t)
		//     − L c ((x² + x u_t + u_t²) h(x) + u_t³ k/((e + 1)(g_t + 1)))
		a1.Add(&x, &ut)
		q.Mul(&k, &a1)
		q.Neg(&q)
		q.AddConst(&q, 2*E)
		q.Mul(&q, &k)
		t1.Mul(&L, &L)
		t1.Mul(&t1, &a1)
		q.Add(&q, &t1)
		a2.Mul(&x, &x)
		t1.Mul(&x, &ut)
		a2.Add(&a2, &t1)
		t1.Mul(&ut, &ut)
		a2.Add(&a2, &t1)
		a2.Mul(&a2, &hu)
		t1.Mul(&ut, &ut)
		t1.Mul(&t1, &ut)
		t1.Mul(&t1, &k)
		t2.AddConst(&e, 1)
		s2.AddConst(&gt, 1)
		t2.Mul(&t2, &s2)
		t1.Div(&t1, &t2)
		a2.Add(&a2, &t1)
		a2.Mul(&a2, &c)
		a2.Mul(&a2, &L)
		q.Sub(&q, &a2)
		// 2 √(u_t/q) (L − kS x h(x))
		s2.Div(&ut, &q)
		s2.Sqrt(&s2)
		out.Mul(&kS, &x)
		out.Mul(&out, &hu)
		out.Sub(&L, &out)
		out.Mul(&out, &s2)
		out.Scale(2, &out)
		return &out
	}
	var r SpinOrbitSeries
	co := func(i, j int) (float64, float64) {
		idx := [jet.NumVars]int{i, j, 0, 0}
		val, e := gradedQuad(func(t, omt float64) float64 { return f(t, omt).Coeff(idx) })
		return 2 * val, 2 * e // χ = π + 2I; the constant term cancels π
	}
	r.C10, r.C10Err = co(1, 0)
	r.C20, r.C20Err = co(2, 0)
	r.C11, r.C11Err = co(1, 1)
	r.C21, r.C21Err = co(2, 1)
	return r, nil
}
