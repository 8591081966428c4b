package integrate

import (
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/observables/fit"
	"ricochet/validate/exact"
)

// secondCase is a second-order check against a known answer.
type secondCase struct {
	Name, Source string
	Model        Model
	In           InState
	// Want1, Want2 are the first- and second-order impulse (spatial
	// parts; the time components must vanish for these static sources).
	Want1, Want2 vec.Vec3
	Tol          float64 // relative to |Want2|
}

func gammaV(v float64) float64 { return 1 / math.Sqrt((1-v)*(1+v)) }

// inPlane returns the impulse of an in-plane deflection χ = c1 λ + c2 λ²
// as first- and second-order parts, for momentum p and the sign s of the
// y component (+1 away from the source, as Darwin; −1 towards it).
func inPlane(p, c1, c2, lam, s float64) (vec.Vec3, vec.Vec3) {
	return vec.Vec3{0, s * p * c1 * lam, 0}, vec.Vec3{-p * c1 * c1 * lam * lam / 2, s * p * c2 * lam * lam, 0}
}

func secondCases(t *testing.T) []secondCase {
	var cs []secondCase
	mustIn := func(gamma float64, spin vec.Vec3) InState {
		in, err := Incoming(1, gamma, 1, spin)
		if err != nil {
			t.Fatal(err)
		}
		return in
	}
	// Coulomb: Darwin 1913, expanded (exact.DarwinSeries); ε = qQ/(m b).
	for _, v := range []float64{0.2, 0.6, 0.95} {
		for _, eps := range []float64{0.05, -0.05} {
			c1, c2, _ := exact.DarwinSeries(v)
			w1, w2 := inPlane(gammaV(v)*v, c1, c2, eps, 1)
			cs = append(cs, secondCase{Name: "coulomb", Source: "Darwin 1913, expanded",
				Model: &Charge{Field: em.Coulomb{Q: eps}, M: 1, Q: 1}, In: mustIn(gammaV(v), vec.Vec3{}),
				Want1: w1, Want2: w2, Tol: 1e-12})
		}
	}
	// Charge–monopole and dyon–dyon: the cones of Poincaré 1896 (and their
	// dyon extension), expanded (exact.DyonSeries).
	for _, c := range []struct {
		v             float64
		probe, source exact.Charge
	}{
		{0.6, exact.Charge{Electric: 1}, exact.Charge{Magnetic: 0.03}},
		{0.9, exact.Charge{Electric: 1}, exact.Charge{Magnetic: -0.05}},
		{0.5, exact.Charge{Electric: 0.8, Magnetic: 0.3}, exact.Charge{Electric: -0.04, Magnetic: 0.09}},
	} {
		w1, w2, err := exact.DyonSeries(c.v, 1, 1, c.probe, c.source)
		if err != nil {
			t.Fatal(err)
		}
		name := "charge–monopole"
		if c.probe.Magnetic != 0 {
			name = "dyon–dyon"
		}
		cs = append(cs, secondCase{Name: name, Source: "Poincaré 1896 cone, expanded",
			Model: &Charge{Field: em.Dyon{Q: c.source.Electric, P: c.source.Magnetic}, M: 1, Q: c.probe.Electric, G: c.probe.Magnetic},
			In:    mustIn(gammaV(c.v), vec.Vec3{}), Want1: w1, Want2: w2, Tol: 1e-12})
	}
	// Schwarzschild: 1PM Einstein, 2PM Westpfahl 1985 (exact.SchwarzschildPM).
	for _, v := range []float64{0.3, 0.6, 0.9} {
		const mu = 0.01
		c1, c2, _ := exact.SchwarzschildPM(v)
		w1, w2 := inPlane(gammaV(v)*v, c1, c2, mu, -1)
		cs = append(cs, secondCase{Name: "schwarzschild", Source: "Westpfahl 1985 (2PM)",
			Model: &Geodesic{Metric: spacetime.Schwarzschild(mu), M: 1}, In: mustIn(gammaV(v), vec.Vec3{}),
			Want1: w1, Want2: w2, Tol: 1e-10})
	}
	// Kerr equatorial, exact in a/b: the radial quadrature (Carter 1968)
	// expanded in M/b (exact.KerrEquatorialSeries). a > 0 is retrograde.
	for _, c := range []struct{ v, alpha float64 }{{0.5, 0.4}, {0.5, -0.4}, {0.8, 0.7}} {
		const mu = 0.01
		s, err := exact.KerrEquatorialSeries(c.v, c.alpha)
		if err != nil {
			t.Fatal(err)
		}
		w1, w2 := inPlane(gammaV(c.v)*c.v, s.C1, s.C2, mu, -1)
		cs = append(cs, secondCase{Name: "kerr equatorial", Source: "Kerr radial quadrature, expanded",
			Model: &Geodesic{Metric: spacetime.Kerr(mu, c.alpha), M: 1}, In: mustIn(gammaV(c.v), vec.Vec3{}),
			Want1: w1, Want2: w2, Tol: 1e-10})
	}
	// Charged probe in Reissner–Nordström: the radial quadrature
	// (Reissner 1916, Nordström 1918) expanded with M and Q scaled
	// together (exact.ReissnerNordstromSeries), gravitational and
	// electric couplings of first order, the metric's Q² of second.
	for _, c := range []struct{ v, M, Q, q float64 }{{0.5, 0.01, 0.006, 2}, {0.7, 0.01, 0.009, -1.5}} {
		s, err := exact.ReissnerNordstromSeries(c.v, 1, c.M, c.Q, c.q)
		if err != nil {
			t.Fatal(err)
		}
		w1, w2 := inPlane(gammaV(c.v)*c.v, s.C1, s.C2, 1, -1)
		cs = append(cs, secondCase{Name: "reissner–nordström", Source: "RN radial quadrature, expanded",
			Model: &Geodesic{Metric: spacetime.ReissnerNordstrom(c.M, c.Q), M: 1, Q: c.q}, In: mustIn(gammaV(c.v), vec.Vec3{}),
			Want1: w1, Want2: w2, Tol: 1e-10})
	}
	// Point charge in the root-Kerr field (Kerr–Newman at G → 0), source
	// spin normal to the plane: the aligned radial quadrature with no
	// probe spin, expanded (exact.RootKerrAlignedSeries), exact in a/b.
	for _, c := range []struct{ v, as float64 }{{0.6, 0.5}, {0.9, -0.3}} {
		const eps = 0.01
		s, err := exact.RootKerrAlignedSeries(c.v, c.as)
		if err != nil {
			t.Fatal(err)
		}
		w1, w2 := inPlane(gammaV(c.v)*c.v, s.C1, s.C2, eps, 1)
		cs = append(cs, secondCase{Name: "charge in root-kerr", Source: "aligned radial quadrature, expanded",
			Model: &Charge{Field: em.RootKerr{Q: eps, A: vec.Vec3{0, 0, c.as}}, M: 1, Q: 1}, In: mustIn(gammaV(c.v), vec.Vec3{}),
			Want1: w1, Want2: w2, Tol: 1e-12})
	}
	// Root-Kerr probe on a root-Kerr source, spins aligned normal to the
	// plane, where both full completions coincide and reduce to a radial
	// quadrature (exact.RootKerrAligned) expanded in ε
	// (exact.RootKerrAlignedSeries). A check of the evaluator on these
	// models' own equations: their second order is completion-dependent
	// outside this configuration (see the package documentation).
	for _, c := range []struct{ v, as, ap float64 }{{0.6, 0.3, 0.2}, {0.8, -0.4, 0.1}} {
		const eps = 0.01
		s, err := exact.RootKerrAlignedSeries(c.v, c.as+c.ap)
		if err != nil {
			t.Fatal(err)
		}
		w1, w2 := inPlane(gammaV(c.v)*c.v, s.C1, s.C2, eps, 1)
		f := em.RootKerr{Q: eps, A: vec.Vec3{0, 0, c.as}}
		for _, m := range []Model{&RootKerr{Field: f, M: 1, Q: 1}, &RootKerrConservative{Field: f, M: 1, Q: 1}} {
			cs = append(cs, secondCase{Name: m.Name() + " aligned", Source: "aligned radial quadrature, expanded",
				Model: m, In: mustIn(gammaV(c.v), vec.Vec3{0, 0, c.ap}), Want1: w1, Want2: w2, Tol: 1e-12})
		}
	}
	return cs
}

