package predict

import (
	"math"
	"math/cmplx"

	"ricochet/background/vec"
)

// vector is a complex 3-vector in the frame of record: the value type of
// vector quantities and of vector arithmetic in formulas. Its components
// are read in a formula as v.x, v.y, v.z.
type vector struct {
	X complex128 `expr:"x"`
	Y complex128 `expr:"y"`
	Z complex128 `expr:"z"`
}

func lift(v vec.Vec3) vector {
	return vector{complex(v[0], 0), complex(v[1], 0), complex(v[2], 0)}
}

func (v vector) add(w vector) vector       { return vector{v.X + w.X, v.Y + w.Y, v.Z + w.Z} }
func (v vector) sub(w vector) vector       { return vector{v.X - w.X, v.Y - w.Y, v.Z - w.Z} }
func (v vector) scale(s complex128) vector { return vector{s * v.X, s * v.Y, s * v.Z} }
func (v vector) dot(w vector) complex128   { return v.X*w.X + v.Y*w.Y + v.Z*w.Z }
func (v vector) cross(w vector) vector {
	return vector{v.Y*w.Z - v.Z*w.Y, v.Z*w.X - v.X*w.Z, v.X*w.Y - v.Y*w.X}
}

// scalarFuncs are the functions of one scalar argument a formula may call.
// All use the principal branch of the complex function (math/cmplx), so
// that for real arguments inside the real domain they are the real
// functions, and sqrt(-1) = i.
var scalarFuncs = map[string]func(complex128) complex128{
	"sqrt":  cmplx.Sqrt,
	"exp":   cmplx.Exp,
	"log":   cmplx.Log,
	"sin":   cmplx.Sin,
	"cos":   cmplx.Cos,
	"tan":   cmplx.Tan,
	"asin":  cmplx.Asin,
	"acos":  cmplx.Acos,
	"atan":  cmplx.Atan,
	"sinh":  cmplx.Sinh,
	"cosh":  cmplx.Cosh,
	"tanh":  cmplx.Tanh,
	"asinh": cmplx.Asinh,
	"acosh": cmplx.Acosh,
	"atanh": cmplx.Atanh,
	"re":    func(z complex128) complex128 { return complex(real(z), 0) },
	"im":    func(z complex128) complex128 { return complex(imag(z), 0) },
	"conj":  cmplx.Conj,
	"abs":   func(z complex128) complex128 { return complex(cmplx.Abs(z), 0) },
	"arg":   func(z complex128) complex128 { return complex(cmplx.Phase(z), 0) },
}

// vectorFuncs are the functions of one vector argument returning a vector.
var vectorFuncs = map[string]func(vector) vector{
	"vre": func(v vector) vector {
		return vector{complex(real(v.X), 0), complex(real(v.Y), 0), complex(real(v.Z), 0)}
	},
	"vim": func(v vector) vector {
		return vector{complex(imag(v.X), 0), complex(imag(v.Y), 0), complex(imag(v.Z), 0)}
	},
	"vconj": func(v vector) vector { return vector{cmplx.Conj(v.X), cmplx.Conj(v.Y), cmplx.Conj(v.Z)} },
}

// pow is z^w with the exact real result for real z ≥ 0 or integer w (so
// that b^2 and v^-3 carry no spurious imaginary rounding), else the
// principal branch.
func pow(z, w complex128) complex128 {
	if imag(z) == 0 && imag(w) == 0 {
		x, y := real(z), real(w)
		if x >= 0 || y == math.Trunc(y) {
			return complex(math.Pow(x, y), 0)
		}
	}
	if w == 2 {
		return z * z
	}
	return cmplx.Pow(z, w)
}
