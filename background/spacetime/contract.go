package spacetime

// Contracted mode of Evaluator (SetContracted): for a body that needs the
// Christoffel symbols and the Riemann tensor only in the contractions
// Γ^μ_αβ u^α v^β and ½ R_μνρσ S^{ρσ}, the uncharged Kerr member at order 2
// leaves Point.Gamma and Point.RiemannLow unset and keeps the data they
// are formed from (the Kerr–Schild data and the type D form of
// kerrcurv.go), from which the contractions follow at a fraction of the
// cost:
//
//	Γ^μ_αβ u^α v^β = ½ η^μμ [l_μ (Sym(u, v) − f((l·v)(w·u) + (l·u)(w·v)))
//	                 + (l·v)(u·Anti)_μ + (l·u)(v·Anti)_μ]
//
// (kerrSchildGamma contracted), and for a bivector S^{ρσ}
//
//	Σ_B R_AB S^B = Re(k 𝒰_A (𝒰·S)) + Re(k zz/3) S_A + Im(k zz/3) (εS)_A,
//
// 𝒰·S = Σ_B 𝒰_B S^B, S_A = S_μν lowered with g, (εS)_μν = ε_μνρσ S^{ρσ}/2
// (weylRicciLow contracted; G_AB S^B = S_μν). Tested against the full
// tensors (TestContractedPoint).

// contracted is the data of a Point in contracted mode.
type contracted struct {
	on bool
	// zero: A, F and DF were set to zero by the contracted path (wasZero:
	// by the previous Eval), so that they need not be cleared again.
	zero, wasZero bool
	ks            KerrSchildPoint
	// Bf[i][n] = ½ ∂_i f l_n + f ∂_i l_n (i spatial; the row i = 0 is
	// zero).
	Bf [4][4]float64
	U  [6]complex128
	kw complex128
	cg float64 // Re(k zz/3)
	ce float64 // Im(k zz/3)
}

// Contracted reports whether p was filled in contracted mode (Gamma and
// RiemannLow unset; use ChristoffelUV, RiemannS and FillGamma).
func (p *Point) Contracted() bool { return p.con.on }

// ChristoffelUV returns Γ^μ_αβ u^α v^β.
func (p *Point) ChristoffelUV(u, v *[4]float64) [4]float64 {
	g, _ := p.ChristoffelUV2(u, v, v)
	return g
}

