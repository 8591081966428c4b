package spacetime

// KerrSchildPoint is the Kerr–Schild data of a KerrNewman spacetime at one
// event, in closed form, for probes that need only first derivatives of
// the metric (geodesics and charged geodesics):
//
//	g_μν = η_μν + f l_μ l_ν,   A_μ = s l_μ,
//
// with f, l and s as in the KerrNewman doc comment (s = −Q r³/(r⁴ + a²z²)).
// The inverse metric is g^μν = η^μν − f l^μ l^ν with l^μ = η^μν l_ν, since
// l is null. Derivatives follow from the chain rule through the
// Boyer–Lindquist radius r(x, y, z), the root of
// r⁴ − (x² + y² + z² − a²) r² − a²z² = 0, whose gradient is
//
//	∂r/∂x = 2x r²/D,  ∂r/∂y = 2y r²/D,  ∂r/∂z = 2z (r² + a²)/D,
//	D = 2r (2r² − x² − y² − z² + a²)
//
// (implicit differentiation). They agree with the automatic
// differentiation of Evaluator to rounding (tested), at a fraction of its
// cost; nothing depends on t, so every ∂_0 vanishes.
type KerrSchildPoint struct {
	F  float64       // f
	DF [4]float64    // ∂_μ f
	L  [4]float64    // l_μ (L[0] = 1)
	DL [4][4]float64 // ∂_μ l_ν as [μ][ν]
	S  float64       // s, A_μ = s l_μ
	DS [4]float64    // ∂_μ s
}

// KerrSchild fills p with the Kerr–Schild data at the event x.
func (k KerrNewman) KerrSchild(x [4]float64, p *KerrSchildPoint) { k.kerrSchild(x, p) }

// kerrSchild is KerrSchild, returning the radius r.
func (k KerrNewman) kerrSchild(x [4]float64, p *KerrSchildPoint) float64 {
	a := k.A
	X, Y, Z := x[1], x[2], x[3]
	rho2 := X*X + Y*Y + Z*Z
	r := ksRadiusFloat(x, a)
	r2 := r * r
	a2 := a * a
	D := 2 * r * (2*r2 - rho2 + a2)
	dr := [4]float64{0, 2 * X * r2 / D, 2 * Y * r2 / D, 2 * Z * (r2 + a2) / D}
	P := r2 + a2
	iP := 1 / P
	n1 := r*X + a*Y
	n2 := r*Y - a*X
	p.L = [4]float64{1, n1 * iP, n2 * iP, Z / r}
	p.DL = [4][4]float64{}
	for j := 1; j < 4; j++ {
		dP := 2 * r * dr[j] // ∂_j (r² + a²)
		dn1 := dr[j] * X
		dn2 := dr[j] * Y
		switch j {
		case 1:
			dn1 += r
			dn2 -= a
		case 2:
			dn1 += a
			dn2 += r
		}
		p.DL[j][1] = dn1*iP - n1*dP*iP*iP
		p.DL[j][2] = dn2*iP - n2*dP*iP*iP
		p.DL[j][3] = -Z * dr[j] / r2
		if j == 3 {
			p.DL[j][3] += 1 / r
		}
	}
	sig := r2*r2 + a2*Z*Z
	iS := 1 / sig
	Nf := r2 * (2*k.M*r - k.Q*k.Q)
	Ns := -k.Q * r2 * r
	p.F = Nf * iS
	p.S = Ns * iS
	p.DF, p.DS = [4]float64{}, [4]float64{}
	for j := 1; j < 4; j++ {
		dSig := 4 * r2 * r * dr[j]
		if j == 3 {
			dSig += 2 * a2 * Z
		}
		dNf := (6*k.M*r2 - 2*k.Q*k.Q*r) * dr[j]
		dNs := -3 * k.Q * r2 * dr[j]
		p.DF[j] = (dNf - Nf*dSig*iS) * iS
		p.DS[j] = (dNs - Ns*dSig*iS) * iS
	}
	return r
}

