package integrate

import (
	"sync"

	"ricochet/background/vec"
)

// Asymptotic tails beyond the start and stop radius, to any order in the
// coupling (Settings.TailOrder, 3 by default).
//
// On an asymptotic leg the path is parametrised by the distance u ≥ 0
// along a fixed unit direction n̂ (the incoming direction p̂_in before the
// start, the direction p̂_stop of the final state after the stop), measured
// from the start backwards or from the stop forwards. With V⃗ = dx⃗/dτ and
// V_∥ = V⃗·n̂ > 0 the equations of motion read, with d/du = ±d/dℓ,
//
//	dp/dℓ = (dp/dτ)/V_∥,   da/dℓ = (da/dτ)/V_∥,   dx⃗_⊥/dℓ = V⃗_⊥/V_∥,
//
// where x⃗_⊥ is the displacement across n̂. On the incoming leg
// p(u) = p_in + ∫_u^∞ (dp/dℓ) du' and x⃗_⊥(u) = b⃗ + ∫_u^∞ (V⃗_⊥/V_∥) du'
// (the asymptote is approached from u = ∞); on the outgoing leg the
// integrals run from the stop, ∫_0^u. Every integrand falls like 1/u² or
// faster for forces falling like 1/r², so all of them converge, and with
// u = L w/(1 − w) they are smooth on w ∈ [0, 1] including the end at
// infinity.
//
// The integrals are solved by Picard iteration on the Gauss–Legendre nodes
// of w: the first pass evaluates the model's own Deriv on the straight
// line with momentum and spin frozen (the first-order tail), and each
// further pass evaluates it on the path, momentum and spin of the previous
// pass, obtained at the nodes from the cumulative integrals of the
// interpolating polynomial (spectral integration; Trefethen, Spectral
// Methods in MATLAB, 2000, ch. 12 and Greengard 1991, SIAM J. Numer.
// Anal. 28, 1071, for the idea, from memory). Each pass gains one order in
// the size of the tail, θ b/R (θ the deflection): two passes leave a
// truncation error of relative order θ²(b/R)³ in the impulse, against
// θ(b/R)² for the first-order tail alone (measured on Darwin's exact
// deflection, see the tests). The velocity at a node is the model's own
// dx/dτ, updated for the new momentum as (p_new − p_old)/m, so the
// displacement of a pass is consistent with its momentum.
type tailWork struct {
	n       int
	w, wt   []float64   // nodes and weights on [0, 1]
	toInf   [][]float64 // toInf[k][j] = ∫_{w_k}^1 ℓ_j(w) dw
	fromZ   [][]float64 // fromZ[k][j] = ∫_0^{w_k} ℓ_j(w) dw
	y, dy   []float64
	u, jac  []float64     // per node: u_k and du/dw at the node, for the current L
	dev     [][tN]float64 // per node: Δp (4), Δa (4), x⃗_⊥ shift (3)
	g       [][tN]float64 // per node: integrands of the same 11 quantities
	passes  int
	hasSpin bool
	// hasExtra: the state has an extra block at IE (extraModel), whose
	// first-order integral over the leg is returned in tailResult.DE.
	hasExtra bool
	// pv and sv say how the model forms its velocity (set by
	// setVelocity): dx/dτ = p/m exactly (momentumVelocity), or α p + w
	// (splitVelocity, read after each deriv call); the hidden part of the
	// velocity is then formed from them instead of as dx/dτ − p/m.
	pv bool
	sv splitVelocity
}

// setVelocity records how m forms its velocity (see tailWork.pv, sv).
//
// For a model whose Deriv goes through another frame (Rotated) the
// difference dx⃗/dτ − p⃗/m carries a rounding of ~1e-16|p⃗|/m even where
// the velocity is p/m exactly; the displacement integrand multiplies it by
// the map's Jacobian, which grows without bound towards infinity, so that
// the shift of the start position, and with it the impulse, took a
// rounding noise growing like R (measured on the tilted Kerr test hole:
// Δp_n scattered by 2e-10 at R = 1.3e5 b and by ~1e-12 at the default
// 1e3 b, several times its error bar).
func (t *tailWork) setVelocity(m Model) {
	_, t.pv = m.(momentumVelocity)
	t.sv, _ = m.(splitVelocity)
}

const (
	tP = 0 // offsets in a node's deviation vector
	tA = 4
	tX = 8
	tN = 11
)

var (
	tailMu    sync.Mutex
	tailCache = map[int]*tailMatrices{}
)

type tailMatrices struct {
	w, wt        []float64
	toInf, fromZ [][]float64
}

