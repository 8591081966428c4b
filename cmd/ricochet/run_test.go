package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"ricochet/integrate"
	"ricochet/observables/scenario"
)

// runJSON runs `ricochet run --format json` with args and decodes it.
func runJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	code, out, e := run(append([]string{"run", "--format", "json"}, args...)...)
	if code != 0 {
		t.Fatalf("run %v: exit %d: %s", args, code, e)
	}
	validateJSON(t, "run", out)
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("run %v: %v", args, err)
	}
	return m
}

// vec4Of reads the components of the four-vector key in frame
// ("source_rest_frame", components t, x, y, z, or "record_frame", t, l,
// b, n).
func vec4Of(t *testing.T, m map[string]any, key string, frame ...string) [4]float64 {
	t.Helper()
	fr, labels := "source_rest_frame", sourceLabels
	if len(frame) > 0 && frame[0] == "record_frame" {
		fr, labels = "record_frame", frameLabels
	}
	o, ok := m[key].(map[string]any)
	if !ok {
		t.Fatalf("%s: %v", key, m[key])
	}
	c, ok := o[fr].(map[string]any)
	if !ok {
		t.Fatalf("%s.%s: %v", key, fr, o[fr])
	}
	var v [4]float64
	for i, l := range labels {
		v[i] = c[l].(float64)
	}
	return v
}

// tensorOf reads an antisymmetric tensor (source frame) from its six
// labelled components.
func tensorOf(t *testing.T, m map[string]any, key string) [4][4]float64 {
	t.Helper()
	o, ok := m[key].(map[string]any)
	if !ok {
		t.Fatalf("%s: %v", key, m[key])
	}
	c := o["source_rest_frame"].(map[string]any)
	var s [4][4]float64
	for _, ij := range tensorPairs {
		x := c[sourceLabels[ij[0]]+sourceLabels[ij[1]]].(float64)
		s[ij[0]][ij[1]], s[ij[1]][ij[0]] = x, -x
	}
	return s
}

