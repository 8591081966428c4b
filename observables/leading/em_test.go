package leading

import (
	"math"
	"sort"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"ricochet/background/em"
	"ricochet/background/vec"
)

// emCase is a scattering configuration in the source rest frame.
type emCase struct {
	name string
	pr   EMProbe
	src  EMSource
	u, b vec.Vec4
}

// spinVec returns the probe spin four-vector whose rest-frame spin is ar,
// for a probe with four-velocity u (pure boost of (0, ar)).
func spinVec(u vec.Vec4, ar vec.Vec3) vec.Vec4 {
	g := u[0]
	v := u.Spatial().Scale(1 / g)
	vh := v.Unit()
	s := ar.Add(vh.Scale((g - 1) * vh.Dot(ar)))
	return vec.FromSpatial(g*v.Dot(ar), s)
}

// perp returns the part of b orthogonal to v as a four-vector with zero
// time component.
func perp(v, b vec.Vec3) vec.Vec4 {
	vh := v.Unit()
	return vec.FromSpatial(0, b.Sub(vh.Scale(vh.Dot(b))))
}

func emCases() []emCase {
	v1 := vec.Vec3{0.6, 0, 0}
	v2 := vec.Vec3{0.3, -0.5, 0.2}
	v3 := vec.Vec3{0.02, 0.05, -0.01}
	u1, u2, u3 := vec.Velocity(v1), vec.Velocity(v2), vec.Velocity(v3)
	return []emCase{
		{"spinless charge", EMProbe{M: 1, Q: 1}, EMSource{Q: 1}, u1, vec.Vec4{0, 0, 1, 0}},
		{"spinless dyons", EMProbe{M: 2, Q: 0.7, G: -0.4}, EMSource{Q: -1.3, P: 0.5}, u2, perp(v2, vec.Vec3{1, 0.4, -0.2})},
		{"aligned source spin", EMProbe{M: 1, Q: 1}, EMSource{Q: 1, A: vec.Vec3{0, 0, 0.4}}, u1, vec.Vec4{0, 0, 1, 0}},
		{"generic spins", EMProbe{M: 1.5, Q: -0.8, G: 0.3, A: spinVec(u2, vec.Vec3{0.2, 0.3, -0.25})},
			EMSource{Q: 0.9, P: -0.2, A: vec.Vec3{-0.1, 0.35, 0.3}}, u2, perp(v2, vec.Vec3{0.5, 0.7, 1.1})},
		{"slow, large spin", EMProbe{M: 1, Q: 1, A: spinVec(u3, vec.Vec3{0.4, -0.1, 0.5})},
			EMSource{Q: 2, A: vec.Vec3{0.1, 0.2, -0.3}}, u3, perp(v3, vec.Vec3{0, 1.5, 1})},
		{"ultrarelativistic", EMProbe{M: 1, Q: 1, G: 1, A: spinVec(vec.Velocity(vec.Vec3{0, 0, 0.99}), vec.Vec3{0.3, 0, 0.05})},
			EMSource{Q: 1, P: 1, A: vec.Vec3{0, 0.3, 0.1}}, vec.Velocity(vec.Vec3{0, 0, 0.99}), vec.Vec4{0, 1, 0, 0}},
	}
}

func norm4(x vec.Vec4) float64 {
	return math.Sqrt(x[0]*x[0] + x[1]*x[1] + x[2]*x[2] + x[3]*x[3])
}

// fieldTensor returns the real field strength F^μ_ν (upper, lower) for
// electric field E and magnetic field B, the textbook form with
// F^i_0 = F^0_i = E^i and F^i_j = ε_ijk B^k (Jackson, Classical
// Electrodynamics, 3rd ed., eq. 11.138 up to signature, from memory),
// here for complex E and B.
func fieldTensor(E, B vec.CVec3) [4][4]complex128 {
	var F [4][4]complex128
	for i := 0; i < 3; i++ {
		F[0][i+1] = E[i]
		F[i+1][0] = E[i]
		for j := 0; j < 3; j++ {
			for k := 0; k < 3; k++ {
				F[i+1][j+1] += complex(vec.Levi(0, i+1, j+1, k+1), 0) * B[k]
			}
		}
	}
	return F
}

