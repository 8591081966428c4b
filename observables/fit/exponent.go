package fit

import (
	"fmt"
	"math"
)

// ExponentSettings tunes Exponent. The zero value (or nil) gives the
// defaults.
type ExponentSettings struct {
	// NoiseFactor: a point is above the noise floor when
	// |residual| > NoiseFactor·σ. Zero means 10 (then the linearised
	// σ(ln|r|) = σ/|r| ≤ 0.1 and the bias of ln|r|, −σ²/(2r²), is below
	// 5 % of it).
	NoiseFactor float64
	// MaxEps is the strong-coupling cut: points with ε > MaxEps are never
	// used. Zero means no cut.
	MaxEps float64
	// EpsLo, EpsHi, when EpsHi > 0, override the automatic window: exactly
	// the points with EpsLo ≤ ε ≤ EpsHi are used.
	EpsLo, EpsHi float64
	// MinPoints is the smallest window tried. Zero means 4, the fewest
	// that leave two degrees of freedom to the plain power law.
	MinPoints int
	// MaxCorrections is the largest number K of correction terms tried.
	// Zero means as many as the data support: n − 4 for a window of n
	// points, at most 39, and never beyond the numerical rank.
	MaxCorrections int
	// ICIThreshold is the Γ of the window rule; zero means
	// DefaultICIThreshold.
	ICIThreshold float64
}

// ExponentResult is the fitted power law |residual| ≈ A ε^N (1 + d₁ε + …).
type ExponentResult struct {
	// N is the exponent and SigmaN its standard uncertainty,
	// SigmaN² = SigmaStat² + SigmaModel²: the point errors propagated
	// (widened by Quality.Inflation) and the spread over the numbers of
	// correction terms the data cannot tell apart.
	N          float64 `json:"n"`
	SigmaN     float64 `json:"n_sigma"`
	SigmaStat  float64 `json:"n_sigma_stat"`
	SigmaModel float64 `json:"n_sigma_model"`
	// LogA is ln A of the model of largest weight.
	LogA float64 `json:"log_a"`
	// EpsLo, EpsHi bound the window used; Used is its number of points.
	EpsLo float64 `json:"eps_lo"`
	EpsHi float64 `json:"eps_hi"`
	Used  int     `json:"points_used"`
	// Corrections is the number K of next-order terms d_k ε^k of the
	// model of largest weight; Weights[K] is the Akaike weight of K terms.
	Corrections int       `json:"corrections"`
	Weights     []float64 `json:"correction_weights"`
	// Quality is the goodness of fit of the model of largest weight.
	Quality `json:"quality"`
}

// Exponent fits ln|residual| = ln A + n ln ε + Σ_{k=1..K} d_k ε^k by
// weighted least squares, with σ(ln|r|) = σ/|r| (first-order error
// propagation), and returns n with its standard uncertainty.
//
// The correction terms absorb the next orders of the expansion,
// r = c ε^n (1 + (c'/c) ε + …), whose pull on a plain power-law fit would
// otherwise bias n by about |c'/c|·ε_max, far more than the statistical
// error of nearly exact data. Every K from 0 to MaxCorrections is fitted
// and the exponents are averaged with Akaike weights, the uncertainty
// including their spread and the overdispersion inflation (see
// NextOrder, fitFamily and family.average).
//
// Window (automatic unless EpsHi is set): the points above the noise
// floor (|r| > NoiseFactor·σ) and below MaxEps form runs of consecutive
// points; the first run of at least MinPoints points is used, and of the
// windows made of its k smallest couplings (k ≥ MinPoints) the rule of
// intersecting confidence intervals (iciSelect) picks the largest whose
// exponent agrees with those of all smaller windows. Cost O(n D²) for
// D = MaxCorrections + 2 and O(D³) for each of at most 8 log₂ n + 64
// windows.
func Exponent(pts []Point, s *ExponentSettings) (ExponentResult, error) {
	var set ExponentSettings
	if s != nil {
		set = *s
	}
	if set.NoiseFactor == 0 {
		set.NoiseFactor = 10
	}
	if set.MinPoints == 0 {
		set.MinPoints = 4
	}
	set.MinPoints = max(set.MinPoints, 4)
	if set.ICIThreshold == 0 {
		set.ICIThreshold = DefaultICIThreshold
	}
	p, err := sorted(pts)
	if err != nil {
		return ExponentResult{}, err
	}
	var run []Point
	fixed := set.EpsHi > 0
	if fixed {
		for _, q := range p {
			if q.Eps >= set.EpsLo && q.Eps <= set.EpsHi {
				if q.Residual == 0 {
					return ExponentResult{}, fmt.Errorf("fit: zero residual at ε = %v inside the window", q.Eps)
				}
				run = append(run, q)
			}
		}
	} else {
		run = firstRun(p, set)
	}
	n := len(run)
	if n < set.MinPoints {
		return ExponentResult{}, fmt.Errorf("%w: %d points in the window, need %d", ErrTooFewPoints, n, set.MinPoints)
	}
	mMax := maxColumns
	if set.MaxCorrections > 0 {
		mMax = min(mMax, 2+set.MaxCorrections)
	}
	k := min(mMax, n-2)
	scale := run[n-1].Eps
	ends := windowEnds(n, set.MinPoints)
	if fixed {
		ends = []int{n}
	}
	ls := newNestedLS(k)
	x := make([]float64, k)
	var wins []window
	next := 0
	for i, q := range run {
		r := math.Abs(q.Residual)
		t := r / q.Sigma // 1/σ(ln|r|)
		x[0], x[1] = t, t*math.Log(q.Eps/scale)
		for j := 2; j < k; j++ {
			t *= q.Eps / scale
			x[j] = t
		}
		ls.add(x, math.Log(r)*r/q.Sigma)
		if next < len(ends) && i+1 == ends[next] {
			next++
			fam, ok := fitFamily(ls, 2, mMax, 1)
			if ok {
				wins = append(wins, window{fam: fam, est: []estimate{fam.average(1, 1)}, size: i + 1})
			}
		}
	}
	if len(wins) == 0 {
		return ExponentResult{}, fmt.Errorf("%w: the power-law design has rank below 2", ErrTooFewPoints)
	}
	w := selectWindow(wins, set.ICIThreshold)
	best := w.fam.models[w.fam.best].fit
	en := w.est[0]
	return ExponentResult{
		N: en.value, SigmaN: en.sigma, SigmaStat: en.stat, SigmaModel: en.model,
		// ln A: the fit is in ln(ε/scale), so ln A = c₀ − n ln scale.
		LogA:  best.c[0] - best.c[1]*math.Log(scale),
		EpsLo: run[0].Eps, EpsHi: run[w.size-1].Eps, Used: w.size,
		Corrections: best.m - 2,
		Weights:     w.fam.weights(2),
		Quality:     w.fam.bestQuality(),
	}, nil
}

// firstRun returns the first run of at least set.MinPoints consecutive
// points above the noise floor and below MaxEps, with distinct couplings.
func firstRun(p []Point, set ExponentSettings) []Point {
	ok := func(q Point) bool {
		return q.Residual != 0 && math.Abs(q.Residual) > set.NoiseFactor*q.Sigma && (set.MaxEps == 0 || q.Eps <= set.MaxEps)
	}
	for lo := 0; lo < len(p); {
		hi := lo
		for hi < len(p) && ok(p[hi]) && (hi == lo || p[hi].Eps > p[hi-1].Eps) {
			hi++
		}
		if hi-lo >= set.MinPoints {
			return p[lo:hi]
		}
		lo = max(hi, lo+1)
	}
	return nil
}
