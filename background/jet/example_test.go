package jet_test

import (
	"fmt"

	"ricochet/background/jet"
)

// The gradient and a second derivative of f = x·y² at (x, y) = (3, 2):
// ∂ₓf = y² = 4, ∂ᵧf = 2xy = 12, ∂ᵧ²f = 2x = 6.
func ExampleJet() {
	var x, y, f jet.Jet
	x.SetVar(2, 3, 1)
	y.SetVar(2, 2, 2)
	f.Mul(&y, &y)
	f.Mul(&f, &x)
	fmt.Println(f.Value(), f.D(1), f.D(2), f.Partial([4]int{0, 0, 2, 0}))
	// Output:
	// 12 4 12 6
}
