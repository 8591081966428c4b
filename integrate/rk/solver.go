package rk

import (
	"fmt"
	"math"
)

// Func evaluates dy/dt at (t, y) into dydt. It must not retain y or dydt.
type Func func(t float64, y, dydt []float64)

// Settings configures a Solver. The zero value of each field selects the
// documented default; a nil *Settings means all defaults.
type Settings struct {
	// Method is the Runge–Kutta pair. nil: DormandPrince853().
	Method *Tableau
	// RelTol is the relative tolerance. 0: 1e-10.
	RelTol float64
	// AbsTol is the absolute tolerance. 0: RelTol. The error of component
	// i is scaled by sc_i = AbsTol + RelTol·max(|y_i|, |y_new,i|) and the
	// scaled errors are combined in the RMS norm (Hairer, Nørsett &
	// Wanner 1993, §II.4, eq. (4.11)).
	AbsTol float64
	// MaxStep bounds |h|. 0: |t1 − t0|.
	MaxStep float64
	// InitialStep is the magnitude of the first trial step. 0: automatic
	// (Hairer, Nørsett & Wanner 1993, §II.4), at the cost of one
	// evaluation of f.
	InitialStep float64
	// MaxSteps bounds the number of attempted (accepted plus rejected)
	// steps of one Solve. 0: 100000. Exceeding it gives StatusMaxSteps.
	MaxSteps int
	// Safety is the safety factor of the step-size controller. 0: 0.9.
	// The remaining controller constants are fixed; see control.go.
	Safety float64
	// Weigh, if non-nil, replaces the component-wise scaling of the error
	// estimate: it receives the raw local error estimate e of the step
	// from y to yNew and overwrites it in place with the scaled error,
	// which is then combined in the RMS norm and accepted when the norm
	// is at most one. It may apply any linear map first (for example,
	// measure a position error along and across the direction of motion
	// with different scales). It must not retain its arguments, and it
	// must not depend on anything but its arguments. nil: the scaling
	// described under AbsTol.
	Weigh func(y, yNew, e []float64)
	// Weights, if non-nil, replaces the component-wise scaling (and takes
	// precedence over Weigh): it is called once per attempted step with
	// the states y and yNew at both ends and fills w with the reciprocal
	// error scales, so that the scaled error of component i is w[i]·e_i
	// (w[i] = 0 ignores the component). The scaled errors are combined in
	// the RMS norm as with Weigh. It must not retain its arguments or
	// depend on anything but them. One call per step serves both error
	// estimates of a pair with a second embedded solution (DormandPrince853), where
	// Weigh is called twice.
	Weights func(y, yNew, w []float64)
	// StepBound, if non-nil, bounds |h| of the step that starts at (t, y)
	// in addition to MaxStep: a state-dependent maximum step, for example
	// one that lets the steps grow in the far zone of a scattering problem
	// but never beyond the distance to the encounter. It must return a
	// positive number.
	StepBound func(t float64, y []float64) float64
	// Carried is the number of trailing components that are integrated
	// but not controlled: the error norm is the RMS over the first
	// dim − Carried components only, so that carrying a quantity along
	// (one that feeds back into nothing, like a clock) leaves the steps
	// exactly as they are without it. 0 ≤ Carried < dim.
	Carried int
	// Predictive selects Gustafsson's predictive step-size controller
	// (see control.go) instead of the PI controller: fewer rejections
	// where the error grows steadily from step to step.
	Predictive bool
}

// Stats counts the work of one Solve.
type Stats struct {
	// Accepted and Rejected count steps; Evaluations counts calls of f,
	// including those of the starting-step algorithm and of the extra
	// dense-output stages.
	Accepted, Rejected, Evaluations int
}

// Result is the outcome of Solve.
type Result struct {
	Status Status
	// T is where the integration stopped.
	T float64
	// Y is the state at T. It is owned by the Solver and valid until the
	// next call of Solve.
	Y []float64
	// Event is the index of the terminal event that stopped the
	// integration, −1 otherwise.
	Event int
	Stats
}

