package predict

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables"
	"ricochet/observables/fit"
)

// Point is one configuration of the short coupling scan: the quantities a
// prediction reads, and the nonlinear result with its error estimate and
// the library's own first-order value, as frame components (t, l, b, n)
// of the impulse (index 0) and spin kick (index 1).
type Point struct {
	// Eps is |ε| in the library's conventions.
	Eps float64
	// Status is empty for a scattering event with numbers; otherwise the
	// outcome (capture, disk crossing, failure), which carries none.
	Status string
	Quantities
	// ImpactJ and ImpactEikonal are b_J = |J|/|p⃗| and the eikonal b of
	// this event, for predictions declared in those definitions.
	ImpactJ, ImpactEikonal float64
	Value, Error, First    [2][4]float64
}

// NewPoint fills a Point from a scattering outcome and the library's
// first-order kicks dp1, da1 (four-vectors in the source frame). The error
// bar of a frame component bounds its own rotation of the source-frame bars
// (observables.Frame.Err).
func NewPoint(eps float64, q Quantities, out integrate.Outcome, dp1, da1 vec.Vec4) Point {
	pt := Point{Eps: eps, Quantities: q}
	if out.Status != integrate.StatusScattered {
		pt.Status = out.Status.String()
		return pt
	}
	pt.ImpactJ = observables.ImpactParameterJ(out.In.P, out.In.B)
	pt.ImpactEikonal = observables.EikonalImpactParameter(out.In.P, out.POut, out.In.B)
	pt.fill(out.Impulse, out.ImpulseErr, dp1, out.SpinKick, out.SpinKickErr, da1, [2]float64{out.ImpulseErrIso, out.SpinKickErrIso})
	return pt
}

// fill sets the frame components of the kicks, their errors and the
// first orders from four-vectors in the source frame; iso are the parts of
// the spatial bars of Δp and Δa that bound the norm of the error
// (integrate.Outcome.ImpulseErrIso).
func (pt *Point) fill(dp, dpErr, dp1, da, daErr, da1 vec.Vec4, iso [2]float64) {
	f := pt.Frame
	for k, v := range [2][3]vec.Vec4{{dp, dpErr, dp1}, {da, daErr, da1}} {
		pt.Value[k] = f.Components(v[0])
		pt.First[k] = f.Components(v[2])
		pt.Error[k] = f.Err(v[1], iso[k])
	}
}

// ok reports whether the point has numbers.
func (pt Point) ok() bool { return pt.Status == "" }

// Prediction is the user's prediction of one observable: a formula, or a
// table of values, one per point (NaN where none is given).
type Prediction struct {
	Observable Observable
	Formula    *Formula
	Values     []float64
}

// Verdict is the classification of a prediction.
type Verdict int

const (
	// Undecided: too few points with numbers, or the prediction could not
	// be evaluated.
	Undecided Verdict = iota
	// DisagreesFirst: the residual has a first-order part, |c₁| > 3σ.
	DisagreesFirst
	// AgreesFirst: the first-order part of the residual vanishes within
	// errors and its ε² part does not: residual ∝ ε².
	AgreesFirst
	// AgreesBeyond: the first- and second-order parts vanish within
	// errors: residual ∝ ε³ or faster.
	AgreesBeyond
	// AgreesAll: every residual is consistent with zero within the
	// numerical error.
	AgreesAll
)

func (v Verdict) String() string {
	return [...]string{"undecided", "disagrees at first order", "agrees at first order", "agrees beyond first order", "agrees to all orders within errors"}[v]
}

// Key is a short machine-readable name of the verdict.
func (v Verdict) Key() string {
	return [...]string{"undecided", "disagrees", "first-order", "beyond-first-order", "all-orders"}[v]
}

// Significance is the number of standard deviations beyond which a
// coefficient counts as nonzero (3σ; common practice).
const Significance = 3

// Row is one point of a verdict: the numbers behind it.
type Row struct {
	Eps      float64 `json:"eps"`
	Status   string  `json:"status,omitempty"`
	Numeric  float64 `json:"numeric"`
	Error    float64 `json:"error"`
	Yours    float64 `json:"prediction"`
	First    float64 `json:"first_order"`
	Residual float64 `json:"residual"`
	// Own is the library's own first-order residual, numeric − first order.
	Own float64 `json:"own_residual"`
}

