package spacetime

// Closed-form second derivatives of the Kerr–Newman metric in Kerr–Schild
// form, for the curvature at order 2 (pole–dipole bodies) without Taylor
// arithmetic. With the notation of KerrNewman and KerrSchildPoint,
//
//	h_μν = f l_μ l_ν,   A_μ = s l_μ,
//
// every derivative follows by the chain rule through the Boyer–Lindquist
// radius r(x, y, z), whose gradient and Hessian come from implicit
// differentiation of F(r; x) = r⁴ − (ρ² − a²)r² − a²z² = 0
// (ρ² = x² + y² + z²):
//
//	∂_i r  = N_i/D,   N_i = 2x_i r² + 2a²z δ_i3,   D = 2r(2r² − ρ² + a²),
//	∂_ij r = (∂_j N_i − ∂_i r ∂_j D)/D,
//	∂_j N_i = 2δ_ij r² + 4x_i r ∂_j r + 2a² δ_i3 δ_j3,
//	∂_j D  = ∂_j r (D/r + 8r²) − 4r x_j,
//
// and the quotients l_1 = (rx + ay)/(r² + a²), l_2 = (ry − ax)/(r² + a²),
// l_3 = z/r, f = (2Mr³ − Q²r²)/(r⁴ + a²z²), s = −Qr³/(r⁴ + a²z²) by the
// Leibniz rule for q = n/d: n = q d differentiated twice (ours). The metric
// derivatives are then
//
//	∂_i h_μν  = l_μ B_iν + B_iμ l_ν,      B_iν = ½ ∂_i f l_ν + f ∂_i l_ν,
//	∂_ij h_μν = ∂_j l_μ B_iν + B_iμ ∂_j l_ν + l_μ ∂_j B_iν + ∂_j B_iμ l_ν,
//
// and, since l is null for η, g^μν = η^μν − f l^μ l^ν exactly (l^μ = η^μν
// l_ν). Agreement with the Taylor and jet arithmetic is tested to rounding.

// d2val is a scalar with its gradient and Hessian in (x, y, z).
type d2val struct {
	v float64
	d [3]float64
	h [3][3]float64
}

// quo sets q = n/dn with derivatives.
func (q *d2val) quo(n, dn *d2val) {
	id := 1 / dn.v
	q.v = n.v * id
	for i := 0; i < 3; i++ {
		q.d[i] = (n.d[i] - q.v*dn.d[i]) * id
	}
	for i := 0; i < 3; i++ {
		for j := i; j < 3; j++ {
			v := (n.h[i][j] - q.d[i]*dn.d[j] - q.d[j]*dn.d[i] - q.v*dn.h[i][j]) * id
			q.h[i][j], q.h[j][i] = v, v
		}
	}
}

// poly sets z = c3 r³ + c2 r² (with derivatives) from r.
func (z *d2val) poly(r *d2val, c3, c2 float64) {
	rv := r.v
	z.v = (c3*rv + c2) * rv * rv
	p1 := (3*c3*rv + 2*c2) * rv // dz/dr
	p2 := 6*c3*rv + 2*c2        // d²z/dr²
	for i := 0; i < 3; i++ {
		z.d[i] = p1 * r.d[i]
	}
	for i := 0; i < 3; i++ {
		for j := i; j < 3; j++ {
			v := p2*r.d[i]*r.d[j] + p1*r.h[i][j]
			z.h[i][j], z.h[j][i] = v, v
		}
	}
}

// ksDerivs holds the metric and potential of a static metric with their
// first and second spatial derivatives, in plain floating point: the input
// of the order-2 curvature assembly (assembleOrder2).
type ksDerivs struct {
	g   [4][4]float64       // g_μν
	dg  [4][4][4]float64    // ∂_λ g_μν as [λ][μ][ν] (λ = 0 zero)
	d2  [4][4][4][4]float64 // ∂_a∂_b g_μν as [a][b][μ][ν] (time index zero)
	a   [4]float64          // A_μ
	da  [4][4]float64       // ∂_λ A_ν as [λ][ν]
	d2a [4][4][4]float64    // ∂_λ∂_μ A_ν as [λ][μ][ν]
	// hinv: g^μν = η^μν − η^μμ η^νν h_μν exactly (Kerr–Schild).
	hinv bool
	// uncharged: A vanishes identically; a, da and d2a are not read.
	uncharged bool
	// glReady: Γ_ναβ and Γ^μ_αβ are already formed (kerrSchild2); dg is
	// then not filled.
	glReady bool
}

