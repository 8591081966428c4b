package main

import (
	"testing"

	"ricochet/background/vec"
	"ricochet/integrate"
)

// benchProblem times one scattering trajectory of p (single run, explicit
// radius 1e5 b, tol 1e-11: the configuration that reaches |Δχ| < 1e-11 on
// both problems in the comparison) and reports the evaluations per
// trajectory.
func benchProblem(b *testing.B, p Problem) {
	in, err := integrate.Incoming(1, gammaOf(p.V), p.B, vec.Vec3{})
	if err != nil {
		b.Fatal(err)
	}
	m := p.New()
	set := &integrate.Settings{Tol: 1e-11, Radius: 1e5, SingleRun: true}
	var o integrate.Outcome
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		o, _ = integrate.Scatter(m, in, set)
	}
	b.ReportMetric(float64(o.Evals), "evals/traj")
}

func BenchmarkP1(b *testing.B) { benchProblem(b, P1()) }
func BenchmarkP2(b *testing.B) { benchProblem(b, P2()) }
