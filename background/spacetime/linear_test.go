package spacetime

import (
	"fmt"
	"math"
	"testing"
)

// maxDiff returns the largest |a − b| over the fields of two points that
// the given order fills, and the largest |b| (the size of the linear field).
func maxDiff(p, q *Point, order int) (d, size float64) {
	upd := func(x, y float64) {
		d = math.Max(d, math.Abs(x-y))
		size = math.Max(size, math.Abs(y))
	}
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			upd(p.G[m][n]-eta4(m, n), q.G[m][n]-eta4(m, n))
			upd(p.GInv[m][n], q.GInv[m][n])
			upd(p.F[m][n], q.F[m][n])
			for a := 0; a < 4; a++ {
				upd(p.Gamma[m][n][a], q.Gamma[m][n][a])
				if order >= 2 {
					upd(p.DF[m][n][a], q.DF[m][n][a])
					for b := 0; b < 4; b++ {
						upd(p.Riemann[m][n][a][b], q.Riemann[m][n][a][b])
					}
				}
			}
		}
	}
	return d, size
}

func eta4(m, n int) float64 {
	if m != n {
		return 0
	}
	return eta[m]
}

// Each linearized geometry agrees with the exact one to first order in the
// couplings: with (M, N, Q) → λ(M, N, Q) at fixed spin, the difference is
// O(λ²), so lowering λ tenfold lowers it a hundredfold.
func TestLinearization(t *testing.T) {
	cases := []struct {
		name  string
		make  func(l float64) Linearizable
		a     float64
		event [4]float64
	}{
		{"Kerr–Newman", func(l float64) Linearizable { return KerrNewman{M: l, A: 0.8, Q: 0.7 * l} }, 0.8, [4]float64{0, 2.3, -1.1, 1.7}},
		{"Kerr", func(l float64) Linearizable { return Kerr(l, -0.6) }, -0.6, [4]float64{0, -1.5, 2.2, -0.9}},
		{"KNTN C=0", func(l float64) Linearizable { return KerrNewmanNUT{M: l, A: 0.5, Q: 0.4 * l, N: 0.7 * l} }, 0.5, [4]float64{0, 1.8, 1.2, 2.1}},
		{"KNTN C=+1", func(l float64) Linearizable {
			return KerrNewmanNUT{M: l, A: 0.5, Q: -0.4 * l, N: 0.7 * l, StringGauge: 1}
		}, 0.5, [4]float64{0, 1.8, -1.2, -2.1}},
		{"KNTN C=−1", func(l float64) Linearizable {
			return KerrNewmanNUT{M: 0.5 * l, A: -0.9, Q: 0.3 * l, N: -l, StringGauge: -1}
		}, -0.9, [4]float64{0, -0.7, 1.9, 1.3}},
		{"dyonic KNTN C=+1", func(l float64) Linearizable {
			return KerrNewmanNUT{M: l, A: 0.5, Q: -0.4 * l, P: 0.6 * l, N: 0.7 * l, StringGauge: 1}
		}, 0.5, [4]float64{0, 1.8, -1.2, -2.1}},
	}
	for _, c := range cases {
		var prev float64
		for i, l := range []float64{1e-2, 1e-3} {
			m := c.make(l)
			ex := NewEvaluator(m, 2)
			li := NewLinearEvaluator(m, 2)
			var p, q Point
			ex.Eval(c.event, &p)
			li.Eval(c.event, &q)
			d, size := maxDiff(&p, &q, 2)
			// The first-order fields are O(λ) and the difference O(λ²).
			if d > 20*l*size {
				t.Errorf("%s λ=%v: difference %.3g not small against the linear field %.3g", c.name, l, d, size)
			}
			if i == 1 {
				ratio := prev / d
				// O(λ²) gives 100; O(λ³) terms shift it by ~10% at λ = 1e-2.
				if ratio < 80 || ratio > 125 {
					t.Errorf("%s: difference ratio between λ=1e-2 and 1e-3 is %.4g, want ≈ 100", c.name, ratio)
				}
				t.Logf("%s: diff(1e-2)/diff(1e-3) = %.4g", c.name, ratio)
			}
			prev = d
		}
	}
}

// At order 3 the linear evaluator's ∇R is ∂R, antisymmetric like R and
// satisfying the linearized second Bianchi identity.
func TestLinearBianchi(t *testing.T) {
	e := NewLinearEvaluator(KerrNewmanNUT{M: 1, A: 0.4, N: 0.3, Q: 0.2, StringGauge: 1}, 3)
	var p Point
	e.Eval([4]float64{0, 3.1, -2.2, 1.4}, &p)
	worst, scale := 0.0, 0.0
	for l := 0; l < 4; l++ {
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				for r := 0; r < 4; r++ {
					for s := 0; s < 4; s++ {
						scale = math.Max(scale, math.Abs(p.DRiemann[l][m][n][r][s]))
						v := p.DRiemann[l][m][n][r][s] + p.DRiemann[r][m][n][s][l] + p.DRiemann[s][m][n][l][r]
						worst = math.Max(worst, math.Abs(v))
					}
				}
			}
		}
	}
	// Rounding in sums of O(scale) terms.
	if worst > 1e-12*scale {
		t.Errorf("linear Bianchi residual %.3g (scale %.3g)", worst, scale)
	}
}

func BenchmarkEvalKerr(b *testing.B) {
	for order := 1; order <= 3; order++ {
		b.Run(fmt.Sprintf("order%d", order), func(b *testing.B) {
			e := NewEvaluator(Kerr(1, 0.7), order)
			var p Point
			x := [4]float64{0, 5.1, 3.2, -2.3}
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				e.Eval(x, &p)
			}
		})
	}
}

func BenchmarkEvalKerrNewmanNUT(b *testing.B) {
	for order := 1; order <= 3; order++ {
		b.Run(fmt.Sprintf("order%d", order), func(b *testing.B) {
			e := NewEvaluator(KerrNewmanNUT{M: 1, A: 0.7, Q: 0.3, N: 0.4, StringGauge: 1}, order)
			var p Point
			x := [4]float64{0, 5.1, 3.2, -2.3}
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				e.Eval(x, &p)
			}
		})
	}
}
