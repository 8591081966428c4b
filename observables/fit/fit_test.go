package fit_test

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/stat/distuv"

	"ricochet/observables/fit"
	"ricochet/validate/exact"
)

// logspace returns n log-spaced values from a to b.
func logspace(a, b float64, n int) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = a * math.Pow(b/a, float64(i)/float64(n-1))
	}
	return out
}

// nominal returns the coverage of the interval ±σ·max(1, √(χ²/dof)) for a
// linear Gaussian model, where χ²/dof is independent of the estimate:
// E[2Φ(max(1, S)) − 1] with dof·S² ~ χ²(dof), by gonum quad over the
// χ² density (gonum distuv).
func nominal(dof int) float64 {
	chi := distuv.ChiSquared{K: float64(dof)}
	f := func(x float64) float64 {
		s := math.Max(1, math.Sqrt(x/float64(dof)))
		return chi.Prob(x) * math.Erf(s/math.Sqrt2)
	}
	hi := float64(dof) + 40*math.Sqrt(2*float64(dof))
	return quad.Fixed(f, 0, hi, 2000, quad.Legendre{}, 0)
}

// checkCoverage compares the observed fraction of draws whose ±σ interval
// holds the true value with the expected one. For N independent draws the
// count is binomial: we accept 3 standard deviations √(p(1−p)/N) below
// the expectation, and any excess up to maxOver (uncertainties that also
// allow for correlated point errors are wider than the nominal ones for
// independent noise).
func checkCoverage(t *testing.T, name string, hits, n int, want, maxOver float64) {
	t.Helper()
	f := float64(hits) / float64(n)
	sd := math.Sqrt(want * (1 - want) / float64(n))
	t.Logf("%s: coverage %.3f over %d draws (expected %.3f ± %.3f)", name, f, n, want, sd)
	if f < want-3*sd || f > want+maxOver+3*sd {
		t.Errorf("%s: coverage %.3f, expected %.3f (−%.3f, +%.3f)", name, f, want, 3*sd, maxOver+3*sd)
	}
}

// within2 counts the draws inside ±2σ: for a Gaussian 95.45 %.
const gauss2 = 0.9545

// TestExponentCoverage: synthetic data r = A ε^n(1 + c(ε/0.1)³) + σ z,
// z ~ N(0, 1), σ = 0.02|r_true|, plus a noise floor at small ε (σ ≫ |r|).
// With c = 0 (a pure power law) the true n must fall within ±SigmaN at no
// less than the nominal rate of the Birge-inflated interval (nominal);
// with c = 1 the correction terms must absorb the strong-coupling
// curvature: the ±2 SigmaN interval must hold the true n as often as a
// Gaussian's. In both cases the window must exclude the noise floor.
func TestExponentCoverage(t *testing.T) {
	for _, c := range []float64{0, 1} {
		exponentDraws(t, c)
	}
}

func exponentDraws(t *testing.T, curv float64) {
	const n, A, rel = 2.0, 0.7, 0.02
	const draws = 400
	hits, hits2, want := 0, 0, 0.0
	for seed := uint64(0); seed < draws; seed++ {
		rng := rand.New(rand.NewPCG(seed, 1))
		var pts []fit.Point
		for _, e := range logspace(1e-6, 1, 40) {
			r := A * math.Pow(e, n) * (1 + curv*math.Pow(e/0.1, 3))
			sigma := rel * r
			if e < 1e-4 {
				sigma = 1e-8 // noise floor: |r| < 10σ below ε ≈ 3.8e-4
			}
			pts = append(pts, fit.Point{Eps: e, Residual: r + sigma*rng.NormFloat64(), Sigma: sigma})
		}
		res, err := fit.Exponent(pts, nil)
		if err != nil {
			t.Fatal(err)
		}
		if res.EpsLo < 1e-4 {
			t.Fatalf("seed %d: window [%g, %g] includes the noise floor", seed, res.EpsLo, res.EpsHi)
		}
		if math.Abs(res.N-n) <= res.SigmaN {
			hits++
		}
		if math.Abs(res.N-n) <= 2*res.SigmaN {
			hits2++
		}
		want += nominal(res.DOF) / draws
	}
	if curv == 0 {
		checkCoverage(t, "Exponent ±σ", hits, draws, want, 0.25)
	}
	checkCoverage(t, fmt.Sprintf("Exponent ±2σ, curvature %g", curv), hits2, draws, gauss2, 1)
}

