package integrate

import (
	"math"

	"ricochet/background/vec"
)

// Osculating variables of the scattering driver.
//
// Scatter integrates in the Sundman variable s (dτ/ds = r/K, K = |p⃗_in|/m)
// and in the orthonormal frame of the incoming motion (motionFrame). In
// that frame the position is split relative to the current direction of
// motion p̂ = p⃗/|p⃗|:
//
//	x⃗ = λ p̂ + β⃗,   λ = x⃗·p̂ = b sinh w,   β⃗ ⊥ p̂,
//
// the along-track coordinate λ and the across-track vector β⃗, the impact
// vector of the osculating straight line. With V⃗ = dx⃗/dτ, F⃗ = dp⃗/dτ and
// ω⃗ = dp̂/dτ = (F⃗ − (F⃗·p̂)p̂)/|p⃗|,
//
//	dλ/dτ = V⃗·p̂ + β⃗·ω⃗,
//	dβ⃗/dτ = V⃗ − (V⃗·p̂)p̂ − (β⃗·ω⃗)p̂ − λω⃗,
//	dw/dτ = (dλ/dτ)/(b cosh w),
//
// exact identities (β⃗·p̂ stays zero up to the integration error, and what
// it carries is an along-track shift). The point of the split:
//
//   - On a straight line w = s + const exactly and β⃗ is constant, so the
//     free motion, which fills the far zone, is integrated without
//     truncation error; what the steps must resolve there is only the
//     decaying force, which falls like e^{−|s|}.
//   - β⃗ is of order b on both legs and is stored as such: the transverse
//     position keeps the precision of b however far out the path starts,
//     while in Cartesian components the outgoing leg (rotated by the
//     deflection) would carry it as the difference of numbers of order R
//     (a floor of 1e-16 R that stalls the step control beyond R ~ 1e6 b).
//   - The error of the along-track coordinate, which in a static
//     background is a time translation of the state along its own path,
//     can be weighed by its physical effect instead of relative to R (see
//     weigher).
//
// Momentum and spin are integrated as deviations from their incoming
// asymptotic values (p⁰_in, |p⃗_in|, 0, 0) and a_in, and the coordinate
// time as it is (no background depends on it).
type osculating struct {
	m         Model
	pscale    float64 // scale of the momentum deviation: |Δp⃗₁|
	ascale    float64 // scale of the spin deviation
	dim       int     // model dimension
	n         int     // dimension of the integrated vector: dim + 1
	b, K      float64
	mass      float64
	p0, pinN  float64
	ain       vec.Vec4 // a_in in the motion frame
	fr        motionFrame
	ident     bool // the motion frame is the frame of record
	pv        bool
	sv        splitVelocity // non-nil for models with dx/dτ = α p + w
	ym, yb    []float64     // model state, motion and background frame
	dyb       []float64
	deviation []float64
}

// Offsets in the integrated vector Z.
const (
	zT = 0 // coordinate time
	zW = 1 // w = asinh(λ/b)
	zB = 2 // β⃗ (3 components)
	zP = 5 // p^μ − p^μ_in (4 components)
	zA = 9 // a^μ − a^μ_in (4 components)
)

func newOsculating(m Model, in InState, b, K float64) *osculating {
	dim := m.Dim()
	o := &osculating{m: m, dim: dim, n: dim + 1, b: b, K: K, mass: m.Mass(),
		p0: in.P[0], pinN: in.P.Spatial().Norm(), fr: newMotionFrame(in),
		ym: make([]float64, dim), yb: make([]float64, dim), dyb: make([]float64, dim),
		deviation: make([]float64, dim)}
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
	return p1 / pn, p2 / pn, p3 / pn, pn
}

// position returns x⃗ in the motion frame and λ.
func (o *osculating) position(Z []float64) (x1, x2, x3, lam float64) {
	c, s2, s3, _ := o.direction(Z)
	lam = o.b * sinh(Z[zW])
	return lam*c + Z[zB], lam*s2 + Z[zB+1], lam*s3 + Z[zB+2], lam
}

