package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"runtime"
	"strconv"
	"strings"
	"sync"

	"github.com/spf13/pflag"

	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
	"ricochet/observables/fit"
)

var scanFlags struct {
	common
	epsMin, epsMax float64
	points         int
	format         string
	observable     string
	workers        int
}

var cmdScan = &Command{
	Name:      "scan",
	UsageLine: "scan [flags] [scenario.toml]",
	Short:     "scan the coupling and tabulate numeric vs first order",
	Long: `Scan integrates the scenario at log-spaced couplings |eps| from eps_min to
eps_max (scaling the source's charges at fixed gamma, phases and spin/b
ratios) and prints a convergence table for one observable: the numeric
value, the first-order prediction, the residual (numeric - first order),
residual/eps^2 and the numerical error estimate of each point.

Below the table: the scaling exponent n of |residual| ~ A eps^n from a
weighted fit over the window where the residual stands above the numerical
noise and the local slope is stable (window printed), the eps -> 0 limit of
residual/eps^2 (the next-order coefficient) from a weighted polynomial fit
in eps with the degree chosen by the corrected Akaike criterion, and the
couplings where |residual|/|first order| crosses 1 % and 10 %.

Observables are components of the impulse (dp) or spin kick (da) along the
frame of record: l (incoming direction), b (impact parameter), n = l x b.
Points run in parallel; results do not depend on the number of workers.`,
	Example: `ricochet scan
ricochet scan --observable dp_n --points 9 --format csv
ricochet scan --scenario coulomb-darwin --eps-max 0.3`,
	Flags: pflag.NewFlagSet("scan", pflag.ContinueOnError),
	Run:   runScan,
}

func init() {
	f := cmdScan.Flags
	scanFlags.register(f)
	f.Float64Var(&scanFlags.epsMin, "eps-min", 0, "override scan.eps_min (smallest |eps|, > 0)")
	f.Float64Var(&scanFlags.epsMax, "eps-max", 0, "override scan.eps_max (largest |eps|)")
	f.IntVar(&scanFlags.points, "points", 0, "override scan.points (2..10000)")
	f.StringVar(&scanFlags.format, "format", "table", "output format: table, csv or json")
	f.StringVar(&scanFlags.observable, "observable", "dp_b", "observable: dp_l, dp_b, dp_n, da_l, da_b, da_n")
	f.IntVar(&scanFlags.workers, "workers", 0, "parallel workers (0: number of CPUs)")
}

// scanPoint is one row of a scan.
type scanPoint struct {
	Eps      float64 `json:"eps"`
	Status   string  `json:"status"`
	Numeric  float64 `json:"numeric"`
	First    float64 `json:"first_order"`
	Residual float64 `json:"residual"`
	Ratio    float64 `json:"residual_over_eps2"`
	Err      float64 `json:"error"`
	Drift    float64 `json:"max_drift"`
	Evals    int     `json:"rhs_evaluations"`
}

// observableIndex parses an observable name into (spin?, component).
func observableIndex(name string) (spin bool, comp int, err error) {
	parts := strings.SplitN(name, "_", 2)
	if len(parts) != 2 || (parts[0] != "dp" && parts[0] != "da") {
		return false, 0, badf("--observable = %q; allowed: dp_l, dp_b, dp_n, da_l, da_b, da_n", name)
	}
	switch parts[1] {
	case "l":
		comp = 1
	case "b":
		comp = 2
	case "n":
		comp = 3
	default:
		return false, 0, badf("--observable = %q; allowed: dp_l, dp_b, dp_n, da_l, da_b, da_n", name)
	}
	return parts[0] == "da", comp, nil
}

