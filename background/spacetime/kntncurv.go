package spacetime

// Closed-form curvature of the Kerr–Newman–Taub–NUT family, for the
// order-2 path of Evaluator without the field gradient: the metric and
// Christoffel symbols from first-order Taylor arithmetic, the Riemann
// tensor from the type D form of kerrcurv.go.
//
// Kerr–Newman–Taub–NUT is of type D with the Maxwell field aligned with
// both principal null directions (Demiański & Newman 1966; Griffiths &
// Podolský 2009, § 12.1; from memory). In the frame
//
//	e⁰ ∝ dt − χ dφ,  e¹ ∝ dr,  e² ∝ dθ,  e³ ∝ a dt − Ω dφ
//
// the field of unit charge, F = d[−(r/Σ)(dt − χ dφ)], is radial:
//
//	F = ((r² − y²)/Σ²) dr ∧ (dt − χ dφ) + (2ry/Σ²) dc ∧ (a dt − Ω dφ),
//
// y = N + a cos θ, c = cos θ, Σ = r² + y² (ours, from Ω − aχ = Σ and
// dχ = −2y dc), so its self-dual part is, with ϱ = r − i y,
//
//	𝒰 = ϱ⁻² [dr ∧ (dt − χ dφ) − i dc ∧ (a dt − Ω dφ)],   𝒰·𝒰 = −4/ϱ⁴
//
// (the sign of the i fixed by *𝒰 = i𝒰 in the orientation of (t, x, y, z),
// in which (dt − χ dφ, dr, dθ, a dt − Ω dφ) is negatively oriented). The
// Weyl scalar is that of Kerr–Newman with the complex mass M − iN
// (Ψ₂ = −(M − iN)/ϱ³ + (Q² + P²)/(ϱ³ϱ̄) in our orientation; Demiański & Newman
// 1966, Griffiths & Podolský 2009, § 12.1, from memory, up to their sign
// conventions for N), so that, in the notation of kerrcurv.go,
//
//	k = −3 (M − iN − (Q² + P²)/ϱ̄) ϱ,
//
// and the Ricci part comes from the Maxwell stress of the field of
// charges Q and P (its duality rotation does not change the stress). The
// volume element is √−g = Σ/(r² + a² cos² θ) (oblate spheroidal
// coordinates, dV = (r² + a²cos²θ) sin θ dr dθ dφ). Agreement with the
// jet arithmetic is tested to rounding (TestKNTNCurvatureClosedForm).

// kntnCurvature fills p.RiemannLow at the spatial event x from p.G,
// p.GInv and p.F (filled at order 1), and p.Riemann when raise is set.
func (k KerrNewmanNUT) kntnCurvature(x [4]float64, p *Point, raise bool) {
	a, N := k.A, k.N
	X, Y, Zc := x[1], x[2], x[3]
	r := ksRadiusFloat(x, a)
	r2 := r * r
	ir := 1 / r
	c := Zc * ir
	y := N + a*c
	rho2 := X*X + Y*Y
	irho2 := 1 / rho2
	ra2 := r2 + a*a
	s2 := rho2 / ra2
	chi := a*s2 - 2*N*(c+k.StringGauge)
	om := ra2 + N*N - 2*a*N*k.StringGauge
	den := r / (r2*r2 + a*a*Zc*Zc)
	P, Pz := den*r2, den*ra2
	dr := [4]float64{0, P * X, P * Y, Pz * Zc}
	dc := [4]float64{0, -c * dr[1] * ir, -c * dr[2] * ir, (1 - c*dr[3]) * ir}
	dphi := [4]float64{0, -Y * irho2, X * irho2, 0}
	var w1, w2 [4]float64
	w1[0], w2[0] = 1, a
	for i := 1; i < 4; i++ {
		w1[i] = -chi * dphi[i]
		w2[i] = -om * dphi[i]
	}
	rho := complex(r, -y)
	irho := cinv(rho)
	z2 := irho * irho
	var U [6]complex128
	for B, pr := range bivectors {
		m, n := pr[0], pr[1]
		U[B] = z2 * complex(dr[m]*w1[n]-dr[n]*w1[m], dc[n]*w2[m]-dc[m]*w2[n])
	}
	sqrtg := (r2 + y*y) / (r2 + a*a*c*c)
	e2 := k.Q*k.Q + k.P*k.P
	me := complex(k.M, -N) // M − iN − (Q² + P²)/ϱ̄
	if e2 != 0 {
		me -= complex(e2, 0) * complex(real(irho), -imag(irho))
	}
	kw := -3 * me * rho
	weylRicciLow(&p.RiemannLow, &U, kw, z2*z2, sqrtg, &p.G, &p.GInv, &p.F, e2 != 0)
	if raise {
		raiseRiemann(&p.Riemann, &p.RiemannLow, &p.GInv, false)
	}
}

