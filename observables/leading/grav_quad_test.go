package leading

import (
	"math"
	"math/cmplx"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/num/dual"

	"ricochet/background/vec"
)

// This file holds an independent first-order evaluator used by the tests:
// the force of a linearized metric h_μν (or of a flat-space electromagnetic
// field) integrated along the straight line by Gauss–Legendre quadrature
// (gonum integrate/quad) on the mapped infinite interval
//
//	τ = T tan ϑ,  ϑ ∈ (−π/2, π/2),
//
// split into equal panels. Metric derivatives are exact (gonum num/dual),
// not finite differences.

// gravMetric returns the lower-index metric perturbation h_μν at the static
// spatial point x, in dual arithmetic so that one derivative is carried.
type gravMetric func(x [3]dual.Number) [4][4]dual.Number

// gravQuadRule is the panel rule of the quadrature.
type gravQuadRule struct {
	panels, nodes int
}

// gravQuadDefault resolves structure down to ~T/50 near closest approach;
// doubling it changes the results of the tests below by < 1e-12 relative
// (checked in TestGravQuadConverged).
var gravQuadDefault = gravQuadRule{panels: 96, nodes: 24}

// gravLine integrates the vector integrand f(τ) over τ ∈ (−∞, ∞) with the
// map τ = T tan ϑ.
func gravLine(f func(tau float64) vec.Vec4, T float64, rule gravQuadRule) vec.Vec4 {
	x := make([]float64, rule.nodes)
	w := make([]float64, rule.nodes)
	var sum vec.Vec4
	h := math.Pi / float64(rule.panels)
	for k := 0; k < rule.panels; k++ {
		lo := -math.Pi/2 + float64(k)*h
		quad.Legendre{}.FixedLocations(x, w, lo, lo+h)
		for i, th := range x {
			c := math.Cos(th)
			tau := T * math.Tan(th)
			jac := T / (c * c)
			sum = sum.Add(f(tau).Scale(w[i] * jac))
		}
	}
	return sum
}

// gravDerivs returns h_αβ and ∂_k h_αβ (k = 1, 2, 3; ∂_t h = 0) at x.
func gravDerivs(h gravMetric, x vec.Vec3) (h0 [4][4]float64, dh [4][4][4]float64) {
	for k := 1; k <= 3; k++ {
		var xd [3]dual.Number
		for i := range xd {
			xd[i].Real = x[i]
		}
		xd[k-1].Emag = 1
		hk := h(xd)
		for a := 0; a < 4; a++ {
			for b := 0; b < 4; b++ {
				h0[a][b] = hk[a][b].Real
				dh[k][a][b] = hk[a][b].Emag
			}
		}
	}
	return h0, dh
}

// gravQuadImpulse returns the first-order impulse of a probe of mass m on
// the line x(τ) = b + u τ (b⁰ = 0) in the static linearized metric h,
//
//	Δp^μ = −m ∫ dτ Γ^μ_αβ u^α u^β,
//	Γ^μ_αβ = ½ η^μν (∂_α h_νβ + ∂_β h_να − ∂_ν h_αβ),
//
// the geodesic equation to first order (textbook; e.g. Weinberg 1972,
// "Gravitation and Cosmology", Ch. 10, from memory).
func gravQuadImpulse(h gravMetric, m float64, u, b vec.Vec4, rule gravQuadRule) vec.Vec4 {
	uv := u.Spatial()
	T := math.Sqrt(b.Dot(b)) / uv.Norm()
	f := func(tau float64) vec.Vec4 {
		x := b.Spatial().Add(uv.Scale(tau))
		_, dh := gravDerivs(h, x)
		var acc vec.Vec4
		for nu := 0; nu < 4; nu++ {
			s := 0.0
			for k := 1; k <= 3; k++ {
				for be := 0; be < 4; be++ {
					s += u[k] * dh[k][nu][be] * u[be]
				}
			}
			if nu > 0 {
				for al := 0; al < 4; al++ {
					for be := 0; be < 4; be++ {
						s -= 0.5 * dh[nu][al][be] * u[al] * u[be]
					}
				}
			}
			acc[nu] = -m * vec.Eta[nu] * s
		}
		return acc
	}
	return gravLine(f, T, rule)
}

