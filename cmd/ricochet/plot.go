package main

import (
	"fmt"
	"image/color"
	"math"
	"path/filepath"
	"slices"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"ricochet/observables/numfmt"
)

// checkPlotExt checks that a figure file name given to --flag has a
// supported extension.
func checkPlotExt(flag, path string) error {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".png", ".svg", ".pdf", ".eps":
		return nil
	}
	return badf("--%s = %q; allowed extensions: .png, .svg, .pdf, .eps", flag, path)
}

// palette holds distinguishable colours (Okabe & Ito 2008 colour-blind
// safe set, from memory).
var palette = []color.Color{
	color.RGBA{0, 114, 178, 255},   // blue
	color.RGBA{213, 94, 0, 255},    // vermillion
	color.RGBA{0, 158, 115, 255},   // bluish green
	color.RGBA{204, 121, 167, 255}, // reddish purple
	color.RGBA{230, 159, 0, 255},   // orange
	color.RGBA{86, 180, 233, 255},  // sky blue
}

// epsLabel is the axis label of the coupling in the scan's conventions.
func epsLabel(res scanResult) string {
	b := map[string]string{"covariant": "b", "j": "b_{J}", "eikonal": "b_{eik}"}[res.Conv.Impact.String()]
	if res.Scenario.Background.Curved() {
		return "ε = |M + iN| / " + b
	}
	return "ε = |(q − ig)(Q + iP)| / (m " + b + ")"
}

// addConventions ends a figure's legend with its conventions (two
// lines, to keep within the column).
func addConventions(leg *legendStrip, res scanResult) {
	u := "G = c = 1"
	if !res.Scenario.Background.Curved() {
		if res.Conv.Units.String() == "gaussian" {
			u += ", Gaussian units"
		} else {
			u += ", Heaviside–Lorentz units"
		}
	}
	b := map[string]string{"covariant": "covariant b", "j": "b_{J} = |J|/|p_{in}|", "eikonal": "eikonal b"}[res.Conv.Impact.String()]
	leg.add(fmt.Sprintf("%s: %s, %s;", filepath.Base(res.Scenario.Name), u, b))
	leg.add("Δp in units of m, Δa of b, along the frame of record")
}

// seriesLabel names a series in a figure: its observable, and its model
// in a --spread scan.
func seriesLabel(res scanResult, sr series) string {
	l := texObsLabel(sr.Observable)
	if len(res.Spread) > 0 {
		l += " (" + sr.Model + ")"
	}
	if len(res.Axes) > 0 {
		l += ", " + sliceLabel(res.Axes, sr.Params)
	}
	return l
}

// residualPoints splits a series into points with a positive and with a
// negative residual, |residual| with its error bar (clipped above zero on
// the log axis).
func residualPoints(sr series) (pos, neg plotter.XYs, posErr, negErr plotter.YErrors) {
	for _, q := range sr.Points {
		if !q.OK() || q.Residual == 0 {
			continue
		}
		r, sig := math.Abs(q.Residual), q.Sigma()
		e := struct{ Low, High float64 }{math.Min(sig, 0.9*r), sig}
		if q.Residual > 0 {
			pos, posErr = append(pos, plotter.XY{X: q.Eps, Y: r}), append(posErr, e)
		} else {
			neg, negErr = append(neg, plotter.XY{X: q.Eps, Y: r}), append(negErr, e)
		}
	}
	return
}

