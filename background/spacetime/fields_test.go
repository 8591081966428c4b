package spacetime

import (
	"math"
	"math/rand/v2"
	"testing"

	"ricochet/background/jet"
	"ricochet/background/vec"
)

// evalJets evaluates m with coordinate jets of the given order at x.
func evalJets(m Metric, x [4]float64, order int) (g [4][4]jet.Jet, A [4]jet.Jet) {
	var X [4]jet.Jet
	for i := range X {
		X[i].SetVar(order, x[i], i)
	}
	m.Eval(&X, &g, &A)
	return g, A
}

// Maxwell's equations ∇_μF^{μν} = (1/√−g) ∂_μ(√−g F^{μν}) = 0 (Misner,
// Thorne & Wheeler 1973, eq. 22.17a, from memory), with √−g, g^{μν} and
// F^{μν} composed in jet arithmetic and the determinant by the Leibniz
// formula.
func TestMaxwellEquations(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	for _, m := range []Metric{
		KerrNewman{M: 1, A: 0.5, Q: 0.6},
		KerrNewman{M: 0.4, A: -1.2, Q: 0.9},
		KerrNewmanNUT{M: 1, A: 0.5, Q: 0.6, N: 0.3, StringGauge: 1},
		KerrNewmanNUT{M: 1, A: 0.2, Q: -0.7, N: -0.5},
		KerrNewmanNUT{M: 1, A: 0.5, Q: 0.6, P: -0.8, N: 0.3, StringGauge: 1},
		KerrNewmanNUT{M: 0.4, A: -0.7, P: 0.9, N: -0.5, StringGauge: 0.2},
		DyonicReissnerNordstrom(1, 0.4, 0.7),
		DyonicKerrNewman{M: 1, A: 0.5, Q: 0.6, P: -0.8},
		DyonicKerrNewman{M: 0.4, A: -1.2, P: 0.9},
	} {
		worst := 0.0
		for _, x := range randomEvents(rng, 30, 0.5, 3, 30) {
			g, A := evalJets(m, x, 2)
			var gt, ginv [4][4]jet.Jet
			var F [4][4]jet.Jet
			for a := 0; a < 4; a++ {
				for b := 0; b < 4; b++ {
					gt[a][b].Truncate(&g[a][b], 1)
					var t jet.Jet
					F[a][b].Deriv(&A[b], a)
					t.Deriv(&A[a], b)
					F[a][b].Sub(&F[a][b], &t)
				}
			}
			jet.MatInv4(&ginv, &gt)
			var det, term jet.Jet
			det.SetConst(1, 0)
			for a := 0; a < 4; a++ {
				for b := 0; b < 4; b++ {
					for c := 0; c < 4; c++ {
						for d := 0; d < 4; d++ {
							s := vec.Levi(a, b, c, d)
							if s == 0 {
								continue
							}
							term.Mul(&gt[0][a], &gt[1][b])
							term.Mul(&term, &gt[2][c])
							term.Mul(&term, &gt[3][d])
							det.AddScaled(&det, s, &term)
						}
					}
				}
			}
			var sq jet.Jet
			sq.Neg(&det)
			sq.Sqrt(&sq)
			for n := 0; n < 4; n++ {
				res, scale := 0.0, 0.0
				for mu := 0; mu < 4; mu++ {
					var W, t jet.Jet
					W.SetConst(1, 0)
					for a := 0; a < 4; a++ {
						for b := 0; b < 4; b++ {
							t.Mul(&ginv[mu][a], &ginv[n][b])
							W.AddMul(&t, &F[a][b])
						}
					}
					W.Mul(&W, &sq)
					res += W.D(mu)
					scale = math.Max(scale, math.Abs(W.D(mu)))
				}
				if scale > 0 {
					worst = math.Max(worst, math.Abs(res)/scale)
				}
			}
		}
		// Cancellation among the four O(scale) terms of the divergence.
		if worst > 1e-11 {
			t.Errorf("%s: Maxwell residual %.3g", m.Name(), worst)
		}
		t.Logf("%s: Maxwell residual %.3g", m.Name(), worst)
	}
}

