package main

import (
	"bytes"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"ricochet/validate/exact"
)

// scenarioAt loads a built-in scenario with overrides applied before
// validation.
func scenarioAt(t *testing.T, name string, edit func(*Scenario)) *Scenario {
	t.Helper()
	b, err := loadBuiltin(name)
	if err != nil {
		t.Fatal(err)
	}
	s, err := parseScenario(b, name)
	if err != nil {
		t.Fatal(err)
	}
	if edit != nil {
		edit(s)
	}
	if err := s.validate(); err != nil {
		t.Fatal(err)
	}
	return s
}

// TestSchwarzschild2PM3PM: scans of real integrations recover the
// test-mass 2PM angle coefficient χ2 = (3π/4)(5γ² − 1)/(γ² − 1) (Westpfahl
// 1985, widely published) at several γ, through Δp_b/m = −γv sin χ with
// χ = χ1 ε + χ2 ε² + χ3 ε³ + … and ε = M/b, b = L/p (so the ε² coefficient
// of Δp_b/m is −γv χ2), to 1e-6 relative with an uncertainty that covers
// the truth; and the 3PM coefficient from the series of the exact
// deflection integral (exact.SchwarzschildPM, derived there by expansion):
// the ε³ coefficient is −γv(χ3 − χ1³/6).
func TestSchwarzschild2PM3PM(t *testing.T) {
	for _, g := range []float64{1.1, 1.5, 3} {
		s := scenarioAt(t, "schwarzschild", func(s *Scenario) {
			s.Kinematics.Gamma, s.Kinematics.V = g, 0
			// The series runs in ε/v² (Darwin 1913; the same holds for the
			// Schwarzschild deflection): ε/v² ≤ 0.05 keeps the degree-4
			// truncation, ~(ε/v²)⁵, below the integration noise.
			v2 := 1 - 1/(g*g)
			s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points = 1e-4, math.Min(0.01, 0.05*v2), 17
		})
		f := doFits(runPoints(s, false, 2, 0))
		if f.NextOrder == nil {
			t.Fatalf("γ=%g: %s", g, f.NextErr)
		}
		v := s.Kinematics.V
		chi1, chi2, chi3 := exact.SchwarzschildPM(v)
		want2 := -g * v * chi2
		want3 := -g * v * (chi3 - chi1*chi1*chi1/6)
		n := f.NextOrder
		t.Logf("γ=%g: c2 = %.10g ± %.1e (want %.10g, rel. dev %.1e), c3 = %.6g ± %.1e (want %.6g), degree %d",
			g, n.C2, n.SigmaC2, want2, math.Abs(n.C2/want2-1), n.C3, n.SigmaC3, want3, n.Degree)
		// 1e-6 relative: the accuracy asked of a 2PM extraction; the
		// uncertainty must cover the truth at 3σ.
		if d := math.Abs(n.C2 - want2); d > 1e-6*math.Abs(want2) || d > 3*n.SigmaC2 {
			t.Errorf("γ=%g: 2PM coefficient %.10g ± %.1e, want %.10g", g, n.C2, n.SigmaC2, want2)
		}
		// 3PM: the slope of residual/ε² is fitted with fewer digits; demand
		// 3σ coverage and 1e-3 relative.
		if d := math.Abs(n.C3 - want3); n.Degree < 1 || d > 3*n.SigmaC3 || d > 1e-3*math.Abs(want3) {
			t.Errorf("γ=%g: 3PM coefficient %.6g ± %.1e, want %.6g", g, n.C3, n.SigmaC3, want3)
		}
	}
}

