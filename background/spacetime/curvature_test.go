package spacetime

import (
	"math"
	"math/rand/v2"
	"testing"
)

// Kerr Kretschmann scalar in Boyer–Lindquist r, θ (Henry 2000, ApJ 535,
// 350, from memory):
//
//	K = 48M²(r² − a²cos²θ)(r⁴ − 14a²r²cos²θ + a⁴cos⁴θ)/(r² + a²cos²θ)⁶.
//
// The middle factor carries 14 (a version with 16 fails already at first
// order in a²: the numerator must equal Re (r + i a cos θ)⁶ =
// r⁶ − 15r⁴a²cos²θ + 15r²a⁴cos⁴θ − a⁶cos⁶θ). kerrKretschmannPsi2 is the
// same scalar from the Weyl scalar of the type-D vacuum, K = 48 Re Ψ₂²/M²·M²
// with Ψ₂ = −M/(r − i a cos θ)³ (Chandrasekhar 1983, §58, from memory).
func kerrKretschmann(M, a, r, c float64) float64 {
	ac := a * c
	return 48 * M * M * (r*r - ac*ac) * (r*r*r*r - 14*r*r*ac*ac + ac*ac*ac*ac) / math.Pow(r*r+ac*ac, 6)
}

func kerrKretschmannPsi2(M, a, r, c float64) float64 {
	z := complex(r, -a*c)
	psi2 := complex(-M, 0) / (z * z * z)
	return 48 * real(psi2*psi2)
}

func TestKerrKretschmann(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, c := range []struct {
		name string
		M, a float64
	}{
		{"Schwarzschild", 1, 0},
		{"Kerr a=0.5", 1, 0.5},
		{"Kerr a=0.99", 1, 0.99},
		{"Kerr a=1.7 (super-extremal)", 1, 1.7},
		{"Kerr a=-0.8", 0.7, -0.8},
	} {
		for _, ev := range []struct {
			name string
			m    Metric
		}{
			{"Kerr–Schild", Kerr(c.M, c.a)},
			{"NUT family at N=0", KerrNewmanNUT{M: c.M, A: c.a}},
		} {
			e := NewEvaluator(ev.m, 2)
			var p Point
			worst := 0.0
			for i := 0; i < 200; i++ {
				r := 0.3 + 30*rng.Float64()
				if _, ok := Kerr(c.M, c.a).Horizon(); ok && ev.name != "Kerr–Schild" && math.Abs(r*r-2*c.M*r+c.a*c.a) < 0.05 {
					continue // Boyer–Lindquist form is singular at Δ = 0
				}
				cth := 0.95 * (2*rng.Float64() - 1)
				x := blToCart(r, cth, 2*math.Pi*rng.Float64(), c.a)
				e.Eval(x, &p)
				got := kretschmann(&p)
				want := kerrKretschmann(c.M, c.a, r, cth)
				want2 := kerrKretschmannPsi2(c.M, c.a, r, cth)
				// Scale: the prefactor 48M²/Σ³; the reference has zeros, so a
				// relative test against the value itself would be ill posed.
				scale := 48 * c.M * c.M / math.Pow(r*r+c.a*c.a*cth*cth, 3)
				worst = math.Max(worst, math.Abs(got-want)/scale)
				worst = math.Max(worst, math.Abs(got-want2)/scale)
			}
			// Exact to rounding; 1e-10 leaves room for the sums of ~10³ terms.
			if worst > 1e-10 {
				t.Errorf("%s, %s: worst relative Kretschmann error %.3g", c.name, ev.name, worst)
			}
			t.Logf("%s, %s: worst relative Kretschmann error %.3g", c.name, ev.name, worst)
		}
	}
}

