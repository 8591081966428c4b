package integrate

import (
	"math"
	"math/cmplx"

	"ricochet/background/em"
	"ricochet/background/vec"
)

// RootKerrBody is the all-multipole root-Kerr probe as a spinning body: a
// charge (Q, G) of mass M whose multipoles couple to a static flat-space
// field through one interaction function W of position, momentum and spin
// vector, with the force and torque that W defines and the Tulczyjew
// condition S^{μν}p_ν = 0. Its O(a) truncation is the Dixon body with
// g = 2 (Dixon with Gyro = 2) exactly; the package documentation ("The
// root-Kerr body") gives the derivation.
//
// Interaction. With 𝔽 the self-dual field (electric part 𝐅 = E + iB,
// charge-weighted by c = Q − iG), S^{μν} the spin tensor and â the shift
// vector it defines with the direction of p,
//
//	â^μ = −(1/(2M𝓜)) ε^μ_{νρσ} p^ν S^{ρσ} = (𝓜/M) a^μ,   𝓜 = √(−p·p),
//	W = −(1/M) ∫₀¹ Im[â^σ c𝔽_σρ(x − i s â) p^ρ] (M/𝓜) ds
//	  = −(1/M) ∫₀¹ Im[c𝐅(x⃗ − i s â⃗)·𝐍] ds,
//	𝐍 = p⁰ a⃗ − a⁰ p⃗ − i a⃗ × p⃗   (the self-dual part of S^{μν}),
//
// the magnetic-dipole coupling −μ·B of μ = Q a (Dixon's −(1/2M) S^{αβ}F_αβ
// at g = 2) spread uniformly over the imaginary segment from x to the
// Newman–Janis point x − i â (Newman & Janis 1965; the root-Kerr probe's
// coupling: Arkani-Hamed, Huang & O'Connell 2020, from memory). It is the
// gauge-invariant form, up to total τ-derivatives at fixed spin, of the
// shifted coupling u·Re 𝒜(x − i a), 𝒜 the self-dual potential, minus the
// monopole term u·A(x). At fixed S it depends on p only through its
// direction p/𝓜 (the shift is the spin over the constant mass parameter,
// the ring radius of the root-Kerr source); with that choice the mass
// function 𝓜 − W is conserved (derived in the package documentation and
// measured to rounding; with the shift a
// itself it drifts at second order in the coupling, i.e. the outgoing rest
// mass would differ from the incoming one).
//
// Equations (Dixon 1970 for a pole–dipole body, with the force and torque
// of a general interaction defined as its response to translations and
// Lorentz rotations, Dixon 1970 and Harte 2012, Class. Quantum Grav. 29,
// 055012, from memory):
//
//	dp^μ/dτ    = F^μ_ν u^ν − ∂^μ W,
//	dS^{μν}/dτ = p^μ u^ν − p^ν u^μ + T^{μν},
//	T^{μν}     = P^μ p^ν − P^ν p^μ + A^μ a^ν − A^ν a^μ,
//
// with P_μ = ∂W/∂p^μ and A_μ = ∂W/∂a^μ, and u from the Tulczyjew
// condition exactly as in Dixon. The torque is minus the change of W
// under a Lorentz rotation of its internal arguments, so that
// dJ^{μν}/dτ = x^μ ṗ^ν − x^ν ṗ^μ + T^{μν} is minus the change of W under
// a rotation of everything: zero when the field is invariant. Hence, for
// a static field, the energy E = p⁰ + Re[c 𝒱(x)] is conserved exactly and,
// for a rotation-invariant field (Coulomb, dyon), every component of
// J = x ∧ p + S; about the axis of an electric root-Kerr source, J_z. The
// spin magnitude S² is conserved (T is a rotation plus terms along p).
//
// Numerics. The s-integral is Gauss–Legendre with a node count set by the
// distance of the nearest singularity in s (at s ≈ |x⃗|/|a⃗| for the
// Coulomb field), for a quadrature error below rounding. The conservation
// laws hold for any node count: they follow from the invariance of the
// quadrature itself.
type RootKerrBody struct {
	Field em.Field
	M     float64 // mass parameter (the asymptotic rest mass)
	Q     float64 // electric charge
	G     float64 // magnetic charge

	// Contact is the coefficient β of the contact term (β/M) W_D², W_D
	// the dipole part of W (−μ·B in the rest frame): a spin-induced
	// polarisability, quadratic in the field and in the spin, which the
	// first-order coupling leaves free (0: none; see "The root-Kerr
	// body" in the package documentation).
	Contact float64

	// dipole restricts W to its O(a) term (one node at s = 0): the Dixon
	// body with g = 2, for the tests.
	dipole bool
	flat   *Dixon // scratch for SpinConstraints
	// unscaled shifts by a instead of â = (𝓜/M) a (W then has degree −1
	// in p and the mass function is not conserved), for the tests.
	unscaled bool

	geo   bodyGeometry
	alpha float64
	w     [4]float64
}

