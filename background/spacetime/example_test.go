package spacetime_test

import (
	"fmt"

	"ricochet/background/spacetime"
)

// The radial Christoffel symbol Γ^x_tt of Schwarzschild on the x axis in
// Kerr–Schild coordinates equals M(r − 2M)/r³ (the Newtonian M/r² at large
// r), here with M = 1, r = 10: 0.008.
func ExampleEvaluator() {
	e := spacetime.NewEvaluator(spacetime.Schwarzschild(1), 1)
	var p spacetime.Point
	e.Eval([4]float64{0, 10, 0, 0}, &p)
	fmt.Printf("Γ^x_tt = %.6f\n", p.Gamma[1][0][0])
	// Output:
	// Γ^x_tt = 0.008000
}
