package integrate

import (
	"math"

	"ricochet/background/vec"
)

// Osculating variables of the scattering driver.
//
// Scatter integrates in the angle clock σ, dτ/dσ = r²/(b K) with
// K = |p⃗_in|/m, and in the orthonormal frame of the incoming motion
// (motionFrame). On a straight line of impact parameter b, σ is the angle
// that the position vector sweeps (dφ/dτ = b K/r²), so the whole path,
// from r = ∞ in to r = ∞ out, spans Δσ = π up to the deflection, however
// far out it starts: the far zone, where a proper-time or logarithmic
// clock spends most of its steps, is a short stretch of σ next to each
// end (Sundman 1912, from memory: a time transformation dt = r^n ds, here
// n = 2 as in Levi-Civita's regularisation; common practice in celestial
// mechanics). In that frame the position is split relative to the current
// direction of motion p̂ = p⃗/|p⃗|:
//
//	x⃗ = λ p̂ + β⃗,   λ = x⃗·p̂ = 2bζ/(1 − ζ²),   β⃗ ⊥ p̂,
//
// the along-track coordinate λ, carried as ζ = tan(½ atan(λ/b)) ∈ (−1, 1),
// and the across-track vector β⃗, the impact vector of the osculating
// straight line. With V⃗ = dx⃗/dτ, F⃗ = dp⃗/dτ and ω⃗ = dp̂/dτ =
// (F⃗ − (F⃗·p̂)p̂)/|p⃗|,
//
//	dλ/dτ = V⃗·p̂ + β⃗·ω⃗,
//	dβ⃗/dτ = V⃗ − (V⃗·p̂)p̂ − (β⃗·ω⃗)p̂ − λω⃗,
//	dζ/dτ = (dλ/dτ)(1 − ζ²)²/(2b(1 + ζ²)),
//
// exact identities (β⃗·p̂ stays zero up to the integration error, and what
// it carries is an along-track shift). The point of the variables:
//
//   - On a straight line ζ = tan(σ/2 + const) and β⃗ is constant; the
//     momentum deviation grows like the swept angle (dp⃗/dσ = F⃗ r²/(bK)
//     tends to a constant for a 1/r² force). Every variable is smooth
//     in σ up to the ends ζ = ±1 (r = ∞), so the steps in the far zone
//     are as long as in the encounter and the cost hardly depends on the
//     start radius.
//   - β⃗ is of order b on both legs and is stored as such: the transverse
//     position keeps the precision of b however far out the path starts,
//     while in Cartesian components the outgoing leg (rotated by the
//     deflection) would carry it as the difference of numbers of order R
//     (a floor of 1e-16 R that stalls the step control beyond R ~ 1e6 b).
//   - The error of the along-track coordinate, which in a static
//     background is a time translation of the state along its own path,
//     can be weighed by its physical effect instead of relative to R (see
//     weigher). ζ near ±1 holds λ to a relative 1e-16·λ/b, an along-track
//     shift of 1e-16 λ²/b, below that physical scale (tol λ²/b) at any
//     tolerance above 1e-16.
//
// Momentum and spin are integrated as deviations from their incoming
// asymptotic values (p⁰_in, |p⃗_in|, 0, 0) and a_in, the extra block of
// a model with more than a spin (extraModel, at IE) and the coordinate
// time as they are (no background depends on the time).
type osculating struct {
	m         Model
	pscale    float64 // scale of the momentum deviation: |Δp⃗₁|
	ascale    float64 // scale of the spin deviation
	escale    float64 // scale of the extra block (extraModel), dim > IE
	dim       int     // model dimension
	n         int     // dimension of the integrated vector with the time: dim + 1
	b, K      float64
	mass      float64
	p0, pinN  float64
	ain       vec.Vec4 // a_in in the motion frame
	fr        motionFrame
	ident     bool // the motion frame is the frame of record
	pv        bool
	sv        splitVelocity // non-nil for models with dx/dτ = α p + w
	imass     float64       // 1/m
	ym, yb    []float64     // model state, motion and background frame
	dyb       []float64
	deviation []float64
	f         func(y, dy []float64) // the model's right-hand side (derivOf)
	iKb       float64               // 1/(b K): dτ/dσ = r² iKb
	// Memo of geometry for the per-step hooks (weights, step bound,
	// events), which see the same state several times: the inputs
	// (ζ, β⃗, spatial momentum deviation) and r, λ, dλ/dζ.
	memoKey             [7]float64
	memoR, memoL, memoC float64
	memoOK              bool
}