// kntnFirst fills the metric, the potential and their first derivatives
// (d.g, d.dg, d.a, d.da) at the spatial event x in closed form, the input
// of assemble at order 1. With the one-forms U = dt − χ dφ,
// V = a dt − Ω dφ, dr, dc (c = cos θ) of the type documentation,
//
//	g = k_UU U⊗U + k_VV V⊗V + k_r dr⊗dr + k_c dc⊗dc,
//	k_UU = −Δ/Σ, k_VV = sin²θ/Σ, k_r = Σ/Δ, k_c = Σ/sin²θ,
//	A = α U + β dφ,   α = −(Q r − P(N + a c))/Σ,   β = −P(c + C),
//
// the metric formed as η + h with h the exact difference from the flat
// metric term by term (see Eval: summing the four terms of order one
// left a relative rounding growing like r/M in h and ∂h), every
// coefficient a function of (r, c) differentiated by the chain
// rule, and the one-forms differentiated through the Hessians of r, c and
// φ: ∂_ij r = (∂_j N_i − ∂_i r ∂_j D)/D from the Kerr–Schild quartic
// (N_i = 2x_i r² + 2a²z δ_i3, D = 2r(2r² − x² − y² − z² + a²),
// ∂_j N_i = 2δ_ij r² + 4x_i r ∂_j r + 2a²δ_i3δ_j3,
// ∂_j D = ∂_j r (D/r + 8r²) − 4r x_j), ∂_ij c = −(∂_i c ∂_j r + ∂_j c ∂_i r +
// c ∂_ij r)/r, and ∂_i φ = (−y, x, 0)/ρ² (ours). Agreement with the Taylor
// and jet arithmetic is tested to rounding.
func (k KerrNewmanNUT) kntnFirst(x [4]float64, d *ksDerivs) {
	a, N, C, M, Q, Pm := k.A, k.N, k.StringGauge, k.M, k.Q, k.P
	X := [3]float64{x[1], x[2], x[3]}
	r := ksRadiusFloat(x, a)
	r2 := r * r
	a2 := a * a
	ra2 := r2 + a2
	rho2 := X[0]*X[0] + X[1]*X[1]
	irho2 := 1 / rho2
	c := X[2] / r
	s2 := rho2 / ra2
	// Gradient and Hessian of r.
	D := 2 * r * (2*r2 - rho2 - X[2]*X[2] + a2)
	iD := 1 / D
	var rg [3]float64
	for i := 0; i < 3; i++ {
		rg[i] = 2 * X[i] * r2 * iD
	}
	rg[2] += 2 * a2 * X[2] * iD
	var dD [3]float64
	cD := D/r + 8*r2
	for j := 0; j < 3; j++ {
		dD[j] = rg[j]*cD - 4*r*X[j]
	}
	var rh, ch, ph [3][3]float64
	for i := 0; i < 3; i++ {
		for j := i; j < 3; j++ {
			v := 4*X[i]*r*rg[j] - rg[i]*dD[j]
			if i == j {
				v += 2 * r2
			}
			if i == 2 && j == 2 {
				v += 2 * a2
			}
			v *= iD
			rh[i][j], rh[j][i] = v, v
		}
	}
	ir := 1 / r
	var cg [3]float64
	for i := 0; i < 3; i++ {
		cg[i] = -c * rg[i] * ir
	}
	cg[2] += ir
	for i := 0; i < 3; i++ {
		for j := i; j < 3; j++ {
			v := -(cg[i]*rg[j] + cg[j]*rg[i] + c*rh[i][j]) * ir
			ch[i][j], ch[j][i] = v, v
		}
	}
	pg := [3]float64{-X[1] * irho2, X[0] * irho2, 0}
	i4 := irho2 * irho2
	ph[0][0], ph[1][1] = 2*X[0]*X[1]*i4, -2*X[0]*X[1]*i4
	ph[0][1] = (X[1]*X[1] - X[0]*X[0]) * i4
	ph[1][0] = ph[0][1]

	// Functions of (r, c) and their gradients: the full Σ, Δ, χ (for the
	// potential and the full coefficients), the flat values Σ₀ = r² + a²c²,
	// Δ₀ = Ω₀ = r² + a², χ₀ = a sin²θ and the exact variations
	// δΣ = N² + 2aNc, δΔ = −2Mr − N² + Q² + P², δχ = −2N(c + C),
	// δΩ = N² − 2aNC.
	S := N + a*c
	sig := r2 + S*S
	del := r2 - 2*M*r + a2 - N*N + k.chargeSq()
	chi := a*s2 - 2*N*(c+C)
	isig := 1 / sig
	sig0 := r2 + a2*c*c
	dSig := N*N + 2*a*N*c
	dDel := -2*M*r - N*N + k.chargeSq()
	dChi := -2 * N * (c + C)
	dOm := N*N - 2*a*N*C
	chi0 := a * s2
	var sigG, delG, s2G, chiG, sig0G, ra2G, dSigG, dDelG, dChiG, chi0G [3]float64
	for i := 0; i < 3; i++ {
		sigG[i] = 2*r*rg[i] + 2*a*S*cg[i]
		delG[i] = 2 * (r - M) * rg[i]
		s2G[i] = -2 * c * cg[i]
		chiG[i] = -2 * (a*c + N) * cg[i]
		sig0G[i] = 2*r*rg[i] + 2*a2*c*cg[i]
		ra2G[i] = 2 * r * rg[i]
		dSigG[i] = 2 * a * N * cg[i]
		dDelG[i] = -2 * M * rg[i]
		dChiG[i] = -2 * N * cg[i]
		chi0G[i] = a * s2G[i]
	}
	// g = η + h with h in the terms of Eval (no cancellation of terms of
	// order one, see there):
	//
	//	h = c_UU U₀U₀ + c_φU 2dφ⊙U₀ + c_VV V₀V₀ + c_φV 2dφ⊙V₀ + c_φφ dφ²
	//	    + c_r dr² + c_c dc²,
	//	c_UU = (Δ₀δΣ − Σ₀δΔ)/(ΣΣ₀), c_φU = (Δ/Σ)δχ, c_VV = −s²δΣ/(ΣΣ₀),
	//	c_φV = −(s²/Σ)δΩ, c_φφ = −(Δ/Σ)δχ² + (s²/Σ)δΩ²,
	//	c_r = (Δ₀δΣ − Σ₀δΔ)/(ΔΔ₀), c_c = δΣ/s².
	nUU := ra2*dSig - sig0*dDel
	ss0 := sig * sig0
	iss0 := 1 / ss0
	q := del * isig // Δ/Σ
	w := s2 * isig  // s²/Σ
	ida := 1 / (del * ra2)
	cUU := nUU * iss0
	cPU := q * dChi
	cVV := -s2 * dSig * iss0
	cPV := -w * dOm
	cPP := -q*dChi*dChi + w*dOm*dOm
	cR := nUU * ida
	cC := dSig / s2
	var cUUg, cPUg, cVVg, cPVg, cPPg, cRg, cCg [3]float64
	for i := 0; i < 3; i++ {
		nG := ra2G[i]*dSig + ra2*dSigG[i] - sig0G[i]*dDel - sig0*dDelG[i]
		ssG := sigG[i]*sig0 + sig*sig0G[i]
		qG := (delG[i] - q*sigG[i]) * isig
		wG := (s2G[i] - w*sigG[i]) * isig
		cUUg[i] = (nG - cUU*ssG) * iss0
		cPUg[i] = qG*dChi + q*dChiG[i]
		cVVg[i] = (-(s2G[i]*dSig + s2*dSigG[i]) - cVV*ssG) * iss0
		cPVg[i] = -dOm * wG
		cPPg[i] = -qG*dChi*dChi - 2*q*dChi*dChiG[i] + wG*dOm*dOm
		cRg[i] = (nG - cR*(delG[i]*ra2+del*ra2G[i])) * ida
		cCg[i] = (dSigG[i] - cC*s2G[i]) / s2
	}
	// One-forms and their derivatives ∂_i w_μ as [i][μ]: the full U (for
	// the potential), U₀, V₀, dφ (Pf), dr, dc.
	var U, U0, V0, Pf, R, Cf [4]float64
	U[0], U0[0], V0[0] = 1, 1, a
	for j := 0; j < 3; j++ {
		U[j+1] = -chi * pg[j]
		U0[j+1] = -chi0 * pg[j]
		V0[j+1] = -ra2 * pg[j]
		Pf[j+1] = pg[j]
		R[j+1] = rg[j]
		Cf[j+1] = cg[j]
	}
	var dU, dU0, dV0, dP, dR, dC [3][4]float64
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			dU[i][j+1] = -chiG[i]*pg[j] - chi*ph[i][j]
			dU0[i][j+1] = -chi0G[i]*pg[j] - chi0*ph[i][j]
			dV0[i][j+1] = -ra2G[i]*pg[j] - ra2*ph[i][j]
			dP[i][j+1] = ph[i][j]
			dR[i][j+1] = rh[i][j]
			dC[i][j+1] = ch[i][j]
		}
	}
	eta := [4]float64{-1, 1, 1, 1}
	d.dg[0] = [4][4]float64{}
	for m := 0; m < 4; m++ {
		for n := m; n < 4; n++ {
			v := cUU*U0[m]*U0[n] + cPU*(Pf[m]*U0[n]+U0[m]*Pf[n]) +
				cVV*V0[m]*V0[n] + cPV*(Pf[m]*V0[n]+V0[m]*Pf[n]) +
				cPP*Pf[m]*Pf[n] + cR*R[m]*R[n] + cC*Cf[m]*Cf[n]
			if m == n {
				v += eta[m]
			}
			d.g[m][n], d.g[n][m] = v, v
			for i := 0; i < 3; i++ {
				v := cUUg[i]*U0[m]*U0[n] + cUU*(dU0[i][m]*U0[n]+U0[m]*dU0[i][n]) +
					cPUg[i]*(Pf[m]*U0[n]+U0[m]*Pf[n]) +
					cPU*(dP[i][m]*U0[n]+Pf[m]*dU0[i][n]+dU0[i][m]*Pf[n]+U0[m]*dP[i][n]) +
					cVVg[i]*V0[m]*V0[n] + cVV*(dV0[i][m]*V0[n]+V0[m]*dV0[i][n]) +
					cPVg[i]*(Pf[m]*V0[n]+V0[m]*Pf[n]) +
					cPV*(dP[i][m]*V0[n]+Pf[m]*dV0[i][n]+dV0[i][m]*Pf[n]+V0[m]*dP[i][n]) +
					cPPg[i]*Pf[m]*Pf[n] + cPP*(dP[i][m]*Pf[n]+Pf[m]*dP[i][n]) +
					cRg[i]*R[m]*R[n] + cR*(dR[i][m]*R[n]+R[m]*dR[i][n]) +
					cCg[i]*Cf[m]*Cf[n] + cC*(dC[i][m]*Cf[n]+Cf[m]*dC[i][n])
				d.dg[i+1][m][n], d.dg[i+1][n][m] = v, v
			}
		}
	}
	// Potential.
	d.da[0] = [4]float64{}
	if Q == 0 && Pm == 0 {
		d.a = [4]float64{}
		for i := 1; i < 4; i++ {
			d.da[i] = [4]float64{}
		}
		return
	}
	nA := Q*r - Pm*S
	alpha := -nA * isig
	beta := -Pm * (c + C)
	for m := 0; m < 4; m++ {
		d.a[m] = alpha * U[m]
	}
	for j := 0; j < 3; j++ {
		d.a[j+1] += beta * pg[j]
	}
	for i := 0; i < 3; i++ {
		alphaG := -(Q*rg[i] - Pm*a*cg[i] + alpha*sigG[i]) * isig
		betaG := -Pm * cg[i]
		da := &d.da[i+1]
		for m := 0; m < 4; m++ {
			da[m] = alphaG*U[m] + alpha*dU[i][m]
		}
		for j := 0; j < 3; j++ {
			da[j+1] += betaG*pg[j] + beta*ph[i][j]
		}
	}
}
