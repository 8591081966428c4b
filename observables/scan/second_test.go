package scan

import (
	"context"
	"math"
	"testing"

	"ricochet/observables/convention"
	"ricochet/observables/scenario"
)

// TestSecondOrderBuiltins: on every built-in scenario the scan carries
// the direct second order (integrate.SecondOrder), the residual after it
// scales with exponent 3, and the next-order coefficient extrapolated from
// the scan agrees with the direct one within the combined uncertainty
// (3σ, common practice), for the in-plane and out-of-plane impulse
// components. The exponent is 4 for the in-plane impulse of the
// charge–monopole cone, whose in-plane deflection is even in the
// coupling (exact.DyonSeries: n̂_y = sin Φ/√(1 + μ̃²), Φ = π√(1 + μ̃²)).
func TestSecondOrderBuiltins(t *testing.T) {
	for _, name := range scenario.BuiltinNames() {
		if testing.Short() && name != "coulomb-darwin" && name != "schwarzschild" {
			continue
		}
		s := scenarioAt(t, name, nil)
		recs, err := Run(context.Background(), s, &Settings{Workers: 2})
		if err != nil {
			t.Fatal(err)
		}
		res := Analyze(s, "", recs, &Options{Observables: []Observable{{Name: "dp_b", I: 2}, {Name: "dp_n", I: 3}}, Conv: convention.Set{}})
		for _, sr := range res.Series {
			f := sr.Fits
			if f.Second == nil {
				t.Errorf("%s %s: no direct second order", name, sr.Observable)
				continue
			}
			sf := f.Second
			n, sn := math.NaN(), math.NaN()
			if sf.Exponent != nil {
				n, sn = sf.Exponent.N, sf.Exponent.SigmaN
			}
			c2, s2 := math.NaN(), math.NaN()
			if f.NextOrder != nil {
				c2, s2 = f.NextOrder.C2, f.NextOrder.SigmaC2
			}
			want := 3.0
			if name == "monopole-cone" && sr.Observable == "dp_b" {
				want = 4
			}
			significant := math.Abs(sf.Direct) > 10*sf.SigmaDirect
			if significant && !(math.Abs(n-want) <= math.Max(3*sn, 0.05)) {
				t.Errorf("%s %s: exponent after second order %.3f ± %.3f, want %g", name, sr.Observable, n, sn, want)
			}
			if significant && !(sf.Sigmas <= 3) {
				t.Errorf("%s %s: scan and direct next order differ by %.2fσ", name, sr.Observable, sf.Sigmas)
			}
			t.Logf("%-16s %s: direct %.12g ± %.1e, scan %.12g ± %.1e (%.2fσ); exponent after second order %.3f ± %.3f (%s)",
				name, sr.Observable, sf.Direct, sf.SigmaDirect, c2, s2, sf.Sigmas, n, sn, sf.ExponentErr)
		}
	}
}
