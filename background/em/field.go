package em

import "ricochet/background/vec"

// Field is a static electromagnetic field in flat space given as the
// complex field 𝐅 = E + iB.
type Field interface {
	// At returns 𝐅(z) and its Jacobian D[i][j] = ∂𝐅_i/∂z_j (holomorphic in
	// each z_j).
	At(z vec.CVec3) (F vec.CVec3, D [3]vec.CVec3)

	// Potential returns the complex potential 𝒱 with 𝐅 = −∇𝒱 (Φ = Re 𝒱
	// electric, Ψ = Im 𝒱 magnetic scalar potential, B = −∇Ψ away from
	// sources); it is defined up to a constant, zero at infinity where that
	// makes sense.
	Potential(z vec.CVec3) complex128

	// Name returns a short lower-case name of the field's family.
	Name() string
}

// EB returns the electric and magnetic fields of f at the real point x,
//
//	E = Re 𝐅(x),  B = Im 𝐅(x).
func EB(f Field, x vec.Vec3) (E, B vec.Vec3) {
	F, _ := f.At(x.Lift())
	return F.Real(), F.Imag()
}

// Valuer is implemented by fields that can return 𝐅(z) alone, without its
// Jacobian, more cheaply than At. Probes whose force needs only the field
// (a point charge, the root-Kerr probe) use it when it is there.
type Valuer interface {
	// Value returns 𝐅(z); it equals the first result of At(z).
	Value(z vec.CVec3) vec.CVec3
}

// Value returns 𝐅(z) of f, through Valuer when f implements it.
func Value(f Field, z vec.CVec3) vec.CVec3 {
	if v, ok := f.(Valuer); ok {
		return v.Value(z)
	}
	F, _ := f.At(z)
	return F
}
