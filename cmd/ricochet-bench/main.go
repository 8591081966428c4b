// Command ricochet-bench measures ricochet's cost on two reference
// scattering problems with exact solutions, in the same output format as
// the C peer of validate/peer, so that one script can compare them.
//
//	P1  relativistic point charge, repulsive Coulomb field, qQ = 1
//	    (Gaussian), v = 0.6, b = 10; exact χ: Darwin (1913)
//	P2  timelike geodesic of Schwarzschild (M = 1) in Kerr–Schild
//	    coordinates, v = 0.5, b = 30; exact χ: radial quadrature
//
// Probe mass 1, G = c = 1. Usage:
//
//	ricochet-bench exact                    exact χ of P1 and P2
//	ricochet-bench measure [flags]          tolerance × radius ladder (TSV)
//	ricochet-bench silent [flags]           loose tolerance, huge radius:
//	                                        χ within its error estimate or a
//	                                        reported outcome, never χ ≈ 0
//	ricochet-bench scan [flags]             coupling scan, 1 vs 2 workers
//	ricochet-bench allocs [flags]           heap allocations per trajectory
//	ricochet-bench select [flags] FILE...   cheapest robust configuration
//	                                        per target, peer vs ricochet
//
// Costs are right-hand-side evaluations (integrate.Outcome.Evals: the
// Runge–Kutta stages plus the first-order tail nodes, with an explicit
// radius so nothing is hidden) and the median wall time per trajectory.
package main

import (
	"fmt"
	"io"
	"math"
	"os"
	"runtime"
	"strconv"
	"strings"

	"github.com/spf13/pflag"
)

func main() {
	os.Exit(mainWith(os.Args[1:], os.Stdout, os.Stderr))
}

const usageText = `usage: ricochet-bench <command> [flags]

commands:
  exact     print the exact deflections of P1 and P2
  measure   cost and error over a tolerance ladder and a radius ladder
  silent    loose tolerances up to R = 1e12 b: no silent χ ≈ 0
  scan      64-point P1-like coupling scan with 1 and 2 workers
  allocs    heap allocations per trajectory for each probe model
  select    from measurement files (this program's and the C peer's), the
            cheapest configuration reaching each target for good (it and
            every tighter tolerance at its radius), and the ratios

Run "ricochet-bench <command> --help" for the flags of a command.
`

// mainWith runs the command line and returns the exit status: 0 on
// success, 1 on a failed check or a run-time error, 2 on bad usage.
func mainWith(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprint(stderr, usageText)
		return 2
	}
	cmd, args := args[0], args[1:]
	fs := pflag.NewFlagSet(cmd, pflag.ContinueOnError)
	fs.SetOutput(stderr)
	problems := fs.String("problems", "P1,P2", "comma-separated problems")
	var run func() error
	switch cmd {
	case "-h", "--help", "help":
		fmt.Fprint(stdout, usageText)
		return 0
	case "exact":
		run = func() error { return cmdExact(stdout, *problems) }
	case "measure":
		tols := fs.String("tols", "1e-6,1e-7,1e-8,1e-9,1e-10,1e-11,1e-12,1e-13,1e-14", "comma-separated tolerances")
		radii := fs.String("radii", "1e4", "comma-separated start/stop radii in units of b")
		repeats := fs.Int("repeats", 5, "timed repeats per configuration (median reported)")
		header := fs.Bool("header", true, "print the header line")
		run = func() error { return cmdMeasure(stdout, *problems, *tols, *radii, *repeats, *header) }
	case "silent":
		tols := fs.String("tols", "1e-6,1e-8", "comma-separated tolerances")
		radii := fs.String("radii", "1e2,1e4,1e6,1e8,1e10,1e12", "comma-separated radii in units of b")
		strict := fs.Bool("strict", false, "exit 1 if any row fails the check")
		run = func() error { return cmdSilent(stdout, *problems, *tols, *radii, *strict) }
	case "scan":
		points := fs.Int("points", 64, "number of scan events")
		repeats := fs.Int("repeats", 3, "repeats of each scan (median wall time)")
		run = func() error { return cmdScan(stdout, *points, *repeats) }
	case "allocs":
		n := fs.Int("n", 20, "trajectories per model")
		run = func() error { return cmdAllocs(stdout, *n) }
	case "select":
		targets := fs.String("targets", "1e-8,1e-10,1e-11,1e-12", "comma-separated target accuracies |Δχ|")
		eventRepeats := fs.Int("event-repeats", 0, "if > 0, also time ricochet's full event (with its error estimate) at each selected configuration, median of this many runs")
		run = func() error {
			if *eventRepeats < 0 {
				return usageError{fmt.Sprintf("--event-repeats = %d, want ≥ 0", *eventRepeats)}
			}
			return cmdSelect(stdout, *targets, *eventRepeats, fs.Args())
		}
	default:
		fmt.Fprintf(stderr, "ricochet-bench: unknown command %q\n%s", cmd, usageText)
		return 2
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		return 2
	}
	if fs.NArg() > 0 && cmd != "select" {
		fmt.Fprintf(stderr, "ricochet-bench %s: unexpected arguments %v\n", cmd, fs.Args())
		return 2
	}
	if err := run(); err != nil {
		fmt.Fprintf(stderr, "ricochet-bench %s: %v\n", cmd, err)
		if _, ok := err.(usageError); ok {
			return 2
		}
		return 1
	}
	return 0
}

