package integrate

import (
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/jet"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/observables/leading"
)

// flatJ returns J^{ij} = x^i p^j − x^j p^i + S^{ij} of a flat-space state
// as the axial vector (J^{23}, J^{31}, J^{12}), with S^{μν} =
// ε^{μνρσ} p_ρ a_σ: the total angular momentum about the origin of a
// body with the Tulczyjew spin tensor (a probe model's own convention).
func flatJ(y []float64) [3]float64 {
	var l bodyLocal
	l.g, l.gi, l.sqrtg = etaDiag, etaDiag, 1
	var b bodyState
	b.load(&l, y)
	x := event(y)
	J := func(i, j int) float64 { return x[i]*b.p[j] - x[j]*b.p[i] + b.S[i][j] }
	return [3]float64{J(2, 3), J(3, 1), J(1, 2)}
}

// conservation runs the model and returns the largest changes, relative to
// |p_in| b, of the three components of flatJ, and the relative change of
// the energy, over the accepted steps. Radius 1e3 b keeps the rounding
// floor of x ∧ p (1e-16 R/b) below 1e-12.
func conservation(t *testing.T, m Model, in InState) (dJ, dE float64, out Outcome) {
	t.Helper()
	var J0 [3]float64
	var E0 float64
	first := true
	// Tol 1e-14: the Runge–Kutta steps do not conserve the mass function
	// and S² (quadratic invariants), and at the default 1e-13 their
	// integration error (about 1e-14) would mask rounding.
	set := &Settings{Tol: 1e-14, Radius: 1e3, Observe: func(_ float64, y []float64) {
		J := flatJ(y)
		E := m.Energy(y)
		if first {
			J0, E0, first = J, E, false
		}
		for i := range J {
			dJ = math.Max(dJ, math.Abs(J[i]-J0[i]))
		}
		dE = math.Max(dE, math.Abs(E-E0)/E0)
	}}
	out, err := Scatter(m, in, set)
	if err != nil || out.Status != StatusScattered {
		t.Fatalf("%s: %v %v", m.Name(), err, out.Status)
	}
	return dJ / (in.P.Spatial().Norm() * in.ImpactParameter()), dE, out
}

// genericIn is an in-state with motion, impact parameter and spin in
// generic directions (spin |a| ≈ 0.27 b).
func genericIn(t *testing.T, gamma float64) InState {
	in, err := IncomingDir(1, gamma, 1, vec.Vec3{1, 0.2, -0.1}, vec.Vec3{0.1, 1, 0.3}, vec.Vec3{0.1, -0.2, 0.15})
	if err != nil {
		t.Fatal(err)
	}
	return in
}

// TestDixonConservationFlat: in a Coulomb field (rotation invariant) the
// Dixon body conserves every component of the total angular momentum
// J = x ∧ p + S and the energy to rounding (Dixon 1970: Q_ξ for every
// Killing vector), the mass function and S² (see Dixon), for any g, in a
// generic orientation. The earlier spinning models (BMT's directional
// Stern–Gerlach force, both root-Kerr completions) are run through the
// same measurement and do not conserve J: their drifts are logged (they
// are first order in coupling and spin) and checked to be of that size,
// so that a change of theirs is seen.
func TestDixonConservationFlat(t *testing.T) {
	f := em.Coulomb{Q: 0.1}
	in := genericIn(t, 1.5)
	for _, g := range []float64{2, 0, 1.3, 3} {
		d := &Dixon{Field: f, M: 1, Q: 1, Gyro: g}
		dJ, dE, out := conservation(t, d, in)
		if dJ > 1e-12 || dE > 1e-14 {
			t.Errorf("dixon g=%g: |ΔJ|/(p b) = %.2g, |ΔE|/E = %.2g", g, dJ, dE)
		}
		if out.Drift.MassShell > 1e-14 || out.Drift.SpinNorm > 1e-14 || out.Drift.SpinOrth > 1e-14 {
			t.Errorf("dixon g=%g: drifts %+v", g, out.Drift)
		}
		if out.Drift.AngularMomentumZ > 1e-12 {
			t.Errorf("dixon g=%g: J_z drift %.2g", g, out.Drift.AngularMomentumZ)
		}
		t.Logf("dixon g=%g: |ΔJ|/(p b) = %.1e, |ΔE|/E = %.1e, mass %.1e, S² %.1e", g, dJ, dE, out.Drift.MassShell, out.Drift.SpinNorm)
	}
	for _, m := range []Model{
		&BMT{Field: f, M: 1, Q: 1, Gyro: 2},
		&RootKerr{Field: f, M: 1, Q: 1},
		&RootKerrConservative{Field: f, M: 1, Q: 1},
	} {
		dJ, _, _ := conservation(t, m, in)
		if dJ < 1e-4 {
			t.Errorf("%s: |ΔJ|/(p b) = %.2g, expected a first-order drift", m.Name(), dJ)
		}
		t.Logf("%s: |ΔJ|/(p b) = %.2e (ε|a|/b = %.2e)", m.Name(), dJ, 0.1*in.A.Spatial().Norm())
	}
}