// plotResiduals draws the residual figure of a scan, one column wide.
// Top panel: |residual| against ε on log–log axes for every series, with
// error bars, filled markers for a positive residual and open ones for a
// negative one, the fitted power law over its window, slope guides ε¹,
// ε², ε³ and the numerical noise floor. Below, one panel per series:
// residual/ε² against ε with error bars, the fitted polynomial over its
// window and the fitted ε → 0 limit with its uncertainty band. The
// legend sits in a strip above the panels. A --spread scan is drawn by
// plotSpread instead.
func plotResiduals(res scanResult, path string) error {
	if len(res.Spread) > 0 {
		return plotSpread(res, path)
	}
	top := newPanel()
	top.X.Scale, top.Y.Scale = plot.LogScale{}, plot.LogScale{}
	top.X.Tick.Marker, top.Y.Tick.Marker = decadeTicks{blank: true}, decadeTicks{}
	grid := plotter.NewGrid()
	grid.Vertical.Color = nil
	top.Add(grid, decadeGrid{})
	leg := newLegend()
	yMin, yMax := math.Inf(1), math.Inf(-1)
	xMin, xMax := math.Inf(1), math.Inf(-1)
	var floor float64
	var ratios []panel
	for k, sr := range res.Series {
		col := palette[k%len(palette)]
		pos, neg, posErr, negErr := residualPoints(sr)
		var thumb plot.Thumbnailer
		for i, set := range []struct {
			xy   plotter.XYs
			errs plotter.YErrors
		}{{pos, posErr}, {neg, negErr}} {
			if len(set.xy) == 0 {
				continue
			}
			sc, eb, err := markersWithErrors(set.xy, set.errs, col, k, i == 1)
			if err != nil {
				return err
			}
			top.Add(eb, sc)
			if thumb == nil {
				thumb = seriesThumb(k)
			}
			for j, q := range set.xy {
				yMin, yMax = math.Min(yMin, q.Y-set.errs[j].Low), math.Max(yMax, q.Y+set.errs[j].High)
				xMin, xMax = math.Min(xMin, q.X), math.Max(xMax, q.X)
			}
		}
		if thumb == nil {
			continue
		}
		label := seriesLabel(res, sr)
		if e := sr.Fits.Exponent; e != nil {
			fn := plotter.NewFunction(func(x float64) float64 { return math.Exp(e.LogA) * math.Pow(x, e.N) })
			fn.XMin, fn.XMax = e.EpsLo, e.EpsHi
			fn.Samples = 2
			fn.LineStyle.Color = col
			fn.LineStyle.Width = vg.Points(0.8)
			top.Add(fn)
			leg.add(fmt.Sprintf("%s: |residual| ~ ε^{n}, n = %s", label, scriptNumber(numfmt.Split(e.N, e.SigmaN, 2))), thumb, fn)
		} else {
			leg.add(label+": exponent not determined", thumb)
		}
		if f := sr.Fits.NoiseFloor; f > 0 && f > floor {
			floor = f
		}
		rp, err := ratioPanel(res, sr, k, leg)
		if err != nil {
			return err
		}
		ratios = append(ratios, panel{rp, ratioLabel(sr.Observable), 1.25})
	}
	if math.IsInf(xMin, 0) {
		return fmt.Errorf("no scattered point with a non-zero residual to draw")
	}
	if floor > 0 {
		yMin = math.Min(yMin, 0.5*floor)
	}
	xlo, xhi := xMin/1.4, xMax*1.4
	ylo, yhi := yMin/10, yMax*10
	top.X.Min, top.X.Max, top.Y.Min, top.Y.Max = xlo, xhi, ylo, yhi
	if err := slopeGuides(top, res, xlo, xhi, ylo, yhi); err != nil {
		return err
	}
	if floor > 0 {
		nf := plotter.NewFunction(func(float64) float64 { return floor })
		nf.XMin, nf.XMax, nf.Samples = xlo, xhi, 2
		nf.LineStyle.Dashes = []vg.Length{vg.Points(1), vg.Points(1.5)}
		nf.LineStyle.Color = color.Gray{Y: 90}
		nf.LineStyle.Width = vg.Points(0.6)
		top.Add(nf)
		lb, err := guideLabel(plotter.XY{X: xhi / 1.15, Y: floor * 1.6}, "noise floor", draw.XRight)
		if err != nil {
			return err
		}
		top.Add(struct{ plot.Plotter }{lb})
	}
	// Sign of the residual: filled and open markers.
	for i, what := range []string{"residual > 0 (filled markers)", "residual < 0 (open markers)"} {
		sc, _ := plotter.NewScatter(plotter.XYs{{}})
		sc.GlyphStyle.Shape = glyphPairs[0][i]
		sc.GlyphStyle.Radius = vg.Points(2)
		leg.add(what, sc)
	}
	addConventions(leg, res)
	panels := []panel{{top, "|numeric − first order|", 2.2}}
	for _, rp := range ratios {
		rp.X.Min, rp.X.Max = xlo, xhi
		panels = append(panels, rp)
	}
	return saveStack(path, leg, panels, epsLabel(res))
}

