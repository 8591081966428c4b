package spacetime

// Closed-form curvature of the Kerr–Newman family in Kerr–Schild
// coordinates, for the order-2 path of Evaluator (pole–dipole bodies):
// no second derivatives of the metric are formed.
//
// Weyl tensor. Kerr–Newman is of Petrov type D, and its Maxwell field is
// aligned with both principal null directions (Kinnersley 1969, J. Math.
// Phys. 10, 1195; Chandrasekhar 1983, The Mathematical Theory of Black
// Holes, §§ 63 and 111; Stephani et al. 2003, Exact Solutions, § 21.1;
// from memory). The self-dual Weyl tensor of a type D field is fixed by
// its one non-zero Weyl scalar Ψ₂ and the self-dual bivector 𝒰 of the two
// principal null directions: with 𝒰·𝒰 = 𝒰_μν 𝒰^μν, the traceless
// self-dual combination
//
//	D_μνρσ = 𝒰_μν 𝒰_ρσ − (𝒰·𝒰/12)(g_μρ g_νσ − g_μσ g_νρ − i ε_μνρσ),
//	C_μνρσ = Re(k D_μνρσ),
//
// where k is the scalar Ψ₂-multiple that makes C the Weyl tensor. Here 𝒰
// is the self-dual part F − i*F (so that *𝒰 = i𝒰) of the Kerr–Newman
// field of unit charge, which in Kerr–Schild coordinates does not depend
// on M or Q (A = s l with s ∝ Q, l independent of M): it is the flat-space
// field of the complex-shifted Coulomb charge (Newman & Janis 1965), with
// electric and magnetic parts E + iB = Z,
//
//	Z = X/ϱ³,   X = (x, y, z − i a),   ϱ = √(X·X) = r − i a z/r,
//	𝒰_i0 = Z_i,   𝒰_ij = −i ε_ijk Z_k,   𝒰·𝒰 = −4 Z·Z = −4/ϱ⁴
//
// (ϱ² = X·X is the Kerr–Schild quartic for r). The Hodge dual of 𝒰 is the
// same for g = η + f l l as for η: l is a principal null direction of 𝒰,
// so raising with g^μν = η^μν − f l^μ l^ν changes nothing, and √−g = 1
// (ours). With ϱ = r − i a cos θ, Ψ₂ = −(M − Q²/ϱ̄)/ϱ³ (Kinnersley tetrad;
// Chandrasekhar 1983, § 111, from memory), and the Schwarzschild limit
// C_0i0j = (M/r³)(δ_ij − 3 n_i n_j) (Misner, Thorne & Wheeler 1973,
// eq. 31.4b, from memory) fixes the factor:
//
//	k = −3 (M − Q²/ϱ̄) ϱ.
//
// Ricci part. The Einstein–Maxwell equations R_μν = 2(F_μα F_ν^α −
// ¼ g_μν F_αβ F^αβ) (traceless, R = 0; Gaussian units, G = 1; see doc.go)
// complete the Riemann tensor,
//
//	R_μνρσ = C_μνρσ + ½(g_μρ R_νσ − g_μσ R_νρ − g_νρ R_μσ + g_νσ R_μρ).
//
// The field of charge Q is F_μν = Re(Q 𝒰_μν) with the gradient
// ∂_j Z_i = (δ_ij − 3 X_i X_j/ϱ²)/ϱ³. The Christoffel symbols come from
// first derivatives only (kerrSchildGamma). All of it agrees with the
// Taylor and jet arithmetic to rounding (TestKerrSchildCurvatureClosedForm).

// ksWeyl holds the self-dual field of unit charge at an event.
type ksWeyl struct {
	rho complex128    // ϱ = r − i a z/r
	ir  complex128    // 1/ϱ
	Z   [3]complex128 // E + iB of the unit charge
	U   [6]complex128 // 𝒰 on the bivectors (01, 02, 03, 12, 13, 23)
	// gradient: ∂_λ𝒰 and ∂_λϱ as [λ] (λ = 0 zero)
	dU   [4][6]complex128
	dRho [4]complex128
}

func (w *ksWeyl) set(x [4]float64, r, a float64) {
	w.rho, w.ir = weylField(x, r, a, &w.Z, &w.U)
}

