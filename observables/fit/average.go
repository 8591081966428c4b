package fit

import (
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// Quality is the goodness of fit of the model that carries the most weight
// in a result.
type Quality struct {
	Chi2 float64 `json:"chi2"`
	DOF  int     `json:"dof"`
	// Birge is the Birge ratio √(χ²/dof) (Birge, Phys. Rev. 40, 207
	// (1932), from memory): about one when the model describes the points
	// within their errors, much larger when it does not or the errors are
	// underestimated.
	Birge float64 `json:"birge_ratio"`
	// Inflation is the factor √ĉ ≥ 1 by which the uncertainties were
	// widened for overdispersion (see the package comment).
	Inflation float64 `json:"inflation"`
	// PValue is the probability of a χ² at least this large for a correct
	// model with honest Gaussian errors (χ² distribution with DOF degrees
	// of freedom).
	PValue float64 `json:"p_value"`
}

// PoorPValue is the p-value below which Quality.Poor reports a fit as poor
// (a 3.3σ-equivalent rejection; common practice).
const PoorPValue = 1e-3

// ReducedChi2 returns χ²/dof (NaN without degrees of freedom).
func (q Quality) ReducedChi2() float64 {
	if q.DOF <= 0 {
		return math.NaN()
	}
	return q.Chi2 / float64(q.DOF)
}

// Poor reports whether the model fails to describe the points within their
// errors (PValue < PoorPValue): the quoted uncertainties then rest on the
// overdispersion inflation and the spread over models.
func (q Quality) Poor() bool { return q.DOF > 0 && q.PValue < PoorPValue }

func quality(chi2 float64, dof int, chat float64) Quality {
	q := Quality{Chi2: chi2, DOF: dof, Birge: math.NaN(), Inflation: math.Sqrt(chat), PValue: math.NaN()}
	if dof > 0 {
		q.Birge = math.Sqrt(chi2 / float64(dof))
		q.PValue = distuv.ChiSquared{K: float64(dof)}.Survival(chi2)
	}
	return q
}

// maxOverdispersion is the largest ĉ of a family whose structure is taken
// as adequate: beyond about 4 the excess scatter points to a lack of fit
// of the models rather than to underestimated errors (Burnham & Anderson
// 2002, §2.5.1, from memory), and the inflation would not measure the
// bias.
const maxOverdispersion = 4

// candidate is one model of a nested family fitted in one window.
type candidate struct {
	fit    nestedFit
	qaic   float64
	weight float64
}

// family is the set of nested models fitted in one window, with their
// Akaike weights.
type family struct {
	models []candidate
	best   int     // index of the model of largest weight
	chat   float64 // overdispersion ĉ ≥ 1
	n      int     // points in the window
	// censored reports that the criterion prefers the most flexible model
	// the window allows: it cannot tell whether still more terms matter.
	censored bool
	// adequate reports whether the window can assess its own truncation:
	// at least two models were fitted and the most flexible one describes
	// the points up to an overdispersion ĉ ≤ maxOverdispersion.
	adequate bool
}

// fitFamily fits the models of mMin…mMax leading columns (limited by the
// numerical rank and by n − 2, so that every model keeps two degrees of
// freedom) and weighs them by the quasi-likelihood Akaike criterion
//
//	QAIC = χ²/ĉ + 2m,
//
// w ∝ exp(−ΔQAIC/2) (Akaike 1974; Burnham & Anderson, Model Selection and
// Multimodel Inference, 2nd ed. (2002), §2.5 and §2.9; from memory), where
// the overdispersion ĉ = max(1, χ²/dof) is that of the most flexible model
// tried (Burnham & Anderson §2.5.1, "the global model"). The point errors
// are given, not estimated from the scatter, so the penalty 2m is the
// exact bias correction of a linear Gaussian model (Mallows' C_p) and the
// small-sample term of AICc (Hurvich & Tsai 1989), which stems from
// estimating the variance, does not apply: with it, near-saturated models
// that fit were rejected in favour of ones that did not (measured on the
// coverage table). ok is false when not even mMin columns can be fitted.
func fitFamily(q *nestedLS, mMin, mMax int, want ...int) (family, bool) {
	mMax = min(mMax, q.rank(), q.rows-2)
	if mMax < mMin {
		return family{}, false
	}
	f := family{n: q.rows}
	for m := mMin; m <= mMax; m++ {
		f.models = append(f.models, candidate{fit: q.solve(m, want...)})
	}
	g := f.models[len(f.models)-1].fit
	f.chat = math.Max(1, g.chi2/float64(g.dof))
	lo := math.Inf(1)
	for i := range f.models {
		c := &f.models[i]
		m := float64(c.fit.m)
		c.qaic = c.fit.chi2/f.chat + 2*m
		if c.qaic < lo {
			lo, f.best = c.qaic, i
		}
	}
	sum := 0.0
	for i := range f.models {
		c := &f.models[i]
		c.weight = math.Exp(-(c.qaic - lo) / 2)
		sum += c.weight
	}
	for i := range f.models {
		f.models[i].weight /= sum
	}
	f.censored = len(f.models) >= 2 && f.best == len(f.models)-1
	f.adequate = len(f.models) >= 2 && f.chat <= maxOverdispersion
	return f, true
}

// estimate is a fitted number: the model average and its unconditional
// standard uncertainty, split into the part propagated from the point
// errors (with the overdispersion inflation) and the part from the spread
// over models.
type estimate struct {
	value, sigma, stat, model float64
	// proxy is sigma without the overdispersion inflation, by which
	// windows are compared (ĉ fluctuates from window to window; choosing
	// by it would favour windows where it happens to be small).
	proxy float64
	ok    bool
}

// average returns the model average of scale·c_j over the models of the
// family that contain c_j, with weights renormalised over them, and its
// unconditional variance (Burnham & Anderson 2002, eq. (6.12), from memory)
//
//	σ² = Σ w_i [ĉ var(θ_i) + (θ_i − θ̄)²],
//
// which is never smaller than their earlier form (4.9), the square of
// Σ w_i √(ĉ var(θ_i) + (θ_i − θ̄)²).
func (f family) average(j int, scale float64) estimate {
	var sw, mean float64
	for _, c := range f.models {
		if c.fit.m > j {
			sw += c.weight
			mean += c.weight * c.fit.c[j] * scale
		}
	}
	if !(sw > 0) {
		return estimate{value: math.NaN(), sigma: math.NaN(), stat: math.NaN(), model: math.NaN()}
	}
	mean /= sw
	var stat2, mod2 float64
	for _, c := range f.models {
		if c.fit.m > j {
			w := c.weight / sw
			sh := c.fit.shift[j]
			stat2 += w * math.Max(c.fit.varc[j], sh*sh) * scale * scale
			d := c.fit.c[j]*scale - mean
			mod2 += w * d * d
		}
	}
	if f.censored {
		// Truncation of a censored family: the last change, from the
		// next-to-last model to the last (common practice for the
		// truncation error of a series: the size of the last correction
		// taken); the whole value when the next-to-last lacks c_j.
		last, prev := f.models[len(f.models)-1].fit, f.models[len(f.models)-2].fit
		d := last.c[j] * scale
		if prev.m > j {
			d -= prev.c[j] * scale
		}
		mod2 += d * d
	}
	return estimate{value: mean, sigma: math.Sqrt(f.chat*stat2 + mod2), stat: math.Sqrt(f.chat * stat2), model: math.Sqrt(mod2), proxy: math.Sqrt(stat2 + mod2), ok: true}
}

// bestQuality is the goodness of fit of the family's best model.
func (f family) bestQuality() Quality {
	b := f.models[f.best].fit
	return quality(b.chi2, b.dof, f.chat)
}

// DefaultICIThreshold is the default half-width, in standard
// uncertainties, of the intervals compared by the window rule.
const DefaultICIThreshold = 2

// iciSelect implements the intersection-of-confidence-intervals rule for
// an adaptive window (Goldenshluger & Nemirovski, Math. Methods Statist. 6,
// 135 (1997); Katkovnik, IEEE Trans. Signal Process. 47, 2567 (1999); a
// form of Lepski's method; from memory): of nested windows of growing
// size with estimates θ_i ± σ_i, the admissible ones are those up to the
// largest i for which the intervals [θ_j − Γσ_j, θ_j + Γσ_j], j ≤ i, still
// have a common point; of these it returns the one of smallest σ (of the
// first entry, without the overdispersion inflation), which is the largest window when σ falls with the window
// size as in the original rule, and otherwise avoids a larger window
// whose truncation estimate is cruder.
// Small windows are little affected by the higher orders but have large
// σ; the rule stops where a larger window's estimate moves away from
// what the smaller ones allow, i.e. where the truncation bias becomes
// visible above the noise. All est[i] have the same length; a window
// whose first entry is not ok is skipped, other entries that are not ok
// impose no constraint. It returns −1 when no window is usable.
func iciSelect(est [][]estimate, use []bool, gamma float64) int {
	sel := -1
	var lo, hi []float64
	for i, es := range est {
		if !use[i] || len(es) == 0 || !es[0].ok || math.IsNaN(es[0].sigma) {
			continue
		}
		if lo == nil {
			lo, hi = make([]float64, len(es)), make([]float64, len(es))
			for k := range lo {
				lo[k], hi[k] = math.Inf(-1), math.Inf(1)
			}
		}
		nlo, nhi := append([]float64(nil), lo...), append([]float64(nil), hi...)
		cross := false
		for k, e := range es {
			if !e.ok || math.IsNaN(e.value) || math.IsNaN(e.sigma) {
				continue // not determined in this window: no constraint
			}
			nlo[k] = math.Max(nlo[k], e.value-gamma*e.sigma)
			nhi[k] = math.Min(nhi[k], e.value+gamma*e.sigma)
			if nlo[k] > nhi[k] {
				cross = true
			}
		}
		if cross {
			break
		}
		lo, hi = nlo, nhi
		if sel < 0 || es[0].proxy < est[sel][0].proxy {
			sel = i
		}
	}
	return sel
}

// windowEnds returns the sizes of the nested windows tried for n points
// with at least mMin points each: every size up to 64 windows, beyond that
// sizes growing geometrically by 2^(1/8) (about 9 %), so that the number
// of windows grows only like 8 log₂ n.
func windowEnds(n, mMin int) []int {
	if n < mMin {
		return nil
	}
	var out []int
	if n-mMin < 64 {
		for m := mMin; m <= n; m++ {
			out = append(out, m)
		}
		return out
	}
	for x := float64(mMin); ; x *= math.Pow(2, 1.0/8) {
		m := int(math.Round(x))
		if m >= n {
			break
		}
		if len(out) == 0 || m > out[len(out)-1] {
			out = append(out, m)
		}
	}
	return append(out, n)
}

// adequate returns, for each window, whether it takes part in the window
// rule. Preferred are the adequate windows (see family.adequate); without
// any, the windows with at least two models (whose truncation is at least
// estimated by the last change); without any, all. A window where even
// the most flexible model fails to describe the points has a bias the
// overdispersion inflation does not measure.
func adequate[W any](wins []W, fam func(W) family) []bool {
	use := make([]bool, len(wins))
	for _, tier := range []func(family) bool{
		func(f family) bool { return f.adequate },
		func(f family) bool { return len(f.models) >= 2 },
		func(family) bool { return true },
	} {
		found := false
		for i, w := range wins {
			use[i] = tier(fam(w))
			found = found || use[i]
		}
		if found {
			break
		}
	}
	return use
}

// window is one nested window: its family of models, the estimates of the
// fitted numbers in it (the first one leads the window rule) and its
// number of points.
type window struct {
	fam  family
	est  []estimate
	size int
}

// selectWindow applies the window rule to the windows tried (at least
// one) and returns the chosen one; without any usable window it returns
// the largest.
func selectWindow(wins []window, gamma float64) window {
	ests := make([][]estimate, len(wins))
	for i, w := range wins {
		ests[i] = w.est
	}
	sel := iciSelect(ests, adequate(wins, func(w window) family { return w.fam }), gamma)
	if sel < 0 {
		sel = len(wins) - 1
	}
	return wins[sel]
}

// weights returns the Akaike weights of the family indexed by m − m0
// (zero for models not tried).
func (f family) weights(m0 int) []float64 {
	var w []float64
	for _, c := range f.models {
		for len(w) <= c.fit.m-m0 {
			w = append(w, 0)
		}
		w[c.fit.m-m0] = c.weight
	}
	return w
}
