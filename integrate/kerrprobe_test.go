package integrate

import (
	"math"
	"math/cmplx"
	"testing"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/observables/leading"
)

// TestKerrSchildSpinAligned: for A = a ẑ the general-direction Kerr–Schild
// data equal those of KerrNewman.KerrSchild (itself held to the automatic
// differentiation of the metric) to rounding.
func TestKerrSchildSpinAligned(t *testing.T) {
	for _, x := range []vec.Vec3{{3, -1, 2}, {0.4, 0.9, -0.3}, {-5, 2, 0.1}} {
		var s kerrSchildSpin
		s.at(x, cspin(vec.Vec3{0, 0, 0.7}, vec.Vec3{}, 0), 1.3)
		var ks spacetime.KerrSchildPoint
		spacetime.Kerr(1.3, 0.7).KerrSchild([4]float64{0, x[0], x[1], x[2]}, &ks)
		// Rounding of O(10) operations on numbers of order one.
		const tol = 1e-14
		near := func(name string, got, want float64) {
			if math.Abs(got-want) > tol*(1+math.Abs(want)) {
				t.Errorf("x=%v %s: got %.17g want %.17g", x, name, got, want)
			}
		}
		near("f", real(s.f), ks.F)
		for k := 0; k < 3; k++ {
			near("df", real(s.df[k]), ks.DF[k+1])
		}
		for nu := 0; nu < 4; nu++ {
			near("l", real(s.l[nu]), ks.L[nu])
			for k := 0; k < 3; k++ {
				near("dl", real(s.dl[k][nu]), ks.DL[k+1][nu])
			}
		}
	}
}

// TestKerrSchildSpinRotated: for a spin of any direction the data are the
// rotation of the aligned ones (l is a covector, f a scalar), and the
// derivatives in A agree with central differences.
func TestKerrSchildSpinRotated(t *testing.T) {
	A := vec.Vec3{0.3, -0.5, 0.4}
	x := vec.Vec3{2, 1.5, -1}
	var s kerrSchildSpin
	s.at(x, cspin(A, vec.Vec3{}, 0), 0.9)
	rot, err := NewRotated(&Geodesic{}, A)
	if err != nil {
		t.Fatal(err)
	}
	R := rot.R // R Â = ẑ
	mul := func(v vec.Vec3) (w vec.Vec3) {
		for i := 0; i < 3; i++ {
			w[i] = R[i][0]*v[0] + R[i][1]*v[1] + R[i][2]*v[2]
		}
		return w
	}
	xr := mul(x)
	var ks spacetime.KerrSchildPoint
	spacetime.Kerr(0.9, A.Norm()).KerrSchild([4]float64{0, xr[0], xr[1], xr[2]}, &ks)
	// Rounding of the rotation and the closed forms.
	const tol = 1e-14
	if math.Abs(real(s.f)-ks.F) > tol {
		t.Errorf("f %v want %v", s.f, ks.F)
	}
	lr := mul(vec.Vec3{real(s.l[1]), real(s.l[2]), real(s.l[3])})
	for i := 0; i < 3; i++ {
		if math.Abs(lr[i]-ks.L[i+1]) > tol {
			t.Errorf("l rotated %v want %v", lr, ks.L)
		}
	}
	// Central differences with step h: truncation ~h² |∂³| ~ 1e-10, rounding
	// ~1e-16/h ~ 1e-11.
	const h, tolD = 1e-5, 1e-8
	for k := 0; k < 3; k++ {
		var sp, sm kerrSchildSpin
		Ap, Am := A, A
		Ap[k] += h
		Am[k] -= h
		sp.at(x, cspin(Ap, vec.Vec3{}, 0), 0.9)
		sm.at(x, cspin(Am, vec.Vec3{}, 0), 0.9)
		if d := real(sp.f-sm.f) / (2 * h); math.Abs(d-real(s.dfA[k])) > tolD {
			t.Errorf("∂f/∂A_%d = %v, differences %v", k, s.dfA[k], d)
		}
		for nu := 1; nu < 4; nu++ {
			if d := real(sp.l[nu]-sm.l[nu]) / (2 * h); math.Abs(d-real(s.dlA[k][nu])) > tolD {
				t.Errorf("∂l_%d/∂A_%d = %v, differences %v", nu, k, s.dlA[k][nu], d)
			}
		}
		xp, xm := x, x
		xp[k] += h
		xm[k] -= h
		sp.at(xp, cspin(A, vec.Vec3{}, 0), 0.9)
		sm.at(xm, cspin(A, vec.Vec3{}, 0), 0.9)
		if d := real(sp.f-sm.f) / (2 * h); math.Abs(d-real(s.df[k])) > tolD {
			t.Errorf("∂f/∂x_%d = %v, differences %v", k, s.df[k], d)
		}
		for nu := 1; nu < 4; nu++ {
			if d := real(sp.l[nu]-sm.l[nu]) / (2 * h); math.Abs(d-real(s.dl[k][nu])) > tolD {
				t.Errorf("∂l_%d/∂x_%d = %v, differences %v", nu, k, s.dl[k][nu], d)
			}
		}
	}
}