// TestRunConventions: the first-order agreement (residual/first order of
// every impulse component) is the same in every output convention, while
// the printed numbers transform as they should:
//   - contravariant components are signature independent and covariant
//     ones flip sign under (+,−,−,−), as does dp.dp (η ↦ −η);
//   - Heaviside–Lorentz charges are √(4π) times the Gaussian ones, so the
//     electromagnetic coupling qQ/(m b) is 4π times (Jackson, Classical
//     Electrodynamics, 3rd ed., Appendix, from memory);
//   - a spin-tensor component equals the value computed by hand from the
//     printed vectors: with ε^{0123} = −1 and lowered indices in (−,+,+,+),
//     S^{xy} = ε^{12ρσ}p_ρ a_σ = −p_0 a_3 + p_3 a_0 = p⁰a^z − p^z a⁰
//     (ε^{1203} = ε^{0123}, ε^{1230} = −ε^{0123}), which is m a_z in the
//     rest frame.
func TestRunConventions(t *testing.T) {
	g := runJSON(t)
	h := runJSON(t, "--signature", "+---", "--units", "heaviside-lorentz", "--spin", "tensor")
	dp, dpH := vec4Of(t, g, "impulse"), vec4Of(t, h, "impulse")
	f, fH := vec4Of(t, g, "first_order_impulse"), vec4Of(t, h, "first_order_impulse")
	cov, covH := vec4Of(t, g, "impulse_covariant"), vec4Of(t, h, "impulse_covariant")
	for i := 0; i < 4; i++ {
		// The same integration: the numbers must agree exactly.
		if dp[i] != dpH[i] || f[i] != fH[i] {
			t.Errorf("component %d: contravariant impulse %v/%v, first order %v/%v", i, dp[i], dpH[i], f[i], fH[i])
		}
		if f[i] != 0 && (dp[i]-f[i])/f[i] != (dpH[i]-fH[i])/fH[i] {
			t.Errorf("component %d: relative residual changes with the conventions", i)
		}
		if covH[i] != -cov[i] {
			t.Errorf("component %d: covariant %v (+---) vs %v (-+++), want a sign flip", i, covH[i], cov[i])
		}
	}
	// (−,+,+,+): Δp_0 = −Δp^0, Δp_i = Δp^i.
	if cov[0] != -dp[0] || cov[2] != dp[2] {
		t.Errorf("covariant components %v of %v", cov, dp)
	}
	if q, qH := g["impulse_squared"].(float64), h["impulse_squared"].(float64); !(q > 0) || qH != -q {
		t.Errorf("dp.dp = %v (-+++), %v (+---): want spacelike and a sign flip", q, qH)
	}
	eps, epsH := g["epsilon"].(float64), h["epsilon"].(float64)
	// 4π to rounding of one product.
	if math.Abs(epsH/eps/(4*math.Pi)-1) > 1e-15 {
		t.Errorf("eps: HL %v, Gaussian %v, ratio %v, want 4π", epsH, eps, epsH/eps)
	}
	qg := g["charges"].(map[string]any)["source_charge"].(float64)
	qh := h["charges"].(map[string]any)["source_charge"].(float64)
	if math.Abs(qh/qg/math.Sqrt(4*math.Pi)-1) > 1e-15 {
		t.Errorf("source charge: HL %v, Gaussian %v", qh, qg)
	}
	// Spin tensor from the printed vectors.
	pin, ain := vec4Of(t, h, "p_in"), vec4Of(t, h, "a_in")
	pout, aout := vec4Of(t, h, "p_out"), vec4Of(t, h, "a_out")
	sxy := func(p, a [4]float64) float64 { return p[0]*a[3] - p[3]*a[0] }
	kick, sout := tensorOf(t, h, "spin_tensor_kick"), tensorOf(t, h, "spin_tensor_out")
	want := sxy(pout, aout) - sxy(pin, ain)
	// A few ulp of the O(1) products.
	if math.Abs(kick[1][2]-want) > 1e-15 || math.Abs(sout[1][2]-sxy(pout, aout)) > 1e-15 || kick[2][1] != -kick[1][2] {
		t.Errorf("dS^xy = %v, from the printed vectors %v", kick[1][2], want)
	}
	errT := tensorOf(t, h, "spin_tensor_kick_err")
	if !(errT[1][2] > 0 && errT[1][2] < 1e-10) {
		t.Errorf("error of dS^xy = %v", errT[1][2])
	}
	// The text output states the conventions and prints the tensor rows
	// with the same numbers.
	_, out, _ := run("run", "--signature", "+---", "--units", "heaviside-lorentz", "--spin", "tensor")
	for _, s := range []string{"(+,-,-,-)", "contravariant components (the same in both signatures)", "covariant dp_mu", "dS^XY", "S_out^XY", "Heaviside-Lorentz", "covariant b = 1"} {
		if !strings.Contains(out, s) {
			t.Errorf("text output lacks %q", s)
		}
	}
	// The frame of record (l, b, n) is (x, y, z) here; the text prints 16
	// significant digits.
	row := regexp.MustCompile(`\n  lb\s+(\S+)`).FindStringSubmatch(out)
	if row == nil {
		t.Fatalf("text output lacks the lb row:\n%s", out)
	}
	if x, _ := strconv.ParseFloat(row[1], 64); math.Abs(x-kick[1][2]) > 1e-15*math.Abs(kick[1][2]) {
		t.Errorf("text dS^lb = %v, JSON dS^xy = %v", x, kick[1][2])
	}
}

// TestRunImpact: --impact chooses the impact parameter of ε and of the
// first order and prints it. For Coulomb scattering in the plane, the
// eikonal b (orthogonal to p_in + p_out, whose direction lies at χ/2 from
// p_in) is b cos(χ/2), with χ the printed scattering angle; b_J = |b| for
// the covariant b.
func TestRunImpact(t *testing.T) {
	c := runJSON(t, "--scenario", "coulomb-darwin")
	j := runJSON(t, "--scenario", "coulomb-darwin", "--impact", "j")
	e := runJSON(t, "--scenario", "coulomb-darwin", "--impact", "eikonal")
	chi := c["scattering_angle"].(float64)
	b := c["impact_parameter"].(float64)
	// Exact relation up to rounding.
	if be := e["impact_parameter"].(float64); math.Abs(be-b*math.Cos(chi/2)) > 1e-14 {
		t.Errorf("b_eik = %.16g, b cos(χ/2) = %.16g", be, b*math.Cos(chi/2))
	}
	if j["impact_parameter"].(float64) != b || j["epsilon"].(float64) != c["epsilon"].(float64) {
		t.Errorf("b_J %v, covariant %v", j["impact_parameter"], b)
	}
	// ε = C/b_eik.
	if r := e["epsilon"].(float64) / c["epsilon"].(float64); math.Abs(r*math.Cos(chi/2)-1) > 1e-14 {
		t.Errorf("eps ratio %v, want 1/cos(χ/2)", r)
	}
	// The first order at b_eik is larger (1/b), the residual changes at
	// next order only.
	f, fe := vec4Of(t, c, "first_order_impulse"), vec4Of(t, e, "first_order_impulse")
	if math.Abs(fe[2]*math.Cos(chi/2)/f[2]-1) > 1e-12 {
		t.Errorf("first-order dp_b: %v at b_eik, %v at b", fe[2], f[2])
	}
	_, out, _ := run("run", "--scenario", "coulomb-darwin", "--impact", "eikonal")
	if !strings.Contains(out, "impact parameter: eikonal b_eik = ") {
		t.Errorf("text output does not state the impact parameter:\n%s", out)
	}
}

