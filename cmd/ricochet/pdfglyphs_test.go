package main

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/recorder"
)

// TestOutlinedGlyphs: text outside the PDF font encoding is drawn as one
// filled outline per visible glyph, advancing exactly as gonum/plot's own
// font.Face.Width measures the string (so the plot's layout holds), and a
// PDF figure with such labels is written.
func TestOutlinedGlyphs(t *testing.T) {
	face := plot.DefaultTextHandler.Cache().Lookup(plot.DefaultFont, 10)
	for _, s := range []string{"Δp_b", "ε = |(q − ig)(Q + iP)|", "ε²", "α₁→β"} {
		if singleByte(s) {
			t.Fatalf("%q: want a string the single-byte encoding cannot hold", s)
		}
		var rec recorder.Canvas
		adv, err := fillOutlines(&rec, face, vg.Point{X: 3, Y: 7}, s)
		if err != nil {
			t.Fatalf("%q: %v", s, err)
		}
		if w := face.Width(s); math.Abs(float64(adv-w)) > 1e-9*float64(w) {
			t.Errorf("%q: advance %v, font width %v", s, adv, w)
		}
		visible := 0
		for _, r := range s {
			if r != ' ' {
				visible++
			}
		}
		if len(rec.Actions) != visible {
			t.Errorf("%q: %d filled outlines, want %d", s, len(rec.Actions), visible)
		}
	}
	if !singleByte("plain ASCII, ±, ×, é") {
		t.Error("Latin-1 text should stay text")
	}

	p := plot.New()
	p.Title.Text = "Δp_b against ε"
	p.X.Label.Text = "ε"
	p.Y.Label.Text = "|numeric − first order|"
	path := filepath.Join(t.TempDir(), "glyphs.pdf")
	if err := savePlot(p, 3*vg.Inch, 2*vg.Inch, path); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(path)
	if err != nil || !bytes.HasPrefix(b, []byte("%PDF")) {
		t.Fatalf("no PDF written: %v", err)
	}
}
