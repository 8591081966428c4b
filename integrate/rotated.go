package integrate

import (
	"fmt"
	"math"

	"ricochet/background/vec"
)

// Rotated is a model whose background is turned in space: the inner model
// lives in coordinates where the background's spin axis is +z (the metric
// families spin along +z), and Rotated presents it in the frame of record,
// where that axis is n. With the rotation R (R n = ẑ) acting on the
// spatial part of every block of the state,
//
//	y_inner = R y,   dy/dτ = Rᵀ f_inner(R y),
//
// which is the same motion in the coordinates x′ = Rᵀ x, whose metric is
// g′(x′) = Rᵀ g(R x′) R — an exact coordinate transformation (a rotation of
// Cartesian Kerr–Schild or NUT coordinates), so every conserved quantity
// and constraint of the inner model keeps its value. The Killing angular
// momentum that is conserved is the one about the spin axis n: Rotated
// reports it through AngularMomentumZ (the inner model's J_z), and Axis
// names n so that the driver labels the drift J_n (Drift.JAxis).
type Rotated struct {
	Inner Model
	R     [3][3]float64 // rotation taking n to ẑ, acting on column vectors
	n     vec.Vec3
	y, dy []float64 // work storage of the inner state
	y1    []float64
}

// NewRotated returns the inner model presented with its +z axis along n
// (any non-zero direction; its length is ignored). The rotation is the one
// about n × ẑ (Rodrigues), the identity for n along +z.
func NewRotated(inner Model, n vec.Vec3) (*Rotated, error) {
	l := n.Norm()
	if !(l > 0) || math.IsInf(l, 0) {
		return nil, fmt.Errorf("integrate: spin axis %v, want a finite non-zero vector", n)
	}
	u := n.Scale(1 / l)
	z := vec.Vec3{0, 0, 1}
	k := u.Cross(z) // rotation axis × sin θ
	c := u.Dot(z)   // cos θ
	var R [3][3]float64
	K := [3][3]float64{{0, -k[2], k[1]}, {k[2], 0, -k[0]}, {-k[1], k[0], 0}}
	for i := 0; i < 3; i++ {
		R[i][i] = 1
	}
	if c < -1+1e-15 {
		// n = −ẑ: a half turn about x.
		R = [3][3]float64{{1, 0, 0}, {0, -1, 0}, {0, 0, -1}}
	} else {
		// R = I + K + K²/(1 + c) (Rodrigues with sin θ K̂ = K).
		f := 1 / (1 + c)
		for i := 0; i < 3; i++ {
			for j := 0; j < 3; j++ {
				s := K[i][j]
				for m := 0; m < 3; m++ {
					s += f * K[i][m] * K[m][j]
				}
				R[i][j] += s
			}
		}
	}
	d := inner.Dim()
	return &Rotated{Inner: inner, R: R, n: u, y: make([]float64, d), dy: make([]float64, d), y1: make([]float64, d)}, nil
}

// Axis returns the unit spin axis n in the frame of record.
func (r *Rotated) Axis() vec.Vec3 { return r.n }

// turn writes out = Q in block by block (Q = R or Rᵀ by transpose).
func (r *Rotated) turn(in, out []float64, transpose bool) {
	for off := 0; off+4 <= len(in); off += 4 {
		out[off] = in[off]
		for i := 0; i < 3; i++ {
			s := 0.0
			for j := 0; j < 3; j++ {
				if transpose {
					s += r.R[j][i] * in[off+1+j]
				} else {
					s += r.R[i][j] * in[off+1+j]
				}
			}
			out[off+1+i] = s
		}
	}
}

func (r *Rotated) turn4(v [4]float64, transpose bool) [4]float64 {
	var out [4]float64
	r.turn(v[:], out[:], transpose)
	return out
}

// Name implements Model.
func (r *Rotated) Name() string {
	return fmt.Sprintf("%s, spin axis along (%.4g, %.4g, %.4g)", r.Inner.Name(), r.n[0], r.n[1], r.n[2])
}

// Dim implements Model.
func (r *Rotated) Dim() int { return r.Inner.Dim() }

// Mass implements Model.
func (r *Rotated) Mass() float64 { return r.Inner.Mass() }

