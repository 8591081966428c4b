package main

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"ricochet/observables/convention"
	"ricochet/observables/scan"
	"ricochet/observables/scenario"
)

var scanFlags struct {
	common
	epsMin, epsMax float64
	points         int
	format         string
	observable     string
	workers        int
	output         string
	resume         bool
	quiet          bool
	plot           string
	window         string
	thresholds     string
	degree         int
	spread         bool
	shard          string
	expect         string
	plotTrend      string
}

var cmdScan = &Command{
	Name:      "scan",
	UsageLine: "scan [flags] [scenario.toml]",
	Short:     "scan the coupling and tabulate numeric vs first order",
	Long: `Scan integrates the scenario at log-spaced couplings |eps| from eps_min to
eps_max (scaling the source's charges at fixed gamma, phases and spin/b
ratios) and prints a convergence table for one or more observables: the
numeric value with its error estimate, the first-order prediction, the
residual (numeric - first order), residual/eps^2, and for each point the
tolerance and truncation parts of its error bar (see run) and the largest
constraint drift.

Below the table: the scaling exponent n of |residual| ~ A eps^n (1 + d1 eps
+ ...) from a weighted fit over the points above the numerical noise, the
eps -> 0 limit of residual/eps^2 (the next-order coefficient) and the slope
after it from weighted polynomial fits in eps, and the couplings where
|residual|/|first order| crosses the --thresholds. Every polynomial degree
from 0 to points - 3 (at most 40, and never beyond the numerical rank) and
every number of correction terms from 0 to points - 4 is fitted and the
results are averaged with Akaike weights; the uncertainties include the
spread over the models, the widening by sqrt(chi2/dof) when the points
scatter beyond their errors, and the effect of correlated point errors; the
window of couplings is chosen by intersecting confidence intervals
(--window overrides it for the exponent). Each fitted number is printed
with chi2/dof of its fit and a warning when the fit is poor. --degree D
fixes the degree (0 <= D <= points - 3).

Each point also carries the prediction through second order (iterated
straight-line quadrature, covariant impact parameter; see README, Second
order) and the residual after it; below the table the direct next-order
coefficient (second - first)/eps^2 is printed beside the scan-extrapolated
one with their difference in standard deviations, and the scaling exponent
of the residual after second order (3, or higher where a symmetry removes
the third order).

Observables are components of the impulse (dp) or spin kick (da) along the
frame of record: t, l (incoming direction), b (impact parameter), n = l x b;
with --spin tensor, spin kicks are dS_XY = S_out^{XY} - S_in^{XY} with X, Y
among t, l, b, n, compared with the linear part S(dp1, a_in) + S(p_in, da1)
of the first order, with the error bars of p_out and a_out propagated
linearly. Give several observables separated by commas.

Points run in parallel; results do not depend on the number of workers. With
--output FILE every point is appended to FILE and synced as soon as it
finishes; when the scan completes FILE is rewritten in grid order. After an
interruption, the same command with --resume computes only the missing
points and leaves the same FILE as an uninterrupted run; it refuses a FILE
written for another scenario or other scan settings. With --resume and a
complete FILE nothing is recomputed, so tables and figures can be produced
from a finished scan.

--format latex writes booktabs tables (needs \usepackage{booktabs,dcolumn,
amsmath}), one per observable (and model, and slice), each within the
345 pt column of a standard article, continued in further tables beyond 30
points; latex-doc wraps them in a document that pdflatex compiles as is.
--plot FILE draws the residual figure, one journal column wide (3.4 in):
|residual| against eps on log-log axes with error bars (filled markers for
a positive residual, open for a negative one), the fitted power law, slope
guides eps^1, eps^2, eps^3 and the noise floor; below it, for each
observable, residual/eps^2 against eps with the fitted polynomial and its
eps -> 0 limit with the 1-sigma band; the legend above the panels. With
--spread, one residual/eps^2 panel per observable shows every completion.
The format follows the extension: vector pdf, svg or eps, or png at 300
dpi.

--spread (probe kind root-kerr only) scans each completion of the root-Kerr
probe: root-kerr (one Lorentz generator rotates momentum and spin),
root-kerr-conservative (conserves the energy exactly) and bmt (the dipole
truncation, g = 2), each against its own first order. Tables, CSV, JSON,
LaTeX and the figure show them side by side, with each completion's fitted
exponent and next-order coefficient and the spread (max - min) of the
next-order coefficient: the part of it that the first-order coupling does
not determine.`,
	Example: `ricochet scan
ricochet scan --observable dp_b,dp_n --points 9 --format csv
ricochet scan --scenario coulomb-darwin --eps-max 0.3 --units heaviside-lorentz
ricochet scan my.toml --output my.jsonl --format latex > table.tex
ricochet scan my.toml --output my.jsonl --resume --plot residual.pdf
ricochet scan --spread --observable dp_b,dp_n --plot spread.png`,
	Flags: pflag.NewFlagSet("scan", pflag.ContinueOnError),
	Run:   runScan,
}

