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
// exact in α, by Taylor-expanding the radial quadrature itself: the
// turning point x_t(μ) is found by Newton's method in truncated Taylor
// arithmetic in μ (background/jet), and the subtracted integrand of
// radialProblem, analytic in μ at fixed t after the substitution
// x = x_t(1 − t²), is expanded and integrated coefficient by coefficient
// with the graded Gauss–Legendre rule. At α = 0 the coefficients are the
// Einstein and Westpfahl values of SchwarzschildPM (checked in the tests).
// |α| < 1 is required (for |α| ≥ 1 the undeflected line meets the ring).
func KerrEquatorialSeries(v, alpha float64) (Series2, error) {
	g, err := seriesArgs(v, alpha)
	if err != nil {
		return Series2{}, err
	}
	al := -alpha
	p2 := g * g * v * v
	w := 1 - al/v
	const K = 2
	var mu, d1, d3, x, c, cp, t1 jet.Jet
	mu.SetVar(K, 0, 0)
	d1.Scale(2/p2, &mu)
	d3.Scale(2*w*w, &mu)
	d2 := al * al
	// C(x) = 1 + d1 x + (d2 − 1) x² + d3 x³ and C'(x); Newton from the
	// flat turning point 1/√(1 − α²).
	x.SetConst(K, 1/math.Sqrt((1-al)*(1+al)))
	for it := 0; it < 4; it++ {
		// c = 1 + x(d1 + x((d2 − 1) + x d3))
		c.Mul(&x, &d3)
		c.AddConst(&c, d2-1)
		c.Mul(&c, &x)
		c.Add(&c, &d1)
		c.Mul(&c, &x)
		c.AddConst(&c, 1)
		// cp = d1 + x(2(d2 − 1) + 3 x d3)
		cp.Mul(&x, &d3)
		cp.Scale(3, &cp)
		cp.AddConst(&cp, 2*(d2-1))
		cp.Mul(&cp, &x)
		cp.Add(&cp, &d1)
		t1.Div(&c, &cp)
		x.Sub(&x, &t1)
	}
	xt := x
	// Backward deflation of C by (x_t − x), as in radialProblem.deflection.
	var x2, dd0, dd1, g2, g3, sq jet.Jet
	x2.Mul(&xt, &xt)
	// d0 = −(d1 + d2 x_t + d3 x_t²)
	dd0.Mul(&d3, &x2)
	t1.Scale(d2, &xt)
	dd0.Add(&dd0, &t1)
	dd0.Add(&dd0, &d1)
	dd0.Neg(&dd0)
	dd1.Add(&d1, &dd0)
	dd1.Div(&dd1, &xt)
	g2.AddConst(&dd1, d2)
	g2.Div(&g2, &xt)
	g3.Add(&d3, &g2)
	g3.Div(&g3, &xt)
	sq.Sqrt(&xt)
	var xx, h, dd, gg, sg, sh, num, den, phi, out, tmp jet.Jet
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
		// −dd/(sg sh (sg + sh))
		den.Add(&sg, &sh)
		den.Mul(&den, &sh)
		den.Mul(&den, &sg)
		out.Div(&dd, &den)
		out.Neg(&out)
		// Φ − 1 = x(2μα/v − α² x)/(1 − 2μx + α²x²), over sg.
		num.Scale(2*al/v, &mu)
		tmp.Scale(al*al, &xx)
		num.Sub(&num, &tmp)
		num.Mul(&num, &xx)
		phi.Mul(&mu, &xx)
		phi.Scale(-2, &phi)
		tmp.Mul(&xx, &xx)
		tmp.Scale(al*al, &tmp)
		phi.Add(&phi, &tmp)
		phi.AddConst(&phi, 1)
		num.Div(&num, &phi)
		num.Div(&num, &sg)
		out.Add(&out, &num)
		out.Mul(&out, &sq)
		out.Scale(2, &out)
		return &out
	}
	return seriesQuad(f, 2), nil
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