// Dual-number helpers.

func dc(c float64) dual.Number                    { return dual.Number{Real: c} }
func dadd(x, y dual.Number) dual.Number           { return dual.Add(x, y) }
func dsub(x, y dual.Number) dual.Number           { return dual.Sub(x, y) }
func dmul(x, y dual.Number) dual.Number           { return dual.Mul(x, y) }
func ddiv(x, y dual.Number) dual.Number           { return dual.Mul(x, dual.Inv(y)) }
func dscale(c float64, x dual.Number) dual.Number { return dual.Scale(c, x) }

func ddot(x [3]dual.Number, a vec.Vec3) dual.Number {
	return dadd(dadd(dscale(a[0], x[0]), dscale(a[1], x[1])), dscale(a[2], x[2]))
}

func dnorm2(x [3]dual.Number) dual.Number {
	return dadd(dadd(dmul(x[0], x[0]), dmul(x[1], x[1])), dmul(x[2], x[2]))
}

// gravKerrKS returns the linearized Kerr metric in Kerr–Schild form with
// spin vector a of any orientation,
//
//	h_μν = f l_μ l_ν,   f = 2M r³/(r⁴ + (a·x)²),
//	l = (1, [r x − a × x + (a·x) a / r]/(r² + a²)),
//	r⁴ − (x² − a²) r² − (a·x)² = 0,
//
// exact in M (the Kerr–Schild metric is linear in M; Kerr & Schild 1965;
// Cartesian form as in Visser 2007, arXiv:0706.0622, Eq. (1.1)-(1.4), from
// memory), written rotation-covariantly; for a = a ẑ it is
// l = (1, (rx + ay)/(r² + a²), (ry − ax)/(r² + a²), z/r), whose far-field
// h_{0i} = −2M (a × x)_i/r³ is the Lense–Thirring field of angular
// momentum J = M a.
func gravKerrKS(M float64, a vec.Vec3) gravMetric {
	a2 := a.Dot(a)
	return func(x [3]dual.Number) [4][4]dual.Number {
		ax := ddot(x, a)
		q := dsub(dnorm2(x), dc(a2))
		r2 := dscale(0.5, dadd(q, dual.Sqrt(dadd(dmul(q, q), dscale(4, dmul(ax, ax))))))
		r := dual.Sqrt(r2)
		r3 := dmul(r2, r)
		f := ddiv(dscale(2*M, r3), dadd(dmul(r2, r2), dmul(ax, ax)))
		// a × x
		axx := [3]dual.Number{
			dsub(dscale(a[1], x[2]), dscale(a[2], x[1])),
			dsub(dscale(a[2], x[0]), dscale(a[0], x[2])),
			dsub(dscale(a[0], x[1]), dscale(a[1], x[0])),
		}
		den := dadd(r2, dc(a2))
		axr := ddiv(ax, r)
		l := [4]dual.Number{dc(1)}
		for i := 0; i < 3; i++ {
			n := dadd(dsub(dmul(r, x[i]), axx[i]), dscale(a[i], axr))
			l[i+1] = ddiv(n, den)
		}
		var h [4][4]dual.Number
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				h[m][n] = dmul(f, dmul(l[m], l[n]))
			}
		}
		return h
	}
}