// TestSecondOrderExact checks the direct second-order impulse against the
// expansions of exact solutions (sources in secondCases), the first order
// with it, the vanishing of Δp₂⁰ (static sources, energy conserved: a
// check, not an input), the mass shell at second order, and that the
// error estimate bounds the true error.
func TestSecondOrderExact(t *testing.T) {
	for _, c := range secondCases(t) {
		r, err := SecondOrder(c.Model, c.In, nil)
		if err != nil {
			t.Fatalf("%s: %v", c.Name, err)
		}
		if r.Status != StatusScattered {
			t.Fatalf("%s: status %v", c.Name, r.Status)
		}
		s2 := c.Want2.Norm()
		d1 := r.Impulse1.Spatial().Sub(c.Want1).Norm() / c.Want1.Norm()
		d2 := r.Impulse2.Spatial().Sub(c.Want2).Norm() / s2
		est := r.Impulse2Err.Spatial().Norm() / s2
		t.Logf("%-16s %-34s rel. error %.1e (estimate %.1e), first order %.1e, nodes %d, evaluations %d, exact derivatives %v",
			c.Name, c.Source, d2, est, d1, r.Nodes, r.Evals, r.Exact)
		if d2 > c.Tol {
			t.Errorf("%s: second order %v, want %v (rel. error %.2g > %g)", c.Name, r.Impulse2, c.Want2, d2, c.Tol)
		}
		if d1 > 1e-13 {
			t.Errorf("%s: first order %v, want %v (rel. error %.2g)", c.Name, r.Impulse1, c.Want1, d1)
		}
		// The estimate must bound the error (1e-14 margin for the
		// rounding of the references).
		if d2 > est+1e-14 {
			t.Errorf("%s: error %.2g not bounded by the estimate %.2g", c.Name, d2, est)
		}
		// Static sources with a conserved energy: Δp₂⁰ = 0 within the
		// estimate; mass shell p_in·Δp₂ + ½Δp₁·Δp₁ = 0 to the same level.
		if math.Abs(r.Impulse2[0]) > r.Impulse2Err[0]+1e-14*s2 {
			t.Errorf("%s: Δp₂⁰ = %.3g, want 0 (±%.2g)", c.Name, r.Impulse2[0], r.Impulse2Err[0])
		}
		if math.Abs(r.MassShell) > c.In.P[0]*(r.Impulse2Err.Spatial().Norm()+1e-14*s2) {
			t.Errorf("%s: mass shell at second order violated by %.3g", c.Name, r.MassShell)
		}
		// Aligned spins do not precess.
		if a := r.SpinKick1.Spatial().Norm() + r.SpinKick2.Spatial().Norm(); a > 1e-14*c.In.A.Spatial().Norm() {
			t.Errorf("%s: aligned spin kicked by %.3g", c.Name, a)
		}
	}
}