func init() {
	f := cmdScan.Flags
	scanFlags.register(f)
	floatFlag(f, &scanFlags.epsMin, "eps-min", 0, "1e-20 ≤ eps-min < eps-max ≤ 10 (≤ 1 on curved backgrounds)", "override scan.eps_min (smallest |eps|, 1e-20..10; ≤ 1 on curved backgrounds)")
	floatFlag(f, &scanFlags.epsMax, "eps-max", 0, "eps-min < eps-max ≤ 10 (≤ 1 on curved backgrounds)", "override scan.eps_max (largest |eps|, up to 10; 1 on curved backgrounds)")
	intFlag(f, &scanFlags.points, "points", 0, "2 ≤ points ≤ 10000", "override scan.points (2..10000)")
	f.StringVar(&scanFlags.format, "format", "table", "output format: table, csv (one row per point), csv-fits (one row per series), json, json-schema (the JSON Schema of the json output), latex or latex-doc")
	f.BoolVar(&csvComments, "csv-comments", false, "precede CSV output with '#' lines of conventions and provenance (default: header row first; the metadata are in --format json)")
	f.StringVar(&scanFlags.observable, "observable", "dp_b", "observables, comma-separated: dp_X, da_X (X = t, l, b, n) or dS_XY (with --spin tensor)")
	intFlag(f, &scanFlags.workers, "workers", 0, "workers ≥ 0 (0: number of CPUs)", "parallel workers (0: number of CPUs)")
	f.StringVar(&scanFlags.output, "output", "", "record every point in FILE as it finishes (JSON lines; see --resume)")
	f.BoolVar(&scanFlags.resume, "resume", false, "complete the interrupted scan recorded in --output FILE")
	f.BoolVar(&scanFlags.quiet, "quiet", false, "no progress bar")
	f.StringVar(&scanFlags.plot, "plot", "", "draw the residual figure to FILE (.png, .svg, .pdf or .eps)")
	f.StringVar(&scanFlags.window, "window", "", "exponent fit window LO,HI in printed eps (default: automatic)")
	f.StringVar(&scanFlags.thresholds, "thresholds", "0.01,0.1", "relative residuals |residual/first order| at which to report the breakdown coupling")
	intFlag(f, &scanFlags.degree, "degree", -1, "-1 (automatic) or 0..points-3, at most 40", "fix the polynomial degree of the next-order fit, 0..points-3 (-1: average over all degrees with Akaike weights)")
	f.StringVar(&scanFlags.expect, "expect", "", "formula of the next-order coefficient to compare each slice with, e.g. '-pi/(2*gamma*v)' (names: pi, gamma, v, b, the axis parameters)")
	f.StringVar(&scanFlags.plotTrend, "plot-trend", "", "draw the next-order coefficient against the first parameter axis to FILE (multi-parameter scans)")
	f.StringVar(&scanFlags.shard, "shard", "", "run shard K/N of the scan's points only (with --output; merge the shards with 'ricochet merge')")
	f.BoolVar(&scanFlags.spread, "spread", false, "scan every completion of the root-Kerr probe (root-kerr probes only) and report the spread of the next-order coefficient")
}

const observableHelp = "allowed: dp_X, da_X with X in t, l, b, n; dS_XY with X ≠ Y (needs --spin tensor)"

