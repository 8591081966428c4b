package main

import (
	"fmt"
	"image/color"
	"math"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// checkPlotExt checks that a figure file name has a supported extension.
func checkPlotExt(path string) error {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".png", ".svg", ".pdf", ".eps":
		return nil
	}
	return badf("--plot = %q; allowed extensions: .png, .svg, .pdf, .eps", path)
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

// epsLabel is the axis label of the coupling, and unitsNote the
// conventions line of the title, in the scan's conventions. Axis labels
// must stay shorter than their axis: gonum/plot pads the data area to fit
// them.
func epsLabel(res scanResult) string {
	b := map[string]string{"covariant": "b", "j": "b_J", "eikonal": "b_eik"}[res.Conv.Impact.String()]
	if res.Scenario.Background.Curved() {
		return "ε = |M + iN| / " + b
	}
	return "ε = |(q − ig)(Q + iP)| / (m " + b + ")"
}

func unitsNote(res scanResult) string {
	u := "G = c = 1"
	if !res.Scenario.Background.Curved() {
		if res.Conv.Units.String() == "gaussian" {
			u += ", Gaussian units"
		} else {
			u += ", Heaviside–Lorentz units"
		}
	}
	return u + ", " + res.Conv.Impact.String() + " impact parameter; Δp in units of m, Δa of b"
}

// obsLabel renders an observable for a legend.
func obsLabel(name string) string {
	r := strings.NewReplacer("dp_", "Δp_", "da_", "Δa_", "dS_", "ΔS^")
	return r.Replace(name)
}

// plotResiduals draws |residual| against ε on log–log axes: the points
// with their error bars, the fitted power law over its window, a slope-2
// guide and the numerical noise floor, for every series.
func plotResiduals(res scanResult, path string) error {
	p := plot.New()
	p.Title.Text = fmt.Sprintf("%s: residual of the first-order prediction\n%s", res.Scenario.Name, unitsNote(res))
	p.Title.TextStyle.Font.Size = font.Length(11)
	p.Title.Padding = vg.Points(2)
	p.X.Label.Text = epsLabel(res)
	p.Y.Label.Text = "|numeric − first order|"
	p.X.Scale, p.Y.Scale = plot.LogScale{}, plot.LogScale{}
	p.X.Tick.Marker, p.Y.Tick.Marker = decadeTicks{}, decadeTicks{}
	// The data rise from lower left to upper right: the upper left is
	// empty and holds the legend.
	p.Legend.Top, p.Legend.Left = true, true
	p.Legend.YOffs = vg.Points(-4)
	p.Legend.XOffs = vg.Points(8)
	p.Legend.TextStyle.Font.Size = font.Length(9)
	p.Add(plotter.NewGrid())
	yMin, yMax := math.Inf(1), math.Inf(-1)
	xMin, xMax := math.Inf(1), math.Inf(-1)
	var floor float64
	for k, sr := range res.Series {
		col := palette[k%len(palette)]
		var xy plotter.XYs
		var errs plotter.YErrors
		for _, q := range sr.Points {
			if !q.OK() || q.Residual == 0 {
				continue
			}
			r, sig := math.Abs(q.Residual), q.Sigma()
			xy = append(xy, plotter.XY{X: q.Eps, Y: r})
			// Error bars clipped above zero on the log axis.
			lo := math.Min(sig, 0.9*r)
			errs = append(errs, struct{ Low, High float64 }{lo, sig})
			yMin, yMax = math.Min(yMin, r-lo), math.Max(yMax, r+sig)
			xMin, xMax = math.Min(xMin, q.Eps), math.Max(xMax, q.Eps)
		}
		if len(xy) == 0 {
			continue
		}
		sc, eb, err := markersWithErrors(xy, errs, col, k)
		if err != nil {
			return err
		}
		// Only the Plotter method: the error bars' glyph boxes are not
		// meaningful on a log axis and would pad the data area.
		p.Add(struct{ plot.Plotter }{eb}, sc)
		label := obsLabel(sr.Observable)
		spread := len(res.Spread) > 0
		if spread {
			label += " (" + sr.Model + ")"
		}
		e := sr.Fits.Exponent
		if !spread || e == nil {
			p.Legend.Add(label, sc)
		}
		if e != nil {
			fn := plotter.NewFunction(func(x float64) float64 { return math.Exp(e.LogA) * math.Pow(x, e.N) })
			fn.XMin, fn.XMax = e.EpsLo, e.EpsHi
			fn.Samples = 2
			fn.LineStyle.Color = col
			fn.LineStyle.Width = vg.Points(1)
			p.Add(fn)
			if spread {
				// One legend line per member (a spread has up to six):
				// points and fit together.
				p.Legend.Add(fmt.Sprintf("%s: fit ε^n, n = %.4f ± %.1g", label, e.N, e.SigmaN), sc, fn)
			} else {
				p.Legend.Add(fmt.Sprintf("fit ε^n: n = %.4f ± %.1g over ε = %.2g to %.2g", e.N, e.SigmaN, e.EpsLo, e.EpsHi), fn)
			}
		}
		if f := sr.Fits.NoiseFloor; f > 0 && (floor == 0 || f > floor) {
			floor = f
		}
	}
	if math.IsInf(xMin, 0) {
		return fmt.Errorf("no scattered point with a non-zero residual to draw")
	}
	// Slope-2 guide through the geometric middle of the data.
	xm := math.Sqrt(xMin * xMax)
	var ym float64
	for _, sr := range res.Series {
		for _, q := range sr.Points {
			if q.OK() && q.Residual != 0 && (ym == 0 || math.Abs(math.Log(q.Eps/xm)) < math.Abs(math.Log(ym/xm))) {
				ym = q.Eps
			}
		}
	}
	var yAt float64
	for _, q := range res.Series[0].Points {
		if q.Eps == ym {
			yAt = math.Abs(q.Residual)
		}
	}
	if yAt > 0 {
		g := plotter.NewFunction(func(x float64) float64 { return 0.3 * yAt * (x / ym) * (x / ym) })
		g.XMin, g.XMax, g.Samples = xMin, xMax, 2
		g.LineStyle.Dashes = []vg.Length{vg.Points(5), vg.Points(3)}
		g.LineStyle.Color = color.Gray{Y: 90}
		p.Add(g)
		p.Legend.Add("slope-2 guide (ε^2)", g)
	}
	if floor > 0 {
		nf := plotter.NewFunction(func(float64) float64 { return floor })
		nf.XMin, nf.XMax, nf.Samples = xMin, xMax, 2
		nf.LineStyle.Dashes = []vg.Length{vg.Points(1), vg.Points(2)}
		nf.LineStyle.Color = color.Gray{Y: 60}
		p.Add(nf)
		p.Legend.Add("numerical noise floor (median error)", nf)
		yMin = math.Min(yMin, 0.5*floor)
	}
	p.X.Min, p.X.Max = xMin/1.5, xMax*1.5
	p.Y.Min, p.Y.Max = yMin/30, yMax*3
	return savePlot(p, 7*vg.Inch, 5*vg.Inch, path)
}

// decadeTicks marks log axes with labelled major ticks 10^k at every
// decade (every second or third decade when there are many) and unlabelled
// minor ticks at 2…9 × 10^k.
type decadeTicks struct{}

func (decadeTicks) Ticks(min, max float64) []plot.Tick {
	lo, hi := int(math.Floor(math.Log10(min))), int(math.Ceil(math.Log10(max)))
	step := 1 + (hi-lo)/8
	var t []plot.Tick
	for k := lo; k <= hi; k++ {
		base := math.Pow(10, float64(k))
		if base >= min && base <= max {
			label := ""
			if k%step == 0 {
				// The bundled fonts lack a superscript minus: write 1e−4.
				label = strings.Replace(fmt.Sprintf("1e%d", k), "-", "−", 1)
			}
			t = append(t, plot.Tick{Value: base, Label: label})
		}
		if step == 1 {
			for m := 2; m <= 9; m++ {
				if v := float64(m) * base; v >= min && v <= max {
					t = append(t, plot.Tick{Value: v})
				}
			}
		}
	}
	return t
}

// markersWithErrors draws the points xy with vertical error bars errs in
// colour col, with the k-th glyph shape of the figure's cycle.
func markersWithErrors(xy plotter.XYs, errs plotter.YErrors, col color.Color, k int) (*plotter.Scatter, *plotter.YErrorBars, error) {
	sc, err := plotter.NewScatter(xy)
	if err != nil {
		return nil, nil, err
	}
	sc.GlyphStyle.Color = col
	sc.GlyphStyle.Shape = []draw.GlyphDrawer{draw.CircleGlyph{}, draw.SquareGlyph{}, draw.TriangleGlyph{}, draw.PyramidGlyph{}}[k%4]
	sc.GlyphStyle.Radius = vg.Points(2.5)
	eb, err := plotter.NewYErrorBars(struct {
		plotter.XYer
		plotter.YErrorer
	}{xy, errs})
	if err != nil {
		return nil, nil, err
	}
	eb.LineStyle.Color = col
	return sc, eb, nil
}
