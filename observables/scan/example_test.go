package scan_test

import (
	"context"
	"fmt"

	"ricochet/observables/scan"
	"ricochet/observables/scenario"
	"ricochet/validate/exact"
)

// A coupling scan of the built-in Coulomb scenario: Run integrates every
// point of the grid (in parallel, resumable with a record file), Analyze
// reads the impulse along b off the records and fits the residual of the
// first-order prediction. Its ε² coefficient is γv times Darwin's c₂ =
// −π/(2(γv)²) (Darwin 1913; validate/exact).
func Example() {
	text, _ := scenario.Builtin("coulomb-darwin")
	s, err := scenario.Parse(text, "coulomb-darwin")
	if err != nil {
		panic(err)
	}
	s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points = 1e-4, 0.02, 9
	if err := s.Validate(); err != nil {
		panic(err)
	}
	recs, err := scan.Run(context.Background(), s, &scan.Settings{Workers: 2})
	if err != nil {
		panic(err)
	}
	dpB := scan.Observable{Name: "dp_b", I: 2} // frame index 2: along b
	res := scan.Analyze(s, string(text), recs, &scan.Options{Observables: []scan.Observable{dpB}})
	sr := res.Series[0]
	fmt.Printf("%s, %s: %d points, first at eps = %.0e\n", sr.Model, sr.Observable, len(sr.Points), sr.Points[0].Eps)
	e, n := sr.Fits.Exponent, sr.Fits.NextOrder
	fmt.Printf("residual ~ eps^%.2f\n", e.N)
	g, v := s.Kinematics.Gamma, s.Kinematics.V
	_, c2, _ := exact.DarwinSeries(v)
	fmt.Printf("next order %.6f (Darwin %.6f)\n", n.C2, g*v*c2)
	// Output:
	// charge, dp_b: 9 points, first at eps = 1e-04
	// residual ~ eps^2.00
	// next order -2.094395 (Darwin -2.094395)
}
