package integrate

import (
	"math"
	"math/cmplx"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// KerrProbe is the all-multipole Kerr probe in a Kerr–Newman or
// Kerr–Newman–Taub–NUT background:
// a spinning test black hole of mass M and spin vector a^μ (a·p = 0)
// whose spin couples to the background at linear order in the curvature
// and to all orders in the spin, the gravitational counterpart of
// RootKerr.
//
// Coupling. At first order in G the impulse on a test black hole of spin
// a₁ passing a Kerr source of spin a₂ is that of a spinless body passing a
// Kerr source of spin a₁ + a₂, and its spin kick is the rotation generated
// by the derivative of the 1PM eikonal with respect to a₁ (Vines 2017,
// Class. Quantum Grav. 35, 084002, arXiv:1709.06016, from memory; the
// closed forms are observables/leading.SpinImpulse1PM). The probe here is
// built on that statement at the level of the equations of motion: with
// the linearized Kerr metric h_μν(x; A) = f l_μ l_ν of mass M_bg and spin
// vector A in Kerr–Schild form (f = 2M_bg r³/(r⁴ + (A·x)²), l the
// Kerr–Schild null covector, r the Boyer–Lindquist radius of A; the
// general-direction form is kerrSchildSpin), the spatial spin part
// A = a₂ + a⃗₁ (a⃗₁ the spatial part of the probe's spin in the
// background's rest frame; its time part is along the source's
// four-velocity and drops out of the transverse projection that the 1PM
// results depend on), u = p/M and the interaction
//
//	L(x, u; A) = (M/2) h_μν(x; A) u^μ u^ν,
//
// the probe obeys
//
//	dx^μ/dτ = p^μ/M,
//	Dp^μ/dτ = f_⊥^μ,                       f_⊥ = f + p (f·p)/𝓜²,
//	Da^μ/dτ = u^μ (f_⊥·a)/M − f_⊥^μ (u·a)/M + (1/M) ε^μ_{νρσ} u^ν 𝒢^ρ a^σ,
//
// with D/dτ the covariant derivative of the full background metric (so
// a₁ = 0 is exactly the geodesic with parallel-transported spin), the
// spin force
//
//	f^μ = −M η^{μν} [Γ^{lin}_{ναβ}(A) − Γ^{lin}_{ναβ}(a₂)] u^α u^β
//
// (the linear Christoffel symbols of h(A) and of the background's own
// linearized metric h(a₂)), and the spin generator 𝒢 = (0, ∂L/∂A|_{a₂ + a⃗₁}
// − ∂L/∂A|_{a₂}). The difference of the two spins in 𝒢 and f is what the
// parallel transport and the geodesic force of the background do not
// already contain. Since f_⊥·p = 0 and the spin law is a Lorentz
// generator applied to a, the mass 𝓜 = √(−p·p), a·p and a·a are exact
// constants.
//
// First order. On the straight line, ∫f dτ is the a₁-dependent part of
// the impulse of a spinless probe off a Kerr source of spin a₂ + a⃗₁, and
// ∫𝒢 dτ the a₁-derivative of its eikonal χ = ∫L dτ; the parallel
// transport supplies the rotation by ∂χ/∂a₁ at a₁ = 0 (see
// observables/leading: the pole–dipole spin kick). So the first-order
// impulse and spin kick are those of SpinImpulse1PM for KerrBody, exact in
// both spins (TestKerrProbeFirstOrder), and their O(a₁) and O(a₁²) parts
// those of Dixon without and with C_ES² = 1 (TestKerrProbeTruncations).
//
// What is a choice. The force and generator are line densities in the
// Kerr–Schild gauge: a change of gauge moves them by total derivatives
// along the line, which leaves the first-order impulse and spin kick
// unchanged but not the worldline at O(ε), so the second-order
// coefficients of this model are those of its completion, not physical
// predictions. They differ from those of Dixon (Tulczyjew) already at
// O(a₁): the Kerr–Schild force density linear in a₁ differs from the
// covariant −½R(u, S) by a total derivative along the line (the Tulczyjew
// velocity differs from p/m only at O(S²)). KerrDixon removes that
// difference; it, and Dixon with and without the quadrupole, are the other
// members of the spread. The energy
//
//	E = −p_t − M [f w]_δ + (p⁰/2) [f w²]_δ,   w = l_μ u^μ,
//
// with [·]_δ the difference between spin A and a₂ (off a NUT background
// also − N p⁰ [U]_δ of nutSpin), is conserved to first order in the
// coupling only (EnergyExact is false), the total angular momentum is not
// monitored.
//
// NUT parameter. Off a Kerr–Newman–Taub–NUT background of mass M and NUT
// parameter N the first-order coupling depends on the background through
// M − iN (the mass–NUT duality: a duality rotation of the linearized
// curvature, R → cos θ R + sin θ *R, multiplies its self-dual part by a
// phase), so that the first-order impulse and spin kick are Re and Im of
// (M − iN) times the unit-mass complex impulse (leading.SpinImpulse1PM).
// With f₁, 𝒢₁ the Kerr–Schild densities above at unit background mass,
// the probe takes
//
//	f = M [f₁]_δ + N [f_N]_δ,   𝒢 = M [𝒢₁]_δ − N [f⃗₁]_δ,
//
// ([·]_δ the difference between spin A and a₂). The NUT force f_N is
// that of the linearized Kerr–Taub–NUT field of unit NUT parameter and
// spin A in harmonic gauge (nutSpin: gravitoelectric potential Im φ,
// gravitomagnetic scalar −Re φ of the Newman–Janis potential
// φ = [(x − iA)²]^{−1/2}), string-free and with the local first-order
// energy p⁰(1 − U); its line integral is N Im of the unit-mass complex
// impulse. The NUT generator −N[f⃗₁]_δ integrates to the generator of the
// rotated phase, −N Re of it: Im[(M − iN)K] = M Im K − N Re K. So the
// first order is that of SpinImpulse1PM with the mass–NUT phase, exact in
// both spins (TestKerrProbeFirstOrder), and its O(a₁) part that of Dixon
// in the same background (TestKerrProbeTruncations). The densities of the
// NUT part are a choice in the same way as the Kerr–Schild ones (here a
// different gauge for the force and the generator), so beyond first order
// the NUT completion is a choice too. A NUT charge n of the probe enters
// the first order only through (m + in)(M − iN); the scenarios integrate
// it as the NUT-free probe in the background rotated to
// M′ − iN′ = (m + in)(M − iN)/m, as for Dixon.
//
// Domain. The background must be a KerrNewman, DyonicKerrNewman or
// KerrNewmanNUT metric (KerrBackground; its charges enter the geodesic part
// only; the spin coupling is that of a neutral probe, which feels the
// charges at second order). The Misner string of a NUT background lies on
// its axis (string gauge of the metric), which the path must avoid; the
// spin coupling has no string. The probe's coupling is singular on the
// disk of radius |A| normal to A; crossing it is reported as
// StatusCrossedDisk.
type KerrProbe struct {
	// Metric is the background: spacetime.KerrNewman, DyonicKerrNewman
	// or KerrNewmanNUT (spin along +z; see KerrBackground).
	Metric spacetime.Metric
	M      float64 // probe mass
	// Linear selects the first-order geometry of the background (the
	// geodesic part; the spin coupling is linear in any case).
	Linear bool

	geo    bodyGeometry
	hazard *Geodesic // the background's own hazard checks
}

// Name implements Model.
func (k *KerrProbe) Name() string { return kerrProbeName("kerr-probe", k.Metric, k.Linear) }

// kerrProbeName names a Kerr-probe model in metric m.
func kerrProbeName(kind string, m spacetime.Metric, linear bool) string {
	s := kind + " in " + m.Name()
	if linear {
		s += " (linearized)"
	}
	return s
}

// Dim implements Model.
func (k *KerrProbe) Dim() int { return 12 }

// Mass implements Model.
func (k *KerrProbe) Mass() float64 { return k.M }

// VelocityIsMomentum marks dx/dτ = p/M (see momentumVelocity).
func (k *KerrProbe) VelocityIsMomentum() {}

func (k *KerrProbe) local(y []float64) *bodyLocal {
	return k.geo.atOrder(k.metric(), k.Linear, nil, 0, 0, event(y), 1)
}

// metric returns the background metric.
func (k *KerrProbe) metric() spacetime.Metric { return k.Metric }

// KerrBackground returns the mass M, NUT parameter N and spin parameter a
// (spin along +z) of a background the Kerr probes accept (KerrNewman,
// DyonicKerrNewman, KerrNewmanNUT), and false for any other metric.
func KerrBackground(m spacetime.Metric) (M, N, a float64, ok bool) {
	switch k := m.(type) {
	case spacetime.KerrNewman:
		return k.M, 0, k.A, true
	case spacetime.DyonicKerrNewman:
		return k.M, 0, k.A, true
	case spacetime.KerrNewmanNUT:
		return k.M, k.N, k.A, true
	}
	return 0, 0, 0, false
}

// background returns KerrBackground of the metric; it panics for a metric
// the probe does not accept (a programmer error: the scenarios build only
// accepted ones).
func (k *KerrProbe) background() (M, N, a float64) {
	M, N, a, ok := KerrBackground(k.Metric)
	if !ok {
		panic("integrate: Kerr probe in a background without Kerr–Taub–NUT spin coupling: " + k.Metric.Name())
	}
	return M, N, a
}

// Deriv implements Model.
func (k *KerrProbe) Deriv(y, dy []float64) { k.rhs(y, dy, false) }

// LinearDeriv writes the first-order part of Deriv (for the straight-line
// quadratures): every contraction of the spin terms with η and 𝓜 = M.
func (k *KerrProbe) LinearDeriv(y, dy []float64) { k.rhs(y, dy, true) }

func (k *KerrProbe) rhs(y, dy []float64, linear bool) {
	l := k.local(y)
	var p, a, u [4]float64
	for i := 0; i < 4; i++ {
		p[i], a[i] = y[IP+i], y[IA+i]
		u[i] = p[i] / k.M
	}
	for mu := 0; mu < 4; mu++ {
		G := &l.gam[mu]
		var gp, ga float64
		for al := 0; al < 4; al++ {
			gp += u[al] * (G[al][0]*p[0] + G[al][1]*p[1] + G[al][2]*p[2] + G[al][3]*p[3])
			ga += u[al] * (G[al][0]*a[0] + G[al][1]*a[1] + G[al][2]*a[2] + G[al][3]*a[3])
		}
		dy[IX+mu] = u[mu]
		dy[IP+mu] = -gp
		dy[IA+mu] = -ga
	}
	x := vec.Vec3{y[IX+1], y[IX+2], y[IX+3]}
	a1 := vec.Vec3{a[1], a[2], a[3]}
	if a1 == (vec.Vec3{}) {
		return
	}
	f, gen := k.coupling(x, u, a1)
	g, gi, sg := &l.g, &l.gi, l.sqrtg
	M2 := -dotG(g, p, p)
	if linear {
		g, gi, sg = &etaDiag, &etaDiag, 1
		M2 = k.M * k.M
	}
	fp := dotG(g, f, p) / M2
	for mu := 0; mu < 4; mu++ {
		f[mu] += p[mu] * fp
	}
	fa, ua := dotG(g, f, a), dotG(g, u, a)
	// ε_κ νρσ u^ν 𝒢^ρ a^σ with ε_{0123} = √−g, raised with g^{μκ}.
	var el [4]float64
	for _, pm := range perms4 {
		i := pm.i
		el[i[0]] += pm.sign * u[i[1]] * gen[i[2]] * a[i[3]]
	}
	for mu := 0; mu < 4; mu++ {
		rot := sg * (gi[mu][0]*el[0] + gi[mu][1]*el[1] + gi[mu][2]*el[2] + gi[mu][3]*el[3])
		dy[IP+mu] += f[mu]
		dy[IA+mu] += (u[mu]*fa - f[mu]*ua + rot) / k.M
	}
}

func dotG(g *[4][4]float64, x, y [4]float64) float64 {
	xl := lowerVec(g, x)
	return xl[0]*y[0] + xl[1]*y[1] + xl[2]*y[2] + xl[3]*y[3]
}

// coupling returns the spin force f^μ (η-raised) and the spin generator
// 𝒢^μ = (0, ∂L/∂A|_{a₂+a⃗₁} − ∂L/∂A|_{a₂}) at x for four-velocity u, with
// the NUT parts of nutCoupling.
func (k *KerrProbe) coupling(x vec.Vec3, u [4]float64, a1 vec.Vec3) (f, gen [4]float64) {
	M, N, a := k.background()
	a2 := vec.Vec3{0, 0, a}
	var s1, s0 kerrSchildSpin
	s1.at(x, cspin(a2.Add(a1), vec.Vec3{}, 0), 1)
	s0.at(x, cspin(a2, vec.Vec3{}, 0), 1)
	f1, g1 := s1.force(u, k.M)
	f0, g0 := s0.force(u, k.M)
	for mu := 0; mu < 4; mu++ {
		f[mu] = M * real(f1[mu]-f0[mu])
	}
	for j := 0; j < 3; j++ {
		gen[j+1] = M * real(g1[j]-g0[j])
	}
	if N == 0 {
		return f, gen
	}
	var n1, n0 nutSpin
	n1.at(x, a2.Add(a1), vec.Vec3{}, false)
	n0.at(x, a2, vec.Vec3{}, false)
	h1, h0 := n1.force(u, k.M), n0.force(u, k.M)
	for j := 1; j < 4; j++ {
		f[j] += N * (h1[j] - h0[j])
		gen[j] -= N * real(f1[j]-f0[j])
	}
	return f, gen
}

// nutSpin is the NUT part of the linearized Kerr–Taub–NUT field of unit
// NUT parameter and spin vector A (any direction) in harmonic gauge,
// given by its gauge-invariant potentials: the gravitoelectric potential
// U and the gravitomagnetic scalar V (∇ × h_0· = 2∇V, string-free), for
// a background metric h_00 = 2U, h_ij = 2U δ_ij, h_0i = w_i.
//
// Mass–NUT duality. In the harmonic gauge of the linearized Kerr metric
// (Vines 2017, from memory) the mass part is h_00 = 2 Re(Mφ),
// ∇ × h_0· = 2∇ Im(Mφ) with the complex Newman–Janis potential
// φ = [(x − iA)·(x − iA)]^{−1/2} (the branch → 1/|x| at infinity; Newman &
// Janis 1965); the NUT parameter enters as the complex mass M − iN (the
// duality rotation of the linearized curvature, R → cos θ R + sin θ *R,
// multiplies its self-dual part by a phase). Hence for unit N
//
//	U = Im φ,   V = −Re φ,
//
// which reproduce the KerrNewmanNUT metric's gauge-invariant h_00 =
// 2(M r + N a cos θ)/(r² + a² cos²θ) for A = a ẑ and, at A = 0, the
// monopole ∇ × h = 2N x̂/r² of Taub–NUT (see leading.GravSource). With
// φ± = φ(z±), z± = x ∓ iA and ∇φ(z) = −z φ³, U = (φ₊ − φ₋)/2i and
// V = −(φ₊ + φ₋)/2; the derivatives along a direction d of A (for
// KerrDixon, which removes the part linear in the probe spin) follow from
// dz± = ∓i d: dφ = −(z·dz)φ³, d(∇φ) = −dz φ³ + 3z(z·dz)φ⁵. (A complex
// step in A, as for kerrSchildSpin, would put the step into the real part
// of z and lose it.)
type nutSpin struct {
	u      float64    // U (or its derivative along d)
	du, dv [3]float64 // ∇U, ∇V (or their derivatives along d)
}

// at sets the potentials at x for the spin A; with deriv set, their
// derivatives in A along d instead.
func (s *nutSpin) at(xr, A, d vec.Vec3, deriv bool) {
	var phi, dphi [2]complex128
	var g, dg [2][3]complex128
	for k, sg := range [2]complex128{-1i, 1i} { // z = x − iA, x + iA
		var z, dz [3]complex128
		for i := 0; i < 3; i++ {
			z[i] = complex(xr[i], 0) + sg*complex(A[i], 0)
			dz[i] = sg * complex(d[i], 0)
		}
		zz := z[0]*z[0] + z[1]*z[1] + z[2]*z[2]
		q := cmplx.Sqrt(zz)
		p1 := 1 / q
		p3 := p1 / zz
		phi[k] = p1
		zd := z[0]*dz[0] + z[1]*dz[1] + z[2]*dz[2]
		dphi[k] = -zd * p3
		p5 := p3 / zz
		for i := 0; i < 3; i++ {
			g[k][i] = -z[i] * p3
			dg[k][i] = -dz[i]*p3 + 3*z[i]*zd*p5
		}
	}
	if deriv {
		phi, g = dphi, dg
	}
	s.u = real((phi[0] - phi[1]) / 2i)
	for i := 0; i < 3; i++ {
		s.du[i] = real((g[0][i] - g[1][i]) / 2i)
		s.dv[i] = -real(g[0][i]+g[1][i]) / 2
	}
}

// force returns the linear geodesic force of the field on a body of mass
// m and four-velocity u (η-raised, time component zero; the probe
// projects it orthogonal to p),
//
//	f⃗ = m[(u⁰² + |u⃗|²)∇U − 2u⃗(u⃗·∇U) + 2u⁰ u⃗ × ∇V],
//
// the spatial part of −m Γ^lin(u, u) for h_00 = 2U, h_ij = 2U δ_ij with
// the h_0i terms through their curl, m u⁰ u⃗ × (∇ × h_0·) (so no string
// enters). Its work rate is f⃗·u⃗ = m u⃗·∇U = m dU/dτ on the line: the
// energy p⁰(1 − U) is conserved to first order. Linear in the
// potentials, it gives the derivative of the force from their
// derivatives.
func (s *nutSpin) force(u [4]float64, m float64) (f [4]float64) {
	uu := u[1]*u[1] + u[2]*u[2] + u[3]*u[3]
	ud := u[1]*s.du[0] + u[2]*s.du[1] + u[3]*s.du[2]
	cx := [3]float64{u[2]*s.dv[2] - u[3]*s.dv[1], u[3]*s.dv[0] - u[1]*s.dv[2], u[1]*s.dv[1] - u[2]*s.dv[0]}
	for i := 0; i < 3; i++ {
		f[i+1] = m * ((u[0]*u[0]+uu)*s.du[i] - 2*u[i+1]*ud + 2*u[0]*cx[i])
	}
	return f
}

// kerrSchildSpin is the linearized Kerr metric h_μν = f l_μ l_ν of mass M
// and spin vector A of any direction in Kerr–Schild form, with its first
// derivatives in the position x and in A. With ρ² = x·x, a² = A·A and
// s = A·x, the radius r is the positive root of
//
//	r⁴ − (ρ² − a²) r² − s² = 0,
//
// and
//
//	f = 2M r³/(r⁴ + s²),   l_0 = 1,   l⃗ = (r x⃗ − A × x⃗ + s A/r)/(r² + a²)
//
// (for A = a ẑ the familiar Kerr–Schild form of KerrNewman at Q = 0:
// l⃗ = ((rx + ay), (ry − ax), (r² + a²)z/r)/(r² + a²); Kerr & Schild 1965,
// from memory). The derivatives follow by implicit differentiation:
//
//	∂r/∂x_k = 2(r² x_k + s A_k)/D,   ∂r/∂A_k = 2(s x_k − r² A_k)/D,
//	D = 2r(2r² − ρ² + a²).
type kerrSchildSpin struct {
	f   complex128
	df  [3]complex128    // ∂f/∂x_k
	dfA [3]complex128    // ∂f/∂A_k
	l   [4]complex128    // l_μ
	dl  [3][4]complex128 // ∂l_ν/∂x_k as [k][ν]
	dlA [3][4]complex128 // ∂l_ν/∂A_k as [k][ν]
}

// cspin returns the complex spin vector a + i h b (h = 0: a itself). The
// Kerr–Schild data are analytic in A, so that at A = a + i h b with h
// tiny, Im(·)/h is the derivative along b to rounding (complex-step
// differentiation; Squire & Trapp 1998, from memory).
func cspin(a, b vec.Vec3, h float64) (A [3]complex128) {
	for i := range A {
		A[i] = complex(a[i], h*b[i])
	}
	return A
}

func (s *kerrSchildSpin) at(xr vec.Vec3, A [3]complex128, M float64) {
	x := [3]complex128{complex(xr[0], 0), complex(xr[1], 0), complex(xr[2], 0)}
	dot := func(a, b [3]complex128) complex128 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }
	rho2 := dot(x, x)
	a2 := dot(A, A)
	sa := dot(A, x)
	w := rho2 - a2
	t := sa * sa
	d := cmplx.Sqrt(w*w + 4*t)
	var r2 complex128
	if real(w) >= 0 {
		r2 = 0.5 * (w + d)
	} else {
		r2 = 2 * t / (d - w)
	}
	r := cmplx.Sqrt(r2)
	D := 2 * r * (2*r2 - rho2 + a2)
	var dr, drA [3]complex128
	for k := 0; k < 3; k++ {
		dr[k] = 2 * (r2*x[k] + sa*A[k]) / D
		drA[k] = 2 * (sa*x[k] - r2*A[k]) / D
	}
	cM := complex(M, 0)
	sig := r2*r2 + t
	s.f = 2 * cM * r2 * r / sig
	for k := 0; k < 3; k++ {
		dsig := 4*r2*r*dr[k] + 2*sa*A[k]
		dsigA := 4*r2*r*drA[k] + 2*sa*x[k]
		s.df[k] = 2 * cM * (3*r2*dr[k]*sig - r2*r*dsig) / (sig * sig)
		s.dfA[k] = 2 * cM * (3*r2*drA[k]*sig - r2*r*dsigA) / (sig * sig)
	}
	P := r2 + a2
	iP := 1 / P
	Ax := [3]complex128{A[1]*x[2] - A[2]*x[1], A[2]*x[0] - A[0]*x[2], A[0]*x[1] - A[1]*x[0]}
	var N [3]complex128
	for i := 0; i < 3; i++ {
		N[i] = r*x[i] - Ax[i] + sa*A[i]/r
	}
	s.l = [4]complex128{1, N[0] * iP, N[1] * iP, N[2] * iP}
	for k := 0; k < 3; k++ {
		dP := 2 * r * dr[k]
		dPA := 2*r*drA[k] + 2*A[k]
		s.dl[k][0], s.dlA[k][0] = 0, 0
		for i := 0; i < 3; i++ {
			// ∂N_i/∂x_k and ∂N_i/∂A_k; (A × x)_i = ε_ilm A_l x_m.
			dN := dr[k]*x[i] + A[k]*A[i]/r - sa*A[i]*dr[k]/r2
			dNA := drA[k]*x[i] + x[k]*A[i]/r - sa*A[i]*drA[k]/r2
			if i == k {
				dN += r
				dNA += sa / r
			}
			// −∂(A × x)_i/∂x_k = −ε_ilk A_l, −∂(A × x)_i/∂A_k = −ε_ikm x_m.
			for m := 0; m < 3; m++ {
				dN -= complex(levi3x(i, m, k), 0) * A[m]
				dNA -= complex(levi3x(i, k, m), 0) * x[m]
			}
			s.dl[k][i+1] = dN*iP - N[i]*dP*iP*iP
			s.dlA[k][i+1] = dNA*iP - N[i]*dPA*iP*iP
		}
	}
}

