package exact

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// TestDarwinRutherfordLimit checks the non-relativistic limit against
// Rutherford's χ = 2 arctan(ε/v²) (Rutherford 1911).
func TestDarwinRutherfordLimit(t *testing.T) {
	for _, v := range []float64{1e-3, 1e-4} {
		for _, r := range []float64{-0.7, -0.1, 0.05, 0.5, 3} { // r = ε/v², the Rutherford variable
			eps := r * v * v
			got, err := Darwin(v, eps)
			if err != nil {
				t.Fatal(err)
			}
			want := 2 * math.Atan(r)
			// Relativistic corrections are O(v²) relative (γ, ω − 1 ∝ ε²/v² ∝ r² v²).
			tol := 10 * v * v * (1 + r*r) * math.Abs(want)
			if math.Abs(got.Chi-want) > tol {
				t.Errorf("v=%g ε/v²=%g: χ = %.15g, Rutherford %.15g (tol %g)", v, r, got.Chi, want, tol)
			}
		}
	}
}

// TestDarwinFirstOrder checks c1 of DarwinSeries against the first-order
// impulse: the Coulomb force integrated along the straight line,
// Δp_y = ∫ qQ b/(b² + v²t²)^{3/2} dt, evaluated here with gonum quad
// (substituting v t = b tan θ). χ ≈ Δp_y/p at first order.
func TestDarwinFirstOrder(t *testing.T) {
	const b, m = 1.0, 1.0
	for _, v := range []float64{0.1, 0.5, 0.9, 0.99} {
		g := 1 / math.Sqrt(1-v*v)
		f := func(th float64) float64 {
			c := math.Cos(th)
			// qQ = 1: force b/r³ with r = b/cos θ, dt = b/(v cos²θ) dθ.
			return b * c * c * c / (b * b * b) * b / (v * c * c)
		}
		dp := quad.Fixed(f, -math.Pi/2, math.Pi/2, 40, quad.Legendre{}, 0)
		c1, _, _ := DarwinSeries(v)
		// eps = qQ/(m b) = 1; χ1 = Δp_y/p with p = γ m v.
		want := dp / (g * m * v)
		// The integrand is a smooth trigonometric polynomial: Gauss–Legendre
		// with 40 points is exact to rounding.
		if math.Abs(c1-want) > 1e-13*want {
			t.Errorf("v=%g: c1 = %.16g, straight-line impulse gives %.16g", v, c1, want)
		}
	}
}

// TestDarwinSeries checks the second- and third-order coefficients derived
// in DarwinSeries against the exact closed form, by fitting
// (χ − c1 ε)/ε² = c2 + c3 ε + c4 ε² on a small-ε stencil (Richardson
// extrapolation, common practice).
func TestDarwinSeries(t *testing.T) {
	for _, v := range []float64{0.2, 0.6, 0.95} {
		c1, c2, c3 := DarwinSeries(v)
		h := 1e-3 * v * v // keeps ε/v² small for slow probes
		var r [3]float64
		for i, s := range []float64{1, 2, 3} {
			eps := s * h
			ch, err := Darwin(v, eps)
			if err != nil {
				t.Fatal(err)
			}
			r[i] = (ch.Chi - c1*eps) / (eps * eps)
		}
		// Quadratic through (h, r0), (2h, r1), (3h, r2): value and slope at 0.
		got2 := 3*r[0] - 3*r[1] + r[2]
		got3 := (-5*r[0] + 8*r[1] - 3*r[2]) / (2 * h)
		// Rounding of χ (~1e-16 χ) divided by ε² dominates got2's error; the
		// ε³ truncation term dominates got3's (relative ~ (ε/v²)²).
		if math.Abs(got2-c2) > 1e-6*math.Abs(c2) {
			t.Errorf("v=%g: c2 = %.12g, extracted %.12g", v, c2, got2)
		}
		if math.Abs(got3-c3) > 1e-3*math.Abs(c3) {
			t.Errorf("v=%g: c3 = %.12g, extracted %.12g", v, c3, got3)
		}
	}
}

// TestDarwinAgainstQuadrature checks the closed form against the radial
// quadrature of ReissnerNordstrom in its flat limit (M = 0, Q → 0 at fixed
// qQ/(m b)), where the orbit equation is that of Darwin 1913, including the
// strongly repulsive branch κ > L and the winding attractive orbits.
func TestDarwinAgainstQuadrature(t *testing.T) {
	const Q = 1e-12 // metric corrections O(Q² x_t⁴/b²) ≤ 1e-14 even for x_t = b/r_min ≈ 300
	for _, v := range []float64{0.3, 0.8} {
		g := 1 / math.Sqrt(1-v*v)
		for _, k := range []float64{-0.99, -0.5, -0.01, 0.01, 0.5, 0.999, 1.001, 3} { // κ/L
			eps := k * g * v
			d, err := Darwin(v, eps)
			if err != nil {
				t.Fatal(err)
			}
			rn, err := ReissnerNordstrom(v, 1, 0, Q, eps/Q)
			if err != nil {
				t.Fatal(err)
			}
			// Opposite sign conventions. Rounding (~4e-16) is amplified by the
			// conditioning of χ near capture, |∂χ/∂ln ε| ~ |χ|/ω²,
			// ω² = 1 − (κ/L)² (its modulus on the strongly repulsive branch).
			tol := 4e-15 * (1 + math.Abs(d.Chi)) / math.Abs((1-k)*(1+k))
			if math.Abs(d.Chi+rn.Chi) > tol {
				t.Errorf("v=%g κ/L=%g: Darwin %.16g, quadrature %.16g", v, k, d.Chi, -rn.Chi)
			}
		}
	}
}

func TestDarwinCapture(t *testing.T) {
	const v = 0.6
	g := 1 / math.Sqrt(1-v*v)
	// Capture for attractive |κ| ≥ L, i.e. ε ≤ −γv (Darwin 1913).
	if _, err := Darwin(v, -1.0001*g*v); !errors.Is(err, ErrCaptured) {
		t.Errorf("ε = −1.0001γv: err = %v, want ErrCaptured", err)
	}
	if _, err := Darwin(v, -0.9999*g*v); err != nil {
		t.Errorf("ε = −0.9999γv: unexpected %v", err)
	}
	// Repulsion never captures; κ = L is continuous across the branches.
	c0, _ := Darwin(v, g*v)
	cm, _ := Darwin(v, g*v*(1-1e-9))
	cp, _ := Darwin(v, g*v*(1+1e-9))
	if math.Abs(cm.Chi-c0.Chi) > 1e-8 || math.Abs(cp.Chi-c0.Chi) > 1e-8 {
		t.Errorf("discontinuity at κ = L: %v %v %v", cm.Chi, c0.Chi, cp.Chi)
	}
}