// usageError is bad input on the command line.
type usageError struct{ msg string }

func (e usageError) Error() string { return e.msg }

func parseList(name, s string) ([]float64, error) {
	var out []float64
	for _, f := range strings.Split(s, ",") {
		v, err := strconv.ParseFloat(strings.TrimSpace(f), 64)
		if err != nil || !(v > 0) || math.IsInf(v, 0) {
			return nil, usageError{fmt.Sprintf("--%s: bad value %q, want a positive number", name, f)}
		}
		out = append(out, v)
	}
	return out, nil
}

func parseProblems(s string) ([]Problem, error) {
	var out []Problem
	for _, f := range strings.Split(s, ",") {
		p, err := problemByName(strings.TrimSpace(f))
		if err != nil {
			return nil, usageError{"--problems: " + err.Error()}
		}
		out = append(out, p)
	}
	return out, nil
}

func cmdExact(w io.Writer, problems string) error {
	ps, err := parseProblems(problems)
	if err != nil {
		return err
	}
	for _, p := range ps {
		chi, err := p.Exact()
		if err != nil {
			return err
		}
		fmt.Fprintf(w, "%s\t%.16f\n", p.Name, chi)
	}
	return nil
}

// Header is the column line shared with the C peer.
const Header = "code\tproblem\ttol\tR\tevals\tmedian_seconds\tchi\tchi_exact\tabs_err\tstatus"

// FormatRun formats a Run as a line under Header.
func FormatRun(r Run) string {
	return fmt.Sprintf("ricochet\t%s\t%.0e\t%.0e\t%d\t%.4e\t%.15f\t%.15f\t%.3e\t%s",
		r.Problem, r.Tol, r.R, r.Evals, r.Median.Seconds(), r.Chi, r.ChiExact, r.AbsErr(), r.Status)
}

// parseGrid parses the problem, tolerance and radius lists of measure and
// silent.
func parseGrid(problems, tols, radii string) ([]Problem, []float64, []float64, error) {
	ps, err := parseProblems(problems)
	if err != nil {
		return nil, nil, nil, err
	}
	ts, err := parseList("tols", tols)
	if err != nil {
		return nil, nil, nil, err
	}
	rs, err := parseList("radii", radii)
	if err != nil {
		return nil, nil, nil, err
	}
	return ps, ts, rs, nil
}

