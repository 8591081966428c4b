package spacetime

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"
)

// The dyonic Kerr–Newman–Taub–NUT field is the duality rotation of the
// electric one (Carter 1968; Plebański 1975; Griffiths & Podolský 2009,
// Ch. 12; from memory): F(Q, P) = F_e(Q) + *F_e(P), with F_e(q) the field
// of the electric member of charge q (its potential does not depend on the
// metric's charge term) and the Hodge dual taken with the dyonic metric.
// This checks the magnetic potential, its Dirac-string gauge on the Misner
// string's half-axes and the sign of N and a in it, for every string gauge.
func TestDyonicKerrNewmanNUTIsDualityRotation(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	for _, k := range []KerrNewmanNUT{
		{M: 1, A: 0.6, Q: 0.4, P: 0.5, N: 0.3, StringGauge: 1},
		{M: 0.3, A: -1.4, Q: -0.2, P: 0.9, N: -0.6, StringGauge: -1},
		{M: 0, A: 0.8, P: -1, N: 0.5},
		{M: 1, Q: 0.5, P: 0.5, N: 0.7, StringGauge: 0.4},
		{M: 1, A: 0.5, P: 0.7, StringGauge: -1},
	} {
		e, m := k, k
		e.P, m.P, m.Q = 0, 0, k.P
		worst := dualityResidual(rng, k, e, m, k.A)
		// Rounding of the dual (sums of ~10² products of O(1) entries).
		if worst > 1e-13 {
			t.Errorf("%s: |F − F_e(Q) − *F_e(P)|/|F| = %.3g", k.Name(), worst)
		}
		t.Logf("%s: duality residual %.3g", k.Name(), worst)
	}
}

// The field invariants of the dyonic Kerr–Newman–Taub–NUT solution in
// closed form: with S = N + a cos θ,
//
//	F_μν F^μν − i F_μν *F^μν = −2 (Q + iP)² / (r − iS)⁴
//
// (the square of the self-dual Maxwell scalar Φ₁ ∝ (Q + iP)/(r − iS)²;
// Kinnersley 1969 and Griffiths & Podolský 2009, Ch. 12, from memory; in
// flat space F² − iF*F = 2(B² − E²) − 4iE·B = −2(E + iB)², which for
// E + iB = (Q + iP) r̂/r² is −2(Q + iP)²/r⁴). The phase of r − iS is the orientation
// convention ε_0123 = +1, fixed by the Reissner–Nordström limit; the r and S
// dependence, and N entering only with a cos θ, is the check.
func TestDyonicKerrNewmanNUTInvariants(t *testing.T) {
	rng := rand.New(rand.NewPCG(43, 44))
	for _, k := range []KerrNewmanNUT{
		{M: 1, A: 0.6, Q: 0.4, P: 0.5, N: 0.3, StringGauge: 1},
		{M: 0.3, A: -1.4, Q: -0.2, P: 0.9, N: -0.6, StringGauge: -1},
		{M: 0.7, A: 0.9, Q: 0.8, N: 0.4},
		{M: 1, P: 0.5, N: 0.7, StringGauge: 0.4},
		{M: 1, Q: 0.3, P: -0.6},
	} {
		e := NewEvaluator(k, 1)
		worst := 0.0
		for _, x := range randomEvents(rng, 40, k.A, 2, 30) {
			var p Point
			e.Eval(x, &p)
			dual := hodge(&p, p.F)
			var up [4][4]float64
			for r := 0; r < 4; r++ {
				for s := 0; s < 4; s++ {
					for a := 0; a < 4; a++ {
						for b := 0; b < 4; b++ {
							up[r][s] += p.GInv[r][a] * p.GInv[s][b] * p.F[a][b]
						}
					}
				}
			}
			var f2, ff float64
			for m := 0; m < 4; m++ {
				for n := 0; n < 4; n++ {
					f2 += p.F[m][n] * up[m][n]
					ff += dual[m][n] * up[m][n]
				}
			}
			r := ksRadiusFloat(x, k.A)
			S := k.N + k.A*x[3]/r
			z := complex(r, -S)
			want := -2 * complex(k.Q, k.P) * complex(k.Q, k.P) / (z * z * z * z)
			got := complex(f2, -ff)
			worst = math.Max(worst, cmplx.Abs(got-want)/cmplx.Abs(want))
		}
		// Rounding of the contractions (~10³ products).
		if worst > 1e-12 {
			t.Errorf("%s: |F² − iF*F − closed form|/|closed form| = %.3g", k.Name(), worst)
		}
		t.Logf("%s: invariants residual %.3g", k.Name(), worst)
	}
}

// String structure (see KerrNewmanNUT): for C = ±1 the Dirac string of
// the magnetic potential lies on the Misner string's half-axis, the other
// half-axis is regular (A_φ = x A_y − y A_x = O(ρ²) there, O(P) on the
// string), and NearString reports exactly the string half-axis, also at
// N = 0.
func TestDyonicKerrNewmanNUTStrings(t *testing.T) {
	for _, tc := range []struct {
		C       float64
		regular [4]float64 // a point near the regular half-axis
	}{{1, [4]float64{0, 1e-3, 2e-3, -4}}, {-1, [4]float64{0, 1e-3, 2e-3, 4}}} {
		k := KerrNewmanNUT{M: 1, A: 0.5, P: 0.8, N: 0.3, StringGauge: tc.C}
		if k.NearString(tc.regular, 0.1) {
			t.Errorf("C = %g: the half-axis through %v reported as a string", tc.C, tc.regular)
		}
		s := tc.regular
		s[3] = -s[3]
		if !k.NearString(s, 0.1) {
			t.Errorf("C = %g: the string half-axis through %v not reported", tc.C, s)
		}
		// A_φ = A_i (∂_φ)^i → 0 on the regular half-axis: A stays bounded
		// there (|A| ≲ P/ρ on a string).
		var p Point
		NewEvaluator(k, 1).Eval(tc.regular, &p)
		aphi := tc.regular[1]*p.A[2] - tc.regular[2]*p.A[1]
		rho2 := tc.regular[1]*tc.regular[1] + tc.regular[2]*tc.regular[2]
		// A_φ = O(ρ²) on the regular axis (smooth 1-form).
		if math.Abs(aphi) > 10*rho2 {
			t.Errorf("C = %g: A_φ = %.3g at ρ² = %.3g on the regular half-axis", tc.C, aphi, rho2)
		}
		NewEvaluator(k, 1).Eval(s, &p)
		if aphi := s[1]*p.A[2] - s[2]*p.A[1]; math.Abs(aphi) < 0.5*k.P {
			t.Errorf("C = %g: A_φ = %.3g next to the string, want O(P)", tc.C, aphi)
		}
	}
	if !(KerrNewmanNUT{M: 1, P: 0.5, StringGauge: 1}).NearString([4]float64{0, 0, 0, 5}, 1) {
		t.Error("N = 0, P ≠ 0: the Dirac string is not reported")
	}
}
