package integrate

import (
	"math"
	"math/rand"
	"testing"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// hazardOnly hides the optional interfaces of a Geodesic but for its
// right-hand side, point force and velocity, so that Scatter watches it through Hazard
// on every step, as it does for models without a capture sphere.
type hazardOnly struct{ g *Geodesic }

func (h hazardOnly) Name() string                         { return h.g.Name() }
func (h hazardOnly) Dim() int                             { return h.g.Dim() }
func (h hazardOnly) Mass() float64                        { return h.g.Mass() }
func (h hazardOnly) Deriv(y, dy []float64)                { h.g.Deriv(y, dy) }
func (h hazardOnly) DerivFunc() func(y, dy []float64)     { return h.g.DerivFunc() }
func (h hazardOnly) VelocityIsMomentum()                  {}
func (h hazardOnly) Energy(y []float64) float64           { return h.g.Energy(y) }
func (h hazardOnly) EnergyExact() bool                    { return true }
func (h hazardOnly) Normalize(y []float64, a2 float64)    { h.g.Normalize(y, a2) }
func (h hazardOnly) Hazard(y0, y1 []float64) Status       { return h.g.Hazard(y0, y1) }
func (h hazardOnly) MassShell(y []float64) float64        { return h.g.MassShell(y) }
func (h hazardOnly) FailureStatus(y []float64) Status     { return h.g.FailureStatus(y) }
func (h hazardOnly) AngularMomentumZ(y []float64) float64 { return h.g.AngularMomentumZ(y) }
func (h hazardOnly) pointForce() pointForce               { return h.g.pointForce() }
func (h hazardOnly) ConservesJz() bool                    { return h.g.ConservesJz() }

// TestCaptureSphereIsHazard checks the contract of Geodesic.CaptureSphere
// against Geodesic.Hazard (the general horizon, disk, ring and string
// checks) on random segments near the horizon of Schwarzschild and of
// Reissner–Nordström with and without a horizon: on segments starting
// outside the sphere, captured exactly when the end point lies within it.
func TestCaptureSphereIsHazard(t *testing.T) {
	rng := rand.New(rand.NewSource(1))
	for _, m := range []spacetime.KerrNewman{spacetime.Schwarzschild(1), spacetime.ReissnerNordstrom(1, 0.6), spacetime.ReissnerNordstrom(1, 1.2)} {
		g := &Geodesic{Metric: m, M: 1}
		rs, ok := g.CaptureSphere()
		if !ok {
			t.Fatalf("%+v: no capture sphere", m)
		}
		y0, y1 := make([]float64, 8), make([]float64, 8)
		for k := 0; k < 20000; k++ {
			for i := 1; i < 4; i++ {
				y0[IX+i] = 4 * (rng.Float64() - 0.5)
				y1[IX+i] = 4 * (rng.Float64() - 0.5)
			}
			if radius(y0) < rs {
				continue
			}
			in := radius(y1) < rs
			want := StatusRunning
			if in {
				want = StatusCaptured
			}
			if got := g.Hazard(y0, y1); got != want {
				t.Fatalf("%+v: segment %v → %v (sphere %g): Hazard %v, sphere says %v", m, y0[1:4], y1[1:4], rs, got, want)
			}
		}
	}
	// Spinning members have a disk and a ring: no sphere.
	if _, ok := (&Geodesic{Metric: spacetime.Kerr(1, 0.5), M: 1}).CaptureSphere(); ok {
		t.Error("Kerr a = 0.5: capture sphere, want none")
	}
}

// TestCaptureSphereScatter: Scatter with the capture sphere gives the
// outcomes of Scatter watching Hazard on every step, bit for bit for the
// scattered paths (the sphere changes only how capture is detected) and
// the same status for the captured ones (TestGeodesicCapture's cases,
// captured by the exact orbit equation).
func TestCaptureSphereScatter(t *testing.T) {
	seen := map[Status]int{}
	for _, c := range []struct{ v, mu, q float64 }{{0.5, 0.03, 0}, {0.5, 0.3, 0}, {0.9, 0.2, 0}, {0.5, 1, 0}, {0.6, 0.1, 0.05}, {0.3, 0.02, 0}} {
		m := spacetime.ReissnerNordstrom(c.mu, c.q)
		in, _ := Incoming(1, speedGamma(c.v), 1, vec.Vec3{})
		for _, set := range []*Settings{nil, {Tol: 1e-8, Radius: 1e4}} {
			a, err := Scatter(&Geodesic{Metric: m, M: 1}, in, set)
			if err != nil {
				t.Fatal(err)
			}
			b, err := Scatter(hazardOnly{&Geodesic{Metric: m, M: 1}}, in, set)
			if err != nil {
				t.Fatal(err)
			}
			if a.Status != b.Status {
				t.Fatalf("%+v: status %v with the sphere, %v with Hazard", c, a.Status, b.Status)
			}
			seen[a.Status]++
			if a.Status != StatusScattered {
				continue
			}
			if a.Impulse != b.Impulse || a.Evals != b.Evals || !same4(a.ImpulseErr, b.ImpulseErr) {
				t.Errorf("%+v: sphere %v (%d evals), Hazard %v (%d evals)", c, a.Impulse, a.Evals, b.Impulse, b.Evals)
			}
		}
	}
	if seen[StatusScattered] < 6 || seen[StatusCaptured] < 4 {
		t.Errorf("outcomes %v, want 6 scattered and 4 captured", seen)
	}
}

func same4(a, b vec.Vec4) bool {
	for i := range a {
		if a[i] != b[i] && !(math.IsNaN(a[i]) && math.IsNaN(b[i])) {
			return false
		}
	}
	return true
}