// Offsets in the integrated vector Z. The coordinate time, which no
// background depends on, comes last, at index dim (the model's dimension),
// and is integrated only when someone looks at it (Settings.Observe): the
// solver's vector then has dim + 1 components, else dim (hasTime).
const (
	zW = 0  // ζ = tan(½ atan(λ/b)): λ = 2bζ/(1 − ζ²)
	zB = 1  // β⃗ (3 components)
	zP = 4  // p^μ − p^μ_in (4 components)
	zA = 8  // a^μ − a^μ_in (4 components)
	zE = IE // the extra block as it is (4 components, dim > IE)
)

// hasTime reports whether Z carries the coordinate time (at index o.dim).
func (o *osculating) hasTime(Z []float64) bool { return len(Z) > o.dim }

// time returns the coordinate time of Z, 0 when it is not integrated.
func (o *osculating) time(Z []float64) float64 {
	if o.hasTime(Z) {
		return Z[o.dim]
	}
	return 0
}

func newOsculating(m Model, in InState, b, K float64) *osculating {
	dim := m.Dim()
	o := &osculating{m: m, dim: dim, n: dim + 1, b: b, K: K, mass: m.Mass(),
		p0: in.P[0], pinN: in.P.Spatial().Norm(), fr: newMotionFrame(in),
		ym: make([]float64, dim), yb: make([]float64, dim), dyb: make([]float64, dim),
		deviation: make([]float64, dim), f: derivOf(m), iKb: 1 / (b * K), imass: 1 / m.Mass()}
	_, o.pv = m.(momentumVelocity)
	o.sv, _ = m.(splitVelocity)
	o.ident = o.fr == motionFrame{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}
	a := in.A.Spatial()
	o.ain = vec.Vec4{in.A[0], o.fr[0].Dot(a), o.fr[1].Dot(a), o.fr[2].Dot(a)}
	return o
}

// direction returns p̂ and |p⃗| for the momentum block of Z.
func (o *osculating) direction(Z []float64) (c, s2, s3, pn float64) {
	p1, p2, p3 := o.pinN+Z[zP+1], Z[zP+2], Z[zP+3]
	pn = math.Sqrt(p1*p1 + p2*p2 + p3*p3)
	ip := 1 / pn
	return p1 * ip, p2 * ip, p3 * ip, pn
}

// alongTrack returns λ = 2bζ/(1 − ζ²) and dλ/dζ = 2b(1 + ζ²)/(1 − ζ²)²
// for the along-track variable ζ = Z[zW], with 1 − ζ² formed as
// (1 − ζ)(1 + ζ), exact near the ends ζ = ±1.
func alongTrack(b, z float64) (lam, dl float64) {
	omz := (1 - z) * (1 + z)
	lam = 2 * b * z / omz
	dl = 2 * b * (1 + z*z) / (omz * omz)
	return lam, dl
}

// zetaOf returns ζ = tan(½ atan(λ/b)) = λ/(b + √(b² + λ²)).
func zetaOf(b, lam float64) float64 {
	return lam / (b + math.Hypot(b, lam))
}

// position returns x⃗ in the motion frame, λ and dλ/dζ.
func (o *osculating) position(Z []float64) (x1, x2, x3, lam, dl float64) {
	c, s2, s3, _ := o.direction(Z)
	lam, dl = alongTrack(o.b, Z[zW])
	return lam*c + Z[zB], lam*s2 + Z[zB+1], lam*s3 + Z[zB+2], lam, dl
}

// geometry returns r = |x⃗|, λ and dλ/dζ for Z, remembering the last
// answer: the step bound, the error weights and the event functions ask
// for the same state in turn.
func (o *osculating) geometry(Z []float64) (r, lam, dl float64) {
	_ = Z[zP+3]
	key := [7]float64{Z[zW], Z[zB], Z[zB+1], Z[zB+2], Z[zP+1], Z[zP+2], Z[zP+3]}
	// Compared component by component, inline (an array comparison is
	// a call).
	m := &o.memoKey
	if o.memoOK && key[0] == m[0] && key[1] == m[1] && key[2] == m[2] && key[3] == m[3] &&
		key[4] == m[4] && key[5] == m[5] && key[6] == m[6] {
		return o.memoR, o.memoL, o.memoC
	}
	x1, x2, x3, lam, dl := o.position(Z)
	r = math.Sqrt(x1*x1 + x2*x2 + x3*x3)
	o.memoKey, o.memoR, o.memoL, o.memoC, o.memoOK = key, r, lam, dl, true
	return r, lam, dl
}

