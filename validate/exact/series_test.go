package exact

import (
	"math"
	"testing"
)

// extrapolatedC2 returns the λ → 0 limit of (χ(λ) − c1 λ)/λ² from
// λ = h, 2h, 3h by quadFit.
func extrapolatedC2(t *testing.T, chi func(l float64) (Scattering, error), c1, h float64) float64 {
	var r [3]float64
	for i := range r {
		l := h * float64(i+1)
		k, err := chi(l)
		if err != nil {
			t.Fatal(err)
		}
		r[i] = (k.Chi - c1*l) / (l * l)
	}
	return quadFit(r)
}

// quadFit returns the value at λ = 0 of the quadratic through
// (h, r0), (2h, r1), (3h, r2) (Richardson-type extrapolation, common
// practice), as in TestDarwinSeries.
func quadFit(r [3]float64) float64 { return 3*r[0] - 3*r[1] + r[2] }

// TestDyonSeries checks the expansion derived in DyonSeries against the
// closed-form cone of Dyon (Poincaré 1896 and its dyon extension), by
// extrapolating (Δp/m − λ first)/λ² of the closed form to λ → 0.
func TestDyonSeries(t *testing.T) {
	for _, c := range []struct {
		name          string
		v             float64
		probe, source Charge
	}{
		{"charge–monopole", 0.6, Charge{Electric: 1}, Charge{Magnetic: 0.7}},
		{"charge–monopole fast", 0.95, Charge{Electric: -1}, Charge{Magnetic: 0.4}},
		{"dyon–dyon", 0.4, Charge{0.8, 0.3}, Charge{-0.4, 0.9}},
		{"charge–charge", 0.5, Charge{Electric: 1}, Charge{Electric: -0.6}},
	} {
		const b, m = 1.3, 0.9
		first, second, err := DyonSeries(c.v, b, m, c.probe, c.source)
		if err != nil {
			t.Fatal(err)
		}
		h := 1e-3 * c.v * c.v
		var r [3][3]float64
		for i := 0; i < 3; i++ {
			l := h * float64(i+1)
			s := Charge{c.source.Electric * l, c.source.Magnetic * l}
			d, err := Dyon(c.v, b, m, c.probe, s)
			if err != nil {
				t.Fatal(err)
			}
			for j := 0; j < 3; j++ {
				r[j][i] = (d.ImpulsePerMass[j+1] - l*first[j]) / (l * l)
			}
		}
		scale := second.Norm() + first.Norm()
		for j := 0; j < 3; j++ {
			got := quadFit(r[j])
			// Rounding of the closed form (~1e-16) over λ² ~ 1e-7 dominates.
			if math.Abs(got-second[j]) > 1e-6*scale {
				t.Errorf("%s: second[%d] = %.12g, closed form gives %.12g", c.name, j, second[j], got)
			}
		}
	}
	if _, _, err := DyonSeries(1.2, 1, 1, Charge{}, Charge{}); err == nil {
		t.Error("v > 1 accepted")
	}
}

// TestKerrEquatorialSeriesSchwarzschild: at a = 0 the expansion of the
// quadrature must give the published test-mass coefficients (1PM Einstein,
// 2PM Westpfahl 1985; SchwarzschildPM).
func TestKerrEquatorialSeriesSchwarzschild(t *testing.T) {
	for _, v := range []float64{0.1, 0.3, 0.6, 0.9, 0.99} {
		s, err := KerrEquatorialSeries(v, 0)
		if err != nil {
			t.Fatal(err)
		}
		c1, c2, _ := SchwarzschildPM(v)
		// Graded Gauss–Legendre on an analytic integrand: rounding level.
		if math.Abs(s.C1-c1) > 1e-13*c1 || math.Abs(s.C2-c2) > 1e-13*c2 {
			t.Errorf("v=%g: series (%.15g, %.15g), Westpfahl (%.15g, %.15g)", v, s.C1, s.C2, c1, c2)
		}
		if s.C2Err > 1e-13*c2 {
			t.Errorf("v=%g: error estimate %g", v, s.C2Err)
		}
	}
}

