package integrate

import (
	"fmt"
	"math"

	"ricochet/background/vec"
	"ricochet/integrate/rk"
)

// LooseFactor is the factor by which the tolerance of the second
// integration of an event is loosened: the event is reported from the run
// at the requested tolerance, and the change to the looser run bounds its
// error (see Outcome.ImpulseErr). Measured with the angle clock
// (TestErrorCoverage, with aprioriFactor 0.06): 10 covers 99.3 % (Coulomb)
// and 99.8 % (Schwarzschild) of the exact cases' components at a median
// pessimism of 11.5 and 12.6; 5 covers only 98.8 % of the Coulomb ones
// (98.0 % with the factor 0.03), 3 97.3 %. The looser run costs about 0.8
// of the first.
const LooseFactor = 10

// BoundSigmas converts the error bars of an Outcome, which bound the
// error, into standard errors for least-squares weights: σ = bar/BoundSigmas.
// The measured median of bar/actual is 11–13 (TestErrorCoverage); for a
// normal error the median of |x| is 0.67σ, so the bars sit near 7–8σ, and
// a bound met in 99 % of cases would be 2.6σ: 4 does not understate the
// errors where they are normal-like (it overstates them about twofold in
// the median since the looser run was moved from 5 to 10 times the
// tolerance, which keeps the fits' uncertainties on the safe side).
const BoundSigmas = 4

// LooseRadius is the factor by which the start and stop radius of the
// second integration of an event is enlarged (see Outcome.ImpulseErr).
const LooseRadius = 2

// Settings controls Scatter. The zero value (or nil) gives the defaults.
type Settings struct {
	// Method is the Runge–Kutta pair; nil means rk.DormandPrince853().
	Method *rk.Tableau
	// Tol is the integrator's relative and absolute tolerance in the
	// reparametrised variables; 0 means 1e-13.
	Tol float64
	// Radius is the start and stop radius in units of the impact
	// parameter. 0 means automatic: R/b = 1e3·max(1, θ₁), capped at 1e9,
	// where θ₁ = |Δp₁|/|p⃗_in| is the first-order deflection from a coarse
	// FirstOrder estimate. With the default third-order tails the
	// truncation error is at most 0.025 min(1,θ₁)² (max(1,θ₁) b/R)⁴
	// relative (measured on Darwin's exact Coulomb deflection and the
	// Schwarzschild quadrature, v = 0.1 … 0.99; truncBound), below 1e-14
	// at the automatic radius; the cost hardly depends on R (the angle
	// clock, osculating.go).
	Radius float64
	// MaxStep bounds the step in the angle clock σ (dτ/dσ = r²/(bK), the
	// swept angle of the straight line; osculating.go), so that the
	// encounter, which spans Δσ of order one, is always resolved; 0 means
	// 0.5.
	MaxStep float64
	// MaxSteps bounds the number of attempted steps per integration; 0
	// means 200000.
	MaxSteps int
	// TailOrder is the order in the coupling to which the asymptotic
	// tails before the start and after the stop are computed (tail.go):
	// 1 is the first-order straight-line tail, each further order costs
	// TailNodes more evaluations per tail. The truncation error falls like
	// (b/R)^(TailOrder+1) (measured: see Radius). 0 means automatic: the
	// lowest order from 1 to 3 whose truncation bound (truncBound, from
	// the coarse first-order deflection) at the radius is at most Tol,
	// else 3; at the automatic radius that is 3, and from R of about 1e5 b
	// on, which the angle clock makes cheap, 1 or 2 (16 or 32 evaluations
	// less than 3).
	TailOrder int
	// TailNodes is the number of Gauss–Legendre nodes for each first-order
	// tail; 0 means 8 (the tail integrand is smooth on the mapped half line
	// from R ≥ 10 b: 6 to 64 nodes agree to 2e-15 relative in the impulse
	// for a Coulomb and a root-Kerr source).
	TailNodes int
	// CaptureRadius: a path coming closer to the centre than this many b
	// is reported as captured; 0 means 1e-6.
	CaptureRadius float64
	// SingleRun skips the error estimate: Scatter then integrates once and
	// leaves the error fields NaN (the estimate costs a second, looser
	// integration, about 0.8 of the first).
	SingleRun bool
	// Observe, if non-nil, receives every accepted step of the main run:
	// the angle clock σ and the state y (not to be retained).
	Observe func(s float64, y []float64)
}

func (s *Settings) defaults() Settings {
	var d Settings
	if s != nil {
		d = *s
	}
	if d.Method == nil {
		d.Method = defaultMethod
	}
	if d.Tol == 0 {
		d.Tol = 1e-13
	}
	if d.MaxStep == 0 {
		d.MaxStep = 0.5
	}
	if d.MaxSteps == 0 {
		d.MaxSteps = 200000
	}
	if d.TailNodes == 0 {
		d.TailNodes = 8
	}
	if d.CaptureRadius == 0 {
		d.CaptureRadius = 1e-6
	}
	return d
}

