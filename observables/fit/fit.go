package fit

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// Point is one entry of a coupling scan.
type Point struct {
	// Eps is the coupling; it must be positive.
	Eps float64
	// First is the first-order prediction (used by Breakdown).
	First float64
	// Residual is numeric − first order.
	Residual float64
	// Sigma is the standard error of Residual; it must be positive.
	Sigma float64
}

// ErrTooFewPoints is returned when a fit has fewer usable points than it
// needs: a model of m parameters needs m + 2 points (two degrees of
// freedom, so that χ²/dof and the small-sample Akaike criterion exist).
var ErrTooFewPoints = errors.New("fit: too few usable points")

// maxColumns bounds the size of any design: polynomial degrees and
// numbers of correction terms above 40 are never tried. It is a numerical
// limit, not a modelling choice: on couplings spanning more than a decade
// the powers ε^j lose numerical rank (see rankTol) well before j = 40.
const maxColumns = 41

// sorted returns a copy of pts sorted by Eps, after validation.
func sorted(pts []Point) ([]Point, error) {
	out := append([]Point(nil), pts...)
	for i, p := range out {
		if !(p.Eps > 0) || math.IsInf(p.Eps, 0) {
			return nil, fmt.Errorf("fit: point %d: ε = %v must be positive and finite", i, p.Eps)
		}
		if !(p.Sigma > 0) || math.IsInf(p.Sigma, 0) {
			return nil, fmt.Errorf("fit: point %d: σ = %v must be positive and finite", i, p.Sigma)
		}
		if math.IsNaN(p.Residual) || math.IsInf(p.Residual, 0) {
			return nil, fmt.Errorf("fit: point %d: residual %v is not finite", i, p.Residual)
		}
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Eps < out[j].Eps })
	return out, nil
}
