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
	// Bf[i][n] = ½ ∂_i f l_n + f ∂_i l_n (i spatial).
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
	B := &c.Bf
	f := c.ks.F
	lu := [4]float64{-l[0], l[1], l[2], l[3]}
	// (B x)_a = Σ_b B_ab x^b, (x B)_n = Σ_a x^a B_an (B_0n = 0).
	bx := func(x *[4]float64) (Bx, xB [4]float64) {
		for a := 1; a < 4; a++ {
			Bx[a] = B[a][0]*x[0] + B[a][1]*x[1] + B[a][2]*x[2] + B[a][3]*x[3]
		}
		for n := 0; n < 4; n++ {
			xB[n] = x[1]*B[1][n] + x[2]*B[2][n] + x[3]*B[3][n]
		}
		return
	}
	dot := func(x, y *[4]float64) float64 { return x[0]*y[0] + x[1]*y[1] + x[2]*y[2] + x[3]*y[3] }
	Bu, uB := bx(u)
	Bl, lB := bx(&lu)
	var wl [4]float64 // w_a = Anti_aν l^ν = (B l^)_a − (l^ B)_a
	for a := 0; a < 4; a++ {
		wl[a] = Bl[a] - lB[a]
	}
	lU, wu := dot(l, u), dot(u, &wl)
	one := func(v *[4]float64) (out [4]float64) {
		Bv, vB := bx(v)
		lV := dot(l, v)
		s := dot(u, &Bv) + dot(v, &Bu) - f*(lV*wu+lU*dot(v, &wl))
		for m := 0; m < 4; m++ {
			// (x·Anti)_m = Σ_a x^a (B_am − B_ma) = (xB)_m − (Bx)_m.
			g := 0.5 * (l[m]*s + lV*(uB[m]-Bu[m]) + lU*(vB[m]-Bv[m]))
			if m == 0 {
				g = -g
			}
			out[m] = g
		}
		return out
	}
	return one(v), one(w)
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
		for n := 0; n < 4; n++ {
			c.Bf[i][n] = 0.5*c.ks.DF[i]*l[n] + f*c.ks.DL[i][n]
		}
	}
	var w ksWeyl
	w.set(x, r, k.A)
	c.U = w.U
	c.kw = -3 * complex(k.M, 0) * w.rho
	ir2 := w.ir * w.ir
	c0 := c.kw * ir2 * ir2 / 3
	c.cg, c.ce = real(c0), imag(c0)
	if !c.wasZero {
		p.A, p.F, p.DF = [4]float64{}, [4][4]float64{}, [4][4][4]float64{}
	}
	c.zero = true
}