// Drift is the largest violation of the constraints and conserved
// quantities seen at the start, on every monitorEvery-th accepted step and
// at the stop of the main run, each relative.
type Drift struct {
	MassShell float64 // |p·p + m²|/m², with the model's own metric if it has one
	SpinOrth  float64 // |a·p|/(m|a|)
	SpinNorm  float64 // |a·a − a_in·a_in|/(a_in·a_in)
	Energy    float64 // |E − E_in|/E_in
	// EnergyExact reports whether the model conserves Energy exactly (if
	// not, Energy measures the completion's second-order non-conservation).
	EnergyExact bool
	// AngularMomentumZ is |J_z − J_z,in|/(|p⃗_in| b) for models with a
	// conserved J_z in the given background (see angularMomentumModel),
	// NaN for the others; J_z is the component along JAxis.
	AngularMomentumZ float64
	// JAxis is the unit axis of the monitored angular momentum: ẑ, or the
	// spin axis of a turned background (Rotated).
	JAxis vec.Vec3
}

// angularMomentumModel is implemented by models that know the angular
// momentum about z including spin (and field) terms; ConservesJz reports
// whether it is a constant of the motion in the model's background.
type angularMomentumModel interface {
	AngularMomentumZ(y []float64) float64
	ConservesJz() bool
}

// spinConstraintModel is implemented by spinning models whose spin
// constraints are not the flat-space ones (curved backgrounds, a
// dynamical mass): SpinConstraints returns the relative violations of the
// spin condition and of the conserved spin magnitude for the asymptotic
// a·a = a2.
type spinConstraintModel interface {
	SpinConstraints(y []float64, a2 float64) (orth, norm float64)
}

// Outcome is the result of one scattering event.
type Outcome struct {
	Status Status
	In     InState
	POut   vec.Vec4 // asymptotic outgoing four-momentum
	AOut   vec.Vec4 // asymptotic outgoing spin vector
	// Impulse Δp = p_out − p_in and spin kick Δa = a_out − a_in.
	Impulse, SpinKick vec.Vec4
	// ImpulseErr and SpinKickErr are component-wise error bars, bounds on
	// the numerical error of each component, the sum of three terms (NaN
	// with Settings.SingleRun):
	//
	//   - tolerance: the larger of |x − x'| and the a priori bound
	//     aprioriFactor·N·tol·max(|Δp⃗|, s_p), where x' comes from a second
	//     integration at a LooseFactor-fold looser tolerance, LooseRadius
	//     times the start/stop radius and step bounds longer by
	//     LooseFactor^(1/(q+1)) (q the order of the pair), N is the number
	//     of accepted steps and s_p the momentum scale of the error weights.
	//     The reported numbers come from the run at the requested
	//     tolerance. Every error source grows from it to the looser run: for
	//     an order-q pair under a controller of the error per step the
	//     global error goes like tol^(q/(q+1)) (Hairer, Nørsett & Wanner
	//     1993, Solving ODEs I, §II.4, from memory), by 5^(8/9) ≈ 4.2 for
	//     the default; where the step bound limits the steps, by the same
	//     factor through the longer steps; a rounding loss growing with the
	//     radius grows too (doubles if linear in R; the Dixon body's, ∝
	//     R^0.6, only by 1.5, so that the difference covers half of it and
	//     the a priori term the rest at the default radius); the truncation
	//     shrinks and is bounded apart. So |x − x'| bounds the error of x
	//     when the errors grow as they should. The global error is also at most the sum of the
	//     local errors, each held by the controller below tol in the weighed
	//     norm, i.e. below ~tol·|Δp⃗| in the momentum deviations; the
	//     8th-order solution beats the embedded estimate, and the factor
	//     aprioriFactor is measured on the exact cases (the floor catches
	//     the events whose two runs agree by chance);
	//   - truncation: the bound truncBound on the error of the asymptotic
	//     tails of order Settings.TailOrder at the radius used, times |Δp⃗|
	//     (|Δa⃗|), for every component;
	//   - rounding: the floor roundingFloor of the accumulated rounding.
	//
	// Against exact solutions (Darwin's Coulomb and the Schwarzschild
	// deflection, |ε| 1e-4…0.5, v 0.1…0.99, tolerances 1e-6…1e-13) the
	// bars bound the actual error in 99.3–99.8 % of impulse components, at
	// a median of 11–13 times the actual error (TestErrorCoverage); against
	// converged reference runs of the spinning models in 99.8 % of impulse
	// and spin-kick components (TestErrorCoverageSpinning).
	ImpulseErr, SpinKickErr vec.Vec4
	// ImpulseErrIso and SpinKickErrIso are the parts of every spatial
	// component of ImpulseErr and SpinKickErr that bound the norm of the
	// spatial error, and so its component along any unit vector ê (the
	// a priori, truncation and rounding terms); a rotated component's bar
	// is Σ_j |ê_j| (ImpulseErr_j − ImpulseErrIso) + ImpulseErrIso
	// (observables.Frame.Err).
	ImpulseErrIso, SpinKickErrIso float64
	// TolErr and TruncErr are the tolerance and truncation terms of the
	// estimate as the Euclidean norms over the components of (Δp, Δa).
	TolErr, TruncErr float64
	Drift            Drift
	Stats            rk.Stats // of the main run
	// Evals counts every evaluation of the model's equations of motion in
	// the main run: the Runge–Kutta stages plus the nodes of the two
	// tails (TailOrder × TailNodes each) and of the coarse first-order
	// estimate that sets the error scales and the automatic radius (2×4
	// nodes). It is the cost measure to compare with other solvers.
	Evals int
	// EventEvals counts the evaluations of the whole event: Evals plus
	// those of the second, looser integration of the error estimate.
	EventEvals int
	Radius     float64 // start/stop radius in units of b
}

