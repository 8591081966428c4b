package observables

import (
	"math"

	"ricochet/background/vec"
)

// Error bars and their propagation.
//
// An error bar here is a bound on the absolute error of one component
// (integrate.Outcome.ImpulseErr: met in ≥ 99 % of components against exact
// solutions). Bars of derived quantities are propagated to first order as
// worst cases over the component bars, |δf| ≤ Σ_j |∂f/∂x_j| e_j, so that a
// derived bar bounds whenever the component bars do and the errors are
// small against the quantities (first-order propagation: the neglected
// terms are of relative order e/|x|).

// Err returns bounds on the frame components (t, l, b, n) of an error given
// as component-wise bounds e in the source frame, of which a part iso of
// each spatial bar bounds the norm of the spatial error
// (integrate.Outcome.ImpulseErrIso; 0 if unknown): the time part is
// unchanged and each rotated spatial component is bounded by
//
//	|δv·ê| ≤ Σ_j |ê_j| (e_j − iso) + iso,  ê = l̂, b̂, n̂,
//
// which for iso = 0 is attained when every source component errs by its
// bar with the sign of ê_j. For the default frame (l̂, b̂, n̂ = x̂, ŷ, ẑ)
// the bars are those of the source frame.
func (f Frame) Err(e vec.Vec4, iso float64) vec.Vec4 {
	return vec.Vec4{math.Abs(e[0]), linearBound(f.L, e, iso), linearBound(f.B, e, iso), linearBound(f.N, e, iso)}
}

// FrameErr bounds the frame components of an error vector by the
// Euclidean norm of its spatial part, whatever the frame.
//
// Deprecated: the bound ignores the frame; use Frame.Err, which bounds
// each component by its own rotation of the bars.
func FrameErr(e vec.Vec4) vec.Vec4 {
	n := e.Spatial().Norm()
	return vec.Vec4{math.Abs(e[0]), n, n, n}
}

// linearBound returns Σ_j |g_j| (e_j − iso) + |g| iso over the spatial
// components: the first-order bound on the change of a function with
// spatial gradient g for source-frame bars e of which iso bounds the norm
// of the error (see Frame.Err).
func linearBound(g vec.Vec3, e vec.Vec4, iso float64) float64 {
	iso = math.Max(0, math.Min(iso, math.Min(e[1], math.Min(e[2], e[3]))))
	return math.Abs(g[0])*(e[1]-iso) + math.Abs(g[1])*(e[2]-iso) + math.Abs(g[2])*(e[3]-iso) + g.Norm()*iso
}

// SquareErr bounds the error of the Minkowski square v·v = −v⁰² + |v⃗|²
// (either signature: the sign only) for component bars e, to first order
// plus the quadratic term that keeps it a bound when a bar is as large as
// its component:
//
//	Σ_μ (2|v^μ| + e_μ) e_μ.
func SquareErr(v, e vec.Vec4) float64 {
	var s float64
	for i := 0; i < 4; i++ {
		s += (2*math.Abs(v[i]) + e[i]) * e[i]
	}
	return s
}

// ScatteringAngleErr bounds the error of ScatteringAngle(pin, pout) for
// bars e on p_out (the error of the impulse; p_in is exact; iso as for
// Frame.Err), to first order: the angle χ between p⃗_in and p⃗_out has the gradient
//
//	∂χ/∂p⃗_out = −(p̂_in − cos χ p̂_out)/(|p⃗_out| sin χ),
//
// a vector of length 1/|p⃗_out| in the plane of the two momenta. Near
// χ = 0 or π, where the direction of the gradient is lost, the bound
// |e⃗|/|p⃗_out| of any angle of the outgoing direction is used.
func ScatteringAngleErr(pin, pout, e vec.Vec4, iso float64) float64 {
	a, b := pin.Spatial().Unit(), pout.Spatial()
	bn := b.Norm()
	bh := b.Scale(1 / bn)
	c := a.Dot(bh)
	perp := a.Sub(bh.Scale(c))
	s := perp.Norm()
	if s < 1e-8 {
		return e.Spatial().Norm() / bn
	}
	return linearBound(perp.Scale(1/(bn*s)), e, iso)
}

// InPlaneAngleErr bounds the error of InPlaneAngle(pout) for bars e on
// p_out (iso as for Frame.Err), to first order: with x = p⃗·l̂ and y = p⃗·b̂ the angle atan2(y, x)
// has the gradient (x b̂ − y l̂)/(x² + y²).
func (f Frame) InPlaneAngleErr(pout, e vec.Vec4, iso float64) float64 {
	s := pout.Spatial()
	x, y := s.Dot(f.L), s.Dot(f.B)
	g := f.B.Scale(x).Sub(f.L.Scale(y)).Scale(1 / (x*x + y*y))
	return linearBound(g, e, iso)
}

// OutOfPlaneAngleErr bounds the error of OutOfPlaneAngle(pout) for bars e
// on p_out (iso as for Frame.Err), to first order: with z = p⃗·n̂ and h = |p⃗ − z n̂| the elevation
// atan2(z, h) has the gradient (h n̂ − z ĥ)/|p⃗|², ĥ the in-plane direction
// of p⃗.
func (f Frame) OutOfPlaneAngleErr(pout, e vec.Vec4, iso float64) float64 {
	s := pout.Spatial()
	z := s.Dot(f.N)
	hv := s.Sub(f.N.Scale(z))
	h := hv.Norm()
	p2 := s.Dot(s)
	if h == 0 {
		return e.Spatial().Norm() / math.Sqrt(p2)
	}
	g := f.N.Scale(h).Sub(hv.Scale(z / h)).Scale(1 / p2)
	return linearBound(g, e, iso)
}