// weylField returns ϱ and 1/ϱ and writes the field Z and 𝒰 of ksWeyl
// (set), without the gradient storage of ksWeyl (the contracted path
// would clear it on every evaluation).
func weylField(x [4]float64, r, a float64, Z *[3]complex128, U *[6]complex128) (rho, ir complex128) {
	rho = complex(r, -a*x[3]/r)
	ir = cinv(rho)
	ir3 := ir * ir * ir
	X := [3]complex128{complex(x[1], 0), complex(x[2], 0), complex(x[3], -a)}
	for i := 0; i < 3; i++ {
		Z[i] = X[i] * ir3
	}
	// 𝒰_0i = −Z_i; 𝒰_12 = −i Z_3, 𝒰_13 = +i Z_2, 𝒰_23 = −i Z_1.
	*U = [6]complex128{-Z[0], -Z[1], -Z[2],
		complex(imag(Z[2]), -real(Z[2])), complex(-imag(Z[1]), real(Z[1])), complex(imag(Z[0]), -real(Z[0]))}
	return rho, ir
}

// cinv returns 1/z (z finite and non-zero; without the scaling of the
// general complex division).
func cinv(z complex128) complex128 {
	re, im := real(z), imag(z)
	n := 1 / (re*re + im*im)
	return complex(re*n, -im*n)
}

// bivectorLevi is [μνρσ] on the bivector pairs (μν) = Bivectors[A],
// (ρσ) = Bivectors[B].
var bivectorLevi = [6][6]float64{
	{0, 0, 0, 0, 0, 1},
	{0, 0, 0, 0, -1, 0},
	{0, 0, 0, 1, 0, 0},
	{0, 0, 1, 0, 0, 0},
	{0, -1, 0, 0, 0, 0},
	{1, 0, 0, 0, 0, 0},
}

// kerrSchildCurvature fills p at the event x for the Kerr–Newman metric k
// at order 2, or 3 with order3, by the closed forms of the file comment;
// raise selects the raised tensors too, fieldGradient the field gradient
// DF (zero otherwise).
func (k KerrNewman) kerrSchildCurvature(x [4]float64, p *Point, raise, order3, fieldGradient bool) {
	var ks KerrSchildPoint
	r := k.kerrSchild(x, &ks)
	f, l := ks.F, &ks.L
	// Metric and its inverse.
	var lu [4]float64
	for m := 0; m < 4; m++ {
		lu[m] = eta[m] * l[m]
	}
	for m := 0; m < 4; m++ {
		for n := m; n < 4; n++ {
			v, vi := f*l[m]*l[n], -f*lu[m]*lu[n]
			if m == n {
				v += eta[m]
				vi += eta[m]
			}
			p.G[m][n], p.G[n][m] = v, v
			p.GInv[m][n], p.GInv[n][m] = vi, vi
		}
	}
	kerrSchildGamma(f, &ks.DF, l, &ks.DL, &p.Gamma)

	var w ksWeyl
	w.set(x, r, k.A)
	// Potential and field of charge Q.
	q := k.Q
	if q == 0 {
		p.A, p.F = [4]float64{}, [4][4]float64{}
	} else {
		for m := 0; m < 4; m++ {
			p.A[m] = ks.S * l[m]
		}
		p.F = [4][4]float64{}
		for B, pr := range bivectors {
			v := q * real(w.U[B])
			p.F[pr[0]][pr[1]], p.F[pr[1]][pr[0]] = v, -v
		}
	}
	// ∂_j F_μν = Re(Q ∂_j 𝒰_μν).
	if q != 0 && fieldGradient || order3 {
		w.gradient(x, k.A)
	}
	if q == 0 || !fieldGradient {
		p.DF = [4][4][4]float64{}
	} else {
		for l := 0; l < 4; l++ {
			D := &p.DF[l]
			for B, pr := range bivectors {
				v := q * real(w.dU[l][B])
				D[pr[0]][pr[1]], D[pr[1]][pr[0]] = v, -v
			}
			D[0][0], D[1][1], D[2][2], D[3][3] = 0, 0, 0, 0
		}
	}

	me := complex(k.M, 0) // M − Q²/ϱ̄
	if q != 0 {
		me -= complex(q*q, 0) * complex(real(w.ir), -imag(w.ir))
	}
	kw := -3 * me * w.rho
	ir2 := w.ir * w.ir
	weylRicciLow(&p.RiemannLow, &w.U, kw, ir2*ir2, 1, &p.G, &p.GInv, &p.F, q != 0)
	if raise {
		raiseRiemann(&p.Riemann, &p.RiemannLow, &p.GInv, false)
	}
	if order3 {
		k.kerrSchildDRiemann(p, &w, me, kw, raise)
	}
}

