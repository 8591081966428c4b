package spacetime

// staticMetric is implemented by the t-independent metrics of this package
// that can evaluate themselves in the static Taylor arithmetic of
// taylor.go: the fast path of Evaluator. The results agree with Eval and
// EvalLinear (jet arithmetic) to rounding; the tests compare them.
type staticMetric interface {
	// evalStatic writes the metric g_μν (h_μν when linear) and the
	// potential A_μ (zero if uncharged) at the spatial point whose
	// coordinate polynomials are x, all entries of g set.
	evalStatic(x *[3]tay, g *[4][4]tay, A *[4]tay, linear bool)
}

// tayRadius sets r and r2 = r² to the Kerr–Schild radius, as ksRadius.
func tayRadius(r, r2 *tay, x *[3]tay, a float64) {
	var w, d, t tay
	w.mul(&x[0], &x[0])
	t.mul(&x[1], &x[1])
	w.add(&w, &t)
	t.mul(&x[2], &x[2])
	w.add(&w, &t)
	w.addConst(&w, -a*a)
	if a == 0 {
		r2.set(&w)
		r.sqrt(r2)
		return
	}
	d.mul(&w, &w)
	d.addScaled(&d, 4*a*a, &t)
	d.sqrt(&d)
	if w.c[0] >= 0 {
		r2.add(&w, &d)
		r2.scale(0.5, r2)
	} else {
		d.sub(&d, &w)
		r2.scale(2*a*a, &t)
		r2.div(r2, &d)
	}
	r.sqrt(r2)
}

func symmetrizeTay(g *[4][4]tay) {
	for m := 0; m < 4; m++ {
		for n := m + 1; n < 4; n++ {
			g[n][m] = g[m][n]
		}
	}
}

// evalStatic implements staticMetric with the Kerr–Schild form of the type
// documentation: g = η + f l l, A = s l.
func (k KerrNewman) evalStatic(x *[3]tay, g *[4][4]tay, A *[4]tay, linear bool) {
	a := k.A
	K := x[0].k
	var r, r2, ip, den, f, s, t tay
	var l [4]tay
	tayRadius(&r, &r2, x, a)
	ip.addConst(&r2, a*a)
	ip.inv(&ip)
	l[0].setConst(K, 1)
	t.mul(&r, &x[0])
	t.addScaled(&t, a, &x[1])
	l[1].mul(&t, &ip)
	t.mul(&r, &x[1])
	t.addScaled(&t, -a, &x[0])
	l[2].mul(&t, &ip)
	l[3].div(&x[2], &r)
	den.mul(&r2, &r2)
	t.mul(&x[2], &x[2])
	den.addScaled(&den, a*a, &t)
	den.inv(&den)
	// f = r²(2Mr − Q²)/(r⁴ + a²z²); linear: 2M r³/(r⁴ + a²z²).
	f.scale(2*k.M, &r)
	if !linear {
		f.addConst(&f, -k.Q*k.Q)
	}
	f.mul(&f, &r2)
	f.mul(&f, &den)
	g[0][0] = f
	for i := 1; i < 4; i++ {
		g[0][i].mul(&f, &l[i])
		for j := i; j < 4; j++ {
			g[i][j].mul(&g[0][i], &l[j])
		}
	}
	if !linear {
		for m := 0; m < 4; m++ {
			g[m][m].c[0] += eta[m]
		}
	}
	symmetrizeTay(g)
	if k.Q == 0 {
		for m := range A {
			A[m].setConst(K, 0)
		}
		return
	}
	s.mul(&r2, &r)
	s.mul(&s, &den)
	s.scale(-k.Q, &s)
	A[0] = s
	for m := 1; m < 4; m++ {
		A[m].mul(&s, &l[m])
	}
}

