package em_test

import (
	"fmt"

	"ricochet/background/em"
	"ricochet/background/vec"
)

// The root-Kerr field of a unit charge with spin a = 0.5 ẑ: on the axis
// far away, E is the Coulomb field Q/z² and B the field 2μ/z³ of the
// magnetic dipole μ = Q a, with corrections of relative order a²/z².
func ExampleRootKerr() {
	f := em.RootKerr{Q: 1, A: vec.Vec3{0, 0, 0.5}}
	z := 100.0
	E, B := em.EB(f, vec.Vec3{0, 0, z})
	fmt.Printf("E_z z² = %.6f\n", E[2]*z*z)
	fmt.Printf("B_z z³ = %.6f\n", B[2]*z*z*z)
	fmt.Println("crosses disk:", f.CrossesDisk(vec.Vec3{0.2, 0, 1}, vec.Vec3{0.2, 0, -1}))
	// Output:
	// E_z z² = 0.999925
	// B_z z³ = 0.999950
	// crosses disk: true
}
