package integrate

import (
	"math"
	"testing"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/observables/fit"
	"ricochet/validate/exact"
)

// TestDixonEquatorialQuadrature: a spinning body with its spin
// perpendicular to the equatorial plane of Schwarzschild and Kerr, spins
// comparable to M, scatters with the deflection of the radial quadrature
// of the Tulczyjew–Dixon conserved energy and angular momentum (Saijo,
// Maeda, Shibata & Mino 1998; Bini, Geralico & Vines 2017 for scattering;
// exact.SpinningEquatorial) to ≤ 1e-10 relative. The deflection is read
// off the asymptotic momentum, χ = atan2(−Δp_y … ), gauge-invariant.
func TestDixonEquatorialQuadrature(t *testing.T) {
	const M, b, v = 1.0, 12.0, 0.6
	gam := 1 / math.Sqrt((1-v)*(1+v))
	cases := []struct{ a, s float64 }{
		{0, 0.8}, {0, -0.8}, // Schwarzschild
		{0.7, 0.5}, {0.7, -0.5}, {-0.9, 0.9}, {-0.9, -1}, {0.5, 0}, // Kerr, a > 0 retrograde in this frame
	}
	for _, c := range cases {
		ex, err := exact.SpinningEquatorial(v, b, M, c.a, c.s)
		if err != nil {
			t.Fatal(err)
		}
		in, err := Incoming(1, gam, b, vec.Vec3{0, 0, c.s})
		if err != nil {
			t.Fatal(err)
		}
		d := &Dixon{Metric: spacetime.Kerr(M, c.a), M: 1, Gyro: 2}
		out, err := Scatter(d, in, nil)
		if err != nil || out.Status != StatusScattered {
			t.Fatalf("a=%g s=%g: %v %v", c.a, c.s, err, out.Status)
		}
		chi := math.Atan2(-out.POut[2], out.POut[1])
		// 1e-10 relative: the requirement for the exact check; the
		// integration's own error estimate is far below it at the default
		// tolerance, the quadrature's at rounding.
		rel := math.Abs(chi-ex.Chi) / ex.Chi
		t.Logf("a=%+.1f s=%+.1f: χ integrated %.15f, quadrature %.15f (±%.0e), rel %.1e, estimate %.1e, out-of-plane %.1e",
			c.a, c.s, chi, ex.Chi, ex.ChiErr, rel, out.ImpulseErr.Spatial().Norm()/out.POut.Spatial().Norm(), out.POut[3])
		if rel > 1e-10 || math.Abs(out.POut[3]) > 1e-13 {
			t.Errorf("a=%g s=%g: χ = %.15g, quadrature %.15g (rel %.2g); p_z out %.2g", c.a, c.s, chi, ex.Chi, rel, out.POut[3])
		}
	}
}

// kerrAligned returns Δp_b (b = 1, m = 1) of the Dixon body in Kerr of
// mass eps and spin along z aBg, with rest spin along z aPr, its
// first-order prediction by quadrature (FirstOrder) and its error estimate.
func kerrAligned(t *testing.T, v, eps, aBg, aPr float64) (dp, dp1, sigma float64) {
	t.Helper()
	gam := 1 / math.Sqrt((1-v)*(1+v))
	in, err := Incoming(1, gam, 1, vec.Vec3{0, 0, aPr})
	if err != nil {
		t.Fatal(err)
	}
	d := &Dixon{Metric: spacetime.Kerr(eps, aBg), M: 1, Gyro: 2}
	out, err := Scatter(d, in, nil)
	if err != nil || out.Status != StatusScattered {
		t.Fatalf("v=%g eps=%g: %v %v", v, eps, err, out.Status)
	}
	// The straight-line quadrature of the Dixon force carries pieces of
	// higher order in M (the dynamical mass and the spin tensor are formed
	// with the local metric); its part linear in M is taken by the
	// symmetric difference in M at ±λM, exact to O(λ²).
	const lam = 1e-6
	pp, _ := FirstOrder(&Dixon{Metric: spacetime.Kerr(lam*eps, aBg), M: 1, Gyro: 2}, in, 0)
	pm, _ := FirstOrder(&Dixon{Metric: spacetime.Kerr(-lam*eps, aBg), M: 1, Gyro: 2}, in, 0)
	return out.Impulse[2], (pp[2] - pm[2]) / (2 * lam), out.ImpulseErr[2]
}

