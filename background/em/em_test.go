package em

import (
	"math"
	"math/cmplx"
	"testing"

	"ricochet/background/vec"
)

// fieldCases are the fields checked against Maxwell's equations and
// against contour integrals of themselves.
var fieldCases = []struct {
	name string
	f    Field
}{
	{"uniform", Uniform{E: vec.Vec3{0.3, -1.1, 0.7}, B: vec.Vec3{-0.4, 0.2, 1.3}}},
	{"coulomb", Coulomb{Q: 1.7}},
	{"monopole", Monopole{P: -0.8}},
	{"dyon", Dyon{Q: 0.6, P: 1.4}},
	{"root-kerr z", RootKerr{Q: 1, A: vec.Vec3{0, 0, 1}}},
	{"root-kerr tilted dyonic", RootKerr{Q: -0.7, P: 0.9, A: vec.Vec3{0.3, -0.5, 0.8}}},
}

// points are evaluation points away from every source above. The last two
// lie just above and below the branch disk of the a = ẑ root-Kerr field;
// rho is the radius of the Cauchy circle, kept well inside the distance
// to the nearest singularity or branch cut (about 0.01 for those two).
var points = []struct {
	z   vec.CVec3
	rho float64
}{
	{vec.Complex(vec.Vec3{2.1, -0.7, 1.3}, vec.Vec3{}), 0.05},
	{vec.Complex(vec.Vec3{-1.5, 2.2, -0.4}, vec.Vec3{0.1, -0.05, 0.2}), 0.05},
	{vec.Complex(vec.Vec3{0.4, 3.0, 2.5}, vec.Vec3{}), 0.05},
	{vec.Complex(vec.Vec3{0.3, 0.1, 0.01}, vec.Vec3{}), 0.001},
	{vec.Complex(vec.Vec3{0.3, 0.1, -0.01}, vec.Vec3{}), 0.001},
}

func cnorm(v vec.CVec3) float64 {
	return math.Sqrt(real(v[0]*cmplx.Conj(v[0]) + v[1]*cmplx.Conj(v[1]) + v[2]*cmplx.Conj(v[2])))
}

func jacScale(D [3]vec.CVec3) float64 {
	m := 0.0
	for i := range D {
		for j := range D[i] {
			m = math.Max(m, cmplx.Abs(D[i][j]))
		}
	}
	return m
}

// TestMaxwell checks ∇·𝐅 = tr D = 0 and ∇×𝐅 = 0 (D symmetric), the static
// source-free Maxwell equations for E and B at once (Jackson, Classical
// Electrodynamics, 3rd ed., §6.1, from memory), from the exact Jacobian.
func TestMaxwell(t *testing.T) {
	for _, fc := range fieldCases {
		for k, p := range points {
			_, D := fc.f.At(p.z)
			// A sum of a few terms each of size ≤ scale: rounding only.
			tol := 1e-14 * math.Max(jacScale(D), 1e-300)
			div := D[0][0] + D[1][1] + D[2][2]
			if cmplx.Abs(div) > tol {
				t.Errorf("%s point %d: div F = %v", fc.name, k, div)
			}
			for i := 0; i < 3; i++ {
				j := (i + 1) % 3
				if c := D[i][j] - D[j][i]; cmplx.Abs(c) > tol {
					t.Errorf("%s point %d: curl component %d%d = %v", fc.name, k, i, j, c)
				}
			}
		}
	}
}

// cauchyDerivative returns ∂g/∂z_j at z by Cauchy's integral formula on a
// circle of radius rho in the complex z_j plane, discretised with the
// n-point trapezoidal rule, which converges geometrically for periodic
// analytic integrands (Trefethen & Weideman 2014, SIAM Review 56, 385,
// from memory):
//
//	g'(z) ≈ (1/(n ρ)) Σ_k g(z + ρ ω_k e_j) ω_k^{-1},  ω_k = e^{2πik/n}.
func cauchyDerivative(g func(vec.CVec3) vec.CVec3, z vec.CVec3, j int, rho float64, n int) vec.CVec3 {
	var sum vec.CVec3
	for k := 0; k < n; k++ {
		w := cmplx.Exp(complex(0, 2*math.Pi*float64(k)/float64(n)))
		zz := z
		zz[j] += complex(rho, 0) * w
		sum = sum.Add(g(zz).Scale(1 / w))
	}
	return sum.Scale(complex(1/(float64(n)*rho), 0))
}

// TestJacobianCauchy checks the exact Jacobian against Cauchy's integral
// formula; 64 nodes with ρ/R ≤ 0.1 put the truncation error below 1e-60,
// so the tolerance is set by rounding, amplified by |𝐅|/(ρ|D|).
func TestJacobianCauchy(t *testing.T) {
	for _, fc := range fieldCases {
		for k, p := range points {
			F, D := fc.f.At(p.z)
			g := func(z vec.CVec3) vec.CVec3 { F, _ := fc.f.At(z); return F }
			scale := math.Max(jacScale(D), 1e-300)
			tol := 1e-14 * math.Max(1, cnorm(F)/(p.rho*scale))
			for j := 0; j < 3; j++ {
				got := cauchyDerivative(g, p.z, j, p.rho, 64)
				for i := 0; i < 3; i++ {
					if e := cmplx.Abs(got[i]-D[i][j]) / scale; e > tol {
						t.Errorf("%s point %d: D[%d][%d] = %v, contour integral %v (rel err %.2g, tol %.2g)",
							fc.name, k, i, j, D[i][j], got[i], e, tol)
					}
				}
			}
		}
	}
}

