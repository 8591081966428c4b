package main

import (
	"testing"

	"ricochet/background/vec"
	"ricochet/integrate"
)

// benchProblem times one scattering event of p with the given settings
// and reports the evaluations per event (with the error run, if any).
func benchProblem(b *testing.B, p Problem, set *integrate.Settings) {
	in, err := integrate.Incoming(1, gammaOf(p.V), p.B, vec.Vec3{})
	if err != nil {
		b.Fatal(err)
	}
	m := p.New()
	var o integrate.Outcome
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		o, _ = integrate.Scatter(m, in, set)
	}
	b.ReportMetric(float64(o.EventEvals), "evals/event")
}

// Single trajectories (no error estimate) at tol 1e-10 and R = 1e3 b,
// which reach |Δχ| < 1e-11 on both problems in the comparison of
// validate/peer.
func BenchmarkP1(b *testing.B) {
	benchProblem(b, P1(), &integrate.Settings{Tol: 1e-10, Radius: 1e3, SingleRun: true})
}
func BenchmarkP2(b *testing.B) {
	benchProblem(b, P2(), &integrate.Settings{Tol: 1e-10, Radius: 1e3, SingleRun: true})
}

// The full event with its error estimate, at the same tolerance and
// radius.
func BenchmarkP1Event(b *testing.B) {
	benchProblem(b, P1(), &integrate.Settings{Tol: 1e-10, Radius: 1e3})
}
func BenchmarkP2Event(b *testing.B) {
	benchProblem(b, P2(), &integrate.Settings{Tol: 1e-10, Radius: 1e3})
}
