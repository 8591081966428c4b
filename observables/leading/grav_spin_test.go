package leading

import (
	"math"
	"testing"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/observables/convention"
)

// restSpin returns the four-vector of the rest-frame spin s of a body of
// four-velocity u (pure boost from the rest frame): a·u = 0.
func restSpin(u vec.Vec4, s vec.Vec3) vec.Vec4 {
	g := u[0]
	v := u.Spatial().Scale(1 / g)
	vs := v.Dot(s)
	return vec.FromSpatial(g*vs, s.Add(v.Scale(g*g/(1+g)*vs)))
}

// mpdQuad integrates the first-order force and spin torque of a
// Mathisson–Papapetrou–Dixon body with Tulczyjew–Dixon spin vector a and
// spin-induced quadrupole C_ES² = C along the straight line x(τ) = b + uτ
// in the linearized geometry of lin (background package, linear
// evaluator), with p = m u and a frozen:
//
//	dp^μ/dτ = −m Γ^μ_αβ u^α u^β − ½ m R^μ_νρσ u^ν s^{ρσ}
//	          + ½ C m η^{μλ} ∂_λR_ανβρ a^α u^ν a^β u^ρ,
//	da^μ/dτ = −Γ^μ_αβ u^α a^β + C ε^μ_{νρσ} u^ν R^ρ_{αβγ} u^α a^β u^γ a^σ,
//
// s^{ρσ} = S^{ρσ}/m = ε^{ρσαβ} u_α a_β. The force is MPD's
// (Mathisson 1937, Papapetrou 1951, Dixon 1970, from memory); the
// quadrupole force is the gradient of the interaction Lagrangian
// L = (C/2m) R_μανβ u^α u^β S^μ S^ν and its torque the rest-frame
// S × ∂L/∂S written covariantly; parallel transport gives the Γ term; the
// Fermi–Walker part along u is restored at the end from a·p = 0:
// Δa = Π_u(∫da) + u (a·Δp)/m. Total derivatives in the equations (hidden
// momentum, the difference between u and p/m) do not change the
// asymptotic Δp and Δa at first order.
func mpdQuad(lin spacetime.Linearizable, m, C float64, u, b, a vec.Vec4, rule gravQuadRule) (dp, da vec.Vec4) {
	order := 2
	if C != 0 {
		order = 3
	}
	ev := spacetime.NewLinearEvaluator(lin, order)
	var p spacetime.Point
	s := convention.SpinTensor(u, a)
	T := math.Sqrt(b.Dot(b)) / u.Spatial().Norm()
	at := func(tau float64) {
		ev.Eval([4]float64(b.Add(u.Scale(tau))), &p)
	}
	force := func(tau float64) vec.Vec4 {
		at(tau)
		var f vec.Vec4
		for mu := 0; mu < 4; mu++ {
			v := 0.0
			for al := 0; al < 4; al++ {
				for be := 0; be < 4; be++ {
					v -= m * p.Gamma[mu][al][be] * u[al] * u[be]
					for rh := 0; rh < 4; rh++ {
						v -= 0.5 * m * p.Riemann[mu][al][be][rh] * u[al] * s[be][rh]
					}
				}
			}
			if C != 0 {
				q := 0.0
				for al := 0; al < 4; al++ {
					for nu := 0; nu < 4; nu++ {
						for be := 0; be < 4; be++ {
							for rh := 0; rh < 4; rh++ {
								q += vec.Eta[al] * p.DRiemann[mu][al][nu][be][rh] * a[al] * u[nu] * a[be] * u[rh]
							}
						}
					}
				}
				v += 0.5 * C * m * vec.Eta[mu] * q
			}
			f[mu] = v
		}
		return f
	}
	torque := func(tau float64) vec.Vec4 {
		at(tau)
		var g, E vec.Vec4
		for mu := 0; mu < 4; mu++ {
			for al := 0; al < 4; al++ {
				for be := 0; be < 4; be++ {
					g[mu] -= p.Gamma[mu][al][be] * u[al] * a[be]
					for ga := 0; ga < 4; ga++ {
						E[mu] += p.Riemann[mu][al][be][ga] * u[al] * a[be] * u[ga]
					}
				}
			}
		}
		if C != 0 {
			g = g.Add(vec.Eps(u, E, a).Scale(C))
		}
		return g
	}
	dp = gravLine(force, T, rule)
	w := gravLine(torque, T, rule)
	w = w.Add(u.Scale(u.Dot(w))) // Π_u w
	da = w.Add(u.Scale(a.Dot(dp) / m))
	return dp, da
}