// TestCoulombNextOrder: the next-order coefficient of the Coulomb impulse
// from Darwin's exact deflection (Darwin 1913; series in exact.DarwinSeries):
// Δp_b/m = γv sin χ (repulsion towards +b), so the ε² coefficient is γv c2
// = −π/(2γv).
func TestCoulombNextOrder(t *testing.T) {
	for _, g := range []float64{1.25, 2} {
		s := scenarioAt(t, "coulomb-darwin", func(s *Scenario) {
			s.Kinematics.Gamma, s.Kinematics.V = g, 0
			v2 := 1 - 1/(g*g) // series in ε/v², as above
			s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points = 1e-4, 0.05*v2, 15
		})
		f := doFits(runPoints(s, false, 2, 0))
		if f.NextOrder == nil {
			t.Fatal(f.NextErr)
		}
		v := s.Kinematics.V
		_, c2, _ := exact.DarwinSeries(v)
		want := g * v * c2
		n := f.NextOrder
		t.Logf("γ=%g: c2 = %.10g ± %.1e, want %.10g", g, n.C2, n.SigmaC2, want)
		// Same accuracy and coverage demand as the 2PM check.
		if d := math.Abs(n.C2 - want); d > 1e-6*math.Abs(want) || d > 3*n.SigmaC2 {
			t.Errorf("γ=%g: c2 = %.10g ± %.1e, want %.10g", g, n.C2, n.SigmaC2, want)
		}
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

// TestConventionSwitches: the first-order agreement (relative residual,
// exponent) is invariant under the output conventions, while the printed
// numbers transform as they should: Heaviside–Lorentz multiplies the
// electromagnetic ε by 4π and divides residual/ε² by (4π)²; the eikonal b
// changes ε at next order only.
func TestConventionSwitches(t *testing.T) {
	s := scenarioAt(t, "coulomb-darwin", func(s *Scenario) { s.Scan.Points = 9 })
	recs, _ := runRecords(s, nil, nil, 0, nil)
	o, _ := parseObservable("dp_b", defaultConv)
	base := buildResult(s, "", recs, scanOptions{obs: []observable{o}, conv: defaultConv})
	hl := defaultConv
	hl.Units = 1
	h := buildResult(s, "", recs, scanOptions{obs: []observable{o}, conv: hl})
	eik := defaultConv
	eik.Impact = 2
	ek := buildResult(s, "", recs, scanOptions{obs: []observable{o}, conv: eik})
	for i, p := range base.Series[0].Points {
		q := h.Series[0].Points[i]
		// Exact up to rounding of the products (a few ulp).
		if math.Abs(q.Eps/p.Eps-4*math.Pi) > 1e-14 || q.Numeric != p.Numeric ||
			math.Abs(q.Ratio*16*math.Pi*math.Pi/p.Ratio-1) > 1e-13 ||
			q.Residual/q.First != p.Residual/p.First {
			t.Errorf("point %d: Heaviside–Lorentz row %+v vs Gaussian %+v", i, q, p)
		}
		r := ek.Series[0].Points[i]
		// b_eik = b cos(χ/2): ε differs by O(χ²) ~ O(ε²) relative.
		if d := math.Abs(r.Eps/p.Eps - 1); d > 2*p.Eps*p.Eps/(s.Kinematics.V*s.Kinematics.V) {
			t.Errorf("point %d: eikonal ε %v vs %v", i, r.Eps, p.Eps)
		}
	}
	for name, res := range map[string]scanResult{"gaussian": base, "hl": h, "eikonal": ek} {
		e := res.Series[0].Fits.Exponent
		// Inside the window the local exponent is 2 + (c3/c2) ε + …, so the
		// fitted n may lie |c3/c2|·EpsHi from 2 (as in the fit package's
		// Darwin test), with c3/c2 from the same scan.
		no := res.Series[0].Fits.NextOrder
		bias := 0.0
		if e != nil && no != nil && no.Degree >= 1 {
			bias = math.Abs(no.C3/no.C2) * e.EpsHi
		}
		if e == nil || math.Abs(e.N-2) > 3*e.SigmaN+bias+1e-4 {
			t.Errorf("%s: exponent %+v, want 2", name, e)
		}
	}
	nb, nh := base.Series[0].Fits.NextOrder, h.Series[0].Fits.NextOrder
	if math.Abs(nh.C2*16*math.Pi*math.Pi/nb.C2-1) > 1e-6 {
		t.Errorf("next order: %v (HL) vs %v (Gaussian)", nh.C2, nb.C2)
	}
	// Spin tensor and signature: the run prints the conventions used.
	code, out, e := run("scan", "--spin", "tensor", "--observable", "dS_lb", "--points", "5", "--signature", "+---", "--quiet")
	if code != 0 || !strings.Contains(out, "(+,-,-,-)") || !strings.Contains(out, "S^{mu nu}") {
		t.Errorf("tensor scan: %d %s %s", code, out, e)
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
