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
