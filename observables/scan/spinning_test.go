package scan

import (
	"context"
	"math"
	"strings"
	"testing"

	"ricochet/observables/convention"
	"ricochet/observables/scenario"
)

// TestSpinningCurvedScans: for the built-in spinning probes on curved
// backgrounds — the Mathisson–Papapetrou–Dixon body in Kerr with generic
// spin orientations, and the spinning NUT-charged body off Kerr–Taub–NUT —
// the residuals of Δp and Δa after the 1PM closed form (Vines 2017, with
// the pole–dipole spin kick of leading.SpinImpulse1PM) scale as ε², the
// order of the next term: the closed form is the whole first order, for
// the impulse and for the spin kick. "kerr-tilted" is kerr-spinning with
// the background spin off the z-axis (integrate.Rotated); "kerr-quadrupole"
// adds the spin-induced quadrupole C_ES² = 1, against the closed form of
// leading.QuadrupoleBody (checked there against the straight-line
// quadrature of the quadrupole force and torque).
func TestSpinningCurvedScans(t *testing.T) {
	names := []string{"kerr-spinning", "kerr-tilted", "kerr-quadrupole", "ktn-spinning-nut"}
	if testing.Short() {
		names = names[:3]
	}
	for _, name := range names {
		var s *scenario.Scenario
		switch name {
		case "kerr-tilted":
			s = scenarioAt(t, "kerr-spinning", func(s *scenario.Scenario) { s.Background.Spin = [3]float64{0.12, -0.15, 0.22} })
		case "kerr-quadrupole":
			s = scenarioAt(t, "kerr-spinning", func(s *scenario.Scenario) { s.Probe.CES2 = 1 })
		default:
			s = scenarioAt(t, name, nil)
		}
		recs, _ := Run(context.Background(), s, nil)
		for _, obs := range []struct {
			spin bool
			comp int
		}{{false, 2}, {false, 3}, {true, 1}, {true, 2}, {true, 3}} {
			pts := make([]Point, len(recs))
			for i, r := range recs {
				pts[i] = Derive(s, r, Observable{Spin: obs.spin, I: obs.comp}, convention.Set{})
			}
			f := Fit(pts, nil)
			if f.Exponent == nil {
				t.Fatalf("%s %+v: no exponent: %s", name, obs, f.ExponentErr)
			}
			e := f.Exponent
			t.Logf("%s %+v: n = %.9f ± %.1e", name, obs, e.N, e.SigmaN)
			// Three standard uncertainties, with the floor of 1e-4 used for
			// the other scans (fits whose stated σ is at rounding level).
			if d := math.Abs(e.N - 2); d > 3*e.SigmaN+1e-4 {
				t.Errorf("%s %+v: exponent %.6f ± %.1e, want 2", name, obs, e.N, e.SigmaN)
			}
		}
	}
}

// TestBlackHoleBuiltins: a built-in scenario that calls its background a
// black hole is one at every point of its scan (no super-extremal
// warning); those that do not say so may be super-extremal, and then the
// warning appears in the analysed scan.
func TestBlackHoleBuiltins(t *testing.T) {
	for _, name := range scenario.BuiltinNames() {
		s := scenarioAt(t, name, nil)
		warn := s.ScanWarning()
		if strings.Contains(s.Description, "black hole") && warn != "" {
			t.Errorf("%s (%q): %s", name, s.Description, warn)
		}
		if warn == "" {
			continue
		}
		res := Analyze(s, "", nil, &Options{})
		if len(res.Warnings) != 1 || res.Warnings[0] != warn {
			t.Errorf("%s: scan warnings %q, want [%q]", name, res.Warnings, warn)
		}
	}
}