// radius returns |x⃗| for Z.
func (o *osculating) radius(Z []float64) float64 {
	r, _, _ := o.geometry(Z)
	return r
}

// motionState writes the model state in the motion frame into y.
func (o *osculating) motionState(Z, y []float64) {
	x1, x2, x3, _, _ := o.position(Z)
	y[IX], y[IX+1], y[IX+2], y[IX+3] = o.time(Z), x1, x2, x3
	y[IP] = o.p0 + Z[zP]
	y[IP+1] = o.pinN + Z[zP+1]
	y[IP+2] = Z[zP+2]
	y[IP+3] = Z[zP+3]
	if o.dim > IA {
		for i := 0; i < 4; i++ {
			y[IA+i] = o.ain[i] + Z[zA+i]
		}
	}
	if o.dim > IE {
		copy(y[IE:IE+4], Z[zE:zE+4])
	}
}

// toModel writes the model state in the background's frame into y.
func (o *osculating) toModel(Z, y []float64) {
	o.motionState(Z, o.ym)
	o.fr.fromFrame(y, o.ym) // a copy for the frame of record
}

// deviations returns the momentum and spin deviations of Z in the
// background's frame, in the model's layout (the position block is zero).
// The slice is reused by the next call.
func (o *osculating) deviations(Z []float64) []float64 {
	d := o.deviation
	for i := range d {
		d[i] = 0
	}
	copy(d[IP:IP+4], Z[zP:zP+4])
	if o.dim > IA {
		copy(d[IA:IA+4], Z[zA:zA+4])
	}
	o.fr.fromFrame(d, d)
	return d
}

// fromModel builds Z from the model state y (background frame) whose
// position is given separately, and more precisely, in the motion frame as
// xf.
func (o *osculating) fromModel(y []float64, xf vec.Vec4, Z []float64) {
	o.fr.toFrame(o.ym, y)
	if o.hasTime(Z) {
		Z[o.dim] = xf[0]
	}
	Z[zP] = o.ym[IP] - o.p0
	Z[zP+1] = o.ym[IP+1] - o.pinN
	Z[zP+2] = o.ym[IP+2]
	Z[zP+3] = o.ym[IP+3]
	if o.dim > IA {
		for i := 0; i < 4; i++ {
			Z[zA+i] = o.ym[IA+i] - o.ain[i]
		}
	}
	if o.dim > IE {
		copy(Z[zE:zE+4], o.ym[IE:IE+4])
	}
	c, s2, s3, _ := o.direction(Z)
	X1, X2, X3 := xf[1], xf[2], xf[3]
	lam := X1*c + X2*s2 + X3*s3
	// β⃗ = x⃗ − λp̂ with 1 − c² written as s₂² + s₃²: no cancellation of
	// numbers of order R in the transverse components.
	Z[zB] = X1*(s2*s2+s3*s3) - c*(X2*s2+X3*s3)
	Z[zB+1] = X2 - lam*s2
	Z[zB+2] = X3 - lam*s3
	Z[zW] = zetaOf(o.b, lam)
}