// ChristoffelUV2 returns Γ^μ_αβ u^α v^β and Γ^μ_αβ u^α w^β, sharing the
// work that depends on u only.
func (p *Point) ChristoffelUV2(u, v, w *[4]float64) (gv, gw [4]float64) {
	if !p.con.on {
		for m := 0; m < 4; m++ {
			G := &p.Gamma[m]
			var sv, sw float64
			for a := 0; a < 4; a++ {
				sv += u[a] * (G[a][0]*v[0] + G[a][1]*v[1] + G[a][2]*v[2] + G[a][3]*v[3])
				sw += u[a] * (G[a][0]*w[0] + G[a][1]*w[1] + G[a][2]*w[2] + G[a][3]*w[3])
			}
			gv[m], gw[m] = sv, sw
		}
		return gv, gw
	}
	c := &p.con
	l := &c.ks.L
	f := c.ks.F
	B := &c.Bf
	// With B_0n = 0: Bs = B + Bᵀ, An_mn = B_mn − B_nm on the bivectors
	// m < n and wl = An l^ (l^ = η l), which depend on the event only.
	bs01, bs02, bs03 := B[1][0], B[2][0], B[3][0]
	bs11, bs22, bs33 := 2*B[1][1], 2*B[2][2], 2*B[3][3]
	bs12, bs13, bs23 := B[1][2]+B[2][1], B[1][3]+B[3][1], B[2][3]+B[3][2]
	a01, a02, a03 := -B[1][0], -B[2][0], -B[3][0]
	a12, a13, a23 := B[1][2]-B[2][1], B[1][3]-B[3][1], B[2][3]-B[3][2]
	lu0, lu1, lu2, lu3 := -l[0], l[1], l[2], l[3]
	wl := [4]float64{
		a01*lu1 + a02*lu2 + a03*lu3,
		-a01*lu0 + a12*lu2 + a13*lu3,
		-a02*lu0 - a12*lu1 + a23*lu3,
		-a03*lu0 - a13*lu1 - a23*lu2,
	}
	// Written out (the products with the antisymmetric An in a function
	// or closure are not inlined). With (x·Anti)_m = Σ_a x^a (B_am −
	// B_ma) = −(An x)_m and Sym(u, v) = u·(B + Bᵀ)·v:
	u0, u1, u2, u3 := u[0], u[1], u[2], u[3]
	su0 := bs01*u1 + bs02*u2 + bs03*u3 // (B + Bᵀ) u
	su1 := bs01*u0 + bs11*u1 + bs12*u2 + bs13*u3
	su2 := bs02*u0 + bs12*u1 + bs22*u2 + bs23*u3
	su3 := bs03*u0 + bs13*u1 + bs23*u2 + bs33*u3
	ua0 := a01*u1 + a02*u2 + a03*u3 // An u
	ua1 := -a01*u0 + a12*u2 + a13*u3
	ua2 := -a02*u0 - a12*u1 + a23*u3
	ua3 := -a03*u0 - a13*u1 - a23*u2
	lU := l[0]*u0 + l[1]*u1 + l[2]*u2 + l[3]*u3
	wu := wl[0]*u0 + wl[1]*u1 + wl[2]*u2 + wl[3]*u3
	v0, v1, v2, v3 := v[0], v[1], v[2], v[3]
	va0 := a01*v1 + a02*v2 + a03*v3
	va1 := -a01*v0 + a12*v2 + a13*v3
	va2 := -a02*v0 - a12*v1 + a23*v3
	va3 := -a03*v0 - a13*v1 - a23*v2
	lV := l[0]*v0 + l[1]*v1 + l[2]*v2 + l[3]*v3
	sv := (su0*v0 + su1*v1 + su2*v2 + su3*v3) - f*(lV*wu+lU*(wl[0]*v0+wl[1]*v1+wl[2]*v2+wl[3]*v3))
	w0, w1, w2, w3 := w[0], w[1], w[2], w[3]
	wa0 := a01*w1 + a02*w2 + a03*w3
	wa1 := -a01*w0 + a12*w2 + a13*w3
	wa2 := -a02*w0 - a12*w1 + a23*w3
	wa3 := -a03*w0 - a13*w1 - a23*w2
	lW := l[0]*w0 + l[1]*w1 + l[2]*w2 + l[3]*w3
	sw := (su0*w0 + su1*w1 + su2*w2 + su3*w3) - f*(lW*wu+lU*(wl[0]*w0+wl[1]*w1+wl[2]*w2+wl[3]*w3))
	gv = [4]float64{
		-0.5 * (l[0]*sv - lV*ua0 - lU*va0),
		0.5 * (l[1]*sv - lV*ua1 - lU*va1),
		0.5 * (l[2]*sv - lV*ua2 - lU*va2),
		0.5 * (l[3]*sv - lV*ua3 - lU*va3),
	}
	gw = [4]float64{
		-0.5 * (l[0]*sw - lW*ua0 - lU*wa0),
		0.5 * (l[1]*sw - lW*ua1 - lU*wa1),
		0.5 * (l[2]*sw - lW*ua2 - lU*wa2),
		0.5 * (l[3]*sw - lW*ua3 - lU*wa3),
	}
	return gv, gw
}

// RiemannS returns W_A = Σ_B R_AB S^B on the bivectors for the
// antisymmetric S^{μν} (W_μν = ½ R_μνρσ S^{ρσ}).
func (p *Point) RiemannS(S *[4][4]float64) [6]float64 {
	var sb [6]float64
	for B, pr := range bivectors {
		sb[B] = S[pr[0]][pr[1]]
	}
	return p.RiemannBivector(&sb)
}