// referenceImpulse integrates the root-Kerr probe's first-order equations
// dp/dτ = Re[(q − ig)𝔽(x − ia)]u, da/dτ = Re[((q − ig)/m)𝔽(x − ia)]a along
// the straight line with gonum's Gauss–Legendre rule, component by
// component, after the map t = (|b|/|v|) tan θ. The self-dual tensor
// 𝔽 = F(E → 𝐅, B → −i𝐅) is built here from the field values of
// background/em independently of the package's closed-form algebra.
func referenceImpulse(c emCase, f em.Field, n int) (dp, da vec.Vec4) {
	g := c.u[0]
	v := c.u.Spatial().Scale(1 / g)
	b := c.b.Spatial()
	scale := b.Norm() / v.Norm()
	k := complex(c.pr.Q, -c.pr.G)
	p := c.u.Scale(c.pr.M)
	// Ω = ((q − ig)/m) ∫𝔽 dτ; Δp = Re(Ω)p, Δa = Re(Ω)a.
	integrand := func(th float64, comp int) float64 {
		t := scale * math.Tan(th)
		jac := scale / (math.Cos(th) * math.Cos(th)) / g // dτ = dt/γ
		z := vec.Complex(b.Add(v.Scale(t)), c.pr.A.Spatial().Scale(-1))
		F, _ := f.At(z)
		T := fieldTensor(F, F.Scale(-1i))
		mu, vecIn := comp%4, p
		if comp >= 4 {
			vecIn = c.pr.A
		}
		s := 0.0
		for nu := 0; nu < 4; nu++ {
			s += real(k*T[mu][nu]) * vecIn[nu]
		}
		return s / c.pr.M * jac
	}
	for comp := 0; comp < 8; comp++ {
		val := quad.Fixed(func(th float64) float64 { return integrand(th, comp) },
			-math.Pi/2, math.Pi/2, n, quad.Legendre{}, 0)
		if comp < 4 {
			dp[comp] = val
		} else {
			da[comp-4] = val
		}
	}
	return dp, da
}

// TestEMImpulseQuadrature checks the closed form against the quadrature
// of the equations of motion along the line (gonum quad) and against the
// package's own quadrature evaluator. Tolerance 1e-10 relative to |Δp|
// (|Δa| for the spin): 1000 nodes resolve the nearest complex singularity
// (distance ≳ 0.1 of the node spacing scale) to below 1e-12.
func TestEMImpulseQuadrature(t *testing.T) {
	for _, c := range emCases() {
		if EMCrossesDisk(c.pr, c.src, c.u, c.b) {
			t.Fatalf("%s: test line crosses the branch disk", c.name)
		}
		dp, da := EMImpulse(c.pr, c.src, c.u, c.b)
		rp, ra := referenceImpulse(c, c.src.Field(), 1000)
		qp, qa := EMImpulseQuadrature(c.pr, c.src.Field(), c.u, c.b, &EMQuadrature{N: 1000})
		sp := norm4(rp)
		sa := math.Max(norm4(ra), 1e-300)
		ep, ea := norm4(dp.Sub(rp))/sp, norm4(da.Sub(ra))/sa
		eqp, eqa := norm4(qp.Sub(rp))/sp, norm4(qa.Sub(ra))/sa
		t.Logf("%s: rel err closed form %.2g (Δp) %.2g (Δa); package quadrature %.2g %.2g", c.name, ep, ea, eqp, eqa)
		if ep > 1e-10 || eqp > 1e-10 {
			t.Errorf("%s: Δp = %v, package quadrature %v, gonum quadrature %v", c.name, dp, qp, rp)
		}
		if norm4(c.pr.A) > 0 && (ea > 1e-10 || eqa > 1e-10) {
			t.Errorf("%s: Δa = %v, package quadrature %v, gonum quadrature %v", c.name, da, qa, ra)
		}
		if norm4(c.pr.A) == 0 && norm4(da) != 0 {
			t.Errorf("%s: spinless probe has Δa = %v", c.name, da)
		}
	}
}