// kerrSchild2 fills d with the Kerr–Schild data of k at the spatial point
// x (closed form, see the file comment), and gl and G with the Christoffel
// symbols Γ_ναβ and Γ^μ_αβ. With B_0ν = 0, Sym_αβ = B_αβ + B_βα and
// Anti_αν = B_αν − B_να (ours, from ∂_λ h_μν = l_μ B_λν + B_λμ l_ν):
//
//	Γ_ναβ   = ½(l_ν Sym_αβ + l_β Anti_αν + l_α Anti_βν),
//	Γ^μ_αβ  = η^μμ Γ_μαβ − ½ f l^μ (l_β w_α + l_α w_β),   w_α = Anti_αν l^ν,
//
// the second from g^μν = η^μν − f l^μ l^ν and l^ν l_ν = 0.
func (k KerrNewman) kerrSchild2(x [4]float64, d *ksDerivs, gl, G *[4][4][4]float64) {
	a := k.A
	a2 := a * a
	X := [3]float64{x[1], x[2], x[3]}
	rho2 := X[0]*X[0] + X[1]*X[1] + X[2]*X[2]
	var r d2val
	r.v = ksRadiusFloat(x, a)
	rv := r.v
	r2 := rv * rv
	D := 2 * rv * (2*r2 - rho2 + a2)
	iD := 1 / D
	var N [3]float64
	for i := 0; i < 3; i++ {
		N[i] = 2 * X[i] * r2
	}
	N[2] += 2 * a2 * X[2]
	for i := 0; i < 3; i++ {
		r.d[i] = N[i] * iD
	}
	var dD [3]float64
	c := D/rv + 8*r2
	for j := 0; j < 3; j++ {
		dD[j] = r.d[j]*c - 4*rv*X[j]
	}
	for i := 0; i < 3; i++ {
		for j := i; j < 3; j++ {
			dN := 4*X[i]*rv*r.d[j] - r.d[i]*dD[j]
			if i == j {
				dN += 2 * r2
			}
			if i == 2 && j == 2 {
				dN += 2 * a2
			}
			v := dN * iD
			r.h[i][j], r.h[j][i] = v, v
		}
	}

	// l_1, l_2, l_3.
	var P, n1, n2, n3 d2val
	P.poly(&r, 0, 1)
	P.v += a2
	n1.v = rv*X[0] + a*X[1]
	n2.v = rv*X[1] - a*X[0]
	n3.v = X[2]
	for i := 0; i < 3; i++ {
		n1.d[i] = r.d[i] * X[0]
		n2.d[i] = r.d[i] * X[1]
		for j := 0; j < 3; j++ {
			n1.h[i][j] = r.h[i][j] * X[0]
			n2.h[i][j] = r.h[i][j] * X[1]
		}
		n1.h[i][0] += r.d[i]
		n1.h[0][i] += r.d[i]
		n2.h[i][1] += r.d[i]
		n2.h[1][i] += r.d[i]
	}
	n1.d[0] += rv
	n1.d[1] += a
	n2.d[1] += rv
	n2.d[0] -= a
	n3.d[2] = 1
	var l [4]d2val
	l[0].v = 1
	l[1].quo(&n1, &P)
	l[2].quo(&n2, &P)
	l[3].quo(&n3, &r)

	// f, s and the denominator Σ = r⁴ + a²z².
	var S, nf, f d2val
	S.v = r2*r2 + a2*X[2]*X[2]
	r3 := r2 * rv
	for i := 0; i < 3; i++ {
		S.d[i] = 4 * r3 * r.d[i]
		for j := i; j < 3; j++ {
			v := 12*r2*r.d[i]*r.d[j] + 4*r3*r.h[i][j]
			S.h[i][j], S.h[j][i] = v, v
		}
	}
	S.d[2] += 2 * a2 * X[2]
	S.h[2][2] += 2 * a2
	nf.poly(&r, 2*k.M, -k.Q*k.Q)
	f.quo(&nf, &S)

	// Metric: h_μν = f l_μ l_ν; B_iν = ½ ∂_i f l_ν + f ∂_i l_ν.
	var B [3][4]float64
	var dB [3][3][4]float64 // ∂_j B_iν as [i][j][ν]
	for i := 0; i < 3; i++ {
		for n := 0; n < 4; n++ {
			B[i][n] = 0.5*f.d[i]*l[n].v + f.v*l[n].d[i]
			for j := 0; j < 3; j++ {
				dB[i][j][n] = 0.5*(f.h[i][j]*l[n].v+f.d[i]*l[n].d[j]) + f.d[j]*l[n].d[i] + f.v*l[n].h[i][j]
			}
		}
	}
	for m := 0; m < 4; m++ {
		for n := m; n < 4; n++ {
			v := f.v * l[m].v * l[n].v
			if m == n {
				v += eta[m]
			}
			d.g[m][n], d.g[n][m] = v, v
			for i := 0; i < 3; i++ {
				for j := i; j < 3; j++ {
					v := l[m].d[j]*B[i][n] + B[i][m]*l[n].d[j] + l[m].v*dB[i][j][n] + dB[i][j][m]*l[n].v
					d.d2[i+1][j+1][m][n], d.d2[i+1][j+1][n][m] = v, v
					d.d2[j+1][i+1][m][n], d.d2[j+1][i+1][n][m] = v, v
				}
			}
		}
	}
	d.hinv, d.glReady = true, true

	// Christoffel symbols.
	var Bf, anti [4][4]float64
	for i := 0; i < 3; i++ {
		Bf[i+1] = B[i]
	}
	var lv, lu, wv [4]float64
	for m := 0; m < 4; m++ {
		lv[m] = l[m].v
		lu[m] = eta[m] * lv[m]
	}
	for a := 0; a < 4; a++ {
		for n := 0; n < 4; n++ {
			anti[a][n] = Bf[a][n] - Bf[n][a]
		}
		wv[a] = anti[a][0]*lu[0] + anti[a][1]*lu[1] + anti[a][2]*lu[2] + anti[a][3]*lu[3]
	}
	for _, ab := range symPairs {
		a, b := ab[0], ab[1]
		sym := Bf[a][b] + Bf[b][a]
		lw := 0.5 * f.v * (lv[b]*wv[a] + lv[a]*wv[b])
		for n := 0; n < 4; n++ {
			v := 0.5 * (lv[n]*sym + lv[b]*anti[a][n] + lv[a]*anti[b][n])
			gl[n][a][b], gl[n][b][a] = v, v
		}
		for m := 0; m < 4; m++ {
			v := eta[m]*gl[m][a][b] - lu[m]*lw
			G[m][a][b], G[m][b][a] = v, v
		}
	}

	// Potential A_ν = s l_ν.
	d.uncharged = k.Q == 0
	if d.uncharged {
		return
	}
	var ns, s d2val
	ns.poly(&r, -k.Q, 0)
	s.quo(&ns, &S)
	for n := 0; n < 4; n++ {
		d.a[n] = s.v * l[n].v
		for i := 0; i < 3; i++ {
			d.da[i+1][n] = s.d[i]*l[n].v + s.v*l[n].d[i]
			for j := 0; j < 3; j++ {
				d.d2a[i+1][j+1][n] = s.h[i][j]*l[n].v + s.d[i]*l[n].d[j] + s.d[j]*l[n].d[i] + s.v*l[n].h[i][j]
			}
		}
	}
}
