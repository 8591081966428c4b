package spacetime

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestContractedPoint checks the contracted mode (contract.go) against the
// full tensors of the default mode at random events of uncharged Kerr
// members, off the equator and near the ring: Γ^μ_αβ u^α v^β and
// Σ_B R_AB S^B for random u, v and antisymmetric S, FillGamma against
// Gamma, and the metric, its inverse and the zero field unchanged.
func TestContractedPoint(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	worst := map[string]float64{}
	for _, m := range []KerrNewman{Schwarzschild(1), Kerr(1, 0.9), Kerr(1, -0.3), Kerr(0.5, 1.6), Kerr(0.01, 0.4)} {
		full, con := NewEvaluator(m, 2), NewEvaluator(m, 2)
		full.SetLowered(true)
		con.SetLowered(true)
		con.SetContracted(true)
		events := randomEvents(rng, 100, m.A, 0.4, 60)
		events = append(events, ringEvents(rng, 30, m.A)...)
		for _, x := range events {
			if x[3] == 0 && x[1]*x[1]+x[2]*x[2] < m.A*m.A {
				continue
			}
			var p, q Point
			full.Eval(x, &p)
			con.Eval(x, &q)
			if !q.Contracted() || p.Contracted() {
				t.Fatalf("%s: contracted mode not taken (or taken by default)", m.Name())
			}
			if q.G != p.G || q.GInv != p.GInv || q.F != p.F || q.A != p.A {
				t.Errorf("%s at %v: metric or field differs in contracted mode", m.Name(), x)
			}
			var u, v [4]float64
			var S [4][4]float64
			for i := 0; i < 4; i++ {
				u[i], v[i] = rng.NormFloat64(), rng.NormFloat64()
				for j := i + 1; j < 4; j++ {
					S[i][j] = rng.NormFloat64()
					S[j][i] = -S[i][j]
				}
			}
			// Relative to the sum of the magnitudes of the terms (the
			// contractions may cancel): rounding of sums of ~10² terms.
			rel := func(name string, got, want []float64, scale float64) {
				for i := range want {
					e := math.Abs(got[i]-want[i]) / scale
					worst[name] = math.Max(worst[name], e)
					if e > 1e-13 {
						t.Errorf("%s at %v: %s[%d] = %v, full tensors %v", m.Name(), x, name, i, got[i], want[i])
					}
				}
			}
			g1, g2 := q.ChristoffelUV(&u, &v), p.ChristoffelUV(&u, &v)
			gs := 0.0
			for mu := 0; mu < 4; mu++ {
				for a := 0; a < 4; a++ {
					for b := 0; b < 4; b++ {
						gs += math.Abs(p.Gamma[mu][a][b] * u[a] * v[b])
					}
				}
			}
			rel("ChristoffelUV", g1[:], g2[:], gs)
			w1, w2 := q.RiemannS(&S), p.RiemannS(&S)
			ws := 0.0
			for A := 0; A < 6; A++ {
				for B, pr := range Bivectors {
					ws += math.Abs(p.RiemannLow[A][B] * S[pr[0]][pr[1]])
				}
			}
			rel("RiemannS", w1[:], w2[:], ws)
			q.FillGamma()
			for mu := 0; mu < 4; mu++ {
				for a := 0; a < 4; a++ {
					for b := 0; b < 4; b++ {
						if q.Gamma[mu][a][b] != p.Gamma[mu][a][b] {
							t.Fatalf("%s at %v: FillGamma differs from Gamma", m.Name(), x)
						}
					}
				}
			}
		}
	}
	for k, v := range worst {
		t.Logf("contracted vs full, %s: worst %.2g (relative to the sum of |terms|)", k, v)
	}
}