// TestNextOrderCoverage: synthetic r = c2 ε² + c3 ε³ + c4 ε⁴ with Gaussian
// noise of known σ. With the degree fixed to the true one, c2 and c3 must
// be covered by ±σ at no less than the nominal rate of the
// Birge-inflated interval; with the degree chosen and averaged
// automatically, ±2σ must cover them as often as for a Gaussian.
func TestNextOrderCoverage(t *testing.T) {
	const c2, c3, c4 = -1.3, 2.1, -0.8
	const draws = 400
	for _, fixed := range []bool{true, false} {
		var hit [2][2]int // [c2, c3][±σ, ±2σ]
		want := 0.0
		for seed := uint64(0); seed < draws; seed++ {
			rng := rand.New(rand.NewPCG(seed, 2))
			var pts []fit.Point
			for _, e := range logspace(1e-3, 0.5, 25) {
				r := c2*e*e + c3*e*e*e + c4*e*e*e*e
				sigma := 1e-4 * e * e // σ/ε² = 1e-4: a relative error of the residual
				pts = append(pts, fit.Point{Eps: e, Residual: r + sigma*rng.NormFloat64(), Sigma: sigma})
			}
			set := &fit.NextOrderSettings{}
			if fixed {
				set.Degree = 2
			}
			res, err := fit.NextOrder(pts, set)
			if err != nil {
				t.Fatal(err)
			}
			want += nominal(res.DOF) / draws
			for k, d := range []float64{math.Abs(res.C2-c2) / res.SigmaC2, math.Abs(res.C3-c3) / res.SigmaC3} {
				if d <= 1 {
					hit[k][0]++
				}
				if d <= 2 {
					hit[k][1]++
				}
			}
		}
		if fixed {
			checkCoverage(t, "NextOrder c2, degree 2, ±σ", hit[0][0], draws, want, 0.2)
			checkCoverage(t, "NextOrder c3, degree 2, ±σ", hit[1][0], draws, want, 0.2)
		} else {
			checkCoverage(t, "NextOrder c2, automatic degree, ±2σ", hit[0][1], draws, gauss2, 1)
			checkCoverage(t, "NextOrder c3, automatic degree, ±2σ", hit[1][1], draws, gauss2, 1)
		}
	}
}

// TestNextOrderDegreeSelection: the Akaike criterion gives the largest
// weight to the true degree of a synthetic polynomial most of the time and
// never to a lower one when the highest coefficient is large compared with
// the noise.
func TestNextOrderDegreeSelection(t *testing.T) {
	right := 0
	const draws = 100
	for seed := uint64(0); seed < draws; seed++ {
		rng := rand.New(rand.NewPCG(seed, 3))
		var pts []fit.Point
		for _, e := range logspace(1e-2, 0.5, 30) {
			r := e * e * (0.5 - 1.5*e)
			sigma := 1e-4 * e * e
			pts = append(pts, fit.Point{Eps: e, Residual: r + sigma*rng.NormFloat64(), Sigma: sigma})
		}
		res, err := fit.NextOrder(pts, nil)
		if err != nil {
			t.Fatal(err)
		}
		if res.Degree < 1 {
			t.Fatalf("seed %d: degree %d below the true 1", seed, res.Degree)
		}
		if res.Degree == 1 {
			right++
		}
	}
	// AIC overfits with probability ~16 % per extra parameter (χ²₁ > 2).
	// Demand a clear majority.
	if right < 60 {
		t.Errorf("true degree chosen in %d of %d draws", right, draws)
	}
}

