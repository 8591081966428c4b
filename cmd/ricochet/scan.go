package main

import (
	"fmt"
	"io"
	"math"
	"os"
	"runtime"
	"strconv"
	"strings"
	"sync"

	"github.com/spf13/pflag"

	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
	"ricochet/observables/convention"
	"ricochet/observables/fit"
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
two parts of the error estimate (change under a tighter tolerance and under
a larger start/stop radius) and the largest constraint drift.

Below the table: the scaling exponent n of |residual| ~ A eps^n from a
weighted fit over the window where the residual stands above the numerical
noise and the local slope is stable (window printed; --window overrides
it), the eps -> 0 limit of residual/eps^2 (the next-order coefficient) and
the slope after it from a weighted polynomial fit in eps with the degree
chosen by the corrected Akaike criterion (--degree fixes it), and the
couplings where |residual|/|first order| crosses the --thresholds.

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

--format latex writes a booktabs table (needs \usepackage{booktabs,dcolumn,
amsmath}); latex-doc wraps it in a document that pdflatex compiles as is.
--plot FILE draws |residual| against eps on log-log axes with error bars,
the fitted power law, a slope-2 guide and the noise floor; the format (png,
svg, pdf, eps) follows the extension.

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
	f.Float64Var(&scanFlags.epsMin, "eps-min", 0, "override scan.eps_min (smallest |eps|, > 0)")
	f.Float64Var(&scanFlags.epsMax, "eps-max", 0, "override scan.eps_max (largest |eps|)")
	f.IntVar(&scanFlags.points, "points", 0, "override scan.points (2..10000)")
	f.StringVar(&scanFlags.format, "format", "table", "output format: table, csv, json, latex or latex-doc")
	f.StringVar(&scanFlags.observable, "observable", "dp_b", "observables, comma-separated: dp_X, da_X (X = t, l, b, n) or dS_XY (with --spin tensor)")
	f.IntVar(&scanFlags.workers, "workers", 0, "parallel workers (0: number of CPUs)")
	f.StringVar(&scanFlags.output, "output", "", "record every point in FILE as it finishes (JSON lines; see --resume)")
	f.BoolVar(&scanFlags.resume, "resume", false, "complete the interrupted scan recorded in --output FILE")
	f.BoolVar(&scanFlags.quiet, "quiet", false, "no progress bar")
	f.StringVar(&scanFlags.plot, "plot", "", "draw the residual figure to FILE (.png, .svg, .pdf or .eps)")
	f.StringVar(&scanFlags.window, "window", "", "exponent fit window LO,HI in printed eps (default: automatic)")
	f.StringVar(&scanFlags.thresholds, "thresholds", "0.01,0.1", "relative residuals |residual/first order| at which to report the breakdown coupling")
	f.IntVar(&scanFlags.degree, "degree", -1, "fix the polynomial degree of the next-order fit (-1: corrected AIC)")
	f.BoolVar(&scanFlags.spread, "spread", false, "scan every completion of the root-Kerr probe (root-kerr probes only) and report the spread of the next-order coefficient")
}

// observable is one column of a scan: a frame component of the impulse or
// spin kick, or a component of the spin-tensor kick.
type observable struct {
	Name   string
	spin   bool
	tensor bool
	i, j   int // frame indices: 0 = t, 1 = l, 2 = b, 3 = n
}

const observableHelp = "allowed: dp_X, da_X with X in t, l, b, n; dS_XY with X ≠ Y (needs --spin tensor)"

var frameIndex = map[byte]int{'t': 0, 'l': 1, 'b': 2, 'n': 3}

// parseObservable parses one observable name.
func parseObservable(name string, conv convention.Set) (observable, error) {
	o := observable{Name: name}
	bad := badf("--observable = %q; %s", name, observableHelp)
	switch {
	case strings.HasPrefix(name, "dp_") && len(name) == 4:
		i, ok := frameIndex[name[3]]
		if !ok {
			return o, bad
		}
		o.i = i
	case strings.HasPrefix(name, "da_") && len(name) == 4:
		i, ok := frameIndex[name[3]]
		if !ok {
			return o, bad
		}
		if conv.Spin == convention.Tensor {
			return o, badf("--observable = %q: with --spin tensor use dS_XY", name)
		}
		o.spin, o.i = true, i
	case strings.HasPrefix(name, "dS_") && len(name) == 5:
		i, ok1 := frameIndex[name[3]]
		j, ok2 := frameIndex[name[4]]
		if !ok1 || !ok2 || i == j {
			return o, bad
		}
		if conv.Spin != convention.Tensor {
			return o, badf("--observable = %q: spin-tensor components need --spin tensor", name)
		}
		o.spin, o.tensor, o.i, o.j = true, true, i, j
	default:
		return o, bad
	}
	return o, nil
}

