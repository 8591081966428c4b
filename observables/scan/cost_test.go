package scan

import (
	"context"
	"encoding/json"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
	"time"
)

// TestSampleIndices: distinct sorted indices in range, all of them when
// n ≥ jobs, and spread over the scan: no gap between neighbours (around
// the end) longer than 3 jobs/n + 1. The bound is our requirement (no
// stretch of the scan three times the mean spacing left untimed); the
// three-distance theorem (Sós 1958, from memory) is why the golden-ratio
// sequence meets it: its gaps take at most three lengths, within a factor
// φ of each other. The +1 allows for rounding the points to indices.
func TestSampleIndices(t *testing.T) {
	for jobs := 1; jobs < 2000; jobs += 13 {
		for _, n := range []int{1, 2, 3, 5, 8, 13, 20, 50, 5000} {
			ids := SampleIndices(jobs, n)
			if len(ids) != min(n, jobs) || !slices.IsSorted(ids) || ids[0] < 0 || ids[len(ids)-1] >= jobs {
				t.Fatalf("jobs %d, n %d: %v", jobs, n, ids)
			}
			if len(slices.Compact(slices.Clone(ids))) != len(ids) {
				t.Fatalf("jobs %d, n %d: repeated indices %v", jobs, n, ids)
			}
			if len(ids) < 2 {
				continue
			}
			worst := 0
			for k, i := range ids {
				next := ids[(k+1)%len(ids)]
				if k == len(ids)-1 {
					next += jobs
				}
				worst = max(worst, next-i)
			}
			if lim := 3*float64(jobs)/float64(len(ids)) + 1; float64(worst) > lim {
				t.Errorf("jobs %d, n %d: gap %d > %.1f", jobs, n, worst, lim)
			}
		}
	}
	if SampleIndices(0, 5) != nil || SampleIndices(5, 0) != nil {
		t.Error("no jobs or no samples: want nil")
	}
}

// TestGrahamBound checks the time model of ShardPlan against simulated
// list scheduling: n points of random cost handed in order to the first
// free of c workers finish within n t̄/c + (1 − 1/c) t_max (Graham 1969,
// SIAM J. Appl. Math. 17, 416; from memory), here with the exact mean
// (SE = 0), so the bound must hold exactly (up to rounding, 1e-9 s).
func TestGrahamBound(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := 0; trial < 200; trial++ {
		n := 1 + rng.IntN(200)
		c := 1 + rng.IntN(16)
		costs := make([]float64, n)
		var sum, mx float64
		for i := range costs {
			costs[i] = math.Exp(3 * rng.Float64()) // spread of a factor e³ ≈ 20
			sum += costs[i]
			mx = max(mx, costs[i])
		}
		free := make([]float64, c)
		for _, x := range costs {
			k := slices.Index(free, slices.Min(free))
			free[k] += x
		}
		makespan := slices.Max(free)
		sp := &ShardPlan{CPUs: c, Cost: Cost{Mean: sum / float64(n), Max: mx}}
		if bound := sp.expected(n); makespan > bound+1e-9 {
			t.Errorf("n %d, c %d: makespan %g > bound %g", n, c, makespan, bound)
		}
		if c == 1 && math.Abs(makespan-sp.expected(n)) > 1e-9*sum {
			t.Errorf("one worker: makespan %g, model %g: want equal", makespan, sp.expected(n))
		}
	}
}

