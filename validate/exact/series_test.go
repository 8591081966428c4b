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