// Name implements Model.
func (r *RootKerrBody) Name() string {
	if r.Contact != 0 {
		return "root-kerr-body-contact"
	}
	return "root-kerr-body"
}

// Dim implements Model.
func (r *RootKerrBody) Dim() int { return 12 }

// Mass implements Model.
func (r *RootKerrBody) Mass() float64 { return r.M }

// Deriv implements Model.
func (r *RootKerrBody) Deriv(y, dy []float64) { r.rhs(y, dy, false) }

// LinearDeriv writes the part of Deriv of first order in the coupling,
// as for Dixon: force and torque with u = p/𝓜 and the first-order
// velocity correction.
func (r *RootKerrBody) LinearDeriv(y, dy []float64) { r.rhs(y, dy, true) }

// VelocitySplit returns the split dx/dτ = α p + w of the last Deriv or
// LinearDeriv (α = 1/𝓜), for the scattering driver.
func (r *RootKerrBody) VelocitySplit() (float64, [4]float64) { return r.alpha, r.w }

// bodyInteraction is W and its derivatives at one state: ∂_μW (dx),
// P_μ = ∂W/∂p^μ and A_μ = ∂W/∂a^μ (lower indices).
type bodyInteraction struct {
	W          float64
	dx, dp, da [4]float64
}

// nodeCount returns the Gauss–Legendre node count on [0, 1] for which
// the quadrature of W's integrand in s is below rounding. For a point
// source (Coulomb, dyon, root-Kerr with spin a_s) the integrand is
// analytic in s except at the branch points where (x⃗ − i(a⃗_s + s â⃗))² = 0,
// the roots of â² s² + 2s(a⃗_s·â⃗ + i x⃗·â⃗) + a_s² + 2i x⃗·a⃗_s − x² = 0; the
// error falls like ρ^{−2n} with ρ the parameter of the Bernstein ellipse
// through the nearer root (Trefethen 2013, Approximation Theory and
// Approximation Practice, ch. 19, from memory). Other fields take the
// largest rule (a uniform field, whose integrand is constant, two nodes).
func (r *RootKerrBody) nodeCount(x, a vec.Vec3) int {
	const nmax = 64
	var as vec.Vec3
	switch f := r.Field.(type) {
	case em.Uniform:
		return 2
	case em.RootKerr:
		as = f.A
	case interface{ RootKerr() em.RootKerr }:
		as = f.RootKerr().A
	default:
		return nmax
	}
	a2 := a.Dot(a)
	B := complex(as.Dot(a), x.Dot(a))
	C := complex(as.Dot(as)-x.Dot(x), 2*x.Dot(as))
	sq := cmplx.Sqrt(B*B - complex(a2, 0)*C)
	rho := math.Inf(1)
	for _, s := range []complex128{(-B + sq) / complex(a2, 0), (-B - sq) / complex(a2, 0)} {
		t := 2*s - 1
		w := cmplx.Sqrt(t*t - 1)
		rho = math.Min(rho, math.Max(cmplx.Abs(t+w), cmplx.Abs(t-w)))
	}
	if !(rho > 1.02) {
		return nmax
	}
	n := int(math.Ceil(math.Log(1e18)/(2*math.Log(rho)))) + 2
	if n > nmax {
		n = nmax
	}
	return n
}

// interaction evaluates W and its derivatives at (x⃗, p, a): the segment
// integral and, with Contact and unless linear (the first-order part
// only), the contact term (Contact/M) W_D², of second order in the
// coupling.
func (r *RootKerrBody) interaction(x vec.Vec3, p, a [4]float64, linear bool) (I bodyInteraction) {
	if r.Field == nil {
		return I
	}
	dip := []float64{0}
	av := vec.Vec3{a[1], a[2], a[3]}
	if r.dipole || av == (vec.Vec3{}) {
		I = r.segment(x, p, a, dip, []float64{1})
	} else {
		mass := math.Sqrt((p[0]-p[1])*(p[0]+p[1]) - p[2]*p[2] - p[3]*p[3])
		nodes, weights := legendre(r.nodeCount(x, av.Scale(mass/r.M)))
		I = r.segment(x, p, a, nodes, weights)
	}
	if r.Contact != 0 && !linear {
		D := r.segment(x, p, a, dip, []float64{1})
		f := r.Contact / r.M
		I.W += f * D.W * D.W
		for mu := 0; mu < 4; mu++ {
			I.dx[mu] += 2 * f * D.W * D.dx[mu]
			I.dp[mu] += 2 * f * D.W * D.dp[mu]
			I.da[mu] += 2 * f * D.W * D.da[mu]
		}
	}
	return I
}

