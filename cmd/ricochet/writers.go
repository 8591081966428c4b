package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"runtime/debug"
	"strconv"
	"strings"
	"time"

	"ricochet/observables/fit"
	"ricochet/observables/numfmt"
	"ricochet/observables/scan"
	"ricochet/observables/scenario"
)

// g6 and g12 render a number for CSV and tables with 6 or 12 digits
// after the point; a non-number (an outcome without it, a formula that
// does not apply) is the empty cell.
func g6(x float64) string  { return fmtNum(x, 6) }
func g12(x float64) string { return fmtNum(x, 12) }

func fmtNum(x float64, digits int) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return ""
	}
	return strconv.FormatFloat(x, 'e', digits, 64)
}

// na renders an empty cell of a terminal table as "n/a".
func na(s string) string {
	if s == "" {
		return "n/a"
	}
	return s
}

// vcsRevision returns the VCS revision of the build (and "+dirty" when
// the tree was modified), or "unknown".
func vcsRevision() string {
	rev, dirty := "unknown", false
	if info, ok := debug.ReadBuildInfo(); ok {
		for _, s := range info.Settings {
			switch s.Key {
			case "vcs.revision":
				rev = s.Value
			case "vcs.modified":
				dirty = s.Value == "true"
			}
		}
	}
	if dirty {
		rev += "+dirty"
	}
	return rev
}

// nowUTC is the date written into JSON metadata (replaced in tests).
var nowUTC = func() time.Time { return time.Now().UTC() }

func writeScan(w io.Writer, res scanResult, format string) error {
	switch format {
	case "json":
		return writeScanJSON(w, res)
	case "csv":
		return writeScanCSV(w, res)
	case "csv-fits":
		return writeScanFitsCSV(w, res)
	case "latex":
		return writeScanLaTeX(w, res, false)
	case "latex-doc":
		return writeScanLaTeX(w, res, true)
	}
	if err := writeScanTable(w, res); err != nil {
		return err
	}
	return writeTrendTable(w, res)
}

// provenance adds to a JSON document's metadata the keys every document
// carries: the program, its version and revision, and the UTC date.
func provenance(m map[string]any) map[string]any {
	m["program"] = "ricochet"
	m["version"] = version
	m["vcs_revision"] = vcsRevision()
	m["date"] = nowUTC().Format(time.RFC3339)
	return m
}