// levi3x is the three-dimensional Levi-Civita symbol ε_ijk, ε_012 = 1.
func levi3x(i, j, k int) float64 {
	return float64((i - j) * (j - k) * (k - i) / 2)
}

// force returns, for four-velocity u and probe mass m, the linear geodesic
// force of h, f^μ = −m η^{μν} Γ^{lin}_{ναβ} u^α u^β, and the spin gradient
// ∂L/∂A_k of L = (m/2) h_μν u^μ u^ν. In the notation of
// KerrSchildPoint.Accel, −Γ_ν(u,u) = ½w²∂_νf + f w G_ν − (u·∂f) w l_ν −
// f (K·u) l_ν − f w K_ν with w = l·u, G_ν = ∂_ν l_β u^β,
// K_ν = u^α ∂_α l_ν.
func (s *kerrSchildSpin) force(ur [4]float64, m float64) (f [4]complex128, dA [3]complex128) {
	u := [4]complex128{complex(ur[0], 0), complex(ur[1], 0), complex(ur[2], 0), complex(ur[3], 0)}
	l := &s.l
	w := l[0]*u[0] + l[1]*u[1] + l[2]*u[2] + l[3]*u[3]
	var G, K [4]complex128
	var udf, Ku complex128
	for j := 0; j < 3; j++ {
		G[j+1] = s.dl[j][1]*u[1] + s.dl[j][2]*u[2] + s.dl[j][3]*u[3]
		udf += u[j+1] * s.df[j]
	}
	for nu := 0; nu < 4; nu++ {
		K[nu] = u[1]*s.dl[0][nu] + u[2]*s.dl[1][nu] + u[3]*s.dl[2][nu]
		Ku += K[nu] * u[nu]
	}
	F := s.f
	cm := complex(m, 0)
	for nu := 0; nu < 4; nu++ {
		var dfn complex128
		if nu > 0 {
			dfn = s.df[nu-1]
		}
		R := 0.5*w*w*dfn + F*w*G[nu] - udf*w*l[nu] - F*Ku*l[nu] - F*w*K[nu]
		f[nu] = cm * complex(vec.Eta[nu], 0) * R
	}
	for k := 0; k < 3; k++ {
		dw := s.dlA[k][1]*u[1] + s.dlA[k][2]*u[2] + s.dlA[k][3]*u[3]
		dA[k] = 0.5 * cm * (s.dfA[k]*w*w + 2*F*w*dw)
	}
	return f, dA
}

