package integrate

import (
	"errors"
	"math"
	"testing"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/observables/leading"
	"ricochet/validate/exact"
)

// speedGamma returns γ for speed v.
func speedGamma(v float64) float64 { return 1 / math.Sqrt((1-v)*(1+v)) }

// scatterExact runs Scatter on a geodesic model in the frame of record and
// compares with an exact impulse per unit mass; it returns the relative
// error and the outcome.
func scatterExact(t *testing.T, g *Geodesic, v float64, want exact.Scattering) (float64, Outcome) {
	t.Helper()
	in, err := Incoming(g.M, speedGamma(v), 1, vec.Vec3{})
	if err != nil {
		t.Fatal(err)
	}
	out, err := Scatter(g, in, nil)
	if err != nil {
		t.Fatal(err)
	}
	if out.Status != StatusScattered {
		t.Fatalf("%s: status %v", g.Name(), out.Status)
	}
	return relDiff(out.Impulse, want.ImpulsePerMass.Scale(g.M)), out
}

// TestGeodesicSchwarzschild checks the integrated impulse of a timelike
// geodesic in Schwarzschild (Kerr–Schild coordinates) against the exact
// deflection by quadrature of the orbit equation (Schwarzschild 1916;
// Chandrasekhar 1983 §19, from memory; validate/exact.Schwarzschild), over
// M/b from 1e-4 to 0.05 at v = 0.5 and 0.9, and checks that the error
// estimate bounds the true error and that the Killing energy is conserved.
func TestGeodesicSchwarzschild(t *testing.T) {
	for _, v := range []float64{0.5, 0.9} {
		for _, mu := range []float64{1e-4, 1e-3, 1e-2, 0.05} {
			ex, err := exact.Schwarzschild(v, 1, mu)
			if err != nil {
				t.Fatal(err)
			}
			g := &Geodesic{Metric: spacetime.Schwarzschild(mu), M: 1}
			d, out := scatterExact(t, g, v, ex)
			want := ex.ImpulsePerMass.Spatial().Norm()
			est := out.ImpulseErr.Spatial().Norm() / want
			t.Logf("v = %.1f M/b = %.0e: rel. error %.2e estimate %.2e R = %.3g b evaluations %d energy drift %.1e mass shell %.1e",
				v, mu, d, est, out.Radius, out.Stats.Evaluations, out.Drift.Energy, out.Drift.MassShell)
			// Design target for the exact checks (achieved: ≲ 7e-12).
			if d > 1e-10 {
				t.Errorf("v = %g M/b = %g: relative error %.3g > 1e-10", v, mu, d)
			}
			// The estimate must bound the error, up to 1e-13 relative
			// for the reference quadrature's own accuracy (exact package).
			if d > est+1e-13 {
				t.Errorf("v = %g M/b = %g: error %.3g not bounded by estimate %.3g", v, mu, d, est)
			}
			// Killing energy: integrator tolerance 1e-13 per step, a
			// few thousand steps (design target 1e-11).
			if out.Drift.Energy > 1e-11 || out.Drift.MassShell > 1e-11 {
				t.Errorf("v = %g M/b = %g: drift %+v", v, mu, out.Drift)
			}
			// Static source: Δp⁰ = 0 up to rounding of E ~ γm.
			if math.Abs(out.Impulse[0]) > 1e-13 {
				t.Errorf("v = %g M/b = %g: Δp⁰ = %g, want 0", v, mu, out.Impulse[0])
			}
		}
	}
}

// TestGeodesicCapture: for small b (M/b = 0.3 at v = 0.5 and M/b = 0.2 at
// v = 0.9) the exact orbit equation has no turning point outside the
// horizon (validate/exact.ErrCaptured); Scatter must report capture.
func TestGeodesicCapture(t *testing.T) {
	for _, c := range []struct{ v, mu float64 }{{0.5, 0.3}, {0.9, 0.2}, {0.5, 1}} {
		if _, err := exact.Schwarzschild(c.v, 1, c.mu); !errors.Is(err, exact.ErrCaptured) {
			t.Fatalf("reference: v = %g M/b = %g not captured: %v", c.v, c.mu, err)
		}
		in, _ := Incoming(1, speedGamma(c.v), 1, vec.Vec3{})
		out, err := Scatter(&Geodesic{Metric: spacetime.Schwarzschild(c.mu), M: 1}, in, nil)
		if err != nil {
			t.Fatal(err)
		}
		if out.Status != StatusCaptured {
			t.Errorf("v = %g M/b = %g: status %v, want captured", c.v, c.mu, out.Status)
		}
	}
}