// Deriv implements Model.
func (r *Rotated) Deriv(y, dy []float64) {
	r.turn(y, r.y, false)
	r.Inner.Deriv(r.y, r.dy)
	r.turn(r.dy, dy, true)
}

// LinearDeriv is the inner model's first-order right-hand side, rotated
// (the inner Deriv if it has none).
func (r *Rotated) LinearDeriv(y, dy []float64) {
	r.turn(y, r.y, false)
	lineDeriv(r.Inner, r.y, r.dy)
	r.turn(r.dy, dy, true)
}

// VelocitySplit returns the inner model's split of the last Deriv with w
// rotated back (models without a split: α = 1/m, w = 0).
func (r *Rotated) VelocitySplit() (float64, [4]float64) {
	sv, ok := r.Inner.(splitVelocity)
	if !ok {
		return 1 / r.Inner.Mass(), [4]float64{}
	}
	a, w := sv.VelocitySplit()
	return a, r.turn4(w, true)
}

// Energy implements Model.
func (r *Rotated) Energy(y []float64) float64 {
	r.turn(y, r.y, false)
	return r.Inner.Energy(r.y)
}

// EnergyExact implements Model.
func (r *Rotated) EnergyExact() bool { return r.Inner.EnergyExact() }

// AngularMomentumZ returns the Killing angular momentum about the spin
// axis n (the inner model's J_z), NaN if the inner model has none.
func (r *Rotated) AngularMomentumZ(y []float64) float64 {
	am, ok := r.Inner.(angularMomentumModel)
	if !ok {
		return math.NaN()
	}
	r.turn(y, r.y, false)
	return am.AngularMomentumZ(r.y)
}

// ConservesJz reports whether the inner model conserves its J_z, i.e. the
// angular momentum about n here.
func (r *Rotated) ConservesJz() bool {
	am, ok := r.Inner.(angularMomentumModel)
	return ok && am.ConservesJz()
}

// Normalize implements Model.
func (r *Rotated) Normalize(y []float64, a2 float64) {
	r.turn(y, r.y, false)
	r.Inner.Normalize(r.y, a2)
	r.turn(r.y, y, true)
}

// Hazard implements Model.
func (r *Rotated) Hazard(y0, y1 []float64) Status {
	r.turn(y0, r.y, false)
	r.turn(y1, r.y1, false)
	return r.Inner.Hazard(r.y, r.y1)
}

// MassShell returns the inner model's mass-shell violation (relative).
func (r *Rotated) MassShell(y []float64) float64 {
	r.turn(y, r.y, false)
	if ms, ok := r.Inner.(massShellModel); ok {
		return ms.MassShell(r.y)
	}
	p := Mom(r.y)
	m := r.Inner.Mass()
	return (p.Dot(p) + m*m) / (m * m)
}

// OutMass returns the inner model's changing mass (outMassModel), false
// if its mass is conserved.
func (r *Rotated) OutMass(y []float64) (float64, bool) {
	om, ok := r.Inner.(outMassModel)
	if !ok {
		return 0, false
	}
	r.turn(y, r.y, false)
	return om.OutMass(r.y)
}

// SpinConstraints returns the inner model's spin-constraint violations
// (the flat-space ones for a model without its own).
func (r *Rotated) SpinConstraints(y []float64, a2 float64) (orth, norm float64) {
	r.turn(y, r.y, false)
	if sc, ok := r.Inner.(spinConstraintModel); ok {
		return sc.SpinConstraints(r.y, a2)
	}
	p, a := Mom(r.y), Spin(r.y)
	m := r.Inner.Mass()
	if a2 > 0 {
		orth = math.Abs(a.Dot(p)) / (m * math.Sqrt(a2))
		norm = (a.Dot(a) - a2) / a2
	}
	return orth, norm
}

// ScaleCoupling implements CouplingScaler: the inner model's scaling,
// rotated alike; nil if the inner model has none.
func (r *Rotated) ScaleCoupling(lambda float64) Model {
	sc, ok := r.Inner.(CouplingScaler)
	if !ok {
		return nil
	}
	in := sc.ScaleCoupling(lambda)
	if in == nil {
		return nil
	}
	out, _ := NewRotated(in, r.n)
	out.R = r.R
	return out
}
