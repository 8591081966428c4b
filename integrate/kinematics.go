package integrate

import (
	"fmt"
	"math"

	"ricochet/background/vec"
)

// InState is the asymptotic incoming data of a probe in the background's
// rest frame (the frame of record).
type InState struct {
	P vec.Vec4 // incoming four-momentum p_in (its mass is √(−p·p))
	B vec.Vec4 // covariant impact parameter: orthogonal to p_in and to the background's four-velocity (1,0,0,0), from the background to the probe's incoming asymptote
	A vec.Vec4 // incoming spin vector a_in (a·p = 0); zero for spinless probes
}

// Incoming returns the in-state of the frame of record: a probe of mass m
// and Lorentz factor gamma moving along +x with impact parameter b along
// +y, carrying the spin vector spin given in its own rest frame (a rest
// spin along +z means angular momentum along +z). The rest-frame spin is
// boosted to the background frame:
//
//	a⁰ = γ v·a_rest,  a⃗ = a_rest + (γ − 1)(v̂·a_rest) v̂.
func Incoming(m, gamma, b float64, spin vec.Vec3) (InState, error) {
	if !(m > 0) || math.IsInf(m, 0) {
		return InState{}, fmt.Errorf("integrate: mass = %v, want 0 < m < ∞", m)
	}
	if !(gamma > 1) || math.IsInf(gamma, 0) {
		return InState{}, fmt.Errorf("integrate: gamma = %v, want 1 < γ < ∞", gamma)
	}
	if !(b > 0) || math.IsInf(b, 0) {
		return InState{}, fmt.Errorf("integrate: impact parameter b = %v, want 0 < b < ∞", b)
	}
	gv := math.Sqrt((gamma - 1) * (gamma + 1))
	v := gv / gamma
	in := InState{
		P: vec.Vec4{m * gamma, m * gv, 0, 0},
		B: vec.Vec4{0, 0, b, 0},
	}
	in.A = vec.Vec4{gamma * v * spin[0], gamma * spin[0], spin[1], spin[2]}
	return in, nil
}

// Mass returns √(−p_in·p_in).
func (in InState) Mass() float64 { return math.Sqrt(-in.P.Dot(in.P)) }

// ImpactParameter returns |b|.
func (in InState) ImpactParameter() float64 { return math.Sqrt(in.B.Dot(in.B)) }

// Validate checks the in-state's constraints and returns a one-line error
// naming the first one violated.
func (in InState) Validate() error {
	m2 := -in.P.Dot(in.P)
	if !(m2 > 0) || !(in.P[0] > 0) {
		return fmt.Errorf("integrate: in-state momentum %v is not future timelike", in.P)
	}
	scale := in.P[0]
	bb := in.B.Dot(in.B)
	if !(bb > 0) {
		return fmt.Errorf("integrate: impact parameter %v is not spacelike", in.B)
	}
	b := math.Sqrt(bb)
	if math.Abs(in.B[0]) > 1e-12*b || math.Abs(in.B.Dot(in.P)) > 1e-12*b*scale {
		return fmt.Errorf("integrate: impact parameter %v must be orthogonal to p_in and to (1,0,0,0)", in.B)
	}
	if in.A != (vec.Vec4{}) && math.Abs(in.A.Dot(in.P)) > 1e-12*scale*math.Sqrt(math.Abs(in.A.Dot(in.A))+1e-300) {
		return fmt.Errorf("integrate: spin %v is not orthogonal to p_in", in.A)
	}
	return nil
}