// Scatter integrates the model from the asymptotic in-state to the far
// future and returns the asymptotic out-state. See the package comment for
// the independent variable and the treatment of the asymptotes. An error is
// returned only for invalid input; physical outcomes such as capture are
// reported in Outcome.Status.
func Scatter(m Model, in InState, s *Settings) (Outcome, error) {
	set := s.defaults()
	if err := in.Validate(); err != nil {
		return Outcome{}, err
	}
	// The first-order impulse and spin kick set the scale of the
	// momentum and spin deviations for the error control (a coarse
	// quadrature suffices) and, with the automatic radius, the radius.
	nFirst := scaleNodes
	dp1, da1 := FirstOrder(m, in, nFirst)
	if !finite4(dp1) || !finite4(da1) {
		// The straight line meets a singularity (it runs along a branch
		// disk or through a ring): no first-order scale. The deviation
		// scales fall back to their floors and the path's own hazards
		// decide the outcome.
		dp1, da1 = vec.Vec4{}, vec.Vec4{}
	}
	th := dp1.Spatial().Norm() / in.P.Spatial().Norm()
	if set.Radius == 0 {
		set.Radius = math.Min(1e9, 1e3*math.Max(1, th))
	}
	if set.TailOrder == 0 {
		set.TailOrder = autoTailOrder(th, set.Radius, set.Tol)
	}
	if !(set.Radius >= 10) {
		return Outcome{}, fmt.Errorf("integrate: radius = %v b, want ≥ 10", set.Radius)
	}
	if !(set.Tol > 0 && set.Tol < 1e-2) {
		return Outcome{}, fmt.Errorf("integrate: tol = %v, want 0 < tol < 1e-2", set.Tol)
	}
	if m.Dim() == 8 && in.A != (vec.Vec4{}) {
		return Outcome{}, fmt.Errorf("integrate: model %s is spinless but the in-state has spin %v", m.Name(), in.A)
	}
	main := newRun(m, in, set, dp1, da1)
	defer putTailWork(main.tail)
	out := main.run(set.Tol, set.Radius, set.Observe)
	out.Evals += 2 * nFirst
	out.EventEvals = out.Evals
	if out.Status != StatusScattered || set.SingleRun {
		nan := math.NaN()
		out.ImpulseErr = vec.Vec4{nan, nan, nan, nan}
		out.SpinKickErr = out.ImpulseErr
		out.TolErr, out.TruncErr = nan, nan
		out.ImpulseErrIso, out.SpinKickErrIso = nan, nan
		return out, nil
	}
	// The looser run also takes steps longer by LooseFactor^(1/(q+1)), q
	// the order of the pair, wherever the step bound rather than the
	// tolerance limits them, so that its error grows by the same factor
	// LooseFactor^(q/(q+1)) in both regimes; with the step bound alone
	// unchanged, events whose steps are all bound-limited would give two
	// identical runs and a zero estimate.
	q := float64(set.Method.Order)
	main.hscale = math.Pow(LooseFactor, 1/(q+1))
	loose := main.run(LooseFactor*set.Tol, LooseRadius*set.Radius, nil)
	main.hscale = 1
	out.EventEvals += loose.Evals
	if loose.Status != StatusScattered {
		// The looser run must not change the outcome; if it does, the
		// event sits on a boundary and no number is returned.
		out.Status = loose.Status
		return out, nil
	}
	// The deflection that sets the truncation: the first order, or the
	// measured one where the first order vanishes (by symmetry).
	dpn, dan := out.Impulse.Spatial().Norm(), out.SpinKick.Spatial().Norm()
	pinN := in.P.Spatial().Norm()
	th1 := math.Max(dp1.Spatial().Norm(), dpn) / pinN
	trunc := truncBound(th1, set.Radius, set.TailOrder)
	pFloor, aFloor := roundingFloor(out, in)
	// The a priori part of the tolerance term: the accumulated local
	// error bound N·tol·scale (see Outcome.ImpulseErr).
	nTol := aprioriFactor * float64(out.Stats.Accepted) * set.Tol
	pa := nTol * math.Max(dpn, main.osc.pscale)
	aa := nTol * math.Max(dan, main.osc.ascale)
	if main.dim <= IA {
		aa = 0
	}
	var t2 float64
	for i := 0; i < 4; i++ {
		dt := math.Max(math.Abs(loose.Impulse[i]-out.Impulse[i]), pa)
		out.ImpulseErr[i] = dt + trunc*dpn + pFloor[i]
		t2 += dt * dt
		dt = math.Max(math.Abs(loose.SpinKick[i]-out.SpinKick[i]), aa)
		if main.dim <= IA {
			dt = 0
		}
		out.SpinKickErr[i] = dt + trunc*dan + aFloor[i]
		t2 += dt * dt
	}
	// The a priori, truncation and rounding terms bound the norm of the
	// spatial error, so they bound its component along any direction.
	out.ImpulseErrIso = pa + trunc*dpn + pFloor[1]
	out.SpinKickErrIso = aa + trunc*dan + aFloor[1]
	out.TolErr = math.Sqrt(t2)
	out.TruncErr = trunc * math.Hypot(dpn, dan)
	return out, nil
}