func runScan(cmd *Command, args []string, w io.Writer) error {
	switch scanFlags.format {
	case "table", "csv", "json":
	default:
		return badf("--format = %q; allowed: table, csv, json", scanFlags.format)
	}
	spin, comp, err := observableIndex(scanFlags.observable)
	if err != nil {
		return err
	}
	if scanFlags.workers < 0 {
		return badf("--workers = %d; allowed: ≥ 0", scanFlags.workers)
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
	s, _, err := scanFlags.load(args)
	if err != nil {
		return err
	}
	if spin && (s.Probe.Kind == "charge" || s.Probe.Kind == "dyon" || s.Probe.Kind == "geodesic") {
		return badf("--observable = %s: probe kind %s has no spin", scanFlags.observable, s.Probe.Kind)
	}
	pts := runPoints(s, spin, comp, scanFlags.workers)
	return writeScan(w, s, pts, scanFlags.format)
}

// epsGrid returns n log-spaced couplings from lo to hi.
func epsGrid(lo, hi float64, n int) []float64 {
	g := make([]float64, n)
	for i := range g {
		g[i] = lo * math.Pow(hi/lo, float64(i)/float64(n-1))
	}
	g[n-1] = hi
	return g
}

// runPoints integrates every point of the scan with a pool of workers.
// Each point is independent and written to its own slot, so the results
// are identical for any number of workers.
func runPoints(s *Scenario, spin bool, comp, workers int) []scanPoint {
	grid := epsGrid(s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points)
	if workers <= 0 {
		workers = runtime.NumCPU()
	}
	pts := make([]scanPoint, len(grid))
	jobs := make(chan int)
	var wg sync.WaitGroup
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				pts[i] = runPoint(s.WithEpsilon(grid[i]), grid[i], spin, comp)
			}
		}()
	}
	for i := range grid {
		jobs <- i
	}
	close(jobs)
	wg.Wait()
	return pts
}

func runPoint(s *Scenario, eps float64, spin bool, comp int) scanPoint {
	p := scanPoint{Eps: eps}
	ev, err := s.Build()
	if err != nil {
		p.Status = err.Error()
		return p
	}
	out, err := integrate.Scatter(ev.Model, ev.In, s.settings())
	if err != nil {
		p.Status = err.Error()
		return p
	}
	p.Status = out.Status.String()
	p.Evals = out.Stats.Evaluations
	if out.Status != integrate.StatusScattered {
		return p
	}
	dp1, da1, _ := ev.FirstOrder(s)
	fr := observables.NewFrame(ev.In.P, ev.In.B)
	num, first, errv := out.Impulse, dp1, out.ImpulseErr
	if spin {
		num, first, errv = out.SpinKick, da1, out.SpinKickErr
	}
	p.Numeric = fr.Components(num)[comp]
	p.First = fr.Components(first)[comp]
	p.Residual = p.Numeric - p.First
	p.Ratio = p.Residual / (eps * eps)
	p.Err = vec.Vec3(errv.Spatial()).Norm()
	d := out.Drift
	p.Drift = math.Max(math.Max(d.MassShell, d.SpinOrth), d.SpinNorm)
	if d.EnergyExact {
		p.Drift = math.Max(p.Drift, d.Energy)
	}
	return p
}

// scanFits are the fits below the table.
type scanFits struct {
	Exponent    *fit.ExponentResult   `json:"exponent,omitempty"`
	ExponentErr string                `json:"exponent_error,omitempty"`
	NextOrder   *fit.NextOrderResult  `json:"next_order,omitempty"`
	NextErr     string                `json:"next_order_error,omitempty"`
	Breakdown   []fit.BreakdownResult `json:"breakdown,omitempty"`
}

func doFits(pts []scanPoint) scanFits {
	var fp []fit.Point
	for _, p := range pts {
		if p.Status != integrate.StatusScattered.String() {
			continue
		}
		// The numerical error estimate is the fit weight; a floor of one
		// unit in the last place of the numeric value keeps it positive.
		sig := math.Max(p.Err, 2.2e-16*math.Abs(p.Numeric))
		if sig == 0 {
			sig = 1e-300
		}
		fp = append(fp, fit.Point{Eps: p.Eps, First: p.First, Residual: p.Residual, Sigma: sig})
	}
	var f scanFits
	if e, err := fit.Exponent(fp, nil); err == nil {
		f.Exponent = &e
	} else {
		f.ExponentErr = err.Error()
	}
	if n, err := fit.NextOrder(fp, nil); err == nil {
		f.NextOrder = &n
	} else {
		f.NextErr = err.Error()
	}
	if b, err := fit.Breakdown(fp, nil); err == nil {
		f.Breakdown = b
	}
	return f
}

