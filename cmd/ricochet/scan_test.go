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

// TestLaTeX: the LaTeX document compiles with pdflatex when present.
func TestLaTeX(t *testing.T) {
	code, out, e := run("scan", "--scenario", "coulomb-darwin", "--points", "5", "--observable", "dp_b,dp_l", "--format", "latex-doc", "--quiet")
	if code != 0 || !strings.Contains(out, `\toprule`) || !strings.Contains(out, `\times10^{`) {
		t.Fatalf("latex: %d %s %s", code, out, e)
	}
	pdflatex, err := exec.LookPath("pdflatex")
	if err != nil {
		t.Skip("pdflatex not installed")
	}
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "t.tex"), []byte(out), 0o644)
	cmd := exec.Command(pdflatex, "-interaction=nonstopmode", "-halt-on-error", "t.tex")
	cmd.Dir = dir
	if b, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("pdflatex: %v\n%s", err, b)
	}
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