// kerrSpinScan returns the ε and ε² coefficients of the part of Δp_b
// linear in the background spin (probe false) or in the probe spin (probe
// true), both along z, extracted from coupling scans of the integrated
// Dixon body: at each ε the odd part in the spin (oddPart, a = 0.005 b) of
// Δp_b and of the residual Δp_b − Δp_b,1, then fit.NextOrder over ε (for
// the ε coefficient the odd part times ε is fitted as a "residual", so
// that its limit over ε² is the ε coefficient).
func kerrSpinScan(t *testing.T, v float64, probe bool) (c1, c2 fit.NextOrderResult) {
	var p1, p2 []fit.Point
	const a = 0.005
	// The coupling grid scales with v² (the expansion parameter of the
	// deflection is ε/v²), ratio √2 from 2.5e-4 v²/0.36.
	for k := 0; k < 12; k++ {
		eps := 0.00025 * math.Pow(2, float64(k)/2) * v * v / 0.36
		var sig float64
		dps := map[float64][2]float64{}
		for _, h := range []float64{a, -a, a / 2, -a / 2} {
			aBg, aPr := h, 0.0
			if probe {
				aBg, aPr = 0, h
			}
			dp, dp1, s := kerrAligned(t, v, eps, aBg, aPr)
			sig = math.Max(sig, s)
			dps[h] = [2]float64{dp, dp1}
		}
		odd := func(i int) float64 {
			return oddPart(func(h float64) float64 { return dps[h][0] - float64(i)*dps[h][1] }, a)
		}
		full, res := odd(0), odd(1)
		// Error of the odd part: the integration errors over the
		// Richardson combination of differences (weights 4/3·1/a + 1/3·1/(2a)).
		p1 = append(p1, fit.Point{Eps: eps, Residual: full * eps, Sigma: 3 * sig / a * eps})
		p2 = append(p2, fit.Point{Eps: eps, Residual: res, Sigma: 3 * sig / a})
	}
	r1, err := fit.NextOrder(p1, nil)
	if err != nil {
		t.Fatal(err)
	}
	r2, err := fit.NextOrder(p2, nil)
	if err != nil {
		t.Fatal(err)
	}
	return r1, r2
}

// TestKerrSpinWeights: first and second order in M/b of the part of the
// impulse linear in the spins, aligned with the orbital angular momentum
// (here along −z), from coupling scans of the integrated Dixon body in Kerr:
//
//   - 1PM: the probe spin and the background spin enter only through
//     their sum (covariant b; Vines 2017): equal ε coefficients, both
//     equal to γv·4γ/√(γ²−1) = 4γ² per unit a_z/b of Δp_b/m (from the
//     aligned 1PM angle χ₁ = −4γ a_L/(b√(γ²−1)), a_L = −a_z).
//   - 2PM: the aligned-spin angle χ₂ = −(π/2) γ(5γ² − 3)/(γ² − 1)^{3/2}
//     (4a_bg + 3a_probe)/b per (M/b)² in the test-body limit (Bini & Damour
//     2018, Phys. Rev. D 98, 044036; Vines, Steinhoff & Buonanno 2019,
//     Phys. Rev. D 99, 064054: weights (4m₂ + 3m₁) and (4m₁ + 3m₂); from
//     memory, the overall normalisation fixed by the Kerr geodesic
//     quadrature exact.KerrEquatorial): background and probe spin weighted
//     4 : 3, so Δp_b/m = −γv sin χ carries −γv χ₂.
//
// The second-order coefficients are also derived independently from the
// Saijo et al. 1998 quadrature (exact.SpinningEquatorial) expanded in
// M/b by Richardson extrapolation (secondOrderOf). Tolerances: 1e-6
// relative, the accuracy asked of a 2PM extraction; the fits' σ and the
// O(a⁴) remainder of the spin Richardson step (~1e-7) are below it.
func TestKerrSpinWeights(t *testing.T) {
	vs := []float64{0.3, 0.6, 0.9}
	if testing.Short() {
		vs = vs[1:2]
	}
	for _, v := range vs {
		gam := 1 / math.Sqrt((1-v)*(1+v))
		g2 := gam * gam
		want1 := -4 * gam
		chi2 := -math.Pi / 2 * gam * (5*g2 - 3) / math.Pow(g2-1, 1.5)
		var bg1, bg2 float64 // background-spin coefficients
		for _, c := range []struct {
			probe bool
			w     float64
		}{{false, 4}, {true, 3}} {
			want2 := gam * v * chi2 * c.w // a_L = −a_z: −γv χ₂ (−1)
			quad := secondOrderOf(func(eps, a float64) float64 {
				aBg, aPr := a, 0.0
				if c.probe {
					aBg, aPr = 0, a
				}
				s, err := exact.SpinningEquatorial(v, 1, eps, aBg, aPr)
				if err != nil {
					t.Fatal(err)
				}
				return s.ImpulsePerMass[2]
			}, v)
			r1, r2 := kerrSpinScan(t, v, c.probe)
			t.Logf("v=%.1f probe=%v: 1PM scan %.10f ± %.1e (want %.10f); 2PM scan %.10f ± %.1e, Saijo quadrature %.10f, published %.10f (weight %g)",
				v, c.probe, r1.C2, r1.SigmaC2, want1, r2.C2, r2.SigmaC2, quad, want2, c.w)
			if !c.probe {
				bg1, bg2 = r1.C2, r2.C2
			} else {
				t.Logf("v=%.1f: probe/background from the scans: 1PM %.10f (sum rule: 1), 2PM %.8f (published 3/4)", v, r1.C2/bg1, r2.C2/bg2)
				// The sum rule at 1PM from the scans alone: 1e-8, ten times
				// the fits' σ.
				if math.Abs(r1.C2/bg1-1) > 1e-8 {
					t.Errorf("v=%g: 1PM probe/background spin coefficients %.12g, want 1", v, r1.C2/bg1)
				}
			}
			if math.Abs(r1.C2-want1) > 1e-6*math.Abs(want1) {
				t.Errorf("v=%g probe=%v: 1PM spin coefficient %.10g ± %.2g, want %.10g", v, c.probe, r1.C2, r1.SigmaC2, want1)
			}
			if math.Abs(r2.C2-want2) > 1e-6*math.Abs(want2) || math.Abs(quad-want2) > 1e-6*math.Abs(want2) {
				t.Errorf("v=%g probe=%v: 2PM spin coefficient scan %.10g ± %.2g, quadrature %.10g, published %.10g", v, c.probe, r2.C2, r2.SigmaC2, quad, want2)
			}
		}
	}
}

