package scenario_test

import (
	"fmt"

	"ricochet/observables/scenario"
)

// A scenario from TOML: validation fills the defaults, WithEpsilon moves it
// to another coupling at fixed γ and phases, Build gives the event and its
// first-order prediction.
func Example() {
	s, err := scenario.Parse([]byte(`
name = "example"
[background]
kind = "coulomb"
charge = 0.05
[probe]
kind = "charge"
charge = -1
[kinematics]
v = 0.5
`), "example.toml")
	if err != nil {
		panic(err)
	}
	if err := s.Validate(); err != nil {
		panic(err)
	}
	fmt.Printf("eps = %g, gamma = %.6f, b = %g, scan %g..%g at %d points\n",
		s.Epsilon(), s.Kinematics.Gamma, s.Kinematics.B, s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points)
	// The default frame: probe incoming along +x, impact parameter along +y.
	at := s.WithEpsilon(0.01)
	ev, err := at.Build()
	if err != nil {
		panic(err)
	}
	dp, _, src := ev.FirstOrder(at)
	fmt.Printf("%s at eps = %g: first-order impulse along b %.6f m\n", ev.Model.Name(), at.Epsilon(), dp[2])
	fmt.Println(src)

	_, err = scenario.Parse([]byte("[kinematics]\ncolour = 1\n"), "bad.toml")
	fmt.Println(err)
	// Output:
	// eps = -0.05, gamma = 1.154701, b = 1, scan 0.0001..0.1 at 13 points
	// charge at eps = -0.01: first-order impulse along b -0.040000 m
	// closed form: complex-shifted impact parameter b − iΠ(a₁+a₂), dyonic phase (q−ig)(Q+iP)
	// bad.toml: unknown key kinematics.colour
}