// segment returns −(1/M) Σ_k w_k Im[c𝐅(x⃗ − i s_k â⃗)·𝐍] and its
// derivatives for the nodes s_k and weights w_k.
func (r *RootKerrBody) segment(x vec.Vec3, p, a [4]float64, nodes, weights []float64) (I bodyInteraction) {
	mass := math.Sqrt((p[0]-p[1])*(p[0]+p[1]) - p[2]*p[2] - p[3]*p[3])
	lam := mass / r.M // the shift is λ a⃗
	dlam := 1 / r.M   // ∂λ/∂𝓜
	if r.unscaled {
		lam, dlam = 1, 0
	}
	av := vec.Vec3{a[1], a[2], a[3]}
	pv := vec.Vec3{p[1], p[2], p[3]}
	c := complex(r.Q, -r.G)
	// 𝐍 = p⁰ a⃗ − a⁰ p⃗ − i a⃗ × p⃗.
	axp := av.Cross(pv)
	var N vec.CVec3
	for i := 0; i < 3; i++ {
		N[i] = complex(p[0]*av[i]-a[0]*pv[i], -axp[i])
	}
	k := -1 / r.M
	var dLam float64 // ∂W/∂λ
	for n, s := range nodes {
		z := vec.Complex(x, av.Scale(-s*lam))
		F, D := r.Field.At(z)
		var G vec.CVec3
		var DN [3]complex128 // Σ_i N_i c D[i][j]
		for i := 0; i < 3; i++ {
			G[i] = c * F[i]
		}
		for j := 0; j < 3; j++ {
			DN[j] = c * (N[0]*D[0][j] + N[1]*D[1][j] + N[2]*D[2][j])
		}
		w := k * weights[n]
		I.W += w * imag(G.Dot(N))
		var Ga, Gp vec.CVec3 // 𝐆 × a⃗, p⃗ × 𝐆
		Ga = G.Cross(av.Lift())
		Gp = pv.Lift().Cross(G)
		I.dp[0] += w * imag(G.Dot(av.Lift()))
		I.da[0] += w * imag(-G.Dot(pv.Lift()))
		for j := 0; j < 3; j++ {
			I.dx[j+1] += w * imag(DN[j])
			I.dp[j+1] += w * imag(-complex(a[0], 0)*G[j]-1i*Ga[j])
			I.da[j+1] += w * imag(complex(p[0], 0)*G[j]-1i*Gp[j]-1i*complex(s*lam, 0)*DN[j])
			dLam += w * imag(-1i*complex(s*av[j], 0)*DN[j])
		}
	}
	// λ = 𝓜/M: ∂λ/∂p^μ = −p_μ/(M 𝓜).
	for mu := 0; mu < 4; mu++ {
		I.dp[mu] -= dLam * dlam * etaDiag[mu][mu] * p[mu] / mass
	}
	return I
}

// forces returns the u-independent force f₀^μ = −∂^μW and the torque
// T^{μν} = P^μp^ν − P^νp^μ + A^μa^ν − A^νa^μ of the interaction.
func (I *bodyInteraction) forces(b *bodyState, f0 *[4]float64, T *[4][4]float64) {
	var P, A [4]float64
	for mu := 0; mu < 4; mu++ {
		s := etaDiag[mu][mu]
		f0[mu] = -s * I.dx[mu]
		P[mu], A[mu] = s*I.dp[mu], s*I.da[mu]
	}
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			T[mu][nu] = P[mu]*b.p[nu] - P[nu]*b.p[mu] + A[mu]*b.a[nu] - A[nu]*b.a[mu]
		}
	}
}

func (r *RootKerrBody) local(y []float64) *bodyLocal {
	return r.geo.at(nil, false, r.Field, r.Q, r.G, event(y))
}

func (r *RootKerrBody) rhs(y, dy []float64, linear bool) {
	l := r.local(y)
	var b bodyState
	b.load(l, y)
	I := r.interaction(spatial(y, IX), b.p, b.a, linear)
	var f0 [4]float64
	var T, C [4][4]float64
	I.forces(&b, &f0, &T)
	b.lorentzCurvature(l, &C)
	var w [4]float64
	if linear {
		w1 := b.velocityFirstOrder(l, &f0, &T, &C)
		b.derivatives(l, &f0, &T, &C, &w, dy)
		for mu := 0; mu < 4; mu++ {
			dy[IX+mu] += w1[mu]
		}
		r.alpha, r.w = 1/b.mass, w1
		return
	}
	w = b.velocityCorrection(l, &f0, &T, &C)
	b.derivatives(l, &f0, &T, &C, &w, dy)
	r.alpha, r.w = 1/b.mass, w
}