// TestPotentialGradient checks 𝐅 = −∇𝒱 by the same contour integral.
func TestPotentialGradient(t *testing.T) {
	for _, fc := range fieldCases {
		for k, p := range points {
			F, _ := fc.f.At(p.z)
			V := fc.f.Potential(p.z)
			g := func(z vec.CVec3) vec.CVec3 {
				v := fc.f.Potential(z)
				return vec.CVec3{v, 0, 0}
			}
			scale := cnorm(F)
			tol := 1e-14 * math.Max(1, cmplx.Abs(V)/(p.rho*scale))
			for j := 0; j < 3; j++ {
				got := -cauchyDerivative(g, p.z, j, p.rho, 64)[0]
				if e := cmplx.Abs(got-F[j]) / scale; e > tol {
					t.Errorf("%s point %d: F[%d] = %v, −∂V = %v (rel err %.2g, tol %.2g)",
						fc.name, k, j, F[j], got, e, tol)
				}
			}
		}
	}
}

// TestPointCharges compares with the textbook fields E = Q x/r³ (Coulomb)
// and B = P x/r³ (Dirac monopole) at real points, and the potentials
// Φ = Q/r, Ψ = P/r.
func TestPointCharges(t *testing.T) {
	x := vec.Vec3{0.7, -1.9, 2.4}
	r := x.Norm()
	const Q, P = 1.3, -0.6
	cases := []struct {
		name string
		f    Field
		E, B vec.Vec3
		V    complex128
	}{
		{"coulomb", Coulomb{Q}, x.Scale(Q / (r * r * r)), vec.Vec3{}, complex(Q/r, 0)},
		{"monopole", Monopole{P}, vec.Vec3{}, x.Scale(P / (r * r * r)), complex(0, P/r)},
		{"dyon", Dyon{Q, P}, x.Scale(Q / (r * r * r)), x.Scale(P / (r * r * r)), complex(Q/r, P/r)},
		{"root-kerr a=0", RootKerr{Q: Q, P: P}, x.Scale(Q / (r * r * r)), x.Scale(P / (r * r * r)), complex(Q/r, P/r)},
	}
	for _, c := range cases {
		// The value-only path (real arithmetic for unshifted sources at
		// real points) against the same closed forms.
		F := Value(c.f, x.Lift())
		if d := F.Real().Sub(c.E).Norm() + F.Imag().Sub(c.B).Norm(); d > 1e-15 {
			t.Errorf("%s: Value = %v, want E = %v B = %v", c.name, F, c.E, c.B)
		}
		E, B := EB(c.f, x)
		// Closed forms evaluated two ways: rounding only.
		if d := E.Sub(c.E).Norm() + B.Sub(c.B).Norm(); d > 1e-15 {
			t.Errorf("%s: E = %v B = %v, want %v %v", c.name, E, B, c.E, c.B)
		}
		if d := cmplx.Abs(c.f.Potential(x.Lift()) - c.V); d > 1e-15 {
			t.Errorf("%s: V = %v, want %v", c.name, c.f.Potential(x.Lift()), c.V)
		}
	}
}

// TestRootKerrFarZone checks the multipole structure derived in the
// RootKerr doc comment: charge Q + iP, magnetic dipole μ = Q a, electric
// dipole d = −P a, with dipole fields (3(μ·n)n − μ)/r³ (Jackson, Classical
// Electrodynamics, 3rd ed., eqs. 4.13 and 5.56, from memory), and the
// remainder equal to the quadrupole term of 1/|x − ia| = Σ (−ia·∇)ⁿ/n! 1/r
// (Taylor expansion), 𝒱₂ = −(Q + iP)(3(a·x)² − a²r²)/(2r⁵), up to O(a³/r⁵).
func TestRootKerrFarZone(t *testing.T) {
	const Q, P = 0.8, -0.5
	a := vec.Vec3{0.2, 0.3, 0.9}
	f := RootKerr{Q: Q, P: P, A: a}
	c := complex(Q, P)
	n := vec.Vec3{0.6, -0.48, 0.64}.Unit()
	mu := a.Scale(Q)
	d := a.Scale(-P)
	dip := func(m vec.Vec3, r float64) vec.Vec3 {
		return n.Scale(3 * m.Dot(n)).Sub(m).Scale(1 / (r * r * r))
	}
	prev := 0.0
	for _, r := range []float64{50, 100, 200, 400, 800} {
		x := n.Scale(r)
		F, _ := f.At(x.Lift())
		mono := x.Lift().Scale(c / complex(r*r*r, 0))
		rem := F.Sub(mono).Sub(vec.Complex(dip(d, r), dip(mu, r)))
		ax := a.Dot(x)
		aa := a.Dot(a)
		r5, r7 := math.Pow(r, 5), math.Pow(r, 7)
		quad := a.Scale(6 * ax / r5).Add(x.Scale(-15*ax*ax/r7 + 3*aa/r5)).Lift().Scale(c / 2)
		// The next multipole is smaller by ~|a|/r; 3|a|/r bounds its
		// angular factor for this direction.
		if e := cnorm(rem.Sub(quad)) / cnorm(quad); e > 3*a.Norm()/r {
			t.Errorf("r = %g: remainder differs from quadrupole by %.3g relative", r, e)
		}
		s := cnorm(rem) * r * r * r * r
		if prev != 0 {
			// r⁴|remainder| tends to a constant with O(|a|/r) corrections.
			if e := math.Abs(s/prev - 1); e > 3*a.Norm()/r {
				t.Errorf("r = %g: r⁴|rem| changed by %.3g from r/2", r, e)
			}
		}
		prev = s
	}
}