// evalStatic implements staticMetric. Both the exact metric and its
// linearization (see Eval and EvalLinear) are written as
//
//	g = H_tt dt² + H_tφ (dt dφ + dφ dt) + H_φφ dφ² + k_r dr² + k_c d(cos θ)²,
//
// plus η (added here for the exact metric, by the caller in linear mode),
// with χ = χ₀ = a sin²θ, Ω = Ω₀ = r² + a² and
//
//	exact:  k_UU, k_φU, k_VV, k_φV, k_r, k_c the exact differences from
//	        the flat values (see the body), and H_φφ also −k_φU δχ − k_φV δΩ,
//	linear: k_UU, k_φU, k_VV, k_φV, k_r, k_c as in EvalLinear,
//	H_tt = k_UU + a² k_VV,
//	H_tφ = −χ k_UU + k_φU − aΩ k_VV + a k_φV,
//	H_φφ = χ² k_UU − 2χ k_φU + Ω² k_VV − 2Ω k_φV,
//
// from U = dt − χ dφ, V = a dt − Ω dφ. In Cartesian components
// dφ_i = (−y, x, 0)/ρ², dr_i = P(x, y, 0)_i + P_z z δ_i3 with
// P = r³/(r⁴ + a²z²), P_z = r(r² + a²)/(r⁴ + a²z²), and
// d(cos θ)_i = (δ_i3 − cos θ dr_i)/r.
func (k KerrNewmanNUT) evalStatic(x *[3]tay, g *[4][4]tay, A *[4]tay, linear bool) {
	a, N, C := k.A, k.N, k.StringGauge
	K := x[0].k
	X, Y, Z := &x[0], &x[1], &x[2]
	var r, r2, c, rho2, irho2, s2, ra2, den, P, Pz, ir, t, u tay
	tayRadius(&r, &r2, x, a)
	c.div(Z, &r)
	rho2.mul(X, X)
	t.mul(Y, Y)
	rho2.add(&rho2, &t)
	irho2.inv(&rho2)
	ra2.addConst(&r2, a*a)
	s2.div(&rho2, &ra2)
	den.mul(&r2, &r2)
	t.mul(Z, Z)
	den.addScaled(&den, a*a, &t)
	den.inv(&den)
	den.mul(&den, &r) // r/(r⁴ + a²z²)
	P.mul(&den, &r2)
	Pz.mul(&den, &ra2)
	ir.inv(&r)

	var kUU, kVV, kphiU, kphiV, kr, kc, chi, om, sig, isig, chiA, hpp2 tay
	hasPhi := false
	if !linear {
		// The exact metric as η + h, h formed like the first-order one
		// below but with the exact variations δΣ = Σ − Σ₀ = N² + 2aNc,
		// δΔ = −2Mr − N² + Q² + P², δχ = −2N(c + C), δΩ = N² − 2aNC: the
		// four terms of ds² are each of order one and cancel to η up to
		// O(M/r), so that summing them left a rounding of ~1e-16 in g and
		// ~1e-16/r in ∂g, relative errors growing like r/M (measured:
		// 1e-5 relative in the geodesic force at r = 1e9 b, M = 0.01 b, and
		// a noise in the start position of paths past a tilted background
		// that moved the impulse by ~1e-11 with R). With U = U₀ − δχ dφ,
		// V = V₀ − δΩ dφ,
		//
		//	h = δk_UU U₀U₀ + 2(Δ/Σ) δχ dφ⊙U₀ − (Δ/Σ) δχ² dφdφ
		//	    + δk_VV V₀V₀ − 2(sin²θ/Σ) δΩ dφ⊙V₀ + (sin²θ/Σ) δΩ² dφdφ
		//	    + δk_r dr² + δk_c d(cos θ)²,
		//	δk_UU = (Δ₀δΣ − Σ₀δΔ)/(ΣΣ₀),  δk_VV = −sin²θ δΣ/(ΣΣ₀),
		//	δk_r = (Δ₀δΣ − Σ₀δΔ)/(ΔΔ₀),   δk_c = δΣ/sin²θ.
		var del, sig0, isig0, idel0, dSig, dDel, dChi, nUU tay
		t.scale(a, &c)
		t.addConst(&t, N)
		sig.mul(&t, &t)
		sig.add(&sig, &r2)
		del.addScaled(&r2, -2*k.M, &r)
		del.addConst(&del, a*a-N*N+k.chargeSq())
		isig.inv(&sig)
		t.mul(&c, &c)
		sig0.addScaled(&r2, a*a, &t)
		isig0.inv(&sig0)
		idel0.inv(&ra2)
		dSig.scale(2*a*N, &c)
		dSig.addConst(&dSig, N*N)
		dDel.scale(-2*k.M, &r)
		dDel.addConst(&dDel, -N*N+k.chargeSq())
		dChi.scale(-2*N, &c)
		dChi.addConst(&dChi, -2*N*C)
		dOm := N*N - 2*a*N*C
		chi.scale(a, &s2) // χ₀ in H below
		om = ra2          // Ω₀
		chiA.add(&chi, &dChi)
		// Δ₀δΣ − Σ₀δΔ, shared by δk_UU and δk_r.
		nUU.mul(&ra2, &dSig)
		t.mul(&sig0, &dDel)
		nUU.sub(&nUU, &t)
		kUU.mul(&nUU, &isig)
		kUU.mul(&kUU, &isig0)
		kphiU.mul(&del, &isig)
		kphiU.mul(&kphiU, &dChi)
		kVV.mul(&s2, &dSig)
		kVV.mul(&kVV, &isig)
		kVV.mul(&kVV, &isig0)
		kVV.scale(-1, &kVV)
		kphiV.mul(&s2, &isig)
		kphiV.scale(-dOm, &kphiV)
		kr.div(&nUU, &del)
		kr.mul(&kr, &idel0)
		kc.div(&dSig, &s2)
		// The δχ² and δΩ² terms of H_φφ: −k_φU δχ − k_φV δΩ.
		hpp2.mul(&kphiU, &dChi)
		hpp2.scale(-1, &hpp2)
		hpp2.addScaled(&hpp2, -dOm, &kphiV)
		hasPhi = true
	} else {
		// Flat values Σ₀ = r² + a²c², Δ₀ = Ω₀ = r² + a², χ₀ = a sin²θ and
		// the first-order variations δΔ = −2Mr, δΣ = 2aNc,
		// δχ = −2N(c + C), δΩ = −2aNC (see EvalLinear).
		var idel, dSig, dDel, dChi tay
		t.mul(&c, &c)
		sig.addScaled(&r2, a*a, &t)
		isig.inv(&sig)
		idel.inv(&ra2)
		om = ra2
		chi.scale(a, &s2)
		dDel.scale(-2*k.M, &r)
		dSig.scale(2*a*N, &c)
		dChi.scale(-2*N, &c)
		dChi.addConst(&dChi, -2*N*C)
		dOm := -2 * a * N * C
		// k_UU = (−δΔ + Δ₀δΣ/Σ₀)/Σ₀.
		kUU.mul(&ra2, &dSig)
		kUU.mul(&kUU, &isig)
		kUU.sub(&kUU, &dDel)
		kUU.mul(&kUU, &isig)
		// k_φU = (Δ₀/Σ₀) δχ.
		kphiU.mul(&ra2, &isig)
		kphiU.mul(&kphiU, &dChi)
		// k_VV = −sin²θ δΣ/Σ₀².
		kVV.mul(&s2, &dSig)
		kVV.mul(&kVV, &isig)
		kVV.mul(&kVV, &isig)
		kVV.scale(-1, &kVV)
		// k_φV = −(sin²θ/Σ₀) δΩ.
		kphiV.mul(&s2, &isig)
		kphiV.scale(-dOm, &kphiV)
		// k_r = (δΣ − Σ₀δΔ/Δ₀)/Δ₀.
		kr.mul(&sig, &dDel)
		kr.mul(&kr, &idel)
		kr.sub(&dSig, &kr)
		kr.mul(&kr, &idel)
		kc.div(&dSig, &s2)
		hasPhi = true
		chiA = chi
	}
	// A = −([Q r − P(N + a c)]/Σ)(dt − χ dφ) − P(c + C) dφ, with the flat
	// Σ₀ and χ₀ and N = 0 in A in linear mode (A is already of first
	// order in Q and P).
	if k.Q == 0 && k.P == 0 {
		for m := range A {
			A[m].setConst(K, 0)
		}
	} else {
		t.scale(-k.Q, &r)
		if k.P != 0 {
			NA := N
			if linear {
				NA = 0
			}
			u.scale(a, &c)
			u.addConst(&u, NA)
			t.addScaled(&t, k.P, &u)
		}
		A[0].mul(&t, &isig)
		t.mul(&A[0], &chiA)
		t.scale(-1, &t) // A_φ = −A_t χ − P(c + C)
		if k.P != 0 {
			u.addConst(&c, C)
			t.addScaled(&t, -k.P, &u)
		}
		t.mul(&t, &irho2) // A_φ/ρ²
		A[1].mul(&t, Y)
		A[1].scale(-1, &A[1])
		A[2].mul(&t, X)
		A[3].setConst(K, 0)
	}
	// H_tt, H_tφ, H_φφ.
	var Htt, Htp, Hpp tay
	Htt.addScaled(&kUU, a*a, &kVV)
	Htp.mul(&chi, &kUU)
	Htp.scale(-1, &Htp)
	t.mul(&om, &kVV)
	Htp.addScaled(&Htp, -a, &t)
	Hpp.mul(&chi, &chi)
	Hpp.mul(&Hpp, &kUU)
	t.mul(&om, &om)
	t.mul(&t, &kVV)
	Hpp.add(&Hpp, &t)
	if hasPhi {
		Htp.add(&Htp, &kphiU)
		Htp.addScaled(&Htp, a, &kphiV)
		t.mul(&chi, &kphiU)
		u.mul(&om, &kphiV)
		t.add(&t, &u)
		Hpp.addScaled(&Hpp, -2, &t)
		if !linear {
			Hpp.add(&Hpp, &hpp2)
		}
	}
	// Components. dφ_i = (−y, x)/ρ², so dφ_i dφ_j = (ρ²δ_ij − x_i x_j)/ρ⁴
	// for i, j ≤ 2.
	g[0][0] = Htt
	t.mul(&Htp, &irho2)
	g[0][1].mul(&t, Y)
	g[0][1].scale(-1, &g[0][1])
	g[0][2].mul(&t, X)
	g[0][3].setConst(K, 0)
	var hp, kP, cq, xy, w tay
	hp.mul(&Hpp, &irho2)
	hp.mul(&hp, &irho2) // H_φφ/ρ⁴
	// dr_i dr_j and dc_i dc_j for i, j ≤ 2 are ∝ x_i x_j with
	// coefficient k_r P² + k_c (cP/r)².
	cq.mul(&c, &P)
	cq.mul(&cq, &ir) // c P/r, dc_i = −cq x_i for i ≤ 2
	kP.mul(&kr, &P)
	kP.mul(&kP, &P)
	t.mul(&cq, &cq)
	t.mul(&t, &kc)
	kP.add(&kP, &t)
	// xx, xy, yy entries.
	u.sub(&kP, &hp)
	t.mul(X, X)
	g[1][1].mul(&u, &t)
	w.mul(Y, Y)
	g[2][2].mul(&u, &w)
	xy.mul(X, Y)
	g[1][2].mul(&u, &xy)
	t.mul(&hp, &rho2)
	g[1][1].add(&g[1][1], &t)
	g[2][2].add(&g[2][2], &t)
	// dc_3 = (1 − c P_z z)/r; dr_3 = P_z z.
	var dr3, dc3 tay
	dr3.mul(&Pz, Z)
	dc3.mul(&c, &dr3)
	dc3.scale(-1, &dc3)
	dc3.addConst(&dc3, 1)
	dc3.mul(&dc3, &ir)
	// g_i3 = x_i (k_r P dr_3 − k_c cq dc_3).
	t.mul(&kr, &P)
	t.mul(&t, &dr3)
	u.mul(&kc, &cq)
	u.mul(&u, &dc3)
	t.sub(&t, &u)
	g[1][3].mul(&t, X)
	g[2][3].mul(&t, Y)
	// g_33 = k_r dr_3² + k_c dc_3².
	t.mul(&dr3, &dr3)
	t.mul(&t, &kr)
	u.mul(&dc3, &dc3)
	u.mul(&u, &kc)
	g[3][3].add(&t, &u)
	if !linear {
		g[0][0].addConst(&g[0][0], -1)
		for i := 1; i < 4; i++ {
			g[i][i].addConst(&g[i][i], 1)
		}
	}
	symmetrizeTay(g)
}

var (
	_ staticMetric = KerrNewman{}
	_ staticMetric = KerrNewmanNUT{}
)