// TestEMLorentzForce checks the spinless case against the textbook dyon
// force q(E + v×B) + g(B − v×E) (Jackson, Classical Electrodynamics, 3rd
// ed., §6.11–6.12, from memory; duality-rotated Lorentz force) integrated
// over t with real E and B from background/em, using gonum quad on
// (−∞, ∞) with its own infinite-interval map. The energy component must
// vanish: the source is static and Δp⁰ = ∫ F·v dt = 0 at first order.
func TestEMLorentzForce(t *testing.T) {
	for _, c := range emCases() {
		if norm4(c.pr.A) != 0 || c.src.A != (vec.Vec3{}) {
			continue
		}
		f := c.src.Field()
		g := c.u[0]
		v := c.u.Spatial().Scale(1 / g)
		b := c.b.Spatial()
		force := func(tt float64, i int) float64 {
			E, B := em.EB(f, b.Add(v.Scale(tt)))
			F := E.Add(v.Cross(B)).Scale(c.pr.Q).Add(B.Sub(v.Cross(E)).Scale(c.pr.G))
			return F[i]
		}
		dp, _ := EMImpulse(c.pr, c.src, c.u, c.b)
		var want vec.Vec4
		for i := 0; i < 3; i++ {
			want[i+1] = quad.Fixed(func(tt float64) float64 { return force(tt, i) }, math.Inf(-1), math.Inf(1), 2000, nil, 0)
		}
		// gonum's algebraic map t = x/(1 − x²) converges more slowly than
		// the tan map: 2000 nodes reach ~1e-12.
		if e := norm4(dp.Sub(want)) / norm4(want); e > 1e-10 {
			t.Errorf("%s: Δp = %v, Lorentz force quadrature %v (rel err %.2g)", c.name, dp, want, e)
		} else {
			t.Logf("%s: rel err %.2g", c.name, e)
		}
		// v·𝒢 = 0 analytically; rounding in the dot product only.
		if math.Abs(dp[0]) > 1e-15*norm4(dp) {
			t.Errorf("%s: Δp⁰ = %v, want 0", c.name, dp[0])
		}
	}
}

// TestEMRutherford checks a = 0 against the first-order Coulomb impulse
// Δp = (2qQ/(v b)) b̂ (Jackson, Classical Electrodynamics, 3rd ed., §13.1,
// from memory).
func TestEMRutherford(t *testing.T) {
	for _, tc := range []struct {
		v, b, q, Q float64
	}{
		{0.6, 1, 1, 1}, {0.1, 3, -2, 0.5}, {0.999, 0.2, 1, -1},
	} {
		u := vec.Velocity(vec.Vec3{tc.v, 0, 0})
		dp, _ := EMImpulse(EMProbe{M: 1, Q: tc.q}, EMSource{Q: tc.Q}, u, vec.Vec4{0, 0, tc.b, 0})
		want := vec.Vec4{0, 0, 2 * tc.q * tc.Q / (tc.v * tc.b), 0}
		// Closed form evaluated two ways: rounding only.
		if e := norm4(dp.Sub(want)) / norm4(want); e > 1e-15 {
			t.Errorf("%+v: Δp = %v, want %v", tc, dp, want)
		}
	}
}

// TestEMSpinTransfer checks that moving spin from probe to source at fixed
// a₁ + a₂ (spatial parts in the source frame) leaves Δp unchanged, the
// Newman–Janis structure (Vines 2017, from memory, for gravity).
func TestEMSpinTransfer(t *testing.T) {
	for _, c := range emCases() {
		a1 := c.pr.A.Spatial()
		moved := c
		moved.pr.A = vec.Vec4{}
		moved.src.A = c.src.A.Add(a1)
		dp, _ := EMImpulse(c.pr, c.src, c.u, c.b)
		dq, _ := EMImpulse(moved.pr, moved.src, moved.u, moved.b)
		if e := norm4(dp.Sub(dq)) / norm4(dp); e > 1e-14 {
			t.Errorf("%s: Δp = %v with probe spin, %v with spin moved to source", c.name, dp, dq)
		}
		// The same with the independent quadrature (tolerance as in
		// TestEMImpulseQuadrature).
		rp, _ := referenceImpulse(moved, moved.src.Field(), 1000)
		if e := norm4(dp.Sub(rp)) / norm4(rp); e > 1e-10 {
			t.Errorf("%s: Δp = %v, quadrature with moved spin %v", c.name, dp, rp)
		}
	}
}

// TestEMDuality checks invariance under a common duality rotation
// (q − ig) → e^{−iθ}(q − ig), (Q + iP) → e^{iθ}(Q + iP).
func TestEMDuality(t *testing.T) {
	for _, c := range emCases() {
		dp, da := EMImpulse(c.pr, c.src, c.u, c.b)
		for _, th := range []float64{0.3, 1.7, -2.5} {
			r := c
			qg := complex(c.pr.Q, -c.pr.G) * complex(math.Cos(th), -math.Sin(th))
			QP := complex(c.src.Q, c.src.P) * complex(math.Cos(th), math.Sin(th))
			r.pr.Q, r.pr.G = real(qg), -imag(qg)
			r.src.Q, r.src.P = real(QP), imag(QP)
			ep, ea := EMImpulse(r.pr, r.src, r.u, r.b)
			// A few roundings in the rotated charges.
			if e := norm4(dp.Sub(ep)) / norm4(dp); e > 1e-14 {
				t.Errorf("%s θ=%g: Δp %v → %v", c.name, th, dp, ep)
			}
			if e := norm4(da.Sub(ea)); e > 1e-14*math.Max(norm4(da), 1e-300) {
				t.Errorf("%s θ=%g: Δa %v → %v", c.name, th, da, ea)
			}
		}
	}
}