// TestNewShardPlan: the documented cost model, computed by hand.
func TestNewShardPlan(t *testing.T) {
	const mib = 1 << 20
	c := &Cost{Mean: 10, Max: 20, RecordBytes: 1000, PeakBytes: 200 * mib}
	sp, err := NewShardPlan(1000, c, ShardRequest{Shards: 10, CPUs: 4})
	if err != nil {
		t.Fatal(err)
	}
	// 100 points per shard: T = 100 × 10 s / 4 + (3/4) × 20 s = 265 s;
	// limit 2 × 265 s + 60 s = 590 s, rounded up to 10 min.
	if sp.PointsPerShard != 100 || sp.Expected != 265*time.Second || sp.Time != 10*time.Minute {
		t.Errorf("shard plan: %d points, expected %v, limit %v; want 100, 265s, 10m", sp.PointsPerShard, sp.Expected, sp.Time)
	}
	// Memory: 2 × (200 MiB + 3 × 100 × 1000 B) = 400.57 MiB → 401 MiB.
	if sp.Memory != 401*mib {
		t.Errorf("memory %d MiB, want 401", sp.Memory/mib)
	}
	// Merge: 2 × 1000 × 1 ms + 60 s = 62 s → 2 min; memory 2 × (200 MiB +
	// 3 × 1000 × 1000 B) = 405.7 MiB → 406 MiB.
	if sp.MergeTime != 2*time.Minute || sp.MergeMemory != 406*mib {
		t.Errorf("merge: %v, %d MiB; want 2m, 406 MiB", sp.MergeTime, sp.MergeMemory/mib)
	}
	if math.Abs(sp.CPUHours-1000*10.0/3600) > 1e-12 {
		t.Errorf("CPU hours %g", sp.CPUHours)
	}

	// Shards from the task time: 1 s per point, one CPU, limit
	// ⌈2n + 60 s⌉ ≤ 1 h allows n ≤ 1770; 10000 points need 6 shards of
	// 1667, whose limit is 2 × 1667 + 60 = 3394 s → 57 min.
	one := &Cost{Mean: 1, Max: 1, RecordBytes: 1000, PeakBytes: mib}
	sp, err = NewShardPlan(10000, one, ShardRequest{})
	if err != nil {
		t.Fatal(err)
	}
	if sp.Shards != 6 || sp.PointsPerShard != 1667 || sp.Time != 57*time.Minute || sp.Memory != MinMemory {
		t.Errorf("from task time: %d shards of %d, limit %v, memory %d; want 6 of 1667, 57m, %d", sp.Shards, sp.PointsPerShard, sp.Time, sp.Memory, MinMemory)
	}
	if sp5, _ := NewShardPlan(10000, one, ShardRequest{Shards: 5}); sp5.Time <= DefaultTaskTime {
		t.Errorf("5 shards fit in %v (limit %v): 6 is not the fewest", DefaultTaskTime, sp5.Time)
	}
	// Beyond MaxShards the tasks get longer instead: 10⁶ points of 10 s
	// need 5650 tasks of an hour; 1000 tasks of 1000 points take
	// 2 × 10⁴ s + 60 s → 5 h 35 min.
	sp, err = NewShardPlan(1_000_000, &Cost{Mean: 10, Max: 10}, ShardRequest{})
	if err != nil || sp.Shards != MaxShards || sp.PointsPerShard != 1000 || sp.Time != 335*time.Minute {
		t.Errorf("capped: %+v %v; want %d shards of 1000, limit 5h35m", sp, err, MaxShards)
	}
	// Overrides.
	sp, err = NewShardPlan(10000, one, ShardRequest{Shards: 2, Time: 90 * time.Minute, Memory: 3 << 30})
	if err != nil || sp.Time != 90*time.Minute || !sp.TimeGiven || sp.Memory != 3<<30 || !sp.MemoryGiven {
		t.Errorf("overrides: %+v %v", sp, err)
	}
	// The standard error raises the time per point by two of it.
	sp, _ = NewShardPlan(100, &Cost{Mean: 1, SE: 0.5, Max: 2}, ShardRequest{Shards: 1})
	if sp.Expected != 200*time.Second {
		t.Errorf("with SE: expected %v, want 200s (100 × (1 + 2 × 0.5) s)", sp.Expected)
	}

	for _, bad := range []struct {
		jobs int
		c    *Cost
		req  ShardRequest
		want string
	}{
		{10, one, ShardRequest{Shards: 11}, "shards = 11"},
		{10, one, ShardRequest{CPUs: -1}, "cpus = -1"},
		{10, one, ShardRequest{Safety: 0.5}, "safety = 0.5"},
		{10, &Cost{}, ShardRequest{}, "cost per point"},
		{10, &Cost{Mean: 3600, Max: 3600}, ShardRequest{}, "too short for one point"},
		{0, one, ShardRequest{}, "no points"},
	} {
		if _, err := NewShardPlan(bad.jobs, bad.c, bad.req); err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("%+v: error %v, want %q", bad, err, bad.want)
		}
	}
}

// TestMeasure times points of a small Coulomb scan: the sampled indices,
// positive times, the longest record line, and the time budget (one
// point when it is already spent).
func TestMeasure(t *testing.T) {
	p, err := NewPlan(mustScenario(t, twoParam), nil, "test")
	if err != nil {
		t.Fatal(err)
	}
	c, err := Measure(context.Background(), p, 4, time.Minute)
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(c.Indices, SampleIndices(p.Jobs(), 4)) || len(c.Seconds) != 4 || !(c.Mean > 0) || c.Max < c.Mean || c.PeakBytes == 0 || c.Given {
		t.Fatalf("cost %+v", c)
	}
	longest := 0
	for _, i := range c.Indices {
		b, _ := json.Marshal(p.Point(i))
		longest = max(longest, len(b)+1)
	}
	if c.RecordBytes != longest {
		t.Errorf("record bytes %d, want %d", c.RecordBytes, longest)
	}
	if c, err := Measure(context.Background(), p, 4, 0); err != nil || len(c.Seconds) != 1 || c.SE != 0 {
		t.Errorf("spent budget: %+v %v; want one point", c, err)
	}
	g := GivenCost(p, 0.25)
	if !g.Given || g.Mean != 0.25 || g.Max != 0.25 || g.RecordBytes == 0 {
		t.Errorf("given cost %+v", g)
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Measure(ctx, p, 4, time.Minute); err == nil {
		t.Error("cancelled: want an error")
	}
}
