package integrate_test

import (
	"fmt"
	"math"

	"ricochet/background/em"
	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/validate/exact"
)

// The second-order deflection of a charge by a Coulomb field, directly,
// against the expansion of Darwin's exact deflection (Darwin 1913).
func ExampleSecondOrder() {
	const v, eps = 0.6, 0.01 // speed and coupling ε = qQ/(m b)
	gamma := 1 / math.Sqrt(1-v*v)
	in, _ := integrate.Incoming(1, gamma, 1, vec.Vec3{})
	m := &integrate.Charge{Field: em.Coulomb{Q: eps}, M: 1, Q: 1}
	r, _ := integrate.SecondOrder(m, in, nil)
	p := gamma * v
	_, c2, _ := exact.DarwinSeries(v)
	fmt.Printf("χ₂ direct %.12f (± %.0e), Darwin %.12f\n", r.Impulse2[2]/(p*eps*eps), r.Impulse2Err[2]/(p*eps*eps), c2)
	fmt.Println("energy conserved at second order:", math.Abs(r.Impulse2[0]) < 1e-16*p)
	// Output:
	// χ₂ direct -2.792526803191 (± 1e-14), Darwin -2.792526803191
	// energy conserved at second order: true
}
