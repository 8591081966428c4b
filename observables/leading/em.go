package leading

import (
	"math"

	"ricochet/background/em"
	"ricochet/background/vec"
)

// EMProbe is an electromagnetic probe: mass M, electric charge Q, magnetic
// charge G and spin vector A = a^μ = S^μ/M (four-vector with A·u = 0).
// Treated as a root-Kerr particle, its magnetic moment is Q a and its
// electric dipole moment −G a in its rest frame.
type EMProbe struct {
	M, Q, G float64
	A       vec.Vec4
}

// EMSource is a static root-Kerr source at the origin of its rest frame:
// electric charge Q, magnetic charge P and spin vector A (see em.RootKerr).
type EMSource struct {
	Q, P float64
	A    vec.Vec3
}

// Field returns the source's field as an em.RootKerr.
func (s EMSource) Field() em.RootKerr { return em.RootKerr{Q: s.Q, P: s.P, A: s.A} }

// line holds the straight-line kinematics in the source frame.
type line struct {
	v     vec.Vec3 // three-velocity
	speed float64  // |v|
	gamma float64  // u⁰
	b     vec.Vec3 // spatial impact parameter, orthogonal to v
}

// newLine reads u and b. The spatial part of b is projected orthogonal to
// v, a no-op for a covariant impact parameter.
func newLine(u, b vec.Vec4) line {
	g := u[0]
	v := u.Spatial().Scale(1 / g)
	bs := b.Spatial()
	vh := v.Unit()
	bs = bs.Sub(vh.Scale(vh.Dot(bs)))
	return line{v: v, speed: v.Norm(), gamma: g, b: bs}
}

// EMFieldIntegral returns the time integral of the root-Kerr field of
// charge c = Q + iP along the line x(t) = b + v t − i a,
//
//	∫ 𝐅 dt = (2c/|v|) 𝐁/(𝐁·𝐁),  𝐁 = b − iΠa,
//
// with Π the projection orthogonal to v and b ⊥ v. Derivation (ours): with
// 𝐁 ⊥ v the integrand is c(𝐁 + v t')/(𝐁² + v²t'²)^{3/2} after shifting
// t' = t − i a·v/v²; the odd part integrates to zero and
// ∫ dt'/(𝐁² + v²t'²)^{3/2} = 2/(|v| 𝐁²). The shift is allowed when the real
// line b + v t does not cross the branch disk of the spin a (em.RootKerr),
// which EMCrossesDisk reports.
func EMFieldIntegral(c complex128, a, v, b vec.Vec3) vec.CVec3 {
	vh := v.Unit()
	pa := a.Sub(vh.Scale(vh.Dot(a)))
	B := vec.Complex(b, pa.Scale(-1))
	return B.Scale(2 * c / (complex(v.Norm(), 0) * B.Dot(B)))
}

// emGenerator returns Re Ω^μ_ν with
//
//	Ω = ((q − ig)/(mγ)) 𝕋(𝒢),
//
// where 𝒢 = ∫𝐅 dt along the line and 𝕋(𝒢) is the self-dual tensor with
// electric part 𝒢 and magnetic part −i𝒢:
//
//	𝕋⁰_i = 𝕋^i_0 = 𝒢_i,  𝕋^i_j = ε_ijk (−i𝒢_k),
//
// so that for real E, B the real part of 𝕋(E + iB) is the field strength
// F^μ_ν with F^i_0 = E^i, F^i_j = ε_ijk B^k.
func emGenerator(pr EMProbe, G vec.CVec3, gamma float64) [4][4]float64 {
	k := complex(pr.Q, -pr.G) / complex(pr.M*gamma, 0)
	var W [4][4]float64
	for i := 0; i < 3; i++ {
		e := real(k * G[i])
		W[0][i+1] = e
		W[i+1][0] = e
	}
	// Magnetic part H = −i𝒢: Re(k H) = Re(−i k 𝒢) = Im(k 𝒢).
	var h vec.Vec3
	for i := 0; i < 3; i++ {
		h[i] = imag(k * G[i])
	}
	// W^i_j = ε_ijk h_k.
	W[1][2], W[2][1] = h[2], -h[2]
	W[2][3], W[3][2] = h[0], -h[0]
	W[3][1], W[1][3] = h[1], -h[1]
	return W
}

