package predict

import (
	"fmt"
	"strings"

	"ricochet/background/vec"
	"ricochet/observables"
)

// Quantities are the named inputs of a prediction at one configuration, in
// the library's conventions (Gaussian units, covariant impact parameter,
// source rest frame). Quantities a background or probe does not have are
// zero.
type Quantities struct {
	Gamma, V float64 // Lorentz factor and speed of the incoming probe
	B        float64 // covariant impact parameter |b|

	Mass, Charge, MagneticCharge float64 // probe m, q, g
	// Source: electric and magnetic charge Q, P, mass M, NUT parameter N.
	SourceCharge, SourceMagneticCharge, SourceMass, NUT float64

	// Eps is the signed coupling ε of the configuration.
	Eps float64
	// Electromagnetic reports whether Eps is an electromagnetic coupling
	// (it then changes with the unit system).
	Electromagnetic bool

	// ProbeSpin is the probe's rest-frame spin vector a₁ = S/m, SourceSpin
	// the source's a₂ (lengths).
	ProbeSpin, SourceSpin vec.Vec3

	// Frame is the triad l̂, b̂, n̂ of the frame of record.
	Frame observables.Frame
}

// Observable is a component of the impulse or spin kick in the frame of
// record: Kick is 0 for Δp, 1 for Δa; Comp is 0..3 for t, l, b, n.
type Observable struct {
	Kick, Comp int
}

var compNames = "tlbn"

func (o Observable) String() string {
	return [2]string{"dp_", "da_"}[o.Kick] + compNames[o.Comp:o.Comp+1]
}

// ParseObservable reads dp_X or da_X with X one of t, l, b, n.
func ParseObservable(s string) (Observable, error) {
	bad := fmt.Errorf("predict: observable %q; allowed: dp_X, da_X with X in t, l, b, n", s)
	if len(s) != 4 || s[2] != '_' {
		return Observable{}, bad
	}
	var o Observable
	switch s[:2] {
	case "dp":
	case "da":
		o.Kick = 1
	default:
		return o, bad
	}
	o.Comp = strings.IndexByte(compNames, s[3])
	if o.Comp < 0 {
		return o, bad
	}
	return o, nil
}

// Observables lists all observables in order.
func Observables() []Observable {
	var out []Observable
	for k := 0; k < 2; k++ {
		for c := 0; c < 4; c++ {
			out = append(out, Observable{k, c})
		}
	}
	return out
}
