package leading

import (
	"math"

	"ricochet/background/vec"
)

// GravSource is a stationary Kerr–Newman–Taub–NUT source at rest at the
// origin of its rest frame, described by its first-order couplings:
//
//	M  mass
//	N  NUT parameter (gravitomagnetic monopole charge)
//	Q  electric charge (Gaussian units)
//	P  magnetic charge (Gaussian units)
//	A  spin vector a = J/M (length), any length and orientation; a along +z
//	   means angular momentum along +z
//
// The zero value is flat space.
//
// Sign of N. N is the parameter of the Kerr–Taub–NUT metric written as
//
//	ds² = −(Δ/ρ²)(dt − χ dφ)² + ρ²(dr²/Δ + dθ²) + (sin²θ/ρ²)(a dt − R dφ)²,
//	χ = a sin²θ − 2N(cos θ + C),  ρ² = r² + (N + a cos θ)²,
//	Δ = r² − 2Mr + a² − N²,       R = r² + a² + N² − 2aNC,
//
// (the Griffiths–Podolský form of the Kerr–Taub–NUT metric, Griffiths &
// Podolský 2009, "Exact Space-Times", Sec. 12.1, from memory, with their l
// written N), so that g_tφ ∋ +2N cos θ·(−Δ/ρ²). The constant C places the
// Misner string (C = 0: both half-axes, C = ∓1: only the south/north
// half-axis); the first-order impulse of a path that avoids the string does
// not depend on it (the tests check this for C = −1, 0, 1, with and
// without spin, against quadrature along such paths; with spin the string
// lies along a). To first order in M and N, at a = 0, the metric is the
// linearized Schwarzschild metric plus
//
//	h_{0i} dx^i = −2N (cos θ + C) dφ,
//
// whose gravitomagnetic field ∇×h = 2N x̂/r² is that of a monopole; a
// probe of energy E then feels the Lorentz-like force of a magnetic charge
// 2E N, so that for N > 0 the out-of-plane impulse is along +v × b.
type GravSource struct {
	M, N, Q, P float64
	A          vec.Vec3
}

// GravProbe is a non-spinning test probe: mass M, electric charge Q and
// magnetic charge G (Gaussian units). The zero value is a neutral probe of
// zero mass, for which Impulse1PM returns zero; a massless probe of finite
// energy is the limit γ → ∞ at fixed mγ (see ScatteringAngle1PM, whose
// angle then tends to 4M/b).
type GravProbe struct {
	M, Q, G float64
}

// Impulse1PM returns the first-order impulse Δp^μ (contravariant components
// in the source rest frame) of a test probe on the straight line
// x(τ) = b + u τ past the stationary source src. The result is of first
// order in the couplings M, N (first post-Minkowskian order, 1PM) and
// (q − ig)(Q + iP) (first order in the electromagnetic coupling), and exact
// in the source spin a:
//
//	Δp^μ = −(2m/√(γ²−1)) Re[ (M − iN) ((2γ²−1) 𝐁^μ − 2iγ ε^μ_{νρσ} 𝐁^ν u^ρ u₂^σ) / (𝐁·𝐁) ]
//	     + (2/√(γ²−1))   Re[ (q − ig)(Q + iP) (γ 𝐁^μ − i ε^μ_{νρσ} 𝐁^ν u^ρ u₂^σ) / (𝐁·𝐁) ],
//
//	𝐁 = b − iΠa,   γ = −u·u₂,   u₂ = (1, 0, 0, 0),
//
// where Π projects onto the plane orthogonal to u and u₂. The first line is
// the 1PM Kerr impulse to all orders in spin (Vines 2017, Class. Quantum
// Grav. 35 084002, arXiv:1709.06016, from memory; there written
// with b + iΠa, the complex conjugate form, whose real part is the same) with the mass–NUT duality M → M − iN of our 𝐁
// convention (Emond, Huang, Kol, Moynihan, O'Connell 2020, arXiv:2010.07861,
// from memory; they write M + iN with the conjugate shift b + iΠa, which
// has the same real part). The second line is the Coulomb, magnetic
// monopole and root-Kerr (Kerr–Newman at G → 0, magnetic dipole μ = Q a)
// impulse, the straight-line integral of the force
// Re[(q − ig)(F − i v × F)] in the field F = E + iB = (Q + iP)(x − ia)/[(x − ia)²]^{3/2}
// (Newman & Janis 1965; Newman 1973). Terms in Q², P², M·Q etc., which
// enter the Kerr–Newman metric and the motion only at second order, are
// excluded.
//
// In our conventions a prograde pass (orbital angular momentum along the
// spin) is deflected less than a retrograde one, and at a = N = Q = P = 0
// the impulse is the attractive Schwarzschild result
// |Δp| = 2Mm(2γ²−1)/(b√(γ²−1)) along −b.
//
// Only the part of b orthogonal to u and u₂ is used (for a stationary
// source any other part only moves the point along the same world line or
// in time). u must be a future-directed unit timelike vector that is not at
// rest (γ > 1). The formula holds for lines that do not pierce the source's
// branch disk of radius |a|; |Πa| < |b| is sufficient.
func Impulse1PM(pr GravProbe, src GravSource, u, b vec.Vec4) vec.Vec4 {
	u2 := vec.Vec4{1, 0, 0, 0}
	gam := -u.Dot(u2)
	rootg := math.Sqrt(gam*gam - 1)

	bp := gravProject(b, u, u2)
	ap := gravProject(vec.FromSpatial(0, src.A), u, u2)

	// 𝐁 = br + i bi.
	br, bi := bp, ap.Scale(-1)
	den := complex(br.Dot(br)-bi.Dot(bi), 2*br.Dot(bi))
	er := vec.Eps(br, u, u2)
	ei := vec.Eps(bi, u, u2)

	cg := complex(-2*pr.M/rootg, 0) * complex(src.M, -src.N)
	ce := complex(2/rootg, 0) * complex(pr.Q, -pr.G) * complex(src.Q, src.P)

	var dp vec.Vec4
	for mu := 0; mu < 4; mu++ {
		bmu := complex(br[mu], bi[mu])
		emu := complex(er[mu], ei[mu])
		num := cg*(complex(2*gam*gam-1, 0)*bmu-complex(0, 2*gam)*emu) +
			ce*(complex(gam, 0)*bmu-complex(0, 1)*emu)
		dp[mu] = real(num / den)
	}
	return dp
}

