package integrate

import (
	"testing"
	"time"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// Cost of spinning-body events relative to their spinless and NUT-free
// counterparts, at the same (default) tolerance and the same kinematics:
// one Scatter each (main run plus the two error-estimate runs), generic
// orientation, M/b = 0.01, γ = 1.25. The targets (an MPD event in Kerr at
// most 3× a geodesic event; a Kerr–Taub–NUT event at most 2× a
// Kerr–Newman event) are reported as metrics, never asserted; the times
// are thread CPU times (timeEvents).

func spinBenchEvent(m Model, spin vec.Vec3) (Model, InState) {
	in, _ := IncomingDir(1, 1.25, 1, genericDirs[1][0], genericDirs[1][1], spin)
	return m, in
}

// timeEvents returns the mean time of one Scatter of each model over
// rounds interleaved runs, on the thread's CPU clock (budgetClock; the
// caller locks the goroutine to its thread), which the other jobs of a
// shared machine do not inflate; interleaving evens out what remains
// (cache and frequency effects of the load).
func timeEvents(rounds int, ms []Model, ins []InState) []time.Duration {
	out := make([]time.Duration, len(ms))
	for r := 0; r < rounds; r++ {
		for i, m := range ms {
			t0 := budgetClock()
			Scatter(m, ins[i], nil)
			out[i] += budgetClock() - t0
		}
	}
	for i := range out {
		out[i] /= time.Duration(rounds)
	}
	return out
}

// BenchmarkSpinCostRatios reports dixon/geodesic (Kerr, a = 0.4 b, probe
// spin 0.3 b in a generic direction) and KTN/KN (the Dixon body in
// Kerr–Taub–NUT with N = M against Kerr–Newman with the same M, a, Q), and
// the same ratio for geodesics, as metrics; ns/op is that of the Dixon
// event in Kerr.
func BenchmarkSpinCostRatios(b *testing.B) {
	spin := vec.Vec3{0.1, -0.2, 0.2}
	kerr := spacetime.Kerr(0.01, 0.4)
	kn := spacetime.KerrNewman{M: 0.01, A: 0.4, Q: 0.005}
	ktn := spacetime.KerrNewmanNUT{M: 0.01, A: 0.4, Q: 0.005, N: 0.01}
	var ms []Model
	var ins []InState
	for _, c := range []struct {
		m Model
		s vec.Vec3
	}{
		{&Dixon{Metric: kerr, M: 1, Gyro: 2}, spin},
		{&Geodesic{Metric: kerr, M: 1}, vec.Vec3{}},
		{&Dixon{Metric: kn, M: 1, Gyro: 2}, spin},
		{&Dixon{Metric: ktn, M: 1, Gyro: 2}, spin},
		{&Geodesic{Metric: kn, M: 1}, vec.Vec3{}},
		{&Geodesic{Metric: ktn, M: 1}, vec.Vec3{}},
	} {
		m, in := spinBenchEvent(c.m, c.s)
		ms, ins = append(ms, m), append(ins, in)
	}
	var sum []time.Duration
	budgetLock()
	defer budgetUnlock()
	b.ResetTimer()
	for b.Loop() {
		t := timeEvents(1, ms, ins)
		if sum == nil {
			sum = make([]time.Duration, len(t))
		}
		for i := range t {
			sum[i] += t[i]
		}
	}
	b.StopTimer()
	// The evaluation counts are deterministic: they separate the cost per
	// evaluation (the geometry) from the number of steps.
	evals := make([]float64, len(ms))
	for i, m := range ms {
		out, _ := Scatter(m, ins[i], nil)
		evals[i] = float64(out.Evals)
	}
	b.ReportMetric(evals[0]/evals[1], "evals-dixon/geodesic-kerr")
	b.ReportMetric(evals[3]/evals[2], "evals-ktn/kn-dixon")
	r := func(i, j int) float64 { return float64(sum[i]) / float64(sum[j]) }
	b.ReportMetric(r(0, 1), "dixon/geodesic-kerr")
	b.ReportMetric(r(3, 2), "ktn/kn-dixon")
	b.ReportMetric(r(5, 4), "ktn/kn-geodesic")
	b.ReportMetric(float64(sum[0].Microseconds())/float64(b.N), "µs/dixon-kerr")
	b.ReportMetric(float64(sum[1].Microseconds())/float64(b.N), "µs/geodesic-kerr")
	b.ReportMetric(float64(sum[2].Microseconds())/float64(b.N), "µs/dixon-kn")
	b.ReportMetric(float64(sum[3].Microseconds())/float64(b.N), "µs/dixon-ktn")
}