// ratioPanel draws residual/ε² of series k against ε (log axis) with the
// fitted polynomial over its window and the fitted limit with its band,
// and adds the limit to the legend.
func ratioPanel(res scanResult, sr series, k int, leg *legendStrip) (*plot.Plot, error) {
	p := newRatioPanel()
	yr := yRange{math.Inf(1), math.Inf(-1)}
	band, lim, err := addRatio(p, sr, k, &yr)
	if err != nil {
		return nil, err
	}
	if n := sr.Fits.NextOrder; n != nil {
		leg.add(fmt.Sprintf("%s: limit ε → 0 of residual/ε^{2} = %s (band ±1σ)", seriesLabel(res, sr), scriptNumber(numfmt.Split(n.C2, n.SigmaC2, 2))), band, lim)
	}
	yr.apply(p)
	return p, nil
}

// newRatioPanel returns an empty residual/ε² panel.
func newRatioPanel() *plot.Plot {
	p := newPanel()
	p.X.Scale = plot.LogScale{}
	p.X.Tick.Marker = decadeTicks{blank: true}
	p.Y.Tick.Marker = mathTicks{linearTicks{}}
	grid := plotter.NewGrid()
	grid.Vertical.Color = nil
	p.Add(grid, decadeGrid{})
	return p
}

// yRange collects the vertical extent of a panel's data.
type yRange struct{ lo, hi float64 }

func (r *yRange) add(y float64) { r.lo, r.hi = math.Min(r.lo, y), math.Max(r.hi, y) }

// apply sets the panel's y range with a margin of 8 %.
func (r yRange) apply(p *plot.Plot) {
	if math.IsInf(r.lo, 0) {
		return
	}
	d := 0.08 * (r.hi - r.lo)
	if d == 0 {
		d = 0.05*math.Abs(r.hi) + 1e-300
	}
	p.Y.Min, p.Y.Max = r.lo-d, r.hi+d
}

