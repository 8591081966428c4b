package integrate

import (
	"math"
	"runtime/debug"
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// TestAllocationsPerEvent: an event allocates a fixed set of buffers (the
// solver, the osculating wrapper, the tails), never per step: the count of
// allocations of a Scatter is the same at a loose and a tight tolerance
// (2–4× more steps), for every model, and stays below a small bound.
// A model value converted to an interface or a scratch value passed
// through one escapes to the heap on every evaluation; this catches it.
func TestAllocationsPerEvent(t *testing.T) {
	spin := vec.Vec3{0.1, -0.2, 0.2}
	kn := spacetime.KerrNewman{M: 0.01, A: 0.4}
	rk := em.RootKerr{Q: 0.01, A: vec.Vec3{0, 0, 0.3}}
	cases := []struct {
		m    Model
		spin bool
	}{
		{&Charge{Field: em.Coulomb{Q: 0.05}, M: 1, Q: 1}, false},
		{&BMT{Field: em.Coulomb{Q: 0.01}, M: 1, Q: 1, G: 2}, true},
		{&RootKerr{Field: rk, M: 1, Q: 1}, true},
		{&RootKerrBody{Field: rk, M: 1, Q: 1}, true},
		{&Geodesic{Metric: spacetime.Schwarzschild(0.02), M: 1}, false},
		{&Geodesic{Metric: spacetime.KerrNewmanNUT{M: 0.01, A: 0.4, Q: 0.005, N: 0.01}, M: 1}, false},
		{&Dixon{Metric: kn, M: 1, Gyro: 2}, true},
		{&Dixon{Metric: kn, M: 1, Gyro: 2, SSC: OhashiKyrianSemerak}, true},
		{&Dixon{Metric: kn, M: 1, Gyro: 2, SSC: Pirani}, true},
		{&KerrProbe{Metric: kn, M: 1}, true},
		{NewKerrDixon(kn, 1, false), true},
		{&KerrProbe{Metric: spacetime.KerrNewmanNUT{M: 0.01, A: 0.4, N: 0.01, StringGauge: 1}, M: 1}, true},
		{NewKerrDixon(spacetime.KerrNewmanNUT{M: 0.01, A: 0.4, N: 0.01, StringGauge: 1}, 1, false), true},
	}
	// Bound: what the event's buffers take today (41–44), with room for a
	// few more; a per-step allocation adds hundreds.
	const bound = 64
	// The collector is off while the events are counted: a collection
	// empties the pools of work storage (sync.Pool), and the next event
	// allocates it again.
	defer debug.SetGCPercent(debug.SetGCPercent(-1))
	for _, c := range cases {
		var s vec.Vec3
		if c.spin {
			s = spin
		}
		in, _ := Incoming(1, speedGamma(0.6), 1, s)
		var steps [2]int
		var allocs [2]float64
		for i, tol := range []float64{1e-8, 1e-12} {
			set := &Settings{Tol: tol}
			var o Outcome
			// The least of three counts (see slack below).
			allocs[i] = math.Inf(1)
			for k := 0; k < 3; k++ {
				allocs[i] = math.Min(allocs[i], testing.AllocsPerRun(1, func() { o, _ = Scatter(c.m, in, set) }))
			}
			steps[i] = o.Evals
		}
		t.Logf("%s: %v allocations per event at %d and %d evaluations", c.m.Name(), allocs, steps[0], steps[1])
		// slack: the count includes what other goroutines allocate
		// meanwhile (measured with the collector off: 1 or 2 more in
		// about 1 % of single events, none of them in Scatter's frames);
		// an allocation per step adds one per step, and the tighter
		// tolerance takes 25 or more steps more than the looser.
		const slack = 2
		if math.Abs(allocs[0]-allocs[1]) > slack || allocs[1] > bound {
			t.Errorf("%s: %v allocations per event at %d and %d evaluations: want the same count (± %d), at most %d", c.m.Name(), allocs, steps[0], steps[1], slack, bound)
		}
	}
}