// TestRotatedEquatorial: the background's spin axis turned to a generic
// direction n (Rotated), the probe moving in the plane orthogonal to n
// with its spin along n, scatters as in the equatorial plane: the
// deflection agrees with the Saijo et al. 1998 quadrature
// (exact.SpinningEquatorial) to ≤ 1e-10 relative and the motion stays in
// the plane orthogonal to n, for the Dixon body and the geodesic (s = 0).
// The out-of-plane bound is the driver's error estimate for paths off the
// coordinate axes (its finite-radius part grows from ~1e-14 to ~3e-11
// there, for geodesics as much as for the Dixon body): |p_out·n| must lie
// within twice the estimate.
func TestRotatedEquatorial(t *testing.T) {
	const M, b, v, a = 1.0, 12.0, 0.6, 0.7
	gam := 1 / math.Sqrt((1-v)*(1+v))
	n := vec.Vec3{0.3, -0.5, 0.8}.Unit()
	// An orthonormal pair in the plane ⟂ n, with L = b × p along −n as in
	// the frame of record (incoming +x, b along +y, L along −z).
	e1 := vec.Vec3{1, 0, 0}.Sub(n.Scale(n[0])).Unit()
	e2 := n.Cross(e1)
	for _, c := range []struct {
		s   float64
		geo bool
	}{{0.5, false}, {-0.8, false}, {0, true}} {
		ex, err := exact.SpinningEquatorial(v, b, M, a, c.s)
		if err != nil {
			t.Fatal(err)
		}
		in, err := IncomingDir(1, gam, b, e1, e2, n.Scale(c.s))
		if err != nil {
			t.Fatal(err)
		}
		var inner Model = &Dixon{Metric: spacetime.Kerr(M, a), M: 1, Gyro: 2}
		if c.geo {
			inner = &Geodesic{Metric: spacetime.Kerr(M, a), M: 1}
			in.A = vec.Vec4{}
		}
		rot, err := NewRotated(inner, n)
		if err != nil {
			t.Fatal(err)
		}
		out, err := Scatter(rot, in, nil)
		if err != nil || out.Status != StatusScattered {
			t.Fatalf("s=%g: %v %v", c.s, err, out.Status)
		}
		po := out.POut.Spatial()
		chi := math.Atan2(-po.Dot(e2), po.Dot(e1))
		rel := math.Abs(chi-ex.Chi) / ex.Chi
		t.Logf("s=%+.1f geodesic=%v: χ %.15f, quadrature %.15f, rel %.1e, p_out·n/|p| %.1e, estimate %.1e (tol %.1e, truncation %.1e), evals %d",
			c.s, c.geo, chi, ex.Chi, rel, po.Dot(n)/po.Norm(), out.ImpulseErr.Spatial().Norm()/po.Norm(), out.TolErr, out.TruncErr, out.Evals)
		if rel > 1e-10 || math.Abs(po.Dot(n)) > 2*out.ImpulseErr.Spatial().Norm() {
			t.Errorf("s=%g: χ = %.15g, quadrature %.15g (rel %.2g), p_out·n %.2g", c.s, chi, ex.Chi, rel, po.Dot(n))
		}
		// The conserved angular momentum is the one about n (with the spin
		// term for the Dixon body; Dixon 1970), monitored as such.
		dr := out.Drift
		t.Logf("  drift: J about n %.1e (axis %v), energy %.1e", dr.AngularMomentumZ, dr.JAxis, dr.Energy)
		if !(dr.AngularMomentumZ <= 1e-12) || dr.JAxis.Sub(n).Norm() > 1e-15 || dr.Energy > 1e-12 {
			t.Errorf("s=%g: drift of J about n %.2g along %v, energy %.2g: want ≤ 1e-12 about %v", c.s, dr.AngularMomentumZ, dr.JAxis, dr.Energy, n)
		}
	}
}

