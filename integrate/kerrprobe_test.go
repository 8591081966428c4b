package integrate

import (
	"math"
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

// kerrProbeCases are generic configurations: background spin along +z,
// probe line and spin in general directions.
var kerrProbeCases = []struct {
	name      string
	gamma     float64
	dir, bhat vec.Vec3
	spin      vec.Vec3 // rest-frame probe spin (in units of b)
	M, a2     float64
}{
	{"Kerr, oblique spins", 1.3, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{0.2, -0.25, 0.3}, 1, 0.6},
	{"Schwarzschild, spin along b", 2, vec.Vec3{0.3, 0.5, -0.2}, vec.Vec3{0.1, 0.9, 0.3}, vec.Vec3{0.1, 0.3, -0.05}, 0.8, 0},
	{"Kerr, fast, large spins", 5, vec.Vec3{0.2, 1, 0.3}, vec.Vec3{0.4, 0.2, 0.9}, vec.Vec3{0.3, -0.15, -0.1}, 0.4, -0.5},
}

// TestKerrProbeFirstOrder: the straight-line quadrature of the Kerr probe's
// first-order force and torque equals the all-orders-in-spin 1PM impulse
// and spin kick of a test black hole off Kerr (Vines 2017, Class. Quantum
// Grav. 35, 084002; the closed form of observables/leading for KerrBody)
// for generic orientations of both spins, in the linearized background.
func TestKerrProbeFirstOrder(t *testing.T) {
	const b, m = 1.5, 0.7
	worstP, worstA := 0.0, 0.0
	for _, c := range kerrProbeCases {
		in, err := IncomingDir(m, c.gamma, b, c.dir, c.bhat, c.spin.Scale(b))
		if err != nil {
			t.Fatal(err)
		}
		kp := &KerrProbe{Metric: spacetime.Kerr(c.M, c.a2), M: m, Linear: true}
		dp, da := FirstOrder(kp, in, 400)
		u := in.P.Scale(1 / m)
		wp, wa := leading.SpinImpulse1PM(leading.GravSpinProbe{M: m, A: in.A, Body: leading.KerrBody},
			leading.GravSource{M: c.M, A: vec.Vec3{0, 0, c.a2}}, u, in.B)
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
			met := spacetime.Kerr(1e-9*c.M, c.a2)
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
// coupling): the impulses agree to rounding.
func TestKerrProbeZeroSpinGeodesic(t *testing.T) {
	in, _ := IncomingDir(1, 1.3, 20, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{})
	met := spacetime.Kerr(1, 0.6)
	o1, err1 := Scatter(&KerrProbe{Metric: met, M: 1}, in, &Settings{})
	o2, err2 := Scatter(&Geodesic{Metric: met, M: 1}, in, &Settings{})
	if err1 != nil || err2 != nil || o1.Status != StatusScattered || o2.Status != StatusScattered {
		t.Fatal(err1, err2, o1.Status, o2.Status)
	}
	// Both integrate the same equations; the drivers' paths differ only
	// by the rounding of the right-hand sides (different operation order).
	if d := euclid(o1.Impulse.Sub(o2.Impulse)); d > 1e-12*euclid(o2.Impulse) {
		t.Errorf("kerr-probe %v, geodesic %v (diff %.2g)", o1.Impulse, o2.Impulse, d)
	}
}

// TestKerrProbeInvariants: 𝓜, a·p and a·a are exact constants of the Kerr
// probe (≤ 1e-12 at the default tolerance), and its energy (conserved to
// first order in the coupling only) drifts at O(ε²): halving ε divides the
// drift by ≈ 4 or more.
func TestKerrProbeInvariants(t *testing.T) {
	drift := func(eps float64) Drift {
		b := 1 / eps
		in, _ := IncomingDir(1, 1.3, b, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{0.2, -0.25, 0.3}.Scale(b))
		out, err := Scatter(&KerrProbe{Metric: spacetime.Kerr(1, 0.3*b), M: 1}, in, &Settings{})
		if err != nil || out.Status != StatusScattered {
			t.Fatal(err, out.Status)
		}
		return out.Drift
	}
	d1, d2 := drift(0.004), drift(0.002)
	for _, d := range []Drift{d1, d2} {
		if d.MassShell > 1e-12 || d.SpinNorm > 1e-12 || d.SpinOrth > 1e-12 {
			t.Errorf("constraint drifts %+v", d)
		}
	}
	// The drift is second order; its ratio is 4 up to O(ε) corrections
	// (and more where the O(ε³) term has the other sign).
	if r := d1.Energy / d2.Energy; !(r > 3.5) {
		t.Errorf("energy drift %.3g at ε = 0.004, %.3g at 0.002: ratio %.3g, want ≳ 4", d1.Energy, d2.Energy, r)
	}
	t.Logf("energy drift %.3g (ε = 0.004), %.3g (ε = 0.002); mass %.1e, a·a %.1e, a·p %.1e", d1.Energy, d2.Energy, d1.MassShell, d1.SpinNorm, d1.SpinOrth)
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
		kd := NewKerrDixon(spacetime.Kerr(1e-12*c.M, c.a2), m, true)
		dp, da := FirstOrder(kd, in, 400)
		wp, wa := leading.SpinImpulse1PM(leading.GravSpinProbe{M: m, A: in.A, Body: leading.KerrBody},
			leading.GravSource{M: 1e-12 * c.M, A: vec.Vec3{0, 0, c.a2}}, in.P.Scale(1/m), in.B)
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
// at O(a) (ratio 2). Aligned spin off Schwarzschild and a generic case in
// Kerr.
func TestKerrDixonSecondOrderLinearSpin(t *testing.T) {
	const b = 50.0
	for _, c := range kerrProbeCases[:2] {
		diff := func(scale float64, kerr Model, dix Model) float64 {
			in, _ := IncomingDir(1, c.gamma, b, c.dir, c.bhat, c.spin.Scale(b*scale))
			r1, err1 := SecondOrder(kerr, in, nil)
			r2, err2 := SecondOrder(dix, in, nil)
			if err1 != nil || err2 != nil {
				t.Fatal(err1, err2)
			}
			return euclid(r1.Impulse2.Sub(r2.Impulse2))
		}
		met := spacetime.Kerr(c.M, c.a2*b)
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
// vanishes (measured ratios ≈ 4.5 and 5 per halving of ε).
func TestKerrDixonInvariants(t *testing.T) {
	drift := func(eps float64) Drift {
		b := 1 / eps
		in, _ := IncomingDir(1, 1.3, b, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{0.2, -0.25, 0.3}.Scale(b))
		out, err := Scatter(NewKerrDixon(spacetime.Kerr(1, 0.3*b), 1, false), in, &Settings{})
		if err != nil || out.Status != StatusScattered {
			t.Fatal(err, out.Status)
		}
		return out.Drift
	}
	d1, d2 := drift(0.004), drift(0.002)
	t.Logf("drifts at ε = 0.004: %+v; at 0.002: energy %.3g, mass %.3g", d1, d2.Energy, d2.MassShell)
	for _, d := range []Drift{d1, d2} {
		if d.SpinNorm > 1e-12 || d.SpinOrth > 1e-12 {
			t.Errorf("constraint drifts %+v", d)
		}
	}
	// Both drifts are second order: ratio 4 up to O(ε) corrections.
	if r := d1.Energy / d2.Energy; !(r > 3.5) {
		t.Errorf("energy drift %.3g at ε = 0.004, %.3g at 0.002: ratio %.3g, want ≳ 4", d1.Energy, d2.Energy, r)
	}
	if r := d1.MassShell / d2.MassShell; !(r > 3.5) {
		t.Errorf("mass drift %.3g at ε = 0.004, %.3g at 0.002: ratio %.3g, want ≳ 4", d1.MassShell, d2.MassShell, r)
	}
}
