package spacetime

import (
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"testing"
)

// pointDiff returns the largest difference between two points, field by
// field, relative to the largest entry of that field in want, over the
// fields the order fills.
func pointDiff(got, want *Point, order int) map[string]float64 {
	out := map[string]float64{}
	rel := func(name string, g, w []float64) {
		var d, s float64
		for i := range w {
			d = math.Max(d, math.Abs(g[i]-w[i]))
			s = math.Max(s, math.Abs(w[i]))
		}
		if s > 0 {
			d /= s
		}
		out[name] = d
	}
	flat := func(p *Point) (G, GI, Ga, A, F, R, DF, DR []float64) {
		for m := 0; m < 4; m++ {
			A = append(A, p.A[m])
			for n := 0; n < 4; n++ {
				G = append(G, p.G[m][n])
				GI = append(GI, p.GInv[m][n])
				F = append(F, p.F[m][n])
				for a := 0; a < 4; a++ {
					Ga = append(Ga, p.Gamma[m][n][a])
					DF = append(DF, p.DF[m][n][a])
					for b := 0; b < 4; b++ {
						R = append(R, p.Riemann[m][n][a][b])
						for c := 0; c < 4; c++ {
							DR = append(DR, p.DRiemann[m][n][a][b][c])
						}
					}
				}
			}
		}
		return
	}
	g1, g2, g3, g4, g5, g6, g7, g8 := flat(got)
	w1, w2, w3, w4, w5, w6, w7, w8 := flat(want)
	rel("G", g1, w1)
	rel("GInv", g2, w2)
	rel("Gamma", g3, w3)
	rel("A", g4, w4)
	rel("F", g5, w5)
	if order >= 2 {
		rel("Riemann", g6, w6)
		rel("DF", g7, w7)
		var gl, wl []float64
		for A := 0; A < 6; A++ {
			gl = append(gl, got.RiemannLow[A][:]...)
			wl = append(wl, want.RiemannLow[A][:]...)
		}
		rel("RiemannLow", gl, wl)
	}
	if order >= 3 {
		rel("DRiemann", g8, w8)
		var gl, wl []float64
		for l := 0; l < 4; l++ {
			for A := 0; A < 6; A++ {
				gl = append(gl, got.DRiemannLow[l][A][:]...)
				wl = append(wl, want.DRiemannLow[l][A][:]...)
			}
		}
		rel("DRiemannLow", gl, wl)
	}
	return out
}

// staticCases are the metrics whose fast path is compared with the jet
// path: every member of both families, one super-extremal, all string
// gauges, both signs of the spin.
var staticCases = []Linearizable{
	Schwarzschild(1),
	ReissnerNordstrom(1, 0.6),
	Kerr(1, 0.7),
	Kerr(0.4, -1.3),
	KerrNewman{M: 1, A: -0.5, Q: 0.4},
	KerrNewmanNUT{M: 1, N: 0.5},
	KerrNewmanNUT{M: 1, A: 0.6, N: 0.4, StringGauge: 1},
	KerrNewmanNUT{M: 0.8, A: -0.5, Q: 0.3, N: -0.7, StringGauge: -1},
	KerrNewmanNUT{M: 1, A: 0.5, Q: 0.6, N: 0.3, StringGauge: 0.3},
	KerrNewmanNUT{M: 1, A: 0.7},
	KerrNewmanNUT{M: 1, A: 0.5, Q: 0.6, P: -0.8, N: 0.3, StringGauge: 1},
	KerrNewmanNUT{M: 0.4, A: -0.7, P: 0.9, N: -0.5, StringGauge: 0.2},
	DyonicReissnerNordstrom(1, 0.3, -0.5),
	DyonicKerrNewman{M: 1, A: 0.6, Q: 0.4, P: 0.5},
	DyonicKerrNewman{M: 0.7, A: -0.8, P: 0.9},
}