// gradient fills dU = ∂_λ 𝒰 on the bivectors and dRho = ∂_λ ϱ, from
// ∂_j Z_i = (δ_ij − 3 X_i X_j/ϱ²)/ϱ³ and ∂_j ϱ = X_j/ϱ (time
// derivatives zero).
func (w *ksWeyl) gradient(x [4]float64, a float64) {
	ir2 := w.ir * w.ir
	ir3 := ir2 * w.ir
	X := [3]complex128{complex(x[1], 0), complex(x[2], 0), complex(x[3], -a)}
	w.dU[0], w.dRho[0] = [6]complex128{}, 0
	for j := 0; j < 3; j++ {
		var dZ [3]complex128
		for i := 0; i < 3; i++ {
			dZ[i] = -3 * X[i] * X[j] * ir2
		}
		dZ[j]++
		for i := 0; i < 3; i++ {
			dZ[i] *= ir3
		}
		w.dU[j+1] = [6]complex128{-dZ[0], -dZ[1], -dZ[2],
			complex(imag(dZ[2]), -real(dZ[2])), complex(-imag(dZ[1]), real(dZ[1])), complex(imag(dZ[0]), -real(dZ[0]))}
		w.dRho[j+1] = X[j] * w.ir
	}
}

// kerrSchildDRiemann fills p.DRiemann (order 3) from the closed form of
// the file comment, differentiated covariantly: ∇g = ∇ε = 0, so with
// ∇_λ𝒰_μν = ∂_λ𝒰_μν − Γ^κ_λμ 𝒰_κν − Γ^κ_λν 𝒰_μκ and zz = 1/ϱ⁴,
//
//	∇_λC_μνρσ = Re[∂_λk 𝒰_μν𝒰_ρσ + k(∇_λ𝒰_μν 𝒰_ρσ + 𝒰_μν ∇_λ𝒰_ρσ)
//	            + ⅓ ∂_λ(k zz)(g_μρ g_νσ − g_μσ g_νρ − i ε_μνρσ)],
//
// ∂_λk = −3(∂_λme ϱ + me ∂_λϱ), me = M − Q²/ϱ̄, and for Q ≠ 0 the
// covariant derivative of the Ricci part with ∇_λF = Re(Q ∇_λ𝒰):
// ∇_λR_μν = 2(∇_λF_μα F_ν^α + F_μα ∇_λF_ν^α − ½ g_μν F^αβ ∇_λF_αβ).
// The lowered result is raised with g^μν when raise is set.
func (k KerrNewman) kerrSchildDRiemann(p *Point, w *ksWeyl, me, kw complex128, raise bool) {
	q := k.Q
	G := &p.Gamma
	g, gi := &p.G, &p.GInv
	// 𝒰 as a 4 × 4 matrix.
	var Um [4][4]complex128
	for B, pr := range bivectors {
		Um[pr[0]][pr[1]], Um[pr[1]][pr[0]] = w.U[B], -w.U[B]
	}
	zz := w.ir * w.ir * w.ir * w.ir
	var kU [6]complex128
	for A := 0; A < 6; A++ {
		kU[A] = kw * w.U[A]
	}
	var Fm [4][4]float64 // F_μ^α
	if q != 0 {
		for m := 0; m < 4; m++ {
			for a := 0; a < 4; a++ {
				Fm[m][a] = p.F[m][0]*gi[0][a] + p.F[m][1]*gi[1][a] + p.F[m][2]*gi[2][a] + p.F[m][3]*gi[3][a]
			}
		}
	}
	for l := 0; l < 4; l++ {
		// ∇_λ𝒰 on the bivectors.
		var dU [6]complex128
		for A, pr := range bivectors {
			m, n := pr[0], pr[1]
			v := w.dU[l][A]
			for c := 0; c < 4; c++ {
				v -= complex(G[c][l][m], 0)*Um[c][n] + complex(G[c][l][n], 0)*Um[m][c]
			}
			dU[A] = v
		}
		dme := complex(0, 0)
		if q != 0 {
			rb := complex(real(w.ir), -imag(w.ir)) // 1/ϱ̄
			dme = complex(q*q, 0) * rb * rb * complex(real(w.dRho[l]), -imag(w.dRho[l]))
		}
		dk := -3 * (dme*w.rho + me*w.dRho[l])
		dzz := -4 * zz * w.ir * w.dRho[l]
		c1 := (dk*zz + kw*dzz) / 3
		cg, ce := real(c1), imag(c1)
		var V [6]complex128
		for A := 0; A < 6; A++ {
			V[A] = dk*w.U[A] + kw*dU[A]
		}
		var DL [6][6]float64
		for A := 0; A < 6; A++ {
			mu, nu := bivectors[A][0], bivectors[A][1]
			for B := A; B < 6; B++ {
				rh, sg := bivectors[B][0], bivectors[B][1]
				GAB := g[mu][rh]*g[nu][sg] - g[mu][sg]*g[nu][rh]
				DL[A][B] = real(V[A])*real(w.U[B]) - imag(V[A])*imag(w.U[B]) +
					real(kU[A])*real(dU[B]) - imag(kU[A])*imag(dU[B]) + cg*GAB + ce*bivectorLevi[A][B]
			}
		}
		if q != 0 {
			var dF [4][4]float64 // ∇_λF_μν
			for B, pr := range bivectors {
				v := q * real(dU[B])
				dF[pr[0]][pr[1]], dF[pr[1]][pr[0]] = v, -v
			}
			var dFm [4][4]float64 // ∇_λF_μ^α
			FdF := 0.0            // F^αβ ∇_λF_αβ = F_α^β ∇_λF^α_β... = Σ Fm[α][β] dFm[β][α] with a sign
			for m := 0; m < 4; m++ {
				for a := 0; a < 4; a++ {
					dFm[m][a] = dF[m][0]*gi[0][a] + dF[m][1]*gi[1][a] + dF[m][2]*gi[2][a] + dF[m][3]*gi[3][a]
				}
			}
			for m := 0; m < 4; m++ {
				for a := 0; a < 4; a++ {
					FdF -= Fm[m][a] * dFm[a][m]
				}
			}
			var dRic [4][4]float64
			for m := 0; m < 4; m++ {
				for n := m; n < 4; n++ {
					s := dF[m][0]*Fm[n][0] + dF[m][1]*Fm[n][1] + dF[m][2]*Fm[n][2] + dF[m][3]*Fm[n][3] +
						p.F[m][0]*dFm[n][0] + p.F[m][1]*dFm[n][1] + p.F[m][2]*dFm[n][2] + p.F[m][3]*dFm[n][3]
					v := 2*s - g[m][n]*FdF
					dRic[m][n], dRic[n][m] = v, v
				}
			}
			addRicciPart(&DL, g, &dRic)
		}
		for A := 0; A < 6; A++ {
			for B := 0; B < A; B++ {
				DL[A][B] = DL[B][A]
			}
		}
		p.DRiemannLow[l] = DL
		if raise {
			raiseRiemann(&p.DRiemann[l], &DL, gi, false)
		}
	}
}

