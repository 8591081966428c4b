package exact

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mathext"
)

// Schwarzschild returns the exact deflection of a timelike geodesic by a
// Schwarzschild black hole of mass M, for speed v at infinity and impact
// parameter b = L/p (L the angular momentum, p the momentum at infinity).
//
// With E = γ, L = γ v b per unit mass and x = b/r the geodesic equations
// (Schwarzschild 1916; e.g. Chandrasekhar, The Mathematical Theory of Black
// Holes, §19, from memory) give
//
//	(dx/dφ)² = C(x) = 1 + (2μ/(γv)²) x − x² + 2μ x³,   μ = M/b,
//
// and the deflection χ = 2∫₀^{x_t} dx/√C − π, with x_t the smallest positive
// root of C, is evaluated by the subtracted quadrature of radialProblem. The
// result is accurate to about 1e-13 relative (ChiErr is the quadrature's
// estimate). If C has no positive root the probe falls into the hole and
// ErrCaptured is returned.
//
// Convention: χ > 0 is deflection towards the source; the outgoing
// direction is (cos χ, −sin χ, 0). The weak-field expansion is given by
// SchwarzschildPM.
func Schwarzschild(v, b, M float64) (Scattering, error) {
	p, xt, err := schwarzschildSetup(v, b, M)
	if err != nil {
		return Scattering{}, err
	}
	chi, e := p.deflection(xt)
	return towardsSource(chi, e, v), nil
}

func schwarzschildSetup(v, b, M float64) (radialProblem, float64, error) {
	g, err := gammaOf(v)
	if err != nil {
		return radialProblem{}, 0, err
	}
	if err := checkB(b); err != nil {
		return radialProblem{}, 0, err
	}
	if !(M >= 0) {
		return radialProblem{}, 0, fmt.Errorf("exact: mass M = %v must be non-negative", M)
	}
	mu := M / b
	p2 := g * g * v * v
	prob := radialProblem{d: [5]float64{0, 2 * mu / p2, 0, 2 * mu, 0}}
	xt, ok := prob.turningPoint()
	if !ok || 2*mu*xt >= 1 {
		return radialProblem{}, 0, fmt.Errorf("%w: no turning point outside the horizon (M/b = %g, v = %g)", ErrCaptured, mu, v)
	}
	return prob, xt, nil
}

// SchwarzschildElliptic returns the same deflection angle as Schwarzschild
// by a second route, the closed form in incomplete elliptic integrals of the
// first kind (e.g. Darwin, Proc. R. Soc. A 249, 180 (1959), for null rays,
// from memory; the timelike case follows the same reduction). With the
// roots x1 < 0 < x2 = x_t < x3 of C = 2μ(x − x1)(x − x2)(x − x3), the
// substitution x = x2 − (x2 − x1) cos²ϑ gives
//
//	χ = 4/√(2μ(x3 − x1)) [K(k) − F(φ0, k)] − π,
//	k² = (x2 − x1)/(x3 − x1),   sin²φ0 = −x1/(x2 − x1).
//
// K and F are evaluated with gonum mathext (Carlson's symmetric forms). The
// difference K − F of two O(1) numbers loses relative accuracy as μ → 0, so
// this route is a cross-check for moderate μ, not a replacement.
func SchwarzschildElliptic(v, b, M float64) (float64, error) {
	_, x2, err := schwarzschildSetup(v, b, M)
	if err != nil {
		return 0, err
	}
	mu := M / b
	if mu == 0 {
		return 0, nil
	}
	// C(x) = (x2 − x) G(x), G = −2μ x² + (1 − 2μ x2) x + 1/x2 has the roots x1, x3.
	a, bb, c := -2*mu, 1-2*mu*x2, 1/x2
	q := -0.5 * (bb + math.Copysign(math.Sqrt(bb*bb-4*a*c), bb))
	r1, r2 := q/a, c/q
	x1, x3 := math.Min(r1, r2), math.Max(r1, r2)
	m := (x2 - x1) / (x3 - x1)
	phi0 := math.Asin(math.Sqrt(-x1 / (x2 - x1)))
	return 4/math.Sqrt(2*mu*(x3-x1))*(mathext.CompleteK(m)-mathext.EllipticF(phi0, m)) - math.Pi, nil
}

// SchwarzschildPM returns the coefficients of the weak-field
// (post-Minkowskian) expansion of the test-mass deflection angle
//
//	χ = χ1 (M/b) + χ2 (M/b)² + χ3 (M/b)³ + O((M/b)⁴),
//
// for the total angle χ and b = L/p:
//
//	χ1 = 2(2γ² − 1)/(γ² − 1)                         (Einstein; 1PM)
//	χ2 = (3π/4)(5γ² − 1)/(γ² − 1)                    (Westpfahl 1985; 2PM)
//	χ3 = 2(64γ⁶ − 120γ⁴ + 60γ² − 5)/(3(γ² − 1)³)     (Damour 2018, Bini–Damour; 3PM, test mass)
//
// all from memory. The convention is confirmed by the tests, which extract
// the coefficients from the exact quadrature; χ3 → 128/3 and χ2 → 15π/4 at
// γ → ∞ reproduce the known light-bending series 4M/b + (15π/4)(M/b)² +
// (128/3)(M/b)³.
func SchwarzschildPM(v float64) (chi1, chi2, chi3 float64) {
	g2 := 1 / ((1 - v) * (1 + v))
	d := g2 - 1 // γ² − 1 = γ² v²
	chi1 = 2 * (2*g2 - 1) / d
	chi2 = 3 * math.Pi / 4 * (5*g2 - 1) / d
	chi3 = 2 * (64*g2*g2*g2 - 120*g2*g2 + 60*g2 - 5) / (3 * d * d * d)
	return chi1, chi2, chi3
}