// Explanation is a convention change that restores first-order agreement,
// with the changes that are equivalent to it for this observable.
type Explanation struct {
	Names   []string `json:"changes"`
	Advice  string   `json:"advice"`
	Entries int      `json:"entries"` // 1 for a single change, 2 for a pair
	// Remaining is the first-order part of the residual after the change,
	// relative to the true first order, with its uncertainty.
	Remaining      float64 `json:"remaining_relative"`
	SigmaRemaining float64 `json:"remaining_relative_sigma"`
}

// Result is the verdict on one prediction.
type Result struct {
	Observable string  `json:"observable"`
	Verdict    Verdict `json:"-"`
	VerdictKey string  `json:"verdict"`
	Claimed    string  `json:"claimed_order"`
	// C1 ± SigmaC1 is the ε → 0 limit of residual/ε (zero for a correct
	// first order); C2 ± SigmaC2 the limit of residual/ε² when C1 vanishes.
	C1      float64 `json:"c1"`
	SigmaC1 float64 `json:"c1_sigma"`
	C2      float64 `json:"c2"`
	SigmaC2 float64 `json:"c2_sigma"`
	// Relative ± SigmaRelative is −C1 over the true first-order
	// coefficient: the relative error of the prediction's first order (NaN
	// when the true first order of this component vanishes).
	Relative      float64 `json:"relative_error"`
	SigmaRelative float64 `json:"relative_error_sigma"`
	// AtGiven ± SigmaAtGiven is (prediction − numeric)/numeric at the
	// largest coupling, with the numerical error propagated.
	AtGiven      float64 `json:"relative_difference_at_given"`
	SigmaAtGiven float64 `json:"relative_difference_at_given_sigma"`
	// Exponent ± SigmaExponent is n of |residual| ∝ ε^n (NaN when the
	// residual is not above the noise at enough points).
	Exponent      float64 `json:"exponent"`
	SigmaExponent float64 `json:"exponent_sigma"`
	// OwnC2 ± SigmaOwnC2 is the limit of the library's own first-order
	// residual over ε²: the true ε² coefficient.
	OwnC2      float64       `json:"own_c2"`
	SigmaOwnC2 float64       `json:"own_c2_sigma"`
	Note       string        `json:"note,omitempty"`
	Diagnosis  []Explanation `json:"diagnosis,omitempty"`
	// Unexplained is set when the prediction disagrees and no change of
	// the catalogue, alone or paired, restores first-order agreement.
	Unexplained bool  `json:"unexplained"`
	Rows        []Row `json:"points"`
}

// Settings tunes Check. The zero value (or nil) gives the defaults.
type Settings struct {
	// Catalogue is the list of convention changes tried; nil means
	// Catalogue.
	Catalogue []Transform
	// MaxDegree is the largest degree of the series fitted to
	// residual/ε; zero means 4.
	MaxDegree int
	// MaxExplanations bounds the explanations listed; zero means 4.
	MaxExplanations int
}

// Couplings returns n couplings from eps down by successive factors of
// ratio: eps, eps/ratio, …; n = 0 means 9 and ratio = 0 means 2 (a factor
// 256 in ε: enough to separate ε, ε² and ε³ at the default integrator
// accuracy, with points to spare for the truncation and window parts of
// the fit uncertainty).
func Couplings(eps float64, n int, ratio float64) []float64 {
	if n <= 0 {
		n = 9
	}
	if ratio <= 1 {
		ratio = 2
	}
	out := make([]float64, n)
	for k := range out {
		out[k] = eps / math.Pow(ratio, float64(k))
	}
	return out
}

