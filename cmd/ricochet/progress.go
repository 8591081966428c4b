package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"strings"
	"syscall"

	"github.com/schollz/progressbar/v3"

	"ricochet/observables/convention"
	"ricochet/observables/scan"
)

// stderrW receives progress output (the command's standard error).
var stderrW io.Writer = os.Stderr

// defaultConv is the library's own set of conventions.
var defaultConv = convention.Set{}

// interruptAfter, when positive, stops a scan after that many newly
// computed points, as an interruption would (used by tests).
var interruptAfter int

// cmdArgs are the arguments of the running command line (for the resume
// hint).
var cmdArgs []string

// interruptible returns a context cancelled by the first SIGINT or
// SIGTERM: the scan then dispatches no new points, finishes those in
// flight and records them. A second signal exits at once; the record file
// is consistent then too (every record is one synced line; a line cut
// short is dropped on resume).
func interruptible(parent context.Context) (context.Context, func()) {
	ctx, cancel := context.WithCancel(parent)
	sig := make(chan os.Signal, 2)
	done := make(chan struct{})
	signal.Notify(sig, os.Interrupt, syscall.SIGTERM)
	go func() {
		for n := 1; ; n++ {
			select {
			case s := <-sig:
				if n == 1 {
					fmt.Fprintf(stderrW, "\nricochet: %v: finishing the points in flight (again to stop at once)\n", s)
					cancel()
					continue
				}
				fmt.Fprintf(stderrW, "ricochet: %v: stopped; %s\n", s, resumeHint())
				os.Exit(1)
			case <-done:
				return
			}
		}
	}()
	return ctx, func() { signal.Stop(sig); close(done); cancel() }
}

// resumeHint tells how to continue an interrupted scan.
func resumeHint() string {
	if len(cmdArgs) == 0 || cmdArgs[0] != "scan" {
		return "nothing was recorded" // verify's short scan is not resumable
	}
	if scanFlags.output == "" {
		return "nothing was recorded (give --output FILE to make a scan resumable)"
	}
	args := append([]string{"ricochet"}, cmdArgs...)
	if !scanFlags.resume {
		args = append(args, "--resume")
	}
	for k, a := range args {
		if a == "" || strings.ContainsAny(a, " \t\n'\"\\$`*?[]{}()<>|&;#~!") {
			args[k] = "'" + strings.ReplaceAll(a, "'", `'\''`) + "'"
		}
	}
	return "the points finished are in " + scanFlags.output + "; resume with: " + strings.Join(args, " ")
}

// collect runs the scan with a progress bar on a terminal, stops it
// cleanly on SIGINT or SIGTERM, and maps record file errors to the
// command's flags.
func collect(s *Scenario, set *scan.Settings, quiet bool) ([]scan.Record, error) {
	ctx, stop := interruptible(context.Background())
	defer stop()
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	bar := newBar(set.Shard.Count(scan.Jobs(s, set.Members)), quiet)
	first, fresh, recorded := -1, 0, 0
	set.Progress = func(done, total int) {
		bar.set(done)
		recorded = done
		if first < 0 {
			first = done
			if set.Resume {
				return // the points read from the record file
			}
		}
		fresh++
		if interruptAfter > 0 && fresh >= interruptAfter {
			cancel()
		}
	}
	set.Warn = func(msg string) { fmt.Fprintf(stderrW, "ricochet scan: warning: %s\n", msg) }
	recs, err := scan.Run(ctx, s, set)
	bar.finish()
	var fe *scan.FileError
	switch {
	case errors.As(err, &fe) && fe.Exists:
		return nil, badf("--output = %q exists; allowed: a new file, or the same with --resume to complete it", fe.Path)
	case errors.As(err, &fe) && fe.Resume:
		return nil, badf("--resume: %s", fe.Msg)
	case errors.As(err, &fe):
		return nil, badf("--output: %s", fe.Msg)
	case errors.Is(err, context.Canceled):
		return nil, fmt.Errorf("scan interrupted after %d of %d points; %s", recorded, set.Shard.Count(scan.Jobs(s, set.Members)), resumeHint())
	}
	return recs, err
}

// progressBar is a progress bar on a terminal, or nothing.
type progressBar struct{ b *progressbar.ProgressBar }

func (p progressBar) set(n int) {
	if p.b != nil {
		p.b.Set(n)
	}
}

func (p progressBar) finish() {
	if p.b != nil {
		p.b.Finish()
		p.b.Exit()
	}
}

// newBar returns a progress bar on the command's standard error when
// that is a terminal and quiet is false.
func newBar(n int, quiet bool) progressBar {
	f, ok := stderrW.(*os.File)
	if quiet || !ok {
		return progressBar{}
	}
	st, err := f.Stat()
	if err != nil || st.Mode()&os.ModeCharDevice == 0 {
		return progressBar{}
	}
	return progressBar{progressbar.NewOptions(n,
		progressbar.OptionSetWriter(f),
		progressbar.OptionSetDescription("scan"),
		progressbar.OptionShowCount(),
		progressbar.OptionShowIts(),
		progressbar.OptionSetItsString("points"),
		progressbar.OptionSetPredictTime(true),
		progressbar.OptionClearOnFinish(),
		progressbar.OptionThrottle(100e6),
	)}
}
