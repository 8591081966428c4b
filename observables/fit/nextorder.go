package fit

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// NextOrderSettings tunes NextOrder. The zero value (or nil) gives the
// defaults.
type NextOrderSettings struct {
	// MaxDegree is the largest polynomial degree tried. Zero means 4.
	MaxDegree int
	// Degree, when positive or when FixDegree is set, fixes the degree
	// instead of selecting it.
	Degree    int
	FixDegree bool
	// MaxEps excludes points with ε > MaxEps. Zero means no cut.
	MaxEps float64
}

// NextOrderResult is the extrapolation of residual/ε² to ε → 0.
type NextOrderResult struct {
	C2, SigmaC2 float64 // ε → 0 limit of residual/ε² and its uncertainty
	C3, SigmaC3 float64 // slope: the next coefficient (NaN when Degree = 0)
	Degree      int     // polynomial degree selected
	// SysC2 is the truncation part of SigmaC2: |change of C2| when the
	// degree is raised by one (zero when the degree is fixed).
	SysC2 float64
	Chi2  float64
	DOF   int
	Birge float64   // factor applied to the uncertainties, max(1, √(χ²/dof))
	AICc  []float64 // corrected AIC of each degree tried, index = degree
	Used  int
}

// NextOrder fits residual/ε² = Σ_{j≤d} c_{2+j} ε^j by weighted least
// squares (weights ε⁴/σ²) and returns c₂ = the value at ε = 0 and c₃ with
// their uncertainties, inflated by the Birge ratio.
//
// Degree criterion: the d in 0…MaxDegree minimising the corrected Akaike
// information criterion AICc = χ² + 2k + 2k(k+1)/(n − k − 1), k = d + 1
// (Akaike 1974; Hurvich & Tsai, Biometrika 76, 297 (1989); from memory).
// Degrees with n − k − 1 ≤ 0 are not tried.
func NextOrder(pts []Point, s *NextOrderSettings) (NextOrderResult, error) {
	var set NextOrderSettings
	if s != nil {
		set = *s
	}
	if set.MaxDegree == 0 {
		set.MaxDegree = 4
	}
	p, err := sorted(pts)
	if err != nil {
		return NextOrderResult{}, err
	}
	var x, y, sy []float64
	for _, q := range p {
		if set.MaxEps > 0 && q.Eps > set.MaxEps {
			continue
		}
		e2 := q.Eps * q.Eps
		x = append(x, q.Eps)
		y = append(y, q.Residual/e2)
		sy = append(sy, q.Sigma/e2)
	}
	n := len(x)
	// Scale ε by its largest value so the design matrix is well conditioned.
	scale := 0.0
	for _, e := range x {
		scale = math.Max(scale, e)
	}
	fitDeg := func(d int) ([]float64, *mat.SymDense, float64, int, error) {
		a := mat.NewDense(n, d+1, nil)
		for i, e := range x {
			t := 1.0
			for j := 0; j <= d; j++ {
				a.Set(i, j, t)
				t *= e / scale
			}
		}
		return linearFit(a, y, sy)
	}
	lo, hi := 0, set.MaxDegree
	if set.FixDegree || set.Degree > 0 {
		lo, hi = set.Degree, set.Degree
	}
	res := NextOrderResult{Degree: -1, Used: n}
	best := math.Inf(1)
	for d := 0; d <= hi; d++ {
		k := float64(d + 1)
		if n-d-2 <= 0 {
			break
		}
		_, _, chi2, _, err := fitDeg(d)
		if err != nil {
			return NextOrderResult{}, err
		}
		aic := chi2 + 2*k + 2*k*(k+1)/(float64(n)-k-1)
		res.AICc = append(res.AICc, aic)
		if d >= lo && aic < best {
			best, res.Degree = aic, d
		}
	}
	if res.Degree < 0 {
		return NextOrderResult{}, fmt.Errorf("%w: %d points for degree %d", ErrTooFewPoints, n, lo)
	}
	c, cov, chi2, dof, err := fitDeg(res.Degree)
	if err != nil {
		return NextOrderResult{}, err
	}
	b := birge(chi2, dof)
	res.C2, res.SigmaC2 = c[0], math.Sqrt(cov.At(0, 0))*b
	res.C3, res.SigmaC3 = math.NaN(), math.NaN()
	if res.Degree >= 1 {
		res.C3, res.SigmaC3 = c[1]/scale, math.Sqrt(cov.At(1, 1))*b/scale
	}
	// Truncation part: the change of the coefficients when one more degree
	// is fitted (common practice for extrapolations), added in quadrature
	// unless the degree is fixed by the caller.
	if !(set.FixDegree || set.Degree > 0) && n-res.Degree-3 > 0 {
		if c1, _, _, _, err := fitDeg(res.Degree + 1); err == nil {
			res.SysC2 = math.Abs(c1[0] - c[0])
			res.SigmaC2 = math.Hypot(res.SigmaC2, res.SysC2)
			if res.Degree >= 1 {
				res.SigmaC3 = math.Hypot(res.SigmaC3, math.Abs(c1[1]-c[1])/scale)
			}
		}
	}
	res.Chi2, res.DOF, res.Birge = chi2, dof, b
	return res, nil
}
