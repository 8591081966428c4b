package main

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgeps"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgpdf"
	"gonum.org/v1/plot/vg/vgsvg"

	"ricochet/observables/numfmt"
)

// Figures for papers: the width of one column of a two-column journal
// page (3.4 in; common practice for physics journals), fonts of at least
// 8 pt at that size, symbols in Unicode with true sub- and superscripts
// (scriptText: "Δp_{b}", "ε^{2}"), vector output for .pdf, .svg and .eps
// and 300 dpi for .png, and legends in a strip of their own above the
// panels so that they never cover data.
const (
	columnWidth = 3.4 * vg.Inch
	pngDPI      = 300
	tickFont    = 8 // pt: tick labels and legends
	labelFont   = 9 // pt: axis labels
)

// mathText typesets every label of the paper figures.
var mathText = scriptText{text.Plain{Fonts: font.DefaultCache}}

// scriptText is a text handler for labels with sub- and superscripts:
// "Δp_{b}" and "ε^{2}" set the braced part in a smaller size below or
// above the baseline; everything else is drawn as plain text. (gonum/plot's
// LaTeX handler, v0.17, has no sub- or superscripts and panics on input it
// does not know, such as "|".)
type scriptText struct{ text.Plain }

// Relative size and baseline shifts of scripts (common practice: TeX's
// scripts are 70 % of the text size).
const (
	scriptScale = 0.7
	subShift    = -0.22 // of the text size
	supShift    = 0.38
)

// scriptPiece is a run of text at one level: 0 text, -1 sub, +1 super.
type scriptPiece struct {
	text  string
	level int
}

// scriptPieces splits one line at the _{…} and ^{…} markers.
func scriptPieces(line string) []scriptPiece {
	var out []scriptPiece
	for line != "" {
		i := strings.IndexAny(line, "_^")
		if i < 0 || i+1 >= len(line) || line[i+1] != '{' {
			if i < 0 || i+1 >= len(line) {
				out = append(out, scriptPiece{line, 0})
				break
			}
			out = append(out, scriptPiece{line[:i+1], 0})
			line = line[i+1:]
			continue
		}
		j := strings.IndexByte(line[i:], '}')
		if j < 0 {
			out = append(out, scriptPiece{line, 0})
			break
		}
		level := -1
		if line[i] == '^' {
			level = 1
		}
		if i > 0 {
			out = append(out, scriptPiece{line[:i], 0})
		}
		out = append(out, scriptPiece{line[i+2 : i+j], level})
		line = line[i+j+1:]
	}
	return out
}

// pieceFont returns the font and baseline shift of a piece.
func pieceFont(fnt font.Font, level int) (font.Font, vg.Length) {
	if level == 0 {
		return fnt, 0
	}
	f := fnt
	f.Size = fnt.Size * scriptScale
	shift := subShift
	if level > 0 {
		shift = supShift
	}
	return f, vg.Length(shift) * fnt.Size
}

// Box returns the extent of one line of text with its scripts.
func (h scriptText) Box(txt string, fnt font.Font) (width, height, depth vg.Length) {
	for _, p := range scriptPieces(txt) {
		f, shift := pieceFont(fnt, p.level)
		w, a, d := h.Plain.Box(p.text, f)
		width += w
		height = max(height, a+shift)
		depth = max(depth, d-shift)
	}
	return width, height, depth
}

// Draw renders txt (lines with scripts) with the style at pt, as
// text.Plain does for plain text.
func (h scriptText) Draw(c vg.Canvas, txt string, sty text.Style, pt vg.Point) {
	txt = strings.TrimRight(txt, "\n")
	if txt == "" {
		return
	}
	c.SetColor(sty.Color)
	if sty.Rotation != 0 {
		c.Push()
		c.Rotate(sty.Rotation)
	}
	sin64, cos64 := math.Sincos(sty.Rotation)
	cos, sin := vg.Length(cos64), vg.Length(sin64)
	pt.X, pt.Y = pt.Y*sin+pt.X*cos, pt.Y*cos-pt.X*sin
	lines := h.Lines(txt)
	ascent := h.Plain.Extents(sty.Font).Ascent
	pt.Y += sty.Height(txt)*vg.Length(sty.YAlign) - ascent
	for i, line := range lines {
		w, _, _ := h.Box(line, sty.Font)
		x := pt.X + vg.Length(sty.XAlign)*w
		y := pt.Y + vg.Length(len(lines)-i)*sty.Font.Size
		for _, p := range scriptPieces(line) {
			f, shift := pieceFont(sty.Font, p.level)
			face := h.Fonts.Lookup(f, f.Size)
			// Glyph outlines on every canvas (pdfglyphs.go): the PDF
			// canvas's code page 1252 has no ε, Δ or −, and outlines look
			// the same in PDF, SVG, EPS and PNG.
			at := vg.Point{X: x, Y: y + shift}
			if _, err := fillOutlines(c, face, at, p.text); err != nil {
				c.FillString(face, at, p.text) // a glyph the font lacks
			}
			x += face.Width(p.text)
		}
	}
	if sty.Rotation != 0 {
		c.Pop()
	}
}