// observableIndex parses a vector observable name into (spin?, component).
func observableIndex(name string) (spin bool, comp int, err error) {
	o, err := parseObservable(name, convention.Set{})
	return o.spin, o.i, err
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

// scanOptions are the settings of one scan invocation after validation.
type scanOptions struct {
	obs     []observable
	conv    convention.Set
	exp     fit.ExponentSettings
	next    fit.NextOrderSettings
	thresh  []float64
	workers int
	// members names the completions of a --spread scan (nil: the
	// scenario's own model only).
	members []string
}

func runScan(cmd *Command, args []string, w io.Writer) error {
	switch scanFlags.format {
	case "table", "csv", "json", "latex", "latex-doc":
	default:
		return badf("--format = %q; allowed: table, csv, json, latex, latex-doc", scanFlags.format)
	}
	if scanFlags.workers < 0 {
		return badf("--workers = %d; allowed: ≥ 0", scanFlags.workers)
	}
	if scanFlags.resume && scanFlags.output == "" {
		return badf("--resume needs --output FILE (the file of the interrupted scan)")
	}
	if scanFlags.plot != "" {
		if err := checkPlotExt(scanFlags.plot); err != nil {
			return err
		}
	}
	scanFlags.extra = func(s *Scenario) {
		if scanFlags.epsMin != 0 {
			s.Scan.EpsMin = scanFlags.epsMin
		}
		if scanFlags.epsMax != 0 {
			s.Scan.EpsMax = scanFlags.epsMax
		}
		if scanFlags.points != 0 {
			s.Scan.Points = scanFlags.points
		}
	}
	s, raw, err := scanFlags.load(args)
	if err != nil {
		return err
	}
	opt := scanOptions{conv: scanFlags.conv, workers: scanFlags.workers}
	for _, name := range strings.Split(scanFlags.observable, ",") {
		o, err := parseObservable(strings.TrimSpace(name), opt.conv)
		if err != nil {
			return err
		}
		if o.spin && !s.spinning() {
			return badf("--observable = %s: probe kind %s has no spin", o.Name, s.Probe.Kind)
		}
		opt.obs = append(opt.obs, o)
	}
	if scanFlags.window != "" {
		win, err := parseFloats("window", scanFlags.window, 2)
		if err != nil {
			return err
		}
		if win[0] >= win[1] {
			return badf("--window = %q; allowed: LO,HI with 0 < LO < HI", scanFlags.window)
		}
		opt.exp.EpsLo, opt.exp.EpsHi = win[0], win[1]
	}
	if opt.thresh, err = parseFloats("thresholds", scanFlags.thresholds, 0); err != nil {
		return err
	}
	if scanFlags.degree > 4 || scanFlags.degree < -1 {
		return badf("--degree = %d; allowed: -1 (automatic) or 0..4", scanFlags.degree)
	}
	if scanFlags.degree >= 0 {
		opt.next.Degree, opt.next.FixDegree = scanFlags.degree, true
	}
	if scanFlags.spread {
		if s.Probe.Kind != "root-kerr" {
			return badf("--spread: allowed only for probe kind root-kerr (the completions of the root-Kerr probe); this scenario's probe is %q", s.Probe.Kind)
		}
		opt.members = s.familyNames()
	}
	recs, err := collect(s, raw, scanFlags.output, scanFlags.resume, opt.members, opt.workers, newProgress(s.Scan.Points*max(1, len(opt.members)), scanFlags.quiet))
	if err != nil {
		return err
	}
	res := buildResult(s, raw, recs, opt)
	if scanFlags.plot != "" {
		if err := plotResiduals(res, scanFlags.plot); err != nil {
			return fmt.Errorf("--plot: %v", err)
		}
	}
	return writeScan(w, res, scanFlags.format)
}

// spinning reports whether the probe carries spin.
func (s *Scenario) spinning() bool { return s.Probe.Kind == "bmt" || s.Probe.Kind == "root-kerr" }

// electromagnetic reports whether ε is an electromagnetic coupling.
func (s *Scenario) electromagnetic() bool { return !s.Background.curved() }

// epsGrid returns n log-spaced couplings from lo to hi.
func epsGrid(lo, hi float64, n int) []float64 {
	g := make([]float64, n)
	for i := range g {
		g[i] = lo * math.Pow(hi/lo, float64(i)/float64(n-1))
	}
	g[n-1] = hi
	return g
}

// record is everything computed at one point of a scan, in the library's
// own conventions (Gaussian units, covariant b, contravariant components in
// the source frame): observables and output conventions are applied when a
// table or figure is made, so a recorded scan serves any of them.
type record struct {
	Index int `json:"i"` // job index: member × points + grid index
	// Model names the completion of a --spread scan (empty otherwise).
	Model  string `json:"model,omitempty"`
	Eps    num    `json:"eps"` // |ε| of the grid (Gaussian, covariant b)
	Status string `json:"status"`
	// Asymptotic data and results.
	PIn         vec4    `json:"p_in"`
	AIn         vec4    `json:"a_in"`
	B           vec4    `json:"b"`
	POut        vec4    `json:"p_out"`
	AOut        vec4    `json:"a_out"`
	Impulse     vec4    `json:"dp"`
	ImpulseErr  vec4    `json:"dp_err"`
	SpinKick    vec4    `json:"da"`
	SpinKickErr vec4    `json:"da_err"`
	FirstDp     [3]vec4 `json:"dp1"` // first order at the covariant b, b_J, b_eik
	FirstDa     [3]vec4 `json:"da1"`
	BJ          num     `json:"b_j"`
	BEik        num     `json:"b_eik"`
	TolErr      num     `json:"err_tol"`
	RadiusErr   num     `json:"err_radius"`
	Drift       num     `json:"drift"`
	Evals       int     `json:"evals"`
	Radius      num     `json:"radius"`
}

// runPoint integrates one point of the scan with the scenario's own model
// (member < 0) or the given member of the root-Kerr family.
func runPoint(s *Scenario, i int, eps float64, member int) record {
	r := record{Index: i, Eps: num(eps)}
	ev, err := s.BuildMember(member)
	if err != nil {
		r.Status = err.Error()
		return r
	}
	if member >= 0 {
		r.Model = ev.Model.Name()
	}
	r.PIn, r.AIn, r.B = vec4(ev.In.P), vec4(ev.In.A), vec4(ev.In.B)
	out, err := integrate.Scatter(ev.Model, ev.In, s.settings())
	if err != nil {
		r.Status = err.Error()
		return r
	}
	r.Status = out.Status.String()
	r.Evals = out.Evals
	if out.Status != integrate.StatusScattered {
		return r
	}
	r.POut, r.AOut = vec4(out.POut), vec4(out.AOut)
	r.Impulse, r.ImpulseErr = vec4(out.Impulse), vec4(out.ImpulseErr)
	r.SpinKick, r.SpinKickErr = vec4(out.SpinKick), vec4(out.SpinKickErr)
	r.TolErr, r.RadiusErr, r.Radius = num(out.TolErr), num(out.RadiusErr), num(out.Radius)
	bcov := ev.In.B.Spatial().Norm()
	r.BJ = num(observables.ImpactParameterJ(ev.In.P, ev.In.B))
	r.BEik = num(observables.EikonalImpactParameter(ev.In.P, out.POut, ev.In.B))
	// The first-order prediction at each impact-parameter definition: the
	// same formula with b rescaled to b_def (spins and charges fixed).
	for k, bd := range []float64{bcov, float64(r.BJ), float64(r.BEik)} {
		e := ev
		e.In.B = ev.In.B.Scale(bd / bcov)
		dp, da, _ := e.FirstOrder(s)
		r.FirstDp[k], r.FirstDa[k] = vec4(dp), vec4(da)
	}
	d := out.Drift
	drift := math.Max(math.Max(d.MassShell, d.SpinOrth), d.SpinNorm)
	if d.EnergyExact {
		drift = math.Max(drift, d.Energy)
	}
	r.Drift = num(drift)
	return r
}

// runRecords integrates the grid points not in done with a pool of
// workers. Each point is independent and written to its own slot, so the
// results are identical for any number of workers. sink, if non-nil, is
// called (serially) as each point finishes; an error from it stops the scan.
//
// With members (a --spread scan) the jobs are every member at every grid
// point, job k = member × points + grid index.
func runRecords(s *Scenario, done map[int]record, members []string, workers int, sink func(record) error) ([]record, error) {
	grid := epsGrid(s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points)
	if workers <= 0 {
		workers = runtime.NumCPU()
	}
	nm := max(1, len(members))
	njobs := nm * len(grid)
	recs := make([]record, njobs)
	jobs := make(chan int)
	var (
		wg      sync.WaitGroup
		mu      sync.Mutex
		sinkErr error
	)
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				g, member := i%len(grid), -1
				if len(members) > 0 {
					member = i / len(grid)
				}
				r := runPoint(s.WithEpsilon(grid[g]), i, grid[g], member)
				recs[i] = r
				if sink != nil {
					mu.Lock()
					if sinkErr == nil {
						sinkErr = sink(r)
					}
					mu.Unlock()
				}
			}
		}()
	}
	for i := 0; i < njobs; i++ {
		if r, ok := done[i]; ok {
			recs[i] = r
			continue
		}
		mu.Lock()
		stop := sinkErr != nil
		mu.Unlock()
		if stop {
			break
		}
		jobs <- i
	}
	close(jobs)
	wg.Wait()
	return recs, sinkErr
}