// TestRunPlot: the trajectory figure is written in every format; a
// captured event still plots (up to the event) and exits with status 1
// naming the outcome; the direction of the collected path far out matches
// the printed scattering angle.
func TestRunPlot(t *testing.T) {
	dir := t.TempDir()
	for _, ext := range []string{"png", "svg", "pdf"} {
		f := filepath.Join(dir, "path."+ext)
		if code, _, e := run("run", "--plot", f, "--projection", "xz"); code != 0 {
			t.Fatalf("%s: exit %d: %s", ext, code, e)
		}
		if st, err := os.Stat(f); err != nil || st.Size() < 1000 {
			t.Errorf("%s: %v", f, err)
		}
	}
	// b = 5M at v = 0.5 is well inside the capture cross-section of a
	// Schwarzschild hole (b_crit → 4M/v = 8M for slow probes, from memory).
	f := filepath.Join(dir, "capture.png")
	code, out, e := run("run", "--scenario", "schwarzschild", "--b", "0.05", "--plot", f)
	// A physical outcome is a computed result: exit 0, the status named.
	if code != 0 || !strings.Contains(out, "status: captured") || e != "" {
		t.Errorf("capture: exit %d, %q, %q", code, out, e)
	}
	if st, err := os.Stat(f); err != nil || st.Size() < 1000 {
		t.Errorf("capture figure: %v", err)
	}
	if code, _, e := run("run", "--plot", filepath.Join(dir, "x.png"), "--projection", "xw"); code != 2 || !strings.Contains(e, "--projection") {
		t.Errorf("bad projection: %d %q", code, e)
	}
	if code, _, e := run("run", "--plot", filepath.Join(dir, "x.gif")); code != 2 || !strings.Contains(e, "--plot") {
		t.Errorf("bad extension: %d %q", code, e)
	}

	for _, name := range []string{defaultScenario, "kerr-skim", "coulomb-darwin"} {
		s, err := scenario.LoadBuiltin(name)
		if err == nil {
			err = s.Validate()
		}
		if err != nil {
			t.Fatal(err)
		}
		ev, err := s.Build()
		if err != nil {
			t.Fatal(err)
		}
		set := s.Settings()
		var path []pathPoint
		set.Observe = func(_ float64, y []float64) { path = append(path, newPathPoint(y)) }
		o, err := integrate.Scatter(ev.Model, ev.In, set)
		if err != nil || o.Status != integrate.StatusScattered {
			t.Fatalf("%s: %v %v", name, err, o.Status)
		}
		_, txt, _ := run("run", "--scenario", name)
		m := regexp.MustCompile(`scattering angle (\S+) rad`).FindStringSubmatch(txt)
		if m == nil {
			t.Fatalf("%s: no angle in %s", name, txt)
		}
		chi, _ := strconv.ParseFloat(m[1], 64)
		got := pathAngle(path, ev.In.P)
		rLast := path[len(path)-1].X.Norm() / s.Kinematics.B
		// The chord over the last step at radius r leans from the
		// asymptote by the deflection still to come, O(χ b/r); ten times
		// that, plus rounding of the positions (~1e-16 r over a chord ~r).
		tol := 10*chi/rLast + 1e-12
		t.Logf("%s: path %.15g, printed %.15g, difference %.1e (tol %.1e), r_last = %.3g b", name, got, chi, math.Abs(got-chi), tol, rLast)
		if math.Abs(got-chi) > tol {
			t.Errorf("%s: path leaves at %.12g rad, printed angle %.12g (tol %.1e)", name, got, chi, tol)
		}
	}
}