// kerrProbeCase is a generic configuration: background spin along +z
// (with NUT parameter N and string gauge C when N ≠ 0), probe line and
// spin in general directions.
type kerrProbeCase struct {
	name      string
	gamma     float64
	dir, bhat vec.Vec3
	spin      vec.Vec3 // rest-frame probe spin (in units of b)
	M, a2     float64
	N, C      float64
}

var kerrProbeCases = []kerrProbeCase{
	{"Kerr, oblique spins", 1.3, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{0.2, -0.25, 0.3}, 1, 0.6, 0, 0},
	{"Schwarzschild, spin along b", 2, vec.Vec3{0.3, 0.5, -0.2}, vec.Vec3{0.1, 0.9, 0.3}, vec.Vec3{0.1, 0.3, -0.05}, 0.8, 0, 0, 0},
	{"Kerr, fast, large spins", 5, vec.Vec3{0.2, 1, 0.3}, vec.Vec3{0.4, 0.2, 0.9}, vec.Vec3{0.3, -0.15, -0.1}, 0.4, -0.5, 0, 0},
	{"Kerr–Taub–NUT C = 1, oblique spins", 1.3, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{0.2, -0.25, 0.3}, 1, 0.6, 0.7, 1},
	{"Taub–NUT C = 0, spin along b", 2, vec.Vec3{0.3, 0.5, -0.2}, vec.Vec3{0.1, 0.9, 0.3}, vec.Vec3{0.1, 0.3, -0.05}, 0.8, 0, -0.5, 0},
	{"pure NUT, Kerr spin, C = −1, fast", 5, vec.Vec3{0.2, 1, 0.3}, vec.Vec3{0.4, 0.2, 0.9}, vec.Vec3{0.3, -0.15, -0.1}, 0, -0.5, 0.4, -1},
}

// metric returns the background with mass and NUT parameter scaled by s
// (and its spin parameter in units of b, times b).
func (c kerrProbeCase) metric(s, b float64) spacetime.Metric {
	if c.N == 0 {
		return spacetime.Kerr(s*c.M, c.a2*b)
	}
	return spacetime.KerrNewmanNUT{M: s * c.M, A: c.a2 * b, N: s * c.N, StringGauge: c.C}
}

// source returns the background as a leading.GravSource.
func (c kerrProbeCase) source(s, b float64) leading.GravSource {
	return leading.GravSource{M: s * c.M, N: s * c.N, A: vec.Vec3{0, 0, c.a2 * b}}
}

// TestKerrProbeFirstOrder: the straight-line quadrature of the Kerr probe's
// first-order force and torque equals the all-orders-in-spin 1PM impulse
// and spin kick of a test black hole off Kerr (Vines 2017, Class. Quantum
// Grav. 35, 084002; the closed form of observables/leading for KerrBody)
// for generic orientations of both spins, in the linearized background;
// off Kerr–Taub–NUT with the mass–NUT phase M − iN exact in both spins
// (the NUT coupling of nutSpin and the geodesic of the linearized
// Kerr–Taub–NUT metric, in the string gauges C = 1, 0, −1).
func TestKerrProbeFirstOrder(t *testing.T) {
	const b, m = 1.5, 0.7
	worstP, worstA := 0.0, 0.0
	for _, c := range kerrProbeCases {
		in, err := IncomingDir(m, c.gamma, b, c.dir, c.bhat, c.spin.Scale(b))
		if err != nil {
			t.Fatal(err)
		}
		kp := &KerrProbe{Metric: c.metric(1, 1), M: m, Linear: true}
		dp, da := FirstOrder(kp, in, 400)
		u := in.P.Scale(1 / m)
		wp, wa := leading.SpinImpulse1PM(leading.GravSpinProbe{M: m, A: in.A, Body: leading.KerrBody},
			c.source(1, 1), u, in.B)
		ep := euclid(dp.Sub(wp)) / euclid(wp)
		ea := euclid(da.Sub(wa)) / euclid(wa)
		worstP, worstA = math.Max(worstP, ep), math.Max(worstA, ea)
		// The quadrature converges geometrically; at 400 nodes per half
		// line it is at rounding (≲ 1e-13 relative, see the log).
		if ep > 1e-12 || ea > 1e-12 {
			t.Errorf("%s: Δp %v want %v (rel %.2e); Δa %v want %v (rel %.2e)", c.name, dp, wp, ep, da, wa, ea)
		}
	}
	t.Logf("worst relative difference, quadrature vs closed form: Δp %.2e, Δa %.2e", worstP, worstA)
}