// scanPoint is one row of a series, in the chosen output conventions.
type scanPoint struct {
	Eps       float64 `json:"eps"`
	Status    string  `json:"status"`
	Numeric   float64 `json:"numeric"`
	First     float64 `json:"first_order"`
	Residual  float64 `json:"residual"`
	Ratio     float64 `json:"residual_over_eps2"`
	Err       float64 `json:"error"`
	TolErr    float64 `json:"error_tolerance"`
	RadiusErr float64 `json:"error_radius"`
	Drift     float64 `json:"max_drift"`
	Evals     int     `json:"rhs_evaluations"`
}

func (p scanPoint) ok() bool { return p.Status == integrate.StatusScattered.String() }

// derive reads one observable off a record in the conventions conv.
func derive(s *Scenario, r record, o observable, conv convention.Set) scanPoint {
	p := scanPoint{Status: r.Status, Evals: r.Evals}
	bcov := vec.Vec4(r.B).Spatial().Norm()
	bdef := [3]float64{bcov, float64(r.BJ), float64(r.BEik)}[conv.Impact]
	if !(bdef > 0) {
		bdef = bcov
	}
	p.Eps = conv.Units.Coupling(float64(r.Eps)*bcov/bdef, s.electromagnetic())
	if r.Status != integrate.StatusScattered.String() {
		return p
	}
	fr := observables.NewFrame(vec.Vec4(r.PIn), vec.Vec4(r.B))
	k := int(conv.Impact)
	switch {
	case o.tensor:
		// Frame components of S^{μν} = ε^{μνρσ}p_ρ a_σ (the frame is
		// orthonormal and right-handed, so S is built from the frame
		// components of p and a); the first order is the linear part
		// S(Δp₁, a_in) + S(p_in, Δa₁); the error is the linear propagation
		// of the error bars of p_out and a_out (spinTensorErr).
		pin, ain := frameVec(fr, vec.Vec4(r.PIn)), frameVec(fr, vec.Vec4(r.AIn))
		pout, aout := frameVec(fr, vec.Vec4(r.POut)), frameVec(fr, vec.Vec4(r.AOut))
		kick := tensorDiff(convention.SpinTensor(pout, aout), convention.SpinTensor(pin, ain))
		first := spinTensorKick1(pin, ain, frameVec(fr, vec.Vec4(r.FirstDp[k])), frameVec(fr, vec.Vec4(r.FirstDa[k])))
		p.Numeric, p.First = kick[o.i][o.j], first[o.i][o.j]
		p.Err = spinTensorErr(pout, aout, frameErr(vec.Vec4(r.ImpulseErr)), frameErr(vec.Vec4(r.SpinKickErr)))[o.i][o.j]
	case o.spin:
		p.Numeric = fr.Components(vec.Vec4(r.SpinKick))[o.i]
		p.First = fr.Components(vec.Vec4(r.FirstDa[k]))[o.i]
		p.Err = errComp(vec.Vec4(r.SpinKickErr), o.i)
	default:
		p.Numeric = fr.Components(vec.Vec4(r.Impulse))[o.i]
		p.First = fr.Components(vec.Vec4(r.FirstDp[k]))[o.i]
		p.Err = errComp(vec.Vec4(r.ImpulseErr), o.i)
	}
	p.Residual = p.Numeric - p.First
	p.Ratio = p.Residual / (p.Eps * p.Eps)
	p.TolErr, p.RadiusErr, p.Drift = float64(r.TolErr), float64(r.RadiusErr), float64(r.Drift)
	return p
}

