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

// BenchmarkTarget: single trajectories at the configurations that
// validate/peer/compare.sh selected for each target accuracy |Δχ| in the
// run of README.md's Performance table (2026-12-03), with the speed target
// as a metric: a third of the C peer's wall time in that run (target_µs),
// against ns/op here. Evaluation counts are exact; the time depends on the
// machine and its load.
func BenchmarkTarget(b *testing.B) {
	cases := []struct {
		name   string
		p      Problem
		tol, R float64
		peerUS float64 // the peer's median wall time in that run
	}{
		{"P1/1e-10", P1(), 1e-10, 1e5, 36.0},
		{"P1/1e-11", P1(), 1e-10, 1e2, 44.2},
		{"P1/1e-12", P1(), 3e-12, 1e6, 61.6},
		{"P2/1e-10", P2(), 1e-9, 1e5, 34.0},
		{"P2/1e-11", P2(), 1e-10, 1e4, 41.4},
		{"P2/1e-12", P2(), 1e-11, 1e6, 56.4},
	}
	for _, c := range cases {
		b.Run(c.name, func(b *testing.B) {
			b.ReportMetric(c.peerUS/3, "target_µs")
			benchProblem(b, c.p, &integrate.Settings{Tol: c.tol, Radius: c.R, SingleRun: true})
		})
	}
}