// Far-field mass, angular momentum, charge and NUT charge:
//
//	g_00 → −1 + 2M/r,  g_{0i} ⊃ 2J(y, −x, 0)/r³ with J = Ma
//	(Misner, Thorne & Wheeler 1973, eq. 19.5, from memory),
//	E = F_{i0} → Q r̂/r² (Gaussian units),
//	∇×(g_{0i}) → 2N r̂/r² (the gravitomagnetic monopole of −2N cos θ dφ;
//	Griffiths & Podolský 2009, Ch. 12, from memory).
func TestFarField(t *testing.T) {
	const R = 1e6
	type want struct{ M, J, Q, N float64 }
	cases := []struct {
		name string
		m    Metric
		w    want
	}{
		{"Kerr–Newman", KerrNewman{M: 1.3, A: 0.7, Q: 0.5}, want{1.3, 1.3 * 0.7, 0.5, 0}},
		{"Kerr–Newman a<0", KerrNewman{M: 0.8, A: -0.4, Q: -0.3}, want{0.8, -0.8 * 0.4, -0.3, 0}},
		{"Kerr–Newman–NUT N=0", KerrNewmanNUT{M: 1.3, A: 0.7, Q: 0.5}, want{1.3, 1.3 * 0.7, 0.5, 0}},
		{"KNTN C=0", KerrNewmanNUT{M: 1, A: 0, Q: 0.2, N: 0.6}, want{1, math.NaN(), 0.2, 0.6}},
		{"KNTN C=+1", KerrNewmanNUT{M: 1, A: 0.3, Q: 0.2, N: 0.6, StringGauge: 1}, want{1, math.NaN(), 0.2, 0.6}},
		{"KNTN C=−1", KerrNewmanNUT{M: 1, A: 0.3, Q: 0.2, N: -0.6, StringGauge: -1}, want{1, math.NaN(), 0.2, -0.6}},
	}
	// Leading corrections are relative O(M/R, Q²/(MR), a/R) ≲ 1e-6.
	const tol = 1e-5
	for _, c := range cases {
		e := NewEvaluator(c.m, 1)
		var p Point
		dir := [3]float64{0.6, 0.48, 0.64} // unit, off the axis
		x := [4]float64{0, R * dir[0], R * dir[1], R * dir[2]}
		e.Eval(x, &p)
		if M := R * (1 + p.G[0][0]) / 2; math.Abs(M-c.w.M) > tol*c.w.M {
			t.Errorf("%s: far-field M = %v, want %v", c.name, M, c.w.M)
		}
		Er := 0.0
		for i := 1; i < 4; i++ {
			Er += p.F[i][0] * dir[i-1]
		}
		if Q := R * R * Er; math.Abs(Q-c.w.Q) > tol*math.Abs(c.w.Q) {
			t.Errorf("%s: far-field Q = %v, want %v", c.name, Q, c.w.Q)
		}
		if !math.IsNaN(c.w.J) {
			xe := [4]float64{0, R * 0.8, R * 0.6, 0}
			e.Eval(xe, &p)
			J := -R * R * R * (xe[1]*p.G[0][2] - xe[2]*p.G[0][1]) / (2 * (xe[1]*xe[1] + xe[2]*xe[2]))
			if math.Abs(J-c.w.J) > tol*math.Abs(c.w.J) {
				t.Errorf("%s: far-field J = %v, want %v", c.name, J, c.w.J)
			}
		}
		g, _ := evalJets(c.m, x, 1)
		// B_i = ε_ijk ∂_j g_0k.
		B := [3]float64{
			g[0][3].D(2) - g[0][2].D(3),
			g[0][1].D(3) - g[0][3].D(1),
			g[0][2].D(1) - g[0][1].D(2),
		}
		N := R * R * (B[0]*dir[0] + B[1]*dir[1] + B[2]*dir[2]) / 2
		if math.Abs(N-c.w.N) > tol*math.Max(math.Abs(c.w.N), 1) {
			t.Errorf("%s: far-field N = %v, want %v", c.name, N, c.w.N)
		}
	}
}