// TestGeodesicKerrEquatorial checks equatorial Kerr scattering, spin ±z
// (a > 0 retrograde, a < 0 prograde in the frame of record), against the
// exact deflection by quadrature with Carter's constants (Carter 1968;
// Chandrasekhar 1983 §61, from memory; validate/exact.KerrEquatorial),
// including horizonless members (|a| > M). Where the reference reaches the
// ring singularity (exact.ErrRing), Scatter must report the disk.
func TestGeodesicKerrEquatorial(t *testing.T) {
	const v = 0.6
	for _, mu := range []float64{1e-3, 0.02, 0.05} {
		for _, a := range []float64{0.3, -0.3, 0.9, -0.9, 0.03, -0.03} {
			ex, err := exact.KerrEquatorial(v, 1, mu, a)
			g := &Geodesic{Metric: spacetime.Kerr(mu, a), M: 1}
			if errors.Is(err, exact.ErrRing) {
				in, _ := Incoming(1, speedGamma(v), 1, vec.Vec3{})
				out, err := Scatter(g, in, &Settings{SingleRun: true})
				if err != nil {
					t.Fatal(err)
				}
				t.Logf("M/b = %g a/b = %+g: reference reaches the ring, status %v", mu, a, out.Status)
				if out.Status != StatusCrossedDisk {
					t.Errorf("M/b = %g a/b = %g: status %v, want crossed branch disk", mu, a, out.Status)
				}
				continue
			}
			if err != nil {
				t.Fatal(err)
			}
			d, out := scatterExact(t, g, v, ex)
			t.Logf("M/b = %g a/b = %+g: χ = %.6f rel. error %.2e evaluations %d energy drift %.1e",
				mu, a, ex.Chi, d, out.Stats.Evaluations, out.Drift.Energy)
			if d > 1e-10 { // design target for the exact checks
				t.Errorf("M/b = %g a/b = %g: relative error %.3g > 1e-10", mu, a, d)
			}
			if out.Drift.Energy > 1e-11 { // as in TestGeodesicSchwarzschild
				t.Errorf("M/b = %g a/b = %g: energy drift %.3g", mu, a, out.Drift.Energy)
			}
		}
	}
}

// TestGeodesicReissnerNordstrom checks a charged probe in
// Reissner–Nordström against the exact deflection by quadrature
// (Reissner 1916, Nordström 1918; Chandrasekhar 1983 §40, from memory;
// validate/exact.ReissnerNordstrom): attractive and repulsive electric
// couplings, sub- and super-extremal charge.
func TestGeodesicReissnerNordstrom(t *testing.T) {
	cases := []struct{ v, M, Q, qm float64 }{
		{0.6, 0.01, 0.005, 1},
		{0.6, 0.01, 0.02, -2},
		{0.6, 0.05, 0.03, 1},
		{0.5, 1e-3, 2e-3, 3},
		{0.9, 0.02, 0.01, -5},
		{0.9, 0, 0.01, 1}, // M = 0: the Q² geometry alone with Coulomb repulsion
	}
	for _, c := range cases {
		ex, err := exact.ReissnerNordstrom(c.v, 1, c.M, c.Q, c.qm)
		if err != nil {
			t.Fatal(err)
		}
		g := &Geodesic{Metric: spacetime.ReissnerNordstrom(c.M, c.Q), M: 1, Q: c.qm}
		d, out := scatterExact(t, g, c.v, ex)
		t.Logf("%+v: χ = %+.6f rel. error %.2e energy drift %.1e", c, ex.Chi, d, out.Drift.Energy)
		if d > 1e-10 { // design target for the exact checks
			t.Errorf("%+v: relative error %.3g > 1e-10", c, d)
		}
		if out.Drift.Energy > 1e-11 { // as in TestGeodesicSchwarzschild
			t.Errorf("%+v: energy drift %.3g", c, out.Drift.Energy)
		}
	}
}

