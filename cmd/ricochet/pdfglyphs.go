package main

import (
	"errors"
	"fmt"

	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/vgpdf"
)

// savePlot writes p to path in the format its extension names (as
// saveFigure: PNG at 300 dpi), like (*plot.Plot).Save, except that PDF text outside the PDF backend's
// single-byte encoding (code page 1252: Greek letters, the minus sign,
// sub- and superscript digits, arrows) is drawn as filled glyph outlines
// taken from the embedded font, so that Δp_b, ε and − read correctly in
// the PDF as they do in PNG and SVG. Text the encoding can hold stays text.
func savePlot(p *plot.Plot, w, h vg.Length, path string) error {
	return saveFigure(path, w, h, p.Draw)
}

// glyphCanvas is a PDF canvas whose FillString outlines the glyphs of any
// string the single-byte PDF font encoding cannot represent.
type glyphCanvas struct{ *vgpdf.Canvas }

// singleByte reports whether every rune of s is printable ASCII or in the
// Latin-1 range that code page 1252 shares with Unicode.
func singleByte(s string) bool {
	for _, r := range s {
		if r >= 0x80 && (r < 0xA0 || r > 0xFF) {
			return false
		}
	}
	return true
}

func (c glyphCanvas) FillString(f font.Face, pt vg.Point, s string) {
	if f.Font.Size == 0 {
		return
	}
	if singleByte(s) || f.Face == nil {
		c.Canvas.FillString(f, pt, s)
		return
	}
	if _, err := fillOutlines(c.Canvas, f, pt, s); err != nil {
		// A glyph the font cannot give: fall back to the encoded text
		// (shows a placeholder rather than dropping the label).
		c.Canvas.FillString(f, pt, s)
	}
}

// fillOutlines draws s at pt (baseline origin) as filled outlines of the
// font's glyphs, advancing and kerning exactly as font.Face.Width measures
// the string, so layout computed by the plot is unchanged. It returns the
// horizontal advance of the whole string.
func fillOutlines(c vg.Canvas, f font.Face, pt vg.Point, s string) (vg.Length, error) {
	var buf sfnt.Buffer
	upem := f.Face.UnitsPerEm()
	// With pixels-per-em set to the units per em, sfnt returns glyph
	// coordinates and advances whose 26.6 raw values are font units.
	ppem := fixed.Int26_6(upem)
	scale := float64(f.Font.Size) / float64(upem)
	x := float64(pt.X)
	var prev sfnt.GlyphIndex
	for i, r := range s {
		idx, err := f.Face.GlyphIndex(&buf, r)
		if err != nil {
			return 0, err
		}
		if idx == 0 {
			return 0, fmt.Errorf("no glyph for %q", r)
		}
		if i > 0 {
			kern, err := f.Face.Kern(&buf, prev, idx, ppem, 0)
			if err == nil {
				x += float64(kern) * scale
			} else if !errors.Is(err, sfnt.ErrNotFound) {
				return 0, err
			}
		}
		segs, err := f.Face.LoadGlyph(&buf, idx, ppem, nil)
		if err != nil {
			return 0, err
		}
		// sfnt's y axis points down; the canvas's points up.
		at := func(p fixed.Point26_6) vg.Point {
			return vg.Point{X: vg.Length(x + float64(p.X)*scale), Y: pt.Y - vg.Length(float64(p.Y)*scale)}
		}
		var path vg.Path
		for _, sg := range segs {
			switch sg.Op {
			case sfnt.SegmentOpMoveTo:
				if len(path) > 0 {
					path.Close()
				}
				path.Move(at(sg.Args[0]))
			case sfnt.SegmentOpLineTo:
				path.Line(at(sg.Args[0]))
			case sfnt.SegmentOpQuadTo:
				path.QuadTo(at(sg.Args[0]), at(sg.Args[1]))
			case sfnt.SegmentOpCubeTo:
				path.CubeTo(at(sg.Args[0]), at(sg.Args[1]), at(sg.Args[2]))
			}
		}
		if len(path) > 0 {
			path.Close()
			c.Fill(path)
		}
		adv, err := f.Face.GlyphAdvance(&buf, idx, ppem, 0)
		if err != nil {
			return 0, err
		}
		x += float64(adv) * scale
		prev = idx
	}
	return vg.Length(x) - pt.X, nil
}