// gravNUT returns the first-order (in N) NUT part of the Taub–NUT metric,
//
//	h_{0i} dx^i = −2N (cos θ + C) dφ
//	            = −2N (n·x/r + C) (n × x)·dx / (r² − (n·x)²),
//
// with polar axis n (unit vector), the linearization of g_tφ = −f χ,
// χ = −2N(cos θ + C), of the Taub–NUT metric in the Griffiths–Podolský
// form (Griffiths & Podolský 2009, Sec. 12.1, from memory). C fixes the
// Misner string: C = 0 puts it on both half-axes, C = −1 on the half-axis
// opposite to n only, C = +1 on the half-axis along n only.
func gravNUT(N, C float64, n vec.Vec3) gravMetric {
	return func(x [3]dual.Number) [4][4]dual.Number {
		r := dual.Sqrt(dnorm2(x))
		nx := ddot(x, n)
		rho2 := dsub(dnorm2(x), dmul(nx, nx))
		pre := ddiv(dscale(-2*N, dadd(ddiv(nx, r), dc(C))), rho2)
		nxx := [3]dual.Number{
			dsub(dscale(n[1], x[2]), dscale(n[2], x[1])),
			dsub(dscale(n[2], x[0]), dscale(n[0], x[2])),
			dsub(dscale(n[0], x[1]), dscale(n[1], x[0])),
		}
		var h [4][4]dual.Number
		for i := 0; i < 3; i++ {
			h[0][i+1] = dmul(pre, nxx[i])
			h[i+1][0] = h[0][i+1]
		}
		return h
	}
}

// gravSum returns the sum of metric perturbations.
func gravSum(hs ...gravMetric) gravMetric {
	return func(x [3]dual.Number) [4][4]dual.Number {
		var h [4][4]dual.Number
		for _, f := range hs {
			g := f(x)
			for m := 0; m < 4; m++ {
				for n := 0; n < 4; n++ {
					h[m][n] = dadd(h[m][n], g[m][n])
				}
			}
		}
		return h
	}
}

// emQuadImpulse returns the first-order impulse of a probe with charges
// (q, g) on the line x(t) = b + v t in the static root-Kerr (Kerr–Newman at
// G → 0) field of a source with charges (Q, P) and spin a,
//
//	F = E + iB = (Q + iP) (x − ia)/[(x − ia)²]^{3/2}   (Newman & Janis 1965, from memory),
//	dp/dt = q(E + v × B) + g(B − v × E),  dp⁰/dt = (qE + gB)·v,
//
// the Lorentz force on a dyon in Gaussian units (Jackson 1999, Sec. 6.12,
// from memory), integrated in coordinate time.
func emQuadImpulse(q, g, Q, P float64, a vec.Vec3, u, b vec.Vec4, rule gravQuadRule) vec.Vec4 {
	v := u.Spatial().Scale(1 / u[0])
	T := math.Sqrt(b.Dot(b)) / v.Norm()
	ca := a.Lift()
	f := func(t float64) vec.Vec4 {
		x := b.Spatial().Add(v.Scale(t)).Lift()
		y := x.Sub(ca.Scale(1i))
		s := cmplx.Sqrt(y.Dot(y))
		F := y.Scale(complex(Q, P) / (s * s * s))
		E, B := F.Real(), F.Imag()
		force := E.Add(v.Cross(B)).Scale(q).Add(B.Sub(v.Cross(E)).Scale(g))
		return vec.FromSpatial(E.Scale(q).Add(B.Scale(g)).Dot(v), force)
	}
	return gravLine(f, T, rule)
}

