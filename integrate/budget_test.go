package integrate

import (
	"math"
	"testing"
	"time"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/integrate/rk"
)

// budgetCase is one of the two reference problems of the performance
// harness (cmd/ricochet-bench, validate/peer): P1, a charge in a repulsive
// Coulomb field (v = 0.6, b = 10, qQ = 1), and P2, a Schwarzschild
// geodesic (v = 0.5, b = 30, M = 1), at tol 1e-10 and R = 1e3 b.
type budgetCase struct {
	name string
	m    Model
	v, b float64
}

func budgetCases() []budgetCase {
	return []budgetCase{
		{"P1", &Charge{Field: em.Coulomb{Q: 1}, M: 1, Q: 1}, 0.6, 10},
		{"P2", &Geodesic{Metric: spacetime.Schwarzschild(1), M: 1}, 0.5, 30},
	}
}

// BenchmarkBudget splits the cost of one integration (Settings.SingleRun)
// into its parts, timed in turn within each iteration so that a change of
// the machine's load affects all alike, on the thread's CPU clock where
// there is one (budgetClock):
//
//	model_ns/eval    the model's right-hand side (derivOf) on the states
//	                 the Runge–Kutta stages of the run evaluate
//	wrapper_ns/eval  the osculating variables around it (the driver's
//	                 right-hand side, osculating.rkFunc, minus the model;
//	                 for a fused right-hand side, fused.go, the model's
//	                 share inside it is not separable and the split is
//	                 nominal: the fused function minus the model alone)
//	stepper_ns/eval  everything else per stage evaluation: stage
//	                 combinations, error norm, step control, the per-step
//	                 hooks (weights, step bound, events, monitoring)
//	tail_ns/eval     one evaluation of the asymptotic tails, with their
//	                 spectral integration
//	total_ns/eval    the whole integration over all its evaluations
//
// The model and wrapper parts are timed in loops over the recorded stage
// inputs, where consecutive calls overlap in the processor; inside the
// integration each stage waits for the one before, so the latency they
// hide there is counted under stepper.
func BenchmarkBudget(b *testing.B) {
	for _, c := range budgetCases() {
		b.Run(c.name, func(b *testing.B) {
			in, err := Incoming(1, 1/sqrt(1-c.v*c.v), c.b, vec.Vec3{})
			if err != nil {
				b.Fatal(err)
			}
			set := (&Settings{Tol: 1e-10, Radius: 1e3, SingleRun: true}).defaults()
			dp1, da1 := FirstOrder(c.m, in, scaleNodes)
			r := newRun(c.m, in, set, dp1, da1)
			zs, ys := recordStages(r, set)
			o := r.osc
			Rabs := set.Radius * r.b
			dZ := make([]float64, o.dim)
			dy := make([]float64, o.dim)
			fz := o.rkFunc()
			yEnd := append([]float64(nil), r.y0...)
			var tTot, tWrap, tModel, tTail time.Duration
			var nRK, nTail, nAll int
			budgetLock()
			defer budgetUnlock()
			clk := clockCost()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				t0 := budgetClock()
				out := r.run(set.Tol, set.Radius, nil)
				t1 := budgetClock()
				for _, Z := range zs {
					fz(0, Z, dZ)
				}
				t2 := budgetClock()
				for _, y := range ys {
					o.f(y, dy)
				}
				t3 := budgetClock()
				in := r.tail.leg(o.f, r.mass, r.y0, r.in.P.Spatial().Unit(), true, Rabs)
				ou := r.tail.leg(o.f, r.mass, yEnd, spatial(yEnd, IP).Unit(), false, Rabs)
				t4 := budgetClock()
				tTot += t1 - t0 - clk
				tWrap += t2 - t1 - clk
				tModel += t3 - t2 - clk
				tTail += t4 - t3 - clk
				nRK += len(zs)
				nTail += in.Evals + ou.Evals
				nAll += out.Evals
			}
			ns := func(d time.Duration, n int) float64 { return float64(d.Nanoseconds()) / float64(n) }
			b.ReportMetric(ns(tModel, nRK), "model_ns/eval")
			b.ReportMetric(ns(tWrap-tModel, nRK), "wrapper_ns/eval")
			b.ReportMetric(ns(tTail, nTail), "tail_ns/eval")
			b.ReportMetric(ns(tTot-tWrap-tTail, nRK), "stepper_ns/eval")
			b.ReportMetric(ns(tTot, nAll), "total_ns/eval")
			b.ReportMetric(float64(nAll)/float64(b.N), "evals/run")
		})
	}
}

func BenchmarkTailLeg(b *testing.B) {
	c := budgetCases()[0]
	in, _ := Incoming(1, 1/sqrt(1-c.v*c.v), c.b, vec.Vec3{})
	set := (&Settings{Tol: 1e-10, Radius: 1e3, SingleRun: true}).defaults()
	dp1, da1 := FirstOrder(c.m, in, scaleNodes)
	r := newRun(c.m, in, set, dp1, da1)
	r.initial(set.Radius * r.b)
	for i := 0; i < b.N; i++ {
		r.tail.leg(r.osc.f, r.mass, r.y0, r.in.P.Spatial().Unit(), true, 1e4)
	}
}

func BenchmarkRunOnly(b *testing.B) {
	for _, c := range budgetCases() {
		b.Run(c.name, func(b *testing.B) {
			in, _ := Incoming(1, 1/sqrt(1-c.v*c.v), c.b, vec.Vec3{})
			set := (&Settings{Tol: 1e-10, Radius: 1e3, SingleRun: true}).defaults()
			dp1, da1 := FirstOrder(c.m, in, scaleNodes)
			r := newRun(c.m, in, set, dp1, da1)
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				r.run(set.Tol, set.Radius, nil)
			}
		})
	}
}

// recordStages returns the stage inputs of one run of r (the osculating
// variables Z and the model states y), recorded through a solver set up
// as run sets it up.
func recordStages(r *runner, set Settings) (zs, ys [][]float64) {
	r.initial(set.Radius * r.b)
	o := r.osc
	Z0 := make([]float64, o.dim)
	o.fromModel(r.y0, r.x0f, Z0)
	sv := rk.NewSolver(o.dim, &rk.Settings{Method: set.Method, RelTol: set.Tol, AbsTol: set.Tol,
		MaxSteps: set.MaxSteps, InitialStep: initialStep,
		Weights: o.weights(set.Tol), StepBound: o.stepBound(set.MaxStep, set.Radius*r.b), Predictive: true})
	Rabs := set.Radius * r.b
	ev := []rk.Event{{G: func(_ float64, Z []float64) float64 { return o.radius(Z) - Rabs },
		Direction: 1, Terminal: true, AtStep: true}}
	sv.Solve(func(_ float64, Z, dZ []float64) {
		zs = append(zs, append([]float64(nil), Z...))
		o.deriv(Z, dZ)
		ys = append(ys, append([]float64(nil), o.ym...))
	}, 0, Z0, 8*math.Log(set.Radius)+200, ev)
	return zs, ys
}

// clockCost returns the cost of one budgetClock reading, taken off each
// timed interval (call with the goroutine locked to its thread).
func clockCost() time.Duration {
	c0 := budgetClock()
	for k := 0; k < 1000; k++ {
		budgetClock()
	}
	return (budgetClock() - c0) / 1001
}
