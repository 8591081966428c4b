package exact

import (
	"fmt"
	"math"
)

// Darwin returns the exact relativistic deflection of a test charge q of
// mass m and speed v at infinity by a fixed point charge Q, with impact
// parameter b (Darwin 1913). The coupling enters only through
//
//	ε = qQ/(m b)  (ε > 0 repulsive).
//
// Derivation (Darwin 1913; also Landau & Lifshitz, Classical Theory of
// Fields, §39, from memory). With E = γm, p = γmv, L = p b and κ = qQ, the
// energy E = m γ(r) + κ/r and the angular momentum give, for u = 1/r,
//
//	(du/dφ)² = 1/b² − 2Eκ u/L² − ω² u²,   ω² = 1 − κ²/L² = 1 − ε²/(γv)²,
//
// a harmonic orbit u = A cos(ωφ) − Eκ/(ω²L²). Its asymptotes are swept by
// Δφ = (2/ω) arccos(β/√(ω² + β²)) with β = Eκ/(p² b) = ε/(γ v²), and the
// deflection χ = π − Δφ is
//
//	χ = π − (2/ω) arctan(ω/β)              β > 0 (repulsive),
//	χ = π − (2/ω) (π − arctan(ω/|β|))      β < 0 (attractive).
//
// For strong repulsion, κ > L, ω = iσ is imaginary and the first form
// continues to χ = π − (2/σ) artanh(σ/β) (the orbit is a hyperbolic cosine
// in u); at κ = L it is χ = π − 2/β. For attraction with |κ| ≥ L the orbit
// spirals into the charge and ErrCaptured is returned.
//
// The non-relativistic limit ω → 1 is Rutherford's χ = 2 arctan(ε/v²)
// (Rutherford 1911). The expansion in ε is DarwinSeries.
//
// Convention: χ > 0 turns the probe away from the source, towards +y; the
// outgoing direction is (cos χ, sin χ, 0).
func Darwin(v, eps float64) (Scattering, error) {
	chi, err := darwinAngle(v, eps)
	if err != nil {
		return Scattering{}, err
	}
	return awayFromSource(chi, 0, v), nil
}

// darwinAngle returns χ of Darwin for speed v and coupling ε = qQ/(m b).
func darwinAngle(v, eps float64) (float64, error) {
	g, err := gammaOf(v)
	if err != nil {
		return 0, err
	}
	if math.IsNaN(eps) || math.IsInf(eps, 0) {
		return 0, fmt.Errorf("exact: coupling ε = %v is not finite", eps)
	}
	if eps == 0 {
		return 0, nil
	}
	k := eps / (g * v)        // κ/L
	beta := eps / (g * v * v) // Eκ/(p² b)
	w2 := (1 - k) * (1 + k)   // ω²
	switch {
	case w2 > 0:
		// π − (2/ω) arctan(ω/β) (repulsive) and π − (2/ω)(π − arctan(ω/|β|))
		// (attractive) are both π(1 − 1/ω) + (2/ω) arctan(β/ω), written
		// with 1 − 1/ω = −(κ/L)²/(ω(1 + ω)) so that nothing cancels at
		// small ε (the first forms lose |log₁₀ χ| digits to rounding).
		w := math.Sqrt(w2)
		return -math.Pi*k*k/(w*(1+w)) + 2/w*math.Atan(beta/w), nil
	case beta > 0 && w2 < 0:
		s := math.Sqrt(-w2)
		return math.Pi - 2/s*math.Atanh(s/beta), nil
	case beta > 0: // κ = L exactly
		return math.Pi - 2/beta, nil
	default:
		return 0, fmt.Errorf("%w: attractive coupling |qQ| = %g L ≥ L (Darwin 1913)", ErrCaptured, math.Abs(k))
	}
}

// DarwinSeries returns the coefficients of the expansion of the Darwin
// deflection in ε = qQ/(m b) at fixed speed v,
//
//	χ = c1 ε + c2 ε² + c3 ε³ + O(ε⁴),
//	c1 = 2/(γ v²),
//	c2 = −π/(2 γ² v²),
//	c3 = 2/(γ³ v⁴) − 2/(3 γ³ v⁶).
//
// Derived here from the closed form of Darwin: with κ/L = ε/(γv) and
// β = ε/(γv²), 1/ω = 1 + κ²/(2L²) + O(ε⁴) and
// χ = π(1 − 1/ω) + (2/ω) arctan(β/ω), so c1 = 2β/ε, c2 = −π/(2(γv)²), and
// c3 ε³ = 2β κ²/L² − (2/3)β³. c1 is the first-order (Coulomb impulse)
// result; c1 and c3 reduce at v → 0 to the expansion of Rutherford's
// 2 arctan(ε/v²) (Rutherford 1911), and c2 is a purely relativistic term.
func DarwinSeries(v float64) (c1, c2, c3 float64) {
	g := 1 / math.Sqrt((1-v)*(1+v))
	v2 := v * v
	c1 = 2 / (g * v2)
	c2 = -math.Pi / (2 * g * g * v2)
	c3 = 2/(g*g*g*v2*v2) - 2/(3*g*g*g*v2*v2*v2)
	return c1, c2, c3
}
