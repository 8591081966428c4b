package rk_test

import (
	"fmt"
	"math"

	"ricochet/integrate/rk"
)

// The harmonic oscillator d²y/dt² = −y from y = 0, y' = 1 is sin t; a
// terminal event stops the integration where y first falls through zero,
// at t = π.
func Example() {
	oscillator := func(_ float64, y, dydt []float64) {
		dydt[0] = y[1]
		dydt[1] = -y[0]
	}
	s := rk.NewSolver(2, &rk.Settings{RelTol: 1e-12})
	events := []rk.Event{{
		G:         func(_ float64, y []float64) float64 { return y[0] },
		Direction: -1,
		Terminal:  true,
	}}
	res := s.Solve(oscillator, 0, []float64{0, 1}, 10, events)
	fmt.Printf("%v %d at t = %.10f (π = %.10f), y' = %.10f\n", res.Status, res.Event, res.T, math.Pi, res.Y[1])

	// Dense output of the last accepted step.
	y := make([]float64, 2)
	s.Interpolate(3, y)
	fmt.Printf("y(3) = %.10f (sin 3 = %.10f)\n", y[0], math.Sin(3))
	// Output:
	// Event 0 at t = 3.1415926536 (π = 3.1415926536), y' = -1.0000000000
	// y(3) = 0.1411200081 (sin 3 = 0.1411200081)
}
