package main

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// plotVerify draws, for every predicted observable, |numeric − yours|
// (filled markers, joined) and ricochet's own |numeric − first order|
// (open markers, dashed) against ε on log–log axes, with the numerical
// error bars and guides of slope 1, 2 and 3: a residual parallel to the
// slope-1 guide is a first-order disagreement, to slope 2 a first-order
// agreement, to slope 3 a correct next order.
func plotVerify(res verifyResult, path string) error {
	p := plot.New()
	useScriptText(p) // the markup of decadeTicks' labels and ε^{n}
	u := "G = c = 1, Gaussian units, covariant b"
	if res.scenario.Background.Curved() {
		u = "G = c = 1, covariant b"
	}
	p.Title.Text = fmt.Sprintf("%s: your residual and ricochet's first-order residual\n%s; kicks in the library's conventions", res.scenario.Name, u)
	p.Title.TextStyle.Font.Size = font.Length(11)
	p.Title.Padding = vg.Points(2)
	p.X.Label.Text = "|ε| (scenario's coupling, halved successively)"
	p.Y.Label.Text = "|residual|"
	p.X.Scale, p.Y.Scale = plot.LogScale{}, plot.LogScale{}
	p.X.Tick.Marker, p.Y.Tick.Marker = decadeTicks{}, decadeTicks{}
	p.Legend.Top, p.Legend.Left = true, true
	p.Legend.XOffs, p.Legend.YOffs = vg.Points(8), vg.Points(-4)
	p.Legend.TextStyle.Font.Size = font.Length(8)
	p.Add(plotter.NewGrid())
	xMin, xMax, yMin, yMax := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	k, entries := 0, 0
	var anchorX, anchorY float64
	for _, cfg := range res.cfgs {
		for _, r := range cfg.Results {
			col := palette[k%len(palette)]
			label := texObsLabel(r.Observable)
			if l := cfg.Label(); l != "" {
				label += " (" + l + ")"
			}
			for own := 0; own < 2; own++ {
				var xy plotter.XYs
				var errs plotter.YErrors
				for _, q := range r.Rows {
					v := q.Residual
					if own == 1 {
						v = q.Own
					}
					if q.Status != "" || v == 0 || math.IsNaN(v) {
						continue
					}
					a := math.Abs(v)
					sig := math.Max(q.Error, 0)
					lo := math.Min(sig, 0.9*a) // clipped above zero on the log axis
					xy = append(xy, plotter.XY{X: q.Eps, Y: a})
					errs = append(errs, struct{ Low, High float64 }{lo, sig})
					xMin, xMax = math.Min(xMin, q.Eps), math.Max(xMax, q.Eps)
					yMin, yMax = math.Min(yMin, a-lo), math.Max(yMax, a+sig)
					if own == 1 && q.Eps > anchorX {
						anchorX, anchorY = q.Eps, a
					}
				}
				if len(xy) == 0 {
					continue
				}
				sc, eb, err := markersWithErrors(xy, errs, col, k, false)
				if err != nil {
					return err
				}
				line, err := plotter.NewLine(xy)
				if err != nil {
					return err
				}
				line.LineStyle.Color = col
				line.LineStyle.Width = vg.Points(0.8)
				// Yours filled, ricochet's own open, in the observable's
				// colour.
				sc.GlyphStyle.Shape = []draw.GlyphDrawer{draw.CircleGlyph{}, draw.BoxGlyph{}, draw.PyramidGlyph{}}[k%3]
				if own == 1 {
					sc.GlyphStyle.Shape = []draw.GlyphDrawer{draw.RingGlyph{}, draw.SquareGlyph{}, draw.TriangleGlyph{}}[k%3]
					sc.GlyphStyle.Radius = vg.Points(3.5)
					line.LineStyle.Dashes = []vg.Length{vg.Points(4), vg.Points(2)}
				}
				p.Add(line, struct{ plot.Plotter }{eb}, sc)
				entries++
				if own == 0 {
					p.Legend.Add(fmt.Sprintf("%s: numeric − yours (%s)", label, r.Verdict), sc, line)
				} else {
					p.Legend.Add(label+": numeric − ricochet's first order", sc, line)
				}
			}
			k++
		}
	}
	if math.IsInf(xMin, 0) {
		return fmt.Errorf("no scattered point with a non-zero residual to draw")
	}
	if anchorY > 0 {
		// Guides of slope 1, 2, 3 through the own residual at the largest ε.
		for n, dash := range [][]vg.Length{{vg.Points(1), vg.Points(2)}, {vg.Points(5), vg.Points(3)}, {vg.Points(8), vg.Points(2), vg.Points(1), vg.Points(2)}} {
			n := n + 1
			ax, ay := anchorX, 0.1*anchorY
			g := plotter.NewFunction(func(x float64) float64 { return ay * math.Pow(x/ax, float64(n)) })
			g.XMin, g.XMax, g.Samples = xMin, xMax, 2
			g.LineStyle.Dashes = dash
			g.LineStyle.Color = color.Gray{Y: 100}
			p.Add(g)
			p.Legend.Add(fmt.Sprintf("slope-%d guide (ε^{%d})", n, n), g)
			entries++
			yMin = math.Min(yMin, ay*math.Pow(xMin/ax, float64(n)))
		}
	}
	p.X.Min, p.X.Max = xMin/1.5, xMax*1.5
	// Headroom for the legend: each entry takes about 1/50 of the height
	// of the data area (measured on the rendered figure), so n entries
	// take the top fraction f = n/50; the data keep to the rest.
	yMin = math.Max(yMin, yMax*1e-18) / 3
	f := math.Min(0.6, float64(entries)/50)
	p.Y.Min, p.Y.Max = yMin, 2*yMax*math.Pow(2*yMax/yMin, f/(1-f))
	return savePlot(p, 7*vg.Inch, 5*vg.Inch, path)
}