// TestKerrEquatorialSeriesQuadrature checks the Taylor-expanded quadrature
// against the exact deflection KerrEquatorial itself, by extrapolating
// (χ − C1 μ)/μ² to μ → 0 (an independent route through the full
// quadrature at finite μ).
func TestKerrEquatorialSeriesQuadrature(t *testing.T) {
	for _, c := range []struct{ v, alpha float64 }{{0.5, 0.4}, {0.5, -0.4}, {0.8, 0.7}, {0.3, -0.2}} {
		s, err := KerrEquatorialSeries(c.v, c.alpha)
		if err != nil {
			t.Fatal(err)
		}
		got := extrapolatedC2(t, func(mu float64) (Scattering, error) { return KerrEquatorial(c.v, 1, mu, c.alpha) }, s.C1, 1e-4)
		// Rounding of χ (~1e-16) over μ² ~ 1e-8, and the O(μ³) fit error.
		if math.Abs(got-s.C2) > 1e-6*math.Abs(s.C2) {
			t.Errorf("v=%g α=%g: C2 = %.12g, quadrature gives %.12g", c.v, c.alpha, s.C2, got)
		}
	}
}

// TestRootKerrAlignedSeries: at α = 0 the expansion is Darwin's
// (DarwinSeries, Darwin 1913); at α ≠ 0 it agrees with the extrapolated
// quadrature RootKerrAligned.
func TestRootKerrAlignedSeries(t *testing.T) {
	for _, v := range []float64{0.2, 0.6, 0.95} {
		s, err := RootKerrAlignedSeries(v, 0)
		if err != nil {
			t.Fatal(err)
		}
		c1, c2, _ := DarwinSeries(v)
		if math.Abs(s.C1-c1) > 1e-13*c1 || math.Abs(s.C2-c2) > 1e-13*math.Abs(c2) {
			t.Errorf("v=%g: series (%.15g, %.15g), Darwin (%.15g, %.15g)", v, s.C1, s.C2, c1, c2)
		}
	}
	for _, c := range []struct{ v, alpha float64 }{{0.6, 0.5}, {0.6, -0.5}, {0.9, 0.3}} {
		s, err := RootKerrAlignedSeries(c.v, c.alpha)
		if err != nil {
			t.Fatal(err)
		}
		got := extrapolatedC2(t, func(eps float64) (Scattering, error) { return RootKerrAligned(c.v, eps, c.alpha) }, s.C1, 1e-4)
		if math.Abs(got-s.C2) > 1e-6*math.Abs(s.C2) {
			t.Errorf("v=%g α=%g: C2 = %.12g, quadrature gives %.12g", c.v, c.alpha, s.C2, got)
		}
	}
}

// TestReissnerNordstromSeries: at Q = 0 the expansion is Schwarzschild's
// (SchwarzschildPM; Westpfahl 1985 at second order); at M = 0 with a
// vanishing metric charge it is Darwin's with the opposite sign
// (DarwinSeries; the same limit as TestDarwinAgainstQuadrature); in
// general it agrees with the extrapolated quadrature ReissnerNordstrom.
func TestReissnerNordstromSeries(t *testing.T) {
	const v = 0.6
	s, err := ReissnerNordstromSeries(v, 1, 1, 0, 0)
	if err != nil {
		t.Fatal(err)
	}
	c1, c2, _ := SchwarzschildPM(v)
	if math.Abs(s.C1-c1) > 1e-13*c1 || math.Abs(s.C2-c2) > 1e-13*c2 {
		t.Errorf("Q = 0: series (%.15g, %.15g), Westpfahl (%.15g, %.15g)", s.C1, s.C2, c1, c2)
	}
	// M = 0, Q = 1e-6, qm = 1e6: qQ/(m b) = 1 per unit λ, Q² negligible.
	s, err = ReissnerNordstromSeries(v, 1, 0, 1e-6, 1e6)
	if err != nil {
		t.Fatal(err)
	}
	d1, d2, _ := DarwinSeries(v)
	// Opposite sign conventions; the metric's ν² = 1e-12 enters C2 at
	// ~1e-12 relative.
	if math.Abs(s.C1+d1) > 1e-12*d1 || math.Abs(s.C2+d2) > 1e-10*math.Abs(d2) {
		t.Errorf("M = 0: series (%.15g, %.15g), Darwin (%.15g, %.15g)", s.C1, s.C2, -d1, -d2)
	}
	for _, c := range []struct{ v, M, Q, qm float64 }{{0.5, 1, 0.6, 2}, {0.7, 1, 0.9, -1.5}, {0.4, 1, 1.3, 0.5}} {
		s, err := ReissnerNordstromSeries(c.v, 1, c.M, c.Q, c.qm)
		if err != nil {
			t.Fatal(err)
		}
		got := extrapolatedC2(t, func(l float64) (Scattering, error) { return ReissnerNordstrom(c.v, 1, l*c.M, l*c.Q, c.qm) }, s.C1, 1e-4)
		if math.Abs(got-s.C2) > 1e-6*math.Abs(s.C2) {
			t.Errorf("%+v: C2 = %.12g, quadrature gives %.12g", c, s.C2, got)
		}
	}
}