// spectralIntegration returns the Gauss–Legendre nodes and weights on
// [0, 1] and the matrices of the cumulative integrals of the Lagrange
// interpolant through the nodes, from w_k to 1 and from 0 to w_k. The
// integral of ℓ_j over [0, w_k] is computed exactly by n-point
// Gauss–Legendre quadrature of the degree n−1 polynomial ℓ_j.
func spectralIntegration(n int) *tailMatrices {
	tailMu.Lock()
	defer tailMu.Unlock()
	if m, ok := tailCache[n]; ok {
		return m
	}
	w, wt := legendre(n)
	lag := func(j int, x float64) float64 {
		v := 1.0
		for m := 0; m < n; m++ {
			if m != j {
				v *= (x - w[m]) / (w[j] - w[m])
			}
		}
		return v
	}
	m := &tailMatrices{w: w, wt: wt, toInf: make([][]float64, n), fromZ: make([][]float64, n)}
	for k := 0; k < n; k++ {
		m.toInf[k] = make([]float64, n)
		m.fromZ[k] = make([]float64, n)
		for j := 0; j < n; j++ {
			var s float64
			for q := 0; q < n; q++ {
				s += wt[q] * lag(j, w[k]*w[q])
			}
			s *= w[k]
			m.fromZ[k][j] = s
			m.toInf[k][j] = wt[j] - s
		}
	}
	tailCache[n] = m
	return m
}

func newTailWork(dim, n, passes int) *tailWork {
	mat := spectralIntegration(n)
	t := &tailWork{n: n, w: mat.w, wt: mat.wt, toInf: mat.toInf, fromZ: mat.fromZ,
		y: make([]float64, dim), dy: make([]float64, dim), u: make([]float64, n), jac: make([]float64, n),
		dev: make([][tN]float64, n), g: make([][tN]float64, n), passes: passes, hasSpin: dim > IA,
		hasExtra: dim > IE}
	return t
}

// tailResult is what one leg gives: the changes of momentum and spin over
// the whole leg, the displacement across n̂ accumulated over the leg (on
// the incoming leg the shift of the start position from the asymptote),
// and the sizes of the last pass's corrections.
type tailResult struct {
	DP, DA vec.Vec4
	Disp   vec.Vec3
	// DE is the change of the extra block at IE over the leg, from its
	// rate on the last pass's nodes (models with one, tailWork.hasExtra).
	DE [4]float64
	// Change and DispChange are |ΔDP⃗| and |ΔDisp| of the last pass: the
	// size of the last correction, from which the remaining truncation
	// error is estimated.
	Change, DispChange float64
	Evals              int
}

