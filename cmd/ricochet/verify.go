package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/olekukonko/tablewriter/tw"
	"github.com/spf13/pflag"

	"ricochet/observables/predict"
	"ricochet/observables/scan"
	"ricochet/observables/scenario"
)

var verifyFlags struct {
	common
	predictions string
	eps         float64
	couplings   int
	format      string
	plot        string
	detail      bool
	template    string
	workers     int
	quiet       bool
}

var cmdVerify = &Command{
	Name:      "verify",
	UsageLine: "verify [flags] [scenario.toml]",
	Short:     "check your own prediction: verdict per observable and convention diagnosis",
	Long: `Verify checks a prediction of your own against the nonlinear result. The
prediction is a [prediction] table in the scenario file, or a predictions
file given with --predictions: a TOML file with a [prediction] table, or a
CSV table of predicted values. A [prediction] table holds formulas, one per
predicted component of the impulse dp_X or spin kick da_X along the frame
of record (X = t, l, b, n), in a small formula language over complex
scalars and vectors, and the conventions they are written in:

  [prediction]
  dp_b = "2*q*Q/(v*b)"     # Coulomb impulse at first order
  signature = "-+++"       # -+++ or +--- (for index = "lower")
  index = "upper"          # upper (contravariant) or lower (covariant)
  units = "gaussian"       # gaussian or heaviside-lorentz
  impact = "covariant"     # covariant, j (|J|/|p|) or eikonal
  spin_sign = "+"          # + (spin along +z is angular momentum along +z) or -
  body = "probe"           # whose impulse: probe or source
  order = "first"          # first, or next (includes the next order)
  table = "values.csv"     # optional CSV of predicted values (next to this file)

Names a formula reads: gamma v p E b m q g Q P M N eps, the vectors a1 a2
lhat bhat nhat vvec bvec, i and pi; functions sqrt exp log sin cos tan
asin acos atan sinh cosh tanh asinh acosh atanh re im conj abs arg atan2,
and dot cross perp norm unit vec vre vim vconj for vectors; "let x = ...;"
binds a name; u.x, u.y, u.z are components. A CSV table has a header row
eps,dp_X,... (eps = |eps| of each point; one column per parameter axis of
a multi-parameter scenario) and one row per point of the short scan;
--template OBS,... prints its skeleton.

Verify integrates the scenario at its own coupling and at --couplings - 1
successive halvings of it (a short scan; other parameter axes are kept,
each combination a configuration), fits residual/eps = c1 + c2 eps + ...
(residual = numeric - yours) and, at 3 standard deviations, says whether
your prediction agrees at first order (residual ~ eps^2), beyond first
order (~ eps^3: a correct next order), to all orders within the numerical
error, or disagrees at first order, by how much and with which power of
eps. For a disagreement it tries a catalogue of convention changes (spin
signs, magnetic charge and NUT signs, orientation of epsilon, in and out
swapped, the other body, covariant components, factors 4 pi, factors 2 in
coupling and spin, sign and definition of b), alone and in pairs, and lists
those that restore first-order agreement, or says that none does.

The verdict table fits 100 columns; --detail adds the points. --format csv
gives the verdicts (header row first), csv-points the points, json all of
it (json-schema prints its JSON Schema); --plot FILE draws |your residual|
and ricochet's own first-order residual against eps (.png, .svg, .pdf or
.eps).`,
	Example: `ricochet verify --scenario coulomb-darwin --predictions coulomb.toml
ricochet verify my.toml --plot residual.png
ricochet verify --scenario schwarzschild --template dp_b,dp_l > values.csv
ricochet verify --scenario schwarzschild --predictions values.csv --format json`,
	Flags: pflag.NewFlagSet("verify", pflag.ContinueOnError),
	Run:   runVerify,
}

