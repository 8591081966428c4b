package integrate

import (
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/vec"
	"ricochet/observables/leading"
)

// sampleState returns a generic spinning state: position, on-shell
// momentum and a spin vector with a·p = 0.
func sampleState(a vec.Vec3) []float64 {
	y := make([]float64, 12)
	put(y, IX, vec.Vec4{0.3, 1.1, -0.7, 0.9})
	put(y, IP, vec.Vec4{0, 0.8, 0.3, -0.2})
	put(y, IA, vec.FromSpatial(0, a))
	flatNormalize(y, 1.3, 0)
	return y
}

// TestRootKerrZeroSpin: at a = 0 the root-Kerr probe is the Lorentz force
// (Lorentz 1895) on p and the g = 2 BMT precession (Bargmann, Michel &
// Telegdi 1959) on a. Both sides evaluate the same field, so agreement is
// to rounding.
func TestRootKerrZeroSpin(t *testing.T) {
	f := em.RootKerr{Q: 0.7, P: -0.2, A: vec.Vec3{0.2, -0.4, 0.5}}
	rk := &RootKerr{Field: f, M: 1.3, Q: 0.9, G: 0.4}
	ch := &Charge{Field: f, M: 1.3, Q: 0.9, G: 0.4}
	bmt := &BMT{Field: f, M: 1.3, Q: 0.9, G: 0.4, Gyro: 2}
	y := sampleState(vec.Vec3{})
	d1 := make([]float64, 12)
	d2 := make([]float64, 8)
	d3 := make([]float64, 12)
	rk.Deriv(y, d1)
	ch.Deriv(y[:8], d2)
	bmt.Deriv(y, d3)
	for i := 0; i < 8; i++ {
		if math.Abs(d1[i]-d2[i]) > 1e-15*(1+math.Abs(d2[i])) {
			t.Errorf("component %d: root-Kerr %v, Lorentz %v", i, d1[i], d2[i])
		}
	}
	// Spin equation with a small spin: at first order in a both models
	// give (q/m) F a for g = 2; they differ at O(|a|²) ≈ 6e-14 here.
	y = sampleState(vec.Vec3{1e-7, 2e-7, -1e-7})
	rk.Deriv(y, d1)
	bmt.Deriv(y, d3)
	for i := IA; i < IA+4; i++ {
		if math.Abs(d1[i]-d3[i]) > 1e-12 {
			t.Errorf("spin component %d: root-Kerr %v, BMT %v", i, d1[i], d3[i])
		}
	}
	// Explicit Lorentz force q(E + v×B) + g(B − v×E) on dp/dt = γ⁻¹ dp/dτ.
	E, B := em.EB(f, vec.Vec3{y[1], y[2], y[3]})
	p := Mom(y)
	v := p.Spatial().Scale(1 / p[0])
	want := E.Add(v.Cross(B)).Scale(0.9).Add(B.Sub(v.Cross(E)).Scale(0.4))
	ch.Deriv(y[:8], d2)
	for i := 0; i < 3; i++ {
		got := d2[IP+1+i] * 1.3 / p[0]
		if math.Abs(got-want[i]) > 1e-14 {
			t.Errorf("force component %d: %v, textbook %v", i, got, want[i])
		}
	}
}

// TestRootKerrFirstOrderSpin: the difference between the root-Kerr probe
// and the g = 2 BMT + Stern–Gerlach probe is of second order in the spin
// (the dipole force on μ = q a is the first term of the Newman–Janis
// shift): scaling a by λ, the difference of dp/dτ scales as λ².
func TestRootKerrFirstOrderSpin(t *testing.T) {
	f := em.Dyon{Q: 0.7, P: -0.2}
	rk := &RootKerr{Field: f, M: 1.3, Q: 0.9, G: 0.4}
	bmt := &BMT{Field: f, M: 1.3, Q: 0.9, G: 0.4, Gyro: 2}
	a := vec.Vec3{0.2, -0.3, 0.25}
	var prev float64
	for k, lam := range []float64{1e-2, 5e-3, 2.5e-3} {
		y := sampleState(a.Scale(lam))
		d1 := make([]float64, 12)
		d3 := make([]float64, 12)
		rk.Deriv(y, d1)
		bmt.Deriv(y, d3)
		var diff float64
		for i := IP; i < IP+4; i++ {
			diff = math.Max(diff, math.Abs(d1[i]-d3[i]))
		}
		// the first-order term itself, for scale
		if k > 0 {
			ratio := prev / diff
			if math.Abs(ratio-4) > 0.05 { // λ² scaling: halving λ divides by 4
				t.Errorf("λ = %g: difference ratio %.4f, want 4 (second order in spin)", lam, ratio)
			}
		}
		prev = diff
	}
}

