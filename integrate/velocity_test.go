package integrate

import (
	"math/rand"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// TestVelocityIsMomentum: every model marked with VelocityIsMomentum sets
// dx^μ/dτ = p^μ/m exactly, in Deriv and in its specialised right-hand side
// (the driver then forms the position derivative from the momentum in the
// motion frame instead of reading it). Bit-for-bit, at random states: the
// marker is a promise about the code, not an approximation.
func TestVelocityIsMomentum(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	models := []Model{
		&Charge{Field: em.Coulomb{Q: 0.7}, M: 1.3, Q: -0.4},
		&Charge{Field: em.RootKerr{Q: 0.3, A: vec.Vec3{0, 0.2, 0.1}}, M: 0.8, Q: 1, G: 0.2},
		&BMT{Field: em.Coulomb{Q: 1}, M: 0.9, Q: 1, Gyro: 2.2},
		&RootKerr{Field: em.RootKerr{Q: 1, A: vec.Vec3{0, 0, 0.3}}, M: 1.1, Q: 0.5},
		&Geodesic{Metric: spacetime.Schwarzschild(0.3), M: 1.2},
		&Geodesic{Metric: spacetime.KerrNewman{M: 0.3, A: 0.2, Q: 0.1}, M: 1, Q: 0.5},
	}
	for _, m := range models {
		if _, ok := m.(momentumVelocity); !ok {
			t.Errorf("%s: not marked", m.Name())
			continue
		}
		fs := []func(y, dy []float64){m.Deriv, derivOf(m)}
		for k := 0; k < 100; k++ {
			y := make([]float64, m.Dim())
			put(y, IX, vec.FromSpatial(0, vec.Vec3{rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()}.Unit().Scale(3+20*rng.Float64())))
			put(y, IP, vec.Vec4{0, rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()})
			if m.Dim() > IA {
				put(y, IA, vec.Vec4{0, 0.1 * rng.NormFloat64(), 0.1 * rng.NormFloat64(), 0.1 * rng.NormFloat64()})
			}
			m.Normalize(y, 0.01)
			for _, f := range fs {
				dy := make([]float64, m.Dim())
				f(y, dy)
				for i := 0; i < 4; i++ {
					if want := y[IP+i] * (1 / m.Mass()); dy[IX+i] != want {
						t.Fatalf("%s: dx^%d/dτ = %v, p^%d/m = %v", m.Name(), i, dy[IX+i], i, want)
					}
				}
			}
		}
	}
}
