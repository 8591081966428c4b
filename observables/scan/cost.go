package scan

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"time"
)

// Cost is the measured cost of the points of a scan on one worker: the
// input of ShardPlan's cost model.
type Cost struct {
	// Indices are the job indices timed and Seconds the wall time of
	// each, integrated one after the other on one worker.
	Indices []int
	Seconds []float64
	// Mean and Max summarise Seconds; SE is the standard error of Mean
	// (0 for a single point or a given cost).
	Mean, Max, SE float64
	// RecordBytes is the longest record line seen (JSON, with its newline).
	RecordBytes int
	// PeakBytes is the peak memory of the measuring process (its resident
	// set where the system tells it, else what the Go runtime obtained
	// from the system).
	PeakBytes uint64
	// Given is set when the cost was given (GivenCost), not measured.
	Given bool
}

// SampleIndices returns up to n distinct job indices of a scan of jobs
// points, in increasing order, spread over the whole scan by the golden
// ratio sequence i_k = ⌊frac(1/2 + k/φ) × jobs⌋ (Weyl 1916; the
// additive recurrence of low-discrepancy sampling, from memory). Because
// every digit of the job index (coupling, parameter axes, model) is
// sampled, the timed points cover weak and strong couplings alike.
func SampleIndices(jobs, n int) []int {
	n = min(n, jobs)
	if n <= 0 {
		return nil
	}
	if n == jobs {
		out := make([]int, jobs)
		for i := range out {
			out[i] = i
		}
		return out
	}
	invPhi := (math.Sqrt(5) - 1) / 2
	seen := map[int]bool{}
	var out []int
	for k := 0; len(out) < n; k++ {
		_, f := math.Modf(0.5 + float64(k)*invPhi)
		i := min(int(f*float64(jobs)), jobs-1)
		if !seen[i] {
			seen[i] = true
			out = append(out, i)
		}
	}
	slices.Sort(out)
	return out
}