// leg integrates one asymptotic leg. base is the model state at the inner
// end of the reference line (incoming: the position on the asymptote at
// the start with the asymptotic momentum and spin; outgoing: the final
// state), n̂ the unit direction of motion along the leg, incoming selects
// the leg, L the length scale of the map u = L w/(1 − w) and deriv the
// model's right-hand side.
func (t *tailWork) leg(deriv func(y, dy []float64), mass float64, base []float64, nh vec.Vec3, incoming bool, L float64) tailResult {
	var res tailResult
	n := t.n
	dev, gs := t.dev[:n], t.g[:n]
	w, wt := t.w[:n], t.wt[:n]
	us, jacs := t.u[:n], t.jac[:n]
	for k := range dev {
		dev[k] = [tN]float64{}
		den := 1 - w[k]
		us[k] = L * w[k] / den
		jacs[k] = L / (den * den)
	}
	// Spinless models: the spin deviation stays zero.
	nq := tA
	if t.hasSpin {
		nq = tX
	}
	sign, mat := 1.0, t.fromZ // node k at x_b + sign n̂ u_k + shift
	if incoming {
		sign, mat = -1, t.toInf
	}
	mat = mat[:n]
	im := 1 / mass
	pb := vec.Vec3{base[IP+1], base[IP+2], base[IP+3]}
	y, dy := t.y, t.dy
	_, _ = y[IP+3], dy[IP+3]
	for pass := 0; pass < t.passes; pass++ {
		var dp, da [4]float64
		for k := range dev {
			u, jac := us[k], jacs[k]
			d := &dev[k]
			copy(y, base)
			for i := 1; i < 4; i++ {
				y[IX+i] = base[IX+i] + sign*nh[i-1]*u + d[tX+i-1]
			}
			for i := 0; i < 4; i++ {
				y[IP+i] = base[IP+i] + d[tP+i]
			}
			if t.hasSpin {
				for i := 0; i < 4; i++ {
					y[IA+i] = base[IA+i] + d[tA+i]
				}
			}
			deriv(y, dy)
			res.Evals++
			g := &gs[k]
			c := jac / (dy[IX+1]*nh[0] + dy[IX+2]*nh[1] + dy[IX+3]*nh[2])
			if t.hasExtra && pass == t.passes-1 {
				for i := 0; i < 4; i++ {
					res.DE[i] += wt[k] * c * dy[IE+i]
				}
			}
			for i := 0; i < 4; i++ {
				g[tP+i] = c * dy[IP+i]
				if t.hasSpin {
					g[tA+i] = c * dy[IA+i]
				}
				dp[i] += wt[k] * g[tP+i]
				da[i] += wt[k] * g[tA+i]
			}
			// Keep, for the displacement integrand, the part of the
			// velocity that is not p/m (zero for the models whose
			// dx/dτ is p/m, (α − 1/m) p + w for a split velocity, see
			// setVelocity; else formed as Deriv forms it, so that it
			// vanishes exactly where the velocity is p/m) and
			// V_∥ − p_∥/m.
			switch {
			case t.pv:
				g[tX], g[tX+1], g[tX+2] = 0, 0, 0
			case t.sv != nil:
				// α p + w − p/m with α − 1/m formed first: the part
				// along p is along n̂ up to the small Δp⃗ and drops
				// out of the transverse integrand below.
				alpha, wv := t.sv.VelocitySplit()
				da := alpha - im
				for i := 1; i < 4; i++ {
					g[tX+i-1] = da*y[IP+i] + wv[i]
				}
			default:
				for i := 1; i < 4; i++ {
					g[tX+i-1] = dy[IX+i] - y[IP+i]*im
				}
			}
		}
		// New momentum and spin deviations at the nodes, then the
		// displacement integrand jac V⃗_⊥/V_∥ with V⃗ = (p_base + Δp)/m
		// plus the non-p/m part. The transverse part is formed from the
		// deviation alone (p_base ∥ n̂): projecting the full velocity
		// would leave a rounding of 1e-16|V⃗| that the map's Jacobian
		// multiplies by up to 10³ R.
		// Scalars rather than vec values in these loops: Go keeps arrays
		// in memory, and the loops run at every node of every pass.
		for k := range dev {
			var n0, n1, n2, n3, n4, n5, n6, n7 float64
			row := mat[k][:n]
			if nq == tA {
				for j := range gs {
					r, gj := row[j], &gs[j]
					n0 += r * gj[0]
					n1 += r * gj[1]
					n2 += r * gj[2]
					n3 += r * gj[3]
				}
			} else {
				for j := range gs {
					r, gj := row[j], &gs[j]
					n0 += r * gj[0]
					n1 += r * gj[1]
					n2 += r * gj[2]
					n3 += r * gj[3]
					n4 += r * gj[4]
					n5 += r * gj[5]
					n6 += r * gj[6]
					n7 += r * gj[7]
				}
			}
			d := &dev[k]
			d[0], d[1], d[2], d[3], d[4], d[5], d[6], d[7] = n0, n1, n2, n3, n4, n5, n6, n7
		}
		var disp vec.Vec3
		nh0, nh1, nh2 := nh[0], nh[1], nh[2]
		pbn := (pb[0]*nh0 + pb[1]*nh1 + pb[2]*nh2) * im
		var disp0, disp1, disp2 float64
		for k := range dev {
			d, g := &dev[k], &gs[k]
			jac := jacs[k]
			h0, h1, h2 := g[tX], g[tX+1], g[tX+2]
			v0, v1, v2 := d[tP+1]*im, d[tP+2]*im, d[tP+3]*im
			vn := v0*nh0 + v1*nh1 + v2*nh2
			hn := h0*nh0 + h1*nh1 + h2*nh2
			par := pbn + vn + hn
			c := jac / par
			// tr = (dv − (dv·n̂)n̂) + (hid − (hid·n̂)n̂), perp = c tr.
			p0 := c * ((v0 - vn*nh0) + (h0 - hn*nh0))
			p1 := c * ((v1 - vn*nh1) + (h1 - hn*nh1))
			p2 := c * ((v2 - vn*nh2) + (h2 - hn*nh2))
			g[tX], g[tX+1], g[tX+2] = p0, p1, p2
			disp0 += wt[k] * p0
			disp1 += wt[k] * p1
			disp2 += wt[k] * p2
		}
		disp = vec.Vec3{disp0, disp1, disp2}
		for k := range dev {
			var x0, x1, x2 float64
			row := mat[k][:n]
			for j := range gs {
				r, gj := row[j], &gs[j]
				x0 += r * gj[tX]
				x1 += r * gj[tX+1]
				x2 += r * gj[tX+2]
			}
			d := &dev[k]
			d[tX], d[tX+1], d[tX+2] = x0, x1, x2
		}
		DP := vec.Vec4(dp)
		res.Change = DP.Spatial().Sub(res.DP.Spatial()).Norm()
		res.DispChange = disp.Sub(res.Disp).Norm()
		res.DP, res.DA, res.Disp = DP, vec.Vec4(da), disp
	}
	return res
}