// TestRunJSONLabels: the labelled JSON carries what the text prints. The
// record-frame impulse equals the text rows (16 significant digits
// printed); the signed in-plane angle of a planar repulsive Coulomb event
// (coulomb-darwin, like charges) is +χ (towards +b, away from the source)
// with no out-of-plane part, and the text prints the same value; a
// captured event (b = 5M at v = 0.5 in Schwarzschild, inside the capture
// cross-section as in TestRunPlot) gives null outgoing numbers, still
// valid against the schema.
func TestRunJSONLabels(t *testing.T) {
	m := runJSON(t, "--scenario", "coulomb-darwin")
	_, txt, _ := run("run", "--scenario", "coulomb-darwin")
	dp := vec4Of(t, m, "impulse", "record_frame")
	for i, l := range frameLabels {
		row := regexp.MustCompile(`\n  ` + l + `\s+(\S+)`).FindStringSubmatch(txt)
		if row == nil {
			t.Fatalf("text lacks the %s row:\n%s", l, txt)
		}
		x, _ := strconv.ParseFloat(row[1], 64)
		// %.15e keeps 16 significant digits: half a unit of the 16th.
		if math.Abs(x-dp[i]) > 5e-16*math.Abs(dp[i])+1e-300 {
			t.Errorf("dp_%s: text %v, JSON %v", l, x, dp[i])
		}
	}
	chi, in, out := m["scattering_angle"].(float64), m["in_plane_angle"].(float64), m["out_of_plane_angle"].(float64)
	// Exact geometry: the same atan2 of the same components.
	if math.Abs(in-chi) > 1e-15 || out != 0 {
		t.Errorf("in-plane %v, out-of-plane %v, scattering angle %v", in, out, chi)
	}
	mt := regexp.MustCompile(`in-plane (\S+)`).FindStringSubmatch(txt)
	if mt == nil {
		t.Fatalf("text lacks the in-plane angle:\n%s", txt)
	}
	if x, _ := strconv.ParseFloat(mt[1], 64); math.Abs(x-in) > 5e-16*in {
		t.Errorf("in-plane angle: text %v, JSON %v", x, in)
	}
	if e := m["in_plane_angle_err"].(float64); !(e > 0 && e < 1e-10) {
		t.Errorf("in-plane angle error %v", e)
	}
	// A super-extremal Kerr background (a = 2M) carries its warning.
	toml := filepath.Join(t.TempDir(), "naked.toml")
	os.WriteFile(toml, []byte("[background]\nkind = \"kerr\"\nmass = 0.01\nspin = [0.0, 0.0, 0.02]\n[probe]\nkind = \"geodesic\"\n[kinematics]\ngamma = 1.25\n"), 0o644)
	if w, ok := runJSON(t, toml)["warnings"].([]any); !ok || len(w) != 1 || !strings.Contains(w[0].(string), "super-extremal") {
		t.Errorf("super-extremal run: warnings %v", w)
	}
	code, js, _ := run("run", "--scenario", "schwarzschild", "--b", "0.05", "--format", "json")
	if code != 0 { // a physical outcome is a computed result
		t.Fatalf("capture: exit %d", code)
	}
	validateJSON(t, "run", js)
	var c map[string]any
	if err := json.Unmarshal([]byte(js), &c); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"p_out", "impulse", "impulse_err", "scattering_angle", "in_plane_angle"} {
		if v, ok := c[k]; !ok || v != nil {
			t.Errorf("capture: %s = %v, want null", k, v)
		}
	}
}

// TestRunJSONBuiltins: the run JSON of every built-in scenario, in the
// vector and the tensor spin convention, validates against the schema.
func TestRunJSONBuiltins(t *testing.T) {
	for _, name := range scenario.BuiltinNames() {
		runJSON(t, "--scenario", name)
		s, err := scenario.LoadBuiltin(name)
		if err == nil && s.Spinning() {
			runJSON(t, "--scenario", name, "--spin", "tensor")
		}
	}
}