// weylRicciLow sets RL to R_μνρσ on the bivectors from the type D form of
// the file comment: the self-dual principal bivector U (𝒰 on the
// bivectors, with 𝒰·𝒰 = −4 zz), the factor kw = k, the volume element
// sqrtg of ε_μνρσ = √−g [μνρσ], and, for charged, the Ricci part of the
// Maxwell field F.
func weylRicciLow(RL *[6][6]float64, U *[6]complex128, kw, zz complex128, sqrtg float64, g, gi, F *[4][4]float64, charged bool) {
	// C_AB = Re(k U_A U_B) + Re(k zz/3) G_AB + Im(k zz/3) ε_AB with
	// G_AB = g_μρ g_νσ − g_μσ g_νρ (−𝒰·𝒰/12 = zz/3).
	c0 := kw * zz / 3
	cg, ce := real(c0), imag(c0)*sqrtg
	var kU [6]complex128
	for A := 0; A < 6; A++ {
		kU[A] = kw * U[A]
	}
	for A := 0; A < 6; A++ {
		// (&3: the indices are < 4, which lets the compiler drop the
		// bounds checks.)
		gm, gn := &g[bivectors[A][0]&3], &g[bivectors[A][1]&3]
		kr, ki := real(kU[A]), imag(kU[A])
		row := &RL[A]
		for B := A; B < 6; B++ {
			rh, sg := bivectors[B][0]&3, bivectors[B][1]&3
			GAB := gm[rh]*gn[sg] - gm[sg]*gn[rh]
			row[B] = kr*real(U[B]) - ki*imag(U[B]) + cg*GAB + ce*bivectorLevi[A][B]
		}
	}
	if charged {
		// Ricci part from R_μν = 2(F_μα F_ν^α − ¼ g_μν F²).
		var Fm [4][4]float64 // F_μ^α
		for m := 0; m < 4; m++ {
			for a := 0; a < 4; a++ {
				Fm[m][a] = F[m][0]*gi[0][a] + F[m][1]*gi[1][a] + F[m][2]*gi[2][a] + F[m][3]*gi[3][a]
			}
		}
		F2 := 0.0 // F_μν F^μν = −F_μ^α F_α^μ
		for m := 0; m < 4; m++ {
			for a := 0; a < 4; a++ {
				F2 -= Fm[m][a] * Fm[a][m]
			}
		}
		var Ric [4][4]float64
		for m := 0; m < 4; m++ {
			for n := m; n < 4; n++ {
				// F_μα F_ν^α = Σ_α F_μα Fm[ν][α].
				s := F[m][0]*Fm[n][0] + F[m][1]*Fm[n][1] + F[m][2]*Fm[n][2] + F[m][3]*Fm[n][3]
				v := 2*s - 0.5*g[m][n]*F2
				Ric[m][n], Ric[n][m] = v, v
			}
		}
		addRicciPart(RL, g, &Ric)
	}
	for A := 0; A < 6; A++ {
		for B := 0; B < A; B++ {
			RL[A][B] = RL[B][A]
		}
	}
}

