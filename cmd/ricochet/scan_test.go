package main

import (
	"bytes"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"

	"ricochet/observables/scenario"
)

// TestScanSpinTensor: a spin-tensor scan prints the conventions used.
func TestScanSpinTensor(t *testing.T) {
	code, out, e := run("scan", "--spin", "tensor", "--observable", "dS_lb", "--points", "5", "--signature", "+---", "--quiet")
	if code != 0 || !strings.Contains(out, "(+,-,-,-)") || !strings.Contains(out, "S^{mu nu}") {
		t.Errorf("tensor scan: %d %s %s", code, out, e)
	}
}

// TestResume: a recorded scan interrupted after k points and resumed gives
// a byte-identical file and the same table as an uninterrupted run; a
// file recorded with other settings is refused with exit status 2.
func TestResume(t *testing.T) {
	dir := t.TempDir()
	full, part := filepath.Join(dir, "full.jsonl"), filepath.Join(dir, "part.jsonl")
	args := []string{"scan", "--scenario", "coulomb-darwin", "--points", "7", "--quiet"}
	code, want, e := run(append(args, "--output", full)...)
	if code != 0 {
		t.Fatalf("full run: %d %s", code, e)
	}
	interruptAfter = 3
	code, _, _ = run(append(args, "--output", part, "--workers", "2")...)
	interruptAfter = 0
	if code != 1 {
		t.Fatalf("interrupted run exited %d, want 1", code)
	}
	b, _ := os.ReadFile(part)
	if n := strings.Count(string(b), "\n"); n < 4 || n >= 8 {
		t.Fatalf("interrupted file has %d lines, want header + 3..6 points", n)
	}
	// Simulate a partly written last line (kill during a write).
	os.WriteFile(part, append(b, []byte(`{"i":6,"eps":0.1`)...), 0o644)
	code, got, e := run(append(args, "--output", part, "--resume", "--workers", "2")...)
	if code != 0 {
		t.Fatalf("resume: %d %s", code, e)
	}
	f1, _ := os.ReadFile(full)
	f2, _ := os.ReadFile(part)
	if !bytes.Equal(f1, f2) {
		t.Errorf("resumed file differs from the uninterrupted one")
	}
	if got != want {
		t.Errorf("resumed table differs:\n%s\nvs\n%s", got, want)
	}
	code, _, e = run("scan", "--scenario", "coulomb-darwin", "--points", "8", "--quiet", "--output", full, "--resume")
	if code != 2 || !strings.Contains(e, "recorded for another scenario") || strings.Count(strings.TrimSpace(e), "\n") != 0 {
		t.Errorf("mismatched resume: exit %d, %q", code, e)
	}
	code, _, e = run(append(args, "--output", full)...)
	if code != 2 || !strings.Contains(e, "exists") {
		t.Errorf("overwrite: exit %d, %q", code, e)
	}
}

// TestLaTeX: the LaTeX tables fit the page. For 1, 2, 3 and 4
// observables, the --spread scan (three completions), a 64-point scan
// (continued tables) and every built-in scenario, the latex-doc output compiles with pdflatex and the
// log has no overfull box and no float too large for its page; the latex
// fragment does the same inside a plain article (textwidth 345 pt, the
// default of the standard class at 10 pt: one column of a paper).
func TestLaTeX(t *testing.T) {
	pdflatex, err := exec.LookPath("pdflatex")
	if err != nil {
		t.Log("pdflatex not installed: the tables are checked for structure only")
	}
	// builtin: a built-in scenario's table, compiled as the fragment in an
	// article only (latex-doc is the same tables in a wider page).
	cases := []struct {
		name    string
		args    []string
		builtin bool
	}{
		{"1 observable", []string{"--observable", "dp_b"}, false},
		{"2 observables", []string{"--observable", "dp_b,dp_n"}, false},
		{"3 observables", []string{"--observable", "dp_b,dp_n,da_b"}, false},
		{"4 observables", []string{"--observable", "dp_b,dp_n,da_b,da_l"}, false},
		{"spread", []string{"--spread", "--observable", "dp_b"}, false},
		{"64 points", []string{"--observable", "dp_l", "--points", "64"}, false},
	}
	// Every built-in scenario at its default observable (the slow
	// Taub–NUT spinning one only without -short).
	for _, name := range scenario.BuiltinNames() {
		if name == "ktn-spinning-nut" && testing.Short() {
			continue
		}
		cases = append(cases, struct {
			name    string
			args    []string
			builtin bool
		}{name, []string{"--scenario", name, "--points", "7"}, true})
	}
	for _, c := range cases {
		args := append([]string{"scan", "--points", "13", "--quiet"}, c.args...)
		code, doc, e := run(append(args, "--format", "latex-doc")...)
		if code != 0 || !strings.Contains(doc, `\toprule`) || !strings.Contains(doc, `\times10^{`) {
			t.Fatalf("%s: latex-doc: %d %s", c.name, code, e)
		}
		code, frag, e := run(append(args, "--format", "latex")...)
		if code != 0 || strings.Contains(frag, `\documentclass`) {
			t.Fatalf("%s: latex: %d %s", c.name, code, e)
		}
		tables := strings.Count(doc, `\begin{table}`)
		t.Logf("%s: %d tables", c.name, tables)
		if tables < strings.Count(strings.Join(c.args, " "), ",")+1 {
			t.Errorf("%s: %d tables, want one per series at least", c.name, tables)
		}
		if pdflatex == "" {
			continue
		}
		article := "\\documentclass{article}\n\\usepackage[T1]{fontenc}\n\\usepackage{amsmath,booktabs,dcolumn}\n\\begin{document}\n" + frag + "\\end{document}\n"
		srcs := []struct{ what, tex string }{{"latex in a plain article", article}, {"latex-doc", doc}}
		if c.builtin {
			srcs = srcs[:1]
		}
		for _, src := range srcs {
			log := compileLaTeX(t, pdflatex, src.tex)
			for _, bad := range []string{"Overfull \\hbox", "Overfull \\vbox", "Float too large"} {
				if i := strings.Index(log, bad); i >= 0 {
					t.Errorf("%s, %s: %s", c.name, src.what, strings.SplitN(log[i:], "\n", 2)[0])
				}
			}
		}
	}
}

