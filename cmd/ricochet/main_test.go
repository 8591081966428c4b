package main

import (
	"bytes"
	"math"
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
		{[]string{"run", "--gamma", "0.5"}, "kinematics.gamma = 0.5; allowed: 1 < gamma < ∞"},
		{[]string{"run", "--b", "-1"}, "kinematics.b = -1; allowed: 0 < b < ∞"},
		{[]string{"run", "--tol", "1"}, "numerics.tol = 1; allowed"},
		{[]string{"scan", "--points", "1"}, "scan.points = 1; allowed: 2 ≤ points ≤ 10000"},
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

// TestScanWorkers: the scan's results are bit-identical for any number of
// workers.
func TestScanWorkers(t *testing.T) {
	b, _ := loadBuiltin(defaultScenario)
	s, err := parseScenario(b, "default")
	if err != nil {
		t.Fatal(err)
	}
	s.Scan.Points = 5
	if err := s.validate(); err != nil {
		t.Fatal(err)
	}
	one := runPoints(s, false, 2, 1)
	two := runPoints(s, false, 2, 2)
	for i := range one {
		if one[i] != two[i] {
			t.Errorf("point %d differs: %+v vs %+v", i, one[i], two[i])
		}
	}
}

// TestDefaultScanExponent: on the built-in default scenario (a root-Kerr
// probe past a root-Kerr source with non-aligned spins) the residual of the
// first-order closed form scales as ε², the order of the next term of the
// perturbative expansion.
func TestDefaultScanExponent(t *testing.T) {
	b, _ := loadBuiltin(defaultScenario)
	s, _ := parseScenario(b, "default")
	if err := s.validate(); err != nil {
		t.Fatal(err)
	}
	for _, obs := range []struct {
		spin bool
		comp int
	}{{false, 2}, {false, 3}, {true, 2}} {
		f := doFits(runPoints(s, obs.spin, obs.comp, 0))
		if f.Exponent == nil {
			t.Fatalf("%+v: no exponent: %s", obs, f.ExponentErr)
		}
		e := f.Exponent
		t.Logf("%+v: n = %.6f ± %.1e", obs, e.N, e.SigmaN)
		// Within three standard uncertainties of 2 (a floor of 1e-4 covers
		// fits whose stated uncertainty is at the rounding level).
		if d := math.Abs(e.N - 2); d > 3*e.SigmaN+1e-4 {
			t.Errorf("%+v: exponent %.6f ± %.1e, want 2", obs, e.N, e.SigmaN)
		}
	}
}

// TestScanFormats: CSV and JSON carry the conventions and every point.
func TestScanFormats(t *testing.T) {
	code, out, errs := run("scan", "--scenario", "coulomb-darwin", "--points", "3", "--format", "csv")
	if code != 0 || !strings.Contains(out, "# G = c = 1") || strings.Count(out, "scattered") != 3 {
		t.Errorf("csv: exit %d, %q %q", code, out, errs)
	}
	code, out, errs = run("scan", "--scenario", "coulomb-darwin", "--points", "3", "--format", "json")
	if code != 0 || !strings.Contains(out, "\"conventions\"") || !strings.Contains(out, "\"residual_over_eps2\"") {
		t.Errorf("json: exit %d, %q %q", code, out, errs)
	}
}

// TestCurvedScans: for each curved family the residual of the 1PM closed
// form scales as ε² (ε = |M + iN|/b); for Schwarzschild the extracted
// next-order coefficient of Δp_b/m is γv times the published 2PM angle
// coefficient (3π/4)(5γ² − 1)/(γ² − 1) (Westpfahl 1985), negative since the
// kick points towards the source.
func TestCurvedScans(t *testing.T) {
	for _, name := range []string{"schwarzschild", "nut-lens"} {
		b, _ := loadBuiltin(name)
		s, _ := parseScenario(b, name)
		if err := s.validate(); err != nil {
			t.Fatal(err)
		}
		f := doFits(runPoints(s, false, 2, 0))
		if f.Exponent == nil || f.NextOrder == nil {
			t.Fatalf("%s: fits failed: %s %s", name, f.ExponentErr, f.NextErr)
		}
		e := f.Exponent
		t.Logf("%s: n = %.6f ± %.1e, c2 = %.9g ± %.1e", name, e.N, e.SigmaN, f.NextOrder.C2, f.NextOrder.SigmaC2)
		if d := math.Abs(e.N - 2); d > 3*e.SigmaN+1e-4 {
			t.Errorf("%s: exponent %.6f ± %.1e, want 2", name, e.N, e.SigmaN)
		}
		if name == "schwarzschild" {
			g := s.Kinematics.Gamma
			want := -g * s.Kinematics.V * 3 * math.Pi / 4 * (5*g*g - 1) / (g*g - 1)
			// 1e-6 relative: the accuracy asked of a 2PM extraction.
			if d := math.Abs(f.NextOrder.C2 - want); d > 1e-6*math.Abs(want) {
				t.Errorf("2PM coefficient %.9g, want %.9g", f.NextOrder.C2, want)
			}
		}
	}
}
