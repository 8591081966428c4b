package scan_test

import (
	"fmt"
	"time"

	"ricochet/observables/scan"
)

// The resources of a scan of 160,000 points at 200 ms each (a cost given
// here; scan.Measure times points of a plan instead), run on 4 CPUs per
// array task, in tasks of at most an hour each.
func ExampleNewShardPlan() {
	cost := &scan.Cost{Mean: 0.2, Max: 0.6, RecordBytes: 2000, PeakBytes: 30 << 20}
	sp, err := scan.NewShardPlan(160000, cost, scan.ShardRequest{CPUs: 4, TaskTime: time.Hour})
	if err != nil {
		panic(err)
	}
	fmt.Printf("%d shards of %d points: expected %v each, limit %v, memory %d MiB\n",
		sp.Shards, sp.PointsPerShard, sp.Expected.Round(time.Second), sp.Time, sp.Memory>>20)
	fmt.Printf("merge job: limit %v, memory %d MiB; whole scan %.2f CPU hours\n", sp.MergeTime, sp.MergeMemory>>20, sp.CPUHours)
	// Output:
	// 5 shards of 32000 points: expected 26m40s each, limit 55m0s, memory 427 MiB
	// merge job: limit 7m0s, memory 1892 MiB; whole scan 8.89 CPU hours
}
