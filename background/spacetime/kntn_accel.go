package spacetime

import "math"

// Accel returns, for a four-velocity u at the event x (Cartesian
// components), the geodesic acceleration −Γ^μ_αβ u^α u^β and the
// Lorentz-force term F^μ_ν u^ν (to be multiplied by the charge-to-mass
// ratio), in closed form: the counterpart of KerrSchildPoint.Accel for
// Kerr–Newman–Taub–NUT, for geodesics and charged geodesics without Taylor
// arithmetic.
//
// Derivation (ours). In the coordinates q = (t, r, c = cos θ, φ) of the
// type documentation the metric has the entries G_tt = H_tt, G_tφ = H_tφ,
// G_φφ = H_φφ, G_rr = Σ/Δ, G_cc = Σ/sin²θ (H as in evalStatic), all
// functions of r and c only. With q̇ = (∂q/∂x) u (the one-forms dr, dc, dφ
// of the type documentation), the lowered contraction is
//
//	Γ_a(q̇, q̇) = (ṙ ∂_r + ċ ∂_c) G_ab q̇^b − ½ ∂_a G_bc q̇^b q̇^c,
//
// and the inverse metric follows exactly from the dual basis of
// U = dt − χ dφ, V = a dt − Ω dφ (Ω − aχ = Σ): e_U = (Ω ∂_t + a ∂_φ)/Σ,
// e_V = −(χ ∂_t + ∂_φ)/Σ, so that
//
//	G^{-1} = −(Σ/Δ) e_U e_U + (Σ/sin²θ) e_V e_V + (Δ/Σ) ∂_r ∂_r + (sin²θ/Σ) ∂_c ∂_c.
//
// The potential A = −((Qr − PS)/Σ)(dt − χ dφ) − P(c + C) dφ, S = N + ac,
// gives F_rt = ∂_r A_t, F_ct = ∂_c A_t, F_rφ = ∂_r A_φ, F_cφ = ∂_c A_φ. The coordinate accelerations q̈ are
// pushed forward by the map x = ρ cos φ, y = ρ sin φ, z = r c with
// ρ² = (r² + a²) sin²θ: ẍ^i = (∂x^i/∂q^a) q̈^a + (∂²x^i/∂q^a∂q^b) q̇^a q̇^b,
// written through ρ̇ and ρ̈ (from the derivatives of ρ²). Tested against the
// Christoffel symbols and field of Evaluator (Taylor and jet arithmetic) to
// rounding. Events on the axis (x = y = 0) are outside the chart.
func (k KerrNewmanNUT) Accel(x, u [4]float64) (geo, lorentz [4]float64) {
	a, N, C, M, Q := k.A, k.N, k.StringGauge, k.M, k.Q
	X, Y, Z := x[1], x[2], x[3]
	r := ksRadiusFloat(x, a)
	r2 := r * r
	ra2 := r2 + a*a
	rho2 := X*X + Y*Y
	rho := math.Sqrt(rho2)
	c := Z / r
	s2 := rho2 / ra2

	// q̇ from the one-forms dr, dc, dφ.
	td := u[0]
	rd := r * (r2*(X*u[1]+Y*u[2]) + ra2*Z*u[3]) / (r2*r2 + a*a*Z*Z)
	cd := (u[3] - c*rd) / r
	pd := (X*u[2] - Y*u[1]) / rho2

	// Metric functions of (r, c) and their derivatives.
	S := N + a*c
	sig := r2 + S*S
	sigR, sigC := 2*r, 2*a*S
	del := r2 - 2*M*r + a*a - N*N + k.chargeSq()
	delR := 2 * (r - M)
	s2C := -2 * c
	chi := a*s2 - 2*N*(c+C)
	chiC := -2*a*c - 2*N
	om := r2 + a*a + N*N - 2*a*N*C
	omR := 2 * r
	is := 1 / sig
	is2 := is * is
	kUU := -del * is
	kUUr := -(delR*sig - del*sigR) * is2
	kUUc := del * sigC * is2
	kVV := s2 * is
	kVVr := -s2 * sigR * is2
	kVVc := (s2C*sig - s2*sigC) * is2
	Httr := kUUr + a*a*kVVr
	Httc := kUUc + a*a*kVVc
	Htpr := -chi*kUUr - a*(omR*kVV+om*kVVr)
	Htpc := -(chiC*kUU + chi*kUUc) - a*om*kVVc
	Hppr := chi*chi*kUUr + 2*om*omR*kVV + om*om*kVVr
	Hppc := 2*chi*chiC*kUU + chi*chi*kUUc + om*om*kVVc
	idel := 1 / del
	krr := (sigR*del - sig*delR) * idel * idel
	krc := sigC * idel
	is2c := 1 / s2
	kcr := sigR * is2c
	kcc := (sigC*s2 - sig*s2C) * is2c * is2c

	// Γ_a(q̇, q̇), a = t, r, c, φ.
	DHtt := rd*Httr + cd*Httc
	DHtp := rd*Htpr + cd*Htpc
	DHpp := rd*Hppr + cd*Hppc
	Gt := DHtt*td + DHtp*pd
	Gp := DHtp*td + DHpp*pd
	Gr := (rd*krr+cd*krc)*rd - 0.5*(Httr*td*td+2*Htpr*td*pd+Hppr*pd*pd+krr*rd*rd+kcr*cd*cd)
	Gc := (rd*kcr+cd*kcc)*cd - 0.5*(Httc*td*td+2*Htpc*td*pd+Hppc*pd*pd+krc*rd*rd+kcc*cd*cd)

	// Inverse metric.
	gtt := (-om*om*idel + chi*chi*is2c) * is
	gtp := (-a*om*idel + chi*is2c) * is
	gpp := (-a*a*idel + is2c) * is
	grr := del * is
	gcc := s2 * is
	qdd := [4]float64{-(gtt*Gt + gtp*Gp), -grr * Gr, -gcc * Gc, -(gtp*Gt + gpp*Gp)}
	geo = pushForward(qdd, [4]float64{td, rd, cd, pd}, true, X, Y, rho, r, c, s2, ra2)
	Pm := k.P
	if Q == 0 && Pm == 0 {
		return geo, lorentz
	}
	// A_t = −n/Σ, A_φ = nχ/Σ − P(c + C) with n = Qr − P S
	// (n_r = Q, n_c = −P a).
	n, nr, nc := Q*r-Pm*S, Q, -Pm*a
	Atr := -(nr*sig - n*sigR) * is2
	Atc := -(nc*sig - n*sigC) * is2
	Apr := -chi * Atr
	Apc := (nc*chi+n*chiC)*is - n*chi*sigC*is2 - Pm
	Ft := -Atr*rd - Atc*cd
	Fp := -Apr*rd - Apc*cd
	Fr := Atr*td + Apr*pd
	Fc := Atc*td + Apc*pd
	ldd := [4]float64{gtt*Ft + gtp*Fp, grr * Fr, gcc * Fc, gtp*Ft + gpp*Fp}
	lorentz = pushForward(ldd, [4]float64{}, false, X, Y, rho, r, c, s2, ra2)
	return geo, lorentz
}