// spinCase is one configuration of the spinning-probe checks: a
// Kerr–Taub–NUT background with spin along +z (the form of the background
// package) and a probe line and spin of generic orientation.
type spinCase struct {
	name  string
	gamma float64
	n, w  vec.Vec3 // direction of motion, helper direction for b
	s1    vec.Vec3 // probe rest-frame spin
	M, N  float64
	a2    float64 // source spin along +z
	gauge float64 // Misner-string gauge
}

func spinCases() []spinCase {
	return []spinCase{
		{"Kerr, oblique spins", 1.3, vec.Vec3{1, 0, 0}, vec.Vec3{-0.4, 0.2, 0.7}, vec.Vec3{0.3, -0.4, 0.5}, 1, 0, 0.6, 0},
		{"Schwarzschild, probe spin along b", 2, vec.Vec3{0.3, 0.5, -0.2}, vec.Vec3{0.1, 0.9, 0.3}, vec.Vec3{0.2, 0.6, -0.1}, 0.8, 0, 0, 0},
		{"KTN C=0", 3, vec.Vec3{0.3, 0.5, -0.2}, vec.Vec3{-0.4, 0.2, 0.7}, vec.Vec3{-0.5, 0.1, 0.4}, 1, 0.7, -0.5, 0},
		{"KTN C=−1, slow", 1.05, vec.Vec3{1, 0.2, 0.1}, vec.Vec3{-0.4, 0.2, 0.7}, vec.Vec3{0.1, 0.2, 0.7}, 0.6, -0.9, 0.8, -1},
		{"Taub–NUT C=+1, fast", 10, vec.Vec3{0.2, 1, 0.3}, vec.Vec3{0.4, 0.2, 0.9}, vec.Vec3{0.6, -0.3, -0.2}, 0.4, 1.1, 0, 1},
	}
}

func (c spinCase) setup(b, scale float64) (u, bv, a1 vec.Vec4, src GravSource, lin spacetime.Linearizable) {
	u, bv = gravFrame(c.gamma, b, c.n, c.w)
	a1 = restSpin(u, c.s1.Scale(scale))
	src = GravSource{M: c.M, N: c.N, A: vec.Vec3{0, 0, c.a2}}
	lin = spacetime.KerrNewmanNUT{M: c.M, N: c.N, A: c.a2, StringGauge: c.gauge}
	return
}

// TestSpinImpulseVsMPDQuadrature checks the pole–dipole and quadrupole
// closed forms of SpinImpulse1PM (Δp and Δa) against the straight-line
// quadrature of the MPD force and torque (mpdQuad) through the linearized
// Kerr–Newman–Taub–NUT metric of the background package, for generic
// orientations of both spins, several γ, both NUT signs and three string
// gauges. Since the closed forms' O(a₁) and O(a₁²) terms are built from the
// source-spin dependence of the impulse (itself checked against the
// geodesic quadrature in TestGravVsSpacetime), the agreement shows that at
// 1PM the probe spin enters through a₁ + a₂ (covariant b, Tulczyjew spin),
// the quadrupole with C_ES² = 1 included.
func TestSpinImpulseVsMPDQuadrature(t *testing.T) {
	const (
		b, m = 1.5, 0.7
		// Quadrature converged to ≲ 1e-12 relative (TestGravQuadConverged);
		// 1e-9 leaves room for the rounding of its sums.
		tol = 1e-9
	)
	worstP, worstA := 0.0, 0.0
	for _, c := range spinCases() {
		for _, body := range []struct {
			kind GravBody
			C    float64
		}{{DipoleBody, 0}, {QuadrupoleBody, 1}, {QuadrupoleBody, 4.3}} {
			u, bv, a1, src, lin := c.setup(b, 1)
			pr := GravSpinProbe{M: m, A: a1, Body: body.kind, CES2: body.C}
			dp, da := SpinImpulse1PM(pr, src, u, bv)
			qp, qa := mpdQuad(lin, m, body.C, u, bv, a1, gravQuadDefault)
			ep, ea := gravRelErr(dp, qp), gravRelErr(da, qa)
			worstP, worstA = math.Max(worstP, ep), math.Max(worstA, ea)
			if ep > tol || ea > tol {
				t.Errorf("%s, %v C=%v: Δp closed %v quad %v (rel %.2e); Δa closed %v quad %v (rel %.2e)",
					c.name, body.kind, body.C, dp, qp, ep, da, qa, ea)
			}
		}
	}
	t.Logf("worst relative difference closed form vs MPD quadrature: Δp %.2e, Δa %.2e", worstP, worstA)
}