// deriv writes dZ/dσ.
func (o *osculating) deriv(Z, dZ []float64) {
	_ = Z[zP+3]
	_ = dZ[zP+3]
	p1, p2, p3 := o.pinN+Z[zP+1], Z[zP+2], Z[zP+3]
	pn := math.Sqrt(p1*p1 + p2*p2 + p3*p3)
	ipn := 1 / pn
	c, s2, s3 := p1*ipn, p2*ipn, p3*ipn
	lam, dl := alongTrack(o.b, Z[zW])
	b1, b2, b3 := Z[zB], Z[zB+1], Z[zB+2]
	x1, x2, x3 := lam*c+b1, lam*s2+b2, lam*s3+b3
	bp := b1*c + b2*s2 + b3*s3
	// The model's state, in the background's frame.
	ym := o.ym
	ym[IX], ym[IX+1], ym[IX+2], ym[IX+3] = o.time(Z), x1, x2, x3
	ym[IP] = o.p0 + Z[zP]
	ym[IP+1] = p1
	ym[IP+2] = p2
	ym[IP+3] = p3
	if o.dim > IA {
		for i := 0; i < 4; i++ {
			ym[IA+i] = o.ain[i] + Z[zA+i]
		}
	}
	if o.dim > IE {
		copy(ym[IE:IE+4], Z[zE:zE+4])
	}
	y, dy := ym, o.dyb
	if !o.ident {
		y = o.yb
		o.fr.fromFrame(y, ym)
	}
	o.f(y, dy)
	if !o.ident {
		o.fr.toFrame(dy, dy)
	}
	h := (x1*x1 + x2*x2 + x3*x3) * o.iKb // dτ/dσ
	F1, F2, F3 := dy[IP+1], dy[IP+2], dy[IP+3]
	Fa := F1*c + F2*s2 + F3*s3
	w1, w2, w3 := (F1-Fa*c)*ipn, (F2-Fa*s2)*ipn, (F3-Fa*s3)*ipn
	// β⃗·ω⃗ = (β⃗·F⃗ − F_∥ β⃗·p̂)/|p⃗|: β⃗·p̂ does not wait for the force, so
	// the chain from the model's result to dZ is shorter than through ω⃗.
	bw := ((b1*F1 + b2*F2 + b3*F3) - Fa*bp) * ipn
	var va, vt1, vt2, vt3, v0 float64
	if o.sv != nil {
		// dx/dτ = α p + w: α p formed in the motion frame as for
		// momentumVelocity, the small w rotated (its rounding is
		// relative to |w|, not |p|).
		alpha, w := o.sv.VelocitySplit()
		if !o.ident {
			v := vec.Vec3{w[1], w[2], w[3]}
			w[1], w[2], w[3] = o.fr[0].Dot(v), o.fr[1].Dot(v), o.fr[2].Dot(v)
		}
		wa := w[1]*c + w[2]*s2 + w[3]*s3
		va = alpha*pn + wa
		vt1, vt2, vt3 = w[1]-wa*c, w[2]-wa*s2, w[3]-wa*s3
		v0 = alpha*(o.p0+Z[zP]) + w[0]
	} else if o.pv {
		// dx/dτ = p/m: along p̂ exactly, formed from the momentum in
		// the motion frame.
		va = pn * o.imass
		v0 = ym[IP] * o.imass
	} else {
		V1, V2, V3 := dy[IX+1], dy[IX+2], dy[IX+3]
		va = V1*c + V2*s2 + V3*s3
		vt1, vt2, vt3 = V1-va*c, V2-va*s2, V3-va*s3
		v0 = dy[IX]
	}
	if o.hasTime(dZ) {
		dZ[o.dim] = v0 * h
	}
	// dζ/dσ = (dλ/dτ)/(dλ/dζ) dτ/dσ.
	dZ[zW] = (va + bw) * h / dl
	dZ[zB] = (vt1 - bw*c - lam*w1) * h
	dZ[zB+1] = (vt2 - bw*s2 - lam*w2) * h
	dZ[zB+2] = (vt3 - bw*s3 - lam*w3) * h
	dZ[zP] = dy[IP] * h
	dZ[zP+1] = F1 * h
	dZ[zP+2] = F2 * h
	dZ[zP+3] = F3 * h
	if o.dim > IA {
		for i := 0; i < 4; i++ {
			dZ[zA+i] = dy[IA+i] * h
		}
	}
	if o.dim > IE {
		for i := 0; i < 4; i++ {
			dZ[zE+i] = dy[IE+i] * h
		}
	}
}

