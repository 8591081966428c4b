package main

import (
	"fmt"
	"io"
	"math"
	"strings"

	"ricochet/observables/numfmt"
)

// texEscape escapes text for LaTeX.
func texEscape(s string) string {
	r := strings.NewReplacer(`\`, `\textbackslash{}`, "_", `\_`, "%", `\%`, "&", `\&`, "#", `\#`, "$", `\$`, "{", `\{`, "}", `\}`, "^", `\^{}`, "~", `\~{}`)
	return r.Replace(s)
}

// texConventions renders the conventions as caption text.
func texConventions(res scanResult) string {
	c := res.Conv
	units := "Gaussian units"
	if c.Units.String() != "gaussian" {
		units = "Heaviside--Lorentz units ($q_{\\mathrm{HL}} = \\sqrt{4\\pi}\\,q_{\\mathrm{G}}$)"
	}
	sig := "signature $(-,+,+,+)$"
	if c.Signature.String() == "+---" {
		sig = "signature $(+,-,-,-)$ (contravariant components as printed are signature independent)"
	}
	imp := map[string]string{"covariant": "covariant impact parameter $b$", "j": "impact parameter $b_J = |J|/|\\vec p_{\\mathrm{in}}|$", "eikonal": "eikonal impact parameter $b_{\\mathrm{eik}}$"}[c.Impact.String()]
	cpl := "$\\epsilon = |(q - ig)(Q + iP)|/(m b)$"
	if res.Scenario.Background.Curved() {
		cpl = "$\\epsilon = |M + iN|/b$"
	}
	return fmt.Sprintf("$G = c = 1$, %s, %s, %s, $\\epsilon_{0123} = +1$; coupling %s", units, sig, imp, cpl)
}

// texObservable renders an observable name in math.
func texObservable(name string) string {
	sub := func(c byte) string {
		if c == 't' {
			return "t"
		}
		return `\hat{` + string(c) + `}`
	}
	switch {
	case strings.HasPrefix(name, "dS_"):
		return `\Delta S^{` + sub(name[3]) + sub(name[4]) + `}`
	case strings.HasPrefix(name, "da_"):
		return `\Delta a_{` + sub(name[3]) + `}`
	}
	return `\Delta p_{` + sub(name[3]) + `}`
}

// latexRowsPerTable is the most rows one table holds; a longer scan
// continues in further tables ("continued"), so that every float with its
// caption fits a page (measured: 40 rows of \small lines and a caption
// overflow the 550 pt text height of the standard article class by 44 pt;
// 30 rows of \footnotesize leave room for a long caption).
const latexRowsPerTable = 30

// latexColumn is one decimal-aligned column of a scan table: its header
// and the cells of its rows in LaTeX math.
type latexColumn struct {
	head  string
	cells []string
}

// spec returns the dcolumn specification D{.}{.}{l.r} with l and r the
// widths, in digits, of the parts before and after the decimal point of
// the widest cells (a minus sign and the ×10^{e} factor counted by their
// printed widths), so that the column is as wide as its numbers rather
// than twice its longest fraction (as the symmetric D{.}{.}{-1} is).
func (c latexColumn) spec() string {
	l, r := 1, 0
	for _, s := range c.cells {
		a, b := texWidths(s)
		l, r = max(l, a), max(r, b)
	}
	return fmt.Sprintf("D{.}{.}{%d.%d}", l, r)
}

// texWidths estimates the printed widths, in digits, of a number in
// LaTeX math before and after its decimal point.
func texWidths(s string) (int, int) {
	lead, frac, ok := strings.Cut(s, ".")
	if !ok {
		lead, frac = s, ""
	}
	var width func(t string) float64
	width = func(t string) float64 {
		w := 0.0
		if m, e, ok := strings.Cut(t, `\times10^{`); ok {
			// "×10" with the medium spaces around × counts as four
			// digits: with each part rounded up to whole digits no cell
			// overflows its column (TestLaTeX compiles the tables and
			// reads the log), and 4.7 would widen the widest table by
			// 7 pt past the article column. The exponent is set in
			// script size (0.7).
			return width(m) + 4 + 0.7*width(strings.TrimSuffix(e, "}"))
		}
		for _, c := range t {
			switch c {
			case '-':
				w += 1.4 // a math minus is wider than a digit
			default:
				w++
			}
		}
		return w
	}
	return int(math.Ceil(width(lead))), int(math.Ceil(width(frac)))
}

// writeScanLaTeX writes the scan as booktabs tables with decimal-aligned
// columns (dcolumn, part of the LaTeX "tools" bundle): one table per
// series (observable, model and slice), each with ε, the numeric value
// with its uncertainty in the concise notation, the first order and
// residual/ε² with uncertainty, and a caption with the set-up, the fits
// and the conventions. One series per table keeps every table within a
// portrait text block, for any number of observables; scans of more than
// latexRowsPerTable points continue in further tables.
func writeScanLaTeX(w io.Writer, res scanResult, document bool) error {
	if document {
		fmt.Fprint(w, "\\documentclass{article}\n\\usepackage[T1]{fontenc}\n\\usepackage{amsmath}\n\\usepackage{booktabs}\n\\usepackage{dcolumn}\n\\usepackage[a4paper,margin=2.5cm]{geometry}\n\\begin{document}\n")
	} else {
		fmt.Fprint(w, "% ricochet scan tables; need \\usepackage{amsmath,booktabs,dcolumn}; each fits the 345 pt column of a standard article (tested for the built-in scenarios)\n")
	}
	fmt.Fprintf(w, "%% %s, revision %s\n", versionString(), vcsRevision())
	first := texLabel(res, 0)
	for i := range res.Series {
		writeSeriesLaTeX(w, res, i, first)
	}
	if document {
		fmt.Fprint(w, "\\end{document}\n")
	}
	return nil
}

// texLabel is the \label of the first table of series i.
func texLabel(res scanResult, i int) string {
	return fmt.Sprintf("tab:ricochet-%s-%d", strings.ReplaceAll(res.Scenario.Name, "_", "-"), i+1)
}

// writeSeriesLaTeX writes the table(s) of series i; the first series'
// caption states the conventions, the others refer to it.
func writeSeriesLaTeX(w io.Writer, res scanResult, i int, firstLabel string) {
	sr := res.Series[i]
	var eps, num, fo, ratio latexColumn
	eps.head, num.head, fo.head, ratio.head = `$\epsilon$`, "numeric", "first order", `$(\text{num.} - \text{first})/\epsilon^2$`
	var status []string
	for _, p := range sr.Points {
		eps.cells = append(eps.cells, numfmt.LaTeXDigits(p.Eps, 4))
		if !p.OK() {
			status = append(status, texEscape(p.Status))
			num.cells, fo.cells, ratio.cells = append(num.cells, ""), append(fo.cells, ""), append(ratio.cells, "")
			continue
		}
		sig := p.Sigma()
		if math.IsNaN(p.First) {
			// The first-order formula does not apply here: the numeric
			// value only, and the reason in the status column.
			status = append(status, "first order n/a")
			num.cells = append(num.cells, numfmt.Split(p.Numeric, sig, 1).LaTeX())
			fo.cells, ratio.cells = append(fo.cells, ""), append(ratio.cells, "")
			continue
		}
		status = append(status, "")
		num.cells = append(num.cells, numfmt.Split(p.Numeric, sig, 1).LaTeX())
		fo.cells = append(fo.cells, numfmt.LaTeXDigits(p.First, 10))
		// residual/ε² is O(1): positional notation down to 10⁻², which
		// drops a ×10⁻¹ factor five digits wide.
		ratio.cells = append(ratio.cells, numfmt.Split(p.Ratio, sig/(p.Eps*p.Eps), 1).Positional(-2, 3).LaTeX())
	}
	cols := []latexColumn{eps, num, fo, ratio}
	var spec strings.Builder
	for _, c := range cols {
		spec.WriteString(c.spec())
	}
	n := len(sr.Points)
	parts := (n + latexRowsPerTable - 1) / latexRowsPerTable
	for part := 0; part < parts; part++ {
		lo, hi := part*latexRowsPerTable, min(n, (part+1)*latexRowsPerTable)
		// \footnotesize and \tabcolsep 4 pt (6 pt by default) keep the
		// four columns of 12–14 digit numbers within the 345 pt of a
		// standard article column (measured: 390 pt in \small).
		fmt.Fprint(w, "\\begin{table}\n\\centering\n\\footnotesize\n\\setlength{\\tabcolsep}{4pt}\n")
		fmt.Fprintf(w, "\\begin{tabular}{@{}%s@{}}\n\\toprule\n", spec.String())
		fmt.Fprintf(w, "\\multicolumn{1}{c}{} & \\multicolumn{3}{c}{$%s$} \\\\\n\\cmidrule(l){2-4}\n", texObservable(sr.Observable))
		for k, c := range cols {
			if k > 0 {
				fmt.Fprint(w, " & ")
			}
			fmt.Fprintf(w, "\\multicolumn{1}{c}{%s}", c.head)
		}
		fmt.Fprint(w, " \\\\\n\\midrule\n")
		for k := lo; k < hi; k++ {
			if status[k] != "" {
				fmt.Fprintf(w, "%s & \\multicolumn{3}{c}{%s} \\\\\n", eps.cells[k], status[k])
				continue
			}
			fmt.Fprintf(w, "%s & %s & %s & %s \\\\\n", eps.cells[k], num.cells[k], fo.cells[k], ratio.cells[k])
		}
		fmt.Fprint(w, "\\bottomrule\n\\end{tabular}\n")
		label := texLabel(res, i)
		if part > 0 {
			fmt.Fprintf(w, "\\caption{$%s$ (%s), continued from Table~\\ref{%s}.}\n\\end{table}\n", texObservable(sr.Observable), texEscape(sr.Model), label)
			continue
		}
		fmt.Fprintf(w, "\\caption{%s}\n\\label{%s}\n\\end{table}\n", seriesCaption(res, i, firstLabel), label)
	}
}

// seriesCaption is the caption of series i: set-up, error bars, fits,
// the model spread of its observable (after the last completion), and the
// conventions (in full in the first table only).
func seriesCaption(res scanResult, i int, firstLabel string) string {
	s, sr := res.Scenario, res.Series[i]
	k := sr.Scenario.Kinematics
	var cap strings.Builder
	fmt.Fprintf(&cap, "$%s$, model %s: coupling scan %s, %s probe past a %s source, $\\gamma = %.6g$", texObservable(sr.Observable), texEscape(sr.Model), texEscape(s.Name), texEscape(s.Probe.Kind), texEscape(s.Background.Kind), k.Gamma)
	if len(res.Axes) > 0 {
		fmt.Fprintf(&cap, ", slice %s", texEscape(sliceLabel(res.Axes, sr.Params)))
	}
	cap.WriteString(". Numeric values carry the numerical error estimate (tolerance and start/stop radius variation) in units of the last digit. ")
	f := sr.Fits
	if e := f.Exponent; e != nil {
		fmt.Fprintf(&cap, "$|\\text{residual}| \\propto \\epsilon^{n}$ with $n = %s$ for $%s \\le \\epsilon \\le %s$ ($\\chi^2/\\text{dof} = %s$); ",
			numfmt.Split(e.N, e.SigmaN, 2).LaTeX(), numfmt.LaTeXDigits(e.EpsLo, 3), numfmt.LaTeXDigits(e.EpsHi, 3), texChi2(e.Quality.ReducedChi2()))
	}
	if n := f.NextOrder; n != nil {
		fmt.Fprintf(&cap, "$\\lim_{\\epsilon\\to0} \\text{residual}/\\epsilon^2 = %s$ ($\\chi^2/\\text{dof} = %s$). ", numfmt.Split(n.C2, n.SigmaC2, 2).LaTeX(), texChi2(n.Quality.ReducedChi2()))
	}
	if sf := f.Second; sf != nil {
		fmt.Fprintf(&cap, "Direct second order (iterated straight-line quadrature): $%s$. ", numfmt.Split(sf.Direct, sf.SigmaDirect, 2).LaTeX())
	}
	for _, sp := range res.Spread {
		last := sp.Members[len(sp.Members)-1].Model
		if sp.Observable != sr.Observable || last != sr.Model || math.IsNaN(sp.Spread) || !sameParams(sp.Params, sr.Params) {
			continue
		}
		fmt.Fprintf(&cap, "Model spread of $%s$ (max $-$ min of the next-order coefficient over the completions %s, each against its own first order): $%s$. ",
			texObservable(sp.Observable), texEscape(strings.Join(spreadModels(sp), ", ")), numfmt.Split(sp.Spread, sp.SigmaSpread, 2).LaTeX())
	}
	if i == 0 {
		fmt.Fprintf(&cap, "Conventions: %s.", texConventions(res))
	} else {
		fmt.Fprintf(&cap, "Conventions as in Table~\\ref{%s}.", firstLabel)
	}
	return cap.String()
}

// texChi2 renders χ²/dof with three significant digits.
func texChi2(x float64) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return `\mathrm{n/a}`
	}
	return numfmt.LaTeXDigits(x, 3)
}

func sameParams(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for k := range a {
		if a[k] != b[k] {
			return false
		}
	}
	return true
}

func spreadModels(sp spreadSummary) []string {
	var out []string
	for _, m := range sp.Members {
		out = append(out, m.Model)
	}
	return out
}
