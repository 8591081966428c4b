package integrate

import (
	"ricochet/background/em"
	"ricochet/background/vec"
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

// VelocityIsMomentum marks that Deriv sets dx^μ/dτ = p^μ/m exactly (see
// Scatter).
func (c *Charge) VelocityIsMomentum() {}

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
	return diskHazard(fieldDisk(c.Field, vec.Vec3{}), y0, y1)
}

// HazardFree implements HazardFreer: a field without a branch disk (every
// field but a shifted root-Kerr one) has no forbidden passage.
func (c *Charge) HazardFree() bool { return !(fieldDisk(c.Field, vec.Vec3{}).Radius > 0) }

// DerivFunc implements DerivFuncer: for an unshifted point source
// (Coulomb, monopole, dyon, or a root-Kerr field with a = 0) the field is
// real, E = Q_s x⃗/r³ and B = P_s x⃗/r³, and with the generator's electric
// and magnetic parts A⃗ = ((q Q_s + g P_s)/m) x⃗/r³ and
// C⃗ = ((q P_s − g Q_s)/m) x⃗/r³ (the real and imaginary parts of
// (q − ig)(E + iB)/m) the force of Deriv reads
//
//	dp⁰/dτ = A⃗·p⃗,   dp⃗/dτ = A⃗ p⁰ + p⃗ × C⃗,
//
// in real arithmetic. Other fields use Deriv.
func (c *Charge) DerivFunc() func(y, dy []float64) {
	if k := c.pointForce(); k != nil {
		return pointDeriv(c.M, k)
	}
	return nil
}

// pointForce implements pointForcer: the force of DerivFunc for an
// unshifted point source, nil for other fields.
func (c *Charge) pointForce() pointForce {
	qs, ps, ok := unshiftedDyon(c.Field)
	if !ok {
		return nil
	}
	im := 1 / c.M
	ca, cc := (c.Q*qs+c.G*ps)*im, (c.Q*ps-c.G*qs)*im
	if cc == 0 {
		return &coulombForce{ca: ca}
	}
	return &dyonForce{ca: ca, cc: cc}
}

// coulombForce is dyonForce without its magnetic part (cc = 0: a charge
// in an electric field, or a dyon whose charges are proportional to the
// source's): a central force.
type coulombForce struct{ ca float64 }

// force implements pointForce: dp⁰/dτ = A⃗·p⃗, dp⃗/dτ = A⃗ p⁰ with
// A⃗ = ca x⃗/r³.
func (k *coulombForce) force(x1, x2, x3, r2, r, p0, p1, p2, p3 float64) (f0, s, g1, g2, g3 float64) {
	// 1/r³ = r (1/r²)², whose division runs beside the square root.
	ir2 := 1 / r2
	i3 := r * ir2 * ir2
	f0 = k.ca * (x1*p1 + x2*p2 + x3*p3) * i3
	s = k.ca * p0 * i3
	return
}

// dyonForce is the Lorentz force of an unshifted point dyon (see
// Charge.DerivFunc) with ca = (q Q_s + g P_s)/m and cc = (q P_s − g Q_s)/m.
type dyonForce struct{ ca, cc float64 }

// force implements pointForce: A⃗ = ca x⃗/r³, C⃗ = cc x⃗/r³,
// dp⁰/dτ = A⃗·p⃗, dp⃗/dτ = A⃗ p⁰ + p⃗ × C⃗: the central part
// s x⃗ = (ca p⁰/r³) x⃗ and g⃗ = p⃗ × C⃗.
func (k *dyonForce) force(x1, x2, x3, r2, r, p0, p1, p2, p3 float64) (f0, s, g1, g2, g3 float64) {
	i3 := 1 / (r2 * r)
	a, cm := k.ca*i3, k.cc*i3
	f0 = a * (x1*p1 + x2*p2 + x3*p3)
	s = a * p0
	g1 = cm * (p2*x3 - p3*x2)
	g2 = cm * (p3*x1 - p1*x3)
	g3 = cm * (p1*x2 - p2*x1)
	return
}

// unshiftedDyon reports whether f is the field of a point dyon at the
// origin with no Newman–Janis shift (em.Coulomb, em.Monopole, em.Dyon, or
// em.RootKerr with a = 0), and its electric and magnetic charges.
func unshiftedDyon(f em.Field) (q, p float64, ok bool) {
	var rk em.RootKerr
	switch g := f.(type) {
	case em.RootKerr:
		rk = g
	case interface{ RootKerr() em.RootKerr }:
		rk = g.RootKerr()
	default:
		return 0, 0, false
	}
	return rk.Q, rk.P, rk.A == (vec.Vec3{})
}

// FailureStatus implements failureClassifier: a failure at the ring of
// the source's branch disk is the path reaching the ring.
func (c *Charge) FailureStatus(y []float64) Status {
	return ringFailure(fieldDisk(c.Field, vec.Vec3{}), y)
}