// useScriptText sets the scriptText handler on every text of p (tick
// labels of decadeTicks are written in its markup).
func useScriptText(p *plot.Plot) {
	for _, s := range []*text.Style{&p.Title.TextStyle, &p.X.Label.TextStyle, &p.Y.Label.TextStyle, &p.X.Tick.Label, &p.Y.Tick.Label, &p.Legend.TextStyle} {
		s.Handler = mathText
	}
}

// newPanel returns a plot with the paper fonts and the scriptText handler
// on every text.
func newPanel() *plot.Plot {
	p := plot.New()
	useScriptText(p)
	p.Title.TextStyle.Font.Size = font.Length(labelFont)
	p.X.Label.TextStyle.Font.Size = font.Length(labelFont)
	p.Y.Label.TextStyle.Font.Size = font.Length(labelFont)
	p.X.Tick.Label.Font.Size = font.Length(tickFont)
	p.Y.Tick.Label.Font.Size = font.Length(tickFont)
	p.Legend.TextStyle.Font.Size = font.Length(tickFont)
	p.X.Label.Padding, p.Y.Label.Padding = vg.Points(2), vg.Points(2)
	p.X.Tick.Length, p.Y.Tick.Length = vg.Points(3), vg.Points(3)
	p.X.Padding, p.Y.Padding = 0, 0
	return p
}

// legendStrip is a legend drawn in a strip of its own above the panels.
type legendStrip struct {
	plot.Legend
	texts []string // of the entries
}

// newLegend returns a legend strip in the paper fonts.
func newLegend() *legendStrip {
	l := plot.NewLegend()
	l.TextStyle.Handler = mathText
	l.TextStyle.Font.Size = font.Length(tickFont)
	l.Top, l.Left = true, true
	l.ThumbnailWidth = vg.Points(16)
	l.Padding = vg.Points(1)
	return &legendStrip{Legend: l}
}

func (l *legendStrip) add(label string, thumbs ...plot.Thumbnailer) {
	l.Add(label, thumbs...)
	l.texts = append(l.texts, label)
}

// height is the height of the strip: its entries as plot.Legend stacks
// them (each as high as the highest) and a gap of 4 pt below.
func (l *legendStrip) height() vg.Length {
	var h vg.Length
	for _, t := range l.texts {
		r := l.TextStyle.Rectangle(t)
		h = max(h, r.Max.Y-r.Min.Y)
	}
	n := vg.Length(len(l.texts))
	return n*h + (n-1)*l.Padding + vg.Points(4)
}

// panel is one panel of a stacked figure with its y label. Axis labels
// are drawn by panelStack, not by gonum/plot: on a log axis gonum/plot
// v0.17 centres the label's glyph box at the arithmetic mean of the axis
// range, which pads the data area by most of the label's length.
type panel struct {
	*plot.Plot
	ylabel string
	height float64 // relative
}