func writeScanJSON(w io.Writer, res scanResult) error {
	s := res.Scenario
	set := s.Settings()
	doc := map[string]any{
		"schema": scanSchemaID,
		"metadata": provenance(map[string]any{
			"scenario_given": res.Given,
			"conventions":    conventions(res.Conv),
			"convention_switches": map[string]string{
				"signature": res.Conv.Signature.String(), "units": res.Conv.Units.String(),
				"impact": res.Conv.Impact.String(), "spin": res.Conv.Spin.String(),
			},
			"tolerances": map[string]any{
				"integrator_tol":      tolOrDefault(set.Tol),
				"radius_over_b":       s.Numerics.Radius,
				"radius_note":         "0 means automatic: R/b = 1e3 max(1, theta_1) per point",
				"method":              methodName(s.Numerics.Method),
				"error_estimate_note": errorBarNote,
			},
			"observable_note": observableNote,
		}),
		"scenario": s,
		"series":   res.Series,
	}
	doc["warnings"] = warningsOrEmpty(res.Warnings)
	if len(res.Axes) > 0 {
		doc["axes"] = res.Axes
		doc["next_order_by_slice"] = scan.Trends(res)
	}
	if len(res.Spread) > 0 {
		doc["spread"] = res.Spread
		doc["spread_note"] = res.Scenario.SpreadNote()
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(nanFree(doc))
}

// observableNote says what the observable names of a series mean.
const observableNote = "dp_X, da_X: the X component of the impulse p_out - p_in and of the spin kick a_out - a_in along the frame of record (t; l incoming direction, b impact direction from source to probe, n = l x b), contravariant; dS_XY: the XY component of the spin-tensor kick"

func tolOrDefault(t float64) float64 {
	if t == 0 {
		return 1e-13
	}
	return t
}

func methodName(m string) string {
	if m == "" {
		return scenario.MethodDormandPrince8
	}
	return strings.ToLower(m)
}

// csvComments adds the conventions and provenance as '#' lines before the
// header of CSV output (off by default: a clean CSV starts with its header
// row, the form numpy.genfromtxt(names=True) and pandas read; the same
// metadata are in --format json).
var csvComments bool

// writeCSVComments writes the metadata lines of CSV output when asked.
func writeCSVComments(w io.Writer, res scanResult) {
	if !csvComments {
		return
	}
	for _, c := range conventions(res.Conv) {
		fmt.Fprintf(w, "# %s\n", c)
	}
	fmt.Fprintf(w, "# %s; scenario: %s\n", versionString(), res.Scenario.Name)
	fmt.Fprintf(w, "# column error: %s\n", errorBarNote)
	for _, warn := range res.Warnings {
		fmt.Fprintf(w, "# warning: %s\n", warn)
	}
	for _, sp := range res.Spread {
		fmt.Fprintf(w, "# model spread of %s: ", sp.Observable)
		for _, m := range sp.Members {
			fmt.Fprintf(w, "%s (%s) n = %s, next order = %s; ", m.Model, memberKind(m.Canonical), plainSigma(m.Exponent, m.SigmaExponent), plainSigma(m.NextOrder, m.SigmaNextOrder))
		}
		fmt.Fprintf(w, "spread (max - min of next order) = %s\n", plainSigma(sp.Spread, sp.SigmaSpread))
	}
	if len(res.Spread) > 0 {
		fmt.Fprintf(w, "# %s\n", res.Scenario.SpreadNote())
	}
}

// csvColumn is one column of a CSV writer: its header and how a row fills
// it. New columns are added by appending to the tables below.
type csvColumn[T any] struct {
	name string
	cell func(T) string
}

// writeCSV writes a header row and one row per item.
func writeCSV[T any](w io.Writer, cols []csvColumn[T], items []T) error {
	cw := csv.NewWriter(w)
	head := make([]string, len(cols))
	for i, c := range cols {
		head[i] = c.name
	}
	cw.Write(head)
	for _, it := range items {
		row := make([]string, len(cols))
		for i, c := range cols {
			row[i] = c.cell(it)
		}
		cw.Write(row)
	}
	cw.Flush()
	return cw.Error()
}

// seriesPoint is one row of the point CSV.
type seriesPoint struct {
	sr *series
	p  scanPoint
}

var pointColumns = []csvColumn[seriesPoint]{
	{"model", func(r seriesPoint) string { return r.sr.Model }},
	{"observable", func(r seriesPoint) string { return r.sr.Observable }},
	{"eps", func(r seriesPoint) string { return g12(r.p.Eps) }},
	{"status", func(r seriesPoint) string { return r.p.Status }},
	{"numeric", func(r seriesPoint) string { return g12(r.p.Numeric) }},
	{"first_order", func(r seriesPoint) string { return g12(r.p.First) }},
	{"residual", func(r seriesPoint) string { return g12(r.p.Residual) }},
	{"residual_over_eps2", func(r seriesPoint) string { return g12(r.p.Ratio) }},
	{"error", func(r seriesPoint) string { return g6(r.p.Err) }},
	{"error_tolerance", func(r seriesPoint) string { return g6(r.p.TolErr) }},
	{"error_truncation", func(r seriesPoint) string { return g6(r.p.TruncErr) }},
	{"max_drift", func(r seriesPoint) string { return g6(r.p.Drift) }},
	{"rhs_evaluations", func(r seriesPoint) string { return strconv.Itoa(r.p.Evals) }},
	{"second_order", func(r seriesPoint) string { return g12(r.p.Second) }},
	{"second_order_error", func(r seriesPoint) string { return g6(r.p.SecondErr) }},
	{"residual_after_second", func(r seriesPoint) string { return g12(r.p.Residual2) }},
}

func writeScanCSV(w io.Writer, res scanResult) error {
	writeCSVComments(w, res)
	var rows []seriesPoint
	for i := range res.Series {
		for _, p := range res.Series[i].Points {
			rows = append(rows, seriesPoint{&res.Series[i], p})
		}
	}
	// Multi-parameter scans: one column per parameter axis, at the end.
	cols := pointColumns
	for k, name := range res.Axes {
		k := k
		cols = append(cols[:len(cols):len(cols)], csvColumn[seriesPoint]{name, func(r seriesPoint) string { return g12(r.sr.Params[k]) }})
	}
	return writeCSV(w, cols, rows)
}

// fitCell renders a field of a fit that may be absent.
func fitCell[R any](r *R, f func(*R) float64) string {
	if r == nil {
		return ""
	}
	return g12(f(r))
}

var fitColumns = []csvColumn[*series]{
	{"model", func(s *series) string { return s.Model }},
	{"observable", func(s *series) string { return s.Observable }},
	{"exponent", func(s *series) string {
		return fitCell(s.Fits.Exponent, func(e *fit.ExponentResult) float64 { return e.N })
	}},
	{"exponent_sigma", func(s *series) string {
		return fitCell(s.Fits.Exponent, func(e *fit.ExponentResult) float64 { return e.SigmaN })
	}},
	{"exponent_chi2_dof", func(s *series) string {
		return fitCell(s.Fits.Exponent, func(e *fit.ExponentResult) float64 { return e.ReducedChi2() })
	}},
	{"exponent_eps_lo", func(s *series) string {
		return fitCell(s.Fits.Exponent, func(e *fit.ExponentResult) float64 { return e.EpsLo })
	}},
	{"exponent_eps_hi", func(s *series) string {
		return fitCell(s.Fits.Exponent, func(e *fit.ExponentResult) float64 { return e.EpsHi })
	}},
	{"next_order", func(s *series) string {
		return fitCell(s.Fits.NextOrder, func(n *fit.NextOrderResult) float64 { return n.C2 })
	}},
	{"next_order_sigma", func(s *series) string {
		return fitCell(s.Fits.NextOrder, func(n *fit.NextOrderResult) float64 { return n.SigmaC2 })
	}},
	{"slope_after", func(s *series) string {
		return fitCell(s.Fits.NextOrder, func(n *fit.NextOrderResult) float64 { return n.C3 })
	}},
	{"slope_after_sigma", func(s *series) string {
		return fitCell(s.Fits.NextOrder, func(n *fit.NextOrderResult) float64 { return n.SigmaC3 })
	}},
	{"next_order_chi2_dof", func(s *series) string {
		return fitCell(s.Fits.NextOrder, func(n *fit.NextOrderResult) float64 { return n.ReducedChi2() })
	}},
	{"next_order_eps_hi", func(s *series) string {
		return fitCell(s.Fits.NextOrder, func(n *fit.NextOrderResult) float64 { return n.EpsHi })
	}},
}

// writeScanFitsCSV writes one row per series with its fitted numbers.
func writeScanFitsCSV(w io.Writer, res scanResult) error {
	writeCSVComments(w, res)
	rows := make([]*series, len(res.Series))
	for i := range res.Series {
		rows[i] = &res.Series[i]
	}
	return writeCSV(w, fitColumns, rows)
}

func writeScanTable(w io.Writer, res scanResult) error {
	s := res.Scenario
	fmt.Fprintf(w, "ricochet scan: %s\n", s.Name)
	for _, c := range conventions(res.Conv) {
		fmt.Fprintf(w, "# %s\n", c)
	}
	fmt.Fprintf(w, "# column error: %s; err(tol) and err(trunc) are the tolerance and truncation terms of the event, as norms over all components of (dp, da), so one component's error can be below them\n", errorBarNote)
	for _, warn := range res.Warnings {
		fmt.Fprintf(w, "warning: %s\n", warn)
	}
	for _, sr := range res.Series {
		k := sr.Scenario.Kinematics // of the series' slice of a multi-parameter scan
		fmt.Fprintf(w, "\nobservable %s; model %s, source %s; gamma = %.6g, b = %g%s\n", sr.Observable, sr.Model, s.Background.Kind, k.Gamma, k.B, sliceNote(res.Axes, sr.Params))
		tw := newTable(w)
		tw.Header("eps", "numeric", "first order", "residual", "residual/eps^2", "second order", "resid. after 2nd", "error", "err(tol)", "err(trunc)", "drift", "status")
		for _, p := range sr.Points {
			if !p.OK() {
				tw.Append(g6(p.Eps), "", "", "", "", "", "", "", "", "", "", p.Status)
				continue
			}
			tw.Append(g6(p.Eps), na(g12(p.Numeric)), na(g12(p.First)), na(g6(p.Residual)), na(g6(p.Ratio)), na(g12(p.Second)), na(g6(p.Residual2)), fmtErr(p.Err), fmtErr(p.TolErr), fmtErr(p.TruncErr), fmtErr(p.Drift), p.Status)
		}
		if err := tw.Render(); err != nil {
			return err
		}
		writeFits(w, sr.Fits)
	}
	return writeSpreadTable(w, res)
}

// memberKind labels a spread member.
func memberKind(canonical bool) string {
	if canonical {
		return "canonical"
	}
	return "non-canonical"
}

// plainSigma prints x with its uncertainty, or n/a.
func plainSigma(x, sig float64) string {
	if math.IsNaN(x) {
		return "n/a"
	}
	if !(sig > 0) {
		return g6(x)
	}
	return numfmt.Split(x, sig, 2).Plain()
}

// writeSpreadTable prints the completions side by side for each
// observable of a --spread scan.
func writeSpreadTable(w io.Writer, res scanResult) error {
	for _, sp := range res.Spread {
		fmt.Fprintf(w, "\nmodel spread of %s (each member against its own first order):\n", sp.Observable)
		tw := newTable(w)
		tw.Header("model", "member", "exponent n", "next order lim residual/eps^2")
		for _, m := range sp.Members {
			tw.Append(m.Model, memberKind(m.Canonical), plainSigma(m.Exponent, m.SigmaExponent), plainSigma(m.NextOrder, m.SigmaNextOrder))
		}
		if err := tw.Render(); err != nil {
			return err
		}
		fmt.Fprintf(w, "spread (max - min of the next-order coefficient over the completions) = %s\n", plainSigma(sp.Spread, sp.SigmaSpread))
	}
	if len(res.Spread) > 0 {
		fmt.Fprintf(w, "%s\n", res.Scenario.SpreadNote())
	}
	return nil
}

// writeFits prints the fit summary below a table: each fitted number with
// the quality of its fit (χ²/dof of the model of largest weight) and a
// warning when that model does not describe the points within their errors.
func writeFits(w io.Writer, f scanFits) {
	if e := f.Exponent; e != nil {
		fmt.Fprintf(w, "residual scaling exponent n = %s (|residual| ~ A eps^n (1 + d1 eps + ...), %d correction terms, Akaike-weighted; window eps in [%.3g, %.3g], %d points; %s)\n",
			numfmt.Split(e.N, e.SigmaN, 2).Plain(), e.Corrections, e.EpsLo, e.EpsHi, e.Used, fitQuality(e.Quality))
		warnPoor(w, "exponent", e.Quality)
	} else {
		fmt.Fprintf(w, "residual scaling exponent: not determined (%s)\n", f.ExponentErr)
	}
	if n := f.NextOrder; n != nil {
		fmt.Fprintf(w, "next-order coefficient lim residual/eps^2 = %s (polynomial in eps, degree %d of largest Akaike weight; window eps <= %.3g, %d of %d points; %s)\n",
			numfmt.Split(n.C2, n.SigmaC2, 2).Plain(), n.Degree, n.EpsHi, n.Used, n.Total, fitQuality(n.Quality))
		if !math.IsNaN(n.C3) {
			fmt.Fprintf(w, "order after it d(residual/eps^2)/d eps at 0 = %s (same fit)\n", numfmt.Split(n.C3, n.SigmaC3, 2).Plain())
		}
		warnPoor(w, "next-order", n.Quality)
	} else {
		fmt.Fprintf(w, "next-order coefficient: not determined (%s)\n", f.NextErr)
	}
	writeSecondFits(w, f)
	for _, b := range f.Breakdown {
		if b.Found {
			fmt.Fprintf(w, "|residual|/|first order| reaches %g %% at eps = %s\n", 100*b.Threshold, numfmt.Split(b.Eps, b.SigmaEps, 2).Plain())
		} else {
			fmt.Fprintf(w, "|residual|/|first order| does not cross %g %% within the scan\n", 100*b.Threshold)
		}
	}
}

// fitQuality renders χ²/dof and, when applied, the inflation of the
// uncertainties.
func fitQuality(q fit.Quality) string {
	s := fmt.Sprintf("chi2/dof = %.3g with %d dof", q.ReducedChi2(), q.DOF)
	if q.Inflation > 1 {
		s += fmt.Sprintf(", uncertainties widened x%.3g", q.Inflation)
	}
	return s
}

// warnPoor says when a fit is poor.
func warnPoor(w io.Writer, what string, q fit.Quality) {
	if q.Poor() {
		fmt.Fprintf(w, "warning: poor %s fit (chi2/dof = %.3g, p = %.1e): the points scatter beyond their error bars; the uncertainty includes the widening by sqrt(chi2/dof) of the most flexible model\n", what, q.ReducedChi2(), q.PValue)
	}
}

// writeSecondFits prints the comparison with the direct second order.
func writeSecondFits(w io.Writer, f scanFits) {
	sf := f.Second
	if sf == nil {
		fmt.Fprintf(w, "second order: not available (model without coupling derivatives, or a non-covariant impact parameter)\n")
		return
	}
	fmt.Fprintf(w, "second order, direct (iterated straight-line quadrature): (second - first)/eps^2 = %s", plainSigma(sf.Direct, sf.SigmaDirect))
	if n := f.NextOrder; n != nil {
		fmt.Fprintf(w, "; scan-extrapolated %s; difference %.2f sigma", plainSigma(n.C2, n.SigmaC2), sf.Sigmas)
	}
	fmt.Fprintln(w)
	if e := sf.Exponent; e != nil {
		fmt.Fprintf(w, "residual after second order: exponent n = %s (window eps in [%.3g, %.3g], %d points)\n",
			numfmt.Split(e.N, e.SigmaN, 2).Plain(), e.EpsLo, e.EpsHi, e.Used)
	} else {
		fmt.Fprintf(w, "residual after second order: exponent not determined (%s)\n", sf.ExponentErr)
	}
}
