package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
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
// observables, the --spread scan (three completions) and a 64-point scan
// (continued tables), the latex-doc output compiles with pdflatex and the
// log has no overfull box and no float too large for its page; the latex
// fragment does the same inside a plain article (textwidth 345 pt, the
// default of the standard class at 10 pt: one column of a paper).
func TestLaTeX(t *testing.T) {
	pdflatex, err := exec.LookPath("pdflatex")
	if err != nil {
		t.Log("pdflatex not installed: the tables are checked for structure only")
	}
	cases := []struct {
		name string
		args []string
	}{
		{"1 observable", []string{"--observable", "dp_b"}},
		{"2 observables", []string{"--observable", "dp_b,dp_n"}},
		{"3 observables", []string{"--observable", "dp_b,dp_n,da_b"}},
		{"4 observables", []string{"--observable", "dp_b,dp_n,da_b,da_l"}},
		{"spread", []string{"--spread", "--observable", "dp_b"}},
		{"64 points", []string{"--observable", "dp_l", "--points", "64"}},
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
		for _, src := range []struct{ what, tex string }{{"latex-doc", doc}, {"latex in a plain article", article}} {
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

// TestPlot: figures are written in each format chosen by extension.
func TestPlot(t *testing.T) {
	dir := t.TempDir()
	for _, ext := range []string{"png", "svg", "pdf"} {
		f := filepath.Join(dir, "r."+ext)
		if code, _, e := run("scan", "--points", "5", "--observable", "dp_b,dp_n", "--plot", f, "--quiet"); code != 0 {
			t.Fatalf("%s: %d %s", ext, code, e)
		}
		if st, err := os.Stat(f); err != nil || st.Size() < 1000 {
			t.Errorf("%s: %v", f, err)
		}
	}
}