// Measure times points of the plan one after the other on one worker
// (SampleIndices of n points) until n are done or budget has passed,
// whichever comes first; at least one point is timed. A cancelled ctx
// stops it with ctx.Err() after the point in flight.
func Measure(ctx context.Context, p *Plan, n int, budget time.Duration) (*Cost, error) {
	ids := SampleIndices(p.Jobs(), max(n, 1))
	c := &Cost{}
	start := time.Now()
	for _, i := range ids {
		if len(c.Indices) > 0 && (time.Since(start) > budget || ctx.Err() != nil) {
			break
		}
		t0 := time.Now()
		r := p.Point(i)
		dt := time.Since(t0).Seconds()
		c.Indices = append(c.Indices, i)
		c.Seconds = append(c.Seconds, dt)
		if b, err := json.Marshal(r); err == nil {
			c.RecordBytes = max(c.RecordBytes, len(b)+1)
		}
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	c.summarise()
	c.PeakBytes = peakMemory()
	return c, nil
}

// GivenCost is a cost of seconds per point stated by the user instead of
// measured, with the record size and memory of the plan's first point
// measured (one integration).
func GivenCost(p *Plan, seconds float64) *Cost {
	r := p.Point(0)
	b, _ := json.Marshal(r)
	return &Cost{Mean: seconds, Max: seconds, RecordBytes: len(b) + 1, PeakBytes: peakMemory(), Given: true}
}

func (c *Cost) summarise() {
	n := float64(len(c.Seconds))
	var sum float64
	for _, s := range c.Seconds {
		sum += s
		c.Max = max(c.Max, s)
	}
	c.Mean = sum / n
	if len(c.Seconds) > 1 {
		var ss float64
		for _, s := range c.Seconds {
			ss += (s - c.Mean) * (s - c.Mean)
		}
		c.SE = math.Sqrt(ss / (n - 1) / n)
	}
}

// peakMemory returns the peak resident set of this process (VmHWM of
// /proc/self/status on Linux), or the memory the Go runtime obtained from
// the system where that cannot be read.
func peakMemory() uint64 {
	if b, err := os.ReadFile("/proc/self/status"); err == nil {
		for _, l := range strings.Split(string(b), "\n") {
			if f := strings.Fields(l); len(f) == 3 && f[0] == "VmHWM:" && f[2] == "kB" {
				if kb, err := strconv.ParseUint(f[1], 10, 64); err == nil {
					return kb << 10
				}
			}
		}
	}
	var m runtime.MemStats
	runtime.ReadMemStats(&m)
	return m.Sys
}

// Cost-model constants of ShardPlan (common practice for batch jobs; the
// safety factor and start-up allowance cover a slower or busier compute
// node and a slow shared file system).
const (
	// DefaultSafety multiplies the expected wall time and memory.
	DefaultSafety = 2.0
	// StartupAllowance is added to every time limit: process start,
	// scenario validation, reading and rewriting the record file.
	StartupAllowance = time.Minute
	// MinMemory is the smallest memory request.
	MinMemory = 256 << 20
	// recordCopies is how many copies of each record a process holds at
	// its peak: the decoded record, its JSON line, and the buffer of the
	// final rewrite of the record file.
	recordCopies = 3
	// mergeSecondsPerPoint is the time allowed to read, check and write
	// one record when merging (measured: 0.25 ms of wall time per point
	// for 2000 points on a shared 2-core machine; allowed 1 ms).
	mergeSecondsPerPoint = 1e-3
	// DefaultTaskTime is the wall time aimed at per array task when the
	// number of shards is not given.
	DefaultTaskTime = time.Hour
	// MaxShards bounds the array size: Slurm's default MaxArraySize is
	// 1001, allowing task ids up to 1000 (slurm.conf manual, from memory).
	MaxShards = 1000
)

// ShardRequest asks ShardPlan for the resources of a sharded scan. The
// zero value asks for one CPU per shard and as many shards as needed for
// DefaultTaskTime each.
type ShardRequest struct {
	// Shards fixes the number of shards (array tasks); 0 chooses the
	// fewest shards whose time limit fits in TaskTime.
	Shards int
	// TaskTime is the longest time limit wanted per task when Shards is
	// 0 (0: DefaultTaskTime).
	TaskTime time.Duration
	// CPUs is the number of CPUs (workers) per task (0: 1).
	CPUs int
	// Safety multiplies the expected time and memory (0: DefaultSafety;
	// else ≥ 1).
	Safety float64
	// Time and Memory override the computed limits (0: computed).
	Time   time.Duration
	Memory uint64
}

// ShardPlan is the resource plan of a scan run as an array of shards.
//
// Cost model: a shard of n points on c workers is expected to take
//
//	T = n × t̄ / c + (1 − 1/c) × t_max,   t̄ = mean + 2 SE,
//
// the list-scheduling bound of Graham (1969, Bounds on multiprocessing
// timing anomalies, SIAM J. Appl. Math. 17, 416; from memory) with the
// per-point mean raised by two standard errors of its sample; the time
// limit is Safety × T + StartupAllowance, rounded up to whole minutes. The
// memory is Safety × (peak of the measuring process + 3 n × record
// size), at least MinMemory, rounded up to MiB. The merge job reads every
// record: Safety × jobs × 1 ms + StartupAllowance, memory as a task with
// n = jobs.
type ShardPlan struct {
	Jobs   int
	Shards int
	// PointsPerShard is the size of the largest shard (⌈Jobs/Shards⌉).
	PointsPerShard int
	CPUs           int
	Safety         float64
	Cost           Cost
	// Expected is T of the largest shard; Time its time limit and Memory
	// its memory request (given or computed; TimeGiven, MemoryGiven).
	Expected    time.Duration
	Time        time.Duration
	Memory      uint64
	TimeGiven   bool
	MemoryGiven bool
	MergeTime   time.Duration
	MergeMemory uint64
	// CPUHours is the expected total cost, Jobs × t̄ (CPU hours).
	CPUHours float64
}

// NewShardPlan computes the resource plan of a scan of jobs points with
// the measured cost c. Errors: a request out of range (an InputError-like
// message naming the field), or a TaskTime too short for one point.
func NewShardPlan(jobs int, c *Cost, req ShardRequest) (*ShardPlan, error) {
	sp := &ShardPlan{Jobs: jobs, CPUs: max(req.CPUs, 1), Safety: req.Safety, Cost: *c}
	if sp.Safety == 0 {
		sp.Safety = DefaultSafety
	}
	switch {
	case jobs < 1:
		return nil, fmt.Errorf("the scan has no points")
	case req.CPUs < 0 || req.CPUs > 1024:
		return nil, fmt.Errorf("cpus = %d; allowed: 1 ≤ cpus ≤ 1024", req.CPUs)
	case math.IsNaN(sp.Safety) || sp.Safety < 1 || sp.Safety > 100:
		return nil, fmt.Errorf("safety = %g; allowed: 1 ≤ safety ≤ 100", sp.Safety)
	case req.Shards < 0 || req.Shards > min(jobs, MaxShards):
		return nil, fmt.Errorf("shards = %d; allowed: 1 ≤ shards ≤ %d (the points of the scan, at most %d)", req.Shards, min(jobs, MaxShards), MaxShards)
	case req.TaskTime < 0 || req.Time < 0:
		return nil, fmt.Errorf("time limits must be positive")
	case !(c.Mean > 0) || math.IsInf(c.Mean, 0):
		return nil, fmt.Errorf("cost per point = %g s; allowed: > 0", c.Mean)
	}
	sp.Shards = req.Shards
	if sp.Shards == 0 {
		task := req.TaskTime
		if task == 0 {
			task = DefaultTaskTime
		}
		n := sp.pointsWithin(task)
		if n < 1 {
			return nil, fmt.Errorf("task time %v is too short for one point (expected %v per point, limit %v with safety %g and start-up allowance %v)",
				task, seconds(sp.perPoint()), sp.limit(1), sp.Safety, StartupAllowance)
		}
		sp.Shards = min(ceilDiv(jobs, n), jobs, MaxShards)
	}
	sp.PointsPerShard = ceilDiv(jobs, sp.Shards)
	sp.Expected = seconds(sp.expected(sp.PointsPerShard))
	sp.Time, sp.TimeGiven = sp.limit(sp.PointsPerShard), req.Time > 0
	if sp.TimeGiven {
		sp.Time = req.Time
	}
	sp.Memory, sp.MemoryGiven = sp.memory(sp.PointsPerShard), req.Memory > 0
	if sp.MemoryGiven {
		sp.Memory = req.Memory
	}
	sp.MergeTime = ceilMinute(seconds(sp.Safety*float64(jobs)*mergeSecondsPerPoint) + StartupAllowance)
	sp.MergeMemory = sp.memory(jobs)
	sp.CPUHours = float64(jobs) * sp.perPoint() / 3600
	return sp, nil
}

// perPoint is t̄ = mean + 2 SE.
func (sp *ShardPlan) perPoint() float64 { return sp.Cost.Mean + 2*sp.Cost.SE }

// expected is T of a shard of n points, in seconds.
func (sp *ShardPlan) expected(n int) float64 {
	c := float64(sp.CPUs)
	return float64(n)*sp.perPoint()/c + (1-1/c)*sp.Cost.Max
}

// limit is the time limit of a shard of n points.
func (sp *ShardPlan) limit(n int) time.Duration {
	return ceilMinute(seconds(sp.Safety*sp.expected(n)) + StartupAllowance)
}

// pointsWithin is the largest shard whose limit fits in task (0 if none).
func (sp *ShardPlan) pointsWithin(task time.Duration) int {
	if sp.limit(1) > task {
		return 0
	}
	lo, hi := 1, sp.Jobs
	for lo < hi {
		mid := (lo + hi + 1) / 2
		if sp.limit(mid) <= task {
			lo = mid
		} else {
			hi = mid - 1
		}
	}
	return lo
}

// memory is the memory request of a process holding n records.
func (sp *ShardPlan) memory(n int) uint64 {
	b := sp.Safety * (float64(sp.Cost.PeakBytes) + float64(recordCopies*n*sp.Cost.RecordBytes))
	const mib = 1 << 20
	return max(MinMemory, uint64(math.Ceil(b/mib))*mib)
}

func seconds(s float64) time.Duration { return time.Duration(math.Ceil(s * 1e9)) }

func ceilMinute(d time.Duration) time.Duration {
	return (d + time.Minute - 1) / time.Minute * time.Minute
}

func ceilDiv(a, b int) int { return (a + b - 1) / b }
