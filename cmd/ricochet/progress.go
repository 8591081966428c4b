package main

import (
	"context"
	"errors"
	"io"
	"os"

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

// collect runs the scan with a progress bar on a terminal and maps record
// file errors to the command's flags.
func collect(s *Scenario, set *scan.Settings, quiet bool) ([]scan.Record, error) {
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	bar := newProgress(scan.Jobs(s, set.Members), quiet)
	defer func() {
		if bar != nil {
			bar.Finish()
			bar.Exit()
		}
	}()
	first, fresh := -1, 0
	set.Progress = func(done, total int) {
		if bar != nil {
			bar.Set(done)
		}
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
	recs, err := scan.Run(ctx, s, set)
	var fe *scan.FileError
	switch {
	case errors.As(err, &fe) && fe.Exists:
		return nil, badf("--output %s exists; add --resume to complete it or remove it", fe.Path)
	case errors.As(err, &fe) && fe.Resume:
		return nil, badf("--resume: %s", fe.Msg)
	case errors.As(err, &fe):
		return nil, badf("--output: %s", fe.Msg)
	case errors.Is(err, context.Canceled):
		return nil, errors.New("scan interrupted")
	}
	return recs, err
}

// newProgress returns a progress bar on the command's standard error when
// that is a terminal and quiet is false, else nil.
func newProgress(n int, quiet bool) *progressbar.ProgressBar {
	f, ok := stderrW.(*os.File)
	if quiet || !ok {
		return nil
	}
	st, err := f.Stat()
	if err != nil || st.Mode()&os.ModeCharDevice == 0 {
		return nil
	}
	return progressbar.NewOptions(n,
		progressbar.OptionSetWriter(f),
		progressbar.OptionSetDescription("scan"),
		progressbar.OptionShowCount(),
		progressbar.OptionShowIts(),
		progressbar.OptionSetItsString("points"),
		progressbar.OptionSetPredictTime(true),
		progressbar.OptionClearOnFinish(),
		progressbar.OptionThrottle(100e6),
	)
}
