package integrate

import (
	"ricochet/background/em"
	"ricochet/background/vec"
)

// applyGenerator returns Re(𝕂)^μ_ν w^ν for the self-dual Lorentz generator
// 𝕂 whose electric part is the complex three-vector k and whose magnetic
// part is −i k:
//
//	(𝕂w)⁰ = k·w⃗,   (𝕂w)ⁱ = kⁱ w⁰ − i (w⃗ × k)ⁱ.
//
// For k = (q/m)(E + iB) its real part is the Lorentz-force generator
// (q/m)F^μ_ν: Re(𝕂w)⁰ = (q/m)E·w⃗, Re(𝕂w)ⁱ = (q/m)(E w⁰ + w⃗ × B)ⁱ.
func applyGenerator(k vec.CVec3, w []float64, out []float64) {
	w0 := complex(w[0], 0)
	w1, w2, w3 := complex(w[1], 0), complex(w[2], 0), complex(w[3], 0)
	out[0] = real(k[0]*w1 + k[1]*w2 + k[2]*w3)
	// w⃗ × k
	c1 := w2*k[2] - w3*k[1]
	c2 := w3*k[0] - w1*k[2]
	c3 := w1*k[1] - w2*k[0]
	out[1] = real(k[0]*w0 - 1i*c1)
	out[2] = real(k[1]*w0 - 1i*c2)
	out[3] = real(k[2]*w0 - 1i*c3)
}

// fieldDisk returns the branch disk seen by a probe whose coupling is
// evaluated at x − i shift, for a root-Kerr source of spin a: the disk of
// radius |a + shift| normal to a + shift (zero radius when there is none).
func fieldDisk(f em.Field, shift vec.Vec3) em.Disk {
	var a vec.Vec3
	if rk, ok := f.(em.RootKerr); ok {
		a = rk.A
	}
	a = a.Add(shift)
	n := a.Norm()
	if n == 0 {
		return em.Disk{}
	}
	return em.Disk{Normal: a.Scale(1 / n), Radius: n}
}

func spatial(y []float64, off int) vec.Vec3 { return vec.Vec3{y[off+1], y[off+2], y[off+3]} }
