package main

import (
	"fmt"
	"math"
	"sort"
	"time"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/validate/exact"
)

// Problem is one benchmark scattering problem with its exact deflection.
// The probe mass is 1 throughout (G = c = 1).
type Problem struct {
	Name string
	V, B float64 // speed at infinity and impact parameter
	// New returns a fresh model (models may hold work storage, so each
	// goroutine needs its own).
	New func() integrate.Model
	// Exact returns the exact deflection angle χ > 0 from validate/exact.
	Exact func() (float64, error)
}

// P1 is the relativistic point charge in a repulsive Coulomb field, qQ = 1
// (Gaussian units), v = 0.6, b = 10; exact χ from Darwin (1913) with
// ε = qQ/(m b) = 0.1.
func P1() Problem {
	const v, b = 0.6, 10.0
	return Problem{
		Name: "P1", V: v, B: b,
		New: func() integrate.Model {
			return &integrate.Charge{Field: em.Coulomb{Q: 1}, M: 1, Q: 1}
		},
		Exact: func() (float64, error) {
			s, err := exact.Darwin(v, 1/(1*b))
			return s.Chi, err
		},
	}
}

// P2 is the timelike geodesic of a Schwarzschild black hole of mass M = 1
// in Cartesian Kerr–Schild coordinates, v = 0.5, b = 30; exact χ from the
// radial quadrature of exact.Schwarzschild.
func P2() Problem {
	const v, b, M = 0.5, 30.0, 1.0
	return Problem{
		Name: "P2", V: v, B: b,
		New: func() integrate.Model {
			return &integrate.Geodesic{Metric: spacetime.Schwarzschild(M), M: 1}
		},
		Exact: func() (float64, error) {
			s, err := exact.Schwarzschild(v, b, M)
			return s.Chi, err
		},
	}
}

// problemByName returns P1 or P2.
func problemByName(name string) (Problem, error) {
	switch name {
	case "P1", "p1", "1":
		return P1(), nil
	case "P2", "p2", "2":
		return P2(), nil
	}
	return Problem{}, fmt.Errorf("unknown problem %q (want P1 or P2)", name)
}

// gammaOf returns the Lorentz factor of speed v.
func gammaOf(v float64) float64 { return 1 / math.Sqrt(1-v*v) }

// Deflection returns the angle between the spatial parts of p_in and
// p_out, atan2(|p⃗_in × p⃗_out|, p⃗_in·p⃗_out) (accurate for small angles).
func Deflection(in, out vec.Vec4) float64 {
	a, b := in.Spatial(), out.Spatial()
	return math.Atan2(a.Cross(b).Norm(), a.Dot(b))
}

// DeflectionErr converts the impulse error estimate of an outcome into an
// error estimate of χ: the transverse change of the outgoing direction,
// |δΔp⃗|/|p⃗_out|, bounded by the norm of the component-wise estimate.
func DeflectionErr(o integrate.Outcome) float64 {
	e := o.ImpulseErr.Spatial().Norm()
	return e / o.POut.Spatial().Norm()
}

// Run is the result of one benchmarked configuration.
type Run struct {
	Problem  string
	Tol, R   float64 // tolerance and start/stop radius in units of b
	Evals    int
	Median   time.Duration // median wall time per trajectory
	Chi      float64
	ChiExact float64
	Status   integrate.Status
}

// AbsErr returns |χ − χ_exact|.
func (r Run) AbsErr() float64 { return math.Abs(r.Chi - r.ChiExact) }

// Measure scatters the problem once per repeat with a single integration
// (Settings.SingleRun, explicit radius, so Outcome.Evals is the whole cost)
// and returns the result with the median wall time.
func Measure(p Problem, tol, R float64, repeats int) (Run, error) {
	return measure(p, tol, R, repeats, true)
}

// MeasureEvent is Measure for the full event with its error estimate (the
// main integration and its variations, as the command runs it); Evals is
// then that of the main integration alone.
func MeasureEvent(p Problem, tol, R float64, repeats int) (Run, error) {
	return measure(p, tol, R, repeats, false)
}

