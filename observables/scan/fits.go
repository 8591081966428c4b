package scan

import (
	"math"
	"sort"

	"ricochet/observables/fit"
)

// Fits are the fits of one series.
type Fits struct {
	Exponent    *fit.ExponentResult   `json:"exponent,omitempty"`
	ExponentErr string                `json:"exponent_error,omitempty"`
	NextOrder   *fit.NextOrderResult  `json:"next_order,omitempty"`
	NextErr     string                `json:"next_order_error,omitempty"`
	Breakdown   []fit.BreakdownResult `json:"breakdown,omitempty"`
	// NoiseFloor is the median numerical error σ of the points (the level
	// below which residuals are noise).
	NoiseFloor float64 `json:"noise_floor"`
	// Second compares the scan with the direct second order, when the
	// points carry one.
	Second *SecondFits `json:"second_order,omitempty"`
}

// SecondFits are the fits that involve the direct second order.
type SecondFits struct {
	// Exponent is the scaling of the residual after second order, which
	// must be 3 (nil with ExponentErr set if it cannot be fitted).
	Exponent    *fit.ExponentResult `json:"exponent,omitempty"`
	ExponentErr string              `json:"exponent_error,omitempty"`
	// Direct is the next-order coefficient (second − first)/ε² from the
	// direct second order (the same at every point up to rounding: the
	// mean over the points; with FitSettings.DirectVaries its value
	// extrapolated to ε = 0), SigmaDirect its largest error estimate over
	// the points (propagated through the extrapolation); Sigmas is |NextOrder.C2 − Direct| in units of the
	// combined uncertainty √(σ_scan² + σ_direct²) (NaN without a
	// next-order fit).
	Direct      float64 `json:"direct"`
	SigmaDirect float64 `json:"sigma_direct"`
	Sigmas      float64 `json:"difference_sigmas"`
}

// FitSettings configures the fits of a series; the zero value uses the
// fit package's defaults and reports no breakdown couplings.
type FitSettings struct {
	Exponent  fit.ExponentSettings
	NextOrder fit.NextOrderSettings
	// Thresholds are the relative residuals |residual/first order| at
	// which the breakdown coupling is reported.
	Thresholds []float64
	// DirectVaries says that the direct coefficient (second − first)/ε²
	// changes along the scan — a scan that scales a spin with the coupling
	// (scenario scan.hold = "a_over_m") — so that it is extrapolated to
	// ε = 0 by the quadratic through the three smallest couplings (error
	// O(ε³) of the smallest ones) rather than averaged.
	DirectVaries bool
}

// FitPoints converts the scattered rows of a series into fit input, each
// weighted by Point.Sigma.
func FitPoints(pts []Point) []fit.Point {
	var fp []fit.Point
	for _, p := range pts {
		if !p.OK() {
			continue
		}
		fp = append(fp, fit.Point{Eps: p.Eps, First: p.First, Residual: p.Residual, Sigma: p.Sigma()})
	}
	return fp
}

// Fit runs the exponent, next-order and breakdown fits (package fit) on
// the scattered rows of a series. A fit that fails leaves its result nil
// and its error message set; set may be nil.
func Fit(pts []Point, set *FitSettings) Fits {
	if set == nil {
		set = &FitSettings{}
	}
	fp := FitPoints(pts)
	var f Fits
	if e, err := fit.Exponent(fp, &set.Exponent); err == nil {
		f.Exponent = &e
	} else {
		f.ExponentErr = err.Error()
	}
	if n, err := fit.NextOrder(fp, &set.NextOrder); err == nil {
		f.NextOrder = &n
	} else {
		f.NextErr = err.Error()
	}
	if b, err := fit.Breakdown(fp, set.Thresholds); err == nil {
		f.Breakdown = b
	}
	f.Second = fitSecond(pts, set, f.NextOrder)
	var sig []float64
	for _, q := range fp {
		sig = append(sig, q.Sigma)
	}
	f.NoiseFloor = median(sig)
	return f
}

// median returns the upper median of x (NaN for none).
func median(x []float64) float64 {
	if len(x) == 0 {
		return math.NaN()
	}
	y := append([]float64(nil), x...)
	sort.Float64s(y)
	return y[len(y)/2]
}

// fitSecond fits the residual after second order and compares the
// scan's next-order coefficient with the direct one; nil when no point
// carries a second order.
func fitSecond(pts []Point, set *FitSettings, next *fit.NextOrderResult) *SecondFits {
	var fp []fit.Point
	var sum, sig float64
	var dEps, dVal []float64
	for _, p := range pts {
		if !p.OK() || math.IsNaN(p.Second) {
			continue
		}
		e2 := p.Eps * p.Eps
		sum += (p.Second - p.First) / e2
		sig = math.Max(sig, p.SecondErr/e2)
		dEps, dVal = append(dEps, p.Eps), append(dVal, (p.Second-p.First)/e2)
		s := math.Max(p.Sigma()+p.SecondErr, 2.2e-16*math.Abs(p.Numeric))
		fp = append(fp, fit.Point{Eps: p.Eps, First: p.Second, Residual: p.Residual2, Sigma: s})
	}
	if len(fp) == 0 {
		return nil
	}
	sf := &SecondFits{Direct: sum / float64(len(fp)), SigmaDirect: sig, Sigmas: math.NaN()}
	if set.DirectVaries && len(dEps) >= 3 {
		sf.Direct, sf.SigmaDirect = extrapolateZero(dEps, dVal, sig)
	}
	if e, err := fit.Exponent(fp, &set.Exponent); err == nil {
		sf.Exponent = &e
	} else {
		sf.ExponentErr = err.Error()
	}
	if next != nil {
		sf.Sigmas = math.Abs(next.C2-sf.Direct) / math.Hypot(next.SigmaC2, sf.SigmaDirect)
	}
	return sf
}

// extrapolateZero returns the value at x = 0 of the quadratic through the
// three points of smallest |x| (Lagrange interpolation), and the error
// sig Σ|L_i(0)| that a common error sig of the values propagates to.
func extrapolateZero(x, y []float64, sig float64) (float64, float64) {
	idx := make([]int, len(x))
	for i := range idx {
		idx[i] = i
	}
	sort.Slice(idx, func(i, j int) bool { return math.Abs(x[idx[i]]) < math.Abs(x[idx[j]]) })
	var v, w float64
	for _, i := range idx[:3] {
		L := 1.0
		for _, j := range idx[:3] {
			if j != i {
				L *= x[j] / (x[j] - x[i])
			}
		}
		v += L * y[i]
		w += math.Abs(L)
	}
	return v, sig * w
}
