package exact

import (
	"fmt"
	"math"
)

// RootKerrAligned returns the exact deflection of an all-multipole
// root-Kerr probe by a root-Kerr source when both spins are orthogonal to
// the plane of motion (the aligned configuration), for speed v at infinity,
// coupling ε = κ/(m b) and total ring parameter α = (a_source + a_probe)/b,
// both spins along ±z (signed z components; a probe spin along +z means
// angular momentum along +z).
//
// κ = Re[(q − ig)(Q + iP)] is the coupling of the probe's charges (q, g)
// to the source's (Q, P); the reduction below needs the duality phases to
// be aligned, Im[(q − ig)(Q + iP)] = 0 (e.g. electric charges only):
// otherwise the force has a component out of the plane and the motion is
// not planar.
//
// Derivation (ours). The probe's coupling is evaluated at the complex
// point x − i a_probe, so it sees a root-Kerr field of ring parameter
// A = a_source + a_probe along z (em.RootKerr). In the plane z = 0,
// w = x − iAẑ has w·w = r² − A², and with C = Q + iP, c = q − ig,
//
//	U  = Re[c𝒱] = κ/√(r² − A²),
//	𝔈  = Re[c𝐅] = κ x⃗/(r² − A²)^{3/2}            (in the plane),
//	𝔅  = Im[c𝐅] = −κA ẑ/(r² − A²)^{3/2}          (normal to it),
//
// so the force 𝔈 + v × 𝔅 stays in the plane and the spin, parallel to 𝔅,
// does not precess (the torque (a⁰𝔈 + a⃗ × 𝔅)/p⁰ vanishes with a⁰ = 0):
// the probe moves in the plane in the central potential U(r) and the
// perpendicular magnetic field 𝔅_z(r). Energy E = p⁰ + U(r) is conserved,
// and d(x × p)_z/dt = −𝔅_z r ṙ gives the conserved canonical angular
// momentum
//
//	L = (x × p)_z + A U(r)        (∫ 𝔅_z r dr = A U).
//
// With ℓ = −L = b p_∞ (incoming along +x with b along +y), the kinetic
// angular momentum is −(ℓ + AU), and the mass shell (E − U)² = m² + p_r² +
// (ℓ + AU)²/r² gives, in x = b/r, u = U/p_∞ = ε x/(γv √(1 − α²x²)),
//
//	dφ/dx = Φ(x)/√C(x),   Φ = 1 + αu,
//	C(x)  = 1 − (2/v) u + u² − (1 + αu)² x²,
//
// and the deflection χ = π − 2∫₀^{x_t} Φ/√C dx, with x_t the first zero of
// C (r_min > |A| necessarily, since the orbit comes in from x = 0). At
// α = 0 this is Darwin's problem (Darwin 1913).
//
// Quadrature: x = x_t(1 − t²) removes the turning-point singularity; C is
// divided by (x_t − x) analytically (each of its terms written as a
// difference quotient) so that no cancellation occurs near t = 0; the flat
// integrand with the same x_t, whose integral is π/2, is subtracted; the
// result goes to the graded Gauss–Legendre rule of radialProblem.
//
// Errors: ErrRing if the probe reaches the ring r = |A| (no turning point
// outside it), ErrCaptured if it falls into the centre (α = 0, strong
// attraction), and an error for invalid input.
//
// Convention: as for Darwin, χ > 0 turns the probe away from the source,
// towards +y; the outgoing direction is (cos χ, sin χ, 0).
func RootKerrAligned(v, eps, alpha float64) (Scattering, error) {
	g, err := gammaOf(v)
	if err != nil {
		return Scattering{}, err
	}
	if math.IsNaN(eps) || math.IsInf(eps, 0) || math.IsNaN(alpha) || math.IsInf(alpha, 0) {
		return Scattering{}, fmt.Errorf("exact: root-Kerr aligned parameters ε = %v, α = %v invalid", eps, alpha)
	}
	p := alignedProblem{eta: 1 / v, k: eps / (g * v), alpha: alpha}
	xt, err := p.turningPoint()
	if err != nil {
		return Scattering{}, fmt.Errorf("%w: root-Kerr aligned ε = %g, α = %g, v = %g", err, eps, alpha, v)
	}
	chi, e := p.deflection(xt)
	return awayFromSource(chi, e, v), nil
}

