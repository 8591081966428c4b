package spacetime

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"
)

// kretschmannLow returns R_abcd R^abcd from the bivector components:
// 4 Σ_{A,B} R_A B R^{AB}, with the bivector metric
// G^{[μν][ρσ]} = g^{μρ}g^{νσ} − g^{μσ}g^{νρ} raising each pair.
func kretschmannLow(p *Point) float64 {
	var Gb [6][6]float64
	gi := &p.GInv
	for A, pa := range Bivectors {
		for B, pb := range Bivectors {
			m, n, r, s := pa[0], pa[1], pb[0], pb[1]
			Gb[A][B] = gi[m][r]*gi[n][s] - gi[m][s]*gi[n][r]
		}
	}
	var sum float64
	for A := 0; A < 6; A++ {
		for B := 0; B < 6; B++ {
			var up float64
			for C := 0; C < 6; C++ {
				for D := 0; D < 6; D++ {
					up += Gb[A][C] * Gb[B][D] * p.RiemannLow[C][D]
				}
			}
			sum += p.RiemannLow[A][B] * up
		}
	}
	return 4 * sum
}

// TestKerrSchildCurvatureClosedForm checks the closed-form order-2 path of
// the Kerr–Newman family (kerrcurv.go: the type D Weyl tensor from Ψ₂ and
// the principal bivector, the Ricci part from the Maxwell stress; F and
// ∂F of the complex-shifted charge; at order 3 its covariant derivative)
// at many random events, inside
// and outside the horizon, near the ring and super-extremal: against the
// jet path (automatic differentiation in four variables) to rounding, in
// both the raised and the lowered-only mode, and, for Kerr, the lowered
// components against the Kretschmann scalar of Henry 2000 (ApJ 535, 350,
// eq. 2; from memory), see kerrKretschmann.
func TestKerrSchildCurvatureClosedForm(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	worst := map[string]float64{}
	worstK := 0.0
	for _, m := range []KerrNewman{
		Schwarzschild(1), ReissnerNordstrom(1, 0.8), Kerr(1, 0.9), Kerr(1, -0.3),
		Kerr(0.5, 1.6), {M: 1, A: 0.6, Q: 0.7}, {M: 0.3, A: -1.2, Q: 0.9}, {A: 0.5, Q: 0.4},
	} {
		fast := NewEvaluator(m, 2)
		low := NewEvaluator(m, 2)
		low.SetLowered(true)
		neutral := NewEvaluator(m, 2) // for a neutral probe: no ∂F
		neutral.SetFieldGradient(false)
		ref := newJetEvaluator(m, 2, false)
		fast3, ref3, low3 := NewEvaluator(m, 3), newJetEvaluator(m, 3, false), NewEvaluator(m, 3)
		low3.SetLowered(true)
		events := randomEvents(rng, 150, m.A, 0.4, 60)
		// Within 0.05–0.5 of the ring (off the disk). Not for a = 0, where
		// the ring is the central singularity: there g has entries ~Q²/r²
		// and the reference's Gaussian elimination loses the digits that
		// the closed-form g⁻¹ keeps.
		events = append(events, ringEvents(rng, 40, m.A)...)
		for _, x := range events {
			if x[3] == 0 && x[1]*x[1]+x[2]*x[2] < m.A*m.A {
				continue
			}
			var p, q, pl Point
			fast.Eval(x, &p)
			low.Eval(x, &pl)
			ref.Eval(x, &q)
			for name, d := range pointDiff(&p, &q, 2) {
				worst[name] = math.Max(worst[name], d)
				// Both exact; they differ by the order of the floating-point
				// operations, sums of ~10² terms of a few ulp each, with
				// cancellation near the ring amplifying them by ~10.
				if d > 1e-12 {
					t.Errorf("%s at %v: %s differs from the jets by %.3g", m.Name(), x, name, d)
				}
			}
			if pl.RiemannLow != p.RiemannLow || pl.Gamma != p.Gamma {
				t.Errorf("%s at %v: lowered-only mode differs from the full one", m.Name(), x)
			}
			var pn Point
			neutral.Eval(x, &pn)
			if pn.DF != ([4][4][4]float64{}) || pn.RiemannLow != p.RiemannLow || pn.F != p.F {
				t.Errorf("%s at %v: without the field gradient: DF not zero or the rest changed", m.Name(), x)
			}
			// Order 3: ∇Riemann by covariant differentiation of the
			// closed form (kerrSchildDRiemann).
			fast3.Eval(x, &p)
			ref3.Eval(x, &q)
			var p3 Point
			low3.Eval(x, &p3)
			if p3.DRiemannLow != p.DRiemannLow || p3.RiemannLow != p.RiemannLow {
				t.Errorf("%s at %v: lowered-only mode differs from the full one at order 3", m.Name(), x)
			}
			for _, name := range []string{"DRiemann", "DRiemannLow"} {
				d := pointDiff(&p, &q, 3)[name]
				worst[name] = math.Max(worst[name], d)
				// As above (measured worst 4e-14).
				if d > 1e-12 {
					t.Errorf("%s at %v: %s differs from the jets by %.3g", m.Name(), x, name, d)
				}
			}
			if m.Q == 0 && m.M != 0 {
				r := m.Radius(x)
				c := x[3] / r
				want := kerrKretschmann(m.M, m.A, r, c)
				scale := 48 * m.M * m.M / math.Pow(r*r+m.A*m.A*c*c, 3)
				e := math.Abs(kretschmannLow(&pl)-want) / scale
				worstK = math.Max(worstK, e)
				// Exact to rounding; the contraction sums ~10³ terms.
				if e > 1e-10 {
					t.Errorf("%s at %v: Kretschmann from RiemannLow off by %.3g (relative to 48M²/Σ³)", m.Name(), x, e)
				}
			}
		}
	}
	for k, v := range worst {
		t.Logf("closed form vs jets, %s: worst relative difference %.2g", k, v)
	}
	t.Logf("Kretschmann from RiemannLow: worst error relative to 48M²/Σ³ %.2g", worstK)
}

