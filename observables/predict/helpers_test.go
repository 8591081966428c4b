package predict_test

import (
	"math"
	"math/cmplx"
	"sync"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
	"ricochet/observables/leading"
	"ricochet/observables/predict"
)

// config is a test configuration of our own: a model built at coupling
// scale λ (λ = 1 is the given coupling) and its quantities.
type config struct {
	name  string
	eps   float64 // |ε| at λ = 1
	build func(lambda float64) (integrate.Model, integrate.InState, predict.Quantities)
	// first is the library's closed-form first order at the same λ.
	first func(m integrate.Model, in integrate.InState, q predict.Quantities) (dp, da vec.Vec4)
}

func frameQ(in integrate.InState, gamma float64) predict.Quantities {
	return predict.Quantities{Gamma: gamma, V: math.Sqrt(1 - 1/(gamma*gamma)), B: in.ImpactParameter(),
		Mass: in.Mass(), Frame: observables.NewFrame(in.P, in.B)}
}

// emConfig is a probe of mass 1, charges q, g and rest-frame spin a1 past a
// root-Kerr source with charges Q, P and spin a2, at b = 1; root selects
// the root-Kerr probe (else a point charge or dyon, spinless).
func emConfig(name string, gamma, q, g, Q, P float64, a1, a2 vec.Vec3, root bool) config {
	c := complex(q, -g) * complex(Q, P)
	eps := cmplx.Abs(c)
	first := func(_ integrate.Model, in integrate.InState, q predict.Quantities) (dp, da vec.Vec4) {
		pr := leading.EMProbe{M: 1, Q: q.Charge, G: q.MagneticCharge, A: in.A}
		src := leading.EMSource{Q: q.SourceCharge, P: q.SourceMagneticCharge, A: q.SourceSpin}
		return leading.EMImpulse(pr, src, in.P.Scale(1/in.Mass()), in.B)
	}
	return config{name: name, eps: eps, first: first, build: func(l float64) (integrate.Model, integrate.InState, predict.Quantities) {
		src := em.RootKerr{Q: l * Q, P: l * P, A: a2}
		var m integrate.Model = &integrate.Charge{Field: src, M: 1, Q: q, G: g}
		if root {
			m = &integrate.RootKerr{Field: src, M: 1, Q: q, G: g}
		}
		in, _ := integrate.Incoming(1, gamma, 1, a1)
		if m.Dim() == 8 {
			in.A = vec.Vec4{}
		}
		qs := frameQ(in, gamma)
		qs.Charge, qs.MagneticCharge, qs.SourceCharge, qs.SourceMagneticCharge = q, g, l*Q, l*P
		qs.Eps = l * eps
		if real(c) < 0 {
			qs.Eps = -qs.Eps
		}
		qs.Electromagnetic = true
		qs.ProbeSpin, qs.SourceSpin = a1, a2
		if !root {
			qs.ProbeSpin = vec.Vec3{}
		}
		return m, in, qs
	}}
}

// gravConfig is a test mass past a Kerr–Newman–Taub–NUT source (mass M,
// NUT parameter N, spin a along +z, string along −z) at b = 1.
func gravConfig(name string, gamma, M, N, a float64) config {
	eps := math.Hypot(M, N)
	first := func(_ integrate.Model, in integrate.InState, q predict.Quantities) (dp, da vec.Vec4) {
		src := leading.GravSource{M: q.SourceMass, N: q.NUT, A: q.SourceSpin}
		return leading.Impulse1PM(leading.GravProbe{M: 1}, src, in.P.Scale(1/in.Mass()), in.B), vec.Vec4{}
	}
	return config{name: name, eps: eps, first: first, build: func(l float64) (integrate.Model, integrate.InState, predict.Quantities) {
		var metric spacetime.Metric = spacetime.KerrNewman{M: l * M, A: a}
		if N != 0 {
			metric = spacetime.KerrNewmanNUT{M: l * M, A: a, N: l * N, StringGauge: -1}
		}
		m := &integrate.Geodesic{Metric: metric, M: 1}
		in, _ := integrate.Incoming(1, gamma, 1, vec.Vec3{})
		in.A = vec.Vec4{}
		qs := frameQ(in, gamma)
		qs.SourceMass, qs.NUT, qs.SourceSpin = l*M, l*N, vec.Vec3{0, 0, a}
		qs.Eps = l * eps
		return m, in, qs
	}}
}

var (
	// Darwin's problem (Coulomb repulsion, v = 0.6), as in the built-in
	// coulomb-darwin scenario.
	coulomb = emConfig("coulomb", 1.25, 1, 0, 0.05, 0, vec.Vec3{}, vec.Vec3{}, false)
	// A dyonic root-Kerr probe past a dyonic root-Kerr source with
	// non-aligned spins (our own demonstration set-up).
	dyonic = emConfig("dyonic root-Kerr", 1.5, 1, 0.3, 0.05, 0.02, vec.Vec3{0.2, 0, 0.1}, vec.Vec3{0, 0.15, 0.3}, true)
	// A test mass past a Schwarzschild hole at v = 0.5.
	schwarzschild = gravConfig("schwarzschild", 1/math.Sqrt(0.75), 0.01, 0, 0)
	// A test mass past a Taub–NUT lens (as the nut-lens scenario).
	nut = gravConfig("taub-nut", 1.5, 0.01, 0.005, 0)
)

var (
	pointsMu    sync.Mutex
	pointsCache = map[string][]predict.Point{}
)

// points integrates the short scan of c once per test binary.
func points(t *testing.T, c config) []predict.Point {
	t.Helper()
	pointsMu.Lock()
	defer pointsMu.Unlock()
	if p, ok := pointsCache[c.name]; ok {
		return p
	}
	var pts []predict.Point
	for _, e := range predict.Couplings(c.eps, 0, 0) {
		m, in, q := c.build(e / c.eps)
		out, err := integrate.Scatter(m, in, nil)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		dp1, da1 := c.first(m, in, q)
		pts = append(pts, predict.NewPoint(e, q, out, dp1, da1))
	}
	pointsCache[c.name] = pts
	return pts
}