// aprioriFactor is the measured ratio, for the default pair, between the
// actual error and the accumulated local error bound N·tol·|Δp⃗| (see
// Outcome.ImpulseErr) that, with the two-run difference, covers 99 % of the
// exact cases' components (with LooseFactor 10: 0.03 covers 99.0–99.1 %,
// 0.06 99.3–99.8 %).
const aprioriFactor = 0.06

// autoTailOrder returns the lowest tail order from 1 to 3 whose
// truncation bound at the radius R (in b) is at most tol for the
// first-order deflection th1, else 3 (Settings.TailOrder 0).
func autoTailOrder(th1, R, tol float64) int {
	for k := 1; k < 3; k++ {
		if truncBound(th1, R, k) <= tol {
			return k
		}
	}
	return 3
}

// truncBound returns a bound on the relative error |δΔp⃗|/|Δp⃗| left by
// asymptotic tails of order k (tail.go) at the start and stop radius R (in
// units of b), for a first-order deflection θ₁ = |Δp⃗₁|/|p⃗_in|:
//
//	C_k min(1, θ₁)^min(k,2) (max(1, θ₁)/R)^(k+1).
//
// The law and the constants are measured (TestTruncationBound): against
// Darwin's exact Coulomb deflection and the Schwarzschild quadrature over
// v = 0.1…0.99, |ε| = 1e-3…0.5 and R = 10…1e4 b with the truncation
// resolved above rounding, the largest ratio of the actual error to the
// law is 0.28, 0.045 and 0.025 for k = 1, 2, 3; C_k is about twice that.
// Orders above 3 use C_3 (each pass gains a power of θ₁ b/R; not measured).
// Scatter passes max(θ₁, |Δp⃗|/|p⃗_in|), so that an event whose first order
// vanishes by symmetry is not given a zero bound.
// At the automatic radius R = 1e3 max(1, θ₁) the bound is below 1e-13
// relative. The same relative bound is applied to the spin kick.
func truncBound(th1, R float64, k int) float64 {
	c := [...]float64{1: 0.5, 2: 0.1, 3: 0.05}
	ck := c[3]
	if k < len(c) {
		ck = c[k]
	}
	lo := math.Pow(math.Min(1, th1), float64(min(k, 2)))
	return ck * lo * math.Pow(math.Max(1, th1)/R, float64(k+1))
}

// roundingFloor returns the per-component floors of the accumulated
// rounding in the impulse and spin kick (see Outcome.ImpulseErr), which
// the two runs of the estimate share and their difference does not see:
//
//   - energy matching: the start (fixEnergy) and the read-out fix the
//     energy E to about 2 ulp each, which moves |p⃗| by (E/|p⃗|) δE, so
//     the spatial components get 4 ulp·E²/|p⃗| and the time component
//     4 ulp·E (measured on the weak-field exact cases at tol 1e-13…1e-14,
//     where the reported l component is otherwise exceeded at v ≲ 0.4 by
//     up to 1·ulp·E²/|p⃗|);
//   - accumulation: rounding in the N accepted steps of the deviation
//     variables, of size |Δp⃗| (|Δa⃗|), adds up like a random walk,
//     √N ulp |Δp⃗| (common practice; Higham 2002, Accuracy and Stability
//     of Numerical Algorithms, §2.8, from memory).
//
// The spin kick gets the same form with |a⃗_in| for |p⃗| in the matching
// term (the spin is normalised against the same momentum shell; by analogy,
// not measured).
func roundingFloor(out Outcome, in InState) (p, a vec.Vec4) {
	E := in.P[0]
	pn := in.P.Spatial().Norm()
	sq := math.Sqrt(float64(out.Stats.Accepted))
	pm := 4 * ulp * E * E / pn
	pa := sq * ulp * out.Impulse.Spatial().Norm()
	p = vec.Vec4{4*ulp*E + pa, pm + pa, pm + pa, pm + pa}
	an := in.A.Spatial().Norm()
	am := 4 * ulp * an * E * E / (pn * pn)
	aa := sq * ulp * out.SpinKick.Spatial().Norm()
	a = vec.Vec4{am + aa, am + aa, am + aa, am + aa}
	return p, a
}

