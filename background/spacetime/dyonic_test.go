package spacetime

import (
	"math"
	"math/rand/v2"
	"testing"

	"ricochet/background/vec"
)

// hodge returns *F_μν = ½√−g ε_μνρσ F^ρσ (ε_0123 = +1) with the metric of p.
func hodge(p *Point, F [4][4]float64) (out [4][4]float64) {
	det := 0.0
	for a := 0; a < 4; a++ {
		for b := 0; b < 4; b++ {
			for c := 0; c < 4; c++ {
				for d := 0; d < 4; d++ {
					if s := vec.Levi(a, b, c, d); s != 0 {
						det += s * p.G[0][a] * p.G[1][b] * p.G[2][c] * p.G[3][d]
					}
				}
			}
		}
	}
	var up [4][4]float64
	for r := 0; r < 4; r++ {
		for s := 0; s < 4; s++ {
			for a := 0; a < 4; a++ {
				for b := 0; b < 4; b++ {
					up[r][s] += p.GInv[r][a] * p.GInv[s][b] * F[a][b]
				}
			}
		}
	}
	sq := math.Sqrt(-det)
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			for r := 0; r < 4; r++ {
				for s := 0; s < 4; s++ {
					out[m][n] += 0.5 * sq * vec.Levi(m, n, r, s) * up[r][s]
				}
			}
		}
	}
	return out
}

// dualityResidual returns max |F − F_e − *F_m|/|F| over random events
// (spin parameter a) for the dyonic metric d and the electric metrics e
// (charge Q) and m (charge P), the dual taken with the metric of d.
func dualityResidual(rng *rand.Rand, d, e, m Metric, a float64) float64 {
	ed, ee, em := NewEvaluator(d, 1), NewEvaluator(e, 1), NewEvaluator(m, 1)
	worst := 0.0
	for _, x := range randomEvents(rng, 40, a, 2, 30) {
		var pd, pe, pm Point
		ed.Eval(x, &pd)
		ee.Eval(x, &pe)
		em.Eval(x, &pm)
		dual := hodge(&pd, pm.F)
		scale := 0.0
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				scale = math.Max(scale, math.Abs(pd.F[m][n]))
			}
		}
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				worst = math.Max(worst, math.Abs(pd.F[m][n]-pe.F[m][n]-dual[m][n])/scale)
			}
		}
	}
	return worst
}

// The dyonic field is the duality rotation of the electric Kerr–Newman
// field (Carter 1968; Griffiths & Podolský 2009, §11.1; from memory):
// F(Q, P) = F_e(Q) + *F_e(P), with F_e(q) the field of KerrNewman at
// charge q and the Hodge dual taken with the dyonic metric. This checks
// the magnetic potential, its Dirac-string gauge and the sign of a in it.
func TestDyonicIsDualityRotation(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	for _, k := range []DyonicKerrNewman{
		{M: 1, A: 0.6, Q: 0.4, P: 0.5},
		{M: 0.3, A: -1.4, Q: -0.2, P: 0.9},
		{M: 0, A: 0.8, P: -1},
		DyonicReissnerNordstrom(1, 0.5, 0.5),
	} {
		worst := dualityResidual(rng, k, KerrNewman{M: k.M, A: k.A, Q: k.Q}, KerrNewman{M: k.M, A: k.A, Q: k.P}, k.A)
		// Rounding of the dual (sums of ~10² products of O(1) entries).
		if worst > 1e-13 {
			t.Errorf("%s: |F − F_e(Q) − *F_e(P)|/|F| = %.3g", k.Name(), worst)
		}
		t.Logf("%s: duality residual %.3g", k.Name(), worst)
	}
}

// Far away E + iB → (Q + iP) r̂/r²: the electric charge Q and the
// magnetic monopole charge P read off r² E·r̂ and r² B·r̂, with
// B_i = ½ε_ijk F_jk (Gaussian units; Jackson 1999, §6.12, from memory), in
// several directions off the string (dyonic Kerr–Newman–Taub–NUT: off
// the axis, which is outside its chart).
func TestDyonicFarField(t *testing.T) {
	const R = 1e6
	for _, c := range []struct {
		m    Metric
		Q, P float64
		dirs [][3]float64
	}{
		{DyonicKerrNewman{M: 1.2, A: 0.7, Q: -0.4, P: 0.9}, -0.4, 0.9, [][3]float64{{0.6, 0.48, 0.64}, {0, 0.6, -0.8}, {-1, 0, 0}, {0, 0, 1}}},
		{KerrNewmanNUT{M: 1.2, A: 0.7, Q: -0.4, P: 0.9, N: 0.5, StringGauge: 1}, -0.4, 0.9, [][3]float64{{0.6, 0.48, 0.64}, {0, 0.6, -0.8}, {-1, 0, 0}, {0.28, -0.96, 0}}},
	} {
		e := NewEvaluator(c.m, 1)
		for _, dir := range c.dirs {
			var p Point
			e.Eval([4]float64{0, R * dir[0], R * dir[1], R * dir[2]}, &p)
			B := [3]float64{p.F[2][3], p.F[3][1], p.F[1][2]}
			Er, Br := 0.0, 0.0
			for i := 0; i < 3; i++ {
				Er += p.F[i+1][0] * dir[i]
				Br += B[i] * dir[i]
			}
			// Leading corrections are relative O(M/R, N/R, a/R) ≲ 1e-6.
			const tol = 1e-5
			if Q := R * R * Er; math.Abs(Q-c.Q) > tol*math.Abs(c.Q) {
				t.Errorf("%s, dir %v: far-field Q = %v, want %v", c.m.Name(), dir, Q, c.Q)
			}
			if P := R * R * Br; math.Abs(P-c.P) > tol*math.Abs(c.P) {
				t.Errorf("%s, dir %v: far-field P = %v, want %v", c.m.Name(), dir, P, c.P)
			}
		}
	}
}

// Near the Dirac string (the negative z axis) the field stays the duality
// rotation of the electric one, to the rounding of the string term's curl,
// O(ε_mach r²/ρ²) at distance ρ (see DyonicKerrNewman).
func TestDyonicNearString(t *testing.T) {
	k := DyonicKerrNewman{M: 0.5, A: 0.3, P: 1}
	ed := NewEvaluator(k, 2)
	em := NewEvaluator(KerrNewman{M: 0.5, A: 0.3, Q: 1}, 2)
	for _, d := range []float64{1e-1, 1e-2, 1e-3, 1e-4} {
		x := [4]float64{0, 5 * d, 3 * d, -5}
		var pd, pm Point
		ed.Eval(x, &pd)
		em.Eval(x, &pm)
		dual := hodge(&pd, pm.F)
		w, s := 0.0, 0.0
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				w = math.Max(w, math.Abs(pd.F[m][n]-dual[m][n]))
				s = math.Max(s, math.Abs(dual[m][n]))
			}
		}
		rr := (x[1]*x[1] + x[2]*x[2] + x[3]*x[3]) / (x[1]*x[1] + x[2]*x[2]) // r²/ρ²
		t.Logf("ρ/r = %.3g: relative difference %.2e", 1/math.Sqrt(rr), w/s)
		// 100 ulp × r²/ρ²: the cancellation among O(r²/ρ²) terms.
		if w/s > 100*2.2e-16*rr {
			t.Errorf("ρ/r = %.3g: |F − *F_e|/|F| = %.3g > 100 ε r²/ρ²", 1/math.Sqrt(rr), w/s)
		}
	}
}