// TestStaticPathAgainstJets checks the fast path (static Taylor arithmetic
// and closed-form curvature) against the jet path (automatic
// differentiation of the metric in four variables, whose curvature is
// checked against the Kerr Kretschmann scalar and the Einstein equations in
// curvature_test.go), exact and linearized, at orders 1–3.
func TestStaticPathAgainstJets(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	worst := map[string]float64{}
	for _, m := range staticCases {
		a := 0.0
		switch k := m.(type) {
		case KerrNewman:
			a = k.A
		case KerrNewmanNUT:
			a = k.A
		case DyonicKerrNewman:
			a = k.A
		}
		events := randomEvents(rng, 12, a, 2.5, 30)
		events = append(events, [4]float64{0.3, 7, -3, 2}, [4]float64{0, 40, 25, -12})
		for _, linear := range []bool{false, true} {
			for order := 1; order <= 3; order++ {
				var fast, ref *Evaluator
				if linear {
					fast = NewLinearEvaluator(m, order)
				} else {
					fast = NewEvaluator(m, order)
				}
				if fast.sm == nil {
					t.Fatalf("%s: no fast path", m.Name())
				}
				ref = newJetEvaluator(m, order, linear)
				for _, x := range events {
					var p, q Point
					fast.Eval(x, &p)
					ref.Eval(x, &q)
					for name, d := range pointDiff(&p, &q, order) {
						key := fmt.Sprintf("%s (linear=%v)", name, linear)
						worst[key] = math.Max(worst[key], d)
						// Both paths are exact; they differ by the order of
						// floating-point operations (sums of up to ~10² terms,
						// each a few ulp).
						if d > 1e-12 {
							t.Errorf("%s linear=%v order %d at %v: %s differs by %.3g (relative to its largest entry)",
								m.Name(), linear, order, x, name, d)
						}
					}
				}
			}
		}
	}
	keys := make([]string, 0, len(worst))
	for k := range worst {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		t.Logf("worst relative difference fast vs jets, %s: %.2g", k, worst[k])
	}
}

// BenchmarkEvalStatic compares the evaluation costs that matter for the
// probes: order 1 (metric, Christoffel symbols, field: geodesics), order 2
// (also Riemann: pole–dipole bodies) and order 3 (also ∇Riemann: bodies
// with a quadrupole), by the fast path and by jets, for Kerr and
// Kerr–Newman–Taub–NUT.
func BenchmarkEvalStatic(b *testing.B) {
	x := [4]float64{0, 5.1, 3.2, -2.3}
	for _, c := range []struct {
		name string
		m    Metric
	}{
		{"Kerr", Kerr(1, 0.7)},
		{"KerrNewman", KerrNewman{M: 1, A: 0.7, Q: 0.3}},
		{"KNTN", KerrNewmanNUT{M: 1, A: 0.7, Q: 0.3, N: 0.4, StringGauge: 1}},
	} {
		for order := 1; order <= 3; order++ {
			for _, path := range []string{"fast", "jet"} {
				b.Run(fmt.Sprintf("%s/order%d/%s", c.name, order, path), func(b *testing.B) {
					e := NewEvaluator(c.m, order)
					if path == "jet" {
						e = newJetEvaluator(c.m, order, false)
					}
					var p Point
					b.ReportAllocs()
					for i := 0; i < b.N; i++ {
						e.Eval(x, &p)
					}
				})
			}
		}
	}
	b.Run("KerrNewmanNUTAccel", func(b *testing.B) {
		k := KerrNewmanNUT{M: 1, A: 0.7, Q: 0.3, N: 0.4, StringGauge: 1}
		u := [4]float64{1.3, 0.4, -0.6, 0.5}
		var s float64
		for i := 0; i < b.N; i++ {
			g, l := k.Accel(x, u)
			s += g[1] + l[1]
		}
		_ = s
	})
	b.Run("KerrSchildPoint", func(b *testing.B) {
		var ks KerrSchildPoint
		k := Kerr(1, 0.7)
		u := [4]float64{1.3, 0.4, -0.6, 0.5}
		var s float64
		for i := 0; i < b.N; i++ {
			k.KerrSchild(x, &ks)
			g, _ := ks.Accel(u)
			s += g[1]
		}
		_ = s
	})
}
