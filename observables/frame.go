package observables

import (
	"math"

	"ricochet/background/vec"
)

// Frame is the orthonormal spatial triad of the frame of record.
type Frame struct {
	L, B, N vec.Vec3 // longitudinal, impact direction, normal = L × B
}

// NewFrame returns the triad built from the incoming momentum and the
// impact-parameter four-vector (both in the background's rest frame).
func NewFrame(pin, b vec.Vec4) Frame {
	l := pin.Spatial().Unit()
	bh := b.Spatial()
	bh = bh.Sub(l.Scale(l.Dot(bh))).Unit()
	return Frame{L: l, B: bh, N: l.Cross(bh)}
}

// Components returns (v⁰, v·l̂, v·b̂, v·n̂).
func (f Frame) Components(v vec.Vec4) [4]float64 {
	s := v.Spatial()
	return [4]float64{v[0], s.Dot(f.L), s.Dot(f.B), s.Dot(f.N)}
}

// ScatteringAngle returns the angle between the incoming and outgoing
// spatial momenta, in [0, π].
func ScatteringAngle(pin, pout vec.Vec4) float64 {
	a, b := pin.Spatial(), pout.Spatial()
	return math.Atan2(a.Cross(b).Norm(), a.Dot(b))
}

// OutOfPlaneAngle returns the elevation of the outgoing momentum above the
// plane spanned by the incoming momentum and the impact parameter, in
// [−π/2, π/2], positive towards n̂ = l̂ × b̂.
func (f Frame) OutOfPlaneAngle(pout vec.Vec4) float64 {
	s := pout.Spatial()
	n := s.Dot(f.N)
	in := math.Hypot(s.Dot(f.L), s.Dot(f.B))
	return math.Atan2(n, in)
}

// InPlaneAngle returns the signed deflection within the scattering plane,
// positive towards b̂ (away from the source: repulsion).
func (f Frame) InPlaneAngle(pout vec.Vec4) float64 {
	s := pout.Spatial()
	return math.Atan2(s.Dot(f.B), s.Dot(f.L))
}

// ImpactParameterJ returns b_J = |J|/|p⃗_in|, the impact parameter defined
// by the orbital angular momentum J = b × p_in about the background's
// centre. For the covariant b (orthogonal to p_in) it equals |b|; it is
// listed so that tables can state the definition they use.
func ImpactParameterJ(pin, b vec.Vec4) float64 {
	return b.Spatial().Cross(pin.Spatial()).Norm() / pin.Spatial().Norm()
}

// EikonalImpactParameter returns the magnitude of the eikonal impact
// parameter: the component of b orthogonal to p_in + p_out (Amati,
// Ciafaloni & Veneziano 1990 and later eikonal literature, from memory).
// It differs from |b| by O(θ²) for a scattering angle θ:
//
//	b_eik = |b − (b·n̂)n̂|,  n̂ = (p⃗_in + p⃗_out)/|p⃗_in + p⃗_out|.
func EikonalImpactParameter(pin, pout, b vec.Vec4) float64 {
	n := pin.Spatial().Add(pout.Spatial()).Unit()
	bs := b.Spatial()
	return bs.Sub(n.Scale(n.Dot(bs))).Norm()
}