// radius returns |x⃗| for Z.
func (o *osculating) radius(Z []float64) float64 {
	x1, x2, x3, _ := o.position(Z)
	return math.Sqrt(x1*x1 + x2*x2 + x3*x3)
}

// motionState writes the model state in the motion frame into y.
func (o *osculating) motionState(Z, y []float64) {
	x1, x2, x3, _ := o.position(Z)
	y[IX], y[IX+1], y[IX+2], y[IX+3] = Z[zT], x1, x2, x3
	y[IP] = o.p0 + Z[zP]
	y[IP+1] = o.pinN + Z[zP+1]
	y[IP+2] = Z[zP+2]
	y[IP+3] = Z[zP+3]
	if o.dim > IA {
		for i := 0; i < 4; i++ {
			y[IA+i] = o.ain[i] + Z[zA+i]
		}
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
	Z[zT] = xf[0]
	Z[zP] = o.ym[IP] - o.p0
	Z[zP+1] = o.ym[IP+1] - o.pinN
	Z[zP+2] = o.ym[IP+2]
	Z[zP+3] = o.ym[IP+3]
	if o.dim > IA {
		for i := 0; i < 4; i++ {
			Z[zA+i] = o.ym[IA+i] - o.ain[i]
		}
	}
	c, s2, s3, _ := o.direction(Z)
	X1, X2, X3 := xf[1], xf[2], xf[3]
	lam := X1*c + X2*s2 + X3*s3
	// β⃗ = x⃗ − λp̂ with 1 − c² written as s₂² + s₃²: no cancellation of
	// numbers of order R in the transverse components.
	Z[zB] = X1*(s2*s2+s3*s3) - c*(X2*s2+X3*s3)
	Z[zB+1] = X2 - lam*s2
	Z[zB+2] = X3 - lam*s3
	Z[zW] = math.Asinh(lam / o.b)
}

// deriv writes dZ/ds.
func (o *osculating) deriv(Z, dZ []float64) {
	c, s2, s3, pn := o.direction(Z)
	lam := o.b * sinh(Z[zW])
	b1, b2, b3 := Z[zB], Z[zB+1], Z[zB+2]
	x1, x2, x3 := lam*c+b1, lam*s2+b2, lam*s3+b3
	// The model's state, in the background's frame.
	y := o.yb
	if o.ident {
		y = o.ym
	}
	o.ym[IX], o.ym[IX+1], o.ym[IX+2], o.ym[IX+3] = Z[zT], x1, x2, x3
	o.ym[IP] = o.p0 + Z[zP]
	o.ym[IP+1] = o.pinN + Z[zP+1]
	o.ym[IP+2] = Z[zP+2]
	o.ym[IP+3] = Z[zP+3]
	if o.dim > IA {
		for i := 0; i < 4; i++ {
			o.ym[IA+i] = o.ain[i] + Z[zA+i]
		}
	}
	if !o.ident {
		o.fr.fromFrame(y, o.ym)
	}
	dy := o.dyb
	o.m.Deriv(y, dy)
	if !o.ident {
		o.fr.toFrame(dy, dy)
	}
	r := math.Sqrt(x1*x1 + x2*x2 + x3*x3)
	h := r / o.K // dτ/ds
	F1, F2, F3 := dy[IP+1], dy[IP+2], dy[IP+3]
	Fa := F1*c + F2*s2 + F3*s3
	w1, w2, w3 := (F1-Fa*c)/pn, (F2-Fa*s2)/pn, (F3-Fa*s3)/pn
	bw := b1*w1 + b2*w2 + b3*w3
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
		va = pn / o.mass
		v0 = (o.p0 + Z[zP]) / o.mass
	} else {
		V1, V2, V3 := dy[IX+1], dy[IX+2], dy[IX+3]
		va = V1*c + V2*s2 + V3*s3
		vt1, vt2, vt3 = V1-va*c, V2-va*s2, V3-va*s3
		v0 = dy[IX]
	}
	dlam := va + bw
	dZ[zT] = v0 * h
	dZ[zW] = dlam / math.Sqrt(o.b*o.b+lam*lam) * h
	dZ[zB] = (vt1 - bw*c - lam*w1) * h
	dZ[zB+1] = (vt2 - bw*s2 - lam*w2) * h
	dZ[zB+2] = (vt3 - bw*s3 - lam*w3) * h
	for i := 0; i < 4; i++ {
		dZ[zP+i] = dy[IP+i] * h
	}
	if o.dim > IA {
		for i := 0; i < 4; i++ {
			dZ[zA+i] = dy[IA+i] * h
		}
	}
}

