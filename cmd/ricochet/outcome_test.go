package main

import (
	"encoding/csv"
	"encoding/json"
	"errors"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"ricochet/validate/exact"
)

// TestOutcomesAreNotNumbers: an event that does not scatter gives no
// numbers in any writer: null in JSON, empty cells in CSV, the named
// status in the tables; exit 0, since the outcome is a computed result.
func TestOutcomesAreNotNumbers(t *testing.T) {
	// Captured: b = 5M at v = 0.5 is inside the capture cross-section of a
	// Schwarzschild hole (b_crit → 4M/v = 8M for slow probes, from memory;
	// confirmed by exact.Schwarzschild, which finds no turning point).
	code, js, e := run("run", "--scenario", "schwarzschild", "--b", "0.05", "--format", "json")
	if code != 0 || e != "" {
		t.Fatalf("captured run: exit %d, %q", code, e)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(js), &m); err != nil {
		t.Fatal(err)
	}
	if m["status"] != "captured" {
		t.Errorf("status %v", m["status"])
	}
	for _, k := range []string{"p_out", "impulse", "impulse_err", "impulse_covariant", "impulse_squared", "scattering_angle", "scattering_angle_err", "in_plane_angle", "in_plane_angle_swept", "windings", "out_of_plane_angle", "error_tolerance", "error_truncation"} {
		if v, ok := m[k]; !ok || v != nil {
			t.Errorf("captured run: %s = %v, want null", k, v)
		}
	}
	code, txt, _ := run("run", "--scenario", "schwarzschild", "--b", "0.05")
	if code != 0 || !strings.Contains(txt, "status: captured") || strings.Contains(txt, "± error") {
		t.Errorf("captured run text: exit %d\n%s", code, txt)
	}
	// A scan whose strong-coupling points are captured: b = 0.05 with
	// |ε| = M/b up to 0.3 (M = 0.015 at the top, b = 3.3M, captured).
	args := []string{"scan", "--scenario", "schwarzschild", "--eps-min", "1e-3", "--eps-max", "0.3", "--points", "3", "--quiet"}
	code, out, e := run(append(args, "--format", "csv")...)
	if code != 0 {
		t.Fatalf("scan csv: exit %d %q", code, e)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := map[string]int{}
	for i, h := range rows[0] {
		col[h] = i
	}
	captured := 0
	for _, r := range rows[1:] {
		if r[col["status"]] == "scattered" {
			if r[col["numeric"]] == "" || r[col["error"]] == "" {
				t.Errorf("scattered row without numbers: %v", r)
			}
			continue
		}
		captured++
		for _, k := range []string{"numeric", "first_order", "residual", "residual_over_eps2", "error", "error_tolerance", "error_truncation", "max_drift", "second_order", "second_order_error", "residual_after_second"} {
			if r[col[k]] != "" {
				t.Errorf("%s row: %s = %q, want empty", r[col["status"]], k, r[col[k]])
			}
		}
	}
	if captured == 0 {
		t.Fatalf("no captured point in the scan:\n%s", out)
	}
	code, out, _ = run(append(args, "--format", "json")...)
	var doc struct {
		Series []struct {
			Points []map[string]any `json:"points"`
		} `json:"series"`
	}
	if err := json.Unmarshal([]byte(out), &doc); code != 0 || err != nil {
		t.Fatalf("scan json: exit %d, %v", code, err)
	}
	for _, p := range doc.Series[0].Points {
		if p["status"] == "scattered" {
			continue
		}
		for _, k := range []string{"numeric", "first_order", "residual", "error", "second_order"} {
			if v, ok := p[k]; ok && v != nil {
				t.Errorf("%v point: %s = %v, want null", p["status"], k, v)
			}
		}
	}
	code, out, _ = run(append(args, "--format", "table")...)
	if code != 0 || !strings.Contains(out, "captured") || strings.Contains(out, "NaN") {
		t.Errorf("scan table: exit %d\n%s", code, out)
	}
	code, out, _ = run(append(args, "--format", "latex")...)
	if code != 0 || !strings.Contains(out, `\multicolumn{3}{c}{captured}`) || strings.Contains(out, "NaN") {
		t.Errorf("scan latex: exit %d\n%s", code, out)
	}
}

// TestFirstOrderNotApplicable: with the spins normal to the plane of
// motion and |a| ≥ b the straight line of the first order runs along the
// branch disk (root-Kerr) or meets the Kerr ring: no first-order number
// is printed, the reason is; the event itself is computed.
func TestFirstOrderNotApplicable(t *testing.T) {
	dir := t.TempDir()
	rk := filepath.Join(dir, "rk.toml")
	// Source spin 1.5 b along +z, probe spin 0.2 b along +z: the shifts
	// add to 1.7 b > b.
	os.WriteFile(rk, []byte("[background]\nkind = \"root-kerr\"\ncharge = 0.01\nspin = [0, 0, 1.5]\n[probe]\nkind = \"root-kerr\"\ncharge = 1\nspin = [0, 0, 0.2]\n[kinematics]\ngamma = 1.5\n"), 0o644)
	code, js, e := run("run", "--format", "json", rk)
	if code != 0 {
		t.Fatalf("exit %d %q", code, e)
	}
	var m map[string]any
	json.Unmarshal([]byte(js), &m)
	if src, _ := m["first_order_source"].(string); !strings.HasPrefix(src, "not applicable") || !strings.Contains(src, "branch disk") {
		t.Errorf("first_order_source %q", src)
	}
	if strings.Contains(js, "NaN") {
		t.Errorf("NaN in JSON")
	}
	code, txt, _ := run("run", rk)
	if code != 0 || !strings.Contains(txt, "first order: not applicable") || strings.Contains(txt, "NaN") {
		t.Errorf("text: exit %d\n%s", code, txt)
	}
	code, out, _ := run("scan", "--quiet", "--points", "3", "--format", "csv", "--observable", "dp_b,da_b", rk)
	rows, _ := csv.NewReader(strings.NewReader(out)).ReadAll()
	if code != 0 || len(rows) != 7 {
		t.Fatalf("scan: exit %d\n%s", code, out)
	}
	for _, r := range rows[1:] {
		if r[3] == "scattered" && (r[4] == "" || r[5] != "" || r[6] != "") {
			t.Errorf("row %v: want a numeric value and empty first order and residual", r)
		}
	}
	// Super-extremal Kerr with |a| > b: warned about and run; the
	// straight line in the equatorial plane meets the disk, so does the
	// path (a named outcome), and there is no first order.
	kerr := filepath.Join(dir, "kerr.toml")
	os.WriteFile(kerr, []byte("[background]\nkind = \"kerr\"\nmass = 0.01\nspin = [0, 0, 1.5]\n[probe]\nkind = \"geodesic\"\n[kinematics]\ngamma = 1.5\n"), 0o644)
	code, txt, e = run("run", kerr)
	if code != 0 || !strings.Contains(txt, "warning: super-extremal") || !strings.Contains(txt, "status: crossed branch disk") || !strings.Contains(txt, "first order: not applicable") {
		t.Errorf("super-extremal Kerr: exit %d %q\n%s", code, e, txt)
	}
}

// TestReachedRing: a probe attracted by a root-Kerr source in the plane of
// its ring (spin normal to the plane of motion) falls into the ring: a
// named outcome with exit 0, not an integrator failure.
func TestReachedRing(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct{ charge, spin string }{{"-0.5", "0.5"}, {"-0.05", "1.2"}} {
		f := filepath.Join(dir, "ring.toml")
		os.WriteFile(f, []byte("[background]\nkind = \"root-kerr\"\ncharge = "+c.charge+"\nspin = [0, 0, "+c.spin+"]\n[probe]\nkind = \"charge\"\ncharge = 1\n[kinematics]\ngamma = 1.2\n"), 0o644)
		code, txt, e := run("run", f)
		if code != 0 || !strings.Contains(txt, "status: reached ring singularity") {
			t.Errorf("Q = %s, a = %s: exit %d %q\n%s", c.charge, c.spin, code, e, txt)
		}
	}
}

// TestSweptDeflection: near the critical impact parameter of a
// Schwarzschild hole the probe's direction turns by more than π (and by
// more than 2π closer in); run reports the swept angle, which agrees with
// the exact deflection of the radial quadrature (Schwarzschild 1916;
// Darwin 1959 for the reduction to elliptic integrals; Chandrasekhar 1983
// §19; all from memory; validate/exact), and the full turns.
func TestSweptDeflection(t *testing.T) {
	const v, M = 0.5, 0.01 // the schwarzschild built-in
	chi := func(b float64) (float64, float64, bool) {
		sc, err := exact.Schwarzschild(v, b, M)
		if errors.Is(err, exact.ErrCaptured) {
			return 0, 0, false
		}
		if err != nil {
			t.Fatal(err)
		}
		return sc.Chi, sc.ChiErr, true
	}
	// χ(b) decreases from +∞ at the critical b: bisect for the b of a
	// given χ between a captured b and one with a smaller χ.
	bOf := func(target float64) float64 {
		lo, hi := 0.08, 0.2 // captured at 0.08, χ < 1 at 0.2
		for range 200 {
			mid := (lo + hi) / 2
			if c, _, ok := chi(mid); !ok || c > target {
				lo = mid
			} else {
				hi = mid
			}
		}
		return hi
	}
	for _, target := range []float64{2.5, 4, 7} {
		b := bOf(target)
		want, wantErr, _ := chi(b)
		code, js, e := run("run", "--scenario", "schwarzschild", "--b", formatG(b), "--format", "json")
		if code != 0 {
			t.Fatalf("b = %v: exit %d %q", b, code, e)
		}
		var m map[string]any
		json.Unmarshal([]byte(js), &m)
		if m["status"] != "scattered" {
			t.Fatalf("b = %v: %v", b, m["status"])
		}
		swept, _ := m["in_plane_angle_swept"].(float64)
		errBar, _ := m["in_plane_angle_swept_err"].(float64)
		turns, _ := m["windings"].(float64)
		folded, _ := m["scattering_angle"].(float64)
		// Attraction: the in-plane angle is −χ. The tolerance is three
		// reported error bars plus the quadrature's own estimate: the
		// error estimate is the change under a tighter tolerance and a
		// larger radius, which covers the true error in most events but
		// is not a strict bound.
		tol := 3*errBar + wantErr
		if d := math.Abs(-swept - want); !(d <= tol) {
			t.Errorf("b = %.15g: swept %v, exact χ = %v, |difference| %.2e > %.2e", b, -swept, want, d, tol)
		}
		// Full turns of the position, which sweeps π + χ.
		if wt := math.Floor((math.Pi + want) / (2 * math.Pi)); turns != wt {
			t.Errorf("b = %.15g: %v turns, want %v", b, turns, wt)
		}
		// The angle between p_in and p_out is the folded one.
		wf := math.Acos(math.Cos(want))
		if math.Abs(folded-wf) > tol {
			t.Errorf("b = %.15g: folded angle %v, want %v", b, folded, wf)
		}
		t.Logf("b = %.12f: exact χ = %.12f, swept %.12f ± %.1e, folded %.6f, %v turns", b, want, -swept, errBar, folded, turns)
	}
}

func formatG(x float64) string { return strconv.FormatFloat(x, 'g', 17, 64) }
