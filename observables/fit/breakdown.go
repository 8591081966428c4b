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
	Threshold float64 `json:"threshold"`
	// Eps is the interpolated crossing and SigmaEps its standard
	// uncertainty, propagated from the σ of the two bracketing points.
	Eps      float64 `json:"eps"`
	SigmaEps float64 `json:"eps_sigma"`
	// Found is false when the ratio stays below (or starts above) the
	// threshold over the whole scan; Eps is then NaN.
	Found bool `json:"found"`
}

// Breakdown returns, for each threshold (nil means DefaultThresholds), the
// coupling where the ratio ρ = |residual|/|first order| first crosses it
// going up in ε. Between the bracketing points k, k+1 the crossing is
// interpolated linearly in ln ρ against ln ε, the natural variables when
// ρ ∝ ε^{n−1}:
//
//	ln ε* = ln ε_k + (ln T − ln ρ_k)(ln ε_{k+1} − ln ε_k)/(ln ρ_{k+1} − ln ρ_k).
//
// When a third point is available (k+2, else k−1) the crossing of the
// quadratic through the three points in the same variables is returned
// instead, and the difference between the linear and the quadratic
// crossings (which overestimates the error of the quadratic one) is taken
// as the interpolation error. SigmaEps combines it in quadrature with the
// propagation of σ(ln ρ_k) = σ_k/|r_k| through the linear formula (first
// order).
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
			stat := math.Hypot(d0*s0, d1*s1) // in ln ε
			interp := 0.0
			j := k + 2
			if j >= len(p) {
				j = k - 1
			}
			if j >= 0 {
				ej := math.Log(p[j].Eps)
				rj := math.Log(math.Abs(p[j].Residual / p[j].First))
				if lq, ok := quadCrossing(e0, e1, ej, r0, r1, rj, lt, le); ok {
					interp = math.Abs(lq - le)
					le = lq
				}
			}
			eps := math.Exp(le)
			out[ti] = BreakdownResult{Threshold: th, Eps: eps, SigmaEps: eps * math.Hypot(stat, interp), Found: true}
			break
		}
	}
	return out, nil
}

// quadCrossing returns the x in [x0, x1] where the quadratic through
// (x0, y0), (x1, y1), (x2, y2) takes the value t, by Newton's method from
// the linear estimate guess; ok is false if it does not converge inside
// the bracket.
func quadCrossing(x0, x1, x2, y0, y1, y2, t, guess float64) (float64, bool) {
	// Newton form: q(x) = y0 + c1 (x − x0) + c2 (x − x0)(x − x1).
	c1 := (y1 - y0) / (x1 - x0)
	c2 := ((y2-y0)/(x2-x0) - c1) / (x2 - x1)
	x := guess
	for it := 0; it < 50; it++ {
		q := y0 + c1*(x-x0) + c2*(x-x0)*(x-x1) - t
		dq := c1 + c2*(2*x-x0-x1)
		if dq == 0 {
			return 0, false
		}
		dx := q / dq
		x -= dx
		if math.Abs(dx) <= 1e-15*math.Max(1, math.Abs(x)) {
			break
		}
	}
	lo, hi := math.Min(x0, x1), math.Max(x0, x1)
	if !(x >= lo && x <= hi) {
		return 0, false
	}
	return x, true
}