func measure(p Problem, tol, R float64, repeats int, single bool) (Run, error) {
	if repeats < 1 {
		repeats = 1
	}
	chiEx, err := p.Exact()
	if err != nil {
		return Run{}, err
	}
	in, err := integrate.Incoming(1, gammaOf(p.V), p.B, vec.Vec3{})
	if err != nil {
		return Run{}, err
	}
	m := p.New()
	set := &integrate.Settings{Tol: tol, Radius: R, SingleRun: single}
	times := make([]time.Duration, repeats)
	var o integrate.Outcome
	for k := range times {
		t0 := time.Now()
		o, err = integrate.Scatter(m, in, set)
		times[k] = time.Since(t0)
		if err != nil {
			return Run{}, err
		}
	}
	run := Run{Problem: p.Name, Tol: tol, R: R, Evals: o.Evals, Median: median(times),
		ChiExact: chiEx, Status: o.Status, Chi: math.NaN()}
	if o.Status == integrate.StatusScattered {
		run.Chi = Deflection(in.P, o.POut)
	}
	return run, nil
}

func median(d []time.Duration) time.Duration {
	s := append([]time.Duration(nil), d...)
	sort.Slice(s, func(i, j int) bool { return s[i] < s[j] })
	n := len(s)
	if n%2 == 1 {
		return s[n/2]
	}
	return (s[n/2-1] + s[n/2]) / 2
}

// Silent is one row of the "no silent χ ≈ 0" check: a full Scatter with its
// error estimate at a loose tolerance and a large radius.
type Silent struct {
	Problem        string
	Tol, R         float64
	Evals          int // of the main run
	Chi, ChiErr    float64
	ChiExact       float64
	Status         integrate.Status
	OK             bool
	Verdict        string
	ZeroDeflection bool
}

// ReadoutFloor is the absolute rounding floor of χ read from the asymptotic
// momenta: the tails and the angle are formed from O(1) momentum components,
// so a few hundred ulp of 1 (1e-13) is the resolution below which the error
// estimate cannot be expected to bound the difference.
const ReadoutFloor = 1e-13

// CheckSilent runs the full Scatter (with the error estimate) and judges
// the outcome: a scattered result must agree with the exact χ within its
// own error estimate (plus ReadoutFloor) and must not be a near-zero
// deflection; any other status is an honest outcome.
func CheckSilent(p Problem, tol, R float64) (Silent, error) {
	chiEx, err := p.Exact()
	if err != nil {
		return Silent{}, err
	}
	in, err := integrate.Incoming(1, gammaOf(p.V), p.B, vec.Vec3{})
	if err != nil {
		return Silent{}, err
	}
	o, err := integrate.Scatter(p.New(), in, &integrate.Settings{Tol: tol, Radius: R})
	if err != nil {
		return Silent{}, err
	}
	s := Silent{Problem: p.Name, Tol: tol, R: R, Evals: o.Evals, ChiExact: chiEx, Status: o.Status,
		Chi: math.NaN(), ChiErr: math.NaN()}
	if o.Status != integrate.StatusScattered {
		s.OK, s.Verdict = true, "reported:"+o.Status.String()
		return s, nil
	}
	s.Chi = Deflection(in.P, o.POut)
	s.ChiErr = DeflectionErr(o)
	// "≈ 0": less than half the true deflection (the step jumped over the
	// encounter).
	s.ZeroDeflection = math.Abs(s.Chi) < chiEx/2
	within := math.Abs(s.Chi-chiEx) <= s.ChiErr+ReadoutFloor
	switch {
	case s.ZeroDeflection:
		s.Verdict = "SILENT-ZERO"
	case !within:
		s.Verdict = "ERROR-UNDERESTIMATED"
	default:
		s.OK, s.Verdict = true, "ok"
	}
	return s, nil
}
