package scan

import (
	"context"
	"runtime"
	"sync"

	"ricochet/observables/scenario"
)

// Settings configures a scan. The zero value (or nil) scans the
// scenario's own model on all CPUs and records nothing.
type Settings struct {
	// Workers is the number of points integrated in parallel; 0 means
	// runtime.NumCPU(). Results do not depend on it.
	Workers int
	// Members names the completions of a spread scan
	// (scenario.FamilyNames; probe kind root-kerr only): every member is
	// run at every grid point, job k = member × points + grid index. Nil
	// scans the scenario's own model.
	Members []string
	// Progress, if non-nil, is called serially after each point finishes
	// with the number of points done (including those read from a record
	// file) and the total number of points.
	Progress func(done, total int)
	// Record names the record file (JSON lines, see RecordFormat); empty
	// records nothing. Every point is appended and synced as it finishes;
	// when the scan completes the file is rewritten in job order.
	Record string
	// Resume completes the scan recorded in Record, computing only the
	// missing points. Without it an existing non-empty Record is refused.
	Resume bool
	// Version identifies the program computing the points; it is written
	// into the record file and is part of its hash.
	Version string
}

// Jobs returns the number of points of a scan: grid points × members.
func Jobs(s *scenario.Scenario, members []string) int {
	return s.Scan.Points * max(1, len(members))
}

// Run computes every point of the scan of s: its coupling grid (EpsGrid)
// for the scenario's own model or for each member of set.Members. With
// set.Record the points are recorded and a recorded scan is resumed (see
// Settings). Cancelling ctx stops the dispatch of new points; points in
// flight finish and are recorded, and Run returns ctx.Err() (the record
// file is then consistent and can be resumed).
func Run(ctx context.Context, s *scenario.Scenario, set *Settings) ([]Record, error) {
	if set == nil {
		set = &Settings{}
	}
	if set.Record != "" {
		return runRecorded(ctx, s, set)
	}
	return runJobs(ctx, s, nil, set, nil)
}

// runJobs integrates the points not in done with a pool of workers. Each
// point is independent and written to its own slot, so the results are
// identical for any number of workers. sink, if non-nil, is called
// (serially) as each point finishes; an error from it stops the scan.
func runJobs(ctx context.Context, s *scenario.Scenario, done map[int]Record, set *Settings, sink func(Record) error) ([]Record, error) {
	grid := EpsGrid(s)
	workers := set.Workers
	if workers <= 0 {
		workers = runtime.NumCPU()
	}
	members := set.Members
	njobs := Jobs(s, members)
	recs := make([]Record, njobs)
	ndone := 0
	for i := range njobs {
		if _, ok := done[i]; ok {
			ndone++
		}
	}
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	jobs := make(chan int)
	var (
		wg      sync.WaitGroup
		mu      sync.Mutex
		sinkErr error
	)
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				g, member := i%len(grid), -1
				if len(members) > 0 {
					member = i / len(grid)
				}
				r := RunPoint(s.WithEpsilon(grid[g]), i, grid[g], member)
				recs[i] = r
				mu.Lock()
				if sinkErr == nil && sink != nil {
					if sinkErr = sink(r); sinkErr != nil {
						cancel()
					}
				}
				if sinkErr == nil {
					ndone++
					if set.Progress != nil {
						set.Progress(ndone, njobs)
					}
				}
				mu.Unlock()
			}
		}()
	}
dispatch:
	for i := 0; i < njobs; i++ {
		if r, ok := done[i]; ok {
			recs[i] = r
			continue
		}
		if ctx.Err() != nil {
			break
		}
		select {
		case jobs <- i:
		case <-ctx.Done():
			break dispatch
		}
	}
	close(jobs)
	wg.Wait()
	if sinkErr != nil {
		return recs, sinkErr
	}
	return recs, ctx.Err()
}
