package integrate

import (
	"ricochet/background/em"
)

// Charge is a point charge or dyon of mass M, electric charge Q and
// magnetic charge G in a static flat-space field (Gaussian units):
//
//	dx^μ/dτ = p^μ/M,
//	dp^μ/dτ = Re[(Q − iG)/M 𝔽^μ_ν] p^ν,
//
// with 𝔽 the self-dual field tensor built from 𝐅 = E + iB, so that the
// three-force is Q(E + v×B) + G(B − v×E): the Lorentz force (Lorentz 1895)
// and its electric–magnetic duality image for a magnetic charge (Dirac
// 1931; Schwinger 1969, from memory). The energy
//
//	E = p⁰ + Re[(Q − iG) 𝒱(x)],   𝐅 = −∇𝒱,
//
// is conserved exactly.
type Charge struct {
	Field em.Field
	M     float64 // mass
	Q     float64 // electric charge
	G     float64 // magnetic charge
}

// Name implements Model.
func (c *Charge) Name() string {
	if c.G != 0 {
		return "dyon"
	}
	return "charge"
}

// Dim implements Model.
func (c *Charge) Dim() int { return 8 }

// Mass implements Model.
func (c *Charge) Mass() float64 { return c.M }

// Deriv implements Model.
func (c *Charge) Deriv(y, dy []float64) {
	im := 1 / c.M
	for i := 0; i < 4; i++ {
		dy[IX+i] = y[IP+i] * im
	}
	F := em.Value(c.Field, spatial(y, IX).Lift())
	k := F.Scale(complex(c.Q, -c.G) * complex(im, 0))
	applyGenerator(k, y[IP:IP+4], dy[IP:IP+4])
}

// Energy implements Model.
func (c *Charge) Energy(y []float64) float64 {
	return y[IP] + real(complex(c.Q, -c.G)*c.Field.Potential(spatial(y, IX).Lift()))
}

// EnergyExact implements Model.
func (c *Charge) EnergyExact() bool { return true }

// Normalize implements Model.
func (c *Charge) Normalize(y []float64, a2 float64) { flatNormalize(y, c.M, a2) }

// Hazard implements Model: the path of a point charge must not cross the
// branch disk of a root-Kerr source.
func (c *Charge) Hazard(y0, y1 []float64) Status {
	d := fieldDisk(c.Field, [3]float64{})
	if d.Crosses(spatial(y0, IX), spatial(y1, IX)) {
		return StatusCrossedDisk
	}
	return StatusRunning
}
