package leading_test

import (
	"fmt"

	"ricochet/background/vec"
	"ricochet/observables/leading"
)

// A unit charge passes a unit charge at v = 0.6 and b = 1: the impulse is
// 2qQ/(v b) = 3.3333 along b̂. Giving the source a spin along z (normal
// to the orbital plane) turns on its magnetic dipole μ = Q a; moving the
// spin onto the probe leaves Δp unchanged, and a spin aligned with the
// orbital angular momentum is not kicked at first order.
func ExampleEMImpulse() {
	u := vec.Velocity(vec.Vec3{0.6, 0, 0})
	b := vec.Vec4{0, 0, 1, 0}
	probe := leading.EMProbe{M: 1, Q: 1}
	dp, _ := leading.EMImpulse(probe, leading.EMSource{Q: 1}, u, b)
	fmt.Printf("spinless:      Δp = (%.4f, %.4f, %.4f, %.4f)\n", dp[0], dp[1], dp[2], dp[3])

	a := vec.Vec3{0, 0, 0.3}
	dp, _ = leading.EMImpulse(probe, leading.EMSource{Q: 1, A: a}, u, b)
	fmt.Printf("source spin:   Δp = (%.4f, %.4f, %.4f, %.4f)\n", dp[0], dp[1], dp[2], dp[3])

	spun := leading.EMProbe{M: 1, Q: 1, A: vec.FromSpatial(0, a)}
	dp, da := leading.EMImpulse(spun, leading.EMSource{Q: 1}, u, b)
	fmt.Printf("probe spin:    Δp = (%.4f, %.4f, %.4f, %.4f)\n", dp[0], dp[1], dp[2], dp[3])
	fmt.Printf("               Δa = (%.4f, %.4f, %.4f, %.4f)\n", da[0], da[1], da[2], da[3])
	// Output:
	// spinless:      Δp = (0.0000, 0.0000, 3.3333, 0.0000)
	// source spin:   Δp = (0.0000, 0.0000, 4.3223, 0.0000)
	// probe spin:    Δp = (0.0000, 0.0000, 4.3223, 0.0000)
	//                Δa = (0.0000, 0.0000, 0.0000, 0.0000)
}