// TestKNTNCurvatureClosedForm checks the order-2 path of the
// Kerr–Newman–Taub–NUT family without the field gradient (kntncurv.go: the
// type D Weyl tensor with the complex mass M − iN, the Maxwell stress,
// first-order Taylor arithmetic for the metric and Christoffels) at random
// events, off the equator and near the ring, electrically and magnetically
// charged, in several string gauges, against the jet path to rounding; in vacuum also the
// Kretschmann scalar 48 Re Ψ₂² of a type D field (Ψ₂ = −(M − iN)/ϱ³,
// ϱ = r − i(N + a cos θ); the invariant I = 3Ψ₂² and R_abcd R^abcd =
// 16 Re I, Stephani et al. 2003, § 9.1; from memory).
func TestKNTNCurvatureClosedForm(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 24))
	worst := map[string]float64{}
	worstK := 0.0
	for _, m := range []KerrNewmanNUT{
		{M: 1, N: 0.5}, {M: 1, A: 0.6, N: 0.4, StringGauge: 0.3}, {M: 1, A: -0.9, N: -0.7, StringGauge: 1},
		{M: 1, A: 0.6, N: 0.4, Q: 0.5, StringGauge: -1}, {M: 0.3, A: 1.4, N: 0.2, Q: 0.6}, {A: 0.5, N: 0.3, Q: 0.4},
		{M: 1, A: 0.5, N: 0.3, P: 0.6, StringGauge: 1}, {M: 1, A: -0.4, N: 0.6, Q: 0.3, P: -0.5, StringGauge: -1},
	} {
		fast := NewEvaluator(m, 2)
		fast.SetFieldGradient(false)
		low := NewEvaluator(m, 2)
		low.SetFieldGradient(false)
		low.SetLowered(true)
		ref := newJetEvaluator(m, 2, false)
		taylor := NewEvaluator(m, 2) // with charge: the order-2 Taylor path
		events := randomEvents(rng, 120, m.A, 0.4, 60)
		events = append(events, ringEvents(rng, 30, m.A)...)
		for _, x := range events {
			if x[3] == 0 && x[1]*x[1]+x[2]*x[2] < m.A*m.A {
				continue
			}
			var p, q, pl, pt Point
			fast.Eval(x, &p)
			low.Eval(x, &pl)
			ref.Eval(x, &q)
			taylor.Eval(x, &pt)
			q.DF = [4][4][4]float64{} // not filled without the field gradient
			pt.DF = q.DF
			two := pointDiff(&pt, &q, 2)
			for name, d := range pointDiff(&p, &q, 2) {
				if name == "DF" {
					continue
				}
				worst[name] = math.Max(worst[name], d)
				// All exact; sums of ~10² terms of a few ulp each, with
				// cancellation near the ring and in the Misner-string
				// gauge terms at large r: 1e-11 (measured worst 6e-12
				// without charge), and with charge, where the order-2
				// Taylor path is a second independent reference, twice
				// its difference from the jets where that is larger
				// (measured up to 2.2e-11 with a magnetic charge).
				tol := 1e-11
				if m.Q != 0 || m.P != 0 {
					worst[name+" (Taylor vs jets)"] = math.Max(worst[name+" (Taylor vs jets)"], two[name])
					tol = math.Max(tol, 2*two[name])
				}
				if d > tol {
					t.Errorf("%s at %v: %s differs from the jets by %.3g", m.Name(), x, name, d)
				}
			}
			if pl.RiemannLow != p.RiemannLow || pl.Gamma != p.Gamma {
				t.Errorf("%s at %v: lowered-only mode differs from the full one", m.Name(), x)
			}
			if m.Q == 0 && m.P == 0 {
				r := m.Radius(x)
				c := x[3] / r
				psi2 := -complex(m.M, -m.N) / cmplx.Pow(complex(r, -(m.N+m.A*c)), 3)
				want := 48 * real(psi2*psi2)
				scale := 48 * cmplx.Abs(psi2*psi2)
				e := math.Abs(kretschmannLow(&pl)-want) / scale
				worstK = math.Max(worstK, e)
				// Exact to rounding; the contraction sums ~10³ terms.
				if e > 1e-10 {
					t.Errorf("%s at %v: Kretschmann from RiemannLow off by %.3g (relative to 48|Ψ₂|²)", m.Name(), x, e)
				}
			}
		}
	}
	for k, v := range worst {
		t.Logf("closed form vs jets, %s: worst relative difference %.2g", k, v)
	}
	t.Logf("Kretschmann from RiemannLow: worst error relative to 48|Ψ₂|² %.2g", worstK)
}