// Check classifies each prediction against the points (one short scan of
// one configuration) and diagnoses the disagreements. Points must be
// ordered by decreasing or increasing ε; an error means a prediction that
// cannot be evaluated at all.
func Check(preds []Prediction, conv Conventions, pts []Point, s *Settings) ([]Result, error) {
	set := Settings{}
	if s != nil {
		set = *s
	}
	if set.Catalogue == nil {
		set.Catalogue = Catalogue
	}
	if set.MaxDegree == 0 {
		set.MaxDegree = 4
	}
	if set.MaxExplanations == 0 {
		set.MaxExplanations = 4
	}
	var out []Result
	for _, p := range preds {
		if err := conv.validFor(p.Observable); err != nil {
			return nil, err
		}
		if p.Formula == nil && len(p.Values) != len(pts) {
			return nil, fmt.Errorf("predict: %s: %d values for %d points", p.Observable, len(p.Values), len(pts))
		}
		r, err := checkOne(p, conv, pts, set)
		if err != nil {
			return nil, err
		}
		out = append(out, r)
	}
	return out, nil
}

// values evaluates the prediction at every point with the change t
// applied (nil: none), in the library's conventions. Points without
// numbers get NaN.
func values(p Prediction, conv Conventions, pts []Point, t *Transform) ([]float64, error) {
	o := p.Observable
	out := make([]float64, len(pts))
	for k, pt := range pts {
		out[k] = math.NaN()
		if !pt.ok() {
			continue
		}
		if p.Formula == nil {
			v := p.Values[k] * conv.output(o)
			if t != nil {
				v *= t.tableScale(o, pt.Electromagnetic)
			}
			out[k] = v
			continue
		}
		q := conv.inputs(pt)
		mirror := false
		if t != nil {
			q = t.inputs(q)
			mirror = t.Mirror
		}
		v, err := p.Formula.Real(q, mirror)
		if err != nil {
			return nil, fmt.Errorf("%v (at eps = %.4g)", err, pt.Eps)
		}
		v *= conv.output(o)
		if t != nil {
			v *= t.output(o)
		}
		out[k] = v
	}
	return out, nil
}

// residualFit is the analysis of one residual series.
type residualFit struct {
	fit            series
	ok             bool
	chi2           float64 // Σ (r/σ)² of the residuals themselves
	n              int
	consistentZero bool
}

// analyse fits residual/ε = Σ c_j ε^j over the points with numbers.
func analyse(pts []Point, o Observable, pred []float64, maxDeg int) residualFit {
	var x, y, s []float64
	var chi2 float64
	for k, pt := range pts {
		if !pt.ok() || math.IsNaN(pred[k]) {
			continue
		}
		num := pt.Value[o.Kick][o.Comp]
		sig := sigmaOf(num, pred[k], pt.Error[o.Kick][o.Comp])
		r := num - pred[k]
		x = append(x, pt.Eps)
		y = append(y, r/pt.Eps)
		s = append(s, sig/pt.Eps)
		chi2 += (r / sig) * (r / sig)
	}
	n := len(x)
	f, ok := polySeries(x, y, s, min(maxDeg, max(0, n-4)))
	// χ² consistent with n degrees of freedom at three standard deviations
	// of the χ² distribution (common practice).
	zero := n > 0 && chi2 <= float64(n)+Significance*math.Sqrt(2*float64(n))
	return residualFit{fit: f, ok: ok && n >= 3, chi2: chi2, n: n, consistentZero: zero}
}

// sigmaOf is the standard error of a residual: the numerical error
// estimate, with a floor of a few units in the last place of the numeric
// and predicted values (their rounding).
func sigmaOf(num, pred, err float64) float64 {
	sig := math.Max(err, 4*0x1p-52*math.Max(math.Abs(num), math.Abs(pred)))
	if !(sig > 0) {
		sig = math.SmallestNonzeroFloat64
	}
	return sig
}

// firstAgrees reports whether the first-order part of a residual vanishes
// within errors.
func (r residualFit) firstAgrees() bool {
	c, s := r.fit.coef(0)
	return r.consistentZero || math.Abs(c) <= Significance*s
}