// Solver holds all work storage for one dimension. Solve allocates nothing
// per step, and nothing at all on a reused Solver once it has seen the
// largest number of events it is given.
//
// A Solver is not safe for concurrent use; use one per goroutine.
type Solver struct {
	// Observe, if non-nil, is called after every accepted step with the
	// new (t, y); after a terminal event it is called with the state at
	// the event instead of the end of the step. y must not be retained or
	// modified. Interpolate may be called from Observe.
	Observe func(t float64, y []float64)
	// OnEvent, if non-nil, is called for every located event crossing,
	// terminal or not, in order of time, with the event index and the
	// interpolated state at the root. y must not be retained or modified.
	OnEvent func(index int, t float64, y []float64)

	dim      int
	tab      *Tableau
	rtol     float64
	atol     float64
	maxStep  float64
	initStep float64
	maxSteps int
	safety   float64
	weigh    func(y, yNew, e []float64)
	weights  func(y, yNew, w []float64)
	kern     *unrolled    // generated stepper of the tableau, if any
	fix      *fixedKernel // its fixed-size stepper for dim and carried, if any
	bound    func(t float64, y []float64) float64
	predict  bool
	carried  int

	e, e3  []float64 // error weights B − BHat, B − BHat3
	err5   []float64 // raw error estimates (with Weigh)
	err3   []float64
	wts    []float64   // reciprocal error scales (with Weights)
	k      [][]float64 // main then dense-output stages
	w      []float64   // dense weights b_i(θ)
	y      []float64
	yNew   []float64
	yOld   []float64
	ytmp   []float64
	yEv    []float64
	yRoot  []float64
	gOld   []float64
	hits   []hit
	ctrl   controller
	stats  Stats
	f      Func
	tOld   float64
	h      float64
	step   bool // a step has been accepted (Interpolate is valid)
	dense  bool // the extra dense stages of the last step are evaluated
	fsal   bool // k[s−1] holds f at the current state
	events []Event
}

type hit struct {
	index int
	t     float64
}

// NewSolver returns a Solver for systems of dimension dim. It panics if
// dim <= 0 or if a setting is negative (programmer errors); nil s means
// default settings.
func NewSolver(dim int, s *Settings) *Solver {
	sv := &Solver{}
	sv.configure(dim, s)
	tab := sv.tab
	ns := tab.Stages()
	if ns == 0 || len(tab.A) != ns || len(tab.B) != ns || len(tab.BHat) != ns {
		panic("rk: inconsistent tableau " + tab.Name)
	}
	sv.e = make([]float64, ns)
	for i := range sv.e {
		sv.e[i] = tab.B[i] - tab.BHat[i]
	}
	if tab.BHat3 != nil {
		sv.e3 = make([]float64, ns)
		for i := range sv.e3 {
			sv.e3[i] = tab.B[i] - tab.BHat3[i]
		}
	}
	total := ns + len(tab.DenseC)
	// One backing array for all vectors of length dim.
	const vectors = 10
	buf := make([]float64, (total+vectors)*dim+total)
	next := func(n int) []float64 {
		v := buf[:n:n]
		buf = buf[n:]
		return v
	}
	sv.k = make([][]float64, total)
	for i := range sv.k {
		sv.k[i] = next(dim)
	}
	sv.w = next(total)
	sv.y = next(dim)
	sv.yNew = next(dim)
	sv.yOld = next(dim)
	sv.ytmp = next(dim)
	sv.yEv = next(dim)
	sv.yRoot = next(dim)
	sv.err5 = next(dim)
	sv.err3 = next(dim)
	sv.wts = next(dim)
	sv.kern = kernelFor(tab)
	sv.fix = sv.kern.fixedFor(dim, dim-sv.carried)
	return sv
}

// Reuse returns a Solver for dimension dim and settings s, as NewSolver
// does, but reuses the storage of old when old has the same dimension and
// method (old must not be used afterwards; its Observe and OnEvent are
// cleared). old may be nil. With a pool of Solvers, repeated integrations
// of the same system allocate nothing.
func Reuse(old *Solver, dim int, s *Settings) *Solver {
	method := defaultMethod
	if s != nil && s.Method != nil {
		method = s.Method
	}
	if old == nil || old.dim != dim || old.tab != method {
		return NewSolver(dim, s)
	}
	old.configure(dim, s)
	old.fix = old.kern.fixedFor(dim, dim-old.carried)
	old.Observe, old.OnEvent = nil, nil
	return old
}