// alignedProblem is the orbit integral of RootKerrAligned in x = b/r.
type alignedProblem struct {
	eta   float64 // E/p_∞ = 1/v
	k     float64 // ε/(γv)
	alpha float64 // A/b
}

// xmax is the ring, x = 1/|α| (infinite for α = 0).
func (p alignedProblem) xmax() float64 {
	if p.alpha == 0 {
		return math.Inf(1)
	}
	return 1 / math.Abs(p.alpha)
}

func (p alignedProblem) sqrtS(x float64) float64 {
	ax := p.alpha * x
	return math.Sqrt((1 - ax) * (1 + ax))
}

func (p alignedProblem) u(x float64) float64 { return p.k * x / p.sqrtS(x) }

// c is C(x).
func (p alignedProblem) c(x float64) float64 {
	u := p.u(x)
	w := (1 + p.alpha*u) * x
	return 1 - 2*p.eta*u + u*u - w*w
}

// turningPoint returns the first zero x_t of C on (0, xmax), located by a
// scan (uniform in x/xmax, refined geometrically towards the ring, or in
// x/(1 + x) for α = 0) followed by bisection to full precision.
func (p alignedProblem) turningPoint() (float64, error) {
	xm := p.xmax()
	at := func(y float64) float64 {
		if math.IsInf(xm, 1) {
			return y / (1 - y)
		}
		return xm * y
	}
	const n = 4096
	var ys []float64
	for i := 1; i < n; i++ {
		ys = append(ys, float64(i)/n)
	}
	for k := 1; k <= 38; k++ { // down to 1 − 2⁻⁵⁰: |A| − r_min ≳ 1e-15 |A|
		ys = append(ys, 1-math.Ldexp(1, -12-k))
	}
	lo := 0.0
	for _, y := range ys {
		cy := p.c(at(y))
		if math.IsNaN(cy) {
			break
		}
		if cy > 0 {
			lo = y
			continue
		}
		hi := y
		for it := 0; it < 200 && hi-lo > 1e-17; it++ {
			mid := 0.5 * (lo + hi)
			if mid <= lo || mid >= hi {
				break
			}
			if p.c(at(mid)) > 0 {
				lo = mid
			} else {
				hi = mid
			}
		}
		// The two ends bracket the zero; take the one with the smaller |C|.
		if math.Abs(p.c(at(lo))) < math.Abs(p.c(at(hi))) {
			return at(lo), nil
		}
		return at(hi), nil
	}
	if math.IsInf(xm, 1) {
		return 0, ErrCaptured
	}
	return 0, ErrRing
}

// deflection returns χ = π − Δφ and an error estimate.
func (p alignedProblem) deflection(xt float64) (chi, chiErr float64) {
	a := p.alpha
	st := p.sqrtS(xt)
	ut := p.u(xt)
	wt := (1 + a*ut) * xt
	sq := math.Sqrt(xt)
	f := func(t, omt float64) float64 {
		x := xt * omt * (1 + t)
		s := p.sqrtS(x)
		u := p.k * x / s
		w := (1 + a*u) * x
		// Difference quotients (q(x) − q(x_t))/(x − x_t).
		du := p.k * (x + xt) / ((x*st + xt*s) * s * st)
		dw := 1 + a*(u+xt*du)
		D := -du*(-2*p.eta+u+ut) + dw*(w+wt) // C(x)/(x_t − x)
		H := xt + x                          // the same for the flat orbit
		phi := 1 + a*u
		return 2 * sq * (phi/math.Sqrt(D) - 1/math.Sqrt(H))
	}
	val, e := gradedQuad(f)
	return -2 * val, 2 * e
}