// TestCyclotron: in a uniform magnetic field B ẑ a charge moves on the
// exact cyclotron circle, its momentum rotating at dφ/dτ = −qB/m, and the
// spin of a BMT probe precesses relative to the momentum at the anomalous
// rate (g/2 − 1) qB γ/m in proper time for motion orthogonal to B
// (Bargmann, Michel & Telegdi 1959; Jackson §11.11, from memory): zero for
// g = 2.
func TestCyclotron(t *testing.T) {
	const (
		q, B, m = 0.8, 1.5, 1.2
		tau     = 7.3
	)
	for _, g := range []float64{2, 2.3} {
		model := &BMT{Field: em.Uniform{B: vec.Vec3{0, 0, B}}, M: m, Q: q, Gyro: g}
		y := make([]float64, 12)
		put(y, IP, vec.Vec4{0, 0.9, 0, 0})
		put(y, IA, vec.Vec4{0, 0, 0.7, 0})
		flatNormalize(y, m, 0)
		gam := y[IP] / m
		yy := integrateTau(model, y, tau)
		phiP := math.Atan2(yy[IP+2], yy[IP+1])
		wantP := -q * B / m * tau
		if d := math.Remainder(phiP-wantP, 2*math.Pi); math.Abs(d) > 1e-10 {
			t.Errorf("g = %g: momentum angle off by %.3g", g, d)
		}
		// Exact circle: centre fixed, radius |p⃗|/(qB).
		rc := 0.9 / (q * B)
		if d := math.Abs(math.Hypot(yy[IX+1]-0, yy[IX+2]+rc) - rc); math.Abs(d) > 1e-10 {
			t.Errorf("g = %g: off the cyclotron circle by %.3g", g, d)
		}
		// Spin–momentum angle: the rest-frame spin s = a⃗ − a⁰p⃗/(p⁰ + m)
		// (starting at 90° to p⃗, along +y) turns relative to p⃗ at
		// (g/2 − 1) qBγ/m per unit proper time.
		k := yy[IA] / (yy[IP] + m)
		phiA := math.Atan2(yy[IA+2]-k*yy[IP+2], yy[IA+1]-k*yy[IP+1]) - phiP
		wantA := math.Pi/2 - (g/2-1)*q*B*gam/m*tau
		if d := math.Remainder(phiA-wantA, 2*math.Pi); math.Abs(d) > 1e-9 {
			t.Errorf("g = %g: spin–momentum angle off by %.3g", g, d)
		}
	}
}

// TestFirstOrderClosedForm: the generic straight-line quadrature of the
// equations of motion of both full root-Kerr completions (Lorentz-generator
// and conservative) reproduces the closed-form first-order impulse and spin
// kick of observables/leading (complex-shifted impact parameter, all orders
// in both spins, dyonic phase).
func TestFirstOrderClosedForm(t *testing.T) {
	src := leading.EMSource{Q: 0.01, P: 0.004, A: vec.Vec3{0.2, 0.3, -0.4}}
	in, _ := Incoming(1, 1.7, 1, vec.Vec3{0.1, -0.25, 0.35})
	pr := leading.EMProbe{M: 1, Q: 0.8, G: -0.3, A: in.A}
	wp, wa := leading.EMImpulse(pr, src, in.P.Scale(1), in.B)
	for _, model := range []Model{
		&RootKerr{Field: src.Field(), M: 1, Q: 0.8, G: -0.3},
		&RootKerrConservative{Field: src.Field(), M: 1, Q: 0.8, G: -0.3},
	} {
		dp, da := FirstOrder(model, in, 0)
		// 96-node Gauss–Legendre per half line: rounding-level agreement.
		if d := dp.Sub(wp).Spatial().Norm() / wp.Spatial().Norm(); d > 1e-12 {
			t.Errorf("%s impulse: quadrature %v closed form %v (rel %.3g)", model.Name(), dp, wp, d)
		}
		if d := da.Sub(wa); vec.Vec3(d.Spatial()).Norm() > 1e-12*vec.Vec3(wa.Spatial()).Norm() {
			t.Errorf("%s spin kick: quadrature %v closed form %v", model.Name(), da, wa)
		}
	}
}

// integrateTau integrates the model in proper time with the default
// integrator (helper for exact-solution tests).
func integrateTau(m Model, y0 []float64, tau float64) []float64 {
	return solveTau(m, y0, tau, 1e-13)
}