// configure checks the settings and sets the Solver's parameters (not its
// storage).
func (sv *Solver) configure(dim int, s *Settings) {
	if dim <= 0 {
		panic(fmt.Sprintf("rk: dimension %d <= 0", dim))
	}
	var set Settings
	if s != nil {
		set = *s
	}
	if set.RelTol < 0 || set.AbsTol < 0 || set.MaxStep < 0 || set.InitialStep < 0 || set.MaxSteps < 0 || set.Safety < 0 {
		panic("rk: negative setting")
	}
	if set.Carried < 0 || set.Carried >= dim {
		panic(fmt.Sprintf("rk: Carried = %d, want 0 ≤ Carried < dim = %d", set.Carried, dim))
	}
	sv.dim, sv.tab, sv.rtol, sv.atol = dim, set.Method, set.RelTol, set.AbsTol
	sv.maxStep, sv.initStep, sv.maxSteps, sv.safety = set.MaxStep, set.InitialStep, set.MaxSteps, set.Safety
	sv.weigh, sv.weights, sv.bound, sv.predict = set.Weigh, set.Weights, set.StepBound, set.Predictive
	sv.carried = set.Carried
	if sv.tab == nil {
		sv.tab = defaultMethod
	}
	if sv.rtol == 0 {
		sv.rtol = 1e-10
	}
	if sv.atol == 0 {
		sv.atol = sv.rtol
	}
	if sv.maxSteps == 0 {
		sv.maxSteps = 100000
	}
	if sv.safety == 0 {
		sv.safety = defaultSafety
	}
}

// defaultMethod is the pair of a nil Settings.Method, built once.
var defaultMethod = DormandPrince853()

// Method returns the tableau in use.
func (s *Solver) Method() *Tableau { return s.tab }

// Solve integrates y' = f from (t0, y0) towards t1 (t1 < t0 allowed:
// backward integration). y0 is not modified. Events are checked on every
// accepted step; a sign change of an event function inside a step is
// located on the dense output. Two sign changes of the same event function
// within one step cancel and go unnoticed; MaxStep bounds that risk.
//
// Solve panics if len(y0) != dim.
func (s *Solver) Solve(f Func, t0 float64, y0 []float64, t1 float64, events []Event) Result {
	if len(y0) != s.dim {
		panic(fmt.Sprintf("rk: len(y0) = %d != dim %d", len(y0), s.dim))
	}
	s.stats = Stats{}
	s.f = f
	s.step, s.dense, s.fsal = false, false, false
	s.events = events
	copy(s.y, y0)
	res := Result{T: t0, Event: -1}
	if t1 == t0 {
		res.Y = s.y
		return res
	}
	dir := 1.0
	if t1 < t0 {
		dir = -1
	}
	ns := s.tab.Stages()
	f(t0, s.y, s.k[0])
	s.stats.Evaluations++
	if !finite(s.y) || !finite(s.k[0]) {
		return s.finish(res, StatusNonFinite, t0)
	}

	if cap(s.gOld) < len(events) {
		s.gOld = make([]float64, len(events))
		s.hits = make([]hit, 0, len(events))
	}
	s.gOld = s.gOld[:len(events)]
	for i := range events {
		s.gOld[i] = events[i].G(t0, s.y)
	}

	hmax := s.maxStep
	if hmax == 0 || hmax > math.Abs(t1-t0) {
		hmax = math.Abs(t1 - t0)
	}
	var h float64
	if s.initStep > 0 {
		h = dir * math.Min(s.initStep, hmax)
	} else {
		h0max := hmax
		if s.bound != nil {
			h0max = math.Min(h0max, s.bound(t0, s.y))
		}
		h = s.initialStep(f, t0, s.y, s.k[0], dir, h0max, s.ytmp, s.k[1])
	}
	s.ctrl.reset(s.tab.EstimateOrder, s.safety, s.predict)

	t := t0
	attempts := 0
	nonFinite := false
	for {
		if attempts >= s.maxSteps {
			return s.finish(res, StatusMaxSteps, t)
		}
		hmin := 16 * eps * larger(larger(math.Abs(t), math.Abs(t1)), math.SmallestNonzeroFloat64)
		if math.Abs(h) < hmin || math.IsNaN(h) {
			if nonFinite {
				return s.finish(res, StatusNonFinite, t)
			}
			return s.finish(res, StatusStepTooSmall, t)
		}
		if s.bound != nil {
			if hb := s.bound(t, s.y); math.Abs(h) > hb {
				h = dir * hb
			}
		}
		last := false
		if dir*(t+1.01*h-t1) >= 0 {
			h = t1 - t
			last = true
		}
		if s.fsal {
			s.k[0], s.k[ns-1] = s.k[ns-1], s.k[0]
			s.fsal = false
		} else if s.step && !s.tab.FSAL {
			f(t, s.y, s.k[0])
			s.stats.Evaluations++
		}
		s.step = false
		attempts++
		errNorm, ok := s.attempt(f, t, h)
		if !ok {
			// Shrink and retry: the trial step may have left the region
			// where f is defined.
			nonFinite = true
			s.stats.Rejected++
			s.ctrl.rejected = true
			h *= minFactor
			continue
		}
		nonFinite = false
		hNew, accept := s.ctrl.next(h, errNorm)
		if !accept {
			s.stats.Rejected++
			h = hNew
			continue
		}
		s.stats.Accepted++
		s.tOld, s.h = t, h
		s.y, s.yOld, s.yNew = s.yNew, s.y, s.yOld
		s.step, s.dense, s.fsal = true, false, s.tab.FSAL
		if last {
			t = t1
		} else {
			t += h
		}
		if len(events) > 0 {
			if idx, tr, stop := s.checkEvents(t); stop {
				copy(s.y, s.yRoot)
				if s.Observe != nil {
					s.Observe(tr, s.y)
				}
				res.Event = idx
				return s.finish(res, StatusEvent, tr)
			}
		}
		if s.Observe != nil {
			s.Observe(t, s.y)
		}
		if last {
			return s.finish(res, StatusSuccess, t)
		}
		h = hNew
		if math.Abs(h) > hmax {
			h = dir * hmax
		}
	}
}