// TestDixonConservationRootKerr: for an electric root-Kerr source with spin
// along z, J_z including the field term q(x × A)_z (Kerr–Schild gauge
// potential) and the energy are conserved to rounding.
func TestDixonConservationRootKerr(t *testing.T) {
	d := &Dixon{Field: em.RootKerr{Q: 0.1, A: vec.Vec3{0, 0, 0.3}}, M: 1, Q: 1, Gyro: 2}
	in := genericIn(t, 1.5)
	out, err := Scatter(d, in, &Settings{Tol: 1e-14, Radius: 1e3}) // see conservation
	if err != nil || out.Status != StatusScattered {
		t.Fatal(err, out.Status)
	}
	if out.Drift.AngularMomentumZ > 1e-12 || out.Drift.Energy > 1e-14 || out.Drift.MassShell > 1e-14 {
		t.Errorf("drifts %+v", out.Drift)
	}
}

// TestDixonFirstOrder: the first-order impulse and spin kick of the Dixon
// body are those of the BMT closed form for any g (Bargmann, Michel &
// Telegdi 1959 with the Stern–Gerlach force; observables/leading
// EMBMTImpulse): force and torque agree on the straight line to first
// order in the spin, and the gradient and directional dipole forces differ
// by a total derivative. The models differ at O(a²), i.e. relatively by
// O(a/b) in the spin kick (itself of order a): spin 1e-8 b, tolerance
// 1e-7 for the spin kick, 1e-11 for the impulse.
func TestDixonFirstOrder(t *testing.T) {
	src := em.Dyon{Q: 0.7, P: 0}
	for _, g := range []float64{2, 0.4} {
		in, _ := IncomingDir(1.3, 1.7, 1.1, vec.Vec3{1, 0.3, -0.2}, vec.Vec3{0, 1, 0.4}, vec.Vec3{2e-9, -4e-9, 7e-9})
		d := &Dixon{Field: src, M: 1.3, Q: 0.4, Gyro: g}
		dp, da := FirstOrder(d, in, 0)
		wp, wa := leading.EMBMTImpulse(leading.BMTProbe{M: 1.3, Q: 0.4, Gyro: g, A: in.A}, src, in.P.Scale(1/1.3), in.B)
		if e := dp.Sub(wp).Spatial().Norm() / wp.Spatial().Norm(); e > 1e-11 {
			t.Errorf("g=%g: impulse %v, closed form %v (rel %.2g)", g, dp, wp, e)
		}
		if e := da.Sub(wa).Spatial().Norm() / wa.Spatial().Norm(); e > 1e-7 {
			t.Errorf("g=%g: spin kick %v, closed form %v (rel %.2g)", g, da, wa, e)
		}
	}
}

// flatCoulombMetric is Minkowski space with the Coulomb potential
// A_μ = (−Q/r, 0, 0, 0): a spacetime.Metric whose curvature vanishes,
// to run the curved-space code path against the flat one.
type flatCoulombMetric struct{ Q float64 }

func (f flatCoulombMetric) Name() string { return "flat with Coulomb field" }

func (f flatCoulombMetric) Eval(x *[4]jet.Jet, g *[4][4]jet.Jet, A *[4]jet.Jet) {
	K := x[0].Order()
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			g[m][n].SetConst(K, etaDiag[m][n])
		}
		A[m].SetConst(K, 0)
	}
	var r2, t jet.Jet
	r2.SetConst(K, 0)
	for i := 1; i < 4; i++ {
		t.Mul(&x[i], &x[i])
		r2.Add(&r2, &t)
	}
	t.Pow(&r2, -0.5)
	A[0].Scale(-f.Q, &t)
}