// TestSpinKerrBodyTruncations checks that the all-orders Kerr body agrees
// with the pole–dipole body to O(a₁) and with the C_ES² = 1 quadrupole
// body to O(a₁²): halving the probe spin divides the differences by 4
// and 8 (O(a₁²) and O(a₁³) remainders), for Δp and Δa.
func TestSpinKerrBodyTruncations(t *testing.T) {
	const b, m = 1.5, 0.7
	for _, c := range spinCases() {
		diff := func(scale float64, body GravBody) (float64, float64) {
			u, bv, a1, src, _ := c.setup(b, scale)
			kp, ka := SpinImpulse1PM(GravSpinProbe{M: m, A: a1}, src, u, bv)
			tp, ta := SpinImpulse1PM(GravSpinProbe{M: m, A: a1, Body: body, CES2: 1}, src, u, bv)
			return gravNorm(kp.Sub(tp)), gravNorm(ka.Sub(ta))
		}
		for _, tr := range []struct {
			body  GravBody
			ratio float64
		}{{DipoleBody, 4}, {QuadrupoleBody, 8}} {
			p1, a1 := diff(0.02, tr.body)
			p2, a2 := diff(0.01, tr.body)
			// The next order shifts the ratio by O(a₁/b) ~ 1 %; 5 % margin.
			for _, r := range []struct {
				what string
				v    float64
			}{{"Δp", p1 / p2}, {"Δa", a1 / a2}} {
				if math.Abs(r.v/tr.ratio-1) > 0.05 {
					t.Errorf("%s, %v: Kerr-body difference ratio %s = %.4g, want %v", c.name, tr.body, r.what, r.v, tr.ratio)
				}
			}
		}
	}
}

// TestSpinSumRule checks, against the geodesic quadrature of the
// linearized Kerr–Taub–NUT metric, that the impulse of a Kerr probe of spin
// a₁ off a source of spin a₂ equals that of a spinless probe off a source of
// spin a₁ + a₂ to all orders (covariant b; Vines 2017, from memory), for
// spins along +z of either sign, lines of generic direction.
func TestSpinSumRule(t *testing.T) {
	const b, m, tol = 1.5, 0.7, 1e-9 // tolerance as in TestGravVsSpacetime
	for _, c := range spinCases() {
		for _, sz := range []float64{0.5, -0.7} {
			u, bv := gravFrame(c.gamma, b, c.n, c.w)
			// The spin four-vector with spatial part sz ẑ in the source
			// frame and a₁·u = 0.
			a1 := vec.Vec4{sz * u[3] / u[0], 0, 0, sz}
			src := GravSource{M: c.M, N: c.N, A: vec.Vec3{0, 0, c.a2}}
			dp, _ := SpinImpulse1PM(GravSpinProbe{M: m, A: a1}, src, u, bv)
			lin := spacetime.KerrNewmanNUT{M: c.M, N: c.N, A: c.a2 + sz, StringGauge: c.gauge}
			want := spacetimeQuadImpulse(lin, m, 0, u, bv)
			if e := gravRelErr(dp, want); e > tol {
				t.Errorf("%s a₁z=%v: Kerr probe %v, spinless probe off a₁+a₂ (quadrature) %v, rel %.2e", c.name, sz, dp, want, e)
			}
		}
	}
}