// pushForward maps coordinate accelerations q̈ (t, r, c, φ) with
// velocities q̇ to Cartesian ones; quad selects the terms quadratic in q̇.
func pushForward(qdd, qd [4]float64, quad bool, X, Y, rho, r, c, s2, ra2 float64) (out [4]float64) {
	rd, cd, pd := qd[1], qd[2], qd[3]
	rdd, cdd, pdd := qdd[1], qdd[2], qdd[3]
	// ρ² = (r² + a²) s², (ρ²)˙ = 2rṙ s² − 2(r² + a²)cċ.
	rhod := (r*rd*s2 - ra2*c*cd) / rho
	rho2dd := 2*r*rdd*s2 - 2*ra2*c*cdd
	if quad {
		rho2dd += 2*rd*rd*s2 - 8*r*rd*c*cd - 2*ra2*cd*cd
	}
	rhodd := 0.5 * rho2dd / rho
	if quad {
		rhodd -= rhod * rhod / rho
	}
	cp, sp := X/rho, Y/rho
	out[0] = qdd[0]
	out[1] = rhodd*cp - rho*sp*pdd
	out[2] = rhodd*sp + rho*cp*pdd
	out[3] = rdd*c + r*cdd
	if quad {
		out[1] += -2*rhod*sp*pd - rho*cp*pd*pd
		out[2] += 2*rhod*cp*pd - rho*sp*pd*pd
		out[3] += 2 * rd * cd
	}
	return out
}
