package scan

import (
	"bytes"
	"context"
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"ricochet/observables/scenario"
	"ricochet/validate/exact"
)

// twoParam is a two-parameter Coulomb scan: 6 couplings × 4 values of γ.
const twoParam = `
name = "coulomb-gamma"
[background]
kind = "coulomb"
charge = 0.01
[probe]
kind = "charge"
charge = 1
[kinematics]
gamma = 1.5
[[scan.axis]]
param = "coupling"
spacing = "log"
min = 1e-4
max = 0.02
points = 6
[[scan.axis]]
param = "gamma"
values = [1.25, 1.5, 2, 3]
`

func mustScenario(t testing.TB, text string) *scenario.Scenario {
	t.Helper()
	s, err := scenario.Parse([]byte(text), "test.toml")
	if err == nil {
		err = s.Validate()
	}
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// TestPlanOrder: the documented enumeration, i = (member × S + slice) × E
// + e with the last declared axis fastest among the slices.
func TestPlanOrder(t *testing.T) {
	s := mustScenario(t, twoParam+"[[scan.axis]]\nparam = \"b\"\nvalues = [1, 2, 4]\n")
	p, err := NewPlan(s, nil, "test")
	if err != nil {
		t.Fatal(err)
	}
	if p.Jobs() != 6*4*3 || p.Slices() != 12 {
		t.Fatalf("jobs %d, slices %d", p.Jobs(), p.Slices())
	}
	i := 0
	for _, g := range []float64{1.25, 1.5, 2, 3} {
		for _, b := range []float64{1, 2, 4} {
			for e := range 6 {
				m, sl, ee := p.Locate(i)
				par := p.Params(sl)
				if m != -1 || ee != e || par[0] != g || par[1] != b {
					t.Fatalf("job %d: member %d slice %d e %d params %v; want γ = %g, b = %g, e = %d", i, m, sl, ee, par, g, b, e)
				}
				if k := p.Slice(sl).Kinematics; k.Gamma != g || k.B != b {
					t.Fatalf("job %d: slice kinematics %+v", i, k)
				}
				i++
			}
		}
	}
	// Shards partition the jobs.
	for _, n := range []int{1, 4, 7} {
		total := 0
		for k := 1; k <= n; k++ {
			sh := Shard{k, n}
			c := 0
			for i := range p.Jobs() {
				if sh.Has(i) {
					c++
				}
			}
			if c != sh.Count(p.Jobs()) {
				t.Errorf("shard %s: %d jobs, Count says %d", sh, c, sh.Count(p.Jobs()))
			}
			total += c
		}
		if total != p.Jobs() {
			t.Errorf("%d shards hold %d jobs of %d", n, total, p.Jobs())
		}
	}
	for _, bad := range []string{"0/4", "5/4", "1/0", "2", "1/4x", "a/b"} {
		if _, err := ParseShard(bad); err == nil {
			t.Errorf("ParseShard(%q) accepted", bad)
		}
	}
}

// TestNextOrderAgainstGamma: per slice of a two-parameter scan, the
// next-order coefficient of the Coulomb impulse Δp_b/m is γv c₂ =
// −π/(2γv) of Darwin's exact deflection (Darwin 1913; exact.DarwinSeries),
// within 3σ and 1e-6 relative at every γ; Trends lists them with the
// expected formula and its pulls.
func TestNextOrderAgainstGamma(t *testing.T) {
	s := mustScenario(t, twoParam)
	recs, err := Run(context.Background(), s, nil)
	if err != nil {
		t.Fatal(err)
	}
	f, err := ParseFormula("-pi/(2*gamma*v)")
	if err != nil {
		t.Fatal(err)
	}
	res := Analyze(s, "", recs, &Options{Observables: []Observable{{Name: "dp_b", I: 2}}, Expect: f})
	tr := Trends(res)
	if len(tr) != 1 || len(tr[0].Rows) != 4 {
		t.Fatalf("trends %+v", tr)
	}
	for _, r := range tr[0].Rows {
		g := r.Params[0]
		v := math.Sqrt(1 - 1/(g*g))
		_, c2, _ := exact.DarwinSeries(v)
		want := g * v * c2
		t.Logf("γ = %g: c2 = %.10g ± %.1e, Darwin %.10g, formula %.10g, pull %.2f", g, r.NextOrder, r.SigmaNextOrder, want, r.Expected, r.Pull)
		if d := math.Abs(r.NextOrder - want); d > 3*r.SigmaNextOrder || d > 1e-6*math.Abs(want) {
			t.Errorf("γ = %g: c2 = %.10g ± %.1e, want %.10g", g, r.NextOrder, r.SigmaNextOrder, want)
		}
		if math.Abs(r.Expected/want-1) > 1e-14 || math.Abs(r.Pull) > 3 {
			t.Errorf("γ = %g: expected %v, pull %v", g, r.Expected, r.Pull)
		}
	}
}

// TestShardsMerge: four shards merged give the record file of one run
// byte for byte (so bit-identical physics columns); a lost shard is
// reported point by point, a rerun of that shard completes it; shards of
// another scenario are refused; merge --rerun computes only what is
// missing.
func TestShardsMerge(t *testing.T) {
	dir := t.TempDir()
	s := mustScenario(t, twoParam)
	one := filepath.Join(dir, "one.jsonl")
	if _, err := Run(context.Background(), s, &Settings{Record: one, Version: "test"}); err != nil {
		t.Fatal(err)
	}
	var shards []string
	for k := 1; k <= 4; k++ {
		f := filepath.Join(dir, "shard-"+string(rune('0'+k))+".jsonl")
		if _, err := Run(context.Background(), s, &Settings{Record: f, Shard: Shard{k, 4}, Version: "test", Workers: 1}); err != nil {
			t.Fatal(err)
		}
		shards = append(shards, f)
	}
	merged := filepath.Join(dir, "merged.jsonl")
	rep, err := Merge(context.Background(), shards, &MergeSettings{Output: merged, Version: "test"})
	if err != nil || !rep.Written || len(rep.Missing) != 0 {
		t.Fatalf("merge: %v %+v", err, rep)
	}
	want, _ := os.ReadFile(one)
	got, _ := os.ReadFile(merged)
	if !bytes.Equal(got, want) {
		t.Fatalf("merged file differs from the one-machine file")
	}
	// Shard 3 lost: its points are missing, exactly.
	os.Remove(merged)
	rep, err = Merge(context.Background(), []string{shards[0], shards[1], shards[3]}, &MergeSettings{Output: merged, Version: "test"})
	if err != nil || rep.Written {
		t.Fatalf("merge without shard 3: %v %+v", err, rep)
	}
	if Ranges(rep.Missing) != "2, 6, 10, 14, 18, 22" || rep.ShardFiles[2] != "" {
		t.Errorf("missing %s, shard files %q", Ranges(rep.Missing), rep.ShardFiles)
	}
	// Rerunning that shard from a partial file completes it (idempotent).
	part := filepath.Join(dir, "shard-3.jsonl")
	b, _ := os.ReadFile(part)
	lines := strings.SplitAfter(string(b), "\n")
	os.WriteFile(part, []byte(strings.Join(lines[:3], "")), 0o644) // header + 2 points
	if _, err := Run(context.Background(), s, &Settings{Record: part, Resume: true, Shard: Shard{3, 4}, Version: "test"}); err != nil {
		t.Fatal(err)
	}
	if b2, _ := os.ReadFile(part); !bytes.Equal(b, b2) {
		t.Errorf("rerun shard file differs from the first run's")
	}
	// Duplicated input: reported, kept once.
	rep, err = Merge(context.Background(), append(shards, one), &MergeSettings{Output: merged, Version: "test"})
	if err != nil || !rep.Written || len(rep.Duplicated) != 24 {
		t.Errorf("merge with a duplicate: %v, %d duplicated", err, len(rep.Duplicated))
	}
	// A shard of another scenario.
	other := mustScenario(t, strings.Replace(twoParam, "charge = 0.01", "charge = -0.01", 1))
	foreign := filepath.Join(dir, "foreign.jsonl")
	if _, err := Run(context.Background(), other, &Settings{Record: foreign, Shard: Shard{2, 4}, Version: "test"}); err != nil {
		t.Fatal(err)
	}
	var fe *FileError
	_, err = Merge(context.Background(), []string{shards[0], foreign}, &MergeSettings{Output: merged, Version: "test"})
	if !errors.As(err, &fe) || !strings.Contains(err.Error(), "belongs to another scan") {
		t.Errorf("foreign shard: %v", err)
	}
	// --rerun computes only the missing points.
	os.Remove(merged)
	rep, err = Merge(context.Background(), shards[:2], &MergeSettings{Output: merged, Version: "test", Rerun: true})
	if err != nil || !rep.Written || rep.Recomputed != 12 {
		t.Fatalf("rerun: %v %+v", err, rep)
	}
	if got, _ := os.ReadFile(merged); !bytes.Equal(got, want) {
		t.Errorf("merge --rerun file differs from the one-machine file")
	}
}