// TestSpinLimitsAndSymmetries holds the closed forms to exact limits and
// symmetries (internal consistency):
//   - zero probe spin: every body gives the spinless Impulse1PM and Δa = 0;
//   - aligned spins in the equatorial plane: the published 1PM aligned-spin
//     angle with a = a₁ + a₂ (AlignedAngle1PM; Vines 2017, from memory) and
//     no spin kick;
//   - the charges enter only through (m + in)(M − iN): a probe NUT charge
//     equals a duality phase of the source;
//   - Newton's third law at 1PM, Δp₁ + Δp₂ = 0, with both bodies spinning
//     and NUT-charged, the second impulse computed in the other body's rest
//     frame (checks the phase of the probe's NUT charge);
//   - the Tulczyjew condition survives the kick: Δ(S^{μν}p_ν) = 0 with
//     ΔS from SpinTensorKick.
func TestSpinLimitsAndSymmetries(t *testing.T) {
	const b, m = 1.5, 0.7
	const tol = 1e-13 // closed forms only: rounding
	bodies := []GravSpinProbe{{Body: KerrBody}, {Body: DipoleBody}, {Body: QuadrupoleBody, CES2: 0.6}}
	for _, c := range spinCases() {
		u, bv, a1, src, _ := c.setup(b, 1)
		want := Impulse1PM(GravProbe{M: m}, src, u, bv)
		for _, body := range bodies {
			pr := body
			pr.M = m
			dp, da := SpinImpulse1PM(pr, src, u, bv)
			if e := gravRelErr(dp, want); e > tol || gravNorm(da) != 0 {
				t.Errorf("%s %v, no probe spin: Δp %v want %v; Δa %v want 0", c.name, pr.Body, dp, want, da)
			}

			// The charges enter only through (m + in)(M − iN) (and the
			// inertial mass m): a probe NUT charge is a phase of the source.
			pr.A, pr.N = a1, 0.4
			dp0, da0 := SpinImpulse1PM(pr, src, u, bv)
			cc := complex(src.M, -src.N) * complex(pr.M, pr.N) / complex(pr.M, 0)
			spr, ssrc := pr, src
			spr.N = 0
			ssrc.M, ssrc.N = real(cc), -imag(cc)
			dp1, da1 := SpinImpulse1PM(spr, ssrc, u, bv)
			if gravRelErr(dp1, dp0) > tol || gravRelErr(da1, da0) > tol {
				t.Errorf("%s %v: probe NUT charge as a source phase: Δp %v vs %v, Δa %v vs %v", c.name, pr.Body, dp0, dp1, da0, da1)
			}

			// Tulczyjew condition: Δ(S p) = ΔS p + S Δp = 0.
			p := u.Scale(m)
			S := convention.SpinTensor(p, a1)
			dS := SpinTensorKick(p, a1, dp0, da0)
			pl, dpl := p.Lower(), dp0.Lower()
			for mu := 0; mu < 4; mu++ {
				v, scale := 0.0, 0.0
				for nu := 0; nu < 4; nu++ {
					v += dS[mu][nu]*pl[nu] + S[mu][nu]*dpl[nu]
					scale += math.Abs(dS[mu][nu]*pl[nu]) + math.Abs(S[mu][nu]*dpl[nu])
				}
				if math.Abs(v) > tol*scale {
					t.Errorf("%s %v: Δ(S^μν p_ν)[%d] = %.3g", c.name, pr.Body, mu, v)
				}
			}
		}

		// Third law with both bodies moving in the frame of the source.
		u2 := vec.Velocity(vec.Vec3{0.1, -0.2, 0.15})
		a2 := restSpin(u2, vec.Vec3{0.2, 0.3, -0.4})
		b12 := gravProject(bv, u, u2)
		p1 := GravSpinProbe{M: m, N: 0.3, A: a1}
		p2 := GravSpinProbe{M: c.M, N: c.N, A: a2}
		dp1, _ := spinImpulse(p1, complex(p2.M, -p2.N), p2.A, u, u2, b12)
		dp2, _ := spinImpulse(p2, complex(p1.M, -p1.N), p1.A, u2, u, b12.Scale(-1))
		if e := gravNorm(dp1.Add(dp2)) / gravNorm(dp1); e > tol {
			t.Errorf("%s: Δp₁ + Δp₂ = %v (Δp₁ = %v)", c.name, dp1.Add(dp2), dp1)
		}
	}

	// Aligned spins: motion along +x, b along +y, so L is along −z and a
	// spin along −z is prograde.
	for _, gamma := range []float64{1.1, 2, 7} {
		v := math.Sqrt(1 - 1/(gamma*gamma))
		u := vec.Velocity(vec.Vec3{v, 0, 0})
		bv := vec.Vec4{0, 0, b, 0}
		for _, sp := range [][2]float64{{0.3, 0.2}, {-0.5, 0.1}, {0.4, -0.9}} {
			src := GravSource{M: 1.1, A: vec.Vec3{0, 0, -sp[1]}}
			pr := GravSpinProbe{M: m, A: vec.Vec4{0, 0, 0, -sp[0]}}
			dp, da := SpinImpulse1PM(pr, src, u, bv)
			theta := -dp[2] / (m * math.Sqrt(gamma*gamma-1))
			want := AlignedAngle1PM(1.1, sp[0]+sp[1], gamma, b)
			if math.Abs(theta-want) > tol*want || gravNorm(da) > tol*gravNorm(dp) {
				t.Errorf("aligned γ=%v spins %v: θ = %.15g want %.15g; Δa = %v", gamma, sp, theta, want, da)
			}
		}
	}
}