func checkOne(p Prediction, conv Conventions, pts []Point, set Settings) (Result, error) {
	o := p.Observable
	res := Result{Observable: o.String(), Claimed: conv.Order.String(),
		Relative: math.NaN(), SigmaRelative: math.NaN(), Exponent: math.NaN(), SigmaExponent: math.NaN(),
		C2: math.NaN(), SigmaC2: math.NaN(), OwnC2: math.NaN(), SigmaOwnC2: math.NaN(), AtGiven: math.NaN(), SigmaAtGiven: math.NaN()}
	u, err := values(p, conv, pts, nil)
	if err != nil {
		return res, err
	}
	first := make([]float64, len(pts))
	scale, f1 := 0.0, math.NaN()
	iMax := -1
	for k, pt := range pts {
		first[k] = pt.First[o.Kick][o.Comp]
		if !pt.ok() {
			continue
		}
		for c := 0; c < 4; c++ {
			scale = math.Max(scale, math.Abs(pt.First[o.Kick][c])/pt.Eps)
		}
		if iMax < 0 || pt.Eps > pts[iMax].Eps {
			iMax = k
		}
		num := pt.Value[o.Kick][o.Comp]
		res.Rows = append(res.Rows, Row{Eps: pt.Eps, Numeric: num, Error: pt.Error[o.Kick][o.Comp], Yours: u[k],
			First: first[k], Residual: num - u[k], Own: num - first[k]})
	}
	for k, pt := range pts {
		if !pt.ok() {
			res.Rows = append(res.Rows, Row{Eps: pt.Eps, Status: pt.Status, Numeric: math.NaN(), Error: math.NaN(),
				Yours: math.NaN(), First: first[k], Residual: math.NaN(), Own: math.NaN()})
		}
	}
	sort.SliceStable(res.Rows, func(i, j int) bool { return res.Rows[i].Eps > res.Rows[j].Eps })
	if iMax >= 0 {
		f1 = pts[iMax].First[o.Kick][o.Comp] / pts[iMax].Eps
		if num := pts[iMax].Value[o.Kick][o.Comp]; num != 0 {
			res.AtGiven = (u[iMax] - num) / num
			res.SigmaAtGiven = math.Abs(u[iMax]/num) * sigmaOf(num, u[iMax], pts[iMax].Error[o.Kick][o.Comp]) / math.Abs(num)
		}
	}
	// f1 vanishes when it is below rounding of the kick's first order.
	vanishes := !(math.Abs(f1) > 1e-12*scale)

	user := analyse(pts, o, u, set.MaxDegree)
	own := analyse(pts, o, first, set.MaxDegree)
	if !user.ok {
		res.Verdict, res.VerdictKey = Undecided, Undecided.Key()
		res.Note = fmt.Sprintf("only %d of %d points have numbers; at least 3 are needed", user.n, len(pts))
		return res, nil
	}
	res.C1, res.SigmaC1 = user.fit.coef(0)
	if !vanishes {
		res.Relative, res.SigmaRelative = -res.C1/f1, res.SigmaC1/math.Abs(f1)
	}
	if c, s := own.fit.coef(1); own.ok {
		res.OwnC2, res.SigmaOwnC2 = c, s
	}
	res.Exponent, res.SigmaExponent = exponent(pts, o, u)
	c2, s2 := user.fit.coef(1)
	switch {
	case user.consistentZero:
		res.Verdict = AgreesAll
		if own.consistentZero {
			res.Note = "the nonlinear part of this component is not resolved by the scan (the library's own first-order residual is within errors)"
		}
	case !user.firstAgrees():
		res.Verdict = DisagreesFirst
	case math.Abs(c2) > Significance*s2:
		res.Verdict = AgreesFirst
		res.C2, res.SigmaC2 = c2, s2
		if conv.Order == NextOrder {
			res.Note = fmt.Sprintf("declared next order, but the residual keeps an eps^2 part: residual/eps^2 -> %.6g ± %.2g (the true eps^2 coefficient, from the library's own residual, is %.6g ± %.2g)",
				c2, s2, res.OwnC2, res.SigmaOwnC2)
		}
	default:
		res.Verdict = AgreesBeyond
		res.C2, res.SigmaC2 = c2, s2
		if conv.Order == FirstOrder && !(math.Abs(res.OwnC2) <= Significance*res.SigmaOwnC2) {
			res.Note = "declared first order, but the eps^2 part agrees too"
		}
		if math.Abs(res.OwnC2) <= Significance*res.SigmaOwnC2 {
			res.Note = "the true eps^2 coefficient of this component vanishes within errors, so a correct first order already agrees beyond first order"
		}
	}
	res.VerdictKey = res.Verdict.Key()
	if res.Verdict == DisagreesFirst {
		res.Diagnosis, err = diagnose(p, conv, pts, set, u, f1, vanishes)
		if err != nil {
			return res, err
		}
		res.Unexplained = len(res.Diagnosis) == 0
	}
	return res, nil
}