func init() {
	f := cmdVerify.Flags
	verifyFlags.registerScenario(f)
	f.StringVar(&verifyFlags.predictions, "predictions", "", "predictions FILE: .toml with a [prediction] table (replaces the scenario's), or .csv of predicted values")
	floatFlag(f, &verifyFlags.eps, "eps", 0, "0 < eps ≤ 10, or 0 for the scenario's own coupling", "largest |eps| of the short scan (> 0; 0: the scenario's own coupling)")
	intFlag(f, &verifyFlags.couplings, "couplings", predict.DefaultCouplings, fmt.Sprintf("%d ≤ couplings ≤ %d", predict.MinCouplings, predict.MaxCouplings), fmt.Sprintf("number of couplings of the short scan, each half the one before (%d..%d)", predict.MinCouplings, predict.MaxCouplings))
	f.StringVar(&verifyFlags.format, "format", "table", "output format: table, csv (verdicts), csv-points, json or json-schema (the JSON Schema of the json output)")
	f.StringVar(&verifyFlags.plot, "plot", "", "draw your residual and ricochet's first-order residual against eps to FILE (.png, .svg, .pdf or .eps)")
	f.BoolVar(&verifyFlags.detail, "detail", false, "with --format table, print the points of each observable")
	f.StringVar(&verifyFlags.template, "template", "", "print the CSV skeleton of a table of predicted values for the observables OBS,... (dp_X, da_X) and stop")
	intFlag(f, &verifyFlags.workers, "workers", 0, "workers ≥ 0 (0: number of CPUs)", "parallel workers (0: number of CPUs)")
	f.BoolVar(&verifyFlags.quiet, "quiet", false, "no progress bar")
}

// verifyResult is everything a verification prints.
type verifyResult struct {
	scenario *Scenario // the short scan
	origin   string    // where the prediction came from
	spec     *predict.Spec
	formulas map[string]string
	cfgs     []predict.Configuration
}

func runVerify(cmd *Command, args []string, w io.Writer) error {
	vf := &verifyFlags
	switch vf.format {
	case "table", "csv", "csv-points", "json":
	case "json-schema":
		return writeSchema(w, "verify")
	default:
		return badf("--format = %q; allowed: table, csv, csv-points, json, json-schema", vf.format)
	}
	if vf.workers < 0 {
		return badf("--workers = %d; allowed: ≥ 0", vf.workers)
	}
	if vf.eps != 0 && !(vf.eps > 0 && !math.IsInf(vf.eps, 0)) {
		return badf("--eps = %g; allowed: 0 < eps < ∞ (0: the scenario's own coupling)", vf.eps)
	}
	if cmd.Flags.Changed("plot") {
		if err := checkPlotExt("plot", vf.plot); err != nil {
			return err
		}
		if err := checkOutputPath("plot", vf.plot); err != nil {
			return err
		}
	}
	s, _, err := vf.load(args)
	if err != nil {
		return err
	}
	if vf.eps != 0 {
		s = s.WithEpsilon(vf.eps)
	}
	if vf.template != "" {
		return writeTemplate(w, s, vf.template, vf.couplings)
	}
	dir := ""
	if len(args) == 1 {
		dir = filepath.Dir(args[0])
	}
	sp, origin, err := loadPrediction(s, dir, vf.predictions)
	if err != nil {
		return err
	}
	if err := sp.ValidFor(s); err != nil {
		return err
	}
	short, err := predict.ShortScan(s, vf.couplings)
	if err != nil {
		return badf("--%v", err)
	}
	recs, err := collect(short, &scan.Settings{Workers: vf.workers, Version: version}, vf.quiet)
	if err != nil {
		return err
	}
	cfgs, err := predict.Evaluate(short, recs, sp, nil)
	if err != nil {
		return err
	}
	res := verifyResult{scenario: short, origin: origin, spec: sp, cfgs: cfgs, formulas: map[string]string{}}
	for _, p := range sp.Formulas {
		res.formulas[p.Observable.String()] = p.Formula.Source
	}
	if vf.plot != "" {
		if err := plotVerify(res, vf.plot); err != nil {
			return fmt.Errorf("--plot: %v", err)
		}
	}
	switch vf.format {
	case "csv":
		return writeVerifyCSV(w, res)
	case "csv-points":
		return writeVerifyPointsCSV(w, res)
	case "json":
		return writeVerifyJSON(w, res)
	}
	return writeVerifyTable(w, res, vf.detail)
}