// defaultMethod is the default Runge–Kutta pair, built once (a Tableau is
// read-only once handed to a Solver).
var defaultMethod = rk.DormandPrince853()

// monitorEvery is the spacing, in accepted steps, of the drift monitoring
// (Drift). Every fourth step of a run of 20 to 100 steps samples the
// encounter, where the constraint violations peak, several times, and
// the stop, where accumulated drifts are largest, is always checked;
// over the validation suite the sampled maxima agree with the every-step
// maxima to within a factor of two (TestDriftSampling).
var monitorEvery = 4

// ulp is the unit in the last place of 1 (the machine epsilon).
const ulp = 0x1p-52

// runner holds the work storage of repeated integrations of one event.
type runner struct {
	m      Model
	in     InState
	set    Settings
	dim    int
	mass   float64
	K      float64 // |p⃗_in|/m
	b      float64
	a2     float64
	solver *rk.Solver
	tail   *tailWork
	dy     []float64
	y0     []float64
	prev   []float64
	x0f    vec.Vec4 // initial position in the motion frame (see motionFrame)
	jzIn   float64  // J_z at the start (angularMomentumModel), NaN before
	osc    *osculating
	inTail tailResult // incoming tail of the last run
	// tailF is the right-hand side on the tails' nodes: the model's,
	// after slaveExtra for a model with an extra block (extraModel).
	tailF func(y, dy []float64)
	// hscale scales the step bound (1 but for the looser run of the
	// error estimate, see Scatter).
	hscale float64
}

// stepBound returns the step bound of a run: osculating.stepBound with
// the maximum step scaled by hscale (the bound that keeps the steps inside
// the domain of the variables is not scaled) and the stop at radius rEnd.
//
// Not inlined (go:noinline): a closure made in a function that is inlined
// into its caller is compiled without the intrinsics and inlining of the
// calls in its body (measured, Go 1.26: math.Sqrt and math.Abs become
// calls, which spill every live register), and this one runs per stage
// or per step.
//
//go:noinline
func (r *runner) stepBound(rEnd float64) func(s float64, Z []float64) float64 {
	return r.osc.stepBound(r.hscale*r.set.MaxStep, rEnd)
}

// initialStep is the first trial step in the angle clock σ. The start
// lies in the far zone, where in σ the motion is as smooth as in the
// encounter (osculating.go): the steps there are of the same size as the
// encounter's, which spans Δσ ≈ π with steps of 0.1–0.3 at tolerances
// 1e-9 to 1e-13, and a first trial step of that size saves the small
// steps with which the derivative-based automatic choice of rk starts.
const initialStep = 0.25

// scaleNodes is the number of Gauss–Legendre nodes per half line of the
// coarse first-order estimate that sets the error scale of the momentum and
// spin deviations and the automatic radius (a scale, not a value: a 30 %
// estimate would do).
const scaleNodes = 4

func newRun(m Model, in InState, set Settings, dp1, da1 vec.Vec4) *runner {
	dim := m.Dim()
	if set.TailOrder == 0 {
		set.TailOrder = 3 // callers that do not go through Scatter
	}
	r := &runner{
		m: m, in: in, set: set, dim: dim,
		mass:   m.Mass(),
		b:      in.ImpactParameter(),
		a2:     in.A.Dot(in.A),
		tail:   getTailWork(dim, set.TailNodes, set.TailOrder),
		dy:     make([]float64, dim),
		y0:     make([]float64, dim),
		prev:   make([]float64, dim),
		hscale: 1,
	}
	r.K = in.P.Spatial().Norm() / r.mass
	r.osc = newOsculating(m, in, r.b, r.K)
	r.tail.setVelocity(m)
	// Deviation scales: the first-order impulse and spin kick, with floors
	// for events whose first order vanishes (a spin kick can vanish by
	// symmetry; then the spin's own size times the deflection, or a
	// millionth of the momentum, sets the scale).
	pin := in.P.Spatial().Norm()
	r.osc.pscale = math.Max(dp1.Spatial().Norm(), 1e-6*pin)
	th := dp1.Spatial().Norm() / pin
	an := in.A.Spatial().Norm()
	r.osc.ascale = math.Max(da1.Spatial().Norm(), math.Max(th*an, 1e-6*an))
	if r.osc.ascale == 0 {
		r.osc.ascale = 1 // spinless in-state: nothing to scale
	}
	r.tailF = r.osc.f
	if em, ok := m.(extraModel); ok && dim > IE {
		r.osc.escale = em.extraScale(r.osc.pscale, an, r.mass, r.b)
		f := r.osc.f
		r.tailF = func(y, dy []float64) {
			em.slaveExtra(y)
			f(y, dy)
		}
	}
	return r
}

func radius(y []float64) float64 {
	return math.Sqrt(y[IX+1]*y[IX+1] + y[IX+2]*y[IX+2] + y[IX+3]*y[IX+3])
}