// panelStack draws panels one above the other on c (top first), their
// data areas aligned left and right, the y labels in one column at the
// left, the legend strips above and the x label xlabel below. Panels other
// than the lowest share its x axis: their tick labels should be blank.
func panelStack(c draw.Canvas, legends []*legendStrip, panels []panel, xlabel string) {
	top := c.Max.Y
	for _, l := range legends {
		h := l.height()
		strip := draw.Crop(c, vg.Points(2), 0, top-h-c.Min.Y, top-c.Max.Y)
		l.Draw(strip)
		top -= h
	}
	label := text.Style{Font: font.From(plot.DefaultFont, labelFont), Handler: mathText, XAlign: text.XCenter, Color: color.Black}
	labelH := label.Height("Mg^{2}_{b}") + vg.Points(3)
	bottom := c.Min.Y + label.Height(xlabel) + vg.Points(2)
	sum := 0.0
	for _, p := range panels {
		sum += p.height
	}
	avail := top - bottom
	tiles := make([]draw.Canvas, len(panels))
	y := top
	for i, p := range panels {
		h := vg.Length(p.height / sum * float64(avail))
		// On the right, room for half the last tick label.
		tiles[i] = draw.Crop(c, labelH, -vg.Points(7), y-h-c.Min.Y, y-c.Max.Y)
		y -= h
	}
	// Align the data areas: the widest left and right margins for all.
	var left, right vg.Length
	for i, p := range panels {
		d := p.DataCanvas(tiles[i])
		left = max(left, d.Min.X-tiles[i].Min.X)
		right = max(right, tiles[i].Max.X-d.Max.X)
	}
	var data draw.Canvas
	for i, p := range panels {
		d := p.DataCanvas(tiles[i])
		t := draw.Crop(tiles[i], left-(d.Min.X-tiles[i].Min.X), -(right - (tiles[i].Max.X - d.Max.X)), 0, 0)
		p.Draw(t)
		data = p.DataCanvas(t)
		ys := label
		ys.Rotation = math.Pi / 2
		ys.YAlign = text.YTop
		c.FillText(ys, vg.Point{X: c.Min.X + vg.Points(1), Y: (data.Min.Y + data.Max.Y) / 2}, p.ylabel)
	}
	xs := label
	xs.YAlign = text.YBottom
	c.FillText(xs, vg.Point{X: (data.Min.X + data.Max.X) / 2, Y: c.Min.Y + vg.Points(1)}, xlabel)
}

// saveFigure renders draw onto a canvas of size w × h in the format of
// path's extension (vector for .pdf, .svg and .eps; 300 dpi for .png).
func saveFigure(path string, w, h vg.Length, render func(draw.Canvas)) error {
	var c interface {
		vg.CanvasSizer
		io.WriterTo
	}
	var dc vg.CanvasSizer
	switch strings.ToLower(filepath.Ext(path)) {
	case ".png":
		c = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseDPI(pngDPI), vgimg.UseBackgroundColor(color.White))}
	case ".svg":
		c = vgsvg.New(w, h)
	case ".pdf":
		// Text that does not go through scriptText still reaches the
		// PDF intact (pdfglyphs.go).
		pc := vgpdf.New(w, h)
		c, dc = pc, glyphCanvas{pc}
	case ".eps":
		c = vgeps.New(w, h)
	default:
		return fmt.Errorf("unsupported figure format %q", filepath.Ext(path))
	}
	if dc == nil {
		dc = c
	}
	render(draw.New(dc))
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	if _, err := c.WriteTo(f); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// decadeTicks marks log axes with major ticks 10^k labelled 10^{k}
// (every second or third decade when there are many) and unlabelled
// minor ticks at 2…9 × 10^k. blank leaves every label empty (panels that
// share the x axis of the panel below).
type decadeTicks struct{ blank bool }