// TestBreakdownExact: ρ = |r|/|first| = c ε exactly (first = ε,
// r = c ε²), so the crossing of T is ε* = T/c, which log–log
// interpolation reproduces exactly.
func TestBreakdownExact(t *testing.T) {
	const c = 3.0
	var pts []fit.Point
	for _, e := range logspace(1e-4, 1, 17) {
		pts = append(pts, fit.Point{Eps: e, First: e, Residual: c * e * e, Sigma: 1e-3 * c * e * e})
	}
	res, err := fit.Breakdown(pts, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range res {
		want := r.Threshold / c
		if !r.Found || math.Abs(r.Eps-want) > 1e-12*want {
			t.Errorf("T=%g: ε* = %v, want %v", r.Threshold, r.Eps, want)
		}
		// σ(ln ρ) = 1e-3 at both ends, slope 1: σ(ln ε*) between
		// 1e-3/√2 and 1e-3.
		if rs := r.SigmaEps / r.Eps; rs < 0.7e-3 || rs > 1.0001e-3 {
			t.Errorf("T=%g: relative σ %v", r.Threshold, rs)
		}
	}
	res, _ = fit.Breakdown(pts, []float64{100})
	if res[0].Found {
		t.Errorf("threshold 100 never reached, got %v", res[0])
	}
}

// TestBreakdownCurved: ρ = c ε e^{5ε} is not a power law, so the log–log
// interpolation is not exact; the reported uncertainty must cover the true
// crossing (solved here by Newton's method) and the three-point estimate
// must be closer than the two-point one would be.
func TestBreakdownCurved(t *testing.T) {
	const c = 3.0
	var pts []fit.Point
	for _, e := range logspace(1e-4, 0.5, 9) {
		first := e
		pts = append(pts, fit.Point{Eps: e, First: first, Residual: c * e * e * math.Exp(5*e), Sigma: 1e-12})
	}
	res, err := fit.Breakdown(pts, []float64{0.01, 0.1, 0.5})
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range res {
		// Exact crossing of ln(c ε) + 5ε = ln T.
		x := r.Threshold / c
		for it := 0; it < 50; it++ {
			x -= (math.Log(c*x) + 5*x - math.Log(r.Threshold)) / (1/x + 5)
		}
		d := math.Abs(r.Eps - x)
		t.Logf("T=%g: ε* = %.10g ± %.2g, exact %.10g (error %.2g)", r.Threshold, r.Eps, r.SigmaEps, x, d)
		if !r.Found || d > r.SigmaEps {
			t.Errorf("T=%g: ε* = %v ± %v does not cover the exact %v", r.Threshold, r.Eps, r.SigmaEps, x)
		}
	}
}

// TestDarwinScan analyses the exact Darwin deflection (Darwin 1913) minus
// its first-order term over a log-spaced scan: the residual must scale with
// exponent 2 and extrapolate to the second-order coefficient
// c2 = −π/(2γ²v²) derived in exact.DarwinSeries.
func TestDarwinScan(t *testing.T) {
	for _, v := range []float64{0.3, 0.7} {
		c1, c2, c3 := exact.DarwinSeries(v)
		var pts []fit.Point
		for _, e := range logspace(1e-6, 0.1, 41) {
			d, err := exact.Darwin(v, e)
			if err != nil {
				t.Fatal(err)
			}
			first := c1 * e
			// σ: rounding of χ and of c1 ε, a few ulp of |χ|.
			sigma := 4e-16 * math.Abs(d.Chi)
			pts = append(pts, fit.Point{Eps: e, First: first, Residual: d.Chi - first, Sigma: sigma})
		}
		ex, err := fit.Exponent(pts, nil)
		if err != nil {
			t.Fatal(err)
		}
		// Inside the window the local exponent is 2 + (c3/c2) ε + O(ε²), so
		// the fitted n lies within |c3/c2|·EpsHi of 2.
		bias := math.Abs(c3/c2) * ex.EpsHi
		t.Logf("v=%g: n = %.6f ± %.2g over [%.2g, %.2g] (%d points), bias bound %.2g",
			v, ex.N, ex.SigmaN, ex.EpsLo, ex.EpsHi, ex.Used, bias)
		if math.Abs(ex.N-2) > bias+3*ex.SigmaN {
			t.Errorf("v=%g: exponent %v ± %v, want 2", v, ex.N, ex.SigmaN)
		}
		// The series in ε is one in ε/(γv²) (Darwin 1913): keep ε/v² ≤ 0.01
		// so that the degree-4 truncation, ~(ε/v²)⁵, is below the noise.
		no, err := fit.NextOrder(pts, &fit.NextOrderSettings{MaxEps: 0.01 * v * v})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("v=%g: c2 = %.12g ± %.2g (degree %d), c3 = %.8g ± %.2g; exact c2 = %.12g, c3 = %.8g",
			v, no.C2, no.SigmaC2, no.Degree, no.C3, no.SigmaC3, c2, c3)
		if math.Abs(no.C2-c2) > 3*no.SigmaC2 || no.SigmaC2 > 1e-6*math.Abs(c2) {
			t.Errorf("v=%g: c2 = %v ± %v, want %v", v, no.C2, no.SigmaC2, c2)
		}
		if no.Degree >= 1 && math.Abs(no.C3-c3) > 3*no.SigmaC3 {
			t.Errorf("v=%g: c3 = %v ± %v, want %v", v, no.C3, no.SigmaC3, c3)
		}
	}
}