// weigher returns the error scaling (rk.Settings.Weigh).
//
// The along-track error: a displacement δ along p̂ at fixed p moves the
// state along its own path (dx⃗/dτ ∥ p⃗ up to the model's hidden-momentum
// terms), which in a static background is a time translation and leaves
// the asymptotic impulse unchanged; what it does change is the momentum
// that belongs to the new point, by |dp/dτ| δ/v ≈ F δ/v, with a force
// F ~ ε m b/r² at radius r, so that holding it to tol relative to the
// first-order impulse ~ε m needs only δ ≤ tol r²/b. With δλ = b cosh w δw
// the error of w is scaled by tol (b + r²/b)/(b cosh w).
//
// The across-track error shifts the path sideways. On the incoming leg
// (λ < 0) that changes the impact parameter itself: β⃗ is held to
// tol (b + |β⃗|). On the outgoing leg (λ > 0) it changes only the impulse
// still to come, ~ε m |β⃗|/(v r) from radius r on, by ε m δ/(v r), so that
// tol relative needs δ ≤ tol v r: β⃗ is held to tol (b + |β⃗| + λ).
//
// The coordinate time does not feed back (no background depends on it)
// and is not weighed. The momentum and spin deviations are held to
// tol (S + |Z_i|) component-wise, with S the size of the first-order
// impulse or spin kick: the impulse is then accurate to tol relative to its
// own size at any coupling, not to tol relative to the probe's momentum.
func (o *osculating) weigher(tol float64) func(Z, Znew, e []float64) {
	b := o.b
	return func(Z, Znew, e []float64) {
		r := o.radius(Z)
		lam := b * sinh(Z[zW])
		e[zT] = 0
		e[zW] /= tol * (b + r*r/b) / math.Sqrt(b*b+lam*lam)
		bn := math.Sqrt(Z[zB]*Z[zB] + Z[zB+1]*Z[zB+1] + Z[zB+2]*Z[zB+2])
		sb := tol * (b + bn + math.Max(0, lam))
		e[zB] /= sb
		e[zB+1] /= sb
		e[zB+2] /= sb
		for i := zP; i < zA && i < len(e); i++ {
			e[i] /= tol * (o.pscale + math.Max(math.Abs(Z[i]), math.Abs(Znew[i])))
		}
		for i := zA; i < len(e); i++ {
			e[i] /= tol * (o.ascale + math.Max(math.Abs(Z[i]), math.Abs(Znew[i])))
		}
	}
}

// stepBound returns the state-dependent step bound
// (rk.Settings.StepBound): max(hmin, ½ ln(r/b)) in the Sundman variable.
// Far out, where r grows like e^{|s|}, a step h multiplies or divides r by
// about e^h; on the incoming leg a step from radius r therefore ends no
// closer than √(r b) > b, so no step can reach across the encounter, while
// the far tails cost only a few steps.
func (o *osculating) stepBound(hmin float64) func(s float64, Z []float64) float64 {
	b := o.b
	return func(_ float64, Z []float64) float64 {
		return math.Max(hmin, 0.5*math.Log(o.radius(Z)/b))
	}
}

// sinh is sinh w from one call of math.Expm1, e(e + 2)/(2(e + 1)) with
// e = e^|w| − 1 and the sign of w: accurate to a few ulp for all w (no
// cancellation near 0),
// at half the cost of math.Sinh, which evaluates two exponentials.
func sinh(w float64) float64 {
	e := math.Expm1(math.Abs(w))
	return math.Copysign(e*(e+2)/(2*(e+1)), w)
}
