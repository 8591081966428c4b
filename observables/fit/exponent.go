package fit

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// ExponentSettings tunes Exponent. The zero value (or nil) gives the
// defaults.
type ExponentSettings struct {
	// NoiseFactor: a point is above the noise floor when
	// |residual| > NoiseFactor·σ. Zero means 10.
	NoiseFactor float64
	// SlopeTol: a window is stable when the local slopes between
	// consecutive points in it differ by at most SlopeTol. Zero means 0.05.
	SlopeTol float64
	// MaxEps is the strong-coupling cut: points with ε > MaxEps are never
	// used. Zero means no cut.
	MaxEps float64
	// EpsLo, EpsHi, when EpsHi > 0, override the automatic window: exactly
	// the points with EpsLo ≤ ε ≤ EpsHi are used.
	EpsLo, EpsHi float64
	// MinPoints is the smallest window accepted. Zero means 3.
	MinPoints int
}

// ExponentResult is the fitted power law |residual| ≈ A ε^N.
type ExponentResult struct {
	N float64 // exponent
	// SigmaN is the standard uncertainty of N, √(SigmaStat² + SigmaSys²).
	SigmaN float64
	// SigmaStat is the statistical part (fit covariance with the Birge
	// factor); SigmaSys the window part: for an automatic window of at
	// least 8 points, the change of N when the largest-ε quarter of the
	// window is dropped (common practice; zero otherwise).
	SigmaStat, SigmaSys float64
	LogA                float64 // ln A
	// EpsLo, EpsHi bound the window used; Used is its number of points.
	EpsLo, EpsHi float64
	Used         int
	Chi2         float64 // χ² of the fit in ln|residual|
	// Corrections is the number K of next-order terms d_k ε^k fitted
	// together with the power law (chosen by AICc, 0 to 2).
	Corrections int
	DOF         int
}

// Exponent fits ln|residual| = ln A + n ln ε by weighted least squares, with
// σ(ln|r|) = σ/|r| (first-order error propagation), over a window of the
// scan, and returns n with its standard uncertainty.
//
// Window criterion (automatic unless overridden): among the points above
// the noise floor (|r| > NoiseFactor·σ) and below MaxEps, the window is the
// longest run of consecutive points that is described by one power law:
// either all local slopes Δln|r|/Δln ε lie within SlopeTol of each other
// (the "plateau of the local exponent" reading of a convergence table,
// suited to nearly exact data), or the power-law fit over the run is
// consistent with the errors and shows no significant curvature (suited to
// noisy data; see stable). Ties go to the smaller ε,
// where higher orders matter least (common practice).
func Exponent(pts []Point, s *ExponentSettings) (ExponentResult, error) {
	var set ExponentSettings
	if s != nil {
		set = *s
	}
	if set.NoiseFactor == 0 {
		set.NoiseFactor = 10
	}
	if set.SlopeTol == 0 {
		set.SlopeTol = 0.05
	}
	if set.MinPoints == 0 {
		set.MinPoints = 3
	}
	p, err := sorted(pts)
	if err != nil {
		return ExponentResult{}, err
	}
	var win []Point
	if set.EpsHi > 0 {
		for _, q := range p {
			if q.Eps >= set.EpsLo && q.Eps <= set.EpsHi {
				win = append(win, q)
			}
		}
	} else {
		win = autoWindow(p, set)
	}
	if len(win) < set.MinPoints || len(win) < 3 {
		return ExponentResult{}, fmt.Errorf("%w: %d points in the window, need %d", ErrTooFewPoints, len(win), max(3, set.MinPoints))
	}
	res, err := powerFit(win)
	if err != nil {
		return ExponentResult{}, err
	}
	if set.EpsHi <= 0 && len(win) >= 8 {
		sub, err := powerFit(win[:len(win)-len(win)/4])
		if err == nil {
			res.SigmaSys = math.Abs(res.N - sub.N)
		}
	}
	res.SigmaN = math.Hypot(res.SigmaStat, res.SigmaSys)
	return res, nil
}