// TestEMConstraints checks the first-order mass shell Δp·p = 0 and the
// preserved spin supplementary condition Δa·p + a·Δp = 0, which hold
// because the generator is antisymmetric with both indices down.
func TestEMConstraints(t *testing.T) {
	for _, c := range emCases() {
		dp, da := EMImpulse(c.pr, c.src, c.u, c.b)
		p := c.u.Scale(c.pr.M)
		sc := norm4(dp) * norm4(p)
		if e := math.Abs(dp.Dot(p)); e > 1e-14*sc {
			t.Errorf("%s: Δp·p = %v", c.name, e)
		}
		if e := math.Abs(da.Dot(p) + c.pr.A.Dot(dp)); e > 1e-14*(sc+norm4(da)*norm4(p)) {
			t.Errorf("%s: Δa·p + a·Δp = %v", c.name, e)
		}
	}
}

// TestEMCrossesDisk checks that a line through the combined branch disk is
// reported and the closed form then differs from the real integral, and
// that a line passing outside the rim is not reported.
func TestEMCrossesDisk(t *testing.T) {
	u := vec.Velocity(vec.Vec3{0, 0, 0.5})
	pr := EMProbe{M: 1, Q: 1}
	through := EMSource{Q: 1, A: vec.Vec3{0, 0, 1.5}} // disk radius 1.5 ⊥ v
	b := vec.Vec4{0, 1, 0, 0}
	if !EMCrossesDisk(pr, through, u, b) {
		t.Errorf("line at b = 1 through disk of radius 1.5 not reported")
	}
	outside := EMSource{Q: 1, A: vec.Vec3{0, 0, 0.8}}
	if EMCrossesDisk(pr, outside, u, b) {
		t.Errorf("line at b = 1 outside disk of radius 0.8 reported")
	}
	// Probe spin counts too: a₁ + a₂ = 1.5 ẑ.
	spun := EMProbe{M: 1, Q: 1, A: spinVec(u, vec.Vec3{0, 0, 0.7 / u[0]})}
	if !EMCrossesDisk(spun, outside, u, b) {
		t.Errorf("combined spin disk not reported")
	}
}

// TestGaussLegendre checks the package's rule against gonum's Legendre
// nodes and against exact moments ∫₋₁¹ x^k dx = 2/(k+1) (k even), which
// the n-point rule integrates exactly for k ≤ 2n − 1.
func TestGaussLegendre(t *testing.T) {
	for _, n := range []int{1, 2, 7, 64, 1000} {
		x, w := gaussLegendre(n, -1, 1)
		gx := make([]float64, n)
		gw := make([]float64, n)
		quad.Legendre{}.FixedLocations(gx, gw, -1, 1)
		sortNodes(x, w)
		sortNodes(gx, gw)
		for i := range x {
			// Both computed by iterations converged to rounding.
			if math.Abs(x[i]-gx[i]) > 1e-14 || math.Abs(w[i]-gw[i]) > 1e-14 {
				t.Fatalf("n=%d node %d: (%v, %v), gonum (%v, %v)", n, i, x[i], w[i], gx[i], gw[i])
			}
		}
		for k := 0; k <= 2*n-1 && k <= 40; k++ {
			s := 0.0
			for i := range x {
				s += w[i] * math.Pow(x[i], float64(k))
			}
			want := 0.0
			if k%2 == 0 {
				want = 2 / float64(k+1)
			}
			if math.Abs(s-want) > 1e-13 {
				t.Errorf("n=%d k=%d: %v, want %v", n, k, s, want)
			}
		}
	}
}

// sortNodes sorts quadrature nodes ascending, carrying the weights along.
func sortNodes(x, w []float64) {
	idx := make([]int, len(x))
	for i := range idx {
		idx[i] = i
	}
	sort.Slice(idx, func(i, j int) bool { return x[idx[i]] < x[idx[j]] })
	xs := make([]float64, len(x))
	ws := make([]float64, len(x))
	for i, k := range idx {
		xs[i], ws[i] = x[k], w[k]
	}
	copy(x, xs)
	copy(w, ws)
}

