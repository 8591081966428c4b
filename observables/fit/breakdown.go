package fit

import (
	"fmt"
	"math"
)

// DefaultThresholds are the relative sizes of the residual at which
// Breakdown reports the coupling by default: 1 % and 10 %.
var DefaultThresholds = []float64{0.01, 0.1}

// BreakdownResult is the coupling at which |residual|/|first order| first
// reaches Threshold.
type BreakdownResult struct {
	Threshold float64
	// Eps is the interpolated crossing and SigmaEps its standard
	// uncertainty, propagated from the σ of the two bracketing points.
	Eps, SigmaEps float64
	// Found is false when the ratio stays below (or starts above) the
	// threshold over the whole scan; Eps is then NaN.
	Found bool
}

// Breakdown returns, for each threshold (nil means DefaultThresholds), the
// coupling where the ratio ρ = |residual|/|first order| first crosses it
// going up in ε. Between the bracketing points k, k+1 the crossing is
// interpolated linearly in ln ρ against ln ε, the natural variables when
// ρ ∝ ε^{n−1}:
//
//	ln ε* = ln ε_k + (ln T − ln ρ_k)(ln ε_{k+1} − ln ε_k)/(ln ρ_{k+1} − ln ρ_k).
//
// The uncertainty propagates σ(ln ρ_k) = σ_k/|r_k| through this formula
// (first order); the interpolation error itself is not included.
func Breakdown(pts []Point, thresholds []float64) ([]BreakdownResult, error) {
	if thresholds == nil {
		thresholds = DefaultThresholds
	}
	p, err := sorted(pts)
	if err != nil {
		return nil, err
	}
	for i, q := range p {
		if q.First == 0 || q.Residual == 0 {
			return nil, fmt.Errorf("fit: point %d (ε = %v): first order and residual must be non-zero", i, q.Eps)
		}
	}
	out := make([]BreakdownResult, len(thresholds))
	for ti, th := range thresholds {
		out[ti] = BreakdownResult{Threshold: th, Eps: math.NaN(), SigmaEps: math.NaN()}
		if !(th > 0) {
			return nil, fmt.Errorf("fit: threshold %v must be positive", th)
		}
		lt := math.Log(th)
		for k := 0; k+1 < len(p); k++ {
			r0 := math.Log(math.Abs(p[k].Residual / p[k].First))
			r1 := math.Log(math.Abs(p[k+1].Residual / p[k+1].First))
			if k == 0 && r0 >= lt {
				break // already above at the weakest coupling
			}
			if !(r0 < lt && r1 >= lt) {
				continue
			}
			e0, e1 := math.Log(p[k].Eps), math.Log(p[k+1].Eps)
			w := (lt - r0) / (r1 - r0)
			le := e0 + w*(e1-e0)
			// ∂ln ε*/∂r0 = −(e1 − e0)(1 − w)/(r1 − r0), ∂ln ε*/∂r1 = −(e1 − e0) w/(r1 − r0).
			d0 := (e1 - e0) * (1 - w) / (r1 - r0)
			d1 := (e1 - e0) * w / (r1 - r0)
			s0 := p[k].Sigma / math.Abs(p[k].Residual)
			s1 := p[k+1].Sigma / math.Abs(p[k+1].Residual)
			eps := math.Exp(le)
			out[ti] = BreakdownResult{Threshold: th, Eps: eps, SigmaEps: eps * math.Hypot(d0*s0, d1*s1), Found: true}
			break
		}
	}
	return out, nil
}