func (d decadeTicks) Ticks(min, max float64) []plot.Tick {
	lo, hi := int(math.Floor(math.Log10(min))), int(math.Ceil(math.Log10(max)))
	step := 1 + (hi-lo)/6
	var t []plot.Tick
	for k := lo; k <= hi; k++ {
		base := math.Pow(10, float64(k))
		if base >= min && base <= max {
			label := ""
			if k%step == 0 && !d.blank {
				label = "10^{" + strings.Replace(strconv.Itoa(k), "-", "−", 1) + "}"
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

// decadeGrid draws vertical grid lines at the decades of a log x axis
// (plotter.Grid draws them only at labelled ticks, and panels that share
// the x axis of the panel below have no labels).
type decadeGrid struct{}

func (decadeGrid) Plot(c draw.Canvas, p *plot.Plot) {
	sty := plotter.DefaultGridLineStyle
	for k := math.Ceil(math.Log10(p.X.Min)); math.Pow(10, k) <= p.X.Max; k++ {
		x := c.X(p.X.Norm(math.Pow(10, k)))
		c.StrokeLine2(sty, x, c.Min.Y, x, c.Max.Y)
	}
}

// glyphPairs are the (filled, open) marker shapes of the series: filled
// for a positive residual, open for a negative one.
var glyphPairs = [][2]draw.GlyphDrawer{
	{draw.CircleGlyph{}, draw.RingGlyph{}},
	{draw.BoxGlyph{}, draw.SquareGlyph{}},
	{draw.PyramidGlyph{}, draw.TriangleGlyph{}},
}

// markersWithErrors draws the points xy with vertical error bars errs in
// colour col, with glyph shape (filled or open) of series k.
func markersWithErrors(xy plotter.XYs, errs plotter.YErrors, col color.Color, k int, open bool) (*plotter.Scatter, *errorBars, error) {
	sc, err := plotter.NewScatter(xy)
	if err != nil {
		return nil, nil, err
	}
	sc.GlyphStyle.Color = col
	g := glyphPairs[k%len(glyphPairs)]
	sc.GlyphStyle.Shape = g[0]
	if open {
		sc.GlyphStyle.Shape = g[1]
	}
	sc.GlyphStyle.Radius = vg.Points(2)
	eb := &errorBars{xy: xy, errs: errs, hide: 2 * sc.GlyphStyle.Radius}
	eb.line.Color = col
	eb.line.Width = vg.Points(0.6)
	return sc, eb, nil
}

// errorBars draws vertical error bars with caps, leaving out those that
// would not reach beyond their marker (shorter than hide on the canvas):
// a bar hidden under its marker except for its caps reads as a line
// through the marker.
type errorBars struct {
	xy   plotter.XYs
	errs plotter.YErrors
	line draw.LineStyle
	hide vg.Length
}

func (e *errorBars) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	cw := vg.Points(1.5)
	for i, q := range e.xy {
		x := trX(q.X)
		lo, hi := trY(q.Y-e.errs[i].Low), trY(q.Y+e.errs[i].High)
		if hi-lo < e.hide || !c.ContainsX(x) {
			continue
		}
		c.StrokeLines(e.line, c.ClipLinesY([]vg.Point{{X: x, Y: lo}, {X: x, Y: hi}})...)
		for _, y := range []vg.Length{lo, hi} {
			if c.ContainsY(y) {
				c.StrokeLine2(e.line, x-cw, y, x+cw, y)
			}
		}
	}
}

// texObsLabel renders an observable for a figure (scriptText markup):
// dp_b → Δp_{b}, dS_lb → ΔS^{lb}.
func texObsLabel(name string) string {
	switch {
	case strings.HasPrefix(name, "dS_"):
		return "ΔS^{" + name[3:] + "}"
	case strings.HasPrefix(name, "da_"):
		return "Δa_{" + name[3:] + "}"
	}
	return "Δp_{" + strings.TrimPrefix(name, "dp_") + "}"
}

// scriptSci renders x with one significant digit, 3×10^{−5}.
func scriptSci(x float64) string {
	if x == 0 || math.IsNaN(x) || math.IsInf(x, 0) {
		return strconv.FormatFloat(x, 'g', 1, 64)
	}
	m, e, _ := strings.Cut(strconv.FormatFloat(x, 'e', 0, 64), "e")
	k, _ := strconv.Atoi(e)
	if k == 0 {
		return m
	}
	return m + "×10^{" + strings.Replace(strconv.Itoa(k), "-", "−", 1) + "}"
}

// ratioLabel is the y label of a residual/ε² panel.
func ratioLabel(name string) string { return texObsLabel(name) + ": residual/ε^{2}" }

// scriptNumber renders a number with its uncertainty in the concise
// notation of the tables, 1.2345(6)×10^{−3}, in scriptText markup, so that
// a figure and a table round the same number alike.
func scriptNumber(v numfmt.Value) string {
	if v.NaN {
		return "n/a"
	}
	s := strings.Replace(v.Mantissa, "-", "−", 1)
	if v.Unc != "" {
		s += "(" + v.Unc + ")"
	}
	if v.Exp != 0 {
		s += "×10^{" + strings.Replace(strconv.Itoa(v.Exp), "-", "−", 1) + "}"
	}
	return s
}
