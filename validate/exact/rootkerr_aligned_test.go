package exact

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// TestRootKerrAlignedDarwin: at α = 0 the aligned root-Kerr problem is the
// Coulomb problem, whose exact deflection is Darwin's closed form (Darwin
// 1913). The quadrature must reproduce it to its own accuracy.
func TestRootKerrAlignedDarwin(t *testing.T) {
	for _, c := range []struct{ v, eps float64 }{
		{0.3, 0.01}, {0.5, 0.2}, {0.9, -0.3}, {0.7, 1.5}, {0.2, -0.01},
	} {
		want, err := Darwin(c.v, c.eps)
		if err != nil {
			t.Fatal(err)
		}
		got, err := RootKerrAligned(c.v, c.eps, 0)
		if err != nil {
			t.Fatalf("v=%g ε=%g: %v", c.v, c.eps, err)
		}
		// Closed form against a 30-point graded Gauss–Legendre rule on a
		// smooth integrand: agreement to a few units of rounding of π.
		if d := math.Abs(got.Chi - want.Chi); d > 1e-14 {
			t.Errorf("v=%g ε=%g: χ = %.16g, Darwin %.16g (diff %.2g)", c.v, c.eps, got.Chi, want.Chi, d)
		}
	}
}

// TestRootKerrAlignedPlainQuadrature checks the subtracted, graded
// quadrature against the unsubtracted orbit integral in another
// substitution, x = x_t sin θ (dx/√C finite at θ = π/2), evaluated with
// gonum's fixed Gauss–Legendre rule on C(x) formed directly, and checks
// that C vanishes at the turning point.
func TestRootKerrAlignedPlainQuadrature(t *testing.T) {
	for _, c := range []struct{ v, eps, alpha float64 }{
		{0.6, 0.1, 0.5},
		{0.6, 0.1, -0.5},
		{0.8, -0.15, -0.4},
		{0.8, 0.15, 0.7},
		{0.4, 0.05, -0.3},
		{0.95, 0.3, 0.9},
	} {
		got, err := RootKerrAligned(c.v, c.eps, c.alpha)
		if err != nil {
			t.Fatal(err)
		}
		g := 1 / math.Sqrt(1-c.v*c.v)
		p := alignedProblem{eta: 1 / c.v, k: c.eps / (g * c.v), alpha: c.alpha}
		xt, err := p.turningPoint()
		if err != nil {
			t.Fatal(err)
		}
		// C(x_t) = 0 up to rounding of its O(1) terms.
		if ct := p.c(xt); math.Abs(ct) > 1e-14 {
			t.Errorf("v=%g ε=%g α=%g: C(x_t) = %.3g", c.v, c.eps, c.alpha, ct)
		}
		f := func(th float64) float64 {
			x := xt * math.Sin(th)
			cc := p.c(x)
			if cc <= 0 {
				return 0 // only at θ = π/2 within rounding
			}
			return (1 + c.alpha*p.u(x)) * xt * math.Cos(th) / math.Sqrt(cc)
		}
		half := quad.Fixed(f, 0, math.Pi/2, 40, quad.Legendre{}, 0)
		want := math.Pi - 2*half
		// The integrand is analytic in θ, so the rule converges
		// geometrically (n = 32 and 64 agree to ~1e-12 on these cases), but
		// C formed directly loses ~1e-16/cos²θ relative near θ = π/2 and
		// the Gauss–Legendre end nodes sit at cos θ ~ 1/n²: the rounding
		// error grows like 1e-16 n². n = 40 balances the two at ~1e-12.
		if d := math.Abs(got.Chi - want); d > 1e-11 {
			t.Errorf("v=%g ε=%g α=%g: χ = %.15g, plain quadrature %.15g (diff %.2g)", c.v, c.eps, c.alpha, got.Chi, want, d)
		}
		if got.ChiErr > 1e-13 {
			t.Errorf("v=%g ε=%g α=%g: error estimate %.3g", c.v, c.eps, c.alpha, got.ChiErr)
		}
	}
}

// TestRootKerrAlignedRing: with weak attraction and a ring (α = 2) larger
// than the impact parameter, C stays positive up to the ring (the
// attractive potential diverges there), so the probe reaches the ring and
// the function must report ErrRing rather than a number.
func TestRootKerrAlignedRing(t *testing.T) {
	_, err := RootKerrAligned(0.9, -0.01, 2)
	if !errors.Is(err, ErrRing) {
		t.Errorf("α = 2, weak attraction: error %v, want ErrRing", err)
	}
	if _, err := RootKerrAligned(1.2, 0.1, 0); err == nil {
		t.Errorf("v > 1 accepted")
	}
}