// TestGeodesicNormalize: in Schwarzschild (Kerr–Schild coordinates) a probe
// with p⃗ = 0 has p⁰ = m/√(1 − 2M/r) (g_tt = −(1 − 2M/r), g_ti p^i = 0;
// exact), and its Killing energy is m√(1 − 2M/r). Normalize must find the
// future root also inside the ergoregion of Kerr (g_tt > 0), keeping the
// shell to rounding.
func TestGeodesicNormalize(t *testing.T) {
	const M, m, r = 0.7, 1.3, 5.0
	g := &Geodesic{Metric: spacetime.Schwarzschild(M), M: m}
	y := []float64{0, 0, r, 0, 99, 0, 0, 0}
	g.Normalize(y, 0)
	want := m / math.Sqrt(1-2*M/r)
	if math.Abs(y[IP]-want) > 1e-15*want { // closed form, rounding only
		t.Errorf("p⁰ = %.17g, want %.17g", y[IP], want)
	}
	if e, w := g.Energy(y), m*math.Sqrt(1-2*M/r); math.Abs(e-w) > 1e-15*w {
		t.Errorf("E = %.17g, want %.17g", e, w)
	}
	// Kerr a = 0.9 M: on the equator the ergosurface is at r = 2M, the
	// outer horizon at 1.436 M; r = 1.7 M lies between. There g_tt > 0 and
	// p⃗ = 0 is not allowed; the normal n^μ = −s g^{μ0} to the surfaces
	// t = const (timelike: g^{00} < 0 in Kerr–Schild coordinates) with
	// s = m/√(−g^{00}) is on the shell, with p⁰ = −s g^{00} (exact).
	k := &Geodesic{Metric: spacetime.Kerr(1, 0.9), M: 1.1}
	x := [4]float64{0, 1.7 * 0.8, 1.7 * 0.6, 0}
	var pt spacetime.Point
	spacetime.NewEvaluator(k.Metric, 1).Eval(x, &pt)
	if pt.G[0][0] <= 0 {
		t.Fatalf("test point not in the ergoregion: g_tt = %g", pt.G[0][0])
	}
	s := k.M / math.Sqrt(-pt.GInv[0][0])
	y = []float64{x[0], x[1], x[2], x[3], 0, -s * pt.GInv[1][0], -s * pt.GInv[2][0], -s * pt.GInv[3][0]}
	want = -s * pt.GInv[0][0]
	y[IP] = 1.05 * want // the current p⁰ selects among the two future roots
	k.Normalize(y, 0)
	if math.Abs(y[IP]-want) > 1e-13*want { // rounding in g⁻¹ and the root
		t.Errorf("ergoregion: p⁰ = %.17g, want %.17g", y[IP], want)
	}
	if ms := k.MassShell(y); math.Abs(ms) > 1e-13 {
		t.Errorf("ergoregion: mass-shell violation %.2e", ms)
	}
	// Weak-field sign of the potential term: E − p⁰ → qQ/r (Coulomb
	// potential, Gaussian units) far from a charge.
	q := &Geodesic{Metric: spacetime.ReissnerNordstrom(0, 0.5), M: 1, Q: 2}
	y = []float64{0, 3e5, 4e5, 0, 0, 0.2, 0.1, 0}
	q.Normalize(y, 0)
	if d, w := q.Energy(y)-y[IP], 2*0.5/5e5; math.Abs(d-w) > 1e-5*w { // O(Q/r) corrections
		t.Errorf("E − p⁰ = %g, want qQ/r = %g", d, w)
	}
}

// genericDirs are probe directions (dir, bhat) at generic angles to the
// background's spin axis z, avoiding the axis.
var genericDirs = [][2]vec.Vec3{
	{{1, 0, 0}, {0, 1, 0}},
	{{0.6, 0.3, -0.5}, {-0.2, 0.9, 0.4}},
	{{0.2, -0.7, 0.6}, {0.8, 0.3, 0.1}},
}