// Vacuum Einstein equations R_μν = 0 for Kerr (Kerr 1963) and Kerr–Taub–NUT
// in every string gauge (Demiański & Newman 1966).
func TestRicciFlat(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	cases := []struct {
		name string
		m    Metric
		a    float64
	}{
		{"Kerr", Kerr(1, 0.6), 0.6},
		{"Kerr super-extremal", Kerr(1, 1.4), 1.4},
		{"Taub–NUT C=0", KerrNewmanNUT{M: 1, N: 0.5}, 0},
		{"Kerr–Taub–NUT C=+1", KerrNewmanNUT{M: 1, A: 0.6, N: 0.4, StringGauge: 1}, 0.6},
		{"Kerr–Taub–NUT C=−1", KerrNewmanNUT{M: 1, A: 0.6, N: 0.4, StringGauge: -1}, 0.6},
		{"Kerr–Taub–NUT C=0", KerrNewmanNUT{M: 1, A: 0.6, N: 0.4}, 0.6},
		{"Kerr–Taub–NUT C=0.3, a<0", KerrNewmanNUT{M: 0.8, A: -0.5, N: -0.7, StringGauge: 0.3}, -0.5},
	}
	for _, c := range cases {
		e := NewEvaluator(c.m, 2)
		var p Point
		worst := 0.0
		for _, x := range randomEvents(rng, 100, c.a, 3, 40) {
			e.Eval(x, &p)
			ric := ricci(&p)
			scale := maxAbsRiemann(&p)
			for _, row := range ric {
				for _, v := range row {
					worst = math.Max(worst, math.Abs(v)/scale)
				}
			}
		}
		// Cancellation among O(scale) terms, exact otherwise.
		if worst > 1e-11 {
			t.Errorf("%s: max |R_μν|/max|R^μ_νρσ| = %.3g", c.name, worst)
		}
		t.Logf("%s: max |R_μν|/max|R^μ_νρσ| = %.3g", c.name, worst)
	}
}

// Einstein–Maxwell equations R_μν = 8πT_μν for Kerr–Newman (Newman et al.
// 1965), dyonic Kerr–Newman (Carter 1968, from memory) and charged
// Kerr–Newman–Taub–NUT (Demiański & Newman 1966), and
// dF = 0 (Bianchi identity of F = dA).
func TestEinsteinMaxwell(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	cases := []struct {
		name string
		m    Metric
		a    float64
	}{
		{"Reissner–Nordström", ReissnerNordstrom(1, 0.7), 0},
		{"Kerr–Newman", KerrNewman{M: 1, A: 0.5, Q: 0.6}, 0.5},
		{"Kerr–Newman super-extremal", KerrNewman{M: 1, A: 0.9, Q: 1.1}, 0.9},
		// Dyonic members: the metric of charge √(Q² + P²) with the
		// duality-rotated field (Carter 1968, from memory).
		{"dyonic Reissner–Nordström", DyonicReissnerNordstrom(1, 0.3, 0.6), 0},
		{"dyonic Kerr–Newman", DyonicKerrNewman{M: 1, A: 0.5, Q: 0.6, P: -0.4}, 0.5},
		{"magnetic Kerr–Newman super-extremal", DyonicKerrNewman{M: 1, A: -0.9, P: 1.1}, -0.9},
		{"KNTN C=+1", KerrNewmanNUT{M: 1, A: 0.5, Q: 0.6, N: 0.3, StringGauge: 1}, 0.5},
		{"KNTN C=−1", KerrNewmanNUT{M: 1, A: 0.5, Q: 0.6, N: 0.3, StringGauge: -1}, 0.5},
		{"KNTN C=0, negative Q", KerrNewmanNUT{M: 1, A: -0.4, Q: -0.8, N: 0.6}, -0.4},
		// Dyonic Kerr–Newman–Taub–NUT: metric with Q² + P², field
		// duality-rotated (Carter 1968; Plebański 1975; from memory).
		{"dyonic KNTN C=+1", KerrNewmanNUT{M: 1, A: 0.5, Q: 0.6, P: -0.4, N: 0.3, StringGauge: 1}, 0.5},
		{"dyonic KNTN C=−1", KerrNewmanNUT{M: 1, A: -0.5, Q: -0.3, P: 0.7, N: -0.4, StringGauge: -1}, -0.5},
		{"magnetic KNTN C=0.3", KerrNewmanNUT{M: 0.8, A: 0.4, P: 0.9, N: 0.5, StringGauge: 0.3}, 0.4},
	}
	for _, c := range cases {
		e := NewEvaluator(c.m, 2)
		var p Point
		worst, worstDF := 0.0, 0.0
		for _, x := range randomEvents(rng, 100, c.a, 3, 40) {
			e.Eval(x, &p)
			ric := ricci(&p)
			T := maxwellStress(&p)
			scale := maxAbsRiemann(&p)
			for m := 0; m < 4; m++ {
				for n := 0; n < 4; n++ {
					worst = math.Max(worst, math.Abs(ric[m][n]-T[m][n])/scale)
				}
			}
			fs := 0.0
			for _, a := range p.DF {
				for _, b := range a {
					for _, v := range b {
						fs = math.Max(fs, math.Abs(v))
					}
				}
			}
			for l := 0; l < 4; l++ {
				for m := 0; m < 4; m++ {
					for n := 0; n < 4; n++ {
						v := p.DF[l][m][n] + p.DF[m][n][l] + p.DF[n][l][m]
						worstDF = math.Max(worstDF, math.Abs(v)/fs)
					}
				}
			}
		}
		// Cancellation among O(scale) terms.
		if worst > 1e-11 {
			t.Errorf("%s: max |R_μν − 8πT_μν|/max|R| = %.3g", c.name, worst)
		}
		if worstDF > 1e-12 {
			t.Errorf("%s: max |dF| = %.3g", c.name, worstDF)
		}
		t.Logf("%s: Einstein–Maxwell residual %.3g, dF residual %.3g", c.name, worst, worstDF)
	}
}