// energyTerms returns M f w and f w² for u (the Kerr–Schild parts of the
// energy, see KerrProbe).
func (s *kerrSchildSpin) energyTerms(ur [4]float64, m float64) (fw, fw2 complex128) {
	l := &s.l
	w := l[0]*complex(ur[0], 0) + l[1]*complex(ur[1], 0) + l[2]*complex(ur[2], 0) + l[3]*complex(ur[3], 0)
	return complex(m, 0) * s.f * w, s.f * w * w
}

// Energy implements Model (conserved to first order in the coupling).
func (k *KerrProbe) Energy(y []float64) float64 {
	l := k.local(y)
	var p, u [4]float64
	for i := 0; i < 4; i++ {
		p[i] = y[IP+i]
		u[i] = p[i] / k.M
	}
	E := -lowerVec(&l.g, p)[0]
	a1 := vec.Vec3{y[IA+1], y[IA+2], y[IA+3]}
	if a1 == (vec.Vec3{}) {
		return E
	}
	x := vec.Vec3{y[IX+1], y[IX+2], y[IX+3]}
	M, N, a := k.background()
	a2 := vec.Vec3{0, 0, a}
	var s1, s0 kerrSchildSpin
	s1.at(x, cspin(a2.Add(a1), vec.Vec3{}, 0), 1)
	s0.at(x, cspin(a2, vec.Vec3{}, 0), 1)
	h1, q1 := s1.energyTerms(u, k.M)
	h0, q0 := s0.energyTerms(u, k.M)
	E += M * (-real(h1-h0) + 0.5*p[0]*real(q1-q0))
	if N != 0 {
		var n1, n0 nutSpin
		n1.at(x, a2.Add(a1), vec.Vec3{}, false)
		n0.at(x, a2, vec.Vec3{}, false)
		E -= N * p[0] * (n1.u - n0.u)
	}
	return E
}

