package exact

import (
	"fmt"
	"math"
)

// ReissnerNordstrom returns the exact deflection of a test particle of
// charge-to-mass ratio qm = q/m by a Reissner–Nordström black hole of mass
// M and charge Q, for speed v at infinity and impact parameter b = L/p.
//
// The metric is −f dt² + dr²/f + r² dΩ², f = 1 − 2M/r + Q²/r², with
// potential A = −(Q/r) dt (Reissner 1916, Nordström 1918). The conserved
// energy per unit mass is E = γ = −u_t + qm Q/r, so the normalisation
// u·u = −1 gives (u^r)² = (E − qm Q/r)² − f (1 + L²/r²) and, in x = b/r with
// μ = M/b, ν = Q/b, λ = qm Q/b (the electromagnetic coupling qQ/(m b)),
//
//	(dx/dφ)² = C(x) = 1 + 2(μ − γλ)/(γv)² x + (−1 + (λ² − ν²)/(γv)²) x²
//	                  + 2μ x³ − ν² x⁴
//
// (e.g. Chandrasekhar, The Mathematical Theory of Black Holes, §40, from
// memory). The deflection χ = 2∫₀^{x_t} dx/√C − π is evaluated by the
// subtracted quadrature of radialProblem. If the turning point is not
// outside the outer horizon x₊ = 1/(μ + √(μ² − ν²)) the probe is captured
// and ErrCaptured is returned. Super-extremal |Q| > M is allowed: the
// repulsive core then always provides a turning point.
//
// Checks: Q = 0 is Schwarzschild; M = 0 with Q → 0 at fixed qQ/(m b) is the
// flat-space Coulomb problem, Darwin, with the opposite sign of χ.
//
// Convention: χ > 0 is deflection towards the source (attraction); the
// outgoing direction is (cos χ, −sin χ, 0).
func ReissnerNordstrom(v, b, M, Q, qm float64) (Scattering, error) {
	g, err := gammaOf(v)
	if err != nil {
		return Scattering{}, err
	}
	if err := checkB(b); err != nil {
		return Scattering{}, err
	}
	if !(M >= 0) || math.IsNaN(Q) || math.IsInf(Q, 0) || math.IsNaN(qm) || math.IsInf(qm, 0) {
		return Scattering{}, fmt.Errorf("exact: Reissner–Nordström parameters M = %v, Q = %v, q/m = %v invalid", M, Q, qm)
	}
	mu, nu, lam := M/b, Q/b, qm*Q/b
	p2 := g * g * v * v
	prob := radialProblem{d: [5]float64{0, 2 * (mu - g*lam) / p2, (lam - nu) * (lam + nu) / p2, 2 * mu, -nu * nu}}
	xt, ok := prob.turningPoint()
	if ok && nu*nu <= mu*mu && mu > 0 {
		ok = xt < 1/(mu+math.Sqrt((mu-nu)*(mu+nu)))
	}
	if !ok {
		return Scattering{}, fmt.Errorf("%w: Reissner–Nordström M/b = %g, Q/b = %g, qQ/(mb) = %g, v = %g", ErrCaptured, mu, nu, lam, v)
	}
	chi, e := prob.deflection(xt)
	return towardsSource(chi, e, v), nil
}