// boostFields returns the fields seen by an observer moving with velocity
// v through the fields E, B (Jackson, Classical Electrodynamics, 3rd ed.,
// eq. 11.149, from memory):
//
//	E' = γ(E + v×B) − γ²/(γ+1) v(v·E),  B' = γ(B − v×E) − γ²/(γ+1) v(v·B).
func boostFields(v, E, B vec.Vec3) (Ep, Bp vec.Vec3) {
	g := 1 / math.Sqrt(1-v.Dot(v))
	k := g * g / (g + 1)
	Ep = E.Add(v.Cross(B)).Scale(g).Sub(v.Scale(k * v.Dot(E)))
	Bp = B.Sub(v.Cross(E)).Scale(g).Sub(v.Scale(k * v.Dot(B)))
	return Ep, Bp
}

// boostBack returns the source-frame components of a four-vector given in
// the rest frame of an observer moving with velocity v.
func boostBack(v vec.Vec3, x vec.Vec4) vec.Vec4 {
	g := 1 / math.Sqrt(1-v.Dot(v))
	vh := v.Unit()
	s := x.Spatial()
	sp := s.Add(vh.Scale((g - 1) * vh.Dot(s))).Add(v.Scale(g * x[0]))
	return vec.FromSpatial(g*(x[0]+v.Dot(s)), sp)
}