// euclid returns the Euclidean norm of the components of v.
func euclid(v vec.Vec4) float64 {
	return math.Sqrt(v[0]*v[0] + v[1]*v[1] + v[2]*v[2] + v[3]*v[3])
}

// TestKerrProbeTruncations: the Kerr probe's first-order impulse and spin
// kick agree with those of the Dixon body (Tulczyjew condition) to O(a₁)
// and with Dixon with the spin-induced quadrupole C_ES² = 1 to O(a₁²):
// halving the probe spin divides the differences by 4 and by 8 (O(a₁²)
// and O(a₁³) remainders; Mathisson 1937, Papapetrou 1951, Dixon 1970 for
// the pole–dipole body, the quadrupole as in Dixon's CES2, from memory).
func TestKerrProbeTruncations(t *testing.T) {
	const b, m = 1.5, 0.7
	for _, c := range kerrProbeCases {
		diffs := func(scale float64) (d0p, d0a, d1p, d1a float64) {
			in, _ := IncomingDir(m, c.gamma, b, c.dir, c.bhat, c.spin.Scale(b*scale))
			// A weak background: Dixon's first-order right-hand side forms
			// its contractions with the (linearized) metric, which holds
			// it to first order only up to O(M/b) ≈ 1e-9 relative.
			met := c.metric(1e-9, 1)
			kp, ka := FirstOrder(&KerrProbe{Metric: met, M: m, Linear: true}, in, 400)
			dp0, da0 := FirstOrder(&Dixon{Metric: met, M: m, Linear: true}, in, 400)
			dp1, da1 := FirstOrder(&Dixon{Metric: met, M: m, Linear: true, CES2: 1}, in, 400)
			return euclid(kp.Sub(dp0)), euclid(ka.Sub(da0)), euclid(kp.Sub(dp1)), euclid(ka.Sub(da1))
		}
		p0, a0, p1, a1 := diffs(0.2)
		q0, b0, q1, b1 := diffs(0.1)
		r := [4]float64{p0 / q0, a0 / b0, p1 / q1, a1 / b1}
		want := [4]float64{4, 4, 8, 8}
		for i := range r {
			// The next term of each remainder is smaller by O(|a₁|/b)
			// ≈ 0.05 at these spins: 15 % covers it.
			if !(math.Abs(r[i]/want[i]-1) <= 0.15) {
				t.Errorf("%s: difference ratios (dipole Δp, Δa; quadrupole Δp, Δa) %.3f, want %v", c.name, r, want)
				break
			}
		}
		t.Logf("%s: ratios at halved spin %.3f (want 4, 4, 8, 8)", c.name, r)
	}
}

