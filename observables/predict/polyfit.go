package predict

import (
	"math"

	"gonum.org/v1/gonum/mat"

	"ricochet/observables/fit"
)

// series is the result of fitting y(ε) = Σ_{j≤d} c_j ε^j to weighted data.
type series struct {
	C, Sigma []float64 // coefficients and standard uncertainties
	Degree   int
	Chi2     float64
	DOF      int
}

// polySeries fits y_k = Σ_{j≤d} c_j x_k^j with standard errors s_k by
// weighted least squares (fit.WeightedLeastSquares), for the degree d in
// 0…maxDeg that minimises the corrected Akaike criterion
// AICc = χ² + 2k + 2k(k+1)/(n − k − 1), k = d + 1 (Akaike 1974; Hurvich &
// Tsai 1989, from memory). Uncertainties are the covariance diagonal
// times the Birge ratio max(1, √(χ²/dof)), and combined in quadrature with
// the change of each coefficient when one more degree is fitted (the
// truncation part) and when the point of largest x is left out (the
// window part; both common practice for extrapolations), so that a series the data do not
// pin down is reported with a wide error rather than a false precision.
// x is scaled by its largest value inside the fit. ok is false with fewer
// than two points.
func polySeries(x, y, s []float64, maxDeg int) (series, bool) {
	n := len(x)
	if n < 2 {
		return series{}, false
	}
	scale := 0.0
	for _, v := range x {
		scale = math.Max(scale, math.Abs(v))
	}
	fitDeg := func(d int) (c, sig []float64, chi2 float64, ok bool) {
		k := d + 1
		a := mat.NewDense(len(x), k, nil)
		for i := range x {
			t := 1.0
			for j := 0; j < k; j++ {
				a.Set(i, j, t)
				t *= x[i] / scale
			}
		}
		c, cov, chi2, _, err := fit.WeightedLeastSquares(a, y, s)
		if err != nil {
			return nil, nil, 0, false
		}
		sig = make([]float64, k)
		for j := range c {
			f := math.Pow(scale, float64(j))
			c[j] /= f
			sig[j] = math.Sqrt(cov.At(j, j)) / f
		}
		return c, sig, chi2, true
	}
	best, bestAIC := series{Degree: -1}, math.Inf(1)
	for d := 0; d <= maxDeg && n-d-2 > 0; d++ {
		c, sig, chi2, ok := fitDeg(d)
		if !ok {
			break
		}
		k := float64(d + 1)
		aic := chi2 + 2*k + 2*k*(k+1)/(float64(n)-k-1)
		if aic < bestAIC {
			bestAIC = aic
			best = series{C: c, Sigma: sig, Degree: d, Chi2: chi2, DOF: n - d - 1}
		}
	}
	if best.Degree < 0 {
		// Two points: the straight line through them, no error estimate
		// from the scatter.
		c, sig, chi2, ok := fitDeg(min(1, n-1))
		if !ok {
			return series{}, false
		}
		return series{C: c, Sigma: sig, Degree: len(c) - 1, Chi2: chi2}, true
	}
	if best.DOF > 0 {
		if b := math.Sqrt(best.Chi2 / float64(best.DOF)); b > 1 {
			for j := range best.Sigma {
				best.Sigma[j] *= b
			}
		}
	}
	if n-best.Degree-3 > 0 {
		if c, _, _, ok := fitDeg(best.Degree + 1); ok {
			for j := range best.C {
				best.Sigma[j] = math.Hypot(best.Sigma[j], c[j]-best.C[j])
			}
		}
	}
	// Window part: the change of each coefficient when the point of
	// largest |x|, where the omitted higher terms weigh most, is left out.
	if n-1-best.Degree-2 > 0 {
		far := 0
		for i := range x {
			if math.Abs(x[i]) > math.Abs(x[far]) {
				far = i
			}
		}
		drop := func(a []float64) []float64 {
			return append(append([]float64(nil), a[:far]...), a[far+1:]...)
		}
		x, y, s = drop(x), drop(y), drop(s)
		n--
		if c, _, _, ok := fitDeg(best.Degree); ok {
			for j := range best.C {
				best.Sigma[j] = math.Hypot(best.Sigma[j], c[j]-best.C[j])
			}
		}
	}
	return best, true
}

// coef returns c_j and its uncertainty, or (0, 0) beyond the fitted degree
// (a term the data do not ask for).
func (s series) coef(j int) (c, sigma float64) {
	if j < len(s.C) {
		return s.C[j], s.Sigma[j]
	}
	return 0, 0
}
