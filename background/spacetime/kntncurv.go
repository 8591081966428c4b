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
