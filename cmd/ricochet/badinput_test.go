package main

import (
	"crypto/sha256"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Scenario files of our own design that the bad-input cases modify: a
// flat pair of root-Kerr bodies, a bmt probe, and a Kerr background.
const (
	flatTOML  = "[background]\nkind = \"root-kerr\"\ncharge = 0.05\nspin = [0, 0.1, 0.2]\n[probe]\nkind = \"root-kerr\"\ncharge = 1\nspin = [0.1, 0, 0]\n[kinematics]\ngamma = 1.5\n"
	bmtTOML   = "[background]\nkind = \"coulomb\"\ncharge = 0.05\n[probe]\nkind = \"bmt\"\ncharge = 1\nspin = [0, 0, 0.1]\n[kinematics]\nv = 0.5\n"
	kerrTOML  = "[background]\nkind = \"kerr\"\nmass = 0.01\nspin = [0, 0, 0.005]\n[probe]\nkind = \"geodesic\"\n[kinematics]\ngamma = 1.2\n"
	dixonTOML = "[background]\nkind = \"kerr\"\nmass = 0.01\nspin = [0, 0, 0.005]\n[probe]\nkind = \"dixon\"\nspin = [0, 0, 0.01]\n[kinematics]\ngamma = 1.2\n"
	nutTOML   = "[background]\nkind = \"taub-nut\"\nmass = 0.01\nnut = 0.005\n[probe]\nkind = \"geodesic\"\n[kinematics]\ngamma = 1.2\n"
)

// badCase is one bad input through the command line: the arguments, an
// optional scenario file (appended as the last argument) and the texts
// the one-line message must hold (the field or flag as written and the
// value); every message must also state what is allowed.
type badCase struct {
	args []string
	toml string
	want []string
}

// set replaces (or adds) key = value in [table] of a scenario text.
func set(text, table, key, value string) string {
	lines := strings.Split(text, "\n")
	in := false
	for i, l := range lines {
		if strings.HasPrefix(l, "[") {
			in = l == "["+table+"]"
			continue
		}
		if in && strings.HasPrefix(l, key+" =") {
			lines[i] = key + " = " + value
			return strings.Join(lines, "\n")
		}
	}
	for i, l := range lines {
		if l == "["+table+"]" {
			lines = append(lines[:i+1], append([]string{key + " = " + value}, lines[i+1:]...)...)
			return strings.Join(lines, "\n")
		}
	}
	return text + "[" + table + "]\n" + key + " = " + value + "\n"
}

// del removes key from [table].
func del(text, table, key string) string {
	var out []string
	in := false
	for _, l := range strings.Split(text, "\n") {
		if strings.HasPrefix(l, "[") {
			in = l == "["+table+"]"
		} else if in && strings.HasPrefix(l, key+" =") {
			continue
		}
		out = append(out, l)
	}
	return strings.Join(out, "\n")
}

func badCases() []badCase {
	var cs []badCase
	toml := func(text string, want ...string) {
		cs = append(cs, badCase{args: []string{"run"}, toml: text, want: want})
	}
	tomlScan := func(text string, want ...string) {
		cs = append(cs, badCase{args: []string{"scan", "--quiet"}, toml: text, want: want})
	}
	field := func(base, table, key, value string, want ...string) {
		toml(set(base, table, key, value), append([]string{table + "." + key}, want...)...)
	}
	nonFinite := []string{"nan", "inf", "-inf"}
	// background
	for _, k := range []string{`"plasma"`, `""`, `"Kerr"`} {
		field(flatTOML, "background", "kind", k)
	}
	toml(del(flatTOML, "background", "kind"), "background.kind is missing")
	for _, v := range append(nonFinite, "1e300", "1e-300", "-1e101") {
		field(flatTOML, "background", "charge", v)
		field(strings.Replace(flatTOML, "root-kerr\"\ncharge", "dyon\"\nmagnetic_charge = 0.01\ncharge", 1), "background", "magnetic_charge", v)
	}
	field(strings.Replace(bmtTOML, "coulomb", "coulomb", 1), "background", "magnetic_charge", "0.1")
	field(strings.Replace(strings.Replace(bmtTOML, "charge = 0.05", "magnetic_charge = 0.05", 1), "coulomb", "monopole", 1), "background", "charge", "0.1")
	for _, v := range []string{"[0, 0, nan]", "[inf, 0, 0]", "[0, -inf, 0]", "[0, 0, 200]", "[1e300, 0, 0]", "[0, 1e-300, 0]"} {
		field(flatTOML, "background", "spin", v)
	}
	field(bmtTOML, "background", "spin", "[0, 0, 0.1]")
	field(flatTOML, "background", "mass", "0.01")
	field(flatTOML, "background", "nut", "0.01")
	field(flatTOML, "background", "string_gauge", "0.5")
	for _, v := range append(nonFinite, "-0.01", "1e300", "1e-300") {
		field(kerrTOML, "background", "mass", v)
	}
	toml(set(set(nutTOML, "background", "mass", "0"), "background", "nut", "0"), "background.mass = 0", "background.nut = 0")
	for _, v := range append(nonFinite, "1e300") {
		field(nutTOML, "background", "nut", v)
	}
	field(kerrTOML, "background", "nut", "0.01")
	for _, v := range append(nonFinite, "2", "-1.5") {
		field(nutTOML, "background", "string_gauge", v)
	}
	field(kerrTOML, "background", "string_gauge", "0.5")
	for _, v := range []string{"[0, 0, nan]", "[0, 0, inf]", "[0, 0, 500]", "[0, 20, 0]"} {
		field(kerrTOML, "background", "spin", v)
	}
	field(strings.Replace(kerrTOML, "kerr", "schwarzschild", 1), "background", "spin", "[0, 0, 0.1]")
	for _, v := range append(nonFinite, "1000") {
		field(strings.Replace(kerrTOML, "kerr", "kerr-newman", 1), "background", "charge", v)
	}
	field(kerrTOML, "background", "charge", "0.001")
	field(kerrTOML, "background", "magnetic_charge", "0.001")
	for _, v := range append(nonFinite, "1000") {
		field(strings.Replace(kerrTOML, "kerr", "kerr-newman", 1), "background", "magnetic_charge", v)
		field(strings.Replace(kerrTOML, "kerr\"\nmass = 0.01\nspin = [0, 0, 0.005]", "reissner-nordstrom\"\nmass = 0.01", 1), "background", "magnetic_charge", v)
	}
	field(nutTOML, "background", "magnetic_charge", "0.001")
	ktnTOML := strings.Replace(nutTOML, "taub-nut\"\nmass = 0.01", "kerr-taub-nut\"\nmass = 0.01\nspin = [0, 0, 0.003]\ncharge = 0.001", 1)
	for _, v := range append(nonFinite, "1000") {
		field(ktnTOML, "background", "magnetic_charge", v)
	}
	// probe
	for _, k := range []string{`"electron"`, `"geodesic"`, `""`} {
		field(flatTOML, "probe", "kind", k)
	}
	toml(del(flatTOML, "probe", "kind"), "probe.kind is missing")
	field(kerrTOML, "probe", "kind", `"charge"`)
	for _, v := range append(nonFinite, "0", "-1", "1e300", "1e-300") {
		field(flatTOML, "probe", "mass", v)
		field(kerrTOML, "probe", "mass", v)
	}
	for _, v := range append(nonFinite, "1e300", "1e-300") {
		field(flatTOML, "probe", "charge", v)
		field(kerrTOML, "probe", "charge", v)
		field(strings.Replace(flatTOML, "kind = \"root-kerr\"\ncharge = 1", "kind = \"dyon\"\ncharge = 1", 1), "probe", "magnetic_charge", v)
	}
	toml(set(flatTOML, "probe", "charge", "0"), "probe.charge = 0")
	field(strings.Replace(bmtTOML, "\"bmt\"", "\"charge\"", 1), "probe", "magnetic_charge", "0.5")
	field(kerrTOML, "probe", "magnetic_charge", "0.5")
	for _, v := range append(nonFinite, "0", "1e4", "-2000") {
		field(bmtTOML, "probe", "gyro", v)
	}
	field(flatTOML, "probe", "gyro", "2")
	field(kerrTOML, "probe", "gyro", "2")
	for _, v := range []string{"[0, 0, nan]", "[0, inf, 0]", "[-inf, 0, 0]", "[0, 0, 101]", "[0, 0, 1e-300]"} {
		field(flatTOML, "probe", "spin", v)
		field(bmtTOML, "probe", "spin", v)
	}
	field(strings.Replace(bmtTOML, "\"bmt\"", "\"charge\"", 1), "probe", "spin", "[0, 0, 0.1]")
	field(kerrTOML, "probe", "spin", "[0, 0, 0.1]")
	for _, v := range []string{"[0, 0, nan]", "[0, inf, 0]", "[0, 0, 500]", "[0, 0, -92.98]", "[1, 0, 0.5]"} {
		field(dixonTOML, "probe", "spin", v)
	}
	for _, v := range append(nonFinite, "0", "5000") {
		field(dixonTOML, "probe", "gyro", v)
	}
	field(dixonTOML, "probe", "nut", "0.1")
	field(flatTOML, "probe", "ces2", "1")
	field(strings.Replace(flatTOML, "kind = \"root-kerr\"\ncharge = 1", "kind = \"root-kerr-body\"\ncharge = 1", 1), "probe", "gyro", "2")
	field(strings.Replace(flatTOML, "kind = \"root-kerr\"\ncharge = 1", "kind = \"dixon\"\ncharge = 1", 1), "probe", "gyro", "nan")
	field(kerrTOML, "probe", "ces2", "1")
	field(strings.Replace(dixonTOML, "kerr", "kerr-taub-nut", 1), "probe", "nut", "nan")
	field(dixonTOML, "probe", "magnetic_charge", "0.1")
	// probe.ssc: names, kinds, and the neutral pole–dipole body of the
	// Pirani and Ohashi–Kyrian–Semerák conditions.
	for _, v := range []string{`"bogus"`, `"Pirani"`, `"oks"`, `"tulczyjew-dixon"`, `""`} {
		if v == `""` {
			continue // "" is the default
		}
		field(dixonTOML, "probe", "ssc", v, "allowed: tulczyjew, pirani, ohashi-kyrian-semerak")
	}
	field(flatTOML, "probe", "ssc", `"pirani"`, "tulczyjew only")
	field(kerrTOML, "probe", "ssc", `"ohashi-kyrian-semerak"`, "tulczyjew only")
	field(set(dixonTOML, "probe", "charge", "0.001"), "probe", "ssc", `"pirani"`, "charge = 0")
	field(set(dixonTOML, "probe", "ces2", "1"), "probe", "ssc", `"ohashi-kyrian-semerak"`, "ces2 = 0")
	toml(set(set(dixonTOML, "probe", "spin", "[0, 0, 0.001]"), "probe", "ssc", `"pirani"`), "probe.spin", "≥ 0.01 b")
	field(flatTOML, "probe", "nut", "0.1")
	field(kerrTOML, "probe", "nut", "0.1")
	for _, kind := range []string{`"kerr-probe"`, `"kerr-probe-ks"`} {
		kp := strings.Replace(dixonTOML, `"dixon"`, kind, 1)
		field(kp, "probe", "nut", "0.1")
		for _, v := range append(nonFinite, "1e300", "1e-300") {
			field(strings.Replace(kp, "kerr", "kerr-taub-nut", 1), "probe", "nut", v)
		}
	}
	field(dixonTOML, "scan", "hold", `"a_over_q"`)
	field(strings.Replace(kerrTOML, "kerr\"\nmass = 0.01\nspin = [0, 0, 0.005]", "schwarzschild\"\nmass = 0.01", 1), "scan", "hold", `"a_over_m"`)
	field(flatTOML, "scan", "hold", `"a_over_m"`)
	// kinematics
	for _, v := range append(nonFinite, "0.5", "1", "-2", "1e300", "1.0000000000000002") {
		field(flatTOML, "kinematics", "gamma", v)
	}
	toml(del(flatTOML, "kinematics", "gamma"), "kinematics.gamma is missing")
	for _, v := range append(nonFinite, "-0.1", "1", "1.5", "1e-300", "1e-7") {
		field(bmtTOML, "kinematics", "v", v)
	}
	toml(set(flatTOML, "kinematics", "v", "0.5"), "kinematics", "gamma = 1.5", "v = 0.5")
	for _, v := range append(nonFinite, "0", "-1", "1e300", "1e-300") {
		field(flatTOML, "kinematics", "b", v)
	}
	// the coupling
	toml(set(flatTOML, "background", "charge", "1e4"), "background.charge = 10000", "|ε|")
	toml(set(flatTOML, "background", "charge", "1e-25"), "background.charge = 1e-25", "|ε|")
	toml(set(kerrTOML, "background", "mass", "1e5"), "background.mass = 100000", "|ε|")
	// scan
	for _, v := range append(nonFinite, "0", "-1e-3", "1e-300", "1e300") {
		field(flatTOML, "scan", "eps_min", v)
	}
	for _, v := range append(nonFinite, "0", "1e-5", "1e300") {
		field(flatTOML, "scan", "eps_max", v)
	}
	for _, v := range []string{"0", "1", "-3", "10001"} {
		field(flatTOML, "scan", "points", v)
	}
	axis := func(body string, want ...string) {
		tomlScan(flatTOML+"[[scan.axis]]\n"+body+"\n", want...)
	}
	axis(`param = "colour"`+"\nvalues = [1]", `scan.axis[0].param = "colour"`)
	axis(`values = [1]`, "scan.axis[0].param is missing")
	axis(`param = "gamma"`+"\nspacing = \"cubic\"\nmin = 1.1\nmax = 2\npoints = 3", `scan.axis[0].spacing = "cubic"`)
	axis(`param = "gamma"`+"\nmin = 1.1\nmax = 2\npoints = 1", "scan.axis[0].points = 1")
	axis(`param = "gamma"`+"\nmin = 1.1\nmax = 2\npoints = 20000", "scan.axis[0].points = 20000")
	axis(`param = "gamma"`+"\nmin = 2\nmax = 1.1\npoints = 3", "scan.axis[0]: min = 2, max = 1.1")
	axis(`param = "gamma"`+"\nmin = nan\nmax = 2\npoints = 3", "scan.axis[0]: min = NaN")
	axis(`param = "b"`+"\nspacing = \"log\"\nmin = 0\nmax = 2\npoints = 3", "scan.axis[0].min = 0")
	axis(`param = "gamma"`+"\nvalues = [1.5, nan]", "scan.axis[0].values", "NaN")
	axis(`param = "gamma"`+"\nvalues = [1.5, inf]", "scan.axis[0].values", "+Inf")
	axis(`param = "gamma"`+"\nvalues = [1.5]\nmin = 1", "scan.axis[0]")
	axis(`param = "gamma"`+"\nspacing = \"linear\"\nvalues = [1.5]", "scan.axis[0]")
	axis(`param = "coupling"`+"\nvalues = [0.1, 0.01]", "scan.axis[0].values", "0.01 after 0.1")
	axis(`param = "coupling"`+"\nvalues = [0.01]", "scan.axis[0]")
	axis(`param = "v"`+"\nvalues = [0.5, 1.5]", "v = 1.5", "kinematics.v = 1.5")
	axis(`param = "b"`+"\nvalues = [1, 0]", "b = 0", "kinematics.b = 0")
	axis(`param = "gamma"`+"\nvalues = [1.5, 1e300]", "gamma = 1e+300", "kinematics.gamma = 1e+300")
	axis(`param = "probe_spin"`+"\nvalues = [0.1, 500]", "probe_spin = 500", "probe.spin")
	axis(`param = "a_over_m"`+"\nvalues = [0.5]", "a_over_m", "root-kerr")
	axis(`param = "gamma"`+"\nvalues = [2]\n[[scan.axis]]\nparam = \"v\"\nvalues = [0.5]", "scan.axis", "gamma or for v")
	axis(`param = "gamma"`+"\nvalues = [2]\n[[scan.axis]]\nparam = \"gamma\"\nvalues = [3]", `scan.axis[1].param = "gamma"`)
	// numerics
	for _, v := range append(nonFinite, "1", "1e-20", "-1e-8") {
		field(flatTOML, "numerics", "tol", v)
	}
	for _, v := range append(nonFinite, "5", "1e13", "-100") {
		field(flatTOML, "numerics", "radius", v)
	}
	for _, v := range []string{`"rk4"`, `"euler"`} {
		field(flatTOML, "numerics", "method", v)
	}
	// command-line overrides and flags
	flags := func(want string, args ...string) {
		cs = append(cs, badCase{args: args, want: []string{want}})
	}
	for _, v := range []string{"0.5", "nan", "inf", "1e300", "-3", "1e400", "abc", "0"} {
		flags("--gamma", "run", "--gamma", v)
	}
	for _, v := range []string{"0", "-1", "nan", "1e300", "1e-300", "1e-400", "x"} {
		flags("--b", "run", "--b", v)
	}
	for _, v := range []string{"1", "nan", "-1", "1e-400", "1e-16"} {
		flags("--tol", "run", "--tol", v)
	}
	for _, v := range []string{"5", "nan", "1e13", "-1", "inf"} {
		flags("--radius", "run", "--radius", v)
	}
	// The allowed list names the methods the flag accepts.
	cs = append(cs, badCase{args: []string{"run", "--method", "rk4"}, want: []string{"--method", "dormand-prince-8, dormand-prince-5, tsitouras-5"}})
	cs = append(cs, badCase{args: []string{"run", "--method", ""}, want: []string{"--method", "dormand-prince-8, dormand-prince-5, tsitouras-5"}})
	flags("--signature", "run", "--signature", "++++")
	flags("--units", "run", "--units", "si")
	flags("--impact", "run", "--impact", "geodesic")
	flags("--spin", "run", "--spin", "matrix")
	flags("--scenario", "run", "--scenario", "nonesuch")
	flags("--format", "run", "--format", "xml")
	flags("--plot", "run", "--plot", "x.gif")
	flags("--plot", "run", "--plot", filepath.Join("nodir", "x.png"))
	flags("--plot", "run", "--plot", ".")
	flags("--projection", "run", "--projection", "xw")
	for _, v := range []string{"0", "2000", "nan", "-1"} {
		flags("--extent", "run", "--extent", v)
	}
	for _, v := range []string{"0", "-1", "1e-400", "nan", "1e300", "1e-30"} {
		flags("--eps-min", "scan", "--eps-min", v)
	}
	for _, v := range []string{"0", "-1", "nan", "1e300", "1e-6"} {
		flags("--eps-max", "scan", "--eps-max", v)
	}
	for _, v := range []string{"0", "1", "-1", "20000", "1e3", "many"} {
		flags("--points", "scan", "--points", v)
	}
	flags("--format", "scan", "--format", "xml")
	flags("--observable", "scan", "--observable", "dp_q")
	flags("--observable", "scan", "--observable", "dp_b,xx")
	flags("--observable", "scan", "--observable", "dS_lb")
	flags("--observable", "scan", "--observable", "da_b", "--spin", "tensor")
	flags("--observable", "scan", "--scenario", "coulomb-darwin", "--observable", "da_b")
	flags("--workers", "scan", "--workers", "-1")
	flags("--workers", "scan", "--workers", "two")
	flags("--output", "scan", "--output", ".")
	flags("--output", "scan", "--output", filepath.Join("nodir", "x.jsonl"))
	flags("--output", "scan", "--output", "existing.jsonl")
	flags("--resume", "scan", "--resume")
	flags("--window", "scan", "--window", "1e-3")
	flags("--window", "scan", "--window", "0.1,0.01")
	flags("--window", "scan", "--window", "nan,1")
	flags("--thresholds", "scan", "--thresholds", "-1")
	flags("--thresholds", "scan", "--thresholds", "abc")
	flags("--degree", "scan", "--degree", "-2")
	flags("--degree", "scan", "--degree", "100")
	flags("--degree", "scan", "--degree", "x")
	flags("--expect", "scan", "--expect", "pi*(")
	flags("--plot-trend", "scan", "--plot-trend", "t.png")
	flags("--plot-trend", "scan", "--plot-trend", "t.gif")
	flags("--plot", "scan", "--plot", "r.bmp")
	flags("--plot", "scan", "--plot", filepath.Join("nodir", "r.png"))
	flags("--shard", "scan", "--shard", "3/2", "--output", "s.jsonl")
	flags("--shard", "scan", "--shard", "x", "--output", "s.jsonl")
	flags("--shard", "scan", "--shard", "1/2")
	flags("--plot", "scan", "--shard", "1/2", "--output", "s.jsonl", "--plot", "x.png")
	flags("--spread", "scan", "--scenario", "coulomb-darwin", "--spread")
	flags("--output", "merge", "a.jsonl")
	flags("--workers", "merge", "--output", "m.jsonl", "--workers", "-3", "a.jsonl")
	flags("--output", "merge", "--output", "a.jsonl", "a.jsonl")
	for _, v := range []string{"-1", "nan", "inf", "1e-400"} {
		flags("--eps", "verify", "--eps", v)
	}
	flags("--couplings", "verify", "--couplings", "x")
	flags("--workers", "verify", "--workers", "-2")
	flags("--plot", "verify", "--plot", "v.jpeg")
	flags("--plot", "verify", "--plot", filepath.Join("nodir", "v.png"))
	flags("--format", "verify", "--format", "yaml")
	flags("--gamma", "verify", "--gamma", "0.9")
	flags("--frobnicate", "run", "--frobnicate")
	flags("--check", "check", "--check")
	return cs
}

// TestBadInputTable: every bad input through the real command line exits
// with status 2 before any integration, with one line on stderr naming
// the field or flag as written, its value and what is allowed; nothing is
// printed on stdout, nothing is written, and no existing file changes.
func TestBadInputTable(t *testing.T) {
	dir := t.TempDir()
	wd, _ := os.Getwd()
	if err := os.Chdir(dir); err != nil {
		t.Fatal(err)
	}
	defer os.Chdir(wd)
	// Files that must survive unchanged: a record file, a figure, a
	// scenario, a shard input.
	for name, text := range map[string]string{"existing.jsonl": "{\"format\":\"x\"}\n", "fig.png": "not a figure", "a.jsonl": "{}\n", "keep.toml": flatTOML} {
		os.WriteFile(name, []byte(text), 0o644)
	}
	before := tree(t, dir)
	cases := badCases()
	seen := map[string]bool{}
	for k, c := range cases {
		args := c.args
		if c.toml != "" {
			f := fmt.Sprintf("case%03d.toml", k)
			os.WriteFile(f, []byte(c.toml), 0o644)
			before[f] = sum([]byte(c.toml))
			args = append(append([]string{}, args...), f)
		}
		key := strings.Join(args, " ") + "\x00" + c.toml
		if seen[key] {
			t.Errorf("case %d duplicates an earlier one: %v", k, args)
		}
		seen[key] = true
		code, stdout, stderr := run(args...)
		msg := strings.TrimSpace(stderr)
		if code != 2 || stdout != "" || strings.Contains(msg, "\n") || msg == "" {
			t.Errorf("case %d %v %q: exit %d, stdout %q, stderr %q; want exit 2 and one line", k, args, c.toml, code, stdout, stderr)
			continue
		}
		for _, w := range c.want {
			if !strings.Contains(msg, w) {
				t.Errorf("case %d %v: %q does not name %q", k, args, msg, w)
			}
		}
		if !strings.Contains(msg, "allowed") {
			t.Errorf("case %d %v: %q does not say what is allowed", k, args, msg)
		}
		// The value of the flag named appears as written (or as %g
		// prints it).
		if c.toml == "" {
			for i, a := range c.args[:len(c.args)-1] {
				v := c.args[i+1]
				if a == c.want[0] && v != "" && !strings.HasPrefix(v, "--") && !valueShown(msg, v) {
					t.Errorf("case %d %v: %q does not show the value %q", k, args, msg, v)
				}
			}
		}
	}
	if len(cases) < 150 {
		t.Errorf("%d cases; the suite holds at least 150", len(cases))
	}
	t.Logf("%d bad inputs, each exit 2 with one line naming the field, value and allowed range", len(cases))
	after := tree(t, dir)
	for name, h := range before {
		if after[name] != h {
			t.Errorf("%s changed or vanished", name)
		}
	}
	for name := range after {
		if _, ok := before[name]; !ok {
			t.Errorf("%s was written", name)
		}
	}
}

// valueShown reports whether a flag value appears in the message in the
// form %g prints it (1e300 as 1e+300, nan as NaN).
func valueShown(msg, v string) bool {
	for _, f := range []string{"%g", "%v"} {
		var x float64
		if _, err := fmt.Sscan(v, &x); err == nil && strings.Contains(msg, fmt.Sprintf(f, x)) {
			return true
		}
	}
	for _, part := range strings.Split(v, ",") {
		if strings.Contains(strings.ToLower(msg), strings.ToLower(part)) {
			return true
		}
	}
	return false
}

func sum(b []byte) string { h := sha256.Sum256(b); return fmt.Sprintf("%x", h) }

// tree returns the checksum of every file under dir.
func tree(t *testing.T, dir string) map[string]string {
	out := map[string]string{}
	filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		b, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		rel, _ := filepath.Rel(dir, p)
		out[rel] = sum(b)
		return nil
	})
	return out
}
