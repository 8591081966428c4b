package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestRobustSelection: a configuration that meets the target only by
// cancellation (a tighter tolerance at the same radius misses it) is not
// selected, for either code; rounds of the same configuration are pooled
// into the median of their wall times; rounds that disagree on the
// deterministic columns are refused. The rows are made up for the test.
func TestRobustSelection(t *testing.T) {
	round := func(sec1, sec2 string) string {
		return strings.Join([]string{
			"code\tproblem\ttol\tR\tevals\tmedian_seconds\tchi\tchi_exact\tabs_err\tstatus",
			// At R = 1e3 the loosest tolerance meets 1e-11 by cancellation:
			// 3e-12 at tol 1e-9, while tol 1e-10 shows the floor 5e-11.
			"ricochet\tP1\t1e-09\t1e+03\t300\t" + sec1 + "\t0\t0\t3.000e-12\tscattered",
			"ricochet\tP1\t1e-10\t1e+03\t400\t4e-05\t0\t0\t5.000e-11\tscattered",
			"ricochet\tP1\t1e-11\t1e+03\t500\t5e-05\t0\t0\t5.000e-11\tscattered",
			// At R = 1e4 tol 1e-10 and everything tighter meet it.
			"ricochet\tP1\t1e-09\t1e+04\t350\t3.5e-05\t0\t0\t2.000e-10\tscattered",
			"ricochet\tP1\t1e-10\t1e+04\t450\t" + sec2 + "\t0\t0\t8.000e-12\tscattered",
			"ricochet\tP1\t1e-11\t1e+04\t550\t5.5e-05\t0\t0\t1.000e-12\tscattered",
			// The peer: the same pattern, and a failed run that must not count.
			"peer\tP1\t1e-09\t1e+03\t1000\t3e-05\t0\t0\t1.000e-12\tscattered",
			"peer\tP1\t1e-10\t1e+03\t1200\t3.6e-05\t0\t0\t4.000e-11\tscattered",
			"peer\tP1\t1e-09\t1e+04\t1300\t4e-05\t0\t0\t9.000e-12\tscattered",
			"peer\tP1\t1e-10\t1e+04\t1500\t4.5e-05\t0\t0\tnan\tfailed",
			"peer\tP1\t1e-09\t1e+05\t1600\t5e-05\t0\t0\t2.000e-12\tscattered",
			"peer\tP1\t1e-10\t1e+05\t1800\t5.5e-05\t0\t0\t1.000e-12\tscattered",
		}, "\n") + "\n"
	}
	rows, err := ReadRows(strings.NewReader(round("3e-05", "4e-05")), strings.NewReader(round("3e-05", "6e-05")),
		strings.NewReader(round("3e-05", "5e-05")))
	if err != nil {
		t.Fatal(err)
	}
	r, ok := Cheapest(Robust(rows, "ricochet", "P1", 1e-11), true)
	if !ok || r.Tol != 1e-10 || r.R != 1e4 || r.Evals != 450 {
		t.Errorf("ricochet: selected %+v, want tol 1e-10 at R = 1e4 (450 evaluations)", r)
	}
	if m := r.Median(); m != 5e-05 {
		t.Errorf("median of the rounds 4e-5, 6e-5, 5e-5 = %g, want 5e-5", m)
	}
	p, ok := Cheapest(Robust(rows, "peer", "P1", 1e-11), true)
	if !ok || p.Tol != 1e-09 || p.R != 1e5 {
		t.Errorf("peer: selected %+v, want tol 1e-9 at R = 1e5", p)
	}
	if _, ok := Cheapest(Robust(rows, "peer", "P1", 1e-13), true); ok {
		t.Error("peer: a configuration selected for an unreached target")
	}
	var out bytes.Buffer
	if err := SelectTable(&out, rows, []float64{1e-11}, nil); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(out.String(), "P1\t1e-11\tevals\t1e-09\t1e+05\t1600\t50.0\t1e-10\t1e+04\t450\t50.0\t3.56\t1.00") {
		t.Errorf("table:\n%s", out.String())
	}
	bad := strings.Replace(round("3e-05", "4e-05"), "\t450\t", "\t451\t", 1)
	if _, err := ReadRows(strings.NewReader(round("3e-05", "4e-05")), strings.NewReader(bad)); err == nil {
		t.Error("rounds with different evaluation counts accepted")
	}
}
