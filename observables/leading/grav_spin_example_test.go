package leading_test

import (
	"fmt"
	"math"

	"ricochet/background/vec"
	"ricochet/observables/leading"
)

// show prints a four-vector at four decimals, without signed zeros.
func show(v vec.Vec4) string {
	for i := range v {
		if math.Abs(v[i]) < 5e-5 {
			v[i] = 0
		}
	}
	return fmt.Sprintf("(%.4f, %.4f, %.4f, %.4f)", v[0], v[1], v[2], v[3])
}

// A Kerr probe of spin 0.3 along −z (prograde: the orbital angular
// momentum of motion along +x at b along +y points along −z) passes a
// Schwarzschild source at γ = 2: its impulse is that of a spinless probe
// off a Kerr source of the same spin, and an aligned spin is not kicked.
// A spin along b precesses about the orbital axis instead.
func ExampleSpinImpulse1PM() {
	u := vec.Velocity(vec.Vec3{0.8660254037844386, 0, 0})
	b := vec.Vec4{0, 0, 1, 0}
	a := vec.Vec4{0, 0, 0, -0.3}

	dp, da := leading.SpinImpulse1PM(leading.GravSpinProbe{M: 1, A: a}, leading.GravSource{M: 1}, u, b)
	fmt.Printf("spinning probe:  Δp = %s, Δa = %s\n", show(dp), show(da))
	dp = leading.Impulse1PM(leading.GravProbe{M: 1}, leading.GravSource{M: 1, A: vec.Vec3{0, 0, -0.3}}, u, b)
	fmt.Printf("spinning source: Δp = %s\n", show(dp))

	along := vec.Vec4{0, 0, 0.3, 0}
	_, da = leading.SpinImpulse1PM(leading.GravSpinProbe{M: 1, A: along}, leading.GravSource{M: 1}, u, b)
	fmt.Printf("spin along b:    Δa = %s\n", show(da))
	// Output:
	// spinning probe:  Δp = (0.0000, 0.0000, -6.2449, 0.0000), Δa = (0.0000, 0.0000, 0.0000, 0.0000)
	// spinning source: Δp = (0.0000, 0.0000, -6.2449, 0.0000)
	// spin along b:    Δa = (-0.6356, 0.5505, 0.0000, 0.0000)
}