// TestKerrProbeZeroSpinGeodesic: without spin the Kerr probe is the
// geodesic of the background (the same Christoffel symbols, no spin
// coupling), in Kerr and Kerr–Taub–NUT: the impulses agree to rounding.
func TestKerrProbeZeroSpinGeodesic(t *testing.T) {
	in, _ := IncomingDir(1, 1.3, 20, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{})
	met := spacetime.Kerr(1, 0.6)
	for _, met := range []spacetime.Metric{met, spacetime.KerrNewmanNUT{M: 1, A: 0.6, N: 0.5, StringGauge: 1}} {
		o1, err1 := Scatter(&KerrProbe{Metric: met, M: 1}, in, &Settings{})
		o2, err2 := Scatter(&Geodesic{Metric: met, M: 1}, in, &Settings{})
		if err1 != nil || err2 != nil || o1.Status != StatusScattered || o2.Status != StatusScattered {
			t.Fatal(err1, err2, o1.Status, o2.Status)
		}
		// Both integrate the same equations. In Kerr the drivers' paths
		// differ only by the rounding of the right-hand sides (different
		// operation order); in Kerr–Taub–NUT the geodesic takes the
		// closed-form accelerations and the probe the Taylor-path
		// Christoffel symbols, whose rounding changes the step sequence:
		// there the impulses agree within their error bars.
		d := euclid(o1.Impulse.Sub(o2.Impulse))
		tol := 1e-12 * euclid(o2.Impulse)
		if _, nut := met.(spacetime.KerrNewmanNUT); nut {
			tol = euclid(o1.ImpulseErr) + euclid(o2.ImpulseErr)
		}
		if d > tol {
			t.Errorf("%s: kerr-probe %v, geodesic %v (diff %.2g > %.2g)", met.Name(), o1.Impulse, o2.Impulse, d, tol)
		}
		t.Logf("%s: difference %.2g, bound %.2g", met.Name(), d, tol)
	}
}

// invariantBackgrounds are the backgrounds of the conservation tests at
// ε = 1/b: Kerr, and Kerr–Taub–NUT (N = 0.6 M, Misner string along the
// spin, away from the path), spin a = 0.3 b.
var invariantBackgrounds = []struct {
	name   string
	metric func(b float64) spacetime.Metric
}{
	{"Kerr", func(b float64) spacetime.Metric { return spacetime.Kerr(1, 0.3*b) }},
	{"Kerr–Taub–NUT", func(b float64) spacetime.Metric {
		return spacetime.KerrNewmanNUT{M: 1, A: 0.3 * b, N: 0.6, StringGauge: 1}
	}},
}

// TestKerrProbeInvariants: 𝓜, a·p and a·a are exact constants of the Kerr
// probe (≤ 1e-12 at the default tolerance), and its energy (conserved to
// first order in the coupling only, the NUT part through p⁰(1 − U) of
// nutSpin) drifts at O(ε²): halving ε divides the drift by ≈ 4 or more.
func TestKerrProbeInvariants(t *testing.T) {
	for _, bg := range invariantBackgrounds {
		drift := func(eps float64) Drift {
			b := 1 / eps
			in, _ := IncomingDir(1, 1.3, b, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{0.2, -0.25, 0.3}.Scale(b))
			out, err := Scatter(&KerrProbe{Metric: bg.metric(b), M: 1}, in, &Settings{})
			if err != nil || out.Status != StatusScattered {
				t.Fatal(err, out.Status)
			}
			return out.Drift
		}
		kerrProbeDrifts(t, bg.name, drift, false)
	}
}

// kerrProbeDrifts checks the drifts of a Kerr probe at ε = 0.004 and
// 0.002: constraints exact, energy (and with mass the mass 𝓜) at O(ε²).
func kerrProbeDrifts(t *testing.T, name string, drift func(float64) Drift, mass bool) {
	t.Helper()
	d1, d2 := drift(0.004), drift(0.002)
	for _, d := range []Drift{d1, d2} {
		if d.SpinNorm > 1e-12 || d.SpinOrth > 1e-12 {
			t.Errorf("%s: constraint drifts %+v", name, d)
		}
	}
	// The drift is second order; its ratio is 4 up to O(ε) corrections
	// (and more where the O(ε³) term has the other sign).
	if r := d1.Energy / d2.Energy; !(r > 3.5) {
		t.Errorf("%s: energy drift %.3g at ε = 0.004, %.3g at 0.002: ratio %.3g, want ≳ 4", name, d1.Energy, d2.Energy, r)
	}
	if r := d1.MassShell / d2.MassShell; mass && !(r > 3.5) {
		t.Errorf("%s: mass drift %.3g at ε = 0.004, %.3g at 0.002: ratio %.3g, want ≳ 4", name, d1.MassShell, d2.MassShell, r)
	}
	if !mass && d1.MassShell > 1e-12 {
		t.Errorf("%s: mass drift %.3g", name, d1.MassShell)
	}
	t.Logf("%s: energy drift %.3g (ε = 0.004), %.3g (ε = 0.002); mass %.1e, %.1e; a·a %.1e, a·p %.1e", name, d1.Energy, d2.Energy, d1.MassShell, d2.MassShell, d1.SpinNorm, d1.SpinOrth)
}