// TestDiskCrossing checks crossing detection for segments through the
// branch disk and segments passing outside its rim.
func TestDiskCrossing(t *testing.T) {
	f := RootKerr{Q: 1, A: vec.Vec3{0, 0, 2}}
	tilted := RootKerr{Q: 1, A: vec.Vec3{1, 0, 1}} // |a| = √2, normal (1,0,1)/√2
	cases := []struct {
		name   string
		f      RootKerr
		x0, x1 vec.Vec3
		want   bool
	}{
		{"through centre", f, vec.Vec3{0, 0, 5}, vec.Vec3{0, 0, -5}, true},
		{"oblique inside rim", f, vec.Vec3{-3, 1.2, 3}, vec.Vec3{3, 1.2, -3}, true},
		{"just inside rim", f, vec.Vec3{1.999, 0, 1}, vec.Vec3{1.999, 0, -1}, true},
		{"just outside rim", f, vec.Vec3{2.001, 0, 1}, vec.Vec3{2.001, 0, -1}, false},
		{"outside rim oblique", f, vec.Vec3{-3, 2.5, 3}, vec.Vec3{3, 2.5, -3}, false},
		{"stops above", f, vec.Vec3{0, 0, 5}, vec.Vec3{0, 0, 0.1}, false},
		{"parallel above", f, vec.Vec3{-5, 0, 0.5}, vec.Vec3{5, 0, 0.5}, false},
		{"in plane through", f, vec.Vec3{-5, 1, 0}, vec.Vec3{5, 1, 0}, true},
		{"in plane outside", f, vec.Vec3{-5, 3, 0}, vec.Vec3{5, 3, 0}, false},
		{"tilted through", tilted, vec.Vec3{1, 0, 0}, vec.Vec3{-1, 0, 0}, true},
		{"tilted beside", tilted, vec.Vec3{1, 1.5, 0}, vec.Vec3{-1, 1.5, 0}, false},
		{"zero spin", RootKerr{Q: 1}, vec.Vec3{0, 0, 1}, vec.Vec3{0, 0, -1}, false},
	}
	for _, c := range cases {
		if got := c.f.CrossesDisk(c.x0, c.x1); got != c.want {
			t.Errorf("%s: CrossesDisk = %v, want %v", c.name, got, c.want)
		}
		if got := c.f.CrossesDisk(c.x1, c.x0); got != c.want {
			t.Errorf("%s reversed: CrossesDisk = %v, want %v", c.name, got, c.want)
		}
	}
}

// TestDiskIsBranchCut checks that the field jumps across the disk and is
// continuous across the disk's plane outside the rim: the disk is where
// the principal branch of √((x − ia)²) is discontinuous.
func TestDiskIsBranchCut(t *testing.T) {
	f := RootKerr{Q: 1, A: vec.Vec3{0, 0, 1}}
	const h = 1e-9
	jump := func(x, y float64) float64 {
		up, _ := f.At(vec.Vec3{x, y, h}.Lift())
		dn, _ := f.At(vec.Vec3{x, y, -h}.Lift())
		return cnorm(up.Sub(dn)) / cnorm(up)
	}
	// Inside the rim 𝐅 changes sign of its branch: O(1) relative jump.
	if j := jump(0.3, 0.2); j < 0.5 {
		t.Errorf("inside rim: relative jump %.3g, want O(1)", j)
	}
	// Outside the rim the field is smooth: jump O(h).
	if j := jump(1.3, 0.2); j > 1e-7 {
		t.Errorf("outside rim: relative jump %.3g, want O(h)", j)
	}
}

// TestValueMatchesAt: the value-only evaluation (Valuer) returns the field
// of At at every test point, real and complex, for every field (rounding
// only: the two paths order the arithmetic differently).
func TestValueMatchesAt(t *testing.T) {
	for _, fc := range fieldCases {
		for _, p := range points {
			F, _ := fc.f.At(p.z)
			G := Value(fc.f, p.z)
			if d := cnorm(G.Sub(F)); d > 4e-16*cnorm(F) {
				t.Errorf("%s at %v: Value %v, At %v", fc.name, p.z, G, F)
			}
		}
	}
}