// TestSecondOrderDifferences checks the finite-difference path against
// the exact expansions of the electromagnetic models (internal
// consistency: same equations, independent derivatives), in a generic
// orientation with spins and a dyonic root-Kerr source, and that each
// path's error estimate covers the difference.
func TestSecondOrderDifferences(t *testing.T) {
	in, err := IncomingDir(1, 1.4, 1, vec.Vec3{1, 0.2, 0.1}, vec.Vec3{0, 1, 0.3}, vec.Vec3{0.1, -0.2, 0.3})
	if err != nil {
		t.Fatal(err)
	}
	f := em.RootKerr{Q: 0.01, P: 0.003, A: vec.Vec3{0.1, 0.2, 0.3}}
	for _, m := range []Model{
		&Charge{Field: f, M: 1, Q: 1, G: 0.2},
		&RootKerr{Field: f, M: 1, Q: 1, G: 0.2},
		&RootKerrConservative{Field: f, M: 1, Q: 1, G: 0.2},
	} {
		st := in
		if m.Dim() == 8 {
			st.A = vec.Vec4{}
		}
		a, err := SecondOrder(m, st, nil)
		if err != nil {
			t.Fatal(err)
		}
		b, err := SecondOrder(m, st, &SecondOrderSettings{Differences: true})
		if err != nil {
			t.Fatal(err)
		}
		if !a.Exact || b.Exact {
			t.Fatalf("%s: exact flags %v %v", m.Name(), a.Exact, b.Exact)
		}
		for i := 0; i < 4; i++ {
			for _, q := range []struct {
				name         string
				x, y, ex, ey float64
			}{
				{"Δp₂", a.Impulse2[i], b.Impulse2[i], a.Impulse2Err[i], b.Impulse2Err[i]},
				{"Δa₂", a.SpinKick2[i], b.SpinKick2[i], a.SpinKick2Err[i], b.SpinKick2Err[i]},
			} {
				if math.Abs(q.x-q.y) > q.ex+q.ey {
					t.Errorf("%s %s[%d]: exact %.15g, differences %.15g, estimates %.2g %.2g", m.Name(), q.name, i, q.x, q.y, q.ex, q.ey)
				}
			}
		}
	}
}

