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
	chi := a*s2 - 2*N*(c+C)
	chiC := -2*a*c - 2*N
	om := r2 + a*a + N*N - 2*a*N*C
	is := 1 / sig
	is2 := is * is
	idel := 1 / del
	is2c := 1 / s2

	// Inverse metric.
	gtt := (-om*om*idel + chi*chi*is2c) * is
	gtp := (-a*om*idel + chi*is2c) * is
	gpp := (-a*a*idel + is2c) * is
	grr := del * is
	gcc := s2 * is

	// The acceleration as the difference from the flat one: in flat
	// space (M = N = Q = P = 0, the oblate spheroidal coordinates of the
	// same (x, y, z)) the coordinate acceleration q̈₀ pushes forward to
	// ẍ = 0, its quadratic terms cancelling, so ẍ is the push-forward of
	// δq̈ = q̈ − q̈₀ without them, with
	//
	//	δq̈ = −G⁻¹ δΓ(q̇, q̇) − δG⁻¹ Γ₀(q̇, q̇),
	//
	// δΓ from the exact differences δH of the metric functions (as in
	// evalStatic) and δG⁻¹ = G⁻¹ − G₀⁻¹ in closed form. Formed as q̈ and
	// pushed forward with the quadratic terms, the O(v²/r) terms cancelled
	// to O(M/r²) and left a relative rounding growing like r/M (8e-7 at
	// r = 1e8 b, M = 0.01 b).
	var dH, fH metricFuncs
	kntnDeltaFuncs(&dH, r, c, a, M, N, C, k.chargeSq())
	flatFuncs(&fH, r, c, a)
	q := [4]float64{td, rd, cd, pd}
	dG := dH.lowGamma(q)
	fG := fH.lowGamma(q)
	d0 := r2 + a*a
	sig0 := r2 + a*a*c*c
	dSig := N*N + 2*a*N*c
	dDel := -2*M*r - N*N + k.chargeSq()
	dChi := -2 * N * (c + C)
	dOm := N*N - 2*a*N*C
	chi0 := a * s2
	iDen := is * idel * is2c // 1/(ΣΔs²)
	dgtt := (-(2*d0+dOm)*dOm*s2 + (2*chi0+dChi)*dChi*d0 + chi*chi*dDel + dSig*d0*s2 + sig*dDel*s2) * iDen
	dgtp := (-a*dOm*s2 + dChi*d0 + chi*dDel) * iDen
	dgpp := (a*a*s2*dDel - del*dSig) * iDen / d0
	dgrr := (dDel*sig0 - d0*dSig) * is / sig0
	dgcc := -s2 * dSig * is / sig0
	qdd := [4]float64{
		-(gtt*dG[0] + gtp*dG[3]) - (dgtt*fG[0] + dgtp*fG[3]),
		-grr*dG[1] - dgrr*fG[1],
		-gcc*dG[2] - dgcc*fG[2],
		-(gtp*dG[0] + gpp*dG[3]) - (dgtp*fG[0] + dgpp*fG[3]),
	}
	geo = pushForward(qdd, q, false, X, Y, rho, r, c, s2, ra2)
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

// dual is a number with its partial derivatives in r and c.
type dual struct{ v, r, c float64 }

func (x dual) add(y dual) dual      { return dual{x.v + y.v, x.r + y.r, x.c + y.c} }
func (x dual) sub(y dual) dual      { return dual{x.v - y.v, x.r - y.r, x.c - y.c} }
func (x dual) scale(s float64) dual { return dual{s * x.v, s * x.r, s * x.c} }
func (x dual) mul(y dual) dual {
	return dual{x.v * y.v, x.r*y.v + x.v*y.r, x.c*y.v + x.v*y.c}
}
func (x dual) div(y dual) dual {
	q := x.v / y.v
	return dual{q, (x.r - q*y.r) / y.v, (x.c - q*y.c) / y.v}
}

// metricFuncs holds the metric functions of (r, c) of the coordinates
// (t, r, c, φ): G_tt, G_tφ, G_φφ, G_rr, G_cc with their partials.
type metricFuncs struct{ tt, tp, pp, rr, cc dual }

