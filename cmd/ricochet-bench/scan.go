package main

import (
	"math"
	"runtime"
	"sync"
	"sync/atomic"
	"time"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/integrate"
)

// ScanCouplings returns n couplings ε = qQ/(m b), log-spaced over
// [1e-3, 0.3]: the range of a typical convergence scan of P1-like events.
func ScanCouplings(n int) []float64 {
	eps := make([]float64, n)
	for k := range eps {
		f := 0.0
		if n > 1 {
			f = float64(k) / float64(n-1)
		}
		eps[k] = 1e-3 * math.Pow(300, f)
	}
	return eps
}

// ScanSettings are the settings of every scan event: the library's
// defaults, as `ricochet scan` uses them (tolerance 1e-13, automatic radius,
// error estimate from a second, looser integration per event).
var ScanSettings = integrate.Settings{}

// RunScan scatters one P1-like event per coupling (v = 0.6, b = 10, m = q =
// 1, Coulomb charge Q = ε b) with the given number of workers. The workers
// take the next event from a shared counter (dynamic assignment, so that a
// slow event does not leave a worker idle); every event has its own model
// and settings, so the results do not depend on the number of workers or
// on the order. It returns the outgoing momenta and the wall time.
func RunScan(eps []float64, workers int) ([]vec.Vec4, time.Duration, error) {
	const v, b = 0.6, 10.0
	in, err := integrate.Incoming(1, gammaOf(v), b, vec.Vec3{})
	if err != nil {
		return nil, 0, err
	}
	out := make([]vec.Vec4, len(eps))
	errs := make([]error, len(eps))
	var next atomic.Int64
	var wg sync.WaitGroup
	t0 := time.Now()
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1) - 1)
				if i >= len(eps) {
					return
				}
				set := ScanSettings
				m := &integrate.Charge{Field: em.Coulomb{Q: eps[i] * b}, M: 1, Q: 1}
				o, err := integrate.Scatter(m, in, &set)
				errs[i] = err
				out[i] = o.POut
			}
		}()
	}
	wg.Wait()
	el := time.Since(t0)
	for _, e := range errs {
		if e != nil {
			return nil, 0, e
		}
	}
	return out, el, nil
}

// Alloc is the allocation count of one probe model.
type Alloc struct {
	Model         string
	Mallocs       float64 // heap allocations per trajectory
	BytesPerTraj  float64
	EvalsPerTraj  int
	Trajectories  int
	ScatterStatus integrate.Status
}

// allocCases are the four probe models measured by Allocs, each on a
// representative event (tol 1e-12, R = 1e4 b, single run).
func allocCases() []struct {
	name string
	m    integrate.Model
	in   func() (integrate.InState, error)
} {
	rest := vec.Vec3{0, 0, 1} // spin a = 1 = b/10 along +z in the rest frame
	g := gammaOf(0.6)
	return []struct {
		name string
		m    integrate.Model
		in   func() (integrate.InState, error)
	}{
		{"Charge", &integrate.Charge{Field: em.Coulomb{Q: 1}, M: 1, Q: 1},
			func() (integrate.InState, error) { return integrate.Incoming(1, g, 10, vec.Vec3{}) }},
		{"BMT", &integrate.BMT{Field: em.Coulomb{Q: 1}, M: 1, Q: 1, Gyro: 2},
			func() (integrate.InState, error) { return integrate.Incoming(1, g, 10, rest) }},
		{"RootKerr", &integrate.RootKerr{Field: em.RootKerr{Q: 1, A: vec.Vec3{0, 0, 2}}, M: 1, Q: 1},
			func() (integrate.InState, error) { return integrate.Incoming(1, g, 10, rest) }},
		{"Geodesic", &integrate.Geodesic{Metric: spacetime.Schwarzschild(1), M: 1},
			func() (integrate.InState, error) { return integrate.Incoming(1, gammaOf(0.5), 30, vec.Vec3{}) }},
	}
}

// Allocs measures the heap allocations per trajectory (difference of
// runtime.MemStats.Mallocs over n scattering runs, divided by n) for each
// probe model, after one warm-up run.
func Allocs(n int) ([]Alloc, error) {
	var res []Alloc
	set := &integrate.Settings{Tol: 1e-12, Radius: 1e4, SingleRun: true}
	for _, c := range allocCases() {
		in, err := c.in()
		if err != nil {
			return nil, err
		}
		o, err := integrate.Scatter(c.m, in, set)
		if err != nil {
			return nil, err
		}
		var m0, m1 runtime.MemStats
		runtime.GC()
		runtime.ReadMemStats(&m0)
		for k := 0; k < n; k++ {
			o, _ = integrate.Scatter(c.m, in, set)
		}
		runtime.ReadMemStats(&m1)
		res = append(res, Alloc{
			Model:         c.name,
			Mallocs:       float64(m1.Mallocs-m0.Mallocs) / float64(n),
			BytesPerTraj:  float64(m1.TotalAlloc-m0.TotalAlloc) / float64(n),
			EvalsPerTraj:  o.Evals,
			Trajectories:  n,
			ScatterStatus: o.Status,
		})
	}
	return res, nil
}

// vecList is the list of outgoing momenta of a scan.
type vecList = []vec.Vec4