// TestDixonQuadrupoleConservation: with the spin-induced quadrupole
// (C_ES² = 1, 3) in Kerr at a generic orientation, the Killing energy and
// J_z with their spin terms stay exact (Dixon 1970's conservation law holds
// for any quadrupole force and torque built from one J^{αβγδ}): ≤ 1e-12,
// with S² to 1e-12; the mass function 𝓜 − J·R/6 drifts at O(S⁴) only:
// halving the spin reduces its drift by 16 (accepted ≥ 12: the O(S⁶)
// remainder at a = 0.88 M).
func TestDixonQuadrupoleConservation(t *testing.T) {
	spin := vec.Vec3{0.4, -0.5, 0.6}
	for _, C := range []float64{1, 3} {
		var prev float64
		for _, sc := range []float64{1, 0.5} {
			in, _ := IncomingDir(1, 1.3, 20, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, spin.Scale(sc))
			d := &Dixon{Metric: spacetime.Kerr(1, 0.7), M: 1, Gyro: 2, CES2: C}
			out, err := Scatter(d, in, nil)
			if err != nil || out.Status != StatusScattered {
				t.Fatal(err, out.Status)
			}
			dr := out.Drift
			t.Logf("C=%g |a|×%g: drifts E %.1e, J_z %.1e, S² %.1e, a·p %.1e, mass function %.2e", C, sc, dr.Energy, dr.AngularMomentumZ, dr.SpinNorm, dr.SpinOrth, dr.MassShell)
			if dr.Energy > 1e-12 || dr.AngularMomentumZ > 1e-12 || dr.SpinNorm > 1e-12 || dr.SpinOrth > 1e-12 {
				t.Errorf("C=%g: drifts %+v", C, dr)
			}
			if sc == 0.5 && !(prev/dr.MassShell >= 12) {
				t.Errorf("C=%g: mass-function drift %.3g → %.3g on halving the spin, want ≥ 12-fold", C, prev, dr.MassShell)
			}
			prev = dr.MassShell
		}
	}
}

// TestDixonZeroSpinDeriv: at zero spin the Dixon right-hand side is the
// geodesic one (charged in Kerr–Newman) to rounding, in every curved
// family: the same equations (Mathisson 1937, Papapetrou 1951: the
// pole–dipole force vanishes with S) from independent code paths (the
// body's tensor algebra against the geodesic's own; for the Kerr–Newman
// members also independent geometry, the Evaluator against the geodesic's
// closed-form Kerr–Schild terms). The
// scattering events then agree within their error estimates
// (TestDixonZeroSpinGeodesic).
func TestDixonZeroSpinDeriv(t *testing.T) {
	y := []float64{0.3, 4.1, -2.7, 1.9, 0, 0.6, 0.45, -0.2, 0, 0, 0, 0}
	for _, c := range []struct {
		m spacetime.Metric
		q float64
	}{
		{spacetime.Kerr(0.7, 0.5), 0},
		{spacetime.KerrNewman{M: 0.7, A: 0.5, Q: 0.3}, -0.8},
		{spacetime.KerrNewmanNUT{M: 0.7, A: 0.5, N: 0.2, StringGauge: -1}, 0},
	} {
		d := &Dixon{Metric: c.m, M: 1.3, Q: c.q, Gyro: 2}
		g := &Geodesic{Metric: c.m, M: 1.3, Q: c.q}
		yd := append([]float64(nil), y...)
		d.Normalize(yd, 0)
		yg := append([]float64(nil), yd[:8]...)
		dd, dg := make([]float64, 12), make([]float64, 8)
		d.Deriv(yd, dd)
		g.Deriv(yg, dg)
		for i := 0; i < 8; i++ {
			// Rounding: a few units in the last place of the largest term.
			if math.Abs(dd[i]-dg[i]) > 1e-14*(math.Abs(dg[i])+1e-2) {
				t.Errorf("%s: dy[%d] Dixon %.16g, geodesic %.16g", c.m.Name(), i, dd[i], dg[i])
			}
		}
		for i := 8; i < 12; i++ {
			if dd[i] != 0 {
				t.Errorf("%s: zero spin changes: da[%d] = %g", c.m.Name(), i-8, dd[i])
			}
		}
	}
}
