package rk

import "math"

// Step-size control (Hairer, Nørsett & Wanner 1993, §II.4; Hairer & Wanner
// 1996, §IV.2, PI control of Gustafsson 1991 as in Hairer's codes).
//
// With the error err of the current step (err ≤ 1 accepts), the previous
// accepted error errOld and α = 1/EstimateOrder − piAlphaShift·piBeta:
//
//	q     = err^α / errOld^piBeta / safety
//	h_new = h / clamp(q, 1/maxFactor, 1/minFactor)
//
// After a rejection the step is only allowed to shrink (no growth on the
// step following a rejection); a rejected step uses the plain (I)
// controller, h_new = h / min(1/minFactor, err^α/safety).
const (
	// defaultSafety is the safety factor (common practice: 0.9).
	defaultSafety = 0.9
	// minFactor ≤ h_new/h ≤ maxFactor bound the step ratio (the defaults of
	// Hairer's published 5(4) code, FAC1 = 0.2, FAC2 = 10).
	minFactor = 0.2
	maxFactor = 10.0
	// piBeta is the β of the PI controller (default 0.04 of Hairer's 5(4) code,
	// after Gustafsson 1991).
	piBeta = 0.04
	// piAlphaShift: the proportional exponent is α = 1/k − 0.75β
	// (Hairer & Wanner 1996, §IV.2, eq. (2.43c), from memory).
	piAlphaShift = 0.75
	// errOldFloor keeps errOld away from 0 (Hairer: FACOLD ≥ 1e-4).
	errOldFloor = 1e-4
)

// controller holds the state of the PI step-size controller.
type controller struct {
	alpha, safety float64
	errOld        float64
	rejected      bool // last attempt was rejected
	// Predictive control (Settings.Predictive): the last accepted step
	// and its error, zero before the first.
	predictive bool
	k          float64 // 1/EstimateOrder
	roots      int     // EstimateOrder = 2^roots (1 … 4), else 0
	hAcc, eAcc float64 // last accepted step and its err^k
}

func (c *controller) reset(estimateOrder int, safety float64, predictive bool) {
	c.alpha = 1/float64(estimateOrder) - piAlphaShift*piBeta
	c.k = 1 / float64(estimateOrder)
	c.safety = safety
	c.errOld = errOldFloor
	c.rejected = false
	c.predictive = predictive
	c.hAcc, c.eAcc = 0, 0
	c.roots = 0
	for r, o := 1, 2; r <= 4; r, o = r+1, 2*o {
		if estimateOrder == o {
			c.roots = r
		}
	}
}

// root returns e^k, k = 1/EstimateOrder: by repeated square roots when the
// order is a power of two (Dormand–Prince 8(5,3): three roots, a fraction of the cost of
// one logarithm and one exponential), else as exp(k ln e).
func (c *controller) root(e float64) float64 {
	if c.roots == 0 {
		return math.Exp(c.k * math.Log(e))
	}
	for i := 0; i < c.roots; i++ {
		e = math.Sqrt(e)
	}
	return e
}

// nextPredictive is the predictive controller of Gustafsson (1994) in the
// form of Hairer & Wanner's RADAU5 (Hairer & Wanner 1996, §IV.8, from
// memory): besides the standard factor q = err^k/safety it forms
//
//	q_G = (h_acc/h) (err²/err_acc)^k / safety
//
// from the last two accepted steps and uses the larger (more cautious) of
// the two, which anticipates an error that grows from step to step (as on
// the approach to an encounter) instead of meeting it with a rejection.
func (c *controller) nextPredictive(h, err float64) (float64, bool) {
	e := larger(err, errOldFloor)
	// One power per step: (e²/err_acc)^k = (e^k)²/err_acc^k.
	ek := c.root(e)
	q := ek / c.safety
	if err <= 1 {
		if c.hAcc != 0 {
			qg := math.Abs(c.hAcc/h) * (ek * ek / c.eAcc) / c.safety
			q = larger(q, qg)
		}
		q = larger(1/maxFactor, smaller(1/minFactor, q))
		hNew := h / q
		if c.rejected && math.Abs(hNew) > math.Abs(h) {
			hNew = h
		}
		c.hAcc, c.eAcc = h, ek
		c.rejected = false
		return hNew, true
	}
	c.rejected = true
	return h / smaller(1/minFactor, q), false
}

// next returns the next step size after a step of size h with error err,
// and whether the step is accepted. The sign of h is kept.
func (c *controller) next(h, err float64) (float64, bool) {
	if c.predictive {
		return c.nextPredictive(h, err)
	}
	fac11 := math.Pow(err, c.alpha)
	if err <= 1 {
		q := fac11 / math.Pow(c.errOld, piBeta) / c.safety
		q = math.Max(1/maxFactor, math.Min(1/minFactor, q))
		hNew := h / q
		if c.rejected && math.Abs(hNew) > math.Abs(h) {
			hNew = h
		}
		c.errOld = math.Max(err, errOldFloor)
		c.rejected = false
		return hNew, true
	}
	c.rejected = true
	return h / math.Min(1/minFactor, fac11/c.safety), false
}

// initialStep returns the starting step size of Hairer, Nørsett & Wanner
// (1993, §II.4, "Starting step size", from memory): with d0 = ‖y0‖,
// d1 = ‖f(t0, y0)‖ in the scaled RMS norm, h0 = 0.01·d0/d1; one explicit
// Euler step of size h0 gives d2 = ‖f(t0+h0, y1) − f0‖/h0 and
// h1 = (0.01/max(d1, d2))^(1/EstimateOrder); the result is min(100·h0, h1, hmax).
// It uses one evaluation of f; work is scratch storage.
func (s *Solver) initialStep(f Func, t0 float64, y0, f0 []float64, dir, hmax float64, work, f1 []float64) float64 {
	// The norms run over the controlled components (Settings.Carried).
	yc := y0[:len(y0)-s.carried]
	n := float64(len(yc))
	var dnf, dny float64
	for i, y := range yc {
		sk := s.atol + s.rtol*math.Abs(y)
		dnf += (f0[i] / sk) * (f0[i] / sk)
		dny += (y / sk) * (y / sk)
	}
	var h float64
	if dnf <= 1e-10 || dny <= 1e-10 {
		h = 1e-6
	} else {
		h = 0.01 * math.Sqrt(dny/dnf)
	}
	h = math.Min(h, hmax)
	for i := range y0 {
		work[i] = y0[i] + dir*h*f0[i]
	}
	f(t0+dir*h, work, f1)
	s.stats.Evaluations++
	var der2 float64
	for i, y := range yc {
		sk := s.atol + s.rtol*math.Abs(y)
		d := (f1[i] - f0[i]) / sk
		der2 += d * d
	}
	der2 = math.Sqrt(der2/n) / h
	der12 := math.Max(math.Abs(der2), math.Sqrt(dnf/n))
	var h1 float64
	if der12 <= 1e-15 || math.IsNaN(der12) {
		h1 = math.Max(1e-6, h*1e-3)
	} else {
		h1 = math.Pow(0.01/der12, 1/float64(s.tab.EstimateOrder))
	}
	return dir * math.Min(math.Min(100*h, h1), hmax)
}

// larger and smaller are math.Max and math.Min for the finite numbers of
// the step loop (the solver rejects non-finite errors before the
// controller sees them), without the rules for NaN and signed zeros that
// cost a call.
func larger(a, b float64) float64 {
	if a > b {
		return a
	}
	return b
}

func smaller(a, b float64) float64 {
	if a < b {
		return a
	}
	return b
}