// lowGamma returns Γ_a(q̇, q̇) = (ṙ ∂_r + ċ ∂_c) G_ab q̇^b − ½ ∂_a G_bc q̇^b q̇^c
// for a = t, r, c, φ.
func (f *metricFuncs) lowGamma(q [4]float64) [4]float64 {
	td, rd, cd, pd := q[0], q[1], q[2], q[3]
	DHtt := rd*f.tt.r + cd*f.tt.c
	DHtp := rd*f.tp.r + cd*f.tp.c
	DHpp := rd*f.pp.r + cd*f.pp.c
	Gt := DHtt*td + DHtp*pd
	Gp := DHtp*td + DHpp*pd
	Gr := (rd*f.rr.r+cd*f.rr.c)*rd - 0.5*(f.tt.r*td*td+2*f.tp.r*td*pd+f.pp.r*pd*pd+f.rr.r*rd*rd+f.cc.r*cd*cd)
	Gc := (rd*f.cc.r+cd*f.cc.c)*cd - 0.5*(f.tt.c*td*td+2*f.tp.c*td*pd+f.pp.c*pd*pd+f.rr.c*rd*rd+f.cc.c*cd*cd)
	return [4]float64{Gt, Gr, Gc, Gp}
}

// flatFuncs fills f with the flat metric in the oblate spheroidal
// coordinates: G_tt = −1, G_tφ = 0, G_φφ = (r² + a²)s², G_rr = Σ₀/(r² + a²),
// G_cc = Σ₀/s² (Σ₀ = r² + a²c², s² = 1 − c²).
func flatFuncs(f *metricFuncs, r, c, a float64) {
	R, Cc := dual{r, 1, 0}, dual{c, 0, 1}
	one := dual{1, 0, 0}
	d0 := R.mul(R).add(dual{a * a, 0, 0})
	s2 := one.sub(Cc.mul(Cc))
	sig0 := R.mul(R).add(Cc.mul(Cc).scale(a * a))
	f.tt, f.tp = dual{-1, 0, 0}, dual{}
	f.pp = d0.mul(s2)
	f.rr = sig0.div(d0)
	f.cc = sig0.div(s2)
}

// kntnDeltaFuncs fills f with the differences of the Kerr–Newman–Taub–NUT
// metric functions from the flat ones, formed without cancellation (the
// coefficients of evalStatic: H_tt = c_UU + a² c_VV,
// H_tφ = −χ₀ c_UU + c_φU − aΩ₀ c_VV + a c_φV,
// H_φφ = χ₀² c_UU − 2χ₀ c_φU + Ω₀² c_VV − 2Ω₀ c_φV + c_φφ, G_rr = c_r,
// G_cc = c_c; e2 = Q² + P²).
func kntnDeltaFuncs(f *metricFuncs, r, c, a, M, N, C, e2 float64) {
	R, Cc := dual{r, 1, 0}, dual{c, 0, 1}
	one := dual{1, 0, 0}
	r2 := R.mul(R)
	d0 := r2.add(dual{a * a, 0, 0}) // Δ₀ = Ω₀
	s2 := one.sub(Cc.mul(Cc))
	sig0 := r2.add(Cc.mul(Cc).scale(a * a))
	S := Cc.scale(a).add(dual{N, 0, 0})
	sig := r2.add(S.mul(S))
	del := r2.sub(R.scale(2 * M)).add(dual{a*a - N*N + e2, 0, 0})
	dSig := Cc.scale(2 * a * N).add(dual{N * N, 0, 0})
	dDel := R.scale(-2 * M).add(dual{-N*N + e2, 0, 0})
	dChi := Cc.scale(-2 * N).add(dual{-2 * N * C, 0, 0})
	dOm := N*N - 2*a*N*C
	chi0 := s2.scale(a)
	nUU := d0.mul(dSig).sub(sig0.mul(dDel))
	ss0 := sig.mul(sig0)
	q := del.div(sig) // Δ/Σ
	w := s2.div(sig)  // s²/Σ
	cUU := nUU.div(ss0)
	cPU := q.mul(dChi)
	cVV := s2.mul(dSig).div(ss0).scale(-1)
	cPV := w.scale(-dOm)
	cPP := q.mul(dChi).mul(dChi).scale(-1).add(w.scale(dOm * dOm))
	f.tt = cUU.add(cVV.scale(a * a))
	f.tp = chi0.mul(cUU).scale(-1).add(cPU).sub(d0.mul(cVV).scale(a)).add(cPV.scale(a))
	f.pp = chi0.mul(chi0).mul(cUU).sub(chi0.mul(cPU).scale(2)).add(d0.mul(d0).mul(cVV)).sub(d0.mul(cPV).scale(2)).add(cPP)
	f.rr = nUU.div(del.mul(d0))
	f.cc = dSig.div(s2)
}