// addRicciPart adds ½(g_μρ R_νσ − g_μσ R_νρ − g_νρ R_μσ + g_νσ R_μρ) to
// the upper triangle of RL (bivector form).
func addRicciPart(RL *[6][6]float64, g, Ric *[4][4]float64) {
	for A := 0; A < 6; A++ {
		mu, nu := bivectors[A][0], bivectors[A][1]
		for B := A; B < 6; B++ {
			rh, sg := bivectors[B][0], bivectors[B][1]
			RL[A][B] += 0.5 * (g[mu][rh]*Ric[nu][sg] - g[mu][sg]*Ric[nu][rh] - g[nu][rh]*Ric[mu][sg] + g[nu][sg]*Ric[mu][rh])
		}
	}
}

// kerrSchildGamma forms the Christoffel symbols Γ^μ_αβ of g = η + f l l
// from f, ∂_μ f, l_μ and ∂_μ l_ν ([μ][ν]; time derivatives zero). With
// B_iν = ½ ∂_i f l_ν + f ∂_i l_ν, B_0ν = 0, Sym_αβ = B_αβ + B_βα and
// Anti_αν = B_αν − B_να (ours, from ∂_λ h_μν = l_μ B_λν + B_λμ l_ν):
//
//	Γ_ναβ   = ½(l_ν Sym_αβ + l_β Anti_αν + l_α Anti_βν),
//	Γ^μ_αβ  = η^μμ Γ_μαβ − ½ f l^μ (l_β w_α + l_α w_β),   w_α = Anti_αν l^ν,
//
// the second from g^μν = η^μν − f l^μ l^ν and l^ν l_ν = 0.
func kerrSchildGamma(f float64, df, lv *[4]float64, dl *[4][4]float64, G *[4][4][4]float64) {
	var Bf, anti [4][4]float64
	for i := 1; i < 4; i++ {
		for n := 0; n < 4; n++ {
			Bf[i][n] = 0.5*df[i]*lv[n] + f*dl[i][n]
		}
	}
	var wv [4]float64
	for a := 0; a < 4; a++ {
		for n := 0; n < 4; n++ {
			anti[a][n] = Bf[a][n] - Bf[n][a]
		}
		wv[a] = -anti[a][0]*lv[0] + anti[a][1]*lv[1] + anti[a][2]*lv[2] + anti[a][3]*lv[3]
	}
	hl := [4]float64{-0.5 * lv[0], 0.5 * lv[1], 0.5 * lv[2], 0.5 * lv[3]} // ½ l^μ
	for a := 0; a < 4; a++ {
		la := 0.5 * lv[a]
		Aa := &anti[a]
		for b := a; b < 4; b++ {
			lb := 0.5 * lv[b]
			Ab := &anti[b]
			// l_μ (Sym_ab − f(l_b w_a + l_a w_b)): the l_ν Sym and l^μ lw
			// terms share the factor l (η^μμ l_μ = l^μ).
			sym := Bf[a][b] + Bf[b][a] - 2*f*(lb*wv[a]+la*wv[b])
			v0 := hl[0]*sym - lb*Aa[0] - la*Ab[0]
			v1 := hl[1]*sym + lb*Aa[1] + la*Ab[1]
			v2 := hl[2]*sym + lb*Aa[2] + la*Ab[2]
			v3 := hl[3]*sym + lb*Aa[3] + la*Ab[3]
			G[0][a][b], G[0][b][a] = v0, v0
			G[1][a][b], G[1][b][a] = v1, v1
			G[2][a][b], G[2][b][a] = v2, v2
			G[3][a][b], G[3][b][a] = v3, v3
		}
	}
}