// Frame dragging: a > 0 means angular momentum along +z, so zero-angular-
// momentum observers rotate in the +φ sense, ω = −g_tφ/g_φφ > 0
// (Bardeen, Press & Teukolsky 1972, from memory), with ∂_φ = (0, −y, x, 0).
func TestFrameDraggingSense(t *testing.T) {
	for _, m := range []Metric{Kerr(1, 0.6), KerrNewman{M: 1, A: 0.6, Q: 0.3}, KerrNewmanNUT{M: 1, A: 0.6}} {
		e := NewEvaluator(m, 1)
		var p Point
		for _, x := range [][4]float64{{0, 5, 0, 0}, {0, 0, -4, 1}, {0, -3, 3, -2}} {
			e.Eval(x, &p)
			phi := [4]float64{0, -x[2], x[1], 0}
			gtp, gpp := 0.0, 0.0
			for i := 0; i < 4; i++ {
				gtp += p.G[0][i] * phi[i]
				for j := 0; j < 4; j++ {
					gpp += phi[i] * p.G[i][j] * phi[j]
				}
			}
			if w := -gtp / gpp; !(w > 0) {
				t.Errorf("%s at %v: ω = %v, want > 0", m.Name(), x, w)
			}
		}
	}
}

// The Kerr–Schild radius and its gradient against the closed forms
//
//	r⁴ − (ρ² − a²)r² − a²z² = 0,
//	∂_i r = r(r² x_i + a² z δ_iz)/(r⁴ + a²z²)
//
// (implicit differentiation of the quartic; Kerr & Schild 1965).
func TestKerrSchildRadius(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for i := 0; i < 200; i++ {
		a := 3 * (rng.Float64() - 0.5)
		x := [3]float64{10 * (rng.Float64() - 0.5), 10 * (rng.Float64() - 0.5), 10 * (rng.Float64() - 0.5)}
		if i%10 == 0 {
			x[2] *= 1e-3 // near the disk plane, where the second root form matters
		}
		var X, Y, Z, r, r2 jet.Jet
		X.SetVar(2, x[0], 1)
		Y.SetVar(2, x[1], 2)
		Z.SetVar(2, x[2], 3)
		ksRadius(&r, &r2, &X, &Y, &Z, a)
		rv := r.Value()
		rho2 := x[0]*x[0] + x[1]*x[1] + x[2]*x[2]
		q := rv*rv*rv*rv - (rho2-a*a)*rv*rv - a*a*x[2]*x[2]
		// Quartic residual relative to its largest term.
		if math.Abs(q) > 1e-13*math.Max(rv*rv*rv*rv, rho2*rv*rv+a*a*rho2) {
			t.Errorf("a=%v x=%v: quartic residual %v", a, x, q)
		}
		den := rv*rv*rv*rv + a*a*x[2]*x[2]
		for k := 0; k < 3; k++ {
			want := rv * rv * rv * x[k] / den
			if k == 2 {
				want += rv * a * a * x[2] / den
			}
			if got := r.D(k + 1); math.Abs(got-want) > 1e-12*math.Max(1, math.Abs(want)) {
				t.Errorf("a=%v x=%v: ∂%d r = %v, want %v", a, x, k, got, want)
			}
		}
	}
}

