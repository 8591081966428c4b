package integrate

import (
	"math/rand"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// unfused hides a model's point force, so that Scatter integrates it
// through osculating.deriv around its DerivFunc (the generic path).
type unfused struct{ Model }

func (u unfused) DerivFunc() func(y, dy []float64) { return u.Model.(DerivFuncer).DerivFunc() }
func (u unfused) VelocityIsMomentum()              {}
func (u unfused) HazardFree() bool                 { return hazardFree(u.Model) }
func (u unfused) CaptureSphere() (float64, bool)   { return captureSphere(u.Model) }

func fusedModels() []Model {
	return []Model{
		&Charge{Field: em.Coulomb{Q: 1}, M: 1, Q: 1},
		&Charge{Field: em.Coulomb{Q: -0.3}, M: 1.3, Q: 0.7},
		&Charge{Field: em.Dyon{Q: 0.2, P: -0.5}, M: 0.8, Q: 0.3, G: 0.6},
		&Charge{Field: em.Monopole{P: 0.4}, M: 1, Q: 1},
		&Geodesic{Metric: spacetime.Schwarzschild(1), M: 1},
		&Geodesic{Metric: spacetime.ReissnerNordstrom(0.3, 0.2), M: 0.9, Q: -0.7},
	}
}

// TestFusedBitForBit: the generated fused right-hand sides (fused.go)
// agree with the generic path, osculating.deriv around the model's
// DerivFunc, bit for bit: on random osculating states, with and without
// the coordinate time, and over whole events (impulse, error bars and
// evaluation counts), for every force listed in gen_fused.go.
func TestFusedBitForBit(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	for _, m := range fusedModels() {
		in, err := Incoming(m.Mass(), 1.3, 10, vec.Vec3{})
		if err != nil {
			t.Fatal(err)
		}
		o := newOsculating(m, in, 10, in.P.Spatial().Norm()/m.Mass())
		f := o.rkFunc()
		if pf, _ := m.(pointForcer); pf == nil || o.fused(pf.pointForce()) == nil {
			t.Fatalf("%s: no fused right-hand side", m.Name())
		}
		for _, n := range []int{8, 9} {
			Z, a, b := make([]float64, n), make([]float64, n), make([]float64, n)
			for k := 0; k < 2000; k++ {
				Z[zW] = 20 * (rng.Float64() - 0.5)
				for i := zB; i < zB+3; i++ {
					Z[i] = 10 * rng.NormFloat64()
				}
				for i := zP; i < zP+4; i++ {
					Z[i] = 0.1 * rng.NormFloat64()
				}
				if n == 9 {
					Z[8] = 100 * rng.NormFloat64()
				}
				f(0, Z, a)
				o.deriv(Z, b)
				for i := range a {
					if a[i] != b[i] {
						t.Fatalf("%s: Z = %v: component %d fused %.17g, generic %.17g", m.Name(), Z, i, a[i], b[i])
					}
				}
			}
		}
		for _, set := range []*Settings{nil, {Tol: 1e-8, Radius: 1e5}} {
			x, err := Scatter(m, in, set)
			if err != nil {
				t.Fatal(err)
			}
			y, err := Scatter(unfused{m}, in, set)
			if err != nil {
				t.Fatal(err)
			}
			if x.Status != StatusScattered || y.Status != x.Status || x.Impulse != y.Impulse ||
				x.ImpulseErr != y.ImpulseErr || x.EventEvals != y.EventEvals {
				t.Errorf("%s %+v: fused %v %v ± %v (%d evals), generic %v %v ± %v (%d evals)", m.Name(), set,
					x.Status, x.Impulse, x.ImpulseErr, x.EventEvals, y.Status, y.Impulse, y.ImpulseErr, y.EventEvals)
			}
		}
	}
}
