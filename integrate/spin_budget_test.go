package integrate

import (
	"math"
	"testing"
	"time"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// BenchmarkSpinBudget splits the cost per right-hand-side evaluation of
// the events of BenchmarkSpinCostRatios (main integration only, default
// tolerance) into parts, on the thread's CPU clock (budgetClock), timed
// in loops over the stage inputs of the run as BenchmarkBudget does:
//
//	geometry_ns/eval  metric, Christoffels and curvature at the event
//	                  (Dixon: bodyGeometry; geodesic: none separately)
//	model_ns/eval     the whole right-hand side (geometry included)
//	wrapper_ns/eval   the osculating variables around it
//	stepper_ns/eval   the rest of the integration per evaluation
//	total_ns/eval     the integration over all its evaluations
func BenchmarkSpinBudget(b *testing.B) {
	spin := vec.Vec3{0.1, -0.2, 0.2}
	kerr := spacetime.Kerr(0.01, 0.4)
	kn := spacetime.KerrNewman{M: 0.01, A: 0.4, Q: 0.005}
	ktn := spacetime.KerrNewmanNUT{M: 0.01, A: 0.4, Q: 0.005, N: 0.01}
	for _, c := range []struct {
		name string
		m    Model
		s    vec.Vec3
	}{
		{"geodesic-kerr", &Geodesic{Metric: kerr, M: 1}, vec.Vec3{}},
		{"dixon-kerr", &Dixon{Metric: kerr, M: 1, Gyro: 2}, spin},
		{"dixon-kerr-quadrupole", &Dixon{Metric: kerr, M: 1, Gyro: 2, CES2: 1}, spin},
		{"dixon-kn", &Dixon{Metric: kn, M: 1, Gyro: 2}, spin},
		{"dixon-ktn", &Dixon{Metric: ktn, M: 1, Gyro: 2}, spin},
	} {
		b.Run(c.name, func(b *testing.B) {
			_, in := spinBenchEvent(c.m, c.s)
			set := (&Settings{SingleRun: true}).defaults()
			dp1, da1 := FirstOrder(c.m, in, scaleNodes)
			set.Radius = math.Min(1e9, 1e3*math.Max(1, dp1.Spatial().Norm()/in.P.Spatial().Norm()))
			r := newRun(c.m, in, set, dp1, da1)
			zs, ys := recordStages(r, set)
			o := r.osc
			dZ := make([]float64, o.dim)
			dy := make([]float64, o.dim)
			d, _ := c.m.(*Dixon)
			var tTot, tWrap, tModel, tGeo time.Duration
			var nRK, nAll int
			budgetLock()
			defer budgetUnlock()
			clk := clockCost()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				t0 := budgetClock()
				out := r.run(set.Tol, set.Radius, nil)
				t1 := budgetClock()
				for _, Z := range zs {
					o.deriv(Z, dZ)
				}
				t2 := budgetClock()
				for _, y := range ys {
					o.f(y, dy)
				}
				t3 := budgetClock()
				if d != nil {
					for _, y := range ys {
						d.local(y)
					}
				}
				t4 := budgetClock()
				tTot += t1 - t0 - clk
				tWrap += t2 - t1 - clk
				tModel += t3 - t2 - clk
				tGeo += t4 - t3 - clk
				nRK += len(zs)
				nAll += out.Evals
			}
			ns := func(d time.Duration, n int) float64 { return float64(d.Nanoseconds()) / float64(n) }
			b.ReportMetric(ns(tGeo, nRK), "geometry_ns/eval")
			b.ReportMetric(ns(tModel, nRK), "model_ns/eval")
			b.ReportMetric(ns(tWrap-tModel, nRK), "wrapper_ns/eval")
			b.ReportMetric(ns(tTot-tWrap, nRK), "stepper_ns/eval")
			b.ReportMetric(ns(tTot, nAll), "total_ns/eval")
			b.ReportMetric(float64(nAll)/float64(b.N), "evals/run")
		})
	}
}
