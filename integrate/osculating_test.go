package integrate

import (
	"math"
	"testing"
)

// TestSinhCosh: the one-exponential sinh and cosh agree with math.Sinh
// and math.Cosh to a few ulp over the range of the along-track variable
// (|w| ≤ 40 covers R ≤ 1e17 b), on both sides of the switch from the
// series to the exponential at |w| = 1/2. Bound 1e-15 (≈ 4.5 ulp): both
// sides carry rounding of their own (math.Sinh is not exact either), and
// w itself is only held to the tolerance.
func TestSinhCosh(t *testing.T) {
	ws := []float64{-40, -12.3, -1, -0.5000001, -0.5, -0.4999999, -0.3, -1e-5, -1e-12, 0, 1e-12, 1e-5, 0.3, 0.4999999, 0.5, 0.5000001, 1, 7.7, 40}
	for k := 0; k <= 100; k++ {
		ws = append(ws, -1+0.02*float64(k))
	}
	for _, w := range ws {
		sh, ch := sinhCosh(w)
		if d := math.Abs(sh - math.Sinh(w)); d > 1e-15*math.Abs(math.Sinh(w)) {
			t.Errorf("sinh(%g) = %.17g, math.Sinh %.17g", w, sh, math.Sinh(w))
		}
		if d := math.Abs(ch - math.Cosh(w)); d > 1e-15*math.Cosh(w) {
			t.Errorf("cosh(%g) = %.17g, math.Cosh %.17g", w, ch, math.Cosh(w))
		}
	}
}

// TestExpPair: the table-driven exponentials e^a and e^−a agree with
// math.Exp to a few ulp over the range of the along-track variable and
// beyond.
func TestExpPair(t *testing.T) {
	worst, worstNeg := 0.0, 0.0
	for k := 0; k <= 200000; k++ {
		a := 0.5 + 60*float64(k)/200000
		e, ie := expPair(a)
		worst = math.Max(worst, math.Abs(e-math.Exp(a))/math.Exp(a))
		worstNeg = math.Max(worstNeg, math.Abs(ie-math.Exp(-a))/math.Exp(-a))
	}
	for _, a := range []float64{100, 300, 699.9} {
		e, ie := expPair(a)
		worst = math.Max(worst, math.Abs(e-math.Exp(a))/math.Exp(a))
		worstNeg = math.Max(worstNeg, math.Abs(ie-math.Exp(-a))/math.Exp(-a))
	}
	t.Logf("largest relative differences %.2e (e^a), %.2e (e^−a)", worst, worstNeg)
	if worst > 6e-16 || worstNeg > 6e-16 { // ≈ 3 ulp
		t.Errorf("expPair differs from math.Exp by %.2e, %.2e relative", worst, worstNeg)
	}
}