// gravKTNNut returns the part linear in N of the Kerr–Taub–NUT metric at
// M = 0, exact in the spin a (along +z), written in Cartesian coordinates.
// Starting from the Griffiths–Podolský form (Griffiths & Podolský 2009,
// Sec. 12.1, from memory)
//
//	g = −(Δ/ρ²) T⊗T + ρ² (dr⊗dr/Δ + dθ⊗dθ) + (sin²θ/ρ²) S⊗S,
//	T = dt − χ dφ,  S = a dt − R dφ,
//	χ = a sin²θ − 2N(cos θ + C),  ρ² = r² + (N + a cos θ)²,
//	Δ = r² − 2Mr + a² − N²,       R = r² + a² + N² − 2aNC,
//
// at M = 0 and first order in N, δρ² = 2Na cos θ, δχ = −2N(cos θ + C),
// δR = −2aNC, δΔ = 0, so
//
//	h = (Δ δρ²/ρ⁴) T⊗T + (Δ δχ/ρ²)(T⊗dφ + dφ⊗T) + δρ² (dr⊗dr/Δ + dθ⊗dθ)
//	    − (sin²θ δρ²/ρ⁴) S⊗S − (sin²θ δR/ρ²)(S⊗dφ + dφ⊗S),
//
// with every background quantity at M = N = 0, where (r, θ, φ) are flat
// oblate spheroidal coordinates: x + iy = √(r² + a²) sin θ e^{iφ},
// z = r cos θ. A change of C is the coordinate change t → t + 2NCφ.
func gravKTNNut(N, C, a float64) gravMetric {
	a2 := a * a
	return func(x [3]dual.Number) [4][4]dual.Number {
		X2 := dnorm2(x)
		z := x[2]
		q := dsub(X2, dc(a2))
		az := dscale(a, z)
		r2 := dscale(0.5, dadd(q, dual.Sqrt(dadd(dmul(q, q), dscale(4, dmul(az, az))))))
		r := dual.Sqrt(r2)
		c := ddiv(z, r)
		s2 := dsub(dc(1), dmul(c, c))
		s := dual.Sqrt(s2)
		rho2 := dadd(r2, dscale(a2, dmul(c, c)))
		Delta := dadd(r2, dc(a2))
		R := Delta
		chi := dscale(a, s2)

		// One-forms as Cartesian components (t, x, y, z).
		cyl2 := dadd(dmul(x[0], x[0]), dmul(x[1], x[1]))
		dphi := [4]dual.Number{dc(0), ddiv(dscale(-1, x[1]), cyl2), ddiv(x[0], cyl2), dc(0)}
		drDen := dmul(r, dadd(dsub(dscale(2, r2), X2), dc(a2)))
		dr := [4]dual.Number{dc(0), ddiv(dmul(r2, x[0]), drDen), ddiv(dmul(r2, x[1]), drDen), ddiv(dmul(Delta, z), drDen)}
		// dθ = −d(cos θ)/sin θ, d(cos θ) = dz/r − z dr/r².
		var dth [4]dual.Number
		for i := 1; i < 4; i++ {
			dcos := dscale(-1, ddiv(dmul(z, dr[i]), r2))
			if i == 3 {
				dcos = dadd(dcos, ddiv(dc(1), r))
			}
			dth[i] = dscale(-1, ddiv(dcos, s))
		}
		dth[0] = dc(0)
		var T, S [4]dual.Number
		for i := 0; i < 4; i++ {
			T[i] = dscale(-1, dmul(chi, dphi[i]))
			S[i] = dscale(-1, dmul(R, dphi[i]))
		}
		T[0] = dadd(T[0], dc(1))
		S[0] = dadd(S[0], dc(a))

		drho2 := dscale(2*N*a, c)
		dchi := dscale(-2*N, dadd(c, dc(C)))
		dR := dc(-2 * a * N * C)
		rho4 := dmul(rho2, rho2)
		kTT := ddiv(dmul(Delta, drho2), rho4)
		kTphi := ddiv(dmul(Delta, dchi), rho2)
		krr := ddiv(drho2, Delta)
		kSS := dscale(-1, ddiv(dmul(s2, drho2), rho4))
		kSphi := dscale(-1, ddiv(dmul(s2, dR), rho2))
		var h [4][4]dual.Number
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				v := dmul(kTT, dmul(T[m], T[n]))
				v = dadd(v, dmul(kTphi, dadd(dmul(T[m], dphi[n]), dmul(dphi[m], T[n]))))
				v = dadd(v, dmul(krr, dmul(dr[m], dr[n])))
				v = dadd(v, dmul(drho2, dmul(dth[m], dth[n])))
				v = dadd(v, dmul(kSS, dmul(S[m], S[n])))
				v = dadd(v, dmul(kSphi, dadd(dmul(S[m], dphi[n]), dmul(dphi[m], S[n]))))
				h[m][n] = v
			}
		}
		return h
	}
}
