package exact

import (
	"fmt"
	"math"

	"ricochet/background/vec"
)

// Charge is the pair of electric and magnetic charges of a dyon, in
// Gaussian units: its fields are E = Electric r/r³ and B = Magnetic r/r³,
// and a probe dyon (q, g) moving with velocity v feels the force
//
//	F = q(E + v×B) + g(B − v×E).
type Charge struct {
	Electric, Magnetic float64
}

// Dyon returns the exact relativistic scattering of a probe dyon of mass m
// and charges probe = (q, g) by a fixed dyon source = (Q, P), for speed v
// at infinity and impact parameter b.
//
// Derivation. For the fields of the source the force is
//
//	F = κ r/r³ + μ v×r/r³,   κ = qQ + gP,   μ = qP − gQ.
//
// The central part κ r/r³ exerts no torque and the velocity-dependent part
// does no work, so E = γ(r) m + κ/r is conserved, and since
// r × (v × r)/r³ = dr̂/dt the vector
//
//	J = r × p − μ r̂
//
// is conserved (Poincaré 1896 for κ = 0; the dyon–dyon case follows the same
// steps, from memory of e.g. Schwinger et al., Ann. Phys. 101, 451 (1976)).
// Hence r̂·J = −μ: r̂ moves on a cone about J of half-angle θ_c with
// cos θ_c = |μ|/|J|, sin θ_c = L/|J|, where L = |r × p| = √(J² − μ²) = p b
// is conserved too. The radial motion is that of the planar Coulomb problem
// with angular momentum L, so the angle swept on the unrolled cone is
// π − χ_D, with χ_D the Darwin deflection for ε = κ/(m b). Since
// dr̂/dt = J × r̂/(γ m r²), r̂ turns about Ĵ in the positive sense by
//
//	Φ = (|J|/L) (π − χ_D).
//
// With the incoming asymptote r̂ → −x̂ one finds J = (μ, 0, −L) and, in the
// plane orthogonal to J, ê_in = (−L, 0, −μ)/|J|; the outgoing direction is
//
//	n̂_out = −(μ/|J|) Ĵ + (L/|J|) [cos Φ ê_in + sin Φ Ĵ × ê_in].
//
// For μ = 0 this is (cos χ_D, sin χ_D, 0). Chi is the total scattering
// angle arccos(n̂_out·x̂) ∈ [0, π]; the sign information is in Dir. An
// attractive κ with |κ| ≥ L gives ErrCaptured, as in Darwin.
func Dyon(v, b, m float64, probe, source Charge) (Scattering, error) {
	g, err := gammaOf(v)
	if err != nil {
		return Scattering{}, err
	}
	if err := checkB(b); err != nil {
		return Scattering{}, err
	}
	if !(m > 0) {
		return Scattering{}, fmt.Errorf("exact: probe mass m = %v must be positive", m)
	}
	kappa := probe.Electric*source.Electric + probe.Magnetic*source.Magnetic
	mu := probe.Electric*source.Magnetic - probe.Magnetic*source.Electric
	chiD, err := darwinAngle(v, kappa/(m*b))
	if err != nil {
		return Scattering{}, err
	}
	L := g * m * v * b
	dir := coneOut(mu, L, math.Pi-chiD)
	chi := math.Acos(math.Max(-1, math.Min(1, dir[0])))
	return fromDir(chi, 0, v, dir), nil
}

// coneOut returns r̂ after it has swept the unrolled-cone angle psi from the
// incoming asymptote −x̂, for J = (μ, 0, −L).
func coneOut(mu, L, psi float64) vec.Vec3 {
	r, _, _ := coneFrame(mu, L)
	phi := math.Hypot(mu, L) / L * psi
	return r(phi)
}

// coneFrame returns the map from the azimuth φ about Ĵ (φ = 0 on the
// incoming asymptote) to r̂, together with Ĵ and |J|.
func coneFrame(mu, L float64) (func(phi float64) vec.Vec3, vec.Vec3, float64) {
	j := math.Hypot(mu, L)
	jh := vec.Vec3{mu / j, 0, -L / j}
	ein := vec.Vec3{-L / j, 0, -mu / j}
	e2 := jh.Cross(ein)
	axis := jh.Scale(-mu / j)
	return func(phi float64) vec.Vec3 {
		s, c := math.Sincos(phi)
		return axis.Add(ein.Scale(c * L / j)).Add(e2.Scale(s * L / j))
	}, jh, j
}