// writeTemplate prints the skeleton of a table of values (--template).
func writeTemplate(w io.Writer, s *Scenario, list string, n int) error {
	var obs []predict.Observable
	for _, name := range strings.Split(list, ",") {
		o, err := predict.ParseObservable(strings.TrimSpace(name))
		if err != nil {
			return badf("--template = %q; allowed: dp_X, da_X with X in t, l, b, n, comma-separated", list)
		}
		if o.Kick == 1 && !s.Spinning() {
			return badf("--template: %s: probe kind %s has no spin; allowed: dp_t, dp_l, dp_b, dp_n", o, s.Probe.Kind)
		}
		obs = append(obs, o)
	}
	short, err := predict.ShortScan(s, n)
	if err != nil {
		return badf("--%v", err)
	}
	return predict.WriteTemplate(w, short, obs)
}

// loadPrediction reads the prediction: the scenario's [prediction] table,
// replaced by a TOML predictions file or completed by a CSV table of
// values. dir is the scenario file's directory.
func loadPrediction(s *Scenario, dir, file string) (*predict.Spec, string, error) {
	spec, origin := s.Prediction, "the [prediction] table of "+s.Name
	switch strings.ToLower(filepath.Ext(file)) {
	case "":
		if file != "" {
			return nil, "", badf("--predictions = %q; allowed: a .toml file with a [prediction] table or a .csv table of values", file)
		}
	case ".csv":
	default:
		b, err := os.ReadFile(file)
		if err != nil {
			return nil, "", badf("--predictions: %v", err)
		}
		if spec, err = scenario.ParsePrediction(b, file); err != nil {
			return nil, "", err
		}
		dir, origin = filepath.Dir(file), file
	}
	if spec == nil {
		spec = &scenario.PredictionSpec{}
	}
	sp, err := predict.CompileSpec(spec, dir)
	if err != nil {
		return nil, "", err
	}
	if strings.ToLower(filepath.Ext(file)) == ".csv" {
		f, err := os.Open(file)
		if err != nil {
			return nil, "", badf("--predictions: %v", err)
		}
		defer f.Close()
		t, err := predict.ReadTable(f, file)
		if err != nil {
			return nil, "", err
		}
		if err := sp.AddTable(t); err != nil {
			return nil, "", err
		}
		origin = file
		if s.Prediction != nil {
			origin += " with the conventions of " + s.Name
		}
	}
	if len(sp.Observables()) == 0 {
		return nil, "", badf("no prediction: the scenario has no [prediction] table; allowed: a [prediction] table in the scenario or --predictions FILE (.toml or .csv)")
	}
	return sp, origin, nil
}

// verdictShort is a verdict as the table prints it.
func verdictShort(v predict.Verdict) string {
	return [...]string{"undecided", "DISAGREES at 1st order", "agrees at 1st order", "agrees beyond 1st order", "agrees to all orders"}[v]
}

// sigmaOrNA prints x ± σ in the concise notation, or n/a.
func sigmaOrNA(x, sig float64) string {
	switch {
	case math.IsNaN(x):
		return "n/a"
	case x == 0 && sig == 0:
		return "0 (every point exactly zero)"
	}
	return plainSigma(x+0, sig) // x + 0 prints −0 as 0
}

// fixedSigma prints x ± σ as x(u), in fixed notation when x is between
// 0.01 and 10⁴ in magnitude and above its uncertainty, else as numfmt's
// plain notation.
func fixedSigma(x, sig float64) string {
	if math.IsNaN(x) {
		return "n/a"
	}
	if a := math.Abs(x); !(sig > 0) || math.IsInf(sig, 0) || a < 0.01 || a >= 1e4 || sig >= a {
		return sigmaOrNA(x, sig)
	}
	d := max(0, 1-int(math.Floor(math.Log10(sig))))
	u := math.Round(sig * math.Pow10(d))
	if u >= 100 && d > 0 { // 99.6 rounds to 100: one digit fewer
		d--
		u = math.Round(sig * math.Pow10(d))
	}
	return fmt.Sprintf("%.*f(%.0f)", d, x, u)
}

// percent prints a relative number ± σ in per cent.
func percent(x, sig float64) string {
	if math.IsNaN(x) {
		return "n/a"
	}
	return fixedSigma(100*x, 100*sig) + " %"
}

