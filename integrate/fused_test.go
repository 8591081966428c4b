package integrate

import (
	"math"
	"math/rand"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// unfused hides the type of a model's point force, so that Scatter
// integrates it through derivPoint and a dynamic call of the force (the
// path of a point force that gen_fused.go does not list).
type unfused struct{ Model }

// hiddenForce is a point force of a type that fused.go does not know.
type hiddenForce struct{ pointForce }

func (u unfused) DerivFunc() func(y, dy []float64) { return u.Model.(DerivFuncer).DerivFunc() }
func (u unfused) VelocityIsMomentum()              {}
func (u unfused) HazardFree() bool                 { return hazardFree(u.Model) }
func (u unfused) CaptureSphere() (float64, bool)   { return captureSphere(u.Model) }
func (u unfused) pointForce() pointForce {
	return hiddenForce{u.Model.(pointForcer).pointForce()}
}

// noPointForce hides a model's point force altogether: Scatter then
// integrates it through osculating.deriv around its DerivFunc.
type noPointForce struct{ Model }

func (u noPointForce) DerivFunc() func(y, dy []float64) { return u.Model.(DerivFuncer).DerivFunc() }
func (u noPointForce) VelocityIsMomentum()              {}
func (u noPointForce) HazardFree() bool                 { return hazardFree(u.Model) }
func (u noPointForce) CaptureSphere() (float64, bool)   { return captureSphere(u.Model) }

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
// agree with derivPoint around a dynamic call of the same force, bit for
// bit: on random osculating states, with and without the coordinate time,
// and over whole events (impulse, error bars and evaluation counts), for
// every force listed in gen_fused.go. derivPoint itself agrees with
// osculating.deriv around the model's DerivFunc (the general form of the
// osculating equations, its along-track force part cancelled
// numerically) to rounding: 1e-13 relative to the size of each component
// over random states with β⃗ ⊥ p̂ to 1e-8 (as along a path; the cancelled
// part is up to e^10 times the remainder there, hence more than a few
// ulp).
func TestFusedBitForBit(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	// Component sizes below which a difference counts against the
	// component's natural scale: dζ/dσ ~ 1, dβ/dσ ~ b, dp/dσ ~ |Δp|.
	sizes := []float64{1, 10, 10, 10, 1e-3, 1e-3, 1e-3, 1e-3, 1}
	for _, m := range fusedModels() {
		in, err := Incoming(m.Mass(), 1.3, 10, vec.Vec3{})
		if err != nil {
			t.Fatal(err)
		}
		o := newOsculating(m, in, 10, in.P.Spatial().Norm()/m.Mass())
		f := o.rkFunc()
		pk := m.(pointForcer).pointForce()
		if pf, _ := m.(pointForcer); pf == nil || o.fused(pf.pointForce()) == nil {
			t.Fatalf("%s: no fused right-hand side", m.Name())
		}
		for _, n := range []int{8, 9} {
			Z, a, b, g := make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
			for it := 0; it < 2000; it++ {
				Z[zW] = math.Tanh(10 * (rng.Float64() - 0.5)) // ζ = tanh(w/2), |w| < 10
				for i := zB; i < zB+3; i++ {
					Z[i] = 10 * rng.NormFloat64()
				}
				for i := zP; i < zP+4; i++ {
					Z[i] = 0.1 * rng.NormFloat64()
				}
				if n == 9 {
					Z[8] = 100 * rng.NormFloat64()
				}
				// β⃗ ⊥ p̂ up to an integration error (an identity of the
				// variables, see osculating.go).
				c, s2, s3, _ := o.direction(Z)
				bp := Z[zB]*c + Z[zB+1]*s2 + Z[zB+2]*s3 - 1e-8*rng.NormFloat64()
				Z[zB], Z[zB+1], Z[zB+2] = Z[zB]-bp*c, Z[zB+1]-bp*s2, Z[zB+2]-bp*s3
				f(0, Z, a)
				o.derivPoint(hiddenForce{pk}, Z, b)
				o.deriv(Z, g)
				for i := range a {
					if a[i] != b[i] {
						t.Fatalf("%s: Z = %v: component %d fused %.17g, derivPoint %.17g", m.Name(), Z, i, a[i], b[i])
					}
					// osculating.deriv cancels the along-track part of
					// the force, of relative size |λ|/b in dβ⃗/dσ.
					lam, _ := alongTrack(10, Z[zW])
					sz := sizes[i]
					if i >= zB && i < zB+3 {
						sz *= 1 + math.Abs(lam)/10
					}
					if d := math.Abs(b[i] - g[i]); d > 1e-13*(math.Abs(g[i])+sz) {
						t.Fatalf("%s: Z = %v: component %d derivPoint %.17g, osculating.deriv %.17g", m.Name(), Z, i, b[i], g[i])
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
				t.Errorf("%s %+v: fused %v %v ± %v (%d evals), derivPoint %v %v ± %v (%d evals)", m.Name(), set,
					x.Status, x.Impulse, x.ImpulseErr, x.EventEvals, y.Status, y.Impulse, y.ImpulseErr, y.EventEvals)
			}
			// osculating.deriv: the same event within the error bars.
			z, err := Scatter(noPointForce{m}, in, set)
			if err != nil {
				t.Fatal(err)
			}
			for i := 0; i < 4; i++ {
				if d := math.Abs(z.Impulse[i] - x.Impulse[i]); z.Status != StatusScattered || d > x.ImpulseErr[i] {
					t.Errorf("%s %+v: Δp[%d] %.17g ± %.3g, with osculating.deriv %.17g", m.Name(), set, i, x.Impulse[i], x.ImpulseErr[i], z.Impulse[i])
				}
			}
		}
	}
}