// errComp bounds the error of a frame component: the estimate is
// component-wise in the source frame; the norm of its spatial part bounds
// each rotated spatial component.
func errComp(e vec.Vec4, i int) float64 {
	if i == 0 {
		return math.Abs(e[0])
	}
	return norm3(e)
}

// series is one column group of a scan: one model and one observable over
// the common grid. A scan result is a list of series so that further
// models or observables add columns without changing the writers.
type series struct {
	Model      string      `json:"model"`
	Observable string      `json:"observable"`
	Points     []scanPoint `json:"points"`
	Fits       scanFits    `json:"fits"`
}

// scanResult is a complete scan in the chosen output conventions.
type scanResult struct {
	Scenario *Scenario
	Given    string // the scenario as given (TOML text)
	Conv     convention.Set
	Series   []series
	// Spread summarises a --spread scan, one entry per observable.
	Spread []spreadSummary
}

func buildResult(s *Scenario, raw string, recs []record, opt scanOptions) scanResult {
	res := scanResult{Scenario: s, Given: raw, Conv: opt.conv}
	models := opt.members
	if len(models) == 0 {
		model := s.Probe.Kind
		if ev, err := s.Build(); err == nil {
			model = ev.Model.Name()
		}
		models = []string{model}
	}
	n := len(recs) / len(models)
	for _, o := range opt.obs {
		var group []series
		for k, model := range models {
			sr := series{Model: model, Observable: o.Name}
			for _, r := range recs[k*n : (k+1)*n] {
				sr.Points = append(sr.Points, derive(s, r, o, opt.conv))
			}
			sr.Fits = doFitsWith(sr.Points, opt)
			group = append(group, sr)
		}
		res.Series = append(res.Series, group...)
		if len(opt.members) > 0 {
			res.Spread = append(res.Spread, spreadOf(o.Name, group))
		}
	}
	return res
}