// printWrapped writes text wrapped at 100 columns.
func printWrapped(w io.Writer, text string, indent int) {
	lead := len(text) - len(strings.TrimLeft(text, " "))
	lines := wrap(text, 100-indent)
	fmt.Fprintln(w, strings.Repeat(" ", lead)+strings.Join(lines, "\n"+strings.Repeat(" ", indent)))
}

func writeVerifyTable(w io.Writer, res verifyResult, detail bool) error {
	s := res.scenario
	fmt.Fprintf(w, "ricochet verify: %s; prediction from %s\n", s.Name, res.origin)
	printWrapped(w, "# your conventions: "+strings.Join(res.spec.Conventions.Describe(), "; "), 2)
	kin := fmt.Sprintf("gamma = %.6g, b = %g", s.Kinematics.Gamma, s.Kinematics.B)
	if len(s.ParamAxes()) > 0 {
		kin = "the parameters of each configuration as given below"
	}
	g := s.CouplingGrid()
	printWrapped(w, fmt.Sprintf("# short scan: %d couplings |eps| = %.10g down to %.10g by halvings (exact by construction); %s",
		len(g), g[len(g)-1], g[0], kin), 2)
	printWrapped(w, fmt.Sprintf("# residual = numeric - yours, fitted as residual/eps = c1 + c2 eps + ...; verdicts at %d standard deviations; numbers are x(u) with u the standard uncertainty in the last digits", predict.Significance), 2)
	for ci, cfg := range res.cfgs {
		fmt.Fprintln(w)
		if l := cfg.Label(); l != "" {
			fmt.Fprintf(w, "configuration %d of %d: %s\n", ci+1, len(res.cfgs), l)
		}
		tb := newAlignedTable(w, tw.AlignLeft)
		tb.Header("observable", "verdict", "1st order off by", "exponent n", "lim residual/eps^2")
		for _, r := range cfg.Results {
			off := percent(r.Relative, r.SigmaRelative)
			if math.IsNaN(r.Relative) {
				off = "c1 = " + sigmaOrNA(r.C1, r.SigmaC1)
			}
			tb.Append(r.Observable, verdictShort(r.Verdict), off, fixedSigma(r.Exponent, r.SigmaExponent), sigmaOrNA(r.C2, r.SigmaC2))
		}
		if err := tb.Render(); err != nil {
			return err
		}
		legend := "1st order off by: (yours - true)/true at first order, or c1 = lim residual/eps where the true first order vanishes"
		for _, r := range cfg.Results {
			if math.IsNaN(r.Exponent) || math.IsNaN(r.C2) {
				legend += "; n/a: not determined (an exponent needs the residual above the numerical noise at enough points; lim residual/eps^2 exists only when the first order agrees)"
				break
			}
		}
		printWrapped(w, legend, 2)
		for _, r := range cfg.Results {
			writeVerdictText(w, r)
			if detail {
				if err := writeVerifyPoints(w, r); err != nil {
					return err
				}
			}
		}
	}
	return nil
}

