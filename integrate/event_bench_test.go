package integrate

import (
	"testing"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// BenchmarkEvent measures the whole event with its error estimate (two
// integrations) on a Coulomb and a Schwarzschild case of the coverage test
// at tolerances 1e-10 and 1e-12, reporting the evaluations per event and
// the share of the second, looser run.
func BenchmarkEvent(b *testing.B) {
	in, _ := Incoming(1, speedGamma(0.6), 1, vec.Vec3{})
	models := []struct {
		name string
		m    Model
	}{
		{"Coulomb", &Charge{Field: em.Coulomb{Q: 0.05}, M: 1, Q: 1}},
		{"Schwarzschild", &Geodesic{Metric: spacetime.Schwarzschild(0.02), M: 1}},
	}
	for _, c := range models {
		for _, tol := range []float64{1e-10, 1e-12} {
			b.Run(c.name+"/"+map[float64]string{1e-10: "1e-10", 1e-12: "1e-12"}[tol], func(b *testing.B) {
				var o Outcome
				for i := 0; i < b.N; i++ {
					o, _ = Scatter(c.m, in, &Settings{Tol: tol})
				}
				b.ReportMetric(float64(o.EventEvals), "evals/event")
				b.ReportMetric(float64(o.Evals), "evals/main")
			})
		}
	}
}
