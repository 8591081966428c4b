package integrate

import "ricochet/background/vec"

// Offsets of the blocks of the state vector.
const (
	IX = 0 // position x^μ
	IP = 4 // kinetic four-momentum p^μ
	IA = 8 // spin vector a^μ
)

// Model is a probe in a given background: its equations of motion and the
// conserved quantities used to set up and read out a scattering event.
type Model interface {
	// Name identifies the model in output.
	Name() string
	// Dim is 8 for spinless models and 12 for spinning ones.
	Dim() int
	// Mass is the probe's rest mass m > 0.
	Mass() float64
	// Deriv writes dy/dτ for proper time τ. It must not retain y or dy.
	Deriv(y, dy []float64)
	// Energy returns the energy E(y) that tends to p⁰ at infinity and is
	// conserved by Deriv in a stationary background (exactly or, for some
	// models, to first order in the coupling: see EnergyExact).
	Energy(y []float64) float64
	// EnergyExact reports whether Energy is an exact constant of Deriv.
	EnergyExact() bool
	// Normalize enforces the constraints: the mass shell p·p = −m² (by
	// solving for p⁰ from the spatial momentum) and, for spinning models,
	// a·p = 0 (by solving for a⁰) followed by a rescaling of a to a·a = a2.
	Normalize(y []float64, a2 float64)
	// Hazard reports a forbidden passage on the segment between the
	// positions of y0 and y1 (a branch disk, a horizon, a string), or
	// StatusRunning when there is none.
	Hazard(y0, y1 []float64) Status
}

// Pos returns the position block of y.
func Pos(y []float64) vec.Vec4 { return vec.Vec4{y[IX], y[IX+1], y[IX+2], y[IX+3]} }

// Mom returns the momentum block of y.
func Mom(y []float64) vec.Vec4 { return vec.Vec4{y[IP], y[IP+1], y[IP+2], y[IP+3]} }

// Spin returns the spin block of y, or zero for a spinless state.
func Spin(y []float64) vec.Vec4 {
	if len(y) < IA+4 {
		return vec.Vec4{}
	}
	return vec.Vec4{y[IA], y[IA+1], y[IA+2], y[IA+3]}
}

func put(y []float64, off int, v vec.Vec4) {
	if off+4 > len(y) {
		return
	}
	y[off], y[off+1], y[off+2], y[off+3] = v[0], v[1], v[2], v[3]
}

// flatNormalize is Model.Normalize for Minkowski space.
func flatNormalize(y []float64, m, a2 float64) {
	p2 := y[IP+1]*y[IP+1] + y[IP+2]*y[IP+2] + y[IP+3]*y[IP+3]
	y[IP] = sqrt(m*m + p2)
	if len(y) < IA+4 {
		return
	}
	y[IA] = (y[IA+1]*y[IP+1] + y[IA+2]*y[IP+2] + y[IA+3]*y[IP+3]) / y[IP]
	cur := -y[IA]*y[IA] + y[IA+1]*y[IA+1] + y[IA+2]*y[IA+2] + y[IA+3]*y[IA+3]
	if cur > 0 && a2 > 0 {
		f := sqrt(a2 / cur)
		for i := IA; i < IA+4; i++ {
			y[i] *= f
		}
	}
}

// DerivFuncer is an optional interface of a Model. DerivFunc returns a
// right-hand side equivalent to Deriv (equal to rounding) for the model's
// parameters as they are at the time of the call, specialised once: the
// background's family resolved, interface dispatch and complex arithmetic
// removed where they are not needed (a real field where the Newman–Janis
// shift vanishes). Scatter and FirstOrder call it once per event and use
// the result for every evaluation; a model without it (or returning nil)
// is evaluated through Deriv. The returned function may share the model's
// work storage, like Deriv.
type DerivFuncer interface {
	DerivFunc() func(y, dy []float64)
}

// derivOf returns the model's specialised right-hand side if it has one,
// else its Deriv.
func derivOf(m Model) func(y, dy []float64) {
	if f, ok := m.(DerivFuncer); ok {
		if d := f.DerivFunc(); d != nil {
			return d
		}
	}
	return m.Deriv
}

// HazardFreer is an optional interface of a Model: HazardFree reports
// that, for the model's parameters as they are at the time of the call, no
// forbidden passage exists (no branch disk, horizon or string), so that
// Hazard would return StatusRunning on every segment. Scatter asks once
// per event and then skips Hazard and the per-step bookkeeping it needs.
type HazardFreer interface {
	HazardFree() bool
}

// hazardFree reports whether m declares itself free of hazards.
func hazardFree(m Model) bool {
	h, ok := m.(HazardFreer)
	return ok && h.HazardFree()
}

// CaptureSpherer is an optional interface of a Model: CaptureSphere
// reports that, for the model's parameters as they are at the time of the
// call, Hazard is a capture sphere: on a segment that starts outside the
// sphere of radius r about the origin (in the coordinates of the state,
// Euclidean |x⃗|), it returns StatusCaptured exactly when the segment ends
// inside, and StatusRunning otherwise (the segments of a path start where
// the last one ended, outside, or the path was captured there). Scatter then skips Hazard and watches the sphere with the event
// that already watches its capture radius (the larger of the two radii
// counts), so that the per-step conversion to the model's state and the
// Hazard call drop out.
type CaptureSpherer interface {
	CaptureSphere() (r float64, ok bool)
}

// captureSphere returns the capture sphere of m, if it declares one.
func captureSphere(m Model) (float64, bool) {
	if c, ok := m.(CaptureSpherer); ok {
		return c.CaptureSphere()
	}
	return 0, false
}