// Misner string location: ∂_φ has zero norm on a regular half-axis and
// norm² → −Δχ²/Σ on a string, χ(θ=0) = −2N(1+C), χ(θ=π) = 2N(1−C).
// Curvature invariants do not depend on C (t → t − 2NCφ).
func TestMisnerString(t *testing.T) {
	const M, a, N, zAxis, rho = 1.0, 0.3, 0.5, 6.0, 1e-5
	var kref float64
	for i, C := range []float64{-1, 0, 1} {
		k := KerrNewmanNUT{M: M, A: a, N: N, StringGauge: C}
		e := NewEvaluator(k, 2)
		var p Point
		for _, side := range []float64{1, -1} {
			x := [4]float64{0, rho, 0, side * zAxis}
			e.Eval(x, &p)
			phi := [4]float64{0, -x[2], x[1], 0}
			n2 := 0.0
			for i := 0; i < 4; i++ {
				for j := 0; j < 4; j++ {
					n2 += phi[i] * p.G[i][j] * phi[j]
				}
			}
			r := k.Radius(x)
			c := side
			chi := -2 * N * (c + C)
			sig := r*r + (N+a*c)*(N+a*c)
			del := r*r - 2*M*r + a*a - N*N
			want := -del * chi * chi / sig
			onString := chi != 0
			// O(ρ²) corrections with ρ = 1e-5 against O(1) values.
			if math.Abs(n2-want) > 1e-8 {
				t.Errorf("C=%v side %v: |∂φ|² = %v, want %v", C, side, n2, want)
			}
			if k.NearString(x, 1e-3) != onString {
				t.Errorf("C=%v side %v: NearString = %v, want %v", C, side, !onString, onString)
			}
		}
		x := [4]float64{0, 2.1, -1.4, 3.3}
		e.Eval(x, &p)
		kr := kretschmann(&p)
		if i == 0 {
			kref = kr
		} else if math.Abs(kr-kref) > 1e-12*math.Abs(kref) { // rounding
			t.Errorf("Kretschmann depends on C: %v vs %v", kr, kref)
		}
	}
}

// Predicates for outcomes against the horizon radius r₊ = M + √(M² − a² − Q²)
// (Newman et al. 1965) and the disk geometry of Kerr–Schild coordinates.
func TestPredicates(t *testing.T) {
	s := Schwarzschild(1)
	if !s.Inside([4]float64{0, 1.5, 0, 0}) || s.Inside([4]float64{0, 2.5, 0, 0}) {
		t.Error("Schwarzschild Inside wrong around r = 2M")
	}
	kn := KerrNewman{M: 1, A: 0.6, Q: 0.5}
	rp, ok := kn.Horizon()
	if !ok || math.Abs(rp-(1+math.Sqrt(1-0.36-0.25))) > 1e-15 {
		t.Errorf("KN horizon %v", rp)
	}
	x := blToCart(rp*0.999, 0.3, 1, 0.6)
	y := blToCart(rp*1.001, 0.3, 1, 0.6)
	if !kn.Inside(x) || kn.Inside(y) {
		t.Error("KN Inside wrong around r₊")
	}
	sup := Kerr(1, 1.2)
	if _, ok := sup.Horizon(); ok || sup.Inside([4]float64{0, 0.1, 0, 0.1}) {
		t.Error("super-extremal Kerr has no horizon")
	}
	if !sup.CrossesDisk([4]float64{0, 0.5, 0.2, 1}, [4]float64{0, 0.5, 0.2, -1}) {
		t.Error("segment through the disk not detected")
	}
	if sup.CrossesDisk([4]float64{0, 2, 0.2, 1}, [4]float64{0, 2, 0.2, -1}) {
		t.Error("segment outside the ring reported as crossing")
	}
	if sup.CrossesDisk([4]float64{0, 0.5, 0.2, 1}, [4]float64{0, 0.5, 0.2, 0.5}) {
		t.Error("segment above the disk reported as crossing")
	}
	if d := sup.RingDistance([4]float64{0, 0, 1.2, 0.5}); math.Abs(d-0.5) > 1e-15 {
		t.Errorf("ring distance %v", d)
	}
	nut := KerrNewmanNUT{M: 1, A: 0.2, N: 0.5}
	rp, _ = nut.Horizon()
	if want := 1 + math.Sqrt(1-0.04+0.25); math.Abs(rp-want) > 1e-15 {
		t.Errorf("NUT horizon %v, want %v", rp, want)
	}
	if (KerrNewmanNUT{M: 1}).NearString([4]float64{0, 0, 0, 5}, 1) {
		t.Error("N = 0 has no string")
	}
}
