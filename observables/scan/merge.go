package scan

import (
	"context"
	"fmt"
	"slices"
	"strings"
)

// MergeSettings configures Merge.
type MergeSettings struct {
	// Output is the merged record file to write (required).
	Output string
	// Rerun computes the points that no input holds (missing, or dropped
	// because they did not check out) instead of reporting them; it
	// needs the program version the inputs were recorded with.
	Rerun bool
	// Workers, Progress and Warn are as in Settings (for Rerun).
	Workers  int
	Progress func(done, total int)
	Warn     func(string)
	// Version is the running program's version.
	Version string
}

// MergeReport is what Merge found in its inputs.
type MergeReport struct {
	Plan *Plan
	// Shards is the number of shards the inputs declare (0 for whole-scan
	// files), and ShardFiles the input file of each shard (index K − 1;
	// "" where none was given).
	Shards     int
	ShardFiles []string
	// Valid is the number of distinct valid points found.
	Valid int
	// Missing lists the points no input holds (before Rerun), in order.
	Missing []int
	// Duplicated lists points found more than once with identical
	// values (kept once); Conflicting those found with different values
	// (dropped, so also Missing).
	Duplicated, Conflicting []int
	// Problems lists records that did not check out, per file and line.
	Problems []string
	// Recomputed is the number of points computed by Rerun.
	Recomputed int
	// Written reports whether Output was written (the merge is complete).
	Written bool
}

// Merge combines the record files of the shards of one scan (or any set
// of record files of the same scan) into the record file a single run of
// the whole scan writes: the same header (without a shard), every record
// in job order, the trailer. Records are checked as on resume (Plan.Check)
// against the plan rebuilt from the first file's header, whose hash must
// match its own scenario and that of every other input (else a FileError).
// When points are missing Merge writes nothing and reports them, unless
// set.Rerun computes them.
func Merge(ctx context.Context, paths []string, set *MergeSettings) (*MergeReport, error) {
	if len(paths) == 0 {
		return nil, &FileError{Msg: "no record files to merge"}
	}
	files := make([]*recordFile, len(paths))
	for k, path := range paths {
		rf, err := readFile(path)
		if err != nil {
			return nil, err
		}
		files[k] = rf
	}
	h0 := files[0].hdr
	p, err := NewPlan(h0.Scenario, h0.Models, h0.Version)
	if err != nil {
		return nil, &FileError{Path: paths[0], Msg: fmt.Sprintf("%s: the recorded scenario does not validate: %v", paths[0], err)}
	}
	if p.Hash != h0.Hash {
		return nil, &FileError{Path: paths[0], Msg: fmt.Sprintf("%s: header hash %s does not match its scenario (%s): the header was edited", paths[0], h0.Hash, p.Hash)}
	}
	rep := &MergeReport{Plan: p}
	for k, rf := range files {
		if rf.hdr.Hash != h0.Hash {
			return nil, &FileError{Path: paths[k], Msg: fmt.Sprintf("%s belongs to another scan (hash %s) than %s (hash %s): other scenario or settings", paths[k], rf.hdr.Hash, paths[0], h0.Hash)}
		}
		if rf.hdr.Shard == "" {
			continue
		}
		sh, err := ParseShard(rf.hdr.Shard)
		if err != nil {
			return nil, &FileError{Path: paths[k], Msg: fmt.Sprintf("%s: header %v", paths[k], err)}
		}
		if rep.Shards == 0 {
			rep.Shards, rep.ShardFiles = sh.N, make([]string, sh.N)
		}
		if sh.N != rep.Shards {
			return nil, &FileError{Path: paths[k], Msg: fmt.Sprintf("%s is shard %s, but %s has %d shards", paths[k], sh, paths[0], rep.Shards)}
		}
		if prev := rep.ShardFiles[sh.K-1]; prev != "" {
			return nil, &FileError{Path: paths[k], Msg: fmt.Sprintf("%s and %s both hold shard %s", prev, paths[k], sh)}
		}
		rep.ShardFiles[sh.K-1] = paths[k]
	}
	done := map[int]Record{}
	conflicted := map[int]bool{}
	for k, rf := range files {
		sh := Shard{}
		if rf.hdr.Shard != "" {
			sh, _ = ParseShard(rf.hdr.Shard)
		}
		c := p.checkFile(rf, sh)
		for _, pr := range c.problems {
			rep.Problems = append(rep.Problems, paths[k]+" "+pr)
		}
		rep.Duplicated = append(rep.Duplicated, c.dup...)
		for _, i := range c.conflict {
			conflicted[i] = true
		}
		for i, r := range c.done {
			if conflicted[i] {
				continue
			}
			if old, ok := done[i]; ok {
				if same(old, r) {
					rep.Duplicated = append(rep.Duplicated, i)
				} else {
					delete(done, i)
					conflicted[i] = true
				}
				continue
			}
			done[i] = r
		}
	}
	for i := range conflicted {
		delete(done, i)
		rep.Conflicting = append(rep.Conflicting, i)
	}
	slices.Sort(rep.Duplicated)
	rep.Duplicated = slices.Compact(rep.Duplicated)
	slices.Sort(rep.Conflicting)
	rep.Valid = len(done)
	for i := range p.Jobs() {
		if _, ok := done[i]; !ok {
			rep.Missing = append(rep.Missing, i)
		}
	}
	recs := ordered(done)
	if len(rep.Missing) > 0 {
		if !set.Rerun {
			return rep, nil
		}
		if h0.Version != set.Version {
			return rep, &FileError{Path: paths[0], Msg: fmt.Sprintf("the inputs were recorded by version %s, this is %s: rerun the missing points with that version", h0.Version, set.Version)}
		}
		run := &Settings{Workers: set.Workers, Members: h0.Models, Progress: set.Progress, Version: set.Version}
		recs, err = runJobs(ctx, p, done, run, nil)
		if err != nil {
			return rep, err
		}
		rep.Recomputed = len(rep.Missing)
	}
	if err := writeFile(set.Output, p.header(h0.Version, Shard{}), recs, true); err != nil {
		return rep, err
	}
	rep.Written = true
	return rep, nil
}

// Ranges renders sorted indices compactly: "3, 7-9, 12".
func Ranges(ids []int) string {
	var parts []string
	for k := 0; k < len(ids); {
		j := k
		for j+1 < len(ids) && ids[j+1] == ids[j]+1 {
			j++
		}
		if j == k {
			parts = append(parts, fmt.Sprint(ids[k]))
		} else {
			parts = append(parts, fmt.Sprintf("%d-%d", ids[k], ids[j]))
		}
		k = j + 1
	}
	return strings.Join(parts, ", ")
}