// KerrSchildForm is implemented by metrics with a closed-form Kerr–Schild
// representation (KerrNewman).
type KerrSchildForm interface {
	Metric
	KerrSchild(x [4]float64, p *KerrSchildPoint)
}

var _ KerrSchildForm = KerrNewman{}

// Accel returns, for a four-velocity u, the geodesic acceleration
// −Γ^μ_αβ u^α u^β and the Lorentz-force term F^μ_ν u^ν (to be multiplied
// by the charge-to-mass ratio), from the Kerr–Schild data alone.
//
// Derivation (ours, from the Lagrangian ½ g_μν u^μ u^ν with g = η + f l l):
// with w = l_ν u^ν, G_μ = (∂_μ l_ν) u^ν, K_μ = u^α ∂_α l_μ, the
// Euler–Lagrange equations read η_μν a^ν + f l_μ (l·a) = R_μ with
//
//	R_μ = ½ w² ∂_μ f + f w G_μ − (u·∂f) w l_μ − f (K·u) l_μ − f w K_μ,
//
// and, l being null, l·a = l^μ R_μ, so that a^μ = η^μν (R_ν − f l_ν l·a).
// The Lorentz term is (F u)_μ = w ∂_μ s + s G_μ − (u·∂s) l_μ − s K_μ,
// raised with g^μν = η^μν − f l^μ l^ν.
func (p *KerrSchildPoint) Accel(u [4]float64) (geo, lorentz [4]float64) {
	l := &p.L
	w := l[0]*u[0] + l[1]*u[1] + l[2]*u[2] + l[3]*u[3]
	var G, K [4]float64
	var udf, uds, Ku float64
	for j := 1; j < 4; j++ {
		G[j] = p.DL[j][1]*u[1] + p.DL[j][2]*u[2] + p.DL[j][3]*u[3]
		K[j] = u[1]*p.DL[1][j] + u[2]*p.DL[2][j] + u[3]*p.DL[3][j]
		udf += u[j] * p.DF[j]
		uds += u[j] * p.DS[j]
	}
	for j := 1; j < 4; j++ {
		Ku += K[j] * u[j]
	}
	f := p.F
	var R [4]float64
	for m := 0; m < 4; m++ {
		R[m] = 0.5*w*w*p.DF[m] + f*w*G[m] - udf*w*l[m] - f*Ku*l[m] - f*w*K[m]
	}
	la := -R[0] + l[1]*R[1] + l[2]*R[2] + l[3]*R[3] // l^μ R_μ
	geo[0] = -(R[0] - f*l[0]*la)
	for i := 1; i < 4; i++ {
		geo[i] = R[i] - f*l[i]*la
	}
	if p.S == 0 && p.DS == ([4]float64{}) {
		return geo, lorentz
	}
	var Fu [4]float64
	for m := 0; m < 4; m++ {
		Fu[m] = w*p.DS[m] + p.S*G[m] - uds*l[m] - p.S*K[m]
	}
	lF := -Fu[0] + l[1]*Fu[1] + l[2]*Fu[2] + l[3]*Fu[3] // l^α (F u)_α
	lorentz[0] = -Fu[0] - f*(-l[0])*lF
	for i := 1; i < 4; i++ {
		lorentz[i] = Fu[i] - f*l[i]*lF
	}
	return geo, lorentz
}

// Lower returns g_μν v^ν and A_μ from the Kerr–Schild data.
func (p *KerrSchildPoint) Lower(v [4]float64) (vl, A [4]float64) {
	l := &p.L
	lv := l[0]*v[0] + l[1]*v[1] + l[2]*v[2] + l[3]*v[3]
	vl = [4]float64{-v[0], v[1], v[2], v[3]}
	for m := 0; m < 4; m++ {
		vl[m] += p.F * lv * l[m]
		A[m] = p.S * l[m]
	}
	return vl, A
}