func cmdMeasure(w io.Writer, problems, tols, radii string, repeats int, header bool) error {
	ps, ts, rs, err := parseGrid(problems, tols, radii)
	if err != nil {
		return err
	}
	if repeats < 1 {
		return usageError{fmt.Sprintf("--repeats = %d, want ≥ 1", repeats)}
	}
	if header {
		fmt.Fprintln(w, Header)
	}
	for _, p := range ps {
		for _, R := range rs {
			for _, tol := range ts {
				r, err := Measure(p, tol, R, repeats)
				if err != nil {
					return err
				}
				fmt.Fprintln(w, FormatRun(r))
			}
		}
	}
	return nil
}

func cmdSilent(w io.Writer, problems, tols, radii string, strict bool) error {
	ps, ts, rs, err := parseGrid(problems, tols, radii)
	if err != nil {
		return err
	}
	fmt.Fprintln(w, "problem\ttol\tR\tevals\tchi\tchi_err_est\tchi_exact\tabs_err\tverdict")
	bad := 0
	for _, p := range ps {
		for _, tol := range ts {
			for _, R := range rs {
				s, err := CheckSilent(p, tol, R)
				if err != nil {
					return err
				}
				if !s.OK {
					bad++
				}
				fmt.Fprintf(w, "%s\t%.0e\t%.0e\t%d\t%.15f\t%.2e\t%.15f\t%.2e\t%s\n",
					s.Problem, s.Tol, s.R, s.Evals, s.Chi, s.ChiErr, s.ChiExact,
					math.Abs(s.Chi-s.ChiExact), s.Verdict)
			}
		}
	}
	if bad > 0 && strict {
		return fmt.Errorf("%d configuration(s) gave a deflection outside its own error estimate or χ ≈ 0", bad)
	}
	return nil
}

func cmdScan(w io.Writer, points, repeats int) error {
	if points < 1 || repeats < 1 {
		return usageError{"--points and --repeats must be ≥ 1"}
	}
	eps := ScanCouplings(points)
	fmt.Fprintf(w, "scan of %d P1-like events (ε = 1e-3 … 0.3, default settings: tol 1e-13, automatic radius, with error estimate); GOMAXPROCS=%d, NumCPU=%d\n",
		points, runtime.GOMAXPROCS(0), runtime.NumCPU())
	fmt.Fprintln(w, "workers\tmedian_seconds\tspeedup\tidentical")
	// The two worker counts are measured alternately, so that a change of
	// the machine's load during the measurement affects both alike.
	counts := []int{1, 2}
	times := make([][]float64, len(counts))
	outs := make([]vecList, len(counts))
	RunScan(eps, 1) // warm-up
	for k := 0; k < repeats; k++ {
		for c, workers := range counts {
			o, el, err := RunScan(eps, workers)
			if err != nil {
				return err
			}
			times[c] = append(times[c], el.Seconds())
			outs[c] = o
		}
	}
	t1 := medianF(times[0])
	for c, workers := range counts {
		med := medianF(times[c])
		ident := "-"
		if c > 0 {
			ident = "yes"
			for i := range outs[c] {
				if outs[c][i] != outs[0][i] {
					ident = "NO"
				}
			}
		}
		fmt.Fprintf(w, "%d\t%.4f\t%.2f\t%s\n", workers, med, t1/med, ident)
	}
	return nil
}

func cmdAllocs(w io.Writer, n int) error {
	if n < 1 {
		return usageError{"--n must be ≥ 1"}
	}
	res, err := Allocs(n)
	if err != nil {
		return err
	}
	fmt.Fprintln(w, "model\tmallocs_per_traj\tbytes_per_traj\tevals\tstatus")
	for _, a := range res {
		fmt.Fprintf(w, "%s\t%.1f\t%.0f\t%d\t%s\n", a.Model, a.Mallocs, a.BytesPerTraj, a.EvalsPerTraj, a.ScatterStatus)
	}
	return nil
}

func medianF(x []float64) float64 {
	s := append([]float64(nil), x...)
	for i := 1; i < len(s); i++ {
		for j := i; j > 0 && s[j] < s[j-1]; j-- {
			s[j], s[j-1] = s[j-1], s[j]
		}
	}
	n := len(s)
	if n%2 == 1 {
		return s[n/2]
	}
	return (s[n/2-1] + s[n/2]) / 2
}