// TestFirstOrderCurved checks integrate.FirstOrder of the geodesic and
// charged-geodesic models in the linearized backgrounds against the 1PM
// closed form (Vines 2017 for Kerr, all orders in spin; its NUT and
// electromagnetic generalisations, Emond et al. 2020; all from memory;
// observables/leading.Impulse1PM) for Kerr at generic orientations, Taub–NUT
// in three string gauges, and Kerr–Newman with a charged probe.
func TestFirstOrderCurved(t *testing.T) {
	const m, b = 1.3, 1.0
	type src struct {
		metric spacetime.Linearizable
		lead   leading.GravSource
		q      float64
	}
	srcs := []src{
		{spacetime.Kerr(0.7, 0.6), leading.GravSource{M: 0.7, A: vec.Vec3{0, 0, 0.6}}, 0},
		{spacetime.Kerr(0.7, -0.4), leading.GravSource{M: 0.7, A: vec.Vec3{0, 0, -0.4}}, 0},
		{spacetime.KerrNewmanNUT{M: 0.3, N: 0.5, StringGauge: -1}, leading.GravSource{M: 0.3, N: 0.5}, 0},
		{spacetime.KerrNewmanNUT{M: 0.3, N: 0.5}, leading.GravSource{M: 0.3, N: 0.5}, 0},
		{spacetime.KerrNewmanNUT{M: 0.3, N: -0.5, StringGauge: 1}, leading.GravSource{M: 0.3, N: -0.5}, 0},
		{spacetime.KerrNewman{M: 0.4, A: 0.5, Q: 0.3}, leading.GravSource{M: 0.4, Q: 0.3, A: vec.Vec3{0, 0, 0.5}}, -0.8},
		{spacetime.KerrNewmanNUT{M: 0.4, A: 0.3, Q: 0.3, N: 0.2, StringGauge: 1}, leading.GravSource{M: 0.4, Q: 0.3, N: 0.2, A: vec.Vec3{0, 0, 0.3}}, 0.6},
		{spacetime.DyonicKerrNewman{M: 0.4, A: 0.5, Q: 0.3, P: -0.4}, leading.GravSource{M: 0.4, Q: 0.3, P: -0.4, A: vec.Vec3{0, 0, 0.5}}, 0.8},
		{spacetime.DyonicReissnerNordstrom(0.3, 0, 0.5), leading.GravSource{M: 0.3, P: 0.5}, -0.6},
	}
	worst := 0.0
	for _, s := range srcs {
		for _, gamma := range []float64{1.1, 2.5} {
			for _, d := range genericDirs {
				in, err := IncomingDir(m, gamma, b, d[0], d[1], vec.Vec3{})
				if err != nil {
					t.Fatal(err)
				}
				g := &Geodesic{Metric: s.metric, M: m, Q: s.q, Linear: true}
				got, _ := FirstOrder(g, in, 0)
				want := leading.Impulse1PM(leading.GravProbe{M: m, Q: s.q}, s.lead, in.P.Scale(1/m), in.B)
				e := got.Sub(want).Spatial().Norm() / want.Spatial().Norm()
				worst = math.Max(worst, e)
				// Gauss–Legendre with 2×96 nodes on a mapped line:
				// geometric convergence to ~1e-13 for |Πa| ≤ 0.6 b
				// (observed worst ~1e-14).
				if e > 1e-11 {
					t.Errorf("%s γ = %g dir %v: FirstOrder %v, 1PM %v, rel. diff %.2e", s.metric.Name(), gamma, d[0], got, want, e)
				}
			}
		}
	}
	t.Logf("worst relative difference FirstOrder vs Impulse1PM: %.2e", worst)
}

// fitSlope returns the least-squares slope of log y against log x.
func fitSlope(x, y []float64) float64 {
	var sx, sy, sxx, sxy float64
	n := float64(len(x))
	for i := range x {
		lx, ly := math.Log(x[i]), math.Log(y[i])
		sx += lx
		sy += ly
		sxx += lx * lx
		sxy += lx * ly
	}
	return (n*sxy - sx*sy) / (n*sxx - sx*sx)
}