// TestCoulombSpinOrbitSeries: at a = 0 the expansion is Darwin's
// (DarwinSeries); the spin-linear coefficients agree with the quadrature
// CoulombSpinOrbit itself, extrapolated in ε and differenced in a.
func TestCoulombSpinOrbitSeries(t *testing.T) {
	for _, c := range []struct{ v, g float64 }{{0.3, 2}, {0.6, 2}, {0.9, 1.3}, {0.6, 0}} {
		s, err := CoulombSpinOrbitSeries(c.v, c.g)
		if err != nil {
			t.Fatal(err)
		}
		d1, d2, _ := DarwinSeries(c.v)
		if math.Abs(s.C10-d1) > 1e-13*d1 || math.Abs(s.C20-d2) > 1e-13*math.Abs(d2) {
			t.Errorf("%+v: spinless part (%.15g, %.15g), Darwin (%.15g, %.15g)", c, s.C10, s.C20, d1, d2)
		}
		// Spin-linear part from the quadrature: central difference in a
		// (the Hamiltonian is linear in S, but the impact-parameter shift
		// and the orbit make χ nonlinear in a: O(a²) error ~1e-8 at a = 1e-4).
		const a = 1e-4
		h := 1e-3 * c.v * c.v
		chi := func(eps, a float64) float64 {
			r, err := CoulombSpinOrbit(c.v, eps, a, c.g)
			if err != nil {
				t.Fatal(err)
			}
			return r.Chi
		}
		var r1, r2 [3]float64
		for i := range r1 {
			eps := h * float64(i+1)
			lin := (chi(eps, a) - chi(eps, -a)) / (2 * a)
			r1[i] = lin / eps
			r2[i] = (lin - s.C11*eps) / (eps * eps)
		}
		g11, g21 := quadFit(r1), quadFit(r2)
		// Rounding of χ over 2a ε² (~1e-5 relative for C21) and the O(ε³)
		// remainder of the fit bound these checks; the exact identity of
		// TestSpinOrbitSourceWeight is the sharp one.
		sc := math.Abs(s.C11) + math.Abs(s.C10)
		if math.Abs(g11-s.C11) > 1e-6*sc || math.Abs(g21-s.C21) > 2e-4*math.Abs(s.C21) {
			t.Errorf("%+v: C11 %.10g (quadrature %.10g), C21 %.10g (quadrature %.10g)", c, s.C11, g11, s.C21, g21)
		}
		t.Logf("%+v: C11 %.12g vs %.12g, C21 %.12g vs %.12g", c, s.C11, g11, s.C21, g21)
	}
}

// TestSpinOrbitSourceWeight: between the expansions of the two exact
// quadratures (the canonical spin–orbit Hamiltonian for the probe spin,
// the aligned root-Kerr problem for the source spin), the coefficients
// linear in the spin satisfy, at every speed and g,
//
//	C11 = (g/2) ∂_α C1,   C21 = ((g − 1)/2) ∂_α C2   at α = 0,
//
// found to hold to rounding (the first is the first-order BMT weight of
// EMBMTImpulse; the second is the statement measured from the full
// quadratures to 1e-7 in integrate's TestSpinWeightRatio). ∂_α by a
// central difference with one Richardson step (error O(α⁴) ≈ 1e-16).
func TestSpinOrbitSourceWeight(t *testing.T) {
	for _, v := range []float64{0.3, 0.6, 0.9} {
		d := func(al float64) (float64, float64) {
			p, err := RootKerrAlignedSeries(v, al)
			if err != nil {
				t.Fatal(err)
			}
			m, _ := RootKerrAlignedSeries(v, -al)
			return (p.C1 - m.C1) / (2 * al), (p.C2 - m.C2) / (2 * al)
		}
		a1, a2 := d(1e-4)
		b1, b2 := d(5e-5)
		s1, s2 := (4*b1-a1)/3, (4*b2-a2)/3
		for _, g := range []float64{0, 1.3, 2, 3} {
			s, err := CoulombSpinOrbitSeries(v, g)
			if err != nil {
				t.Fatal(err)
			}
			// Rounding of C2 (~1e-15) over 2α ~ 1e-4.
			if math.Abs(s.C11-g/2*s1) > 1e-10*math.Abs(s1) || math.Abs(s.C21-(g-1)/2*s2) > 1e-10*math.Abs(s2) {
				t.Errorf("v=%g g=%g: C11 %.15g vs %.15g, C21 %.15g vs %.15g", v, g, s.C11, g/2*s1, s.C21, (g-1)/2*s2)
			}
		}
	}
}