// EnergyExact implements Model: false (see the type's comment).
func (k *KerrProbe) EnergyExact() bool { return false }

// Normalize implements Model: p⁰ from the mass shell of the background
// metric, a⁰ from a·p = 0, a rescaled to a·a = a2.
func (k *KerrProbe) Normalize(y []float64, a2 float64) {
	l := k.local(y)
	massShellP0(&l.g, y, k.M)
	normalizeSpin(&l.g, y, a2)
}

// MassShell returns (g_μν p^μ p^ν + M²)/M² (see massShellModel).
func (k *KerrProbe) MassShell(y []float64) float64 {
	l := k.local(y)
	p := [4]float64{y[IP], y[IP+1], y[IP+2], y[IP+3]}
	return (dotG(&l.g, p, p) + k.M*k.M) / (k.M * k.M)
}

// SpinConstraints returns |a·p|/(M|a|) and a·a/a2 − 1 in the background
// metric.
func (k *KerrProbe) SpinConstraints(y []float64, a2 float64) (orth, norm float64) {
	l := k.local(y)
	p := [4]float64{y[IP], y[IP+1], y[IP+2], y[IP+3]}
	a := [4]float64{y[IA], y[IA+1], y[IA+2], y[IA+3]}
	aa := dotG(&l.g, a, a)
	orth = math.Abs(dotG(&l.g, a, p)) / (k.M * math.Sqrt(math.Abs(aa)))
	if a2 > 0 {
		norm = aa/a2 - 1
	}
	return orth, norm
}