// Interaction returns W at y (see the type's comment).
func (r *RootKerrBody) Interaction(y []float64) float64 {
	I := r.interaction(spatial(y, IX), [4]float64(Mom(y)), [4]float64(Spin(y)), false)
	return I.W
}

// Energy implements Model: E = p⁰ + Re[(Q − iG) 𝒱(x)].
func (r *RootKerrBody) Energy(y []float64) float64 {
	l := r.local(y)
	var b bodyState
	b.load(l, y)
	return b.energy(l)
}

// EnergyExact implements Model: true.
func (r *RootKerrBody) EnergyExact() bool { return true }

// AngularMomentumZ returns J_z = (x × p)_z + S^{12} + q(x × A)_z (see
// Dixon.AngularMomentumZ).
func (r *RootKerrBody) AngularMomentumZ(y []float64) float64 {
	l := r.local(y)
	var b bodyState
	b.load(l, y)
	return b.angularMomentumZ(l)
}

// ConservesJz reports whether AngularMomentumZ is a constant of the
// motion: as for the flat-space Dixon body.
func (r *RootKerrBody) ConservesJz() bool {
	d := Dixon{Field: r.Field, G: r.G}
	return d.ConservesJz()
}

// AngularMomentum returns J^{ij} = x^i p^j − x^j p^i + S^{ij} as the axial
// vector (J^{23}, J^{31}, J^{12}) (see Dixon.AngularMomentum).
func (r *RootKerrBody) AngularMomentum(y []float64) [3]float64 {
	d := Dixon{}
	return d.AngularMomentum(y)
}

// MassShell returns (𝓜 − W − M)/M, the relative deviation of the conserved
// mass function 𝓜 − W from the mass parameter (at O(a) Dixon's m_D; the
// derivation is in the package documentation, "The root-Kerr body").
func (r *RootKerrBody) MassShell(y []float64) float64 {
	l := r.local(y)
	var b bodyState
	b.load(l, y)
	return (b.mass - r.Interaction(y) - r.M) / r.M
}

// Normalize implements Model: p⁰ from the mass shell with 𝓜 = M + W, a⁰
// from a·p = 0 and a rescaled so that S² = 𝓜² a·a = M² a2.
func (r *RootKerrBody) Normalize(y []float64, a2 float64) {
	l := r.local(y)
	target := r.M
	for it := 0; it < 3; it++ {
		massShellP0(&l.g, y, target)
		normalizeSpin(&l.g, y, r.M*r.M*a2/(target*target))
		target = r.M + r.Interaction(y)
	}
	massShellP0(&l.g, y, target)
	normalizeSpin(&l.g, y, r.M*r.M*a2/(target*target))
}

// Hazard implements Model: the shifted points x⃗ − i s a⃗, 0 ≤ s ≤ 1, must
// not cross the source's branch set; the disks of the end points s = 0
// (the source's own disk) and s = 1 (radius |a_source + a⃗|) are checked.
func (r *RootKerrBody) Hazard(y0, y1 []float64) Status {
	if r.Field == nil {
		return StatusRunning
	}
	x0, x1 := spatial(y0, IX), spatial(y1, IX)
	if fieldDisk(r.Field, vec.Vec3{}).Crosses(x0, x1) || fieldDisk(r.Field, spatial(y0, IA)).Crosses(x0, x1) {
		return StatusCrossedDisk
	}
	return StatusRunning
}

// SpinConstraints returns the relative violations of the spin condition
// and of the spin magnitude S² = 𝓜² a·a (see Dixon.SpinConstraints).
func (r *RootKerrBody) SpinConstraints(y []float64, a2 float64) (orth, norm float64) {
	if r.flat == nil {
		r.flat = &Dixon{} // kept: a Dixon value built per call escapes to the heap
	}
	r.flat.M = r.M
	return r.flat.SpinConstraints(y, a2)
}

// ScaleCoupling implements CouplingScaler: the probe's charges scaled by λ
// (W scales with them).
func (r *RootKerrBody) ScaleCoupling(lambda float64) Model {
	// The contact term is quadratic in the charge: (β/M) W_D² scales as
	// λ² with W_D, which keeps it of second order in the coupling.
	return &RootKerrBody{Field: r.Field, M: r.M, Q: lambda * r.Q, G: lambda * r.G, Contact: r.Contact, dipole: r.dipole}
}
