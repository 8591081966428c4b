package exact

import (
	"fmt"
	"math"
)

// CoulombSpinOrbit returns the deflection of a spinning point charge whose
// spin is normal to the plane of motion, passing a Coulomb source, from the
// canonical Hamiltonian with the Thomas–BMT spin–orbit coupling at linear
// order in the spin: a computation independent of the covariant equations
// of motion, for checking their second-order coefficients.
//
// Units: probe mass m = 1 and covariant impact parameter b = 1. v is the
// speed at infinity, eps = qQ/(m b) the coupling (positive: repulsion), a
// the rest-frame spin per unit mass (signed z component, a > 0 meaning
// angular momentum along +z, in units of b) and g the gyromagnetic ratio.
// The probe comes in along +x with b along +y; χ > 0 turns it towards +y
// (away from the source), as for Darwin.
//
// Hamiltonian. In canonical (Newton–Wigner) variables x⃗, π⃗, S⃗ with
// {x_i, π_j} = δ_ij and {S_i, S_j} = ε_ijk S_k, a charge q with magnetic
// moment (g/2)(q/m)S in the static field E = −∇Φ has
//
//	H = √(m² + π²) + qΦ + Ω⃗·S⃗,
//	Ω⃗ = −(q/m)[(g/2 − 1 + 1/γ) B − (g/2 − 1)(γ/(γ + 1))(v·B) v − (g/2 − γ/(γ + 1)) v × E],
//
// with v = π/√(m² + π²) and γ = √(m² + π²)/m, so that dS⃗/dt = Ω⃗ × S⃗ is
// the Thomas–BMT precession (Thomas 1927, Phil. Mag. 3, 1; Bargmann,
// Michel & Telegdi 1959, Phys. Rev. Lett. 2, 435; Jackson, Classical
// Electrodynamics, 3rd ed., eq. 11.170; the Hamiltonian at linear order in
// spin: Pomeransky & Khriplovich 1998, JETP 86, 839; all from memory). For
// E = Q r⃗/r³, B = 0 and both L = (x⃗ × π⃗)_z and S = S_z conserved,
//
//	H = √(m² + π²) + κ/r − (κ L S/(m² γ r³))(g/2 − γ/(γ + 1)),   κ = qQ.
//
// Radial reduction (derived here). At energy E = γ_∞ m and linear order in
// S, with u = 1/r and γ(u) = (E − κu)/m the zeroth-order Lorentz factor,
//
//	π_r² = f(u) = (E − κu)² − m² − L²u² + L U(u),
//	U(u) = (2κS/m) u³ [g/2 − 1 + 1/(γ(u) + 1)],
//
// and the azimuth swept is Δφ = 2∫_{r_min}^∞ ∂(−π_r)/∂L dr =
// 2∫₀^{u_t} (L − U/(2u²))/√f du, u_t the first zero of f. The outgoing
// direction makes the angle π + Δφ with +x (L < 0 for the frame of record).
// The substitution u = u_t(1 − t²) and the difference quotient
// f(u)/(u_t − u), written out term by term, remove the turning-point
// singularity without cancellation.
//
// Impact parameter. The Hamiltonian's position is the Newton–Wigner one;
// the covariant impact parameter is that of the Tulczyjew centroid. For
// the free probe the total angular momentum J_z = −b p + γ m a (Tulczyjew
// centroid, spin tensor S^{12} = γ m a for a spin normal to a boost along
// x) equals −b_NW p + m a (canonical), so
//
//	b_NW = b − (γ − 1) a/(γ v),   L = −b_NW γ v m,   S = m a.
//
// The spin-orbit coupling is linear in S; the deflection returned is that
// of this Hamiltonian at finite a (its terms of order a² are not those of
// any particular body): use it for the part linear in a.
func CoulombSpinOrbit(v, eps, a, g float64) (Scattering, error) {
	gam, err := gammaOf(v)
	if err != nil {
		return Scattering{}, err
	}
	for _, x := range []float64{eps, a, g} {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return Scattering{}, fmt.Errorf("exact: spin–orbit parameters ε = %v, a = %v, g = %v invalid", eps, a, g)
		}
	}
	p := spinOrbitProblem{E: gam, k: eps, S: a, g: g}
	p.L = -(1 - (gam-1)*a/(gam*v)) * gam * v
	ut, err := p.turningPoint()
	if err != nil {
		return Scattering{}, fmt.Errorf("%w: spin–orbit ε = %g, a = %g, v = %g", err, eps, a, v)
	}
	I, e := p.sweep(ut)
	psi := math.Pi + 2*I
	return awayFromSource(psi, 2*e, v), nil
}

// spinOrbitProblem is the radial problem of CoulombSpinOrbit (m = 1).
type spinOrbitProblem struct {
	E, k, S, g, L float64
}

func (p spinOrbitProblem) h(u float64) float64 {
	return p.g/2 - 1 + 1/(p.E-p.k*u+1)
}

func (p spinOrbitProblem) f(u float64) float64 {
	e := p.E - p.k*u
	return e*e - 1 - p.L*p.L*u*u + p.L*2*p.k*p.S*u*u*u*p.h(u)
}

// turningPoint brackets the first sign change of f on u > 0 and bisects it.
func (p spinOrbitProblem) turningPoint() (float64, error) {
	lo, step := 0.0, 0.01/math.Abs(p.L)
	hi := lo
	for i := 0; ; i++ {
		hi = lo + step
		if p.f(hi) < 0 {
			break
		}
		lo = hi
		if i > 1e6 {
			return 0, ErrCaptured
		}
	}
	for i := 0; i < 200 && hi-lo > 1e-17*hi; i++ {
		mid := 0.5 * (lo + hi)
		if p.f(mid) < 0 {
			hi = mid
		} else {
			lo = mid
		}
	}
	return 0.5 * (lo + hi), nil
}

// sweep returns ∫₀^{u_t} (L − U/(2u²))/√f du and its error estimate.
func (p spinOrbitProblem) sweep(ut float64) (float64, float64) {
	gt := p.E - p.k*ut
	c := 2 * p.k * p.S
	q := func(u float64) float64 {
		// f(u)/(u_t − u), term by term (f(u_t) = 0).
		gu := p.E - p.k*u
		v := p.k*(2*p.E-p.k*(u+ut)) + p.L*p.L*(u+ut)
		v -= p.L * c * ((u*u+u*ut+ut*ut)*p.h(u) + ut*ut*ut*p.k/((gu+1)*(gt+1)))
		return v
	}
	fn := func(t, omt float64) float64 {
		u := ut * omt * (1 + t)
		return 2 * math.Sqrt(ut/q(u)) * (p.L - p.k*p.S*u*p.h(u))
	}
	return gradedQuad(fn)
}
