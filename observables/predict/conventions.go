package predict

import (
	"fmt"
	"math"
	"strings"

	"ricochet/observables/convention"
)

// Index says whether predicted components carry an upper (contravariant)
// or a lower (covariant) index.
type Index int

const (
	Upper Index = iota // contravariant v^μ, the same numbers in both signatures
	Lower              // covariant v_μ = η_μν v^ν in the declared signature
)

// Body says which body the predicted impulse belongs to.
type Body int

const (
	Probe  Body = iota // the probe (the library's own)
	Source             // the source: Δp_source = −Δp_probe at first order in the source frame
)

// Order is the order in the coupling a prediction claims to be exact to.
type Order int

const (
	FirstOrder Order = iota // exact at O(ε): residual O(ε²) expected
	NextOrder               // exact at O(ε²): residual O(ε³) expected
)

func (o Order) String() string {
	if o == NextOrder {
		return "next"
	}
	return "first"
}

// Conventions are the conventions a prediction is written in. The zero
// value is the library's own: contravariant components, Gaussian units,
// covariant impact parameter, a = S/m with a spin along +z meaning
// angular momentum along +z, the probe's impulse, first order.
type Conventions struct {
	Signature convention.Signature
	Index     Index
	Units     convention.Units
	Impact    convention.Impact
	// OppositeSpin: the prediction's spin vectors are minus the library's
	// (a spin along +z means angular momentum along −z).
	OppositeSpin bool
	Body         Body
	Order        Order
}

// ParseIndex accepts "upper" or "lower".
func ParseIndex(s string) (Index, error) {
	switch strings.ToLower(s) {
	case "upper", "contravariant", "":
		return Upper, nil
	case "lower", "covariant":
		return Lower, nil
	}
	return 0, fmt.Errorf("predict: index %q; allowed: upper, lower", s)
}

// ParseSpinSense accepts "+" (a spin along +z is angular momentum along
// +z, the library's own) or "-".
func ParseSpinSense(s string) (opposite bool, err error) {
	switch s {
	case "+", "":
		return false, nil
	case "-":
		return true, nil
	}
	return false, fmt.Errorf("predict: spin sign %q; allowed: + (spin along +z is angular momentum along +z) or -", s)
}

// ParseBody accepts "probe" or "source".
func ParseBody(s string) (Body, error) {
	switch strings.ToLower(s) {
	case "probe", "":
		return Probe, nil
	case "source":
		return Source, nil
	}
	return 0, fmt.Errorf("predict: body %q; allowed: probe, source", s)
}

// ParseOrder accepts "first" or "next".
func ParseOrder(s string) (Order, error) {
	switch strings.ToLower(s) {
	case "first", "":
		return FirstOrder, nil
	case "next", "second":
		return NextOrder, nil
	}
	return 0, fmt.Errorf("predict: order %q; allowed: first, next", s)
}

// Describe returns one sentence per convention.
func (c Conventions) Describe() []string {
	idx := "contravariant components (upper index)"
	if c.Index == Lower {
		idx = "covariant components (lower index) in signature " + c.Signature.String()
	}
	spin := "spin a = S/m, a spin along +z is angular momentum along +z"
	if c.OppositeSpin {
		spin = "spin a = -S/m (opposite sense to the library's)"
	}
	body := "impulse on the probe"
	if c.Body == Source {
		body = "impulse on the source"
	}
	return []string{idx, c.Units.Describe(), c.Impact.Describe(), spin, body, "claimed order: " + c.Order.String()}
}

// validFor reports an error if the conventions cannot apply to o.
func (c Conventions) validFor(o Observable) error {
	if c.Body == Source && o.Kick == 1 {
		return fmt.Errorf("predict: %s: body = source applies to impulses only (the source's spin kick is not computed)", o)
	}
	return nil
}

// inputs returns the quantities of pt as the prediction's conventions
// define them.
func (c Conventions) inputs(pt Point) Quantities {
	q := pt.Quantities
	if c.Units == convention.HeavisideLorentz {
		k := math.Sqrt(4 * math.Pi)
		q.Charge *= k
		q.MagneticCharge *= k
		q.SourceCharge *= k
		q.SourceMagneticCharge *= k
		if q.Electromagnetic {
			q.Eps *= 4 * math.Pi
		}
	}
	if bd := [3]float64{q.B, pt.ImpactJ, pt.ImpactEikonal}[c.Impact]; bd > 0 {
		q.Eps *= q.B / bd
		q.B = bd
	}
	if c.OppositeSpin {
		q.ProbeSpin = q.ProbeSpin.Scale(-1)
		q.SourceSpin = q.SourceSpin.Scale(-1)
	}
	return q
}

// output returns the factor that takes the prediction's value of o to the
// library's conventions.
func (c Conventions) output(o Observable) float64 {
	f := 1.0
	if c.Index == Lower {
		// (−,+,+,+) lowers with a minus on the time component, (+,−,−,−)
		// with a minus on the spatial ones.
		if (o.Comp == 0) == (c.Signature == convention.MostlyPlus) {
			f = -f
		}
	}
	if c.Body == Source && o.Kick == 0 {
		f = -f
	}
	if c.OppositeSpin && o.Kick == 1 {
		f = -f
	}
	return f
}
