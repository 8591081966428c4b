package main

import (
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"ricochet/observables/scan"
)

// sliceNote labels a series of a multi-parameter scan with its parameter
// values ("" for a plain coupling scan).
func sliceNote(axes []string, params []float64) string {
	if len(axes) == 0 {
		return ""
	}
	return "; slice " + sliceLabel(axes, params)
}

func sliceLabel(axes []string, params []float64) string {
	var parts []string
	for k, a := range axes {
		parts = append(parts, fmt.Sprintf("%s = %.6g", a, params[k]))
	}
	return strings.Join(parts, ", ")
}

// writeTrendTable prints, for a multi-parameter scan, the next-order
// coefficient and the exponent of every slice with their uncertainties,
// and the expected formula with the pull where one was given.
func writeTrendTable(w io.Writer, res scanResult) error {
	for _, tr := range scan.Trends(res) {
		fmt.Fprintf(w, "\nnext-order coefficient lim residual/eps^2 of %s (model %s) against %s:\n", tr.Observable, tr.Model, strings.Join(tr.Axes, ", "))
		tw := newTable(w)
		head := append([]string(nil), tr.Axes...)
		showGamma := !slices.Contains(tr.Axes, "gamma")
		if showGamma {
			head = append(head, "gamma")
		}
		head = append(head, "next order", "exponent n")
		if tr.Expect != "" {
			head = append(head, "expected", "(fit - expected)/sigma")
		}
		tw.Header(head)
		for _, r := range tr.Rows {
			var row []string
			for _, x := range r.Params {
				row = append(row, fmt.Sprintf("%.6g", x))
			}
			if showGamma {
				row = append(row, fmt.Sprintf("%.6g", r.Gamma))
			}
			row = append(row, plainSigma(r.NextOrder, r.SigmaNextOrder), plainSigma(r.Exponent, r.SigmaExponent))
			if tr.Expect != "" {
				row = append(row, g12(r.Expected), fmt.Sprintf("%.2f", r.Pull))
			}
			tw.Append(row)
		}
		if err := tw.Render(); err != nil {
			return err
		}
		if tr.Expect != "" {
			fmt.Fprintf(w, "expected: %s\n", tr.Expect)
		}
	}
	return nil
}

// plotTrend draws the next-order coefficient against the first parameter
// axis with its error bars, one curve per observable, model and value of
// the further axes, and the expected formula where one was given.
func plotTrend(res scanResult, path string) error {
	trends := scan.Trends(res)
	if len(trends) == 0 {
		return fmt.Errorf("the scan has no parameter axis (add [[scan.axis]] tables to the scenario)")
	}
	p := newPanel()
	p.X.Tick.Marker, p.Y.Tick.Marker = mathTicks{linearTicks{}}, mathTicks{linearTicks{}}
	p.Add(plotter.NewGrid())
	leg := newLegend()
	k := 0
	xMin, xMax, yMin, yMax := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, tr := range trends {
		// Group the rows by the values of the further axes.
		groups := map[string][]scan.TrendRow{}
		var order []string
		for _, r := range tr.Rows {
			key := ""
			if len(tr.Axes) > 1 {
				key = sliceLabel(tr.Axes[1:], r.Params[1:])
			}
			if _, ok := groups[key]; !ok {
				order = append(order, key)
			}
			groups[key] = append(groups[key], r)
		}
		for _, key := range order {
			col := palette[k%len(palette)]
			var xy plotter.XYs
			var errs plotter.YErrors
			rows := groups[key]
			maxSig := 0.0
			for _, r := range rows {
				if !math.IsNaN(r.NextOrder) {
					xy = append(xy, plotter.XY{X: r.Params[0], Y: r.NextOrder})
					errs = append(errs, struct{ Low, High float64 }{r.SigmaNextOrder, r.SigmaNextOrder})
					maxSig = math.Max(maxSig, r.SigmaNextOrder)
					xMin, xMax = math.Min(xMin, r.Params[0]), math.Max(xMax, r.Params[0])
					yMin, yMax = math.Min(yMin, r.NextOrder-r.SigmaNextOrder), math.Max(yMax, r.NextOrder+r.SigmaNextOrder)
				}
			}
			exp := expectedCurve(res, tr, rows)
			label := texObsLabel(tr.Observable)
			if len(res.Spread) > 0 || len(trends) > 1 {
				label += " (" + tr.Model + ")"
			}
			if key != "" {
				label += ", " + key
			}
			if len(xy) > 0 {
				sc, eb, err := markersWithErrors(xy, errs, col, k, false)
				if err != nil {
					return err
				}
				p.Add(eb, sc)
				leg.add(fmt.Sprintf("%s: fitted limit ± σ (largest σ %s)", label, scriptSci(maxSig)), sc)
			}
			if len(exp) > 1 {
				ln, err := plotter.NewLine(exp)
				if err != nil {
					return err
				}
				ln.LineStyle.Color = col
				ln.LineStyle.Dashes = []vg.Length{vg.Points(5), vg.Points(3)}
				p.Add(ln)
				leg.add(label+": "+tr.Expect, ln)
			}
			k++
		}
	}
	if math.IsInf(xMin, 0) {
		return fmt.Errorf("no slice with a next-order coefficient to draw")
	}
	// Room around the data (the legend is in its own strip above).
	dx, dy := 0.05*(xMax-xMin), 0.08*(yMax-yMin)
	if dy == 0 {
		dy = 0.1 * math.Abs(yMax)
	}
	p.X.Min, p.X.Max = xMin-dx, xMax+dx
	p.Y.Min, p.Y.Max = yMin-dy, yMax+dy
	addConventions(leg, res)
	return saveFigure(path, columnWidth, leg.height()+2.6*vg.Inch, func(c draw.Canvas) {
		panelStack(c, []*legendStrip{leg}, []panel{{p, "limit ε → 0 of residual/ε^{2}", 1}}, res.Axes[0])
	})
}

// expectedCurve samples the expected formula finely along the first axis
// between the rows' first and last values, the further axes and the
// kinematics as in the first row (gamma and v follow each other when the
// axis is one of them).
func expectedCurve(res scanResult, tr scan.Trend, rows []scan.TrendRow) plotter.XYs {
	if res.Expect == nil || len(rows) < 2 {
		return nil
	}
	r0 := rows[0]
	lo, hi := r0.Params[0], rows[len(rows)-1].Params[0]
	vars := map[string]float64{"gamma": r0.Gamma, "v": r0.V, "b": res.Scenario.Kinematics.B}
	for i, a := range tr.Axes {
		vars[a] = r0.Params[i]
	}
	var out plotter.XYs
	const n = 200
	for i := 0; i <= n; i++ {
		x := lo + (hi-lo)*float64(i)/n
		vars[tr.Axes[0]] = x
		switch tr.Axes[0] {
		case "gamma":
			vars["v"] = math.Sqrt((x-1)*(x+1)) / x
		case "v":
			vars["gamma"] = 1 / math.Sqrt((1-x)*(1+x))
		}
		if y, err := res.Expect.Eval(vars); err == nil && !math.IsNaN(y) && !math.IsInf(y, 0) {
			out = append(out, plotter.XY{X: x, Y: y})
		}
	}
	return out
}
