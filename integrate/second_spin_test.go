package integrate

import (
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/vec"
	"ricochet/validate/exact"
)

// TestSecondOrderDixonSpinOrbit: the spin-linear second-order impulse of
// the Dixon body (Mathisson–Papapetrou–Dixon with the electromagnetic
// dipole, Tulczyjew condition) with its spin normal to the plane of a
// Coulomb encounter, directly, against the expansion of the aligned-spin
// radial quadrature of the canonical Thomas–BMT spin–orbit Hamiltonian
// (exact.CoulombSpinOrbitSeries; Thomas 1927; Bargmann, Michel & Telegdi
// 1959): two formulations of the same published physics, the quadrature
// independent of the covariant equations. The spin-linear part is the
// odd part in the rest spin a, with one Richardson step (remainder
// O(a⁴)).
func TestSecondOrderDixonSpinOrbit(t *testing.T) {
	const eps, a = 0.01, 0.02
	for _, c := range []struct{ v, g float64 }{{0.3, 2}, {0.6, 2}, {0.9, 2}, {0.6, 1.3}, {0.6, 0}} {
		gam := gammaV(c.v)
		p := gam * c.v
		m := &Dixon{Field: em.Coulomb{Q: eps}, M: 1, Q: 1, Gyro: c.g}
		var errEst float64
		evals := 0
		dp2 := func(s float64) float64 {
			in, err := Incoming(1, gam, 1, vec.Vec3{0, 0, s})
			if err != nil {
				t.Fatal(err)
			}
			r, err := SecondOrder(m, in, nil)
			if err != nil || r.Status != StatusScattered {
				t.Fatalf("%+v: %v %v", c, err, r.Status)
			}
			errEst = math.Max(errEst, r.Impulse2Err[2])
			evals += r.Evals
			return r.Impulse2[2]
		}
		odd := func(h float64) float64 { return (dp2(h) - dp2(-h)) / (2 * h) }
		got := (4*odd(a/2) - odd(a)) / 3
		s, err := exact.CoulombSpinOrbitSeries(c.v, c.g)
		if err != nil {
			t.Fatal(err)
		}
		want := p * s.C21 * eps * eps
		// Error of the odd part: the estimates over the Richardson weights.
		est := errEst * (4.0/3/(a/2) + 1.0/3/a) / math.Abs(want)
		d := math.Abs(got-want) / math.Abs(want)
		t.Logf("v=%g g=%g: spin-linear Δp₂ %.13g, canonical %.13g, rel. error %.1e (estimate %.1e), evaluations %d", c.v, c.g, got, want, d, est, evals)
		if d > 1e-10 {
			t.Errorf("v=%g g=%g: spin-linear second order %.13g, canonical quadrature %.13g (rel. %.2g)", c.v, c.g, got, want, d)
		}
	}
}