func (s *Solver) finish(res Result, st Status, t float64) Result {
	res.Status = st
	res.T = t
	res.Y = s.y
	res.Stats = s.stats
	return res
}

const eps = 0x1p-52

// finite reports whether every component of v is finite: 0·x is 0 for
// finite x and NaN for ±Inf and NaN, and a sum with a NaN is NaN, so one
// comparison at the end decides (no branch per component).
func finite(v []float64) bool {
	var z float64
	for _, x := range v {
		z += 0 * x
	}
	return z == 0
}

// attempt computes one step of size h from (t, s.y) with s.k[0] = f(t, y)
// into s.yNew and returns the scaled error norm. ok is false if the new
// state, the last stage or the error is not finite.
func (s *Solver) attempt(f Func, t, h float64) (errNorm float64, ok bool) {
	tab := s.tab
	ns := tab.Stages()
	y, k := s.y, s.k
	if s.fix != nil {
		s.fix.stages(s, f, t, h)
	} else if s.kern != nil {
		s.kern.stages(s, f, t, h)
	} else {
		for i := 1; i < ns; i++ {
			if tab.FSAL && i == ns-1 {
				break
			}
			combine(s.ytmp, y, h, tab.A[i], k)
			f(t+tab.C[i]*h, s.ytmp, k[i])
		}
		combine(s.yNew, y, h, tab.B, k)
		if tab.FSAL {
			f(t+h, s.yNew, k[ns-1])
		}
	}
	s.stats.Evaluations += ns - 1
	if !finite(s.yNew) || !finite(k[ns-1]) {
		return 0, false
	}
	errNorm = s.errorNorm(h)
	if math.IsNaN(errNorm) || math.IsInf(errNorm, 0) {
		return 0, false
	}
	return errNorm, true
}

// combine sets dst = y + h Σ_j a[j] k[j].
func combine(dst, y []float64, h float64, a []float64, k [][]float64) {
	copy(dst, y)
	for j, aj := range a {
		if aj == 0 {
			continue
		}
		c := h * aj
		kj := k[j][:len(dst)]
		for i, v := range kj {
			dst[i] += c * v
		}
	}
}

// errorNorm returns the scaled error of the step just computed into yNew.
func (s *Solver) errorNorm(h float64) float64 {
	if s.weights != nil || s.weigh != nil {
		return s.weighedNorm(h)
	}
	if s.kern != nil {
		return s.unrolledNorm(h)
	}
	n := float64(s.dim - s.carried)
	var sum5, sum3 float64
	for i := range s.y[:s.dim-s.carried] {
		sc := s.atol + s.rtol*math.Max(math.Abs(s.y[i]), math.Abs(s.yNew[i]))
		var e5, e3 float64
		for j, ej := range s.e {
			if ej != 0 {
				e5 += ej * s.k[j][i]
			}
		}
		e5 /= sc
		sum5 += e5 * e5
		if s.e3 != nil {
			for j, ej := range s.e3 {
				if ej != 0 {
					e3 += ej * s.k[j][i]
				}
			}
			e3 /= sc
			sum3 += e3 * e3
		}
	}
	if s.e3 == nil {
		return math.Abs(h) * math.Sqrt(sum5/n)
	}
	return combinedNorm(h, n, sum5, sum3)
}

// rawErrors sets s.err5 (and s.err3 for a pair with a third-order
// estimate) to the unscaled error vectors Σ_j e_j k_j of the last step.
func (s *Solver) rawErrors() {
	if s.kern != nil {
		s.kern.errs(s.k, s.err5, s.err3)
		return
	}
	errorVector(s.err5, s.e, s.k)
	if s.e3 != nil {
		errorVector(s.err3, s.e3, s.k)
	} else {
		for i := range s.err3 {
			s.err3[i] = 0
		}
	}
}

