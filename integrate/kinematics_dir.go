package integrate

import (
	"fmt"
	"math"

	"ricochet/background/vec"
)

// IncomingDir returns the in-state of a probe of mass m and Lorentz factor
// gamma moving along the direction dir with impact parameter b along bhat,
// both given in the background's rest frame, carrying the spin vector spin
// given in its own rest frame. It generalises Incoming (dir = x̂,
// bhat = ŷ) to any orientation of the motion relative to a background
// whose spin is fixed along +z: rotating the probe's data instead of the
// source.
//
// dir is normalised; bhat has its component along dir removed and is then
// normalised, so that b is orthogonal to p_in and to the background's
// four-velocity. The rest-frame spin is boosted with v = v dir:
//
//	a⁰ = γ v·a_rest,  a⃗ = a_rest + (γ − 1)(v̂·a_rest) v̂.
//
// An error is returned for invalid m, gamma or b, a zero dir, or bhat
// parallel to dir.
func IncomingDir(m, gamma, b float64, dir, bhat, spin vec.Vec3) (InState, error) {
	in, err := Incoming(m, gamma, b, vec.Vec3{})
	if err != nil {
		return InState{}, err
	}
	dn := dir.Norm()
	if !(dn > 0) || math.IsInf(dn, 0) {
		return InState{}, fmt.Errorf("integrate: direction %v, want a finite non-zero vector", dir)
	}
	n := dir.Scale(1 / dn)
	bp := bhat.Sub(n.Scale(n.Dot(bhat)))
	bn := bp.Norm()
	if !(bn > 1e-12*bhat.Norm()) || math.IsInf(bn, 0) {
		return InState{}, fmt.Errorf("integrate: impact direction %v is parallel to the direction of motion %v", bhat, dir)
	}
	bp = bp.Scale(1 / bn)
	gv := math.Sqrt((gamma - 1) * (gamma + 1))
	v := gv / gamma
	in.P = vec.FromSpatial(m*gamma, n.Scale(m*gv))
	in.B = vec.FromSpatial(0, bp.Scale(b))
	na := n.Dot(spin)
	in.A = vec.FromSpatial(gamma*v*na, spin.Add(n.Scale((gamma-1)*na)))
	return in, nil
}

// motionFrame is the orthonormal spatial frame, as rows, in which Scatter
// integrates: e₁ along p⃗_in, e₂ along the impact parameter b⃗, e₃ = e₁ × e₂.
// The integrator's error control is component-wise relative, so in the
// frame of record (e = x̂, ŷ, ẑ, where motionFrame is exactly the identity)
// the transverse position components stay of order b on the far
// asymptotes, while in a rotated setup every component would be of order
// R and the transverse position would be held only to tol·R. Integrating
// the rotated components keeps the accuracy of the frame of record for any
// orientation.
type motionFrame [3]vec.Vec3

func newMotionFrame(in InState) motionFrame {
	e1 := in.P.Spatial().Unit()
	e2 := in.B.Spatial().Unit()
	return motionFrame{e1, e2, e1.Cross(e2)}
}

// toFrame writes into dst the state src with the spatial parts of its
// position, momentum and spin blocks expressed in the frame (dst may be
// src).
func (f *motionFrame) toFrame(dst, src []float64) {
	copy(dst, src)
	for off := 0; off+4 <= len(src); off += 4 {
		v := vec.Vec3{src[off+1], src[off+2], src[off+3]}
		dst[off+1], dst[off+2], dst[off+3] = f[0].Dot(v), f[1].Dot(v), f[2].Dot(v)
	}
}

// fromFrame is the inverse of toFrame.
func (f *motionFrame) fromFrame(dst, src []float64) {
	copy(dst, src)
	for off := 0; off+4 <= len(src); off += 4 {
		a, b, c := src[off+1], src[off+2], src[off+3]
		for i := 0; i < 3; i++ {
			dst[off+1+i] = f[0][i]*a + f[1][i]*b + f[2][i]*c
		}
	}
}