func g6(x float64) string  { return strconv.FormatFloat(x, 'e', 6, 64) }
func g12(x float64) string { return strconv.FormatFloat(x, 'e', 12, 64) }

func writeScan(w io.Writer, s *Scenario, pts []scanPoint, format string) error {
	fits := doFits(pts)
	obs := scanFlags.observable
	switch format {
	case "json":
		doc := map[string]any{
			"program":     versionString(),
			"scenario":    s,
			"conventions": conventions(),
			"observable":  obs,
			"points":      pts,
			"fits":        fits,
		}
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(nanFree(doc))
	case "csv":
		for _, c := range conventions() {
			fmt.Fprintf(w, "# %s\n", c)
		}
		fmt.Fprintf(w, "# scenario: %s; observable: %s\n", s.Name, obs)
		cw := csv.NewWriter(w)
		cw.Write([]string{"eps", "status", "numeric", "first_order", "residual", "residual_over_eps2", "error", "max_drift", "rhs_evaluations"})
		for _, p := range pts {
			cw.Write([]string{g12(p.Eps), p.Status, g12(p.Numeric), g12(p.First), g12(p.Residual), g12(p.Ratio), g6(p.Err), g6(p.Drift), strconv.Itoa(p.Evals)})
		}
		cw.Flush()
		return cw.Error()
	}
	fmt.Fprintf(w, "ricochet scan: %s\n", s.Name)
	for _, c := range conventions() {
		fmt.Fprintf(w, "# %s\n", c)
	}
	fmt.Fprintf(w, "\nobservable %s; probe %s, source %s; gamma = %.6g, b = %g\n", obs, s.Probe.Kind, s.Background.Kind, s.Kinematics.Gamma, s.Kinematics.B)
	tw := newTable(w)
	tw.Header("eps", "numeric", "first order", "residual", "residual/eps^2", "num. error", "status")
	for _, p := range pts {
		if p.Status != integrate.StatusScattered.String() {
			tw.Append(g6(p.Eps), "", "", "", "", "", p.Status)
			continue
		}
		tw.Append(g6(p.Eps), g12(p.Numeric), g12(p.First), g6(p.Residual), g6(p.Ratio), g6(p.Err), p.Status)
	}
	if err := tw.Render(); err != nil {
		return err
	}
	if e := fits.Exponent; e != nil {
		fmt.Fprintf(w, "residual scaling exponent n = %.5f ± %.1e (|residual| ~ A eps^n (1 + d1 eps + ...), %d correction terms by AICc; window eps in [%.3g, %.3g], %d points)\n", e.N, e.SigmaN, e.Corrections, e.EpsLo, e.EpsHi, e.Used)
	} else {
		fmt.Fprintf(w, "residual scaling exponent: not determined (%s)\n", fits.ExponentErr)
	}
	if n := fits.NextOrder; n != nil {
		fmt.Fprintf(w, "next-order coefficient lim residual/eps^2 = %.8g ± %.2g (polynomial degree %d in eps, corrected AIC; %d points)\n", n.C2, n.SigmaC2, n.Degree, n.Used)
	} else {
		fmt.Fprintf(w, "next-order coefficient: not determined (%s)\n", fits.NextErr)
	}
	for _, b := range fits.Breakdown {
		if b.Found {
			fmt.Fprintf(w, "|residual|/|first order| reaches %g %% at eps = %.4g ± %.2g\n", 100*b.Threshold, b.Eps, b.SigmaEps)
		} else {
			fmt.Fprintf(w, "|residual|/|first order| does not cross %g %% within the scan\n", 100*b.Threshold)
		}
	}
	return nil
}
