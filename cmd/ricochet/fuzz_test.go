package main

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"ricochet/integrate"
)

var (
	fuzzBackgrounds = []string{"coulomb", "monopole", "dyon", "root-kerr", "schwarzschild", "reissner-nordstrom", "kerr", "kerr-newman", "taub-nut", "kerr-taub-nut"}
	fuzzProbes      = []string{"charge", "dyon", "bmt", "root-kerr", "geodesic", "dixon", "root-kerr-body"}
	nonNumber       = regexp.MustCompile(`\bNaN\b|[+-]?Inf\b`)
)

// tomlFloat writes x as a TOML float (nan and inf spelled as TOML does).
func tomlFloat(x float64) string {
	switch {
	case math.IsNaN(x):
		return "nan"
	case math.IsInf(x, 1):
		return "inf"
	case math.IsInf(x, -1):
		return "-inf"
	}
	return strconv.FormatFloat(x, 'g', -1, 64)
}

// FuzzRunEvent: the whole event of a scenario through the command line
// (run --format json, and the text form): bad input exits 2 with one
// line; a scenario that validates runs to a status with exit 0 (or, for a
// failure of the integrator, exit 1 with that one-line message: logged,
// a finding to look at when fuzzing by hand), prints no NaN or
// infinity anywhere, gives numbers exactly when it scattered, and stays
// within the integrator's step limit (the bounded-time guarantee: at most
// 200000 steps per integration). The tolerance is kept at 1e-9 or looser
// and the radius automatic so that an event costs well under a second.
// Seed corpus: testdata/fuzz/FuzzRunEvent.
func FuzzRunEvent(f *testing.F) {
	f.Add(uint8(3), uint8(3), 0.05, 0.0, 0.0, 0.15, 0.3, 1.0, 0.2, 0.0, 0.1, 1.5, 1.0, uint8(0))
	f.Add(uint8(4), uint8(4), 0.01, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 1.1547, 0.05, uint8(1))
	f.Add(uint8(6), uint8(5), 0.01, 0.0, 0.0, 0.0, 0.009, 0.0, 0.01, 0.0, 0.02, 1.3, 1.0, uint8(2))
	f.Add(uint8(3), uint8(0), -0.5, 0.0, 0.0, 0.0, 0.5, 1.0, 0.0, 0.0, 0.0, 1.2, 1.0, uint8(0))
	f.Add(uint8(6), uint8(4), 0.01, 0.0, 0.0, 0.0, 1.5, 0.0, 0.0, 0.0, 0.0, 1.5, 1.0, uint8(3))
	f.Add(uint8(9), uint8(5), 0.01, 0.003, 0.001, 0.0, 0.005, 0.0, 0.0, 0.01, 0.0, 2.0, 1.0, uint8(1))
	dir := f.TempDir()
	f.Fuzz(func(t *testing.T, bgk, prk uint8, q, p, qq, ax, az, pq, sx, sy, sz, gamma, b float64, tolk uint8) {
		bg := fuzzBackgrounds[int(bgk)%len(fuzzBackgrounds)]
		pr := fuzzProbes[int(prk)%len(fuzzProbes)]
		var sb strings.Builder
		fmt.Fprintf(&sb, "[background]\nkind = %q\n", bg)
		curved := int(bgk)%len(fuzzBackgrounds) >= 4
		if curved {
			fmt.Fprintf(&sb, "mass = %s\n", tomlFloat(q))
			if strings.Contains(bg, "nut") {
				fmt.Fprintf(&sb, "nut = %s\n", tomlFloat(p))
			}
			if bg == "reissner-nordstrom" || bg == "kerr-newman" || bg == "kerr-taub-nut" {
				fmt.Fprintf(&sb, "charge = %s\n", tomlFloat(qq))
			}
			if strings.Contains(bg, "kerr") {
				fmt.Fprintf(&sb, "spin = [0, 0, %s]\n", tomlFloat(az))
			}
		} else {
			fmt.Fprintf(&sb, "charge = %s\nmagnetic_charge = %s\n", tomlFloat(q), tomlFloat(p))
			if bg == "root-kerr" {
				fmt.Fprintf(&sb, "spin = [%s, 0, %s]\n", tomlFloat(ax), tomlFloat(az))
			}
		}
		fmt.Fprintf(&sb, "[probe]\nkind = %q\n", pr)
		if pr != "geodesic" || pq != 0 {
			fmt.Fprintf(&sb, "charge = %s\n", tomlFloat(pq))
		}
		if pr == "bmt" || pr == "root-kerr" || pr == "dixon" || pr == "root-kerr-body" {
			fmt.Fprintf(&sb, "spin = [%s, %s, %s]\n", tomlFloat(sx), tomlFloat(sy), tomlFloat(sz))
		}
		fmt.Fprintf(&sb, "[kinematics]\ngamma = %s\nb = %s\n", tomlFloat(gamma), tomlFloat(b))
		fmt.Fprintf(&sb, "[numerics]\ntol = %s\n", tomlFloat([]float64{1e-9, 1e-8, 1e-7, 1e-6}[int(tolk)%4]))
		file := filepath.Join(dir, "event.toml")
		if err := os.WriteFile(file, []byte(sb.String()), 0o644); err != nil {
			t.Fatal(err)
		}
		code, js, e := run("run", "--format", "json", file)
		switch code {
		case 2:
			if strings.Count(strings.TrimSpace(e), "\n") != 0 || js != "" {
				t.Fatalf("bad input: stderr %q, stdout %q\n%s", e, js, sb.String())
			}
			return
		case 0:
		case 1:
			// A failure of the integrator is a program failure, named
			// and on one line; the JSON still carries the status and
			// no numbers. Run by hand, these are findings to look at.
			if strings.TrimSpace(e) != "ricochet run: integrate: integrator failed" {
				t.Fatalf("exit 1: %q\n%s", e, sb.String())
			}
			t.Logf("integrator failed:\n%s", sb.String())
		default:
			t.Fatalf("exit %d: %s\n%s", code, e, sb.String())
		}
		if nonNumber.MatchString(js) {
			t.Fatalf("non-number in the JSON output:\n%s\n%s", js, sb.String())
		}
		var m map[string]any
		if err := json.Unmarshal([]byte(js), &m); err != nil {
			t.Fatalf("JSON: %v\n%s", err, js)
		}
		scattered := m["status"] == integrate.StatusScattered.String()
		if (m["impulse"] != nil) != scattered || (m["scattering_angle"] != nil) != scattered {
			t.Fatalf("status %v with impulse %v, angle %v\n%s", m["status"], m["impulse"], m["scattering_angle"], sb.String())
		}
		// Bounded time: every integration stops at the step limit, 200000
		// steps of at most 16 stages, plus the tails.
		if n, _ := m["rhs_evaluations"].(float64); !(n > 0 && n < 200000*16+100000) {
			t.Fatalf("rhs_evaluations = %v\n%s", m["rhs_evaluations"], sb.String())
		}
		code1 := code
		code, txt, e := run("run", file)
		if code != code1 || nonNumber.MatchString(txt) {
			t.Fatalf("text: exit %d %q\n%s\n%s", code, e, txt, sb.String())
		}
	})
}