// runPoints runs the scan and returns the rows of one vector observable in
// the default conventions.
func runPoints(s *Scenario, spin bool, comp, workers int) []scanPoint {
	recs, _ := runRecords(s, nil, nil, workers, nil)
	o := observable{spin: spin, i: comp}
	pts := make([]scanPoint, len(recs))
	for i, r := range recs {
		pts[i] = derive(s, r, o, convention.Set{})
	}
	return pts
}

// scanFits are the fits below the table.
type scanFits struct {
	Exponent    *fit.ExponentResult   `json:"exponent,omitempty"`
	ExponentErr string                `json:"exponent_error,omitempty"`
	NextOrder   *fit.NextOrderResult  `json:"next_order,omitempty"`
	NextErr     string                `json:"next_order_error,omitempty"`
	Breakdown   []fit.BreakdownResult `json:"breakdown,omitempty"`
	// NoiseFloor is the median numerical error σ of the points (the level
	// below which residuals are noise).
	NoiseFloor float64 `json:"noise_floor"`
}

func doFits(pts []scanPoint) scanFits { return doFitsWith(pts, scanOptions{}) }

// fitPoints converts rows into fit input.
func fitPoints(pts []scanPoint) []fit.Point {
	var fp []fit.Point
	for _, p := range pts {
		if !p.ok() {
			continue
		}
		fp = append(fp, fit.Point{Eps: p.Eps, First: p.First, Residual: p.Residual, Sigma: sigmaOf(p)})
	}
	return fp
}

// sigmaOf is the fit weight of a row: the numerical error estimate, with a
// floor of one unit in the last place of the numeric value to keep it
// positive (rounding of the result itself).
func sigmaOf(p scanPoint) float64 {
	sig := math.Max(p.Err, 2.2e-16*math.Abs(p.Numeric))
	if !(sig > 0) {
		sig = 1e-300
	}
	return sig
}

func doFitsWith(pts []scanPoint, opt scanOptions) scanFits {
	fp := fitPoints(pts)
	var f scanFits
	if e, err := fit.Exponent(fp, &opt.exp); err == nil {
		f.Exponent = &e
	} else {
		f.ExponentErr = err.Error()
	}
	if n, err := fit.NextOrder(fp, &opt.next); err == nil {
		f.NextOrder = &n
	} else {
		f.NextErr = err.Error()
	}
	if b, err := fit.Breakdown(fp, opt.thresh); err == nil {
		f.Breakdown = b
	}
	var sig []float64
	for _, q := range fp {
		sig = append(sig, q.Sigma)
	}
	f.NoiseFloor = median(sig)
	return f
}

func median(x []float64) float64 {
	if len(x) == 0 {
		return math.NaN()
	}
	y := append([]float64(nil), x...)
	for i := 1; i < len(y); i++ {
		for j := i; j > 0 && y[j] < y[j-1]; j-- {
			y[j], y[j-1] = y[j-1], y[j]
		}
	}
	return y[len(y)/2]
}

// stderrW receives progress output (the command's standard error).
var stderrW io.Writer = os.Stderr

// defaultConv is the library's own set of conventions.
var defaultConv = convention.Set{}
