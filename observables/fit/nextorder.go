package fit

import "fmt"

// NextOrderSettings tunes NextOrder. The zero value (or nil) gives the
// defaults.
type NextOrderSettings struct {
	// MaxDegree is the largest polynomial degree tried. Zero means as far
	// as the data support: n − 3 for a window of n points (every model
	// keeps two degrees of freedom), at most 40, and never beyond the
	// numerical rank of the design.
	MaxDegree int
	// Degree, when positive or when FixDegree is set, fixes the degree
	// instead of averaging over degrees.
	Degree    int
	FixDegree bool
	// MaxEps excludes points with ε > MaxEps. Zero means no cut.
	MaxEps float64
	// FixedWindow uses every point up to MaxEps instead of selecting the
	// window.
	FixedWindow bool
	// ICIThreshold is the Γ of the window rule; zero means
	// DefaultICIThreshold.
	ICIThreshold float64
}

// NextOrderResult is the extrapolation of residual/ε² to ε → 0.
type NextOrderResult struct {
	// C2 is the ε → 0 limit of residual/ε² and SigmaC2 its standard
	// uncertainty, SigmaC2² = StatC2² + ModelC2²: the point errors
	// propagated (widened by Quality.Inflation) and the spread over the
	// degrees the data cannot tell apart.
	C2      float64 `json:"c2"`
	SigmaC2 float64 `json:"c2_sigma"`
	StatC2  float64 `json:"c2_sigma_stat"`
	ModelC2 float64 `json:"c2_sigma_model"`
	// C3 is the slope d(residual/ε²)/dε at ε = 0, the coefficient of the
	// order after the next, with the same split of its uncertainty; NaN
	// when only degree 0 could be fitted.
	C3      float64 `json:"c3"`
	SigmaC3 float64 `json:"c3_sigma"`
	StatC3  float64 `json:"c3_sigma_stat"`
	ModelC3 float64 `json:"c3_sigma_model"`
	// Degree is the degree of largest Akaike weight; Weights[d] is the
	// weight of degree d (zero for degrees not tried).
	Degree  int       `json:"degree"`
	Weights []float64 `json:"degree_weights"`
	// Coeffs are the coefficients of the degree-Degree polynomial,
	// residual/ε² ≈ Σ_j Coeffs[j] ε^j (for drawing the fit).
	Coeffs []float64 `json:"coefficients"`
	// Quality is the goodness of fit of the degree-Degree polynomial.
	Quality `json:"quality"`
	// EpsLo, EpsHi bound the window used and Used is its number of
	// points; Total is the number of points offered (after MaxEps).
	EpsLo float64 `json:"eps_lo"`
	EpsHi float64 `json:"eps_hi"`
	Used  int     `json:"points_used"`
	Total int     `json:"points_total"`
}

// NextOrder fits residual/ε² = Σ_{j≤d} c_{2+j} ε^j by weighted least
// squares (weights ε⁴/σ²) and returns c₂, the value at ε = 0, and c₃, the
// slope there, with uncertainties that include the truncation of the
// series.
//
// Degrees. In each window every degree from 0 to MaxDegree is fitted and
// the results are averaged with Akaike weights (QAIC; see fitFamily), the
// uncertainty being the unconditional one of Burnham & Anderson (see
// family.average): degrees the criterion cannot distinguish contribute
// their spread. When the most flexible degree still leaves χ²/dof = ĉ > 1
// (a series that the polynomials do not capture, or underestimated point
// errors) every variance is multiplied by ĉ and the criterion uses χ²/ĉ
// (Burnham & Anderson 2002, §2.5, from memory).
//
// Window. The windows are the sets of the k smallest couplings, k ≥ 3;
// of these the rule of intersecting confidence intervals (iciSelect)
// picks the largest whose estimates of c₂ and c₃ agree with those of all
// smaller windows within ICIThreshold standard uncertainties: it stops
// before points where the series converges too slowly (near a radius of
// convergence, a capture, a breakdown of the expansion) to be captured by
// the polynomials.
//
// Cost: one pass of Givens rotations over the points (nestedLS), O(n D²)
// for D = MaxDegree + 1, and O(D³) per window for the at most 8 log₂ n +
// 64 windows.
func NextOrder(pts []Point, s *NextOrderSettings) (NextOrderResult, error) {
	var set NextOrderSettings
	if s != nil {
		set = *s
	}
	if set.ICIThreshold == 0 {
		set.ICIThreshold = DefaultICIThreshold
	}
	p, err := sorted(pts)
	if err != nil {
		return NextOrderResult{}, err
	}
	if set.MaxEps > 0 {
		k := 0
		for k < len(p) && p[k].Eps <= set.MaxEps {
			k++
		}
		p = p[:k]
	}
	n := len(p)
	mMin, mMax := 1, maxColumns
	if set.MaxDegree > 0 {
		mMax = min(mMax, set.MaxDegree+1)
	}
	if set.FixDegree || set.Degree > 0 {
		mMin, mMax = set.Degree+1, set.Degree+1
	}
	if n < mMin+2 {
		return NextOrderResult{}, fmt.Errorf("%w: %d points for degree %d", ErrTooFewPoints, n, mMin-1)
	}
	k := min(mMax, n-2)
	scale := p[n-1].Eps
	ends := windowEnds(n, mMin+2)
	if set.FixedWindow {
		ends = []int{n}
	}
	ls := newNestedLS(k)
	x := make([]float64, k)
	var wins []window
	next := 0
	for i, q := range p {
		e2 := q.Eps * q.Eps
		sy := q.Sigma / e2
		t := 1 / sy
		for j := range x {
			x[j] = t
			t *= q.Eps / scale
		}
		ls.add(x, q.Residual/e2/sy)
		if next < len(ends) && i+1 == ends[next] {
			next++
			fam, ok := fitFamily(ls, mMin, mMax, 0, 1)
			if !ok {
				continue
			}
			wins = append(wins, window{fam: fam, est: []estimate{fam.average(0, 1), fam.average(1, 1/scale)}, size: i + 1})
		}
	}
	if len(wins) == 0 {
		return NextOrderResult{}, fmt.Errorf("%w: %d points, design of rank below %d", ErrTooFewPoints, n, mMin)
	}
	w := selectWindow(wins, set.ICIThreshold)
	best := w.fam.models[w.fam.best].fit
	c2, c3 := w.est[0], w.est[1]
	res := NextOrderResult{
		C2: c2.value, SigmaC2: c2.sigma, StatC2: c2.stat, ModelC2: c2.model,
		C3: c3.value, SigmaC3: c3.sigma, StatC3: c3.stat, ModelC3: c3.model,
		Degree:  best.m - 1,
		Weights: w.fam.weights(1),
		Quality: w.fam.bestQuality(),
		EpsLo:   p[0].Eps, EpsHi: p[w.size-1].Eps, Used: w.size, Total: n,
	}
	t := 1.0
	for _, c := range best.c {
		res.Coeffs = append(res.Coeffs, c*t)
		t /= scale
	}
	return res, nil
}