// compileLaTeX runs pdflatex on tex in a fresh directory and returns its log.
func compileLaTeX(t *testing.T, pdflatex, tex string) string {
	t.Helper()
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "t.tex"), []byte(tex), 0o644)
	cmd := exec.Command(pdflatex, "-interaction=nonstopmode", "-halt-on-error", "t.tex")
	cmd.Dir = dir
	if b, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("pdflatex: %v\n%s", err, b)
	}
	log, err := os.ReadFile(filepath.Join(dir, "t.log"))
	if err != nil {
		t.Fatal(err)
	}
	return string(log)
}

// TestPlot: figures are written in each format chosen by extension, one
// column wide (3.4 in; 1020 pixels at 300 dpi for PNG), with no text left
// to the PDF's font encoding, for two and three observables and for a
// --spread scan.
func TestPlot(t *testing.T) {
	dir := t.TempDir()
	for _, c := range [][]string{
		{"--observable", "dp_b,dp_n"},
		{"--observable", "dp_b,dp_n,da_b", "--scenario", "rootkerr-pair"},
		{"--spread", "--observable", "dp_b,dp_n"},
	} {
		for _, ext := range []string{"png", "svg", "pdf", "eps"} {
			f := filepath.Join(dir, "r."+ext)
			if code, _, e := run(append([]string{"scan", "--points", "7", "--plot", f, "--quiet"}, c...)...); code != 0 {
				t.Fatalf("%v %s: %d %s", c, ext, code, e)
			}
			st, err := os.Stat(f)
			if err != nil || st.Size() < 1000 {
				t.Fatalf("%v %s: %v", c, f, err)
			}
			if ext == "pdf" {
				// Every label is drawn as glyph outlines: a font in the
				// PDF means text went through gonum/plot's code-page-1252
				// encoding, which garbles ε, Δ and −.
				if b, _ := os.ReadFile(f); bytes.Contains(b, []byte("/Type /Font")) {
					t.Errorf("%v: the PDF embeds a font", c)
				}
			}
			if ext != "png" {
				continue
			}
			r, _ := os.Open(f)
			cfg, err := png.DecodeConfig(r)
			r.Close()
			// 3.4 in at 300 dpi, rounded by the rasteriser.
			if err != nil || cfg.Width < 1019 || cfg.Width > 1021 || cfg.Height < cfg.Width {
				t.Errorf("%v: PNG %dx%d (%v), want 1020 wide and taller than wide", c, cfg.Width, cfg.Height, err)
			}
		}
	}
}

// TestScriptText: labels with sub- and superscripts are split into their
// pieces, so no raw markup reaches the figure, and a subscript is set
// smaller than the text.
func TestScriptText(t *testing.T) {
	got := scriptPieces("Δp_{b}: residual/ε^{2}, x_y")
	want := []scriptPiece{{"Δp", 0}, {"b", -1}, {": residual/ε", 0}, {"2", 1}, {", x_", 0}, {"y", 0}}
	if len(got) != len(want) {
		t.Fatalf("pieces %q, want %q", got, want)
	}
	for i := range got {
		if got[i] != want[i] {
			t.Errorf("piece %d: %q, want %q", i, got[i], want[i])
		}
	}
	fnt := font.From(plot.DefaultFont, 10)
	w1, _, d1 := mathText.Box("Δp_{b}", fnt)
	w2, _, d2 := mathText.Plain.Box("Δpb", fnt)
	if !(w1 < w2) || !(d1 > d2) {
		t.Errorf("Δp_{b}: width %v depth %v, plain Δpb width %v depth %v: want a narrower, lower subscript", w1, d1, w2, d2)
	}
}