// TestResidualScaling scans the coupling ε = M/b at fixed spin-to-b ratio
// (and fixed N/M, Q/M, probe charge) and checks that the residual
// |Δp − Δp_1PM| of the full integration against the 1PM closed form
// (observables/leading.Impulse1PM) scales as ε² (the next order is 2PM),
// with exponent 2 ± 0.05.
func TestResidualScaling(t *testing.T) {
	eps := []float64{1e-4, 2e-4, 4e-4, 8e-4}
	type family struct {
		name   string
		metric func(e float64) spacetime.Metric
		lead   func(e float64) leading.GravSource
		q      float64
		dir    [2]vec.Vec3
	}
	fams := []family{
		{"Kerr a = 0.5 b, generic orientation",
			func(e float64) spacetime.Metric { return spacetime.Kerr(e, 0.5) },
			func(e float64) leading.GravSource { return leading.GravSource{M: e, A: vec.Vec3{0, 0, 0.5}} },
			0, genericDirs[1]},
		{"Taub–NUT N = 2M",
			func(e float64) spacetime.Metric { return spacetime.KerrNewmanNUT{M: e, N: 2 * e} },
			func(e float64) leading.GravSource { return leading.GravSource{M: e, N: 2 * e} },
			0, genericDirs[0]},
		{"Kerr–Newman Q = M, a = 0.3 b, q/m = −1",
			func(e float64) spacetime.Metric { return spacetime.KerrNewman{M: e, A: 0.3, Q: e} },
			func(e float64) leading.GravSource { return leading.GravSource{M: e, Q: e, A: vec.Vec3{0, 0, 0.3}} },
			-1, genericDirs[2]},
		{"dyonic Kerr–Newman Q = M, P = −2M, a = 0.3 b, q/m = 1",
			func(e float64) spacetime.Metric { return spacetime.DyonicKerrNewman{M: e, A: 0.3, Q: e, P: -2 * e} },
			func(e float64) leading.GravSource {
				return leading.GravSource{M: e, Q: e, P: -2 * e, A: vec.Vec3{0, 0, 0.3}}
			},
			1, genericDirs[1]},
	}
	for _, f := range fams {
		in, err := IncomingDir(1, 1.25, 1, f.dir[0], f.dir[1], vec.Vec3{})
		if err != nil {
			t.Fatal(err)
		}
		var res []float64
		for _, e := range eps {
			out, err := Scatter(&Geodesic{Metric: f.metric(e), M: 1, Q: f.q}, in, &Settings{SingleRun: true})
			if err != nil || out.Status != StatusScattered {
				t.Fatalf("%s ε = %g: %v %v", f.name, e, err, out.Status)
			}
			want := leading.Impulse1PM(leading.GravProbe{M: 1, Q: f.q}, f.lead(e), in.P, in.B)
			res = append(res, out.Impulse.Sub(want).Spatial().Norm())
		}
		s := fitSlope(eps, res)
		t.Logf("%s: residual/ε² = %.5g … %.5g, exponent %.4f", f.name, res[0]/(eps[0]*eps[0]), res[3]/(eps[3]*eps[3]), s)
		// Exponent 2 (first correction is second order); the third-order
		// term shifts it by O(10 ε) ≲ 0.01 over this range and the
		// numerical error (~1e-13 relative to ~1e-3) is negligible.
		if math.Abs(s-2) > 0.05 {
			t.Errorf("%s: residual exponent %.4f, want 2 ± 0.05", f.name, s)
		}
	}
}