// TestSecondOrderSpinConstraints: the spinning models keep a·p = 0 and
// a·a exactly, so the spin kick must satisfy the constraints at second
// order (a check on the nested quadrature in a generic orientation), and
// the conservative completion conserves energy (Δp₂⁰ = 0) while the
// Lorentz-generator completion does not (its documented second-order
// energy drift when the spin has a component along the motion).
func TestSecondOrderSpinConstraints(t *testing.T) {
	in, err := IncomingDir(1, 1.4, 1, vec.Vec3{1, 0.2, 0.1}, vec.Vec3{0, 1, 0.3}, vec.Vec3{0.1, -0.2, 0.3})
	if err != nil {
		t.Fatal(err)
	}
	f := em.RootKerr{Q: 0.01, A: vec.Vec3{0.1, 0.2, 0.3}}
	for _, c := range []struct {
		m          Model
		energyZero bool
	}{
		{&RootKerr{Field: f, M: 1, Q: 1}, false},
		{&RootKerrConservative{Field: f, M: 1, Q: 1}, true},
		{&BMT{Field: f, M: 1, Q: 1, Gyro: 2}, false},
		{&RootKerrBody{Field: f, M: 1, Q: 1}, true},
		{&RootKerrBody{Field: f, M: 1, Q: 1, Contact: 1}, true},
	} {
		r, err := SecondOrder(c.m, in, nil)
		if err != nil {
			t.Fatal(err)
		}
		sa := r.SpinKick2.Spatial().Norm() + r.SpinKick1.Spatial().Norm()
		ea := r.SpinKick2Err.Spatial().Norm() + r.Impulse2Err.Spatial().Norm()
		an := in.A.Spatial().Norm()
		t.Logf("%s: spin norm %.2g, spin orth %.2g, mass shell %.2g, Δp₂⁰ %.3g ± %.2g, exact %v, evaluations %d",
			c.m.Name(), r.SpinNorm, r.SpinOrth, r.MassShell, r.Impulse2[0], r.Impulse2Err[0], r.Exact, r.Evals)
		// The BMT spin equation keeps a·p = 0 but not a·a beyond first
		// order in the Stern–Gerlach force; check a·p for all.
		if math.Abs(r.SpinOrth) > in.P[0]*(ea+1e-14*sa) {
			t.Errorf("%s: a·p at second order %.3g (scale %.3g)", c.m.Name(), r.SpinOrth, in.P[0]*ea)
		}
		if c.m.Name() != "bmt" && math.Abs(r.SpinNorm) > an*(ea+1e-14*sa) {
			t.Errorf("%s: a·a at second order %.3g", c.m.Name(), r.SpinNorm)
		}
		zero := math.Abs(r.Impulse2[0]) <= r.Impulse2Err[0]+1e-14*r.Impulse2.Spatial().Norm()
		if zero != c.energyZero {
			t.Errorf("%s: Δp₂⁰ = %.3g ± %.2g, want zero: %v", c.m.Name(), r.Impulse2[0], r.Impulse2Err[0], c.energyZero)
		}
	}
}