// Symmetries of Γ and R (Wald 1984, §3.2, from memory) and the second
// Bianchi identity ∇_[λ R^μ_|ν|ρσ] = 0.
func TestSymmetriesAndBianchi(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for _, m := range []Metric{
		KerrNewman{M: 1, A: 0.7, Q: 0.4},
		KerrNewmanNUT{M: 1, A: 0.3, Q: 0.5, N: 0.4, StringGauge: 1},
	} {
		e := NewEvaluator(m, 3)
		var p Point
		for _, x := range randomEvents(rng, 20, 0.7, 3, 20) {
			e.Eval(x, &p)
			scale := maxAbsRiemann(&p)
			lo := lowerRiemann(&p)
			// Rounding in sums of O(scale) terms.
			const tol = 1e-12
			for a := 0; a < 4; a++ {
				for b := 0; b < 4; b++ {
					for c := 0; c < 4; c++ {
						if p.Gamma[a][b][c] != p.Gamma[a][c][b] {
							t.Fatalf("%s: Γ not symmetric", m.Name())
						}
						for d := 0; d < 4; d++ {
							R := lo[a][b][c][d]
							if math.Abs(R+lo[b][a][c][d]) > tol*scale ||
								math.Abs(R+lo[a][b][d][c]) > tol*scale ||
								math.Abs(R-lo[c][d][a][b]) > tol*scale ||
								math.Abs(R+lo[a][c][d][b]+lo[a][d][b][c]) > tol*scale {
								t.Fatalf("%s: Riemann symmetry violated at %v", m.Name(), [4]int{a, b, c, d})
							}
						}
					}
				}
			}
			dscale := 0.0
			for _, a := range p.DRiemann {
				for _, b := range a {
					for _, c := range b {
						for _, d := range c {
							for _, v := range d {
								dscale = math.Max(dscale, math.Abs(v))
							}
						}
					}
				}
			}
			worst := 0.0
			for l := 0; l < 4; l++ {
				for mu := 0; mu < 4; mu++ {
					for n := 0; n < 4; n++ {
						for r := 0; r < 4; r++ {
							for s := 0; s < 4; s++ {
								v := p.DRiemann[l][mu][n][r][s] + p.DRiemann[r][mu][n][s][l] + p.DRiemann[s][mu][n][l][r]
								worst = math.Max(worst, math.Abs(v)/dscale)
							}
						}
					}
				}
			}
			// Rounding in sums of O(dscale) terms.
			if worst > 1e-11 {
				t.Errorf("%s: second Bianchi identity residual %.3g", m.Name(), worst)
			}
		}
	}
}