// initial builds the state at the start radius R (absolute) from the
// asymptotic in-state with the first-order tail applied and the energy set
// to its asymptotic value.
func (r *runner) initial(R float64) {
	y := r.y0
	for i := range y {
		y[i] = 0
	}
	sig0 := -math.Sqrt(R*R-r.b*r.b) / r.K
	put(y, IX, r.in.B.Add(r.in.P.Scale(sig0/r.mass)))
	put(y, IP, r.in.P)
	put(y, IA, r.in.A)
	tl := r.tail.leg(r.tailF, r.mass, y, r.in.P.Spatial().Unit(), true, R)
	dp, da := tl.DP, tl.DA
	shift := vec.FromSpatial(0, tl.Disp)
	r.inTail = tl
	put(y, IX, Pos(y).Add(shift))
	// The same position in the motion frame, formed there so that the
	// transverse components carry no rounding of order R·1e-16.
	fr := newMotionFrame(r.in)
	sh := shift.Spatial()
	r.x0f = vec.Vec4{r.in.P[0] * sig0 / r.mass,
		r.in.P.Spatial().Norm()*sig0/r.mass + fr[0].Dot(sh), r.b + fr[1].Dot(sh), fr[2].Dot(sh)}
	put(y, IP, Mom(y).Add(dp))
	if r.dim > IA {
		put(y, IA, Spin(y).Add(da))
	}
	if r.dim > IE {
		// The extra block vanishes at infinity (see SSC): its value at
		// the start is its tail.
		for i := 0; i < 4; i++ {
			y[IE+i] += tl.DE[i]
		}
	}
	r.m.Normalize(y, r.a2)
	r.fixEnergy(y, r.in.P[0])
}

// fixEnergy rescales the spatial momentum so that Energy(y) = E, keeping
// the constraints (Newton's method with dE/dλ ≈ |p⃗|²/p⁰).
func (r *runner) fixEnergy(y []float64, E float64) {
	for it := 0; it < 8; it++ {
		g := r.m.Energy(y) - E
		if math.Abs(g) <= 4e-16*E {
			return
		}
		p2 := y[IP+1]*y[IP+1] + y[IP+2]*y[IP+2] + y[IP+3]*y[IP+3]
		lam := 1 - g*y[IP]/p2
		for i := 1; i < 4; i++ {
			y[IP+i] *= lam
		}
		r.m.Normalize(y, r.a2)
	}
}