// TestNUTStringGauge: the impulse of a path away from the Misner string
// does not depend on the string gauge C (Misner 1963; the C-family is one
// spacetime in shifted time coordinates, see spacetime.KerrNewmanNUT), and
// the out-of-plane kick appears at first order with the 1PM value
// (observables/leading.Impulse1PM; Emond et al. 2020, from memory).
func TestNUTStringGauge(t *testing.T) {
	const mu = 1e-3
	in, _ := Incoming(1, 1.25, 1, vec.Vec3{})
	cases := []spacetime.KerrNewmanNUT{
		{M: mu, N: 2 * mu},
		{M: mu, N: 2 * mu, A: 0.4},
		{M: 0.02, N: -0.03, A: -0.3, Q: 0.01},
	}
	for _, base := range cases {
		var ref Outcome
		for i, C := range []float64{-1, 0, 1} {
			k := base
			k.StringGauge = C
			g := &Geodesic{Metric: k, M: 1, Q: 0.5}
			out, err := Scatter(g, in, nil)
			if err != nil || out.Status != StatusScattered {
				t.Fatalf("%s: %v %v", k.Name(), err, out.Status)
			}
			if out.Drift.Energy > 1e-11 { // as in TestGeodesicSchwarzschild
				t.Errorf("%s: energy drift %.3g", k.Name(), out.Drift.Energy)
			}
			if i == 0 {
				ref = out
				continue
			}
			d := relDiff(out.Impulse, ref.Impulse)
			t.Logf("%s: relative change from C = −1: %.2e", k.Name(), d)
			// Gauge independence to the design's exact-check level.
			if d > 1e-10 {
				t.Errorf("%s: impulse changed by %.3g relative", k.Name(), d)
			}
			// And within the error bars, component by component: the two
			// gauges are independent integrations of the same physics.
			for j := 0; j < 4; j++ {
				if dj := math.Abs(out.Impulse[j] - ref.Impulse[j]); dj > out.ImpulseErr[j]+ref.ImpulseErr[j] {
					t.Errorf("%s: component %d changed by %.3g, bars %.3g + %.3g", k.Name(), j, dj, out.ImpulseErr[j], ref.ImpulseErr[j])
				}
			}
		}
	}
	// Out-of-plane kick at first order: Δp_z/Δp_z(1PM) − 1 = O(ε) (second
	// order relative correction; coefficient of order 10 at γ = 1.25).
	for _, e := range []float64{1e-4, 1e-3} {
		k := spacetime.KerrNewmanNUT{M: e, N: 2 * e}
		out, _ := Scatter(&Geodesic{Metric: k, M: 1}, in, nil)
		want := leading.Impulse1PM(leading.GravProbe{M: 1}, leading.GravSource{M: e, N: 2 * e}, in.P, in.B)
		r := out.Impulse[3]/want[3] - 1
		t.Logf("ε = %g: Δp_z = %.6e, 1PM %.6e, relative difference %.2e", e, out.Impulse[3], want[3], r)
		if want[3] == 0 || math.Abs(r) > 20*e {
			t.Errorf("ε = %g: Δp_z = %g, 1PM %g", e, out.Impulse[3], want[3])
		}
	}
}

// TestNUTStringHazard: a path crossing the half-axis that carries the
// Misner string (z > 0 for C = +1) is reported, never returned as a number.
func TestNUTStringHazard(t *testing.T) {
	in, err := IncomingDir(1, 1.25, 1, vec.Vec3{1, 0, 0}, vec.Vec3{0, 0, 1}, vec.Vec3{})
	if err != nil {
		t.Fatal(err)
	}
	for _, C := range []float64{1, 0} {
		k := spacetime.KerrNewmanNUT{M: 1e-3, N: 1e-3, StringGauge: C}
		out, err := Scatter(&Geodesic{Metric: k, M: 1}, in, &Settings{SingleRun: true})
		if err != nil {
			t.Fatal(err)
		}
		if out.Status != StatusNearString {
			t.Errorf("C = %g: status %v, want %v", C, out.Status, StatusNearString)
		}
	}
}