// scanSecond extrapolates the next-order coefficient of each impulse
// component from nonlinear integrations at couplings λ times the model's
// (fit.NextOrder on (Δp(λ) − λΔp₁)/λ²), the independent route to Δp₂. The
// couplings give first-order deflections θ from 1e-3 to 3e-2.
func scanSecond(t *testing.T, m Model, in InState, dp1 vec.Vec4) (c2, sig vec.Vec4) {
	sc := m.(CouplingScaler)
	th1 := dp1.Spatial().Norm() / in.P.Spatial().Norm()
	var pts [4][]fit.Point
	for k := 0; k < 12; k++ {
		l := 1e-3 * math.Pow(30, float64(k)/11) / th1
		out, err := Scatter(sc.ScaleCoupling(l), in, nil)
		if err != nil || out.Status != StatusScattered {
			t.Fatalf("%s λ=%g: %v %v", m.Name(), l, err, out.Status)
		}
		for i := 0; i < 4; i++ {
			pts[i] = append(pts[i], fit.Point{Eps: l, Residual: out.Impulse[i] - l*dp1[i], Sigma: out.ImpulseErr[i]})
		}
	}
	for i := 0; i < 4; i++ {
		r, err := fit.NextOrder(pts[i], nil)
		if err != nil {
			t.Fatal(err)
		}
		c2[i], sig[i] = r.C2, r.SigmaC2
	}
	return c2, sig
}

// TestSecondOrderScan compares the direct second order with the scan
// extrapolation from the nonlinear integration, for the exact cases and
// for the spinning models in a generic orientation (mechanics of those
// models' own equations, whose second order is completion-dependent).
func TestSecondOrderScan(t *testing.T) {
	type item struct {
		m  Model
		in InState
	}
	var items []item
	for i, c := range secondCases(t) {
		if testing.Short() && i%3 != 0 {
			continue
		}
		items = append(items, item{c.Model, c.In})
	}
	in, err := IncomingDir(1, 1.4, 1, vec.Vec3{1, 0.2, 0.1}, vec.Vec3{0, 1, 0.3}, vec.Vec3{0.1, -0.2, 0.3})
	if err != nil {
		t.Fatal(err)
	}
	f := em.RootKerr{Q: 0.01, A: vec.Vec3{0.1, 0.2, 0.3}}
	items = append(items, item{&RootKerr{Field: f, M: 1, Q: 1}, in}, item{&RootKerrConservative{Field: f, M: 1, Q: 1}, in},
		item{&BMT{Field: f, M: 1, Q: 1, Gyro: 2}, in})
	// Kerr off the equatorial plane, and the Dixon body with a generic
	// spin, where no closed form is at hand.
	gin, err := IncomingDir(1, 1.3, 1, vec.Vec3{1, 0, 0.4}, vec.Vec3{0, 1, 0}, vec.Vec3{})
	if err != nil {
		t.Fatal(err)
	}
	items = append(items, item{&Geodesic{Metric: spacetime.Kerr(0.01, 0.5), M: 1}, gin},
		item{&Dixon{Field: em.Coulomb{Q: 0.01}, M: 1, Q: 1, Gyro: 2}, in},
		item{&RootKerrBody{Field: f, M: 1, Q: 1, Contact: 1}, in})
	for _, it := range items {
		r, err := SecondOrder(it.m, it.in, nil)
		if err != nil {
			t.Fatal(err)
		}
		c2, sig := scanSecond(t, it.m, it.in, r.Impulse1)
		worst := 0.0
		for i := 1; i < 4; i++ {
			if math.Abs(r.Impulse2[i]) < 1e-3*r.Impulse2.Spatial().Norm() {
				continue
			}
			s := math.Hypot(sig[i], r.Impulse2Err[i])
			n := math.Abs(c2[i]-r.Impulse2[i]) / s
			worst = math.Max(worst, n)
			// Agreement within the fit's uncertainty (3σ, common practice),
			// and the scan must say something (σ below 1e-5 relative).
			if n > 3 {
				t.Errorf("%s [%d]: direct %.12g, scan %.12g ± %.2g (%.1fσ)", it.m.Name(), i, r.Impulse2[i], c2[i], sig[i], n)
			}
			if sig[i] > 1e-5*math.Abs(r.Impulse2[i]) {
				t.Errorf("%s [%d]: scan uncertainty %.2g too large for a check", it.m.Name(), i, sig[i])
			}
		}
		t.Logf("%-40s worst %.2fσ, scan σ/|Δp₂| %.1e", it.m.Name(), worst, sig.Spatial().Norm()/r.Impulse2.Spatial().Norm())
	}
}

