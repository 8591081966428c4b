package scan

import (
	"context"
	"math"
	"testing"

	"ricochet/observables/fit"
	"ricochet/observables/scenario"
	"ricochet/validate/exact"
)

// spreadNextOrderOdd runs spread scans of the aligned built-in scenario at
// probe (or source) spin ±h and ±h/2 along z and returns, per member, the
// next-order coefficient of the part of Δp_b linear in that spin, per unit
// spin: the odd part of each point's residual (Richardson in the spin,
// remainder O(h⁴)) fitted with fit.NextOrder.
func spreadNextOrderOdd(t *testing.T, v float64, probe bool) (names []string, c2, sig []float64) {
	return nextOrderOdd(t, v, probe, scenario.FamilyNames(), nil)
}

// nextOrderOdd is spreadNextOrderOdd for the given members (nil: the
// scenario's own probe, after edit).
func nextOrderOdd(t *testing.T, v float64, probe bool, members []string, edit func(*scenario.Scenario)) (names []string, c2, sig []float64) {
	t.Helper()
	const h = 0.01
	names = members
	if names == nil {
		names = []string{""}
	}
	obs := Observable{Name: "dp_b", I: 2}
	series := map[float64][]Series{}
	for _, a := range []float64{h, -h, h / 2, -h / 2} {
		s := scenarioAt(t, "rootkerr-aligned", func(s *scenario.Scenario) {
			s.Kinematics.V = v
			s.Probe.Spin, s.Background.Spin = [3]float64{}, [3]float64{}
			if probe {
				s.Probe.Spin[2] = a
			} else {
				s.Background.Spin[2] = a
			}
			// The grid of TestDixonSecondOrderWeights: the expansion
			// parameter of the deflection is ε/v².
			s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points = 0.0005*v*v/0.36, 0.032*v*v/0.36, 7
			if edit != nil {
				edit(s)
			}
		})
		recs, err := Run(context.Background(), s, &Settings{Members: members})
		if err != nil {
			t.Fatal(err)
		}
		series[a] = Analyze(s, "", recs, &Options{Observables: []Observable{obs}, Members: members}).Series
	}
	for k := range names {
		var pts []fit.Point
		for i := range series[h][k].Points {
			r := func(a float64) float64 { p := series[a][k].Points[i]; return p.Numeric - p.First }
			d := func(a float64) float64 { return (r(a) - r(-a)) / (2 * a) }
			var e float64
			for _, a := range []float64{h, -h, h / 2, -h / 2} {
				e = math.Max(e, series[a][k].Points[i].Err)
			}
			// Error of the odd part: the point errors over the
			// Richardson combination (weights 4/3·1/h + 1/3·1/(2h)).
			pts = append(pts, fit.Point{Eps: series[h][k].Points[i].Eps, Residual: (4*d(h/2) - d(h)) / 3, Sigma: 3 * e / h})
		}
		r, err := fit.NextOrder(pts, nil)
		if err != nil {
			t.Fatal(err)
		}
		c2, sig = append(c2, r.C2), append(sig, r.SigmaC2)
	}
	return names, c2, sig
}

// TestSpreadAlignedSpinWeights: `scan --spread` of the aligned root-Kerr
// scenario (library path: Run with the family's members, Analyze,
// fit.NextOrder), spins normal to the plane, v = 0.3, 0.6, 0.9. The
// second-order weight of the probe spin read from each member's scans is
// compared with the canonical Thomas–BMT Hamiltonian at g = 2 and that of
// the source spin with the radial quadrature of a charge in the root-Kerr
// field (validate/exact.SpinWeights; Thomas 1927; Bargmann, Michel &
// Telegdi 1959; Newman & Janis 1965): the canonical members (dixon,
// root-kerr-body) agree with both to 1e-6 relative; the non-canonical
// completions agree on the source spin, and on the probe spin give the
// source weight (root-kerr, root-kerr-conservative, bmt: twice the
// physical value), which is checked so that a change of theirs is seen.
// Tolerance 1e-6: the O(h⁴) remainder of the spin Richardson step
// (measured up to 8e-7 relative at h = 0.02 b for root-kerr-body at
// v = 0.9, hence ~5e-8 at the h = 0.01 b used) and the fits'
// uncertainties (≤ 2e-7 relative); measured differences ≤ 1e-7.
func TestSpreadAlignedSpinWeights(t *testing.T) {
	vs := []float64{0.3, 0.6, 0.9}
	if testing.Short() {
		vs = vs[1:2]
	}
	for _, v := range vs {
		wp, ws, err := exact.SpinWeights(v, 2)
		if err != nil {
			t.Fatal(err)
		}
		names, cp, sp := spreadNextOrderOdd(t, v, true)
		_, cs, ss := spreadNextOrderOdd(t, v, false)
		for k, name := range names {
			t.Logf("v=%.1f %-24s probe weight %.9f ± %.1e (canonical %.9f)  source weight %.9f ± %.1e (exact %.9f)",
				v, name, cp[k], sp[k], wp, cs[k], ss[k], ws)
			if math.Abs(cs[k]-ws) > 1e-6*math.Abs(ws) {
				t.Errorf("v=%g %s: source weight %.10g, exact %.10g", v, name, cs[k], ws)
			}
			want := wp
			if !scenario.CanonicalMember(name) {
				want = ws
			}
			if math.Abs(cp[k]-want) > 1e-6*math.Abs(want) {
				t.Errorf("v=%g %s: probe weight %.10g, want %.10g (canonical %v)", v, name, cp[k], want, scenario.CanonicalMember(name))
			}
		}
	}
}

// TestDixonProbeSpinWeights: the same through a scan of the scenario's own
// probe, kind dixon with g = 1.3 and g = 0.5 (probe kind dixon, flat): the
// probe spin's second-order weight is the canonical Thomas–BMT
// Hamiltonian's at that g, (g − 1)/2 times the source spin's
// (validate/exact.SpinWeights; Thomas 1927; Bargmann, Michel & Telegdi
// 1959), to 1e-6 relative (as above; relative to the source weight where
// the probe weight is small, g near 1).
func TestDixonProbeSpinWeights(t *testing.T) {
	vs := []float64{0.3, 0.6, 0.9}
	if testing.Short() {
		vs = vs[2:]
	}
	for _, g := range []float64{1.3, 0.5} {
		for _, v := range vs {
			wp, ws, err := exact.SpinWeights(v, g)
			if err != nil {
				t.Fatal(err)
			}
			_, c, sg := nextOrderOdd(t, v, true, nil, func(s *scenario.Scenario) { s.Probe.Kind, s.Probe.Gyro = "dixon", g })
			t.Logf("g=%.1f v=%.1f dixon probe weight %.9f ± %.1e, canonical %.9f ((g−1)/2 × source %.9f)", g, v, c[0], sg[0], wp, (g-1)/2*ws)
			if math.Abs(c[0]-wp) > 1e-6*math.Abs(ws) {
				t.Errorf("g=%g v=%g: probe weight %.10g, canonical %.10g", g, v, c[0], wp)
			}
		}
	}
}
