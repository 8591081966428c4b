package exact

import (
	"fmt"
	"math"

	"ricochet/background/vec"
)

// Poincare returns the exact scattering of a point charge q of mass m by a
// fixed magnetic monopole P (field B = P r/r³, Gaussian units), for speed v
// at infinity and impact parameter b (Poincaré 1896). It is Dyon with
// probe (q, 0) and source (0, P): the coupling is μ = qP, the speed is
// constant, the orbit lies on a cone about J = r × p − qP r̂ with
//
//	tan θ_c = L/|qP|,   L = γ m v b,
//
// and the probe turns about Ĵ by Φ = π √(1 + (qP/L)²). Chi is the total
// scattering angle arccos(n̂_out·x̂).
func Poincare(v, b, m, qP float64) (Scattering, error) {
	return Dyon(v, b, m, Charge{Electric: 1}, Charge{Magnetic: qP})
}

// PoincareState returns the exact position and velocity at coordinate time
// t of the probe of Poincare, with t = 0 at closest approach.
//
// The magnetic force does no work and r·F = 0, so d²(r²)/dt² = 2v² and
//
//	r(t) = √(b² + v² t²),
//
// while r̂ turns about Ĵ at the rate |J|/(γ m r²), so its azimuth from the
// incoming asymptote is
//
//	φ(t) = (|J|/L) (π/2 + arctan(v t/b)),
//
// and r̂(φ) lies on the cone given in Dyon. The velocity is
// ṙ r̂ + J × r̂/(γ m r).
func PoincareState(v, b, m, qP, t float64) (pos, vel vec.Vec3, err error) {
	g, err := gammaOf(v)
	if err != nil {
		return pos, vel, err
	}
	if err := checkB(b); err != nil {
		return pos, vel, err
	}
	if !(m > 0) {
		return pos, vel, fmt.Errorf("exact: probe mass m = %v must be positive", m)
	}
	L := g * m * v * b
	rhat, jh, j := coneFrame(qP, L)
	r := math.Hypot(b, v*t)
	phi := j / L * (math.Pi/2 + math.Atan(v*t/b))
	n := rhat(phi)
	pos = n.Scale(r)
	vel = n.Scale(v * v * t / r).Add(jh.Cross(n).Scale(j / (g * m * r)))
	return pos, vel, nil
}
