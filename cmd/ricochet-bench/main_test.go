package main

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"ricochet/background/vec"
	"ricochet/integrate"
)

// TestMeasureExact: the benchmark's read-out of χ agrees with the exact
// deflections it is compared with.
func TestMeasureExact(t *testing.T) {
	cases := []struct {
		p      Problem
		source string
		tol, R float64
		want   float64 // |χ − χ_exact| bound
	}{
		// Darwin 1913 (validate/exact.Darwin). At R = 1e5 b the first-order
		// tails leave a truncation error of order θ²(b/R)²/7 ≈ 3e-12 (the
		// law measured in integrate's Settings.Radius comment), and tol
		// 1e-12 an integration error of the same size; 1e-10 leaves a
		// margin of thirty while still catching a wrong set-up or read-out
		// (a missing tail alone costs ~1e-6).
		{P1(), "Darwin 1913", 1e-12, 1e5, 1e-10},
		// Schwarzschild radial quadrature (validate/exact.Schwarzschild,
		// accurate to ~1e-13); same reasoning for the bound.
		{P2(), "Schwarzschild 1916 quadrature", 1e-12, 1e5, 1e-10},
	}
	for _, c := range cases {
		r, err := Measure(c.p, c.tol, c.R, 1)
		if err != nil {
			t.Fatalf("%s: %v", c.p.Name, err)
		}
		if r.Status != integrate.StatusScattered {
			t.Fatalf("%s: status %v", c.p.Name, r.Status)
		}
		if r.AbsErr() > c.want {
			t.Errorf("%s (%s): χ = %.15f, exact %.15f, |Δχ| = %.2e > %.0e",
				c.p.Name, c.source, r.Chi, r.ChiExact, r.AbsErr(), c.want)
		}
		if r.Evals <= 0 || r.Median <= 0 {
			t.Errorf("%s: evals %d, median %v: want positive", c.p.Name, r.Evals, r.Median)
		}
	}
}

// TestExactValues: the exact deflections the harness compares with match
// their first post-Minkowskian estimates to the size of the next order,
// so the problems are the ones described (and not, say, a wrong coupling).
func TestExactValues(t *testing.T) {
	// Leading order: χ ≈ 2β, β = ε/(γ v²) = 0.222 (Rutherford's small-angle
	// limit with the relativistic momentum; Darwin 1913, from memory). The
	// higher orders are relative O(β²) ≈ 5 %; the 10 % bound still catches
	// a wrong coupling or a missing factor γ (25 %).
	chi1, err := P1().Exact()
	if err != nil {
		t.Fatal(err)
	}
	v := 0.6
	lo1 := 2 * 0.1 / (gammaOf(v) * v * v)
	if math.Abs(chi1-lo1) > 0.1*lo1 {
		t.Errorf("P1: χ = %v, leading order %v", chi1, lo1)
	}
	// Schwarzschild 1PM + 2PM: χ ≈ 2(1 + v²)/v² (M/b) + (3π/4)(4 + v²)/v²
	// (M/b)² (Westpfahl 1985 in the test-mass limit, from memory). With
	// M/b = 1/30 and v = 0.5 the 3PM term is of relative size
	// (M/b)²/v⁴ × O(10) ≈ 2 %: bound 5 %.
	chi2, err := P2().Exact()
	if err != nil {
		t.Fatal(err)
	}
	v, mb := 0.5, 1.0/30
	pm2 := 2*(1+v*v)/(v*v)*mb + 3*math.Pi/4*(4+v*v)/(v*v)*mb*mb
	if math.Abs(chi2-pm2) > 0.05*pm2 {
		t.Errorf("P2: χ = %v, 1PM + 2PM %v", chi2, pm2)
	}
}

// TestDeflection: the angle read-out against exact values: 90° and a
// small angle where arccos would lose half the digits.
func TestDeflection(t *testing.T) {
	in := vec.Vec4{1, 1, 0, 0}
	if got := Deflection(in, vec.Vec4{1, 0, 2, 0}); math.Abs(got-math.Pi/2) > 1e-15 {
		t.Errorf("90°: got %v", got)
	}
	th := 1e-9
	out := vec.Vec4{1, math.Cos(th), math.Sin(th), 0}
	// exact: th; atan2 keeps full relative precision (a few ulp).
	if got := Deflection(in, out); math.Abs(got-th) > 1e-15*th*10 {
		t.Errorf("small angle: got %v, want %v", got, th)
	}
}

// TestScanWorkersIdentical: the fixed assignment of events to workers makes
// a scan's results independent of the number of workers, bit for bit.
func TestScanWorkersIdentical(t *testing.T) {
	eps := ScanCouplings(6)
	if eps[0] != 1e-3 || math.Abs(eps[5]-0.3) > 1e-15 {
		t.Fatalf("couplings %v: want 1e-3 … 0.3", eps)
	}
	a, _, err := RunScan(eps, 1)
	if err != nil {
		t.Fatal(err)
	}
	b, _, err := RunScan(eps, 2)
	if err != nil {
		t.Fatal(err)
	}
	for i := range a {
		if a[i] != b[i] {
			t.Errorf("event %d: 1 worker %v, 2 workers %v", i, a[i], b[i])
		}
	}
}

// TestCommandLine: exit statuses and the shared header.
func TestCommandLine(t *testing.T) {
	cases := []struct {
		args []string
		code int
		out  string
	}{
		{nil, 2, ""},
		{[]string{"nonsense"}, 2, ""},
		{[]string{"measure", "--tols", "abc"}, 2, ""},
		{[]string{"measure", "--problems", "P3"}, 2, ""},
		{[]string{"exact"}, 0, "P1\t0.41682314120"},
		{[]string{"measure", "--problems", "P1", "--tols", "1e-8", "--radii", "1e3", "--repeats", "1"}, 0, Header},
	}
	for _, c := range cases {
		var out, errb bytes.Buffer
		code := mainWith(c.args, &out, &errb)
		if code != c.code {
			t.Errorf("%v: exit %d, want %d (stderr %q)", c.args, code, c.code, errb.String())
		}
		if !strings.Contains(out.String(), c.out) {
			t.Errorf("%v: output %q does not contain %q", c.args, out.String(), c.out)
		}
	}
}
