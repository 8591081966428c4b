package main

import (
	"context"
	"errors"
	"fmt"
	"io"

	"github.com/spf13/pflag"

	"ricochet/observables/scan"
)

var mergeFlags struct {
	output  string
	rerun   bool
	workers int
	quiet   bool
}

var cmdMerge = &Command{
	Name:      "merge",
	UsageLine: "merge --output FILE [flags] RECORD-FILE...",
	Short:     "combine the record files of a sharded scan into one",
	Long: `Merge combines the record files written by 'ricochet scan --shard K/N' into
the record file that one run of the whole scan writes: the same header,
every point in job order, the same trailer, bit for bit.

Every record is checked as on --resume (index in range and in its shard,
hash, coupling and parameters of its index, status, in-state, finite
results). Merge refuses files of another scenario or other scan settings,
and lists exactly which points are missing (per shard, with the file that
should have held them), duplicated (kept once when identical) or
conflicting (dropped). With points missing it writes nothing and exits
with status 1; rerun the shards that lack points (a shard's command is
idempotent: it resumes its own file) or add --rerun to compute only the
missing points here.

The merged file serves every table and figure: 'ricochet scan SCENARIO
--output FILE --resume' with the scan's own settings recomputes nothing.`,
	Example: `ricochet merge --output scan.jsonl shard-*.jsonl
ricochet merge --output scan.jsonl --rerun shard-*.jsonl
ricochet scan my.toml --output scan.jsonl --resume --format latex > table.tex`,
	Flags: pflag.NewFlagSet("merge", pflag.ContinueOnError),
	Run:   runMerge,
}

func init() {
	f := cmdMerge.Flags
	f.StringVar(&mergeFlags.output, "output", "", "the merged record file to write")
	f.BoolVar(&mergeFlags.rerun, "rerun", false, "compute the points no input holds instead of reporting them")
	intFlag(f, &mergeFlags.workers, "workers", 0, "workers ≥ 0 (0: number of CPUs)", "parallel workers for --rerun (0: number of CPUs)")
	f.BoolVar(&mergeFlags.quiet, "quiet", false, "no progress bar")
}

func runMerge(cmd *Command, args []string, w io.Writer) error {
	if mergeFlags.output == "" {
		return badf("--output is missing; allowed: --output FILE, the merged record file to write")
	}
	if len(args) == 0 {
		return badf("no record files given; usage: ricochet %s", cmd.UsageLine)
	}
	if mergeFlags.workers < 0 {
		return badf("--workers = %d; allowed: ≥ 0", mergeFlags.workers)
	}
	for _, a := range args {
		if a == mergeFlags.output {
			return badf("--output = %q is also an input; allowed: a file other than the inputs", a)
		}
	}
	ctx, stop := interruptible(context.Background())
	defer stop()
	set := &scan.MergeSettings{Output: mergeFlags.output, Rerun: mergeFlags.rerun, Workers: mergeFlags.workers, Version: version}
	var bar progressBar
	set.Progress = func(done, total int) {
		if bar.b == nil {
			bar = newBar(total, mergeFlags.quiet)
		}
		bar.set(done)
	}
	rep, err := scan.Merge(ctx, args, set)
	bar.finish()
	var fe *scan.FileError
	if errors.As(err, &fe) {
		return badf("%s", fe.Msg)
	}
	if rep != nil {
		writeMergeReport(w, rep, len(args))
	}
	if err != nil {
		return err
	}
	if !rep.Written {
		return fmt.Errorf("%d of %d points missing; nothing written (rerun the shards that lack points, or add --rerun)", len(rep.Missing), rep.Plan.Jobs())
	}
	return nil
}

// writeMergeReport prints what merge found.
func writeMergeReport(w io.Writer, rep *scan.MergeReport, files int) {
	jobs := rep.Plan.Jobs()
	fmt.Fprintf(w, "ricochet merge: %d files, scan %s of %d points", files, rep.Plan.Hash, jobs)
	if rep.Shards > 0 {
		fmt.Fprintf(w, " in %d shards", rep.Shards)
	}
	fmt.Fprintf(w, "; %d valid points found\n", rep.Valid)
	for _, p := range rep.Problems {
		fmt.Fprintf(w, "dropped: %s\n", p)
	}
	if len(rep.Duplicated) > 0 {
		fmt.Fprintf(w, "duplicated (identical, kept once): %d points: %s\n", len(rep.Duplicated), scan.Ranges(rep.Duplicated))
	}
	if len(rep.Conflicting) > 0 {
		fmt.Fprintf(w, "conflicting (recorded with different values, dropped): %d points: %s\n", len(rep.Conflicting), scan.Ranges(rep.Conflicting))
	}
	if len(rep.Missing) > 0 {
		fmt.Fprintf(w, "missing: %d points: %s\n", len(rep.Missing), scan.Ranges(rep.Missing))
		for k := range rep.Shards {
			sh := scan.Shard{K: k + 1, N: rep.Shards}
			var ids []int
			for _, i := range rep.Missing {
				if sh.Has(i) {
					ids = append(ids, i)
				}
			}
			if len(ids) == 0 {
				continue
			}
			file := rep.ShardFiles[k]
			if file == "" {
				file = "no file given"
			}
			fmt.Fprintf(w, "  shard %s (%s): %d of %d points missing: %s\n", sh, file, len(ids), sh.Count(jobs), scan.Ranges(ids))
		}
	}
	if rep.Recomputed > 0 {
		fmt.Fprintf(w, "recomputed here: %d points\n", rep.Recomputed)
	}
	if rep.Written {
		fmt.Fprintf(w, "wrote %s: %d points, complete\n", mergeFlags.output, jobs)
	}
}