// writeVerdictText explains one verdict in words, with the diagnosis.
func writeVerdictText(w io.Writer, r predict.Result) {
	var t string
	switch r.Verdict {
	case predict.Undecided:
		t = "undecided"
	case predict.AgreesAll:
		t = "agrees to all orders within the numerical error (every residual is consistent with zero)"
	case predict.AgreesFirst:
		t = fmt.Sprintf("agrees at first order: the residual scales like eps^2, residual/eps^2 -> %s", sigmaOrNA(r.C2, r.SigmaC2))
	case predict.AgreesBeyond:
		t = fmt.Sprintf("agrees beyond first order: the eps^2 part of the residual vanishes too, residual/eps^2 -> %s (residual ~ eps^3 or faster)", sigmaOrNA(r.C2, r.SigmaC2))
	case predict.DisagreesFirst:
		t = "DISAGREES at first order: "
		if !math.IsNaN(r.Relative) {
			t += "your first order is off by " + percent(r.Relative, r.SigmaRelative)
		} else {
			t += "the true first order of this component vanishes, yours does not: residual/eps -> " + sigmaOrNA(r.C1, r.SigmaC1)
		}
		t += fmt.Sprintf(" (residual ~ eps^%s)", fixedSigma(r.Exponent, r.SigmaExponent))
	}
	t = r.Observable + ": " + t + "."
	if !math.IsNaN(r.OwnC2) && r.Verdict != predict.DisagreesFirst {
		t += fmt.Sprintf(" ricochet's own first-order residual/eps^2 -> %s (the true eps^2 coefficient).", sigmaOrNA(r.OwnC2, r.SigmaOwnC2))
	}
	if !math.IsNaN(r.AtGiven) && r.SigmaAtGiven > 0 {
		t += fmt.Sprintf(" At the largest eps, (yours - numeric)/numeric = %s.", percent(r.AtGiven, r.SigmaAtGiven))
	}
	if r.Note != "" {
		t += " Note: " + r.Note + "."
	}
	printWrapped(w, t, 2)
	for _, e := range r.Diagnosis {
		kind := "explained by"
		if e.Entries == 2 {
			kind = "explained by the pair"
		}
		x := fmt.Sprintf("%s: %s. %s", kind, strings.Join(e.Names, " = "), capitalise(e.Advice))
		if !math.IsNaN(e.Remaining) {
			x += fmt.Sprintf(" (after it the first order is off by %s)", percent(e.Remaining, e.SigmaRemaining))
		}
		printWrapped(w, "  "+x+".", 4)
	}
	if r.Unexplained {
		printWrapped(w, "  "+fmt.Sprintf("no convention in the catalogue explains this (%d changes tried, alone and in pairs): check the formula itself, e.g. powers of gamma and v, factors (1 - v^2), combinations of the spins.", len(predict.Catalogue)), 4)
	}
}

func capitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// writeVerifyPoints prints the points of one observable.
func writeVerifyPoints(w io.Writer, r predict.Result) error {
	tw := newTable(w)
	tw.Header("eps", "numeric (error) or outcome", "yours", "residual (error)")
	for _, p := range r.Rows {
		if p.Status != "" {
			tw.Append(g6(p.Eps), p.Status, "", "")
			continue
		}
		tw.Append(g6(p.Eps), sigmaOrNA(p.Numeric, p.Error), g12(p.Yours), sigmaOrNA(p.Residual, p.Error))
	}
	fmt.Fprintf(w, "  points of %s (yours is your formula or table at the point, exact to rounding):\n", r.Observable)
	return tw.Render()
}

// csvText makes a text cell safe for numpy.genfromtxt, which does not
// honour CSV quoting: signatures lose their commas, other commas become
// semicolons.
func csvText(s string) string {
	s = strings.NewReplacer("(+,-,-,-)", "(+---)", "(-,+,+,+)", "(-+++)").Replace(s)
	return strings.ReplaceAll(s, ",", ";")
}

// verdictRow is one row of the verdict CSV.
type verdictRow struct {
	cfg *predict.Configuration
	r   *predict.Result
}

var verdictColumns = []csvColumn[verdictRow]{
	{"observable", func(v verdictRow) string { return v.r.Observable }},
	{"verdict", func(v verdictRow) string { return v.r.VerdictKey }},
	{"claimed_order", func(v verdictRow) string { return v.r.Claimed }},
	{"relative_error", func(v verdictRow) string { return g12(v.r.Relative) }},
	{"relative_error_sigma", func(v verdictRow) string { return g6(v.r.SigmaRelative) }},
	{"c1", func(v verdictRow) string { return g12(v.r.C1) }},
	{"c1_sigma", func(v verdictRow) string { return g6(v.r.SigmaC1) }},
	{"exponent", func(v verdictRow) string { return g12(v.r.Exponent) }},
	{"exponent_sigma", func(v verdictRow) string { return g6(v.r.SigmaExponent) }},
	{"c2", func(v verdictRow) string { return g12(v.r.C2) }},
	{"c2_sigma", func(v verdictRow) string { return g6(v.r.SigmaC2) }},
	{"own_c2", func(v verdictRow) string { return g12(v.r.OwnC2) }},
	{"own_c2_sigma", func(v verdictRow) string { return g6(v.r.SigmaOwnC2) }},
	{"relative_difference_at_given", func(v verdictRow) string { return g12(v.r.AtGiven) }},
	{"relative_difference_at_given_sigma", func(v verdictRow) string { return g6(v.r.SigmaAtGiven) }},
	{"unexplained", func(v verdictRow) string { return strconv.FormatBool(v.r.Unexplained) }},
	{"diagnosis", func(v verdictRow) string {
		var names []string
		for _, e := range v.r.Diagnosis {
			names = append(names, strings.Join(e.Names, " = "))
		}
		return csvText(strings.Join(names, "; "))
	}},
	{"note", func(v verdictRow) string { return csvText(v.r.Note) }},
}