// run performs one integration with tolerance tol and radius R (in b),
// the maximum step (osculating.stepBound) scaled by r.hscale.
//
// The integrated variables (see osculating.go) are, in the frame of the
// incoming motion: the coordinate time, the position split into its
// along-track coordinate (through ζ = tan(½ atan(λ/b))) and its across-track
// vector β⃗ relative to the current direction of motion, and the
// deviations of momentum and spin from their incoming asymptotic values,
// so that the impulse and spin kick are accumulated directly instead of
// being formed as differences of O(1) numbers.
func (r *runner) run(tol, R float64, observe func(float64, []float64)) Outcome {
	out := Outcome{In: r.in, Radius: R}
	Rabs := R * r.b
	r.initial(Rabs)
	o := r.osc
	// The coordinate time is integrated only for the observer (see
	// osculating.go).
	n := o.dim
	if observe != nil {
		n = o.n
	}
	Z0 := make([]float64, n)
	o.fromModel(r.y0, r.x0f, Z0)
	r.solver = rk.Reuse(getSolver(n), n, &rk.Settings{Method: r.set.Method, RelTol: tol, AbsTol: tol,
		MaxSteps: r.set.MaxSteps, InitialStep: initialStep, Carried: n - o.dim,
		Weights: o.weights(tol), StepBound: r.stepBound(Rabs), Predictive: true})
	Ein := r.m.Energy(r.y0)
	r.jzIn = math.NaN()
	drift := Drift{EnergyExact: r.m.EnergyExact()}
	hazard := StatusRunning
	copy(r.prev, r.y0)
	obuf := make([]float64, r.dim)
	rcap := r.set.CaptureRadius * r.b
	rsph, sphere := captureSphere(r.m)
	if sphere {
		rcap = math.Max(rcap, rsph)
	}
	checkHazard := !hazardFree(r.m) && !sphere
	f := o.rkFunc()
	if checkHazard {
		// After a hazard the remaining stages are made non-finite, so
		// that the solver stops.
		fz := f
		f = func(s float64, Z, dZ []float64) {
			if hazard != StatusRunning {
				for i := range dZ {
					dZ[i] = math.NaN()
				}
				return
			}
			fz(s, Z, dZ)
		}
	}
	r.drift(r.y0, Ein, &drift) // the start, which also fixes the reference J_z
	step := 0
	r.solver.Observe = func(s float64, Z []float64) {
		step++
		monitor := step%monitorEvery == 0
		if !checkHazard && !monitor && observe == nil {
			return
		}
		o.toModel(Z, obuf)
		if checkHazard {
			if hz := r.m.Hazard(r.prev, obuf); hz != StatusRunning && hazard == StatusRunning {
				hazard = hz
			}
			copy(r.prev, obuf)
		}
		if monitor {
			r.drift(obuf, Ein, &drift)
		}
		if observe != nil {
			observe(s, obuf)
		}
	}
	// The stop: the end of the first step beyond R on the way out (the
	// outgoing tail starts wherever the path is, so the crossing itself
	// need not be located).
	events := []rk.Event{
		{G: func(_ float64, Z []float64) float64 { return o.radius(Z) - Rabs }, Direction: 1, Terminal: true, AtStep: true},
		{G: func(_ float64, Z []float64) float64 { return o.radius(Z) - rcap }, Direction: -1, Terminal: true},
	}
	// σ spans π up to the deflection on a scattered path (more for paths
	// that wind round the source); the limit is for paths that never
	// leave (about 30 windings).
	sMax := 200.0
	res := r.solver.Solve(f, 0, Z0, sMax, events)
	defer func() {
		// res.Y belongs to the solver: it goes back only once run has
		// read it.
		putSolver(n, r.solver)
		r.solver = nil
	}()
	out.Stats = res.Stats
	out.Evals = res.Stats.Evaluations
	out.Drift = drift
	switch {
	case hazard != StatusRunning:
		out.Status = hazard
		return out
	case res.Status == rk.StatusEvent && res.Event == 0:
	case res.Status == rk.StatusEvent && res.Event == 1:
		out.Status = StatusCaptured
		return out
	case res.Status == rk.StatusSuccess:
		out.Status = StatusDidNotEscape
		return out
	default:
		out.Status = StatusIntegratorFailed
		if checkHazard {
			out.Status = r.stalledAt(res.Y, rcap)
		}
		if fc, ok := r.m.(failureClassifier); ok && out.Status == StatusIntegratorFailed {
			r.osc.toModel(res.Y, r.dy)
			out.Status = fc.FailureStatus(r.dy)
		}
		return out
	}
	// Read out: first-order tail to +∞, energy from the conserved quantity.
	y := r.dy // scratch for the state at the stop radius
	o.toModel(res.Y, y)
	dev := o.deviations(res.Y) // momentum and spin deviations, background frame
	r.drift(y, Ein, &out.Drift)
	// At infinity the potential vanishes, so p⁰_out = E(y), and
	// Δp⁰ = (p⁰ − p⁰_in) + U(y) without cancellation.
	dp0 := dev[IP] + (r.m.Energy(y) - y[IP])
	// The tail's map scale is the radius where the path stopped, which the
	// last step may have carried well beyond R (osculating.stepBound): the
	// tail's quadrature is exact to rounding only when its scale and the
	// distance match (with the scale R instead, stops at 8 R cost
	// 1e-13 relative).
	outTail := r.tail.leg(r.tailF, r.mass, y, spatial(y, IP).Unit(), false, math.Max(Rabs, o.radius(res.Y)))
	tp, ta := outTail.DP, outTail.DA
	out.Evals += outTail.Evals + r.inTail.Evals
	// Deviation of the spatial momentum before the mass-shell rescaling.
	pin := r.in.P.Spatial()
	d := vec.Vec3{dev[IP+1] + tp[1], dev[IP+2] + tp[2], dev[IP+3] + tp[3]}
	// p⃗_out = λ(p⃗_in + d⃗) with |p⃗_out|² = (p⁰_in + Δp⁰)² − m_out²; λ − 1
	// from N − D without cancellation. m_out = m but for the models whose
	// mass changes (outMassModel).
	E0 := r.in.P[0]
	D := pin.Dot(pin) + 2*pin.Dot(d) + d.Dot(d)
	var dm2 float64 // m² − m_out²
	if om, ok := r.m.(outMassModel); ok {
		if mo, ok := om.OutMass(y); ok {
			dm2 = (r.mass - mo) * (r.mass + mo)
		}
	}
	NmD := 2*E0*dp0 + dp0*dp0 - 2*pin.Dot(d) - d.Dot(d) + dm2
	lam := math.Sqrt(1 + NmD/D)
	lm1 := (NmD / D) / (lam + 1)
	dpv := pin.Scale(lm1).Add(d.Scale(lam))
	out.Impulse = vec.FromSpatial(dp0, dpv)
	out.POut = r.in.P.Add(out.Impulse)
	if r.dim > IA {
		da := vec.Vec3{dev[IA+1] + ta[1], dev[IA+2] + ta[2], dev[IA+3] + ta[3]}
		// a⁰ from a·p = 0: Δa⁰ E = Δa⃗·p⃗_out + a⃗_in·Δp⃗ − a⁰_in Δp⁰.
		E := E0 + dp0
		da0 := (da.Dot(out.POut.Spatial()) + r.in.A.Spatial().Dot(dpv) - r.in.A[0]*dp0) / E
		out.SpinKick = vec.FromSpatial(da0, da)
		out.AOut = r.in.A.Add(out.SpinKick)
	}
	out.Status = StatusScattered
	return out
}