// carter returns Carter's constant (Carter 1968, from memory)
//
//	K = p_θ² + cos²θ [a²(m² − E²) + L_z²/sin²θ]
//
// of a Kerr–Newman probe state in Kerr–Schild coordinates, with the
// Killing energy E and angular momentum L_z (including the potential
// terms) and p_θ = p_μ ∂x^μ/∂θ. At fixed (t, r, φ) the Kerr–Schild
// Cartesian coordinates x + iy = (r + ia) sin θ e^{iφ}, z = r cos θ give
// ∂_θ = x cot θ ∂_x + y cot θ ∂_y − r sin θ ∂_z; it is the same vector
// field in Boyer–Lindquist coordinates, which differ only by functions of r
// in t and φ, and A_θ = 0 there (so p_θ is kinetic and canonical).
func carter(g *Geodesic, a float64, y []float64) float64 {
	k := g.Metric.(spacetime.KerrNewman)
	x := event(y)
	r := k.Radius(x)
	c := x[3] / r
	s := math.Sqrt((x[1]*x[1] + x[2]*x[2]) / (r*r + a*a))
	pl, _ := g.lower(y)
	pth := (x[1]*pl[1]+x[2]*pl[2])*c/s - r*s*pl[3]
	E := g.Energy(y)
	L := g.AngularMomentumZ(y)
	return pth*pth + c*c*(a*a*(g.M*g.M-E*E)+L*L/(s*s))
}

// TestGeodesicConservation integrates paths at generic orientations in
// Kerr, Kerr–Newman (charged probe) and Kerr–Newman–Taub–NUT and checks
// along every accepted step the drift of the Killing energy (whole path), of the
// angular momentum J_z of the axial Killing vector, and, for Kerr and
// Kerr–Newman, of Carter's constant (Carter 1968), the last two within
// 100 b of the source.
func TestGeodesicConservation(t *testing.T) {
	cases := []struct {
		metric spacetime.Metric
		q      float64
		dir    [2]vec.Vec3
	}{
		{spacetime.Kerr(0.05, 0.6), 0, genericDirs[1]},
		{spacetime.Kerr(0.08, 0.07), 0, genericDirs[2]},
		{spacetime.KerrNewman{M: 0.05, A: -0.4, Q: 0.03}, -2, genericDirs[1]},
		{spacetime.KerrNewmanNUT{M: 0.03, A: 0.2, N: 0.02, Q: 0.01, StringGauge: -1}, 1, genericDirs[0]},
	}
	for _, c := range cases {
		in, err := IncomingDir(1, 1.4, 1, c.dir[0], c.dir[1], vec.Vec3{})
		if err != nil {
			t.Fatal(err)
		}
		g := &Geodesic{Metric: c.metric, M: 1, Q: c.q}
		probe := &Geodesic{Metric: c.metric, M: 1, Q: c.q} // separate evaluator for the checks
		kn, isKN := c.metric.(spacetime.KerrNewman)
		var J0, K0, dJ, dK, scale float64
		first := true
		set := &Settings{SingleRun: true, Observe: func(_ float64, y []float64) {
			// J_z = x p_y − y p_x loses ~ (r/b)·1e-16 relative to
			// cancellation at radius r; measure where that is below 1e-14.
			if radius(y) > 100*in.ImpactParameter() {
				return
			}
			J := probe.AngularMomentumZ(y)
			var K float64
			if isKN {
				K = carter(probe, kn.A, y)
			}
			if first {
				J0, K0, first = J, K, false
				// |p| b sets the scale of J_z and its square that of K.
				scale = in.P.Spatial().Norm() * in.ImpactParameter()
				return
			}
			dJ = math.Max(dJ, math.Abs(J-J0)/scale)
			dK = math.Max(dK, math.Abs(K-K0)/(scale*scale))
		}}
		out, err := Scatter(g, in, set)
		if err != nil || out.Status != StatusScattered {
			t.Fatalf("%s: %v %v", c.metric.Name(), err, out.Status)
		}
		t.Logf("%s: drift energy %.1e J_z %.1e Carter %.1e mass shell %.1e; steps %d evaluations %d",
			c.metric.Name(), out.Drift.Energy, dJ, dK, out.Drift.MassShell, out.Stats.Accepted, out.Stats.Evaluations)
		// Integrator tolerance 1e-13 on a few thousand steps: target 1e-11
		// relative for every exact constant of the motion.
		if out.Drift.Energy > 1e-11 || dJ > 1e-11 || dK > 1e-11 || out.Drift.MassShell > 1e-11 {
			t.Errorf("%s: drift energy %.3g J_z %.3g Carter %.3g mass shell %.3g", c.metric.Name(), out.Drift.Energy, dJ, dK, out.Drift.MassShell)
		}
	}
}

