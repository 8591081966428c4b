package integrate

import (
	"math"
	"testing"
)

// TestSinh: the one-exponential sinh agrees with math.Sinh to a few ulp
// over the range of the along-track variable (|w| ≤ 40 covers R ≤ 1e17 b).
func TestSinh(t *testing.T) {
	for _, w := range []float64{-40, -12.3, -1, -0.3, -1e-5, -1e-12, 0, 1e-12, 1e-5, 0.3, 1, 7.7, 40} {
		got, want := sinh(w), math.Sinh(w)
		if d := math.Abs(got - want); d > 4e-16*math.Abs(want) {
			t.Errorf("sinh(%g) = %.17g, math.Sinh %.17g", w, got, want)
		}
	}
}
