package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestScanSpread: `scan --spread` on the built-in root-Kerr scenario
// reports the six members of the root-Kerr family side by side, each with a residual
// exponent ≈ 2 against its own first order and a next-order coefficient,
// and their spread; other probes are refused with exit status 2.
func TestScanSpread(t *testing.T) {
	code, out, e := run("scan", "--spread", "--quiet", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, e)
	}
	validateJSON(t, "scan", out)
	var doc struct {
		Spread []spreadSummary `json:"spread"`
		Series []series        `json:"series"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Spread) != 1 || len(doc.Spread[0].Members) != 6 || len(doc.Series) != 6 {
		t.Fatalf("spread %+v, %d series", doc.Spread, len(doc.Series))
	}
	sp := doc.Spread[0]
	lo, hi := math.Inf(1), math.Inf(-1)
	for k, m := range sp.Members {
		if m.Model != []string{"root-kerr", "root-kerr-conservative", "bmt", "dixon", "root-kerr-body", "root-kerr-body-contact"}[k] {
			t.Errorf("member %d is %q", k, m.Model)
		}
		t.Logf("%s: n = %.6f ± %.1e, c2 = %.8g ± %.1e", m.Model, m.Exponent, m.SigmaExponent, m.NextOrder, m.SigmaNextOrder)
		// Within three standard uncertainties of 2 (a floor of 1e-4 as in
		// TestDefaultScanExponent).
		if math.Abs(m.Exponent-2) > 3*m.SigmaExponent+1e-4 {
			t.Errorf("%s: exponent %v ± %v, want 2", m.Model, m.Exponent, m.SigmaExponent)
		}
		if !(m.SigmaNextOrder > 0) || math.IsNaN(m.NextOrder) {
			t.Errorf("%s: next order %v ± %v", m.Model, m.NextOrder, m.SigmaNextOrder)
		}
		lo, hi = math.Min(lo, m.NextOrder), math.Max(hi, m.NextOrder)
	}
	if sp.Spread != hi-lo || !(sp.SigmaSpread > 0) {
		t.Errorf("spread %v ± %v, want max − min = %v", sp.Spread, sp.SigmaSpread, hi-lo)
	}
	t.Logf("spread = %.6g ± %.1e", sp.Spread, sp.SigmaSpread)
	// CSV states the spread in its '#' lines (--csv-comments).
	for _, format := range []string{"table", "csv", "latex"} {
		_, out, _ := run("scan", "--spread", "--quiet", "--points", "5", "--format", format, "--csv-comments")
		for _, name := range []string{"root-kerr-conservative", "bmt", "dixon", "root-kerr-body", "root-kerr-body-contact", "spread"} {
			if !strings.Contains(out, name) {
				t.Errorf("%s output lacks %q", format, name)
			}
		}
	}
	code, _, e = run("scan", "--scenario", "coulomb-darwin", "--spread")
	if code != 2 || !strings.Contains(e, "--spread") || !strings.Contains(e, "root-kerr") || strings.Count(strings.TrimSpace(e), "\n") != 0 {
		t.Errorf("--spread on a charge probe: exit %d, %q", code, e)
	}
	f := filepath.Join(t.TempDir(), "spread.png")
	if code, _, e := run("scan", "--spread", "--quiet", "--points", "5", "--plot", f); code != 0 {
		t.Errorf("plot: %d %s", code, e)
	}
}

// TestSpreadResume: a --spread scan interrupted and resumed gives the same
// record file as an uninterrupted one, and the spread setting is part of
// the record's identity (a plain scan refuses a --spread file).
func TestSpreadResume(t *testing.T) {
	dir := t.TempDir()
	full, part := filepath.Join(dir, "full.jsonl"), filepath.Join(dir, "part.jsonl")
	args := []string{"scan", "--spread", "--points", "4", "--quiet"}
	code, want, e := run(append(args, "--output", full)...)
	if code != 0 {
		t.Fatalf("full run: %d %s", code, e)
	}
	interruptAfter = 5
	code, _, _ = run(append(args, "--output", part, "--workers", "2")...)
	interruptAfter = 0
	if code != 1 {
		t.Fatalf("interrupted run exited %d, want 1", code)
	}
	code, got, e := run(append(args, "--output", part, "--resume", "--workers", "2")...)
	if code != 0 {
		t.Fatalf("resume: %d %s", code, e)
	}
	f1, _ := os.ReadFile(full)
	f2, _ := os.ReadFile(part)
	if !bytes.Equal(f1, f2) || got != want {
		t.Errorf("resumed --spread scan differs from the uninterrupted one")
	}
	if n := strings.Count(string(f1), "\n"); n != 1+24+1 {
		t.Errorf("record file has %d lines, want header + 6×4 points + trailer", n)
	}
	code, _, e = run("scan", "--points", "4", "--quiet", "--output", full, "--resume")
	if code != 2 || !strings.Contains(e, "recorded for another scenario or other scan settings") {
		t.Errorf("plain resume of a --spread file: exit %d, %q", code, e)
	}
}
