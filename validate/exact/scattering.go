package exact

import (
	"errors"
	"fmt"
	"math"

	"ricochet/background/vec"
)

// Outcomes that are not a scattering angle.
var (
	// ErrCaptured reports a probe that does not escape: it spirals into a
	// point source or falls through a horizon.
	ErrCaptured = errors.New("exact: probe is captured")
	// ErrRing reports a probe that reaches the ring singularity (r = 0 in
	// Boyer–Lindquist coordinates) of a horizonless Kerr source.
	ErrRing = errors.New("exact: probe reaches the ring singularity")
)

// Scattering is the exact outcome of a scattering event in the frame of
// record (source at rest at the origin, probe incoming along +x, impact
// parameter along +y).
type Scattering struct {
	// Chi is the deflection angle in radians; its sign convention is stated
	// by the function that returns it. |Chi| may exceed π for orbits that
	// wind around the source.
	Chi float64
	// Dir is the outgoing unit direction of motion.
	Dir vec.Vec3
	// ImpulsePerMass is Δp^μ/m = u_out − u_in, the impulse per unit probe
	// mass. Its time component vanishes for a static source.
	ImpulsePerMass vec.Vec4
	// ChiErr is an estimate of the absolute error of Chi: zero for closed
	// forms (exact up to rounding), the quadrature error estimate otherwise.
	ChiErr float64
}

// gammaOf returns the Lorentz factor of speed v, or an error if v ∉ (0, 1).
func gammaOf(v float64) (float64, error) {
	if !(v > 0 && v < 1) {
		return 0, fmt.Errorf("exact: speed v = %v outside (0, 1)", v)
	}
	return 1 / math.Sqrt((1-v)*(1+v)), nil
}

func checkB(b float64) error {
	if !(b > 0) || math.IsInf(b, 0) {
		return fmt.Errorf("exact: impact parameter b = %v must be positive and finite", b)
	}
	return nil
}

// fromDir fills in the impulse for a probe of speed v leaving along dir.
func fromDir(chi, chiErr, v float64, dir vec.Vec3) Scattering {
	g := 1 / math.Sqrt((1-v)*(1+v))
	p := g * v
	d := dir.Sub(vec.Vec3{1, 0, 0}).Scale(p)
	return Scattering{Chi: chi, Dir: dir, ImpulsePerMass: vec.FromSpatial(0, d), ChiErr: chiErr}
}

// awayFromSource returns the scattering for an in-plane deflection where χ > 0
// turns the probe towards +y (away from a source below it).
func awayFromSource(chi, chiErr, v float64) Scattering {
	return fromDir(chi, chiErr, v, vec.Vec3{math.Cos(chi), math.Sin(chi), 0})
}

// towardsSource returns the scattering for an in-plane deflection where
// χ > 0 turns the probe towards −y, i.e. towards the source.
func towardsSource(chi, chiErr, v float64) Scattering {
	return fromDir(chi, chiErr, v, vec.Vec3{math.Cos(chi), -math.Sin(chi), 0})
}