// paramColumns prepends one column per parameter axis.
func paramColumns[T any](cfgs []predict.Configuration, cols []csvColumn[T], cfgOf func(T) *predict.Configuration) []csvColumn[T] {
	if len(cfgs) == 0 || len(cfgs[0].Axes) == 0 {
		return cols
	}
	var out []csvColumn[T]
	for k, name := range cfgs[0].Axes {
		k := k
		out = append(out, csvColumn[T]{name, func(v T) string { return g12(cfgOf(v).Params[k]) }})
	}
	return append(out, cols...)
}

func writeVerifyCSV(w io.Writer, res verifyResult) error {
	var rows []verdictRow
	for i := range res.cfgs {
		for j := range res.cfgs[i].Results {
			rows = append(rows, verdictRow{&res.cfgs[i], &res.cfgs[i].Results[j]})
		}
	}
	return writeCSV(w, paramColumns(res.cfgs, verdictColumns, func(v verdictRow) *predict.Configuration { return v.cfg }), rows)
}

// verifyPoint is one row of the points CSV.
type verifyPoint struct {
	cfg *predict.Configuration
	obs string
	p   predict.Row
}

var verifyPointColumns = []csvColumn[verifyPoint]{
	{"observable", func(v verifyPoint) string { return v.obs }},
	{"eps", func(v verifyPoint) string { return g12(v.p.Eps) }},
	{"status", func(v verifyPoint) string {
		if v.p.Status == "" {
			return "scattered"
		}
		return csvText(v.p.Status)
	}},
	{"numeric", func(v verifyPoint) string { return g12(v.p.Numeric) }},
	{"error", func(v verifyPoint) string { return g6(v.p.Error) }},
	{"prediction", func(v verifyPoint) string { return g12(v.p.Yours) }},
	{"first_order", func(v verifyPoint) string { return g12(v.p.First) }},
	{"residual", func(v verifyPoint) string { return g12(v.p.Residual) }},
	{"own_residual", func(v verifyPoint) string { return g12(v.p.Own) }},
}

func writeVerifyPointsCSV(w io.Writer, res verifyResult) error {
	var rows []verifyPoint
	for i := range res.cfgs {
		for _, r := range res.cfgs[i].Results {
			for _, p := range r.Rows {
				rows = append(rows, verifyPoint{&res.cfgs[i], r.Observable, p})
			}
		}
	}
	return writeCSV(w, paramColumns(res.cfgs, verifyPointColumns, func(v verifyPoint) *predict.Configuration { return v.cfg }), rows)
}

func writeVerifyJSON(w io.Writer, res verifyResult) error {
	s := res.scenario
	doc := map[string]any{
		"schema": verifySchemaID,
		"metadata": provenance(map[string]any{
			"prediction_from":     res.origin,
			"library_conventions": conventions(defaultConv),
			"your_conventions":    res.spec.Conventions.Describe(),
			"significance_sigma":  predict.Significance,
			"couplings":           s.CouplingGrid(),
			"couplings_note":      "|eps| of the short scan: the given coupling and successive halvings, exact by construction",
			"fit_note":            "residual = numeric - prediction; residual/eps = c1 + c2 eps + ... fitted by weighted least squares; *_sigma are standard uncertainties",
		}),
		"scenario":       s,
		"formulas":       res.formulas,
		"configurations": res.cfgs,
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(nanFree(doc))
}
