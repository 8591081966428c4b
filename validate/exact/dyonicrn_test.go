package exact

import (
	"testing"
)

// TestDyonicReissnerNordstromLimits: at P = 0 the dyonic solution is
// ReissnerNordstrom (planar, to rounding); with M = 0 and the charges
// scaled to zero at fixed qQ/(m b) and qP/(m b), it tends to the flat
// charge–dyon scattering of Dyon (Poincaré 1896 cone with Darwin's
// radial motion), the remaining geometry (Q² + P²)/r² entering at O(λ²).
func TestDyonicReissnerNordstromLimits(t *testing.T) {
	for _, c := range []struct{ v, M, Q, qm float64 }{{0.6, 0.01, 0.005, 1}, {0.9, 0.02, 0.01, -5}} {
		a, err := DyonicReissnerNordstrom(c.v, 1, c.M, c.Q, 0, c.qm)
		if err != nil {
			t.Fatal(err)
		}
		b, err := ReissnerNordstrom(c.v, 1, c.M, c.Q, c.qm)
		if err != nil {
			t.Fatal(err)
		}
		// Same quadrature, the direction built through the cone at μ = 0:
		// rounding of sin and cos of π + χ.
		if d := a.Dir.Sub(b.Dir).Norm(); d > 1e-15 {
			t.Errorf("%+v: P = 0 direction %v, Reissner–Nordström %v", c, a.Dir, b.Dir)
		}
	}
	const v, kq, kp = 0.7, 0.03, -0.05 // qQ/(m b), qP/(m b)
	ref, err := Dyon(v, 1, 1, Charge{Electric: 1}, Charge{Electric: kq, Magnetic: kp})
	if err != nil {
		t.Fatal(err)
	}
	prev := 0.0
	for _, lam := range []float64{1e-1, 1e-2} {
		s, err := DyonicReissnerNordstrom(v, 1, 0, lam*kq, lam*kp, 1/lam)
		if err != nil {
			t.Fatal(err)
		}
		d := s.Dir.Sub(ref.Dir).Norm()
		t.Logf("λ = %g: |n_out − n_flat| = %.3e", lam, d)
		// The geometry's (Q² + P²)/b² = λ²(kq² + kp²) enters at O(λ²): a
		// tenfold smaller λ must shrink the difference ~100-fold (allowing
		// a factor 2 for the next term).
		if prev != 0 && !(d < prev/50) {
			t.Errorf("λ = %g: difference %.3e, previous %.3e: not O(λ²)", lam, d, prev)
		}
		prev = d
	}
	// Its size: (Q² + P²)/b² times an O(1) coefficient (for v = 0.7 the
	// Reissner–Nordström Q² term of the deflection is a few times ν²/v²).
	if nu2 := 1e-4 * (kq*kq + kp*kp); prev > 10*nu2 {
		t.Errorf("λ = 1e-2: difference %.3e from the flat dyon, above 10 (Q² + P²)/b² = %.3e", prev, 10*nu2)
	}
}