// gravProject returns the part of x orthogonal to the unit timelike vectors
// u and w:
//
//	Πx = x − α u − β w,  with (Πx)·u = (Πx)·w = 0.
func gravProject(x, u, w vec.Vec4) vec.Vec4 {
	// Solve [u·u u·w; w·u w·w][α β]ᵀ = [x·u x·w]ᵀ.
	uu, uw, ww := u.Dot(u), u.Dot(w), w.Dot(w)
	xu, xw := x.Dot(u), x.Dot(w)
	det := uu*ww - uw*uw
	alpha := (xu*ww - xw*uw) / det
	beta := (uu*xw - uw*xu) / det
	return x.Sub(u.Scale(alpha)).Sub(w.Scale(beta))
}

// ScatteringAngle1PM returns the first-order scattering angles of a probe
// in the frame of record: the source at rest at the origin, the probe
// incoming along +x with Lorentz factor gamma > 1 and impact parameter b > 0
// along +y, so that its orbital angular momentum is along −z. The angles
// are the first-order impulse (Impulse1PM) divided by |p| = m√(γ²−1):
//
//	theta = −Δp^y/|p|   in-plane deflection, positive towards the source
//	phi   =  Δp^z/|p|   out-of-plane deflection, positive towards +z
//
// In the aligned case a = a_z ẑ a spin a_z < 0 is prograde, and at N = Q =
// P = 0 theta equals AlignedAngle1PM(M, −a_z, gamma, b) and phi is zero.
// Nonzero N, P or G, or a spin with x or y components, give phi ≠ 0.
func ScatteringAngle1PM(pr GravProbe, src GravSource, gamma, b float64) (theta, phi float64) {
	v := math.Sqrt(1 - 1/(gamma*gamma))
	u := vec.Velocity(vec.Vec3{v, 0, 0})
	dp := Impulse1PM(pr, src, u, vec.Vec4{0, 0, b, 0})
	p := pr.M * math.Sqrt(gamma*gamma-1)
	return -dp[2] / p, dp[3] / p
}

// AlignedAngle1PM returns the 1PM scattering angle of a neutral test probe
// in the equatorial plane of a Kerr source of mass M whose spin is aligned
// with the orbital angular momentum, with signed spin length a (a > 0
// prograde, a < 0 retrograde), at Lorentz factor gamma and impact parameter
// b (|a| < b):
//
//	θ = (M/v²) [ (1 + v)²/(b + a) + (1 − v)²/(b − a) ],   v = √(1 − 1/γ²).
//
// It is the aligned-spin specialisation of Impulse1PM (Vines 2017,
// arXiv:1709.06016, from memory): there 𝐁·𝐁 = b² − a² and the real part
// gives θ = 2M[(1 + v²)b − 2va]/[v²(b² − a²)]. At a = 0 it is
// 2M(1 + v²)/(v² b), whose massless limit is Einstein's 4M/b.
func AlignedAngle1PM(M, a, gamma, b float64) float64 {
	v := math.Sqrt(1 - 1/(gamma*gamma))
	return M / (v * v) * ((1+v)*(1+v)/(b+a) + (1-v)*(1-v)/(b-a))
}