// TestGeodesicSuperExtremalDisk: a probe moving along the axis of a
// horizonless Kerr member through the ring's disk is reported as crossing
// it; the same probe passing outside the ring scatters.
func TestGeodesicSuperExtremalDisk(t *testing.T) {
	k := spacetime.Kerr(0.01, 0.5)
	for _, c := range []struct {
		b    float64
		want Status
	}{{0.3, StatusCrossedDisk}, {1, StatusScattered}} {
		in, _ := IncomingDir(1, 1.25, c.b, vec.Vec3{0, 0, 1}, vec.Vec3{1, 0, 0}, vec.Vec3{})
		out, err := Scatter(&Geodesic{Metric: k, M: 1}, in, &Settings{SingleRun: true})
		if err != nil {
			t.Fatal(err)
		}
		if out.Status != c.want {
			t.Errorf("b = %g: status %v, want %v", c.b, out.Status, c.want)
		}
	}
}

// BenchmarkGeodesicSchwarzschild measures one Scatter (main run plus the
// two error-estimate runs) at the default tolerance, M/b = 0.01, v = 0.6.
func BenchmarkGeodesicSchwarzschild(b *testing.B) {
	in, _ := Incoming(1, 1.25, 1, vec.Vec3{})
	g := &Geodesic{Metric: spacetime.Schwarzschild(0.01), M: 1}
	for b.Loop() {
		Scatter(g, in, nil)
	}
}

// BenchmarkGeodesicKerrNewmanNUT measures one Scatter in Kerr–Newman–
// Taub–NUT with a charged probe at a generic orientation.
func BenchmarkGeodesicKerrNewmanNUT(b *testing.B) {
	in, _ := IncomingDir(1, 1.25, 1, genericDirs[1][0], genericDirs[1][1], vec.Vec3{})
	g := &Geodesic{Metric: spacetime.KerrNewmanNUT{M: 0.01, A: 0.4, Q: 0.01, N: 0.01}, M: 1, Q: 1}
	for b.Loop() {
		Scatter(g, in, nil)
	}
}

// adOnly hides every method of a metric but those of spacetime.Metric, so
// that Geodesic falls back to the automatic differentiation.
type adOnly struct{ spacetime.Metric }

// TestGeodesicKerrSchildPath: the closed-form Kerr–Schild path of
// Geodesic (used for every KerrNewman metric) gives the same equations of
// motion and conserved quantities as the automatic differentiation of the
// metric, for a charged probe in Kerr–Newman (rounding only).
func TestGeodesicKerrSchildPath(t *testing.T) {
	k := spacetime.KerrNewman{M: 0.7, A: 0.5, Q: 0.3}
	fast := &Geodesic{Metric: k, M: 1.3, Q: -0.8}
	slow := &Geodesic{Metric: adOnly{k}, M: 1.3, Q: -0.8}
	y := []float64{0.3, 4.1, -2.7, 1.9, 0, 0.6, 0.45, -0.2}
	fast.Normalize(y, 0)
	d1 := make([]float64, 8)
	d2 := make([]float64, 8)
	fast.Deriv(y, d1)
	slow.Deriv(y, d2)
	for i := range d1 {
		if math.Abs(d1[i]-d2[i]) > 1e-14*(math.Abs(d2[i])+1e-3) {
			t.Errorf("dy[%d]: Kerr–Schild %.16g, automatic differentiation %.16g", i, d1[i], d2[i])
		}
	}
	if e1, e2 := fast.Energy(y), slow.Energy(y); math.Abs(e1-e2) > 1e-15*math.Abs(e2) {
		t.Errorf("energy: %.16g vs %.16g", e1, e2)
	}
	if j1, j2 := fast.AngularMomentumZ(y), slow.AngularMomentumZ(y); math.Abs(j1-j2) > 1e-14*math.Abs(j2) {
		t.Errorf("J_z: %.16g vs %.16g", j1, j2)
	}
}
