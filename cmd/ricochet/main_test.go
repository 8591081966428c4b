package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestReadmeUsage keeps the README's usage section in step with the help
// rendered from the command table.
func TestReadmeUsage(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), usageText()) {
		t.Errorf("README.md does not contain the current usage text:\n%s", usageText())
	}
}

func run(args ...string) (code int, stdout, stderr string) {
	var o, e bytes.Buffer
	code = mainWith(args, &o, &e)
	return code, o.String(), e.String()
}

// TestBadInput: bad input exits with status 2 and one line naming the
// field and the allowed range.
func TestBadInput(t *testing.T) {
	dir := t.TempDir()
	unknown := filepath.Join(dir, "unknown.toml")
	os.WriteFile(unknown, []byte("[background]\nkind = \"coulomb\"\ncharge = 0.1\ncolour = 3\n[probe]\nkind = \"charge\"\ncharge = 1\n[kinematics]\ngamma = 2\n"), 0o644)
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"run", "--gamma", "0.5"}, "--gamma = 0.5 (kinematics.gamma); allowed: 1 + 5e-13 ≤ gamma ≤ 1e+08"},
		{[]string{"run", "--b", "-1"}, "--b = -1 (kinematics.b); allowed: 1e-100 ≤ b ≤ 1e+100"},
		{[]string{"run", "--tol", "1"}, "--tol = 1 (numerics.tol); allowed"},
		{[]string{"scan", "--points", "1"}, "--points = 1 (scan.points); allowed: 2 ≤ points ≤ 10000"},
		{[]string{"scan", "--observable", "dp_q"}, "--observable = \"dp_q\""},
		{[]string{"run", "--scenario", "nonesuch"}, "no built-in scenario"},
		{[]string{"run", unknown}, "unknown key background.colour"},
		{[]string{"frobnicate"}, "unknown command"},
	}
	for _, c := range cases {
		code, _, stderr := run(c.args...)
		if code != 2 {
			t.Errorf("%v: exit %d, want 2", c.args, code)
		}
		if !strings.Contains(stderr, c.want) || strings.Count(strings.TrimSpace(stderr), "\n") != 0 {
			t.Errorf("%v: stderr %q, want one line containing %q", c.args, stderr, c.want)
		}
	}
}

func TestHelpAndVersion(t *testing.T) {
	for _, c := range commands {
		code, out, _ := run(c.Name, "--help")
		if code != 0 || !strings.Contains(out, "usage: ricochet "+c.Name) || !strings.Contains(out, "Example:") {
			t.Errorf("%s --help: exit %d, output %q", c.Name, code, out)
		}
	}
	if code, out, _ := run("--version"); code != 0 || !strings.HasPrefix(out, "ricochet ") {
		t.Errorf("--version: %d %q", code, out)
	}
}

// TestScanFormats: CSV starts with its header row and has every point
// (the conventions on request); JSON carries the conventions and every
// point.
func TestScanFormats(t *testing.T) {
	code, out, errs := run("scan", "--scenario", "coulomb-darwin", "--points", "3", "--format", "csv")
	if code != 0 || !strings.HasPrefix(out, "model,observable,eps,") || strings.Count(out, "scattered") != 3 {
		t.Errorf("csv: exit %d, %q %q", code, out, errs)
	}
	code, out, errs = run("scan", "--scenario", "coulomb-darwin", "--points", "3", "--format", "csv", "--csv-comments")
	if code != 0 || !strings.HasPrefix(out, "# G = c = 1") || strings.Count(out, "scattered") != 3 {
		t.Errorf("csv with comments: exit %d, %q %q", code, out, errs)
	}
	code, out, errs = run("scan", "--scenario", "coulomb-darwin", "--points", "3", "--format", "json")
	if code != 0 || !strings.Contains(out, "\"conventions\"") || !strings.Contains(out, "\"residual_over_eps2\"") {
		t.Errorf("json: exit %d, %q %q", code, out, errs)
	}
	validateJSON(t, "scan", out)
	// A multi-parameter scan adds its axes and the next order by slice.
	toml := filepath.Join(t.TempDir(), "axes.toml")
	os.WriteFile(toml, []byte("[background]\nkind = \"coulomb\"\ncharge = 0.01\n[probe]\nkind = \"charge\"\ncharge = 1\n[kinematics]\ngamma = 1.5\n[scan]\neps_min = 1e-3\neps_max = 0.05\npoints = 5\n[[scan.axis]]\nparam = \"v\"\nvalues = [0.4, 0.8]\n"), 0o644)
	code, out, errs = run("scan", toml, "--format", "json", "--quiet", "--expect", "-pi/(2*gamma*v)")
	if code != 0 || !strings.Contains(out, "\"next_order_by_slice\"") || !strings.Contains(out, "\"axis\"") {
		t.Errorf("multi-parameter json: exit %d, %q", code, errs)
	}
	validateJSON(t, "scan", out)
}