// TestKerrDixonFirstOrder: the Kerr probe on the Dixon core has the first
// order of the Kerr body exact in both spins (Vines 2017; closed form of
// observables/leading), like KerrProbe.
func TestKerrDixonFirstOrder(t *testing.T) {
	const b, m = 1.5, 0.7
	worst := 0.0
	for _, c := range kerrProbeCases {
		in, _ := IncomingDir(m, c.gamma, b, c.dir, c.bhat, c.spin.Scale(b))
		// A weak background: Dixon's first-order right-hand side forms its
		// contractions with the metric (O(M/b) ≈ 1e-12 relative, times
		// γ² ≲ 25).
		kd := NewKerrDixon(c.metric(1e-12, 1), m, true)
		dp, da := FirstOrder(kd, in, 400)
		wp, wa := leading.SpinImpulse1PM(leading.GravSpinProbe{M: m, A: in.A, Body: leading.KerrBody},
			c.source(1e-12, 1), in.P.Scale(1/m), in.B)
		ep, ea := euclid(dp.Sub(wp))/euclid(wp), euclid(da.Sub(wa))/euclid(wa)
		worst = math.Max(worst, math.Max(ep, ea))
		// The metric contractions' 1e-12 γ², plus quadrature rounding.
		if ep > 1e-10 || ea > 1e-10 {
			t.Errorf("%s: Δp %v want %v (%.2e); Δa %v want %v (%.2e)", c.name, dp, wp, ep, da, wa, ea)
		}
	}
	t.Logf("worst relative difference vs the closed form: %.2e", worst)
}

// TestKerrDixonSecondOrderLinearSpin: to linear order in the probe spin the
// Kerr probe on the Dixon core is the Dixon body, so their direct second
// orders (integrate.SecondOrder) differ only at O(a²): halving the spin
// divides the difference by 4, while KerrProbe differs from Dixon already
// at O(a) (ratio 2). Aligned spin off Schwarzschild and generic cases in
// Kerr and Kerr–Taub–NUT (whose NUT coupling is Dixon's at O(a) too).
func TestKerrDixonSecondOrderLinearSpin(t *testing.T) {
	const b = 50.0
	for _, c := range []kerrProbeCase{kerrProbeCases[0], kerrProbeCases[1], kerrProbeCases[3]} {
		diff := func(scale float64, kerr Model, dix Model) float64 {
			in, _ := IncomingDir(1, c.gamma, b, c.dir, c.bhat, c.spin.Scale(b*scale))
			r1, err1 := SecondOrder(kerr, in, nil)
			r2, err2 := SecondOrder(dix, in, nil)
			if err1 != nil || err2 != nil {
				t.Fatal(err1, err2)
			}
			return euclid(r1.Impulse2.Sub(r2.Impulse2))
		}
		met := c.metric(1, b)
		kd := NewKerrDixon(met, 1, false)
		kp := &KerrProbe{Metric: met, M: 1}
		dx := &Dixon{Metric: met, M: 1, Gyro: 2}
		rd := diff(0.1, kd, dx) / diff(0.05, kd, dx)
		rp := diff(0.1, kp, dx) / diff(0.05, kp, dx)
		t.Logf("%s: second-order difference ratio at halved spin: Dixon core %.3f, KerrProbe %.3f", c.name, rd, rp)
		// O(a²) against O(a): the next term is smaller by O(a/b) ≈ 0.05.
		if !(math.Abs(rd/4-1) < 0.15) {
			t.Errorf("%s: Dixon-core ratio %.3f, want 4", c.name, rd)
		}
	}
}

// TestKerrDixonInvariants: on the Dixon core S² and the Tulczyjew
// condition stay exact (≤ 1e-12), while the energy (first-order correction
// only) and the mass 𝓜 drift at O(ε²): the torque of the higher multipoles
// enters the Tulczyjew momentum–velocity relation, and p·(C u) no longer
// vanishes (measured ratios ≈ 4.5 and 5 per halving of ε), off Kerr and
// Kerr–Taub–NUT.
func TestKerrDixonInvariants(t *testing.T) {
	for _, bg := range invariantBackgrounds {
		drift := func(eps float64) Drift {
			b := 1 / eps
			in, _ := IncomingDir(1, 1.3, b, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{0.2, -0.25, 0.3}.Scale(b))
			out, err := Scatter(NewKerrDixon(bg.metric(b), 1, false), in, &Settings{})
			if err != nil || out.Status != StatusScattered {
				t.Fatal(err, out.Status)
			}
			return out.Drift
		}
		kerrProbeDrifts(t, bg.name, drift, true)
	}
}

