package exact

import (
	"fmt"
	"math"
)

// KerrEquatorial returns the exact deflection of a timelike geodesic moving
// in the equatorial plane of a Kerr black hole of mass M and spin a (the
// spin vector is a ẑ; a may be negative), for speed v at infinity and
// impact parameter b = |L|/p.
//
// In the frame of record the probe's orbital angular momentum is
// L_z = −p b, along −z. So a > 0 gives a retrograde orbit and a < 0 a
// prograde one; the spin component along the orbital angular momentum is
// a_L = −a.
//
// With the Boyer–Lindquist constants of motion E = γ, L = γ v b (per unit
// mass; Carter 1968), the equatorial radial function
//
//	R(r) = (E² − 1) r⁴ + 2M r³ + (a_L²(E² − 1) − L²) r² + 2M (L − a_L E)² r
//
// (e.g. Chandrasekhar, The Mathematical Theory of Black Holes, §61, from
// memory) and dφ/dr = (L r² − 2M r (L − a_L E))/(Δ √R), Δ = r² − 2Mr + a²,
// give in x = b/r, α = a_L/b, μ = M/b
//
//	dφ/dx = Φ/√C,   C = 1 + (2μ/(γv)²) x + (α² − 1) x² + 2μ (1 − α/v)² x³,
//	Φ = (1 − 2μ(1 − α/v) x)/(1 − 2μ x + α² x²).
//
// The deflection χ = |Δφ| − π is evaluated by the subtracted quadrature of
// radialProblem. The Boyer–Lindquist azimuth differs from the Kerr–Schild
// one by a function of r alone, so the total Δφ is the same in both.
// Capture (turning point not outside the outer horizon) returns
// ErrCaptured; for |a| > M (no horizon) reaching r = 0 returns ErrRing.
//
// Convention: χ > 0 is deflection towards the source; the outgoing
// direction is (cos χ, −sin χ, 0).
func KerrEquatorial(v, b, M, a float64) (Scattering, error) {
	g, err := gammaOf(v)
	if err != nil {
		return Scattering{}, err
	}
	if err := checkB(b); err != nil {
		return Scattering{}, err
	}
	if !(M >= 0) || math.IsNaN(a) || math.IsInf(a, 0) {
		return Scattering{}, fmt.Errorf("exact: Kerr parameters M = %v, a = %v invalid (need M ≥ 0, finite a)", M, a)
	}
	mu := M / b
	al := -a / b
	p2 := g * g * v * v
	w := 1 - al/v
	prob := radialProblem{
		d: [5]float64{0, 2 * mu / p2, al * al, 2 * mu * w * w, 0},
		phiM1: func(x float64) float64 {
			return x * (2*mu*al/v - al*al*x) / (1 - 2*mu*x + al*al*x*x)
		},
	}
	xt, ok := prob.turningPoint()
	// Outer horizon at x₊ = b/r₊ = 1/(μ + √(μ² − α²)) when |α| ≤ μ.
	horizon := al*al <= mu*mu && mu > 0
	if horizon && ok {
		xp := 1 / (mu + math.Sqrt((mu-al)*(mu+al)))
		ok = xt < xp
	}
	if !ok {
		if horizon {
			return Scattering{}, fmt.Errorf("%w: Kerr M/b = %g, a/b = %g, v = %g", ErrCaptured, mu, a/b, v)
		}
		return Scattering{}, fmt.Errorf("%w: Kerr M/b = %g, a/b = %g, v = %g", ErrRing, mu, a/b, v)
	}
	chi, e := prob.deflection(xt)
	return towardsSource(chi, e, v), nil
}