// addRatio adds residual/ε² of series k in colour and glyph k to p: the
// points with error bars, the band of the fitted limit ±1σ across the
// panel with the limit as a dashed line, and the fitted polynomial over
// its window. It returns the band and the limit line for a legend (nil
// without a next-order fit).
func addRatio(p *plot.Plot, sr series, k int, yr *yRange) (plot.Thumbnailer, plot.Thumbnailer, error) {
	col := palette[k%len(palette)]
	// Filled for a positive residual, open for a negative one, as in the
	// |residual| panel.
	var xy [2]plotter.XYs
	var errs [2]plotter.YErrors
	for _, q := range sr.Points {
		if !q.OK() {
			continue
		}
		s := q.Sigma() / (q.Eps * q.Eps)
		i := 0
		if q.Residual < 0 {
			i = 1
		}
		xy[i] = append(xy[i], plotter.XY{X: q.Eps, Y: q.Ratio})
		errs[i] = append(errs[i], struct{ Low, High float64 }{s, s})
		yr.add(q.Ratio)
	}
	var band *plotter.Polygon
	var lim *plotter.Function
	if n := sr.Fits.NextOrder; n != nil {
		lo, hi := n.C2-n.SigmaC2, n.C2+n.SigmaC2
		var err error
		band, err = plotter.NewPolygon(plotter.XYs{{X: 1e-300, Y: lo}, {X: 1e300, Y: lo}, {X: 1e300, Y: hi}, {X: 1e-300, Y: hi}})
		if err != nil {
			return nil, nil, err
		}
		band.Color = withAlpha(col, 70)
		band.LineStyle.Width = 0
		lim = plotter.NewFunction(func(float64) float64 { return n.C2 })
		lim.LineStyle.Color = col
		lim.LineStyle.Width = vg.Points(0.6)
		lim.LineStyle.Dashes = []vg.Length{vg.Points(3), vg.Points(2)}
		poly := plotter.NewFunction(func(x float64) float64 {
			s := 0.0
			for j := len(n.Coeffs) - 1; j >= 0; j-- {
				s = s*x + n.Coeffs[j]
			}
			return s
		})
		poly.XMin, poly.XMax = n.EpsLo, n.EpsHi
		poly.LineStyle.Color = col
		poly.LineStyle.Width = vg.Points(0.8)
		p.Add(band, lim, poly)
		yr.add(lo)
		yr.add(hi)
	}
	for i := range xy {
		if len(xy[i]) == 0 {
			continue
		}
		sc, eb, err := markersWithErrors(xy[i], errs[i], col, k, i == 1)
		if err != nil {
			return nil, nil, err
		}
		p.Add(eb, sc)
	}
	if band == nil {
		return nil, nil, nil
	}
	return band, lim, nil
}

// plotSpread draws the residual/ε² of every completion of a --spread
// scan, one panel per observable, each completion in its own colour and
// marker with its fitted limit and band; the legend strip above names the
// completions once (three entries, whatever the number of observables).
func plotSpread(res scanResult, path string) error {
	var obs []string
	models := map[string]int{}
	var modelOrder []string
	for _, sr := range res.Series {
		if !slices.Contains(obs, sr.Observable) {
			obs = append(obs, sr.Observable)
		}
		if _, ok := models[sr.Model]; !ok {
			models[sr.Model] = len(modelOrder)
			modelOrder = append(modelOrder, sr.Model)
		}
	}
	leg := newLegend()
	thumbs := make([][]plot.Thumbnailer, len(modelOrder))
	xMin, xMax := math.Inf(1), math.Inf(-1)
	var panels []panel
	for _, o := range obs {
		p := newRatioPanel()
		yr := yRange{math.Inf(1), math.Inf(-1)}
		for _, sr := range res.Series {
			if sr.Observable != o {
				continue
			}
			k := models[sr.Model]
			band, lim, err := addRatio(p, sr, k, &yr)
			if err != nil {
				return err
			}
			if thumbs[k] == nil && band != nil {
				thumbs[k] = []plot.Thumbnailer{band, lim, seriesThumb(k)}
			}
			for _, q := range sr.Points {
				if q.OK() {
					xMin, xMax = math.Min(xMin, q.Eps), math.Max(xMax, q.Eps)
				}
			}
		}
		yr.apply(p)
		panels = append(panels, panel{p, ratioLabel(o), 1.5})
	}
	if math.IsInf(xMin, 0) {
		return fmt.Errorf("no scattered point to draw")
	}
	for k, m := range modelOrder {
		leg.add(m, thumbs[k]...)
	}
	leg.add("solid: fitted polynomial; dashed: its limit ε → 0, band ±1σ")
	leg.add("markers filled for residual > 0, open for residual < 0")
	addConventions(leg, res)
	for _, p := range panels {
		p.X.Min, p.X.Max = xMin/1.4, xMax*1.4
	}
	return saveStack(path, leg, panels, epsLabel(res))
}

