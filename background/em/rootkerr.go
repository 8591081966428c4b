package em

import (
	"math"
	"math/cmplx"

	"ricochet/background/vec"
)

// RootKerr is the electromagnetic field of the Kerr–Newman solution at
// G → 0 (the "root-Kerr" field) with electric charge Q, magnetic charge P
// and spin vector a (a = J/M, the ring radius), centred at the origin: the
// field of a dyon at the imaginary position i a (Newman 1973, J. Math.
// Phys. 14, 102; Lynden-Bell 2004, Phys. Rev. D 70, 105017; from memory),
//
//	w = z − i a,  s = w·w,
//	𝒱 = (Q + iP)/√s,
//	𝐅 = (Q + iP) w/s^{3/2},
//	∂𝐅_i/∂z_j = (Q + iP) [δ_ij s^{-3/2} − 3 w_i w_j s^{-5/2}],
//
// with the principal square root and s^{3/2} = s √s. On real x,
// s = |x|² − |a|² − 2i a·x, so the branch cut of √ is exactly the disk
// a·x = 0, |x| < |a| and √s → +|x| at infinity.
//
// Far zone (expansion of 1/√((x − ia)²) in a/r, derived here): for r ≫ |a|
//
//	𝒱 = (Q + iP)/r + i(Q + iP) a·x/r³ + O(|a|²/r³),
//
// so Φ = Q/r − P a·x/r³ and Ψ = P/r + Q a·x/r³: a charge Q with magnetic
// dipole μ = Q a (gyromagnetic ratio 2), and for P ≠ 0 a magnetic charge P
// with electric dipole d = −P a, the duality image of the former. The
// remainder of 𝐅 falls like |a|²/r⁴ (quadrupole).
type RootKerr struct {
	Q, P float64
	A    vec.Vec3
}

func (f RootKerr) charge() complex128 { return complex(f.Q, f.P) }

// shift returns w = z − i a.
func (f RootKerr) shift(z vec.CVec3) vec.CVec3 {
	return z.Sub(vec.Complex(vec.Vec3{}, f.A))
}

// At returns 𝐅(z) and its Jacobian.
func (f RootKerr) At(z vec.CVec3) (vec.CVec3, [3]vec.CVec3) {
	w := f.shift(z)
	s := w.Dot(w)
	sq := cmplx.Sqrt(s)
	c := f.charge()
	i3 := c / (s * sq)         // (Q+iP) s^{-3/2}
	i5 := 3 * c / (s * s * sq) // 3(Q+iP) s^{-5/2}
	F := w.Scale(i3)
	var D [3]vec.CVec3
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			D[i][j] = -i5 * w[i] * w[j]
		}
		D[i][i] += i3
	}
	return F, D
}

// Potential returns 𝒱(z) = (Q + iP)/√((z − ia)·(z − ia)), zero at infinity.
// Value implements Valuer: 𝐅(z) without the Jacobian. At a real point of
// an unshifted source (Coulomb, monopole, dyon at real x) it uses real
// arithmetic: 𝐅 = (Q + iP) x/|x|³.
func (f RootKerr) Value(z vec.CVec3) vec.CVec3 {
	if f.A == (vec.Vec3{}) && imag(z[0]) == 0 && imag(z[1]) == 0 && imag(z[2]) == 0 {
		x, y, w := real(z[0]), real(z[1]), real(z[2])
		r2 := x*x + y*y + w*w
		i3 := 1 / (r2 * math.Sqrt(r2))
		q, p := f.Q*i3, f.P*i3
		return vec.CVec3{complex(q*x, p*x), complex(q*y, p*y), complex(q*w, p*w)}
	}
	w := f.shift(z)
	s := w.Dot(w)
	return w.Scale(f.charge() / (s * cmplx.Sqrt(s)))
}

func (f RootKerr) Potential(z vec.CVec3) complex128 {
	if f.A == (vec.Vec3{}) && imag(z[0]) == 0 && imag(z[1]) == 0 && imag(z[2]) == 0 {
		// Real point, unshifted source: (Q + iP)/|x| in real arithmetic.
		x, y, w := real(z[0]), real(z[1]), real(z[2])
		ir := 1 / math.Sqrt(x*x+y*y+w*w)
		return complex(f.Q*ir, f.P*ir)
	}
	w := f.shift(z)
	return f.charge() / cmplx.Sqrt(w.Dot(w))
}

// Name returns "root-kerr".
func (RootKerr) Name() string { return "root-kerr" }

// Disk returns the branch disk of the field on real space: centred at the
// origin, normal to a, of radius |a|. For a = 0 the radius is zero.
func (f RootKerr) Disk() Disk {
	return Disk{Normal: f.A.Unit(), Radius: f.A.Norm()}
}

// CrossesDisk reports whether the straight segment from x0 to x1 passes
// through the open branch disk of f.
func (f RootKerr) CrossesDisk(x0, x1 vec.Vec3) bool { return f.Disk().Crosses(x0, x1) }

// Disk is a flat disk in space: the points x with Normal·(x − Centre) = 0
// and |x − Centre| < Radius. Normal is a unit vector.
type Disk struct {
	Centre, Normal vec.Vec3
	Radius         float64
}

// Crosses reports whether the straight segment from x0 to x1 has a point
// in the open disk. A disk of zero radius is never crossed. A segment
// lying in the disk's plane crosses it when its distance from the centre
// is less than the radius.
func (d Disk) Crosses(x0, x1 vec.Vec3) bool {
	if !(d.Radius > 0) {
		return false
	}
	r0 := x0.Sub(d.Centre)
	r1 := x1.Sub(d.Centre)
	h0 := d.Normal.Dot(r0)
	h1 := d.Normal.Dot(r1)
	if h0 == 0 && h1 == 0 {
		return segmentDistance(r0, r1) < d.Radius
	}
	if (h0 > 0 && h1 > 0) || (h0 < 0 && h1 < 0) {
		return false
	}
	lam := h0 / (h0 - h1)
	p := r0.Add(r1.Sub(r0).Scale(lam))
	// Remove the residual normal component left by rounding.
	p = p.Sub(d.Normal.Scale(d.Normal.Dot(p)))
	return p.Norm() < d.Radius
}

// RimDistance returns the distance of x from the disk's rim, the ring
// |x − Centre| = Radius in the disk's plane:
//
//	d = √((ρ − Radius)² + h²),  h = Normal·(x − Centre),  ρ = |x − Centre − h Normal|.
func (d Disk) RimDistance(x vec.Vec3) float64 {
	r := x.Sub(d.Centre)
	h := d.Normal.Dot(r)
	rho := r.Sub(d.Normal.Scale(h)).Norm()
	return math.Hypot(rho-d.Radius, h)
}

// segmentDistance returns the distance from the origin to the segment
// [r0, r1].
func segmentDistance(r0, r1 vec.Vec3) float64 {
	e := r1.Sub(r0)
	ee := e.Dot(e)
	if ee == 0 {
		return r0.Norm()
	}
	lam := math.Max(0, math.Min(1, -r0.Dot(e)/ee))
	return r0.Add(e.Scale(lam)).Norm()
}