// unrolledNorm is errorNorm with the default component-wise scaling for a
// tableau with a generated kernel: the same operations in the same order.
func (s *Solver) unrolledNorm(h float64) float64 {
	s.rawErrors()
	n := float64(s.dim - s.carried)
	var sum5, sum3 float64
	for i := range s.y[:s.dim-s.carried] {
		sc := s.atol + s.rtol*math.Max(math.Abs(s.y[i]), math.Abs(s.yNew[i]))
		e5 := s.err5[i] / sc
		sum5 += e5 * e5
		if s.e3 != nil {
			e3 := s.err3[i] / sc
			sum3 += e3 * e3
		}
	}
	if s.e3 == nil {
		return math.Abs(h) * math.Sqrt(sum5/n)
	}
	return combinedNorm(h, n, sum5, sum3)
}

// errorVector sets dst = Σ_j e[j] k[j].
func errorVector(dst, e []float64, k [][]float64) {
	for i := range dst {
		dst[i] = 0
	}
	for j, ej := range e {
		if ej == 0 {
			continue
		}
		kj := k[j][:len(dst)]
		for i, v := range kj {
			dst[i] += ej * v
		}
	}
}

// weighedNorm is errorNorm with the user's Weigh in place of the
// component-wise scaling.
func (s *Solver) weighedNorm(h float64) float64 {
	n := float64(s.dim - s.carried)
	if s.weights != nil && s.fix != nil {
		s.weights(s.y, s.yNew, s.wts)
		sum5, sum3 := s.fix.norm(s, s.wts)
		return combinedNorm(h, n, sum5, sum3)
	}
	s.rawErrors()
	var sum5, sum3 float64
	if s.weights != nil {
		w := s.wts
		s.weights(s.y, s.yNew, w)
		w = w[:s.dim-s.carried]
		e5, e3 := s.err5[:len(w)], s.err3[:len(w)]
		for i, wi := range w {
			a := e5[i] * wi
			sum5 += a * a
			c := e3[i] * wi
			sum3 += c * c
		}
		if s.e3 == nil {
			return math.Abs(h) * math.Sqrt(sum5/n)
		}
		return combinedNorm(h, n, sum5, sum3)
	}
	s.weigh(s.y, s.yNew, s.err5)
	for _, e := range s.err5[:s.dim-s.carried] {
		sum5 += e * e
	}
	if s.e3 == nil {
		return math.Abs(h) * math.Sqrt(sum5/n)
	}
	s.weigh(s.y, s.yNew, s.err3)
	for _, e := range s.err3[:s.dim-s.carried] {
		sum3 += e * e
	}
	return combinedNorm(h, n, sum5, sum3)
}

// combinedNorm is Hairer's combined 5th/3rd-order estimate (see DormandPrince853)
// from the sums of squares of the two scaled error vectors.
func combinedNorm(h, n, sum5, sum3 float64) float64 {
	deno := sum5 + 0.01*sum3
	if deno <= 0 {
		deno = 1
	}
	return math.Abs(h) * sum5 / math.Sqrt(n*deno)
}

// Interpolate evaluates the dense output of the last accepted step at t into
// y. t should lie within that step (after a terminal event the step extends
// beyond Result.T); outside it the polynomial is extrapolated. Methods with
// extra dense-output stages evaluate them on the first call per step, which
// counts towards Stats.Evaluations of the running Solve.
//
// The dense output stays valid after Solve returns StatusSuccess or
// StatusEvent, until the next Solve. Interpolate panics if there is no
// valid accepted step or len(y) != dim.
func (s *Solver) Interpolate(t float64, y []float64) {
	if !s.step {
		panic("rk: Interpolate without an accepted step")
	}
	if len(y) != s.dim {
		panic("rk: len(y) != dim")
	}
	tab := s.tab
	ns := tab.Stages()
	if !s.dense {
		for m, c := range tab.DenseC {
			combine(s.ytmp, s.yOld, s.h, tab.DenseA[m], s.k)
			s.f(s.tOld+c*s.h, s.ytmp, s.k[ns+m])
			s.stats.Evaluations++
		}
		s.dense = true
	}
	theta := (t - s.tOld) / s.h
	for i, p := range tab.Dense {
		var v float64
		for m := len(p) - 1; m >= 0; m-- {
			v = v*theta + p[m]
		}
		s.w[i] = v * theta
	}
	combine(y, s.yOld, s.h, s.w, s.k)
}
