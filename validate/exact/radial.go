package exact

import (
	"math"
	"sync"

	"gonum.org/v1/gonum/integrate/quad"
)

// radialProblem describes the orbit integral shared by the problems on a
// static or stationary background. In units of the impact parameter b,
// with x = b/r, the orbit equation reads
//
//	dφ/dx = Φ(x)/√C(x),   C(x) = 1 + d1 x + (d2 − 1) x² + d3 x³ + d4 x⁴,
//
// normalised so that the flat, force-free problem has C = 1 − x², Φ = 1.
// The coefficients d_k and Φ − 1 vanish with the couplings, which lets the
// deflection be computed without cancelling the leading π.
type radialProblem struct {
	d [5]float64 // d[1..4]; d[0] unused
	// phiM1 returns Φ(x) − 1, computed without cancellation; nil means Φ = 1.
	phiM1 func(x float64) float64
}

// turningPoint returns x_t = b/r_min, the smallest positive root of C at
// which C changes sign, or ok = false if C stays positive (no turning
// point: the probe reaches r = 0 or a horizon).
func (p radialProblem) turningPoint() (xt float64, ok bool) {
	c := []float64{1, p.d[1], p.d[2] - 1, p.d[3], p.d[4]}
	return smallestPositiveRoot(c)
}

// deflection returns χ = Δφ − π, with Δφ = 2∫₀^{x_t} Φ dx/√C the total
// azimuth swept, and an estimate of its absolute error.
//
// The turning-point singularity is removed by x = x_t(1 − t²): with
// C(x) = (x_t − x) G(x) the integral becomes ∫₀¹ 2√x_t Φ/√G dt. The flat
// integrand with the same x_t, 2√x_t/√H with H = x_t + x, integrates to
// π/2 exactly, and is subtracted in the form
//
//	Φ/√G − 1/√H = (Φ − 1)/√G − D/(√G √H (√G + √H)),   D = G − H,
//
// where the coefficients of D are obtained by backward deflation of C,
// using C(x_t) = 0 to write each as a sum of coupling terms.
func (p radialProblem) deflection(xt float64) (chi, chiErr float64) {
	d := p.d
	x2, x3 := xt*xt, xt*xt*xt
	// G = g0 + g1 x + g2 x² + g3 x³ by backward deflation, c_k = x_t g_k − g_{k−1}.
	d0 := -(d[1] + d[2]*xt + d[3]*x2 + d[4]*x3) // g0 − x_t = (1 − x_t²)/x_t
	d1 := (d[1] + d0) / xt                      // g1 − 1
	g2 := (d[2] + d1) / xt
	g3 := (d[3] + g2) / xt
	sq := math.Sqrt(xt)
	f := func(t, omt float64) float64 {
		x := xt * omt * (1 + t)
		h := xt + x
		dd := d0 + x*(d1+x*(g2+x*g3))
		gg := h + dd
		sg, sh := math.Sqrt(gg), math.Sqrt(h)
		v := -dd / (sg * sh * (sg + sh))
		if p.phiM1 != nil {
			v += p.phiM1(x) / sg
		}
		return 2 * sq * v
	}
	val, e := gradedQuad(f)
	return 2 * val, 2 * e
}

// smallestPositiveRoot returns the smallest x > 0 where the polynomial
// c[0] + c[1] x + … (c[0] > 0) changes sign.
func smallestPositiveRoot(c []float64) (float64, bool) {
	r := signChangeRoots(c)
	if len(r) == 0 {
		return 0, false
	}
	return r[0], true
}

// signChangeRoots returns, in increasing order, the positive real roots of
// the polynomial c at which it changes sign. Monotone intervals are found
// from the roots of the derivative, recursively; each bracketed root is then
// solved by safeguarded Newton iteration.
func signChangeRoots(c []float64) []float64 {
	n := len(c) - 1
	for n > 0 && c[n] == 0 {
		n--
	}
	c = c[:n+1]
	if n == 0 {
		return nil
	}
	if n == 1 {
		x := -c[0] / c[1]
		if x > 0 {
			return []float64{x}
		}
		return nil
	}
	// Cauchy bound on the roots.
	ub := 0.0
	for k := 0; k < n; k++ {
		ub = math.Max(ub, math.Abs(c[k]/c[n]))
	}
	ub = 1 + ub
	der := make([]float64, n)
	for k := 1; k <= n; k++ {
		der[k-1] = float64(k) * c[k]
	}
	pts := []float64{0}
	for _, x := range signChangeRoots(der) {
		if x < ub {
			pts = append(pts, x)
		}
	}
	pts = append(pts, ub)
	var roots []float64
	for i := 0; i+1 < len(pts); i++ {
		lo, hi := pts[i], pts[i+1]
		flo, fhi := horner(c, lo), horner(c, hi)
		// A root exactly at a critical point is of even multiplicity (the
		// polynomial touches zero without changing sign) and is skipped.
		if !(flo < 0 && fhi > 0 || flo > 0 && fhi < 0) {
			continue
		}
		roots = append(roots, bracketRoot(c, der, lo, hi, flo))
	}
	return roots
}