// powerFit fits ln|r| = ln A + n ln ε + Σ_{k=1..K} d_k ε^k on all points
// of win, with K ∈ {0, 1, 2} chosen by the corrected Akaike criterion
// (Akaike 1974; Hurvich & Tsai 1989, from memory). The correction terms
// absorb the next orders of the expansion, r = c ε^n (1 + (c'/c) ε + …),
// whose pull on a plain power-law fit would otherwise bias n by about
// |c'/c|·ε_max, far more than the statistical error of nearly exact data.
func powerFit(win []Point) (ExponentResult, error) {
	n := len(win)
	y := make([]float64, n)
	sy := make([]float64, n)
	for i, q := range win {
		if q.Residual == 0 {
			return ExponentResult{}, fmt.Errorf("fit: zero residual at ε = %v inside the window", q.Eps)
		}
		y[i] = math.Log(math.Abs(q.Residual))
		sy[i] = q.Sigma / math.Abs(q.Residual)
	}
	var best ExponentResult
	bestAIC := math.Inf(1)
	for K := 0; K <= 2; K++ {
		k := 2 + K
		if n-k-1 <= 0 && K > 0 {
			break
		}
		a := mat.NewDense(n, k, nil)
		for i, q := range win {
			a.Set(i, 0, 1)
			a.Set(i, 1, math.Log(q.Eps))
			e := 1.0
			for j := 0; j < K; j++ {
				e *= q.Eps
				a.Set(i, 2+j, e)
			}
		}
		c, cov, chi2, dof, err := linearFit(a, y, sy)
		if err != nil {
			if K == 0 {
				return ExponentResult{}, err
			}
			break
		}
		aic := chi2 + 2*float64(k)
		if n-k-1 > 0 {
			aic += 2 * float64(k*(k+1)) / float64(n-k-1)
		}
		if aic < bestAIC {
			bestAIC = aic
			best = ExponentResult{
				N: c[1], SigmaStat: math.Sqrt(cov.At(1, 1)) * birge(chi2, dof), LogA: c[0],
				EpsLo: win[0].Eps, EpsHi: win[n-1].Eps, Used: n, Chi2: chi2, DOF: dof, Corrections: K,
			}
		}
	}
	return best, nil
}

// autoWindow implements the window criterion of Exponent on sorted points.
func autoWindow(p []Point, set ExponentSettings) []Point {
	ok := func(q Point) bool {
		return q.Residual != 0 && math.Abs(q.Residual) > set.NoiseFactor*q.Sigma && (set.MaxEps == 0 || q.Eps <= set.MaxEps)
	}
	bestLo, bestHi := 0, 0
	for lo := 0; lo < len(p); lo++ {
		if !ok(p[lo]) {
			continue
		}
		for hi := lo + 1; hi <= len(p) && ok(p[hi-1]) && (hi == lo+1 || p[hi-1].Eps > p[hi-2].Eps); hi++ {
			if hi-lo > bestHi-bestLo && stable(p[lo:hi], set.SlopeTol) {
				bestLo, bestHi = lo, hi
			}
		}
	}
	return p[bestLo:bestHi]
}

// stable reports whether a window is described by a single power law: the
// spread of its local slopes Δln|r|/Δln ε is at most tol, or the power-law
// fit is consistent with the stated errors, χ² ≤ dof + 3√(2 dof) (three
// standard deviations of the χ² distribution), and a quadratic term in ln ε
// added to the fit is not significant at two standard deviations (a
// curvature test, more sensitive to the onset of higher orders than χ²;
// common practice).
func stable(w []Point, tol float64) bool {
	if len(w) < 3 {
		return true
	}
	smin, smax := math.Inf(1), math.Inf(-1)
	for i := 0; i+1 < len(w); i++ {
		sl := math.Log(math.Abs(w[i+1].Residual/w[i].Residual)) / math.Log(w[i+1].Eps/w[i].Eps)
		smin, smax = math.Min(smin, sl), math.Max(smax, sl)
	}
	if smax-smin <= tol {
		return true
	}
	n := len(w)
	a := mat.NewDense(n, 2, nil)
	y := make([]float64, n)
	sy := make([]float64, n)
	for i, q := range w {
		a.Set(i, 0, 1)
		a.Set(i, 1, math.Log(q.Eps))
		y[i] = math.Log(math.Abs(q.Residual))
		sy[i] = q.Sigma / math.Abs(q.Residual)
	}
	_, _, chi2, dof, err := linearFit(a, y, sy)
	if err != nil || chi2 > float64(dof)+3*math.Sqrt(2*float64(dof)) {
		return false
	}
	if n < 4 {
		return true
	}
	// Curvature test: a term q (ln ε)² must not be significant at 2σ.
	a3 := mat.NewDense(n, 3, nil)
	for i, q := range w {
		l := math.Log(q.Eps)
		a3.Set(i, 0, 1)
		a3.Set(i, 1, l)
		a3.Set(i, 2, l*l)
	}
	c, cov, _, _, err := linearFit(a3, y, sy)
	if err != nil {
		return false
	}
	return math.Abs(c[2]) <= 2*math.Sqrt(cov.At(2, 2))
}
