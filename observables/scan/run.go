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
	// run at every point (Plan). Nil scans the scenario's own model.
	Members []string
	// Shard restricts the scan to a deterministic subset of its points;
	// the zero value runs them all. The records of the shards of a scan
	// merge (Merge) into the file one run of the whole scan writes.
	Shard Shard
	// Progress, if non-nil, is called serially after each point finishes
	// with the number of points done (including those read from a record
	// file) and the number of points to do.
	Progress func(done, total int)
	// Warn, if non-nil, receives one-line warnings, such as records of a
	// resumed file that did not check out and are recomputed.
	Warn func(string)
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

// Jobs returns the number of points of a scan of a validated scenario
// (every combination of its axes, times the models).
func Jobs(s *scenario.Scenario, members []string) int {
	n := s.Scan.Points * max(1, len(members))
	for _, a := range s.ParamAxes() {
		n *= len(a.Grid())
	}
	return n
}

// Run computes every point of the scan of s (or of set.Shard) and returns
// the records in job order (Plan): for a shard, only its own points. With
// set.Record the points are recorded and a recorded scan is resumed (see
// Settings). Cancelling ctx stops the dispatch of new points; points in
// flight finish and are recorded, and Run returns ctx.Err() with the
// record file consistent and resumable.
func Run(ctx context.Context, s *scenario.Scenario, set *Settings) ([]Record, error) {
	if set == nil {
		set = &Settings{}
	}
	p, err := NewPlan(s, set.Members, set.Version)
	if err != nil {
		return nil, err
	}
	if set.Record != "" {
		return runRecorded(ctx, p, set)
	}
	return runJobs(ctx, p, nil, set, nil)
}

// runJobs integrates the points of the shard not in done with a pool of
// workers. Each point is independent and written to its own slot, so the
// results are identical for any number of workers. sink, if non-nil, is
// called (serially) as each point finishes; an error from it stops the
// scan.
func runJobs(ctx context.Context, p *Plan, done map[int]Record, set *Settings, sink func(Record) error) ([]Record, error) {
	workers := set.Workers
	if workers <= 0 {
		workers = runtime.NumCPU()
	}
	var ids []int
	for i := range p.Jobs() {
		if set.Shard.Has(i) {
			ids = append(ids, i)
		}
	}
	recs := make([]Record, len(ids))
	ndone := 0
	for _, i := range ids {
		if _, ok := done[i]; ok {
			ndone++
		}
	}
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	slots := make(chan int)
	var (
		wg      sync.WaitGroup
		mu      sync.Mutex
		sinkErr error
	)
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for k := range slots {
				r := p.Point(ids[k])
				recs[k] = r
				mu.Lock()
				if sinkErr == nil && sink != nil {
					if sinkErr = sink(r); sinkErr != nil {
						cancel()
					}
				}
				if sinkErr == nil {
					ndone++
					if set.Progress != nil {
						set.Progress(ndone, len(ids))
					}
				}
				mu.Unlock()
			}
		}()
	}
dispatch:
	for k, i := range ids {
		if r, ok := done[i]; ok {
			recs[k] = r
			continue
		}
		if ctx.Err() != nil {
			break
		}
		select {
		case slots <- k:
		case <-ctx.Done():
			break dispatch
		}
	}
	close(slots)
	wg.Wait()
	if sinkErr != nil {
		return recs, sinkErr
	}
	return recs, ctx.Err()
}