// stubModel is a model with neither coupling derivatives nor scaling.
type stubModel struct{ c *Charge }

func (s stubModel) Name() string                      { return "stub" }
func (s stubModel) Dim() int                          { return 8 }
func (s stubModel) Mass() float64                     { return s.c.M }
func (s stubModel) Deriv(y, dy []float64)             { s.c.Deriv(y, dy) }
func (s stubModel) Energy(y []float64) float64        { return s.c.Energy(y) }
func (s stubModel) EnergyExact() bool                 { return true }
func (s stubModel) Normalize(y []float64, a2 float64) { s.c.Normalize(y, a2) }
func (s stubModel) Hazard(y0, y1 []float64) Status    { return StatusRunning }

// TestSecondOrderOutcomes: a straight line through the branch disk is an
// outcome, not a number; models without derivatives or scaling and
// invalid input are errors.
func TestSecondOrderOutcomes(t *testing.T) {
	in, err := Incoming(1, 1.3, 1, vec.Vec3{})
	if err != nil {
		t.Fatal(err)
	}
	// Ring of radius 2 in the plane z = 0: the line y = 1 crosses its disk.
	m := &Charge{Field: em.RootKerr{Q: 0.01, A: vec.Vec3{0, 0, 2}}, M: 1, Q: 1}
	r, err := SecondOrder(m, in, nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Status != StatusCrossedDisk {
		t.Errorf("line through the disk: status %v", r.Status)
	}
	if _, err := SecondOrder(stubModel{&Charge{Field: em.Coulomb{Q: 0.1}, M: 1, Q: 1}}, in, nil); err == nil {
		t.Error("model without derivatives accepted")
	}
	g := &Geodesic{Metric: stubMetric{spacetime.Schwarzschild(0.1)}, M: 1}
	if _, err := SecondOrder(g, in, nil); err == nil {
		t.Error("metric without coupling scaling accepted")
	}
	bad := in
	bad.B = vec.Vec4{0, 1, 0, 0}
	if _, err := SecondOrder(m, bad, nil); err == nil {
		t.Error("impact parameter along the motion accepted")
	}
}

// stubMetric hides the family of a metric.
type stubMetric struct{ spacetime.KerrNewman }

// TestSecondOrderNUTGauge: for a path away from the Misner string the
// second-order impulse off Kerr–Taub–NUT does not depend on the string
// gauge C (string on z < 0, on both half-axes, on z > 0), with and
// without spin (internal consistency: the gauge changes the metric
// components along the whole path).
func TestSecondOrderNUTGauge(t *testing.T) {
	in, err := IncomingDir(1, 1.3, 1, vec.Vec3{1, 0, 0.4}, vec.Vec3{0, 1, 0}, vec.Vec3{})
	if err != nil {
		t.Fatal(err)
	}
	for _, a := range []float64{0, 0.3} {
		var rs []SecondOrderResult
		for _, C := range []float64{-1, 0, 1} {
			r, err := SecondOrder(&Geodesic{Metric: spacetime.KerrNewmanNUT{M: 0.01, N: 0.004, A: a, StringGauge: C}, M: 1}, in, nil)
			if err != nil || r.Status != StatusScattered {
				t.Fatalf("a=%g C=%g: %v %v", a, C, err, r.Status)
			}
			rs = append(rs, r)
		}
		for _, r := range rs[1:] {
			for i := 0; i < 4; i++ {
				if d := math.Abs(r.Impulse2[i] - rs[0].Impulse2[i]); d > r.Impulse2Err[i]+rs[0].Impulse2Err[i] {
					t.Errorf("a=%g: Δp₂[%d] differs between gauges by %.3g (estimates %.2g, %.2g)", a, i, d, r.Impulse2Err[i], rs[0].Impulse2Err[i])
				}
			}
		}
		t.Logf("a=%g: Δp₂ = %v, nodes %d/%d/%d", a, rs[0].Impulse2, rs[0].Nodes, rs[1].Nodes, rs[2].Nodes)
	}
}
