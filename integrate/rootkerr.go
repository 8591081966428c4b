package integrate

import (
	"ricochet/background/em"
	"ricochet/background/vec"
)

// RootKerr is the all-multipole root-Kerr probe in a static flat-space
// field, in its Lorentz-generator completion — a non-canonical member of
// the root-Kerr family: its first order is right, its second order is a
// completion choice and not that of a consistent body (it weights the
// probe spin like the source spin and drifts the total angular momentum;
// RootKerrBody is the consistent form): a charge (Q, G) of mass M
// with spin vector a^μ whose coupling to the field is evaluated at the
// Newman–Janis shifted position x − i a (Newman & Janis 1965; the
// Kerr–Newman field as a complex-shifted Coulomb field, Newman 1973; its
// use for the classical probe: Arkani-Hamed, Huang & O'Connell 2020,
// "Kerr black holes as elementary particles", from memory). One and the
// same Lorentz generator rotates momentum and spin:
//
//	dx^μ/dτ = p^μ/M,
//	ω^μ_ν   = Re[(Q − iG)/M 𝔽^μ_ν(x⃗ − i a⃗)],
//	dp^μ/dτ = ω^μ_ν p^ν,
//	da^μ/dτ = ω^μ_ν a^ν,
//
// where 𝔽 is the self-dual tensor of 𝐅 = E + iB and a⃗ the spatial part of
// a in the background frame (the time component of the shift drops out of
// a static field). Limits proved in the tests: at a = 0 this is the
// Lorentz force with g = 2 BMT precession; at first order in a it is the
// BMT probe with g = 2 and the Stern–Gerlach force of the dipole μ = Q a.
//
// The model is linear in the field and exact in the spin; its completion
// beyond first order in the coupling is a choice. This one preserves p·p,
// a·a and a·p exactly, but the energy
//
//	E = p⁰ + Re[(Q − iG) 𝒱(x⃗ − i a⃗)]
//
// is conserved only to first order in the coupling when a has a component
// along the motion: per coordinate time, dE/dt = −a⁰ 𝔈·𝔅/p⁰ with
// 𝔈 = Re[(Q − iG)𝐅(x⃗ − i a⃗)], 𝔅 = Im[(Q − iG)𝐅(x⃗ − i a⃗)]. Its
// conservative sibling is RootKerrConservative; RootKerrFamily lists the
// completions (see "Completions of the root-Kerr probe" in the package
// documentation).
type RootKerr struct {
	Field em.Field
	M     float64 // mass
	Q     float64 // electric charge
	G     float64 // magnetic charge
}

// Name implements Model.
func (r *RootKerr) Name() string { return "root-kerr" }

// Dim implements Model.
func (r *RootKerr) Dim() int { return 12 }

// Mass implements Model.
func (r *RootKerr) Mass() float64 { return r.M }

func shifted(y []float64) vec.CVec3 {
	return vec.Complex(spatial(y, IX), spatial(y, IA).Scale(-1))
}

// Deriv implements Model.
func (r *RootKerr) Deriv(y, dy []float64) {
	im := 1 / r.M
	for i := 0; i < 4; i++ {
		dy[IX+i] = y[IP+i] * im
	}
	F := em.Value(r.Field, shifted(y))
	k := F.Scale(complex(r.Q, -r.G) * complex(im, 0))
	applyGenerator(k, y[IP:IP+4], dy[IP:IP+4])
	applyGenerator(k, y[IA:IA+4], dy[IA:IA+4])
}

// VelocityIsMomentum marks that Deriv sets dx^μ/dτ = p^μ/m exactly (see
// Scatter).
func (r *RootKerr) VelocityIsMomentum() {}

// Energy implements Model.
func (r *RootKerr) Energy(y []float64) float64 { return shiftedEnergy(r.Field, r.Q, r.G, y) }

// shiftedEnergy is p⁰ + Re[(Q − iG) 𝒱(x⃗ − i a⃗)], the energy of both
// root-Kerr completions.
func shiftedEnergy(f em.Field, q, g float64, y []float64) float64 {
	return y[IP] + real(complex(q, -g)*f.Potential(shifted(y)))
}

// EnergyExact implements Model: false, see the type's comment.
func (r *RootKerr) EnergyExact() bool { return false }

// Normalize implements Model.
func (r *RootKerr) Normalize(y []float64, a2 float64) { flatNormalize(y, r.M, a2) }

// Hazard implements Model: the probe's shifted position must not cross the
// source's branch set, which on real x is the disk normal to a_source + a⃗
// of radius |a_source + a⃗|.
func (r *RootKerr) Hazard(y0, y1 []float64) Status { return shiftedHazard(r.Field, y0, y1) }

// shiftedHazard is the Hazard of a probe whose coupling is evaluated at
// x⃗ − i a⃗: a crossing of the disk of radius |a_source + a⃗| normal to
// a_source + a⃗.
func shiftedHazard(f em.Field, y0, y1 []float64) Status {
	return diskHazard(fieldDisk(f, spatial(y0, IA)), y0, y1)
}

// ringFailure returns StatusReachedRing when the state y lies within
// RingFailReach of the rim of the disk d, else StatusIntegratorFailed.
func ringFailure(d em.Disk, y []float64) Status {
	if d.Radius > 0 && d.RimDistance(spatial(y, IX)) < RingFailReach*d.Radius {
		return StatusReachedRing
	}
	return StatusIntegratorFailed
}

// FailureStatus implements failureClassifier: a failure at the ring of
// the shifted disk is the path reaching the ring.
func (r *RootKerr) FailureStatus(y []float64) Status {
	return ringFailure(fieldDisk(r.Field, spatial(y, IA)), y)
}

// diskHazard classifies the step from y0 to y1 against the branch disk d:
// through the disk, StatusCrossedDisk; within RingReach of its rim (the
// singular ring), StatusReachedRing; else StatusRunning.
func diskHazard(d em.Disk, y0, y1 []float64) Status {
	x1 := spatial(y1, IX)
	if d.Crosses(spatial(y0, IX), x1) {
		return StatusCrossedDisk
	}
	if d.Radius > 0 && d.RimDistance(x1) < RingReach*d.Radius {
		return StatusReachedRing
	}
	return StatusRunning
}
