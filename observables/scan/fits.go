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
}

// FitSettings configures the fits of a series; the zero value uses the
// fit package's defaults and reports no breakdown couplings.
type FitSettings struct {
	Exponent  fit.ExponentSettings
	NextOrder fit.NextOrderSettings
	// Thresholds are the relative residuals |residual/first order| at
	// which the breakdown coupling is reported.
	Thresholds []float64
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