// TestEMRestFrameDipole checks the signs of the root-Kerr generator at
// first order in the probe spin, independently of the covariant form: in
// the probe's rest frame a dyonic probe (q, g) with rest spin a has
// magnetic moment μ = q a and electric dipole d = −g a, so energy
// −a·ℬ with ℬ = qB' − gE', force ∇'(a·ℬ) (up to total time derivatives,
// which integrate to zero) and torque a × ℬ = m da/dτ; the time component
// of the spin follows from a·u = 0: m da⁰/dτ = a·ℰ, ℰ = qE' + gB' (Jackson,
// Classical Electrodynamics, 3rd ed., §5.7 and §11.11, from memory). The
// rest-frame fields are the boosted source fields, and probe-frame spatial
// derivatives at fixed t' are ∂'_j = Λ_jk ∂_k, Λ = 1 + (γ−1)v̂v̂, since the
// source fields are static. The linear-in-spin parts of the closed form
// are extracted by the odd combination [X(εa) − X(−εa)]/(2ε), whose error
// is O(ε²) (ε = 1e-4 gives ≲ 1e-8 relative, the tolerance set below at
// 1e-6 for margin). The same rest-frame integrals with the moment scaled by
// g_s/2 check EMBMTImpulse for gyromagnetic ratios g_s ≠ 2 (BMT 1959,
// from memory).
func TestEMRestFrameDipole(t *testing.T) {
	cases := []struct {
		name string
		v    vec.Vec3
		b    vec.Vec3
		pr   EMProbe
		src  EMSource
		ar   vec.Vec3 // rest-frame spin
		gyro float64  // gyromagnetic ratio for the BMT comparison
	}{
		{"charge past charge", vec.Vec3{0.6, 0, 0}, vec.Vec3{0, 1, 0}, EMProbe{M: 1, Q: 1}, EMSource{Q: 1}, vec.Vec3{0.3, -0.2, 0.5}, 2.0023},
		{"dyon past dyon", vec.Vec3{0.2, -0.4, 0.3}, vec.Vec3{1, 0.5, 0}, EMProbe{M: 1.7, Q: 0.8, G: -0.6}, EMSource{Q: -1.1, P: 0.7}, vec.Vec3{-0.4, 0.1, 0.6}, 5.59},
		{"fast monopole", vec.Vec3{0, 0.95, 0}, vec.Vec3{0, 0, 2}, EMProbe{M: 1, Q: 1}, EMSource{P: 1}, vec.Vec3{1, 0.2, 0.3}, 0},
	}
	const eps = 1e-4
	for _, c := range cases {
		u := vec.Velocity(c.v)
		g := u[0]
		b := perp(c.v, c.b)
		bs := b.Spatial()
		vh := c.v.Unit()
		f := c.src.Field()
		m := c.pr.M
		a := c.ar
		// Rest-frame rates as functions of proper time.
		rates := func(tau float64) (dp, da, dq, dbmt vec.Vec4) {
			x := bs.Add(c.v.Scale(g * tau))
			E, B := em.EB(f, x)
			Ep, Bp := boostFields(c.v, E, B)
			calE := Ep.Scale(c.pr.Q).Add(Bp.Scale(c.pr.G))
			calB := Bp.Scale(c.pr.Q).Sub(Ep.Scale(c.pr.G))
			_, D := f.At(x.Lift())
			for j := 0; j < 3; j++ {
				// ∂'_j of the source fields.
				var dE, dB vec.Vec3
				for k := 0; k < 3; k++ {
					l := vh[j] * vh[k] * (g - 1)
					if j == k {
						l++
					}
					for i := 0; i < 3; i++ {
						dE[i] += l * real(D[i][k])
						dB[i] += l * imag(D[i][k])
					}
				}
				// The field boost is linear, so it maps derivatives too.
				dEp, dBp := boostFields(c.v, dE, dB)
				dcalB := dBp.Scale(c.pr.Q).Sub(dEp.Scale(c.pr.G))
				dp[j+1] = a.Dot(dcalB)
			}
			da = vec.FromSpatial(a.Dot(calE)/m, a.Cross(calB).Scale(1/m))
			// Charge force ℰ and BMT spin rate with the moment scaled by
			// g_s/2; at first order the rest frame does not accelerate,
			// so the Thomas precession does not enter here.
			dq = vec.FromSpatial(0, calE)
			dbmt = vec.FromSpatial(a.Dot(calE)/m, a.Cross(calB).Scale(c.gyro/(2*m)))
			return dp, da, dq, dbmt
		}
		scale := bs.Norm() / (g * c.v.Norm())
		var res [4]vec.Vec4
		for comp := 0; comp < 16; comp++ {
			val := quad.Fixed(func(th float64) float64 {
				tau := scale * math.Tan(th)
				jac := scale / (math.Cos(th) * math.Cos(th))
				var r [4]vec.Vec4
				r[0], r[1], r[2], r[3] = rates(tau)
				return r[comp/4][comp%4] * jac
			}, -math.Pi/2, math.Pi/2, 600, quad.Legendre{}, 0)
			res[comp/4][comp%4] = val
		}
		want := boostBack(c.v, res[0])
		wantA := boostBack(c.v, res[1])
		wantBMT := boostBack(c.v, res[2].Add(res[0].Scale(c.gyro/2)))
		wantBMTA := boostBack(c.v, res[3])

		plus, minus := c.pr, c.pr
		plus.A = spinVec(u, a.Scale(eps))
		minus.A = spinVec(u, a.Scale(-eps))
		dpP, daP := EMImpulse(plus, c.src, u, b)
		dpM, daM := EMImpulse(minus, c.src, u, b)
		lin := dpP.Sub(dpM).Scale(1 / (2 * eps))
		linA := daP.Sub(daM).Scale(1 / (2 * eps))
		ep := norm4(lin.Sub(want)) / norm4(want)
		ea := norm4(linA.Sub(wantA)) / norm4(wantA)
		t.Logf("%s: linear-in-spin Δp rel err %.2g, Δa rel err %.2g", c.name, ep, ea)
		if ep > 1e-6 {
			t.Errorf("%s: linear-in-spin Δp = %v, rest-frame dipole %v", c.name, lin, want)
		}
		if ea > 1e-6 {
			t.Errorf("%s: Δa/ε = %v, rest-frame torque %v", c.name, linA, wantA)
		}

		// The BMT probe's closed form is exactly linear in spin: compare
		// at the full spin; 600 nodes resolve the integrands to ~1e-14,
		// so 1e-10 leaves room for the derivative-weighted sums.
		bp := BMTProbe{M: m, Q: c.pr.Q, G: c.pr.G, Gyro: c.gyro, A: spinVec(u, a)}
		dpB, daB := EMBMTImpulse(bp, em.Dyon{Q: c.src.Q, P: c.src.P}, u, b)
		eb := norm4(dpB.Sub(wantBMT)) / norm4(wantBMT)
		eba := norm4(daB.Sub(wantBMTA)) / norm4(wantBMTA)
		t.Logf("%s: BMT g=%g Δp rel err %.2g, Δa rel err %.2g", c.name, c.gyro, eb, eba)
		if eb > 1e-10 {
			t.Errorf("%s: BMT Δp = %v, rest-frame %v", c.name, dpB, wantBMT)
		}
		if eba > 1e-10 {
			t.Errorf("%s: BMT Δa = %v, rest-frame %v", c.name, daB, wantBMTA)
		}
	}
}