// RiemannBivector is RiemannS for S^{μν} given on the bivectors μ < ν
// (sb[B] = S^{Bivectors[B]}).
func (p *Point) RiemannBivector(sb *[6]float64) (W [6]float64) {
	if !p.con.on {
		for A := 0; A < 6; A++ {
			R := &p.RiemannLow[A]
			W[A] = R[0]*sb[0] + R[1]*sb[1] + R[2]*sb[2] + R[3]*sb[3] + R[4]*sb[4] + R[5]*sb[5]
		}
		return W
	}
	c := &p.con
	var usr, usi float64 // 𝒰·S
	for B := 0; B < 6; B++ {
		usr += real(c.U[B]) * sb[B]
		usi += imag(c.U[B]) * sb[B]
	}
	kr, ki := real(c.kw), imag(c.kw)
	kur, kui := kr*usr-ki*usi, kr*usi+ki*usr // k 𝒰·S
	// S_μν = (ηSη)_μν + f (t_μ l_ν − l_μ t_ν), t = η S l (l null, S
	// antisymmetric).
	l := &c.ks.L
	f := c.ks.F
	s01, s02, s03, s12, s13, s23 := sb[0], sb[1], sb[2], sb[3], sb[4], sb[5]
	t0 := -(s01*l[1] + s02*l[2] + s03*l[3])
	t1 := -s01*l[0] + s12*l[2] + s13*l[3]
	t2 := -s02*l[0] - s12*l[1] + s23*l[3]
	t3 := -s03*l[0] - s13*l[1] - s23*l[2]
	sl := [6]float64{
		-s01 + f*(t0*l[1]-l[0]*t1), -s02 + f*(t0*l[2]-l[0]*t2), -s03 + f*(t0*l[3]-l[0]*t3),
		s12 + f*(t1*l[2]-l[1]*t2), s13 + f*(t1*l[3]-l[1]*t3), s23 + f*(t2*l[3]-l[2]*t3),
	}
	for A := 0; A < 6; A++ {
		W[A] = kur*real(c.U[A]) - kui*imag(c.U[A]) + c.cg*sl[A]
	}
	// (εS)_A = Σ_B [AB] S^B (√−g = 1).
	ce := c.ce
	W[0] += ce * s23
	W[1] -= ce * s13
	W[2] += ce * s12
	W[3] += ce * s03
	W[4] -= ce * s02
	W[5] += ce * s01
	return W
}

// KerrSchild returns f and l_μ of g = η + f l l for a Point in contracted
// mode (ok false otherwise).
func (p *Point) KerrSchild() (f float64, l [4]float64, ok bool) {
	return p.con.ks.F, p.con.ks.L, p.con.on
}

// FillGamma fills p.Gamma of a Point in contracted mode (for the rarer
// uses that need all components); it does nothing otherwise.
func (p *Point) FillGamma() {
	if p.con.on {
		kerrSchildGamma(p.con.ks.F, &p.con.ks.DF, &p.con.ks.L, &p.con.ks.DL, &p.Gamma)
	}
}

// SetContracted selects, for on true, the contracted mode for the metrics
// that have one (the uncharged Kerr–Newman member at order 2 with
// SetLowered(true)); Point.Contracted reports whether it was used.
func (e *Evaluator) SetContracted(on bool) { e.contracted = on }

// kerrContracted fills p in contracted mode: G, GInv, A = F = DF = 0 and
// the contraction data.
func (k KerrNewman) kerrContracted(x [4]float64, p *Point) {
	c := &p.con
	c.on = true
	r := k.kerrSchild(x, &c.ks)
	f, l := c.ks.F, &c.ks.L
	for m := 0; m < 4; m++ {
		lm := l[m]
		for n := m; n < 4; n++ {
			v := f * lm * l[n]
			vi := -eta[m] * eta[n] * v
			if m == n {
				v += eta[m]
				vi += eta[m]
			}
			p.G[m][n], p.G[n][m] = v, v
			p.GInv[m][n], p.GInv[n][m] = vi, vi
		}
	}
	for i := 1; i < 4; i++ {
		dfi, dl := 0.5*c.ks.DF[i], &c.ks.DL[i]
		c.Bf[i] = [4]float64{dfi*l[0] + f*dl[0], dfi*l[1] + f*dl[1], dfi*l[2] + f*dl[2], dfi*l[3] + f*dl[3]}
	}
	var Z [3]complex128
	rho, ir := weylField(x, r, k.A, &Z, &c.U)
	c.kw = -3 * complex(k.M, 0) * rho
	ir2 := ir * ir
	c0 := c.kw * ir2 * ir2
	c0 = complex(real(c0)/3, imag(c0)/3) // the complex division by 3 is a call
	c.cg, c.ce = real(c0), imag(c0)
	if !c.wasZero {
		p.A, p.F, p.DF = [4]float64{}, [4][4]float64{}, [4][4][4]float64{}
	}
	c.zero = true
}