// weights returns the reciprocal error scales (rk.Settings.Weights).
//
// The along-track error: a displacement δ along p̂ at fixed p moves the
// state along its own path (dx⃗/dτ ∥ p⃗ up to the model's hidden-momentum
// terms), which in a static background is a time translation and leaves
// the asymptotic impulse unchanged; what it does change is the momentum
// that belongs to the new point, by |dp/dτ| δ/v ≈ F δ/v, with a force
// F ~ ε m b/r² at radius r, so that holding it to tol relative to the
// first-order impulse ~ε m needs only δ ≤ tol r²/b. With δλ = (dλ/dζ) δζ
// the error of ζ is scaled by tol (b + r²/b)/(dλ/dζ).
//
// The across-track error shifts the path sideways. On the incoming leg
// (λ < 0) that changes the impact parameter itself: β⃗ is held to
// tol (b + |β⃗|). On the outgoing leg (λ > 0) it changes only the impulse
// still to come, ~ε m |β⃗|/(v r) from radius r on, by ε m δ/(v r), so that
// tol relative needs δ ≤ tol v r: β⃗ is held to tol (b + |β⃗| + λ).
//
// A step that ends beyond ζ = ±1 has left the domain of the variables and
// gets an infinite weight, which the solver rejects.
//
// The coordinate time does not feed back (no background depends on it)
// and is not weighed. The momentum and spin deviations are held to
// tol (S + |Z_i|) component-wise, with S the size of the first-order
// impulse or spin kick: the impulse is then accurate to tol relative to its
// own size at any coupling, not to tol relative to the probe's momentum.
//
// Not inlined (go:noinline): a closure made in a function that is inlined
// into its caller is compiled without the intrinsics and inlining of the
// calls in its body (measured, Go 1.26: math.Sqrt and math.Abs become
// calls, which spill every live register), and this one runs per stage
// or per step.
//
//go:noinline
func (o *osculating) weights(tol float64) func(Z, Znew, w []float64) {
	b := o.b
	itol := 1 / tol
	return func(Z, Znew, w []float64) {
		r, lam, dl := o.geometry(Z)
		w[zW] = itol * dl / (b + r*r/b)
		if !(Znew[zW] < 1 && Znew[zW] > -1) {
			// A step beyond r = ∞ (ζ = ±1), where λ changes sign: an
			// infinite scaled error, so that the solver rejects it.
			w[zW] = math.Inf(1)
		}
		bn := math.Sqrt(Z[zB]*Z[zB] + Z[zB+1]*Z[zB+1] + Z[zB+2]*Z[zB+2])
		sb := itol / (b + bn + larger(0, lam))
		w[zB], w[zB+1], w[zB+2] = sb, sb, sb
		for i := zP; i < zP+4; i++ {
			w[i] = itol / (o.pscale + larger(math.Abs(Z[i]), math.Abs(Znew[i])))
		}
		for i := zA; i < o.dim && i < zA+4; i++ {
			w[i] = itol / (o.ascale + larger(math.Abs(Z[i]), math.Abs(Znew[i])))
		}
		for i := zE; i < o.dim; i++ {
			w[i] = itol / (o.escale + larger(math.Abs(Z[i]), math.Abs(Znew[i])))
		}
		if len(w) > o.dim {
			w[o.dim] = 0
		}
	}
}

// stepBound returns the state-dependent step bound
// (rk.Settings.StepBound) in the angle clock σ: hmax, and on the outgoing
// leg (λ > 0) the step that reaches the along-track coordinate
// λ_end = 2 rEnd, so that no step leaves the domain ζ < 1 of the
// variables (ζ = 1 is r = ∞). With θ = 2 atan ζ = atan(λ/b) that step is
// (θ_end − θ)/θ̄', with the rate θ' = dθ/dσ = (dλ/dτ/K) r²/(b² + λ²)
// (dλ/dτ taken as |p⃗|/m) averaged as θ̄' = (θ' + 1)/2 between its value
// at the start of the step and its free-line value 1 at r = ∞: the
// force's share of the rate falls like 1/r, about linearly in the
// remaining angle (on P1 and P2 at four settings each this saves the
// extra end step in 3 of 8 looser runs against the rate at the start
// alone). The stop (the end of the step in which r passes rEnd) therefore
// comes at most a step or two after the last step of the encounter, at
// any start radius; a step that overshoots ζ = 1 gets an infinite error
// weight (weights) and is retried shorter. The incoming leg needs no bound beyond hmax: σ spans
// only π over the whole path, and hmax (0.5) resolves the encounter.
//
// Not inlined (go:noinline): a closure made in a function that is inlined
// into its caller is compiled without the intrinsics and inlining of the
// calls in its body (measured, Go 1.26: math.Sqrt and math.Abs become
// calls, which spill every live register), and this one runs per stage
// or per step.
//
//go:noinline
func (o *osculating) stepBound(hmax, rEnd float64) func(s float64, Z []float64) float64 {
	b := o.b
	zEnd := zetaOf(b, 2*rEnd)
	ipin := 1 / o.pinN
	return func(_ float64, Z []float64) float64 {
		z := Z[zW]
		if z <= 0 {
			return hmax
		}
		r, lam, _ := o.geometry(Z)
		p1, p2, p3 := o.pinN+Z[zP+1], Z[zP+2], Z[zP+3]
		rate := math.Sqrt(p1*p1+p2*p2+p3*p3) * ipin * r * r / (b*b + lam*lam)
		h := 2 * math.Atan((zEnd-z)/(1+zEnd*z)) / (0.5 * (rate + 1))
		if !(h < hmax) {
			return hmax
		}
		return larger(h, 1e-12)
	}
}

// larger returns the larger of two finite numbers: math.Max without its
// rules for NaN and signed zeros, which cost a call in the per-step hooks
// (their states have passed the solver's finiteness checks).
func larger(a, b float64) float64 {
	if a > b {
		return a
	}
	return b
}