// exponent fits |residual| ∝ ε^n over the points where the residual is
// above the noise (fit.Exponent with its default window criterion).
func exponent(pts []Point, o Observable, pred []float64) (n, sigma float64) {
	var fp []fit.Point
	for k, pt := range pts {
		if !pt.ok() || math.IsNaN(pred[k]) {
			continue
		}
		num := pt.Value[o.Kick][o.Comp]
		fp = append(fp, fit.Point{Eps: pt.Eps, First: pt.First[o.Kick][o.Comp], Residual: num - pred[k],
			Sigma: sigmaOf(num, pred[k], pt.Error[o.Kick][o.Comp])})
	}
	e, err := fit.Exponent(fp, nil)
	if err != nil {
		return math.NaN(), math.NaN()
	}
	return e.N, e.SigmaN
}

// diagnose tries the catalogue's changes alone, then in pairs, and returns
// those that restore first-order agreement, grouping changes that give
// the same values for this observable. Pairs are tried only when no
// single change works, and a pair is skipped when one of its members
// alone leaves the prediction unchanged (it would only repeat a single).
func diagnose(p Prediction, conv Conventions, pts []Point, set Settings, u []float64, f1 float64, vanishes bool) ([]Explanation, error) {
	singles, doubles := pairs(set.Catalogue)
	o := p.Observable
	usable := func(t Transform) bool { return p.Formula != nil || t.OutputOnly() }
	changes := map[string]bool{}
	var found []Explanation
	var seen [][]float64
	try := func(t Transform, entries int) error {
		if !usable(t) {
			return nil
		}
		v, err := values(p, conv, pts, &t)
		if err != nil {
			// A change may take a formula outside its domain (e.g. a
			// canonical b at zero spin); that change explains nothing.
			return nil
		}
		if same(v, u) {
			return nil
		}
		if entries == 1 {
			changes[t.Name] = true
		}
		r := analyse(pts, o, v, set.MaxDegree)
		if !r.ok || !r.firstAgrees() {
			return nil
		}
		c, s := r.fit.coef(0)
		rel, srel := math.NaN(), math.NaN()
		if !vanishes {
			rel, srel = -c/f1, s/math.Abs(f1)
		}
		for i, w := range seen {
			if same(v, w) {
				found[i].Names = append(found[i].Names, t.Name)
				return nil
			}
		}
		seen = append(seen, v)
		found = append(found, Explanation{Names: []string{t.Name}, Advice: t.Explain, Entries: entries, Remaining: rel, SigmaRemaining: srel})
		return nil
	}
	for _, t := range singles {
		if err := try(t, 1); err != nil {
			return nil, err
		}
	}
	if len(found) == 0 {
		for _, t := range doubles {
			a, b, _ := strings.Cut(t.Name, " + ")
			if !changes[a] || !changes[b] {
				continue
			}
			if err := try(t, 2); err != nil {
				return nil, err
			}
		}
	}
	if len(found) > set.MaxExplanations {
		found = found[:set.MaxExplanations]
	}
	return found, nil
}

// same reports whether two value series agree to rounding.
func same(a, b []float64) bool {
	for i := range a {
		if math.IsNaN(a[i]) != math.IsNaN(b[i]) {
			return false
		}
		if math.IsNaN(a[i]) {
			continue
		}
		if math.Abs(a[i]-b[i]) > 1e-13*math.Max(math.Abs(a[i]), math.Abs(b[i])) {
			return false
		}
	}
	return true
}