// TestNUTSpinPotentials: the harmonic-gauge NUT potentials of nutSpin
// against the linearized Kerr–Newman–Taub–NUT metric
// (spacetime.KerrNewmanNUT.EvalLinear; Demiański & Newman 1966 and
// Griffiths & Podolský 2009, from memory) in its gauge-invariant parts:
// with the mass part h_00 = 2 Re(Mφ), ∇ × h_0· = 2∇ Im(Mφ) (Im φ = U of
// unit NUT), the metric's
//
//	h_00 = 2(M Re φ + N U),   ∇ × h_0· = 2(M ∇U + N ∇V),
//
// for A = a ẑ (stationary gauge changes leave h_00 and the curl of h_0i
// alone; (∇ × h_0·)_k = ∂_i h_0j − ∂_j h_0i = Γ_{j i 0} − Γ_{i j 0} for
// cyclic (k, i, j)), in every string gauge; and the derivatives along d
// against central differences.
func TestNUTSpinPotentials(t *testing.T) {
	for _, k := range []spacetime.KerrNewmanNUT{
		{M: 0.7, A: 0.6, N: 0.4, StringGauge: 1},
		{M: 1.1, A: -0.5, N: -0.3},
		{M: 0, A: 0.8, N: 0.9, StringGauge: -1},
	} {
		e := spacetime.NewLinearEvaluator(k, 1)
		for _, x := range []vec.Vec3{{1.3, -0.7, 0.9}, {-0.4, 2.1, -1.6}, {0.9, 0.3, 0.1}} {
			var p spacetime.Point
			e.Eval([4]float64{0, x[0], x[1], x[2]}, &p)
			var s nutSpin
			s.at(x, vec.Vec3{0, 0, k.A}, vec.Vec3{}, false)
			phi := 1 / cmplx.Sqrt(complex(x[0]*x[0]+x[1]*x[1], 0)+complex(x[2], -k.A)*complex(x[2], -k.A))
			h00 := 2 * (k.M*real(phi) + k.N*s.u)
			// Rounding of the jet arithmetic on O(1) numbers.
			if d := math.Abs(p.G[0][0] + 1 - h00); d > 1e-14 {
				t.Errorf("%s x=%v: h_00 %.16g, nutSpin %.16g", k.Name(), x, p.G[0][0]+1, h00)
			}
			for c := 0; c < 3; c++ {
				i, j := (c+1)%3, (c+2)%3
				curl := p.Gamma[j+1][i+1][0] - p.Gamma[i+1][j+1][0]
				want := 2 * (k.M*s.du[c] + k.N*s.dv[c])
				if math.Abs(curl-want) > 1e-13 {
					t.Errorf("%s x=%v: (∇ × h_0)_%d = %.16g, nutSpin %.16g", k.Name(), x, c, curl, want)
				}
			}
		}
	}
	// Derivatives along d: central differences, truncation ~h²|∂³| ~ 1e-10,
	// rounding ~1e-16/h ~ 1e-11.
	x, A, d := vec.Vec3{1.2, -0.8, 0.5}, vec.Vec3{0.3, -0.2, 0.5}, vec.Vec3{0.4, 0.1, -0.3}
	const h = 1e-5
	var s0, sp, sm nutSpin
	s0.at(x, A, d, true)
	sp.at(x, A.Add(d.Scale(h)), vec.Vec3{}, false)
	sm.at(x, A.Sub(d.Scale(h)), vec.Vec3{}, false)
	near := func(name string, got, want float64) {
		if math.Abs(got-want) > 1e-8 {
			t.Errorf("%s along d: %.12g, differences %.12g", name, got, want)
		}
	}
	near("U", s0.u, (sp.u-sm.u)/(2*h))
	for i := 0; i < 3; i++ {
		near("∇U", s0.du[i], (sp.du[i]-sm.du[i])/(2*h))
		near("∇V", s0.dv[i], (sp.dv[i]-sm.dv[i])/(2*h))
	}
}