var frameIndex = map[byte]int{'t': 0, 'l': 1, 'b': 2, 'n': 3}

// parseObservable parses one observable name of --observable.
func parseObservable(name string, conv convention.Set) (scan.Observable, error) {
	o := scan.Observable{Name: name}
	bad := badf("--observable = %q; %s", name, observableHelp)
	switch {
	case strings.HasPrefix(name, "dp_") && len(name) == 4:
		i, ok := frameIndex[name[3]]
		if !ok {
			return o, bad
		}
		o.I = i
	case strings.HasPrefix(name, "da_") && len(name) == 4:
		i, ok := frameIndex[name[3]]
		if !ok {
			return o, bad
		}
		if conv.Spin == convention.Tensor {
			return o, badf("--observable = %q with --spin tensor; allowed: dS_XY (X ≠ Y in t, l, b, n)", name)
		}
		o.Spin, o.I = true, i
	case strings.HasPrefix(name, "dS_") && len(name) == 5:
		i, ok1 := frameIndex[name[3]]
		j, ok2 := frameIndex[name[4]]
		if !ok1 || !ok2 || i == j {
			return o, bad
		}
		if conv.Spin != convention.Tensor {
			return o, badf("--observable = %q without --spin tensor; allowed: dp_X, da_X (X in t, l, b, n), or dS_XY with --spin tensor", name)
		}
		o.Spin, o.Tensor, o.I, o.J = true, true, i, j
	default:
		return o, bad
	}
	return o, nil
}

func parseFloats(flag, s string, n int) ([]float64, error) {
	var out []float64
	for _, f := range strings.Split(s, ",") {
		x, err := strconv.ParseFloat(strings.TrimSpace(f), 64)
		if err != nil || !(x > 0) || math.IsInf(x, 0) {
			return nil, badf("--%s = %q; allowed: comma-separated positive numbers", flag, s)
		}
		out = append(out, x)
	}
	if n > 0 && len(out) != n {
		return nil, badf("--%s = %q; allowed: %d comma-separated positive numbers", flag, s, n)
	}
	return out, nil
}