// saveStack writes the panels stacked under the legend, one column wide,
// each panel's height in inches its relative height; the lowest panel
// carries the x tick labels.
func saveStack(path string, leg *legendStrip, panels []panel, xlabel string) error {
	panels[len(panels)-1].X.Tick.Marker = decadeTicks{}
	height := leg.height() + vg.Points(14)
	for _, p := range panels {
		height += vg.Length(p.height) * vg.Inch
	}
	return saveFigure(path, columnWidth, height, func(c draw.Canvas) {
		panelStack(c, []*legendStrip{leg}, panels, xlabel)
	})
}

// mathTicks sets the labels of another ticker with a true minus sign.
type mathTicks struct{ plot.Ticker }

func (m mathTicks) Ticks(min, max float64) []plot.Tick {
	t := m.Ticker.Ticks(min, max)
	for i := range t {
		if t[i].Label != "" {
			t[i].Label = strings.Replace(t[i].Label, "-", "−", 1)
		}
	}
	return t
}

// withAlpha returns col with opacity a (0–255).
func withAlpha(col color.Color, a uint8) color.Color {
	r, g, b, _ := col.RGBA()
	return color.NRGBA{uint8(r >> 8), uint8(g >> 8), uint8(b >> 8), a}
}

// slopeGuides draws short grey lines of slope 1, 2 and 3 on the log–log
// panel, from a point two decades below the lowest-ε point of the first
// series over 1.5 decades of ε (below the data, which rise no faster than
// ε^2 there), each labelled ε^n at its end.
func slopeGuides(p *plot.Plot, res scanResult, xlo, xhi, ylo, yhi float64) error {
	var x0, y0 float64
	for _, sr := range res.Series {
		for _, q := range sr.Points {
			if q.OK() && q.Residual != 0 && (x0 == 0 || q.Eps < x0) {
				x0, y0 = q.Eps, math.Abs(q.Residual)
			}
		}
		if x0 > 0 {
			break
		}
	}
	y0 /= 100
	x1 := math.Min(x0*math.Pow(10, 1.5), xhi)
	for n := 1; n <= 3; n++ {
		nn := float64(n)
		g := plotter.NewFunction(func(x float64) float64 { return y0 * math.Pow(x/x0, nn) })
		g.XMin, g.XMax, g.Samples = x0, x1, 2
		g.LineStyle.Color = color.Gray{Y: 120}
		g.LineStyle.Width = vg.Points(0.6)
		g.LineStyle.Dashes = []vg.Length{vg.Points(4), vg.Points(2)}
		p.Add(g)
		lb, err := guideLabel(plotter.XY{X: x1 * 1.08, Y: y0 * math.Pow(x1/x0, nn) * 2}, fmt.Sprintf("ε^{%d}", n), draw.XLeft)
		if err != nil {
			return err
		}
		// Without its glyph box, which would pad the data area.
		p.Add(struct{ plot.Plotter }{lb})
	}
	return nil
}

// seriesThumb is the legend marker of series k: its filled glyph.
func seriesThumb(k int) plot.Thumbnailer {
	sc, _ := plotter.NewScatter(plotter.XYs{{}})
	sc.GlyphStyle.Shape = glyphPairs[k%len(glyphPairs)][0]
	sc.GlyphStyle.Color = palette[k%len(palette)]
	sc.GlyphStyle.Radius = vg.Points(2)
	return sc
}

// guideLabel is a small grey label at xy.
func guideLabel(xy plotter.XY, s string, align draw.XAlignment) (*plotter.Labels, error) {
	lb, err := plotter.NewLabels(plotter.XYLabels{XYs: plotter.XYs{xy}, Labels: []string{s}})
	if err != nil {
		return nil, err
	}
	for i := range lb.TextStyle {
		lb.TextStyle[i].Handler = mathText
		lb.TextStyle[i].Font.Size = tickFont
		lb.TextStyle[i].Color = color.Gray{Y: 80}
		lb.TextStyle[i].XAlign = align
		lb.TextStyle[i].YAlign = draw.YTop
	}
	return lb, nil
}