func apply(W [4][4]float64, x vec.Vec4) vec.Vec4 {
	var y vec.Vec4
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			y[mu] += W[mu][nu] * x[nu]
		}
	}
	return y
}

// EMRotation returns the first-order Lorentz generator Re Ω^μ_ν (upper,
// lower index) that rotates the root-Kerr probe's momentum and spin:
// Δp = Re(Ω) p and Δa = Re(Ω) a. See EMImpulse.
func EMRotation(pr EMProbe, src EMSource, u, b vec.Vec4) [4][4]float64 {
	l := newLine(u, b)
	a := pr.A.Spatial().Add(src.A)
	G := EMFieldIntegral(complex(src.Q, src.P), a, l.v, l.b)
	return emGenerator(pr, G, l.gamma)
}

// EMImpulse returns the first-order Δp^μ and Δa^μ of a root-Kerr (g = 2,
// all multipoles) probe, all orders in both spins, passing a static
// root-Kerr source on the straight line with incoming four-velocity u and
// covariant impact parameter b, in the source rest frame.
//
// The probe's equations at linear order in the field are (Newman–Janis
// shift of the Lorentz force and the g = 2 BMT equation; for the
// root-Kerr probe see Arkani-Hamed, Huang & O'Connell 2020, JHEP 01, 046,
// and Guevara, Ochirov & Vines 2019, JHEP 09, 056, from memory; covariant
// form and signs derived here)
//
//	dp^μ/dτ = Re[(q − ig) 𝔽^μ_ν(x − ia)] u^ν,
//	da^μ/dτ = Re[((q − ig)/m) 𝔽^μ_ν(x − ia)] a^ν,
//
// with 𝔽 the self-dual tensor with electric part 𝐅 and magnetic part −i𝐅.
// At a = 0 they are the dyon Lorentz force q(E + v×B) + g(B − v×E); at
// first order in a, for the probe at rest, the force q(a·∇)B = ∇(μ·B) of a
// magnetic moment μ = q a and the torque μ × B of g = 2. Integrating along
// the line (dτ = dt/γ) and using EMFieldIntegral,
//
//	𝒢 = (2(Q + iP)/|v|) 𝐁/(𝐁·𝐁),  𝐁 = b − iΠ(a₁ + a₂),
//	Ω = ((q − ig)/(mγ)) 𝕋(𝒢),
//	Δp = Re(Ω) p,  Δa = Re(Ω) a₁,
//
// explicitly Δp = (0, Re[(q − ig)(𝒢 − i v×𝒢)]) since 𝒢·v = 0. For a = 0
// this is the Coulomb impulse 2qQ b̂/(|v| b) (Jackson, Classical
// Electrodynamics, 3rd ed., §13.1, from memory).
//
// The spin components along v drop out only while the line does not cross
// the branch disk of a₁ + a₂ (EMCrossesDisk); on a crossing line the result
// is the analytic continuation, not the integral. The source velocity
// must be nonzero; Δa is the kick of the four-vector a^μ.
func EMImpulse(pr EMProbe, src EMSource, u vec.Vec4, b vec.Vec4) (dp, da vec.Vec4) {
	W := EMRotation(pr, src, u, b)
	return apply(W, u.Scale(pr.M)), apply(W, pr.A)
}

// EMCrossesDisk reports whether the probe's straight line crosses the
// branch disk of the combined spin a₁ + a₂ (spatial parts in the source
// frame), where the closed form of EMImpulse does not hold.
func EMCrossesDisk(pr EMProbe, src EMSource, u, b vec.Vec4) bool {
	l := newLine(u, b)
	a := pr.A.Spatial().Add(src.A)
	f := em.RootKerr{A: a}
	// The line enters and leaves far beyond the disk after a time ±T.
	T := 2 * (l.b.Norm() + a.Norm() + 1) / l.speed
	return f.CrossesDisk(l.b.Sub(l.v.Scale(T)), l.b.Add(l.v.Scale(T)))
}