func horner(c []float64, x float64) float64 {
	s := 0.0
	for k := len(c) - 1; k >= 0; k-- {
		s = s*x + c[k]
	}
	return s
}

// bracketRoot solves c(x) = 0 on [lo, hi], where c is monotone and changes
// sign, by Newton steps that fall back to (geometric, for wide brackets)
// bisection when they leave the bracket.
func bracketRoot(c, der []float64, lo, hi, flo float64) float64 {
	sLo := flo > 0
	x := 0.5 * (lo + hi)
	for it := 0; it < 400; it++ {
		fx := horner(c, x)
		if fx == 0 {
			return x
		}
		if (fx > 0) == sLo {
			lo = x
		} else {
			hi = x
		}
		nx := x - fx/horner(der, x)
		if !(nx > lo && nx < hi) {
			if lo > 0 && hi > 4*lo {
				nx = math.Sqrt(lo * hi)
			} else {
				nx = 0.5 * (lo + hi)
			}
		}
		if math.Abs(nx-x) <= 2e-16*math.Abs(x) || hi-lo <= 4e-16*hi {
			return nx
		}
		x = nx
	}
	return x
}

// Gauss–Legendre rules used on every panel of gradedQuad.
var (
	glOnce     sync.Once
	glLo, glHi [2][]float64 // nodes and weights on [−1, 1]
)

const (
	gradeLevels = 60 // the end panels are then below 1e-18 wide
	nLo         = 20 // points of the lower-order rule
	nHi         = 30 // points of the higher-order rule
)

// gradedQuad integrates f over [0, 1] on panels graded geometrically
// towards both ends, [2^{−k−2}, 2^{−k−1}] and its mirror image about 1/2,
// k < gradeLevels, plus the two end panels, each with Gauss–Legendre rules
// of nLo and nHi points (gonum quad.Legendre). The grading resolves sharp
// peaks at the ends, as in hp-quadrature for endpoint singularities (common
// practice): at t = 0 for orbits near the critical (orbiting) impact
// parameter, at t = 1 when another root of C lies just below x = 0. The error estimate is the difference of
// the two rules.
//
// f receives t together with 1 − t, computed without rounding so that the
// peak at t = 1 is resolved below the spacing of floating-point numbers
// near 1.
func gradedQuad(f func(t, omt float64) float64) (val, errEst float64) {
	glOnce.Do(func() {
		glLo = [2][]float64{make([]float64, nLo), make([]float64, nLo)}
		glHi = [2][]float64{make([]float64, nHi), make([]float64, nHi)}
		quad.Legendre{}.FixedLocations(glLo[0], glLo[1], -1, 1)
		quad.Legendre{}.FixedLocations(glHi[0], glHi[1], -1, 1)
	})
	// panel integrates over [a, b] (mirror = false) or over [1 − b, 1 − a]
	// (mirror = true), always passing 1 − t accurately.
	panel := func(rule [2][]float64, a, b float64, mirror bool) float64 {
		m, h := 0.5*(a+b), 0.5*(b-a)
		s := 0.0
		for i, x := range rule[0] {
			u := m + h*x
			if mirror {
				s += rule[1][i] * f(1-u, u)
			} else {
				s += rule[1][i] * f(u, 1-u)
			}
		}
		return h * s
	}
	lo, hi := 0.0, 0.0
	// Panels graded towards t = 0 on [0, 1/2] and towards t = 1 on [1/2, 1].
	w := 0.5
	for k := 0; k < gradeLevels; k++ {
		lo += panel(glLo, 0.5*w, w, false) + panel(glLo, 0.5*w, w, true)
		hi += panel(glHi, 0.5*w, w, false) + panel(glHi, 0.5*w, w, true)
		w *= 0.5
	}
	lo += panel(glLo, 0, w, false) + panel(glLo, 0, w, true)
	hi += panel(glHi, 0, w, false) + panel(glHi, 0, w, true)
	return hi, math.Abs(hi - lo)
}
