package em

import "ricochet/background/vec"

// Uniform is the constant field 𝐅 = E + iB with the potential
//
//	𝒱(z) = −𝐅·z,
//
// zero at the origin (it has no finite value at infinity).
type Uniform struct {
	E, B vec.Vec3
}

// F returns the constant complex field E + iB.
func (u Uniform) F() vec.CVec3 { return vec.Complex(u.E, u.B) }

// At returns the constant field and a zero Jacobian.
func (u Uniform) At(z vec.CVec3) (vec.CVec3, [3]vec.CVec3) {
	return u.F(), [3]vec.CVec3{}
}

// Potential returns −𝐅·z.
func (u Uniform) Potential(z vec.CVec3) complex128 { return -u.F().Dot(z) }

// Name returns "uniform".
func (Uniform) Name() string { return "uniform" }
