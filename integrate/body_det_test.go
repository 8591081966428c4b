package integrate

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestDet4 checks det4 against the LU determinant of gonum (reference
// library) on random matrices and on Kerr–Schild-like metrics η + f l l
// (l null), whose determinant is exactly −1.
func TestDet4(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for k := 0; k < 500; k++ {
		var m [4][4]float64
		d := mat.NewDense(4, 4, nil)
		scale := 0.0
		for i := 0; i < 4; i++ {
			for j := 0; j < 4; j++ {
				m[i][j] = rng.NormFloat64()
				d.Set(i, j, m[i][j])
				scale = math.Max(scale, math.Abs(m[i][j]))
			}
		}
		want := mat.Det(d)
		// Rounding of sums of 24 products of four O(scale) entries.
		if e := math.Abs(det4(&m)-want) / math.Pow(scale, 4); e > 1e-14 {
			t.Errorf("det4 = %v, gonum %v (error %.2g relative to scale⁴)", det4(&m), want, e)
		}
	}
	for k := 0; k < 100; k++ {
		n := [3]float64{rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()}
		nn := math.Sqrt(n[0]*n[0] + n[1]*n[1] + n[2]*n[2])
		l := [4]float64{1, n[0] / nn, n[1] / nn, n[2] / nn}
		f := 2 * rng.Float64()
		m := etaDiag
		for i := 0; i < 4; i++ {
			for j := 0; j < 4; j++ {
				m[i][j] += f * l[i] * l[j]
			}
		}
		// Exactly −1 for null l; rounding of O(f²) cancelling terms.
		if e := math.Abs(det4(&m) + 1); e > 1e-14*(1+f*f) {
			t.Errorf("Kerr–Schild determinant %v, want −1", det4(&m))
		}
	}
}