// stalledAt is the status of a run whose steps shrank to nothing at Z: a
// path that stalls on a forbidden surface (a branch disk, where the
// background is not smooth) never completes the step across it, so the
// segment from Z on along the direction of motion, of the length rcap
// below which a path counts as captured, is checked for the model's
// hazards; StatusIntegratorFailed if it meets none.
func (r *runner) stalledAt(Z []float64, rcap float64) Status {
	y0, y1 := r.dy, r.prev
	r.osc.toModel(Z, y0)
	copy(y1, y0)
	d := spatial(y0, IP).Unit().Scale(rcap)
	for i := 1; i < 4; i++ {
		y1[IX+i] += d[i-1]
	}
	if hz := r.m.Hazard(y0, y1); hz != StatusRunning {
		return hz
	}
	return StatusIntegratorFailed
}

// momentumVelocity is implemented by models whose Deriv sets
// dx^μ/dτ = p^μ/m exactly. The driver then forms the position derivative
// in the motion frame from the momentum there: evaluated in the
// background's frame, p⃗ carries a rounding of ~1e-16|p⃗| that, for a
// rotated setup, moves the transverse position by ~1e-16 R over a leg of
// length R and puts a noise floor under the step-size control.
type momentumVelocity interface {
	VelocityIsMomentum()
}

// splitVelocity is implemented by models whose velocity is
// dx^μ/dτ = α p^μ + w^μ with a small hidden-momentum part w (a spin
// supplementary condition): after each Deriv, VelocitySplit returns α and
// w of that call, so that the driver can form α p in the motion frame
// without the rounding of a rotated p (as for momentumVelocity).
type splitVelocity interface {
	VelocitySplit() (alpha float64, w [4]float64)
}

// outMassModel is implemented by models whose dynamics does not conserve
// the mass √(−g_μν p^μ p^ν) (KerrDixon: the densities of the higher
// multipoles change it at second order in the coupling). OutMass returns
// it at y (false: the mass is conserved), and the read-out puts p_out on
// that shell rather than on the asymptotic mass's, so that the impulse is
// the model's own: with the asymptotic mass imposed, Δp_l differed from the
// model's direct second order (SecondOrder) by −MassShell/|p⃗_in| per ε²
// (kerr-test-hole 0.2527 against 0.2526 predicted, ktn-test-hole 0.0811
// against 0.0811, millions of standard deviations; now 0.30σ and 0.23σ).
type outMassModel interface {
	OutMass(y []float64) (float64, bool)
}

// massShellModel is implemented by models whose mass shell is not the
// Minkowski one (probes in curved backgrounds): MassShell returns the
// relative violation (g_μν p^μ p^ν + m²)/m² at y. Models without it are
// checked against the flat shell.
type massShellModel interface {
	MassShell(y []float64) float64
}

func (r *runner) drift(y []float64, Ein float64, d *Drift) {
	p := Mom(y)
	m2 := r.mass * r.mass
	if ms, ok := r.m.(massShellModel); ok {
		d.MassShell = math.Max(d.MassShell, math.Abs(ms.MassShell(y)))
	} else {
		d.MassShell = math.Max(d.MassShell, math.Abs(p.Dot(p)+m2)/m2)
	}
	if sc, ok := r.m.(spinConstraintModel); ok && r.a2 > 0 {
		o, n := sc.SpinConstraints(y, r.a2)
		d.SpinOrth = math.Max(d.SpinOrth, math.Abs(o))
		d.SpinNorm = math.Max(d.SpinNorm, math.Abs(n))
	} else if r.a2 > 0 {
		a := Spin(y)
		d.SpinOrth = math.Max(d.SpinOrth, math.Abs(a.Dot(p))/(r.mass*math.Sqrt(r.a2)))
		d.SpinNorm = math.Max(d.SpinNorm, math.Abs(a.Dot(a)-r.a2)/r.a2)
	}
	d.Energy = math.Max(d.Energy, math.Abs(r.m.Energy(y)-Ein)/Ein)
	d.JAxis = vec.Vec3{0, 0, 1}
	if ax, ok := r.m.(interface{ Axis() vec.Vec3 }); ok {
		d.JAxis = ax.Axis()
	}
	if am, ok := r.m.(angularMomentumModel); ok && am.ConservesJz() {
		if math.IsNaN(r.jzIn) {
			r.jzIn = am.AngularMomentumZ(y)
		}
		jn := r.in.P.Spatial().Norm() * r.b
		d.AngularMomentumZ = math.Max(d.AngularMomentumZ, math.Abs(am.AngularMomentumZ(y)-r.jzIn)/jn)
	} else {
		d.AngularMomentumZ = math.NaN()
	}
}

// failureClassifier is implemented by models that can name the physical
// cause of an integration that failed at the last accepted state y (a
// singularity that the path ran into); FailureStatus returns that
// outcome, or StatusIntegratorFailed.
type failureClassifier interface {
	FailureStatus(y []float64) Status
}

// finite4 reports whether every component of v is finite.
func finite4(v vec.Vec4) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}
