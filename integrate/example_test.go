package integrate_test

import (
	"fmt"
	"math"

	"ricochet/background/em"
	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
	"ricochet/validate/exact"
)

// A unit charge of unit mass at v = 0.6 passes a Coulomb charge Q = 0.01 at
// impact parameter b = 1 (coupling ε = qQ/(m b) = 0.01, repulsive). Scatter
// integrates from the far past to the far future and returns the
// asymptotic impulse with its error estimate; the deflection agrees with
// Darwin's exact relativistic solution (Darwin 1913; validate/exact).
func ExampleScatter() {
	v := 0.6
	gamma := 1 / math.Sqrt(1-v*v)
	model := &integrate.Charge{Field: em.Coulomb{Q: 0.01}, M: 1, Q: 1}
	in, err := integrate.Incoming(1, gamma, 1, vec.Vec3{})
	if err != nil {
		panic(err)
	}
	out, err := integrate.Scatter(model, in, nil)
	if err != nil {
		panic(err)
	}
	chi := observables.ScatteringAngle(in.P, out.POut)
	want, _ := exact.Darwin(v, 0.01)
	// The error estimate of Δp bounds that of the angle: δχ ≤ |δΔp⃗|/|p⃗|.
	bound := out.ImpulseErr.Spatial().Norm() / in.P.Spatial().Norm()
	fmt.Println("status:", out.Status)
	fmt.Printf("deflection %.9f rad (Darwin %.9f)\n", chi, want.Chi)
	fmt.Printf("impulse along b: %.9f m\n", observables.NewFrame(in.P, in.B).Components(out.Impulse)[2])
	fmt.Println("within the error estimate:", math.Abs(chi-want.Chi) <= bound)
	// Output:
	// status: scattered
	// deflection 0.044165741 rad (Darwin 0.044165741)
	// impulse along b: 0.033113538 m
	// within the error estimate: true
}
