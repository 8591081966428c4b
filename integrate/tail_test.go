package integrate

import (
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/validate/exact"
)

// TestTailTruncationOrder checks the asymptotic tails against exact
// deflections: at fixed start/stop radius R the remaining error must fall
// like (b/R)^(k+1) for tails of order k (tail.go; the design document's
// "Asymptotics" asks for the first-order law (b/R)² at least; without
// tails the error would fall like b/R). References: Darwin's exact
// Coulomb deflection (Darwin 1913, validate/exact.Darwin) and the radial
// quadrature of the Schwarzschild deflection (validate/exact.Schwarzschild).
// The radii keep the errors between 1e-11 and 1e-4, far above the
// integrator's error at tol 1e-14 (~1e-15), so a deviation of 0.15 in the
// exponent means a wrong tail.
func TestTailTruncationOrder(t *testing.T) {
	const v = 0.3
	gamma := 1 / math.Sqrt(1-v*v)
	coul, _ := exact.Darwin(v, 0.05)
	schw, _ := exact.Schwarzschild(v, 20, 1)
	cases := []struct {
		name  string
		model Model
		b     float64
		want  exact.Scattering
		order int
		radii [2]float64
	}{
		{"coulomb", &Charge{Field: em.Coulomb{Q: 0.05}, M: 1, Q: 1}, 1, coul, 1, [2]float64{1e2, 1e3}},
		{"coulomb", &Charge{Field: em.Coulomb{Q: 0.05}, M: 1, Q: 1}, 1, coul, 2, [2]float64{1e2, 1e3}},
		{"coulomb", &Charge{Field: em.Coulomb{Q: 0.05}, M: 1, Q: 1}, 1, coul, 3, [2]float64{3e1, 1e2}},
		{"schwarzschild", &Geodesic{Metric: spacetime.Schwarzschild(1), M: 1}, 20, schw, 1, [2]float64{1e2, 1e3}},
		{"schwarzschild", &Geodesic{Metric: spacetime.Schwarzschild(1), M: 1}, 20, schw, 2, [2]float64{1e2, 1e3}},
		{"schwarzschild", &Geodesic{Metric: spacetime.Schwarzschild(1), M: 1}, 20, schw, 3, [2]float64{3e1, 1e2}},
	}
	for _, c := range cases {
		in, _ := Incoming(1, gamma, c.b, vec.Vec3{})
		var errs [2]float64
		for i, R := range c.radii {
			out, err := Scatter(c.model, in, &Settings{Tol: 1e-14, Radius: R, TailOrder: c.order, SingleRun: true})
			if err != nil || out.Status != StatusScattered {
				t.Fatal(err, out.Status)
			}
			errs[i] = relDiff(out.Impulse, c.want.ImpulsePerMass)
		}
		slope := math.Log(errs[0]/errs[1]) / math.Log(c.radii[1]/c.radii[0])
		t.Logf("%-13s order %d: errors %.2e, %.2e at R = %g, %g b: exponent %.3f", c.name, c.order, errs[0], errs[1], c.radii[0], c.radii[1], slope)
		if math.Abs(slope-float64(c.order+1)) > 0.15 {
			t.Errorf("%s order %d: truncation exponent %.3f, want %d", c.name, c.order, slope, c.order+1)
		}
	}
}

// TestTruncationBound checks the tail truncation bound truncBound against
// exact deflections (Darwin 1913, validate/exact.Darwin; the Schwarzschild
// quadrature, validate/exact.Schwarzschild) for tails of order 1, 2 and 3
// over v = 0.1…0.99, |ε| = 1e-3…0.5 (M/b ≤ v/10) and start/stop radii
// 10…1e4 b, wherever θ₁ b/R < 0.3 (beyond, the asymptotic expansion of the
// tails is not meant to hold). The integrator runs at tol 1e-15 so that the
// truncation dominates; where the actual error is below 1e-13 |p⃗| or four
// rounding floors of the event it is compared with the bound plus that.
func TestTruncationBound(t *testing.T) {
	vs := []float64{0.1, 0.2, 0.3, 0.6, 0.9, 0.99}
	eps := []float64{1e-3, 3e-3, 1e-2, 3e-2, 0.1, 0.3, 0.5, -0.01, -0.03, -0.1, -0.3}
	radii := []float64{10, 20, 50, 100, 300, 1000, 1e4}
	if testing.Short() {
		vs, eps, radii = []float64{0.1, 0.6, 0.99}, []float64{1e-3, 0.1, 0.5, -0.1}, []float64{10, 100, 1e4}
	}
	for k := 1; k <= 3; k++ {
		worst, n := 0.0, 0
		for _, fam := range []string{"Coulomb", "Schwarzschild"} {
			for _, v := range vs {
				for _, e := range eps {
					gv := v / math.Sqrt((1-v)*(1+v))
					if e < 0 && -e > gv/2 || fam == "Schwarzschild" && (e < 0 || e > v/10) {
						continue // capture or its neighbourhood
					}
					in, _ := Incoming(1, speedGamma(v), 1, vec.Vec3{})
					var m Model
					var ex exact.Scattering
					if fam == "Coulomb" {
						m = &Charge{Field: em.Coulomb{Q: e}, M: 1, Q: 1}
						ex, _ = exact.Darwin(v, e)
					} else {
						m = &Geodesic{Metric: spacetime.Schwarzschild(e), M: 1}
						ex, _ = exact.Schwarzschild(v, 1, e)
					}
					dp1, _ := FirstOrder(m, in, scaleNodes)
					th1 := dp1.Spatial().Norm() / in.P.Spatial().Norm()
					for _, R := range radii {
						if th1/R > 0.3 {
							continue
						}
						o, err := Scatter(m, in, &Settings{Tol: 1e-15, Radius: R, SingleRun: true, TailOrder: k})
						if err != nil || o.Status != StatusScattered {
							t.Fatalf("%s v %g ε %g R %g: %v %v", fam, v, e, R, err, o.Status)
						}
						d := o.Impulse.Spatial().Sub(ex.ImpulsePerMass.Spatial()).Norm()
						bound := truncBound(th1, R, k) * o.Impulse.Spatial().Norm()
						pf, _ := roundingFloor(o, in)
						n++
						// Below 1e-13 |p⃗| or a few rounding floors of the
						// event (4 ulp E²/|p⃗| dominates at v = 0.1) the
						// integrator's error at tol 1e-14 and rounding
						// compete with the truncation.
						if floor := math.Max(1e-13*in.P.Spatial().Norm(), 4*pf[1]); d < floor {
							bound += floor
						} else if r := d / bound; r > worst {
							worst = r
						}
						if d > bound+pf[1] {
							t.Errorf("order %d %s v %g ε %g R %g b: error %.3g above the bound %.3g", k, fam, v, e, R, d, bound)
						}
					}
				}
			}
		}
		t.Logf("tail order %d: %d events, largest actual/bound where the truncation is resolved: %.3f", k, n, worst)
	}
}
