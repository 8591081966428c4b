package vec

import "math"

// Vec4 is a Minkowski four-vector with contravariant components
// (v⁰, v¹, v², v³) in a Cartesian inertial frame.
type Vec4 [4]float64

// Eta is the Minkowski metric η_μν = diag(−1, +1, +1, +1).
var Eta = [4]float64{-1, 1, 1, 1}

// Add returns v + w.
func (v Vec4) Add(w Vec4) Vec4 { return Vec4{v[0] + w[0], v[1] + w[1], v[2] + w[2], v[3] + w[3]} }

// Sub returns v − w.
func (v Vec4) Sub(w Vec4) Vec4 { return Vec4{v[0] - w[0], v[1] - w[1], v[2] - w[2], v[3] - w[3]} }

// Scale returns s v.
func (v Vec4) Scale(s float64) Vec4 { return Vec4{s * v[0], s * v[1], s * v[2], s * v[3]} }

// Dot returns the Minkowski product
//
//	v·w = −v⁰w⁰ + v¹w¹ + v²w² + v³w³.
func (v Vec4) Dot(w Vec4) float64 { return -v[0]*w[0] + v[1]*w[1] + v[2]*w[2] + v[3]*w[3] }

// Lower returns the covariant components v_μ = η_μν v^ν.
func (v Vec4) Lower() Vec4 { return Vec4{-v[0], v[1], v[2], v[3]} }

// Spatial returns the spatial part (v¹, v², v³).
func (v Vec4) Spatial() Vec3 { return Vec3{v[1], v[2], v[3]} }

// FromSpatial returns the four-vector (t, s).
func FromSpatial(t float64, s Vec3) Vec4 { return Vec4{t, s[0], s[1], s[2]} }

// Velocity returns the four-velocity u = γ(1, v) of the three-velocity v,
// |v| < 1.
func Velocity(v Vec3) Vec4 {
	g := 1 / math.Sqrt(1-v.Dot(v))
	return FromSpatial(g, v.Scale(g))
}

// Levi returns the Levi-Civita symbol with lower indices, ε_{μνρσ}, with
// ε_{0123} = +1.
func Levi(mu, nu, rho, sigma int) float64 {
	idx := [4]int{mu, nu, rho, sigma}
	for i := 0; i < 4; i++ {
		for j := i + 1; j < 4; j++ {
			if idx[i] == idx[j] {
				return 0
			}
		}
	}
	// Parity of the permutation by counting inversions.
	inv := 0
	for i := 0; i < 4; i++ {
		for j := i + 1; j < 4; j++ {
			if idx[i] > idx[j] {
				inv++
			}
		}
	}
	if inv%2 == 0 {
		return 1
	}
	return -1
}

// Eps returns the contravariant vector w^μ = ε^μ_{νρσ} a^ν b^ρ c^σ, the
// Minkowski "triple cross product" with ε_{0123} = +1. For a = (1,0,0,0)
// and purely spatial b, c it gives
//
//	w = (0, −b × c),
//
// since ε_{i0jk} = −ε_{0ijk} = −ε_{ijk}.
func Eps(a, b, c Vec4) Vec4 {
	var w Vec4
	for mu := 0; mu < 4; mu++ {
		s := 0.0
		for nu := 0; nu < 4; nu++ {
			if a[nu] == 0 {
				continue
			}
			for rho := 0; rho < 4; rho++ {
				if b[rho] == 0 || rho == nu {
					continue
				}
				for sg := 0; sg < 4; sg++ {
					if c[sg] == 0 || sg == nu || sg == rho {
						continue
					}
					s += Levi(mu, nu, rho, sg) * a[nu] * b[rho] * c[sg]
				}
			}
		}
		w[mu] = Eta[mu] * s // raise the first index
	}
	return w
}