// TestDixonFlatMetric: the curved-space code path with a flat metric and
// a Coulomb potential is the flat-space spinning charge (same physics,
// independent field evaluation: jets of the potential vs the closed-form
// field), to 1e-12 at the same radius.
func TestDixonFlatMetric(t *testing.T) {
	in := genericIn(t, 1.4)
	for _, g := range []float64{2, 1.3} {
		flat := &Dixon{Field: em.Coulomb{Q: 0.05}, M: 1, Q: 1, Gyro: g}
		curved := &Dixon{Metric: flatCoulombMetric{Q: 0.05}, M: 1, Q: 1, Gyro: g}
		set := &Settings{Radius: 1e4}
		o1, _ := Scatter(flat, in, set)
		o2, _ := Scatter(curved, in, set)
		if e := o1.Impulse.Sub(o2.Impulse).Spatial().Norm() / o1.Impulse.Spatial().Norm(); e > 1e-12 {
			t.Errorf("g=%g impulse: flat %v, metric %v (rel %.2g)", g, o1.Impulse, o2.Impulse, e)
		}
		if e := o1.SpinKick.Sub(o2.SpinKick).Spatial().Norm() / o1.SpinKick.Spatial().Norm(); e > 1e-12 {
			t.Errorf("g=%g spin kick: flat %v, metric %v (rel %.2g)", g, o1.SpinKick, o2.SpinKick, e)
		}
	}
}

// TestDixonZeroSpinGeodesic: with zero spin the Dixon body in Kerr is the
// geodesic (and in Kerr–Newman the charged geodesic): the same equations
// from independent geometry (jets vs the closed-form Kerr–Schild data);
// the impulses agree within their error estimates and to 1e-11.
func TestDixonZeroSpinGeodesic(t *testing.T) {
	in, _ := IncomingDir(1, 1.3, 20, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{})
	for _, c := range []struct {
		m spacetime.Metric
		q float64
	}{{spacetime.Kerr(1, 0.6), 0}, {spacetime.KerrNewman{M: 1, A: 0.5, Q: 0.3}, 0.4}} {
		d := &Dixon{Metric: c.m, M: 1, Q: c.q, Gyro: 2}
		g := &Geodesic{Metric: c.m, M: 1, Q: c.q}
		// The automatic radius (1e3 b here, with third-order tails). At
		// R = 1e4–1e5 b the Dixon impulse wanders by ~5e-12 (inside its
		// own error estimate of ~4e-11) while the geodesic's stays to 1e-13.
		set := &Settings{}
		o1, _ := Scatter(d, in, set)
		o2, _ := Scatter(g, in, set)
		diff := o1.Impulse.Sub(o2.Impulse).Spatial().Norm()
		est := o1.ImpulseErr.Spatial().Norm() + o2.ImpulseErr.Spatial().Norm()
		if diff > est || diff > 1e-11*o2.Impulse.Spatial().Norm() {
			t.Errorf("%s: dixon %v, geodesic %v (diff %.2g, error estimates %.2g)", c.m.Name(), o1.Impulse, o2.Impulse, diff, est)
		}
	}
}

// TestDixonConservationKerr: in Kerr (and charged in Kerr–Newman) with a
// generic orientation and a spin comparable to M, the Killing energy and
// J_z with their spin terms (Dixon 1970), the mass, S² and the Tulczyjew
// condition are kept to ≤ 1e-12.
func TestDixonConservationKerr(t *testing.T) {
	in, _ := IncomingDir(1, 1.3, 20, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{0.4, -0.5, 0.6})
	for _, c := range []struct {
		m spacetime.Metric
		q float64
	}{{spacetime.Kerr(1, 0.7), 0}, {spacetime.KerrNewman{M: 1, A: 0.5, Q: 0.3}, 0.4}} {
		d := &Dixon{Metric: c.m, M: 1, Q: c.q, Gyro: 2}
		out, err := Scatter(d, in, &Settings{Radius: 1e3})
		if err != nil || out.Status != StatusScattered {
			t.Fatal(err, out.Status)
		}
		dr := out.Drift
		if dr.Energy > 1e-13 || dr.AngularMomentumZ > 1e-12 || dr.MassShell > 1e-12 || dr.SpinNorm > 1e-12 || dr.SpinOrth > 1e-12 {
			t.Errorf("%s: drifts %+v", c.m.Name(), dr)
		}
		t.Logf("%s: drifts E %.1e, J_z %.1e, mass %.1e, S² %.1e, S·p %.1e", c.m.Name(), dr.Energy, dr.AngularMomentumZ, dr.MassShell, dr.SpinNorm, dr.SpinOrth)
	}
}