// Hazard implements Model: the background's horizon, disk and ring, and
// the disk of the probe's coupling, radius |a₂ + a⃗₁| normal to a₂ + a⃗₁.
func (k *KerrProbe) Hazard(y0, y1 []float64) Status {
	if k.hazard == nil {
		k.hazard = &Geodesic{} // kept: a value built per call escapes to the heap
	}
	k.hazard.Metric = k.metric()
	if st := k.hazard.Hazard(y0, y1); st != StatusRunning {
		return st
	}
	_, _, a := k.background()
	A := vec.Vec3{0, 0, a}.Add(spatial(y0, IA))
	n := A.Norm()
	if n == 0 {
		return StatusRunning
	}
	d := em.Disk{Normal: A.Scale(1 / n), Radius: n}
	if d.Crosses(spatial(y0, IX), spatial(y1, IX)) {
		return StatusCrossedDisk
	}
	return StatusRunning
}

// ScaleCoupling implements CouplingScaler: the background's mass and
// charge scaled by λ (scaleMetric), its spin and the probe fixed; the
// spin coupling is linear in the background mass and scales with it.
func (k *KerrProbe) ScaleCoupling(lambda float64) Model {
	return &KerrProbe{Metric: scaleMetric(k.Metric, lambda), M: k.M, Linear: k.Linear}
}