// EMQuadrature are the settings of EMImpulseQuadrature.
type EMQuadrature struct {
	// N is the number of Gauss–Legendre nodes; zero means 256.
	N int
}

// EMImpulseQuadrature returns the first-order Δp^μ and Δa^μ of the
// root-Kerr probe in the static field f (in f's rest frame) by computing
//
//	𝒢 = ∫ 𝐅(b + v t − i a₁) dt
//
// with n-point Gauss–Legendre quadrature after the map
// t = (|b|/|v|) tan θ, θ ∈ (−π/2, π/2), which makes the integrand of a
// field falling like 1/r² smooth at the ends, and then applying the
// generator of EMImpulse. It covers fields without a closed form; f must
// fall off at least like 1/r² (em.Uniform does not), and the convergence is
// geometric with a rate set by the distance of the field's singularities
// from the line. s nil means default settings.
func EMImpulseQuadrature(pr EMProbe, f em.Field, u, b vec.Vec4, s *EMQuadrature) (dp, da vec.Vec4) {
	n := 256
	if s != nil && s.N > 0 {
		n = s.N
	}
	l := newLine(u, b)
	scale := l.b.Norm() / l.speed
	shift := vec.Complex(l.b, pr.A.Spatial().Scale(-1))
	x, w := gaussLegendre(n, -math.Pi/2, math.Pi/2)
	var G vec.CVec3
	for i, th := range x {
		c := math.Cos(th)
		t := scale * math.Tan(th)
		jac := scale / (c * c)
		F, _ := f.At(shift.Add(l.v.Scale(t).Lift()))
		G = G.Add(F.Scale(complex(w[i]*jac, 0)))
	}
	W := emGenerator(pr, G, l.gamma)
	return apply(W, u.Scale(pr.M)), apply(W, pr.A)
}

// gaussLegendre returns the nodes and weights of the n-point Gauss–Legendre
// rule on [lo, hi], exact for polynomials of degree 2n − 1. The nodes are
// the roots of the Legendre polynomial P_n found by Newton's method from
// the asymptotic guess cos(π(i + 3/4)/(n + 1/2)), with weights
// 2/((1 − x²) P_n'(x)²) (Press et al., Numerical Recipes, 3rd ed., §4.6,
// routine gauleg, from memory).
func gaussLegendre(n int, lo, hi float64) (x, w []float64) {
	x = make([]float64, n)
	w = make([]float64, n)
	mid, half := (hi+lo)/2, (hi-lo)/2
	for i := 0; i < (n+1)/2; i++ {
		z := math.Cos(math.Pi * (float64(i) + 0.75) / (float64(n) + 0.5))
		var dp float64
		for iter := 0; iter < 100; iter++ {
			p0, p1 := 1.0, 0.0
			for j := 1; j <= n; j++ {
				p0, p1 = ((2*float64(j)-1)*z*p0-(float64(j)-1)*p1)/float64(j), p0
			}
			// p0 = P_n(z), p1 = P_{n−1}(z).
			dp = float64(n) * (z*p0 - p1) / (z*z - 1)
			dz := p0 / dp
			z -= dz
			if math.Abs(dz) < 1e-16 {
				break
			}
		}
		// Recompute the derivative at the converged root.
		p0, p1 := 1.0, 0.0
		for j := 1; j <= n; j++ {
			p0, p1 = ((2*float64(j)-1)*z*p0-(float64(j)-1)*p1)/float64(j), p0
		}
		dp = float64(n) * (z*p0 - p1) / (z*z - 1)
		wt := 2 / ((1 - z*z) * dp * dp)
		x[i], x[n-1-i] = mid-half*z, mid+half*z
		w[i], w[n-1-i] = half*wt, half*wt
	}
	return x, w
}
