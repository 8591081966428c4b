package observables

import (
	"math"

	"ricochet/background/vec"
)

// Sweep follows the angle ψ = atan2(x·b̂, x·l̂) of the probe's position
// projected on the plane of the frame of record (l̂, b̂) along a path, so
// that a deflection past π is read without folding: the angle between
// p_in and p_out (ScatteringAngle) lies in [0, π], while an orbit that
// whirls around the source (zoom–whirl orbits of strong-field gravity)
// turns its direction by more. Feed it the positions of the path in
// order (Add); Deflection unwraps the in-plane angle of p_out with it.
type Sweep struct {
	fr    Frame
	first float64 // ψ at the first point
	last  float64 // ψ at the last point
	turn  float64 // accumulated change of ψ between the points
	n     int
}

// NewSweep returns a Sweep in the frame fr.
func NewSweep(fr Frame) *Sweep { return &Sweep{fr: fr} }

// Add adds the next position of the path. Consecutive positions must be
// less than π apart in ψ (a resolved path).
func (s *Sweep) Add(x vec.Vec3) {
	psi := math.Atan2(x.Dot(s.fr.B), x.Dot(s.fr.L))
	if s.n == 0 {
		s.first = psi
	} else {
		s.turn += wrapAngle(psi - s.last)
	}
	s.last = psi
	s.n++
}

// wrapAngle maps x to (−π, π].
func wrapAngle(x float64) float64 {
	x = math.Remainder(x, 2*math.Pi)
	if x <= -math.Pi {
		x += 2 * math.Pi
	}
	return x
}

// Deflection returns the in-plane deflection of the outgoing momentum,
// positive towards b̂ (away from the source) like Frame.InPlaneAngle but
// unwrapped by the path, and the number of full turns the position made
// about n̂. The position starts at ψ → π (incoming from −l̂ with b̂
// offset) and ends along p_out; the total turn of ψ is
//
//	Δψ = wrap(ψ_first − π) + Σ wrap(ψ_{k+1} − ψ_k) + wrap(θ_out − ψ_last),
//
// with θ_out = InPlaneAngle(p_out), and the deflection is θ = Δψ + π: the
// folded angle θ_out plus the multiple of 2π the path gives it. A
// straight line has Δψ = −π and θ = 0; an attracted probe that turns by
// more than π about the source has θ < −π. Without points the folded
// angle is returned with no turns.
func (s *Sweep) Deflection(pout vec.Vec4) (theta float64, windings int) {
	out := s.fr.InPlaneAngle(pout)
	if s.n == 0 {
		return out, 0
	}
	dpsi := wrapAngle(s.first-math.Pi) + s.turn + wrapAngle(out-s.last)
	return dpsi + math.Pi, int(math.Abs(dpsi) / (2 * math.Pi))
}