func runScan(cmd *Command, args []string, w io.Writer) error {
	switch scanFlags.format {
	case "table", "csv", "csv-fits", "json", "latex", "latex-doc":
	case "json-schema":
		return writeSchema(w, "scan")
	default:
		return badf("--format = %q; allowed: table, csv, csv-fits, json, json-schema, latex, latex-doc", scanFlags.format)
	}
	if scanFlags.workers < 0 {
		return badf("--workers = %d; allowed: ≥ 0", scanFlags.workers)
	}
	if scanFlags.resume && scanFlags.output == "" {
		return badf("--resume without --output; allowed: --resume with --output FILE, the record file of the interrupted scan")
	}
	if cmd.Flags.Changed("plot") {
		if err := checkPlotExt("plot", scanFlags.plot); err != nil {
			return err
		}
		if err := checkOutputPath("plot", scanFlags.plot); err != nil {
			return err
		}
	}
	if cmd.Flags.Changed("plot-trend") {
		if err := checkPlotExt("plot-trend", scanFlags.plotTrend); err != nil {
			return err
		}
		if err := checkOutputPath("plot-trend", scanFlags.plotTrend); err != nil {
			return err
		}
	}
	if cmd.Flags.Changed("output") {
		if err := checkOutputPath("output", scanFlags.output); err != nil {
			return err
		}
	}
	scanFlags.extra = func(s *Scenario) {
		f := cmd.Flags
		if f.Changed("eps-min") {
			s.Scan.EpsMin = scanFlags.epsMin
			s.MarkGiven("scan.eps_min")
		}
		if f.Changed("eps-max") {
			s.Scan.EpsMax = scanFlags.epsMax
			s.MarkGiven("scan.eps_max")
		}
		if f.Changed("points") {
			s.Scan.Points = scanFlags.points
			s.MarkGiven("scan.points")
		}
	}
	s, raw, err := scanFlags.load(args)
	if err != nil {
		return err
	}
	opt := scan.Options{Conv: scanFlags.conv}
	for _, name := range strings.Split(scanFlags.observable, ",") {
		o, err := parseObservable(strings.TrimSpace(name), opt.Conv)
		if err != nil {
			return err
		}
		if o.Spin && !s.Spinning() {
			return badf("--observable = %q: probe kind %s has no spin; allowed: dp_X (X in t, l, b, n)", o.Name, s.Probe.Kind)
		}
		opt.Observables = append(opt.Observables, o)
	}
	if scanFlags.window != "" {
		win, err := parseFloats("window", scanFlags.window, 2)
		if err != nil {
			return err
		}
		if win[0] >= win[1] {
			return badf("--window = %q; allowed: LO,HI with 0 < LO < HI", scanFlags.window)
		}
		opt.Fit.Exponent.EpsLo, opt.Fit.Exponent.EpsHi = win[0], win[1]
	}
	if opt.Fit.Thresholds, err = parseFloats("thresholds", scanFlags.thresholds, 0); err != nil {
		return err
	}
	if maxDeg := min(s.Scan.Points-3, 40); scanFlags.degree < -1 || scanFlags.degree > maxDeg {
		return badf("--degree = %d; allowed: -1 (automatic) or 0..%d (points - 3, at most 40)", scanFlags.degree, maxDeg)
	}
	if scanFlags.degree >= 0 {
		opt.Fit.NextOrder.Degree, opt.Fit.NextOrder.FixDegree = scanFlags.degree, true
	}
	if scanFlags.expect != "" {
		if opt.Expect, err = scan.ParseFormula(scanFlags.expect); err != nil {
			return badf("--expect = %q: %v; allowed: a formula in pi, gamma, v, b and the axis parameters", scanFlags.expect, strings.TrimPrefix(err.Error(), fmt.Sprintf("formula %q: ", scanFlags.expect)))
		}
	}
	if scanFlags.plotTrend != "" {
		if len(s.ParamAxes()) == 0 {
			return badf("--plot-trend = %q: the scenario has no parameter axis; allowed: scans with [[scan.axis]] tables", scanFlags.plotTrend)
		}
	}
	if scanFlags.spread {
		if s.Probe.Kind != "root-kerr" && s.Probe.Kind != "root-kerr-body" {
			return badf("--spread: allowed only for probe kinds root-kerr and root-kerr-body (the members of the root-Kerr family); this scenario's probe is %q", s.Probe.Kind)
		}
		opt.Members = scenario.FamilyNames()
	}
	set := &scan.Settings{Workers: scanFlags.workers, Members: opt.Members, Record: scanFlags.output, Resume: scanFlags.resume, Version: version}
	if scanFlags.shard != "" {
		if set.Shard, err = scan.ParseShard(scanFlags.shard); err != nil {
			return badf("--%v", err)
		}
		if scanFlags.output == "" {
			return badf("--shard = %q without --output; allowed: --shard with --output FILE (the shard's record file, for 'ricochet merge')", scanFlags.shard)
		}
		if scanFlags.plot != "" {
			return badf("--plot = %q with --shard: a shard holds part of the scan; allowed: --plot on the merged file ('ricochet scan --output MERGED --resume --plot FILE')", scanFlags.plot)
		}
	}
	recs, err := collect(s, set, scanFlags.quiet)
	if err != nil {
		return err
	}
	if set.Shard.N > 0 {
		fmt.Fprintf(w, "ricochet scan: shard %s of %s: %d points recorded in %s, complete; merge the shards with 'ricochet merge --output FILE SHARD-FILES...'\n", set.Shard, s.Name, len(recs), scanFlags.output)
		return nil
	}
	res := scan.Analyze(s, raw, recs, &opt)
	if scanFlags.plot != "" {
		if err := plotResiduals(res, scanFlags.plot); err != nil {
			return fmt.Errorf("--plot: %v", err)
		}
	}
	if scanFlags.plotTrend != "" {
		if err := plotTrend(res, scanFlags.plotTrend); err != nil {
			return fmt.Errorf("--plot-trend: %v", err)
		}
	}
	return writeScan(w, res, scanFlags.format)
}
