package vec

import "math"

// Vec3 is a real Euclidean three-vector.
type Vec3 [3]float64

// Add returns v + w.
func (v Vec3) Add(w Vec3) Vec3 { return Vec3{v[0] + w[0], v[1] + w[1], v[2] + w[2]} }

// Sub returns v − w.
func (v Vec3) Sub(w Vec3) Vec3 { return Vec3{v[0] - w[0], v[1] - w[1], v[2] - w[2]} }

// Scale returns s v.
func (v Vec3) Scale(s float64) Vec3 { return Vec3{s * v[0], s * v[1], s * v[2]} }

// Dot returns v·w.
func (v Vec3) Dot(w Vec3) float64 { return v[0]*w[0] + v[1]*w[1] + v[2]*w[2] }

// Cross returns v × w.
func (v Vec3) Cross(w Vec3) Vec3 {
	return Vec3{v[1]*w[2] - v[2]*w[1], v[2]*w[0] - v[0]*w[2], v[0]*w[1] - v[1]*w[0]}
}

// Norm returns |v|, computed without undue overflow.
//
// The sum of the squares is formed directly where it can neither overflow
// nor underflow (the common case, a square root and no scaling), and
// through math.Hypot's scaling otherwise.
func (v Vec3) Norm() float64 {
	s := v[0]*v[0] + v[1]*v[1] + v[2]*v[2]
	if s > 1e-290 && s < 1e290 {
		return math.Sqrt(s)
	}
	return math.Hypot(math.Hypot(v[0], v[1]), v[2])
}

// Unit returns v/|v|. The zero vector is returned unchanged.
func (v Vec3) Unit() Vec3 {
	n := v.Norm()
	if n == 0 {
		return v
	}
	return v.Scale(1 / n)
}

// Complex returns the complex vector v + i w.
func Complex(v, w Vec3) CVec3 {
	return CVec3{complex(v[0], w[0]), complex(v[1], w[1]), complex(v[2], w[2])}
}

// CVec3 is a complex three-vector, such as F = E + iB or a complex-shifted
// position x − i a.
type CVec3 [3]complex128

// Add returns v + w.
func (v CVec3) Add(w CVec3) CVec3 { return CVec3{v[0] + w[0], v[1] + w[1], v[2] + w[2]} }

// Sub returns v − w.
func (v CVec3) Sub(w CVec3) CVec3 { return CVec3{v[0] - w[0], v[1] - w[1], v[2] - w[2]} }

// Scale returns s v for complex s.
func (v CVec3) Scale(s complex128) CVec3 { return CVec3{s * v[0], s * v[1], s * v[2]} }

// Dot returns the bilinear product v·w = Σ vᵢwᵢ (no conjugation).
func (v CVec3) Dot(w CVec3) complex128 { return v[0]*w[0] + v[1]*w[1] + v[2]*w[2] }

// Cross returns v × w.
func (v CVec3) Cross(w CVec3) CVec3 {
	return CVec3{v[1]*w[2] - v[2]*w[1], v[2]*w[0] - v[0]*w[2], v[0]*w[1] - v[1]*w[0]}
}

// Real returns the real part of v.
func (v CVec3) Real() Vec3 { return Vec3{real(v[0]), real(v[1]), real(v[2])} }

// Imag returns the imaginary part of v.
func (v CVec3) Imag() Vec3 { return Vec3{imag(v[0]), imag(v[1]), imag(v[2])} }

// Lift returns v as a complex vector with zero imaginary part.
func (v Vec3) Lift() CVec3 { return CVec3{complex(v[0], 0), complex(v[1], 0), complex(v[2], 0)} }
