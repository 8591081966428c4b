package integrate

import (
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/vec"
	"ricochet/validate/exact"
)

// TestRootKerrFamilyNames: fixed order, distinct names, the documented
// member types.
func TestRootKerrFamilyNames(t *testing.T) {
	fam := RootKerrFamily(em.Coulomb{Q: 1}, 1, 1, 0)
	if len(fam) != 6 {
		t.Fatalf("%d members, want 6", len(fam))
	}
	if _, ok := fam[0].(*RootKerr); !ok {
		t.Errorf("member 0 is %T, want *RootKerr", fam[0])
	}
	if _, ok := fam[1].(*RootKerrConservative); !ok {
		t.Errorf("member 1 is %T, want *RootKerrConservative", fam[1])
	}
	if b, ok := fam[2].(*BMT); !ok || b.Gyro != 2 {
		t.Errorf("member 2 is %T %+v, want *BMT with Gyro 2", fam[2], fam[2])
	}
	if d, ok := fam[3].(*Dixon); !ok || d.Gyro != 2 || d.Metric != nil {
		t.Errorf("member 3 is %T %+v, want flat *Dixon with Gyro 2", fam[3], fam[3])
	}
	if b, ok := fam[4].(*RootKerrBody); !ok || b.Contact != 0 {
		t.Errorf("member 4 is %T, want *RootKerrBody", fam[4])
	}
	if b, ok := fam[5].(*RootKerrBody); !ok || b.Contact != 1 {
		t.Errorf("member 5 is %T, want *RootKerrBody with Contact 1", fam[5])
	}
	for k, m := range fam {
		if Canonical(m) != (k >= 3) {
			t.Errorf("member %d (%s): Canonical %v", k, m.Name(), Canonical(m))
		}
	}
	seen := map[string]bool{}
	for _, m := range fam {
		if seen[m.Name()] {
			t.Errorf("duplicate name %q", m.Name())
		}
		seen[m.Name()] = true
	}
}

// TestRootKerrConservativeZeroSpin: at a = 0 the conservative completion is
// the Lorentz force (Lorentz 1895) on x and p, identical to Charge, and its
// spin law is the g = 2 BMT precession (Bargmann, Michel & Telegdi 1959)
// up to O(|a|²).
func TestRootKerrConservativeZeroSpin(t *testing.T) {
	f := em.RootKerr{Q: 0.7, P: -0.2, A: vec.Vec3{0.2, -0.4, 0.5}}
	rc := &RootKerrConservative{Field: f, M: 1.3, Q: 0.9, G: 0.4}
	ch := &Charge{Field: f, M: 1.3, Q: 0.9, G: 0.4}
	bmt := &BMT{Field: f, M: 1.3, Q: 0.9, G: 0.4, Gyro: 2}
	y := sampleState(vec.Vec3{})
	d1 := make([]float64, 12)
	d2 := make([]float64, 8)
	d3 := make([]float64, 12)
	rc.Deriv(y, d1)
	ch.Deriv(y[:8], d2)
	// Same field evaluation on both sides: agreement to rounding.
	for i := 0; i < 8; i++ {
		if math.Abs(d1[i]-d2[i]) > 1e-15*(1+math.Abs(d2[i])) {
			t.Errorf("component %d: conservative %v, Lorentz %v", i, d1[i], d2[i])
		}
	}
	if e1, e2 := rc.Energy(y), ch.Energy(y[:8]); math.Abs(e1-e2) > 1e-15*math.Abs(e2) {
		t.Errorf("energy %v, Lorentz %v", e1, e2)
	}
	y = sampleState(vec.Vec3{1e-7, 2e-7, -1e-7})
	rc.Deriv(y, d1)
	bmt.Deriv(y, d3)
	// O(|a|²) ≈ 6e-14 difference, as in TestRootKerrZeroSpin.
	for i := IA; i < IA+4; i++ {
		if math.Abs(d1[i]-d3[i]) > 1e-12 {
			t.Errorf("spin component %d: conservative %v, BMT %v", i, d1[i], d3[i])
		}
	}
}

// TestRootKerrConservativeDarwin: spinless, in a Coulomb field, the
// conservative completion scatters exactly as Darwin's relativistic
// Coulomb orbit (Darwin 1913; validate/exact.Darwin).
func TestRootKerrConservativeDarwin(t *testing.T) {
	const v = 0.6
	g := 1 / math.Sqrt(1-v*v)
	for _, eps := range []float64{0.05, -0.2} {
		m := &RootKerrConservative{Field: em.Coulomb{Q: eps}, M: 1, Q: 1}
		in, _ := Incoming(1, g, 1, vec.Vec3{})
		out, err := Scatter(m, in, nil)
		if err != nil || out.Status != StatusScattered {
			t.Fatalf("ε = %g: %v %v", eps, err, out.Status)
		}
		ex, _ := exact.Darwin(v, eps)
		want := ex.ImpulsePerMass
		d := out.Impulse.Sub(want).Spatial().Norm() / want.Spatial().Norm()
		// Default tolerance 1e-13 with the error estimate of Scatter: the
		// driver reaches ~1e-12 relative on Darwin (scatter_test.go).
		if d > 1e-10 {
			t.Errorf("ε = %g: impulse %v, Darwin %v (rel %.2g)", eps, out.Impulse, want, d)
		}
	}
}

// TestRootKerrConservativeFirstOrderSpin: scaling the spin by λ, the
// conservative completion's momentum and spin laws differ from g = 2 BMT
// with the Stern–Gerlach force by O(λ²) (the dipole term of the
// Newman–Janis shift; Newman & Janis 1965), while its velocity differs by
// exactly −a⁰𝔅/M, first order in the field.
func TestRootKerrConservativeFirstOrderSpin(t *testing.T) {
	f := em.Dyon{Q: 0.7, P: -0.2}
	rc := &RootKerrConservative{Field: f, M: 1.3, Q: 0.9, G: 0.4}
	bmt := &BMT{Field: f, M: 1.3, Q: 0.9, G: 0.4, Gyro: 2}
	a := vec.Vec3{0.2, -0.3, 0.25}
	var prev [2]float64
	for k, lam := range []float64{1e-2, 5e-3, 2.5e-3} {
		y := sampleState(a.Scale(lam))
		d1 := make([]float64, 12)
		d3 := make([]float64, 12)
		rc.Deriv(y, d1)
		bmt.Deriv(y, d3)
		var diff [2]float64
		for i := 0; i < 4; i++ {
			diff[0] = math.Max(diff[0], math.Abs(d1[IP+i]-d3[IP+i]))
			diff[1] = math.Max(diff[1], math.Abs(d1[IA+i]-d3[IA+i]))
		}
		if k > 0 {
			for j, name := range []string{"dp/dτ", "da/dτ"} {
				// λ² scaling: halving λ divides by 4 (O(λ³) remainder ~1%).
				if r := prev[j] / diff[j]; math.Abs(r-4) > 0.05 {
					t.Errorf("λ = %g: %s difference ratio %.4f, want 4", lam, name, r)
				}
			}
		}
		prev = diff
		// Velocity: dx⃗/dτ = p⃗/M − a⁰𝔅/M with 𝔅 = Im[(Q − iG)𝐅].
		F, _ := f.At(shifted(y))
		a0 := y[IA]
		for i := 0; i < 3; i++ {
			B := imag(complex(0.9, -0.4) * F[i])
			want := (y[IP+1+i] - a0*B) / 1.3
			if math.Abs(d1[IX+1+i]-want) > 1e-15 {
				t.Errorf("λ = %g: dx%d/dτ = %v, want %v", lam, i+1, d1[IX+1+i], want)
			}
		}
	}
}

// genericPair is a root-Kerr source and probe in generic orientation: the
// probe's spin has a component along its motion (a⁰ ≠ 0), the source spin
// is oblique to the plane of motion.
func genericPair(eps float64) (em.Field, InState) {
	f := em.RootKerr{Q: eps, A: vec.Vec3{0.15, -0.1, 0.25}}
	in, _ := IncomingDir(1, 1.5, 1, vec.Vec3{1, 0.2, -0.1}, vec.Vec3{0, 1, 0.3}, vec.Vec3{0.2, 0.15, -0.1})
	return f, in
}

// TestRootKerrEnergyConservation: in the generic orientation the
// conservative completion keeps its Killing energy E = p⁰ + U to 1e-12
// relative along the whole run, while the Lorentz-generator completion
// drifts at second order in the coupling, d/dτ E = −a⁰ 𝔈·𝔅/M.
func TestRootKerrEnergyConservation(t *testing.T) {
	f, in := genericPair(0.02)
	fam := RootKerrFamily(f, 1, 1, 0)
	var drift [2]float64
	for i, m := range fam[:2] {
		out, err := Scatter(m, in, nil)
		if err != nil || out.Status != StatusScattered {
			t.Fatalf("%s: %v %v", m.Name(), err, out.Status)
		}
		drift[i] = out.Drift.Energy
		t.Logf("%-24s max |E − E_in|/E_in = %.3g (EnergyExact %v)", m.Name(), out.Drift.Energy, m.EnergyExact())
	}
	// Rounding of ~1e3 steps at tolerance 1e-13: measured 2.2e-14.
	if drift[1] > 1e-12 {
		t.Errorf("conservative completion: energy drift %.3g, want ≤ 1e-12", drift[1])
	}
	// Second order in ε = 0.02: measured 1.35e-5; the test
	// only asks that the drift is far above rounding.
	if drift[0] < 1e-6 {
		t.Errorf("Lorentz-generator completion: energy drift %.3g, expected a second-order drift ≫ rounding", drift[0])
	}
	if !fam[1].EnergyExact() || fam[0].EnergyExact() {
		t.Errorf("EnergyExact: Lorentz-generator %v, conservative %v", fam[0].EnergyExact(), fam[1].EnergyExact())
	}
}

// slope returns the least-squares slope of log|y| against log x.
func slope(x, y []float64) float64 {
	var sx, sy, sxx, sxy float64
	n := float64(len(x))
	for i := range x {
		lx, ly := math.Log(x[i]), math.Log(math.Abs(y[i]))
		sx += lx
		sy += ly
		sxx += lx * lx
		sxy += lx * ly
	}
	return (n*sxy - sx*sy) / (n*sxx - sx*sx)
}

// TestRootKerrFamilyScan: an ε-scan of the members on the
// generic-orientation pair. The Lorentz-generator and conservative
// completions share their first-order law exactly, so their difference
// scales as ε²; the dipole truncation has a different first-order law (it
// drops O(a²) multipoles), so its difference to the others, after removing
// the difference of the first-order laws (FirstOrder of each), scales as
// ε². The next-order coefficients (Δp − Δp₁)/ε² of each member, with Δp₁
// its own first-order impulse, are logged: their spread is the model spread.
func TestRootKerrFamilyScan(t *testing.T) {
	epss := []float64{0.016, 0.008, 0.004, 0.002}
	if testing.Short() {
		epss = epss[:3]
	}
	names := []string{}
	var imp, first [6][]vec.Vec4
	for _, eps := range epss {
		f, in := genericPair(eps)
		for k, m := range RootKerrFamily(f, 1, 1, 0) {
			if len(names) < 6 {
				names = append(names, m.Name())
			}
			out, err := Scatter(m, in, nil)
			if err != nil || out.Status != StatusScattered {
				t.Fatalf("%s ε = %g: %v %v", m.Name(), eps, err, out.Status)
			}
			dp1, _ := FirstOrder(m, in, 0)
			imp[k] = append(imp[k], out.Impulse)
			first[k] = append(first[k], dp1)
			res := out.Impulse.Sub(dp1).Scale(1 / (eps * eps))
			t.Logf("ε = %-6g %-24s (Δp − Δp₁)/ε² = (%+.6f, %+.6f, %+.6f, %+.6f)  err/ε² %.1e",
				eps, m.Name(), res[0], res[1], res[2], res[3], out.ImpulseErr.Spatial().Norm()/(eps*eps))
		}
	}
	// Every pair differs beyond first order at O(ε²) (the Dixon body and
	// the dipole truncation share the dipole first order up to the O(a²)
	// spin-kick terms that FirstOrder of each carries).
	pairs := [][2]int{{0, 1}, {0, 2}, {1, 2}, {2, 3}, {0, 4}, {3, 4}, {4, 5}}
	for _, pr := range pairs {
		d := make([]float64, len(epss))
		for i := range epss {
			// Difference beyond the first-order laws (zero first-order part
			// for the pair (0, 1), whose first-order laws coincide).
			dd := imp[pr[0]][i].Sub(imp[pr[1]][i]).Sub(first[pr[0]][i].Sub(first[pr[1]][i]))
			d[i] = dd.Spatial().Norm()
		}
		s := slope(epss, d)
		t.Logf("%s − %s beyond first order: |·| = %.3g … %.3g, slope %.3f", names[pr[0]], names[pr[1]], d[0], d[len(d)-1], s)
		// Slope 2 plus the O(ε³) term: the logged (Δp − Δp₁)/ε² change by
		// up to ~4% per halving of ε here, which shifts the fitted slope by
		// up to ~0.06 (measured 1.95–1.96); a first-order disagreement would
		// give slope 1.
		if math.Abs(s-2) > 0.1 {
			t.Errorf("%s − %s: slope %.3f, want 2", names[pr[0]], names[pr[1]], s)
		}
	}
	// The first-order laws of the two full completions are identical; the
	// body's equals theirs to rounding (a quadrature of a different force).
	for i := range epss {
		if first[0][i] != first[1][i] {
			t.Errorf("ε = %g: first-order impulses differ: %v %v", epss[i], first[0][i], first[1][i])
		}
		for _, k := range []int{4, 5} {
			if d := first[k][i].Sub(first[0][i]).Spatial().Norm(); d > 1e-14*first[0][i].Spatial().Norm() {
				t.Errorf("ε = %g: first-order impulse of %s %v, of the generator form %v", epss[i], names[k], first[k][i], first[0][i])
			}
		}
	}
}

// TestRootKerrAligned: spins along ±z, motion in the equatorial plane,
// electric charges. The Lorentz-generator and conservative completions
// coincide there (a⁰ = 0) and are exact against the radial quadrature of
// validate/exact.RootKerrAligned (derived in its documentation) to 1e-10.
// That quadrature is the dynamics of these two non-canonical completions
// (the probe spin enters only through a_s + a_p), not the physics of a
// spinning probe beyond first order: it checks the integrator.
func TestRootKerrAligned(t *testing.T) {
	const v = 0.6
	g := 1 / math.Sqrt(1-v*v)
	cases := []struct{ eps, as, ap float64 }{
		{0.05, 0.3, 0.2},
		{0.05, 0.3, -0.5},
		{-0.1, -0.2, 0.1},
		{0.2, 0, 0.4},
	}
	for _, c := range cases {
		f := em.RootKerr{Q: c.eps, A: vec.Vec3{0, 0, c.as}}
		in, _ := Incoming(1, g, 1, vec.Vec3{0, 0, c.ap})
		ex, err := exact.RootKerrAligned(v, c.eps, c.as+c.ap)
		if err != nil {
			t.Fatal(err)
		}
		want := ex.ImpulsePerMass
		for _, m := range RootKerrFamily(f, 1, 1, 0) {
			out, err := Scatter(m, in, nil)
			if err != nil || out.Status != StatusScattered {
				t.Fatalf("%s: %v %v", m.Name(), err, out.Status)
			}
			d := out.Impulse.Sub(want).Spatial().Norm() / want.Spatial().Norm()
			if _, ok := m.(*BMT); ok || Canonical(m) {
				// Not this quadrature's physics: the dipole truncation is
				// first order in spin, and the canonical members weight
				// the probe spin half as much as the source spin at
				// second order (the quadrature depends on a_s + a_p):
				// shown, not tested.
				t.Logf("ε=%g a_s=%g a_p=%g %-24s rel. deviation %.3g (not exact: first order in spin)", c.eps, c.as, c.ap, m.Name(), d)
				continue
			}
			t.Logf("ε=%g a_s=%g a_p=%g %-24s rel. deviation %.3g (error estimate %.2g)", c.eps, c.as, c.ap, m.Name(), d, out.ImpulseErr.Spatial().Norm()/want.Spatial().Norm())
			// Default settings reach ~1e-12 relative; 1e-10 as required.
			if d > 1e-10 {
				t.Errorf("ε=%g a_s=%g a_p=%g %s: impulse %v, exact %v (rel %.3g)", c.eps, c.as, c.ap, m.Name(), out.Impulse, want, d)
			}
		}
	}
}

// TestRootKerrFamilyAngularMomentum: in a Coulomb field (rotation
// invariant) and a generic orientation, every canonical member of the
// family conserves every component of J = x ∧ p + S to ≤ 1e-12 |p| b
// (Dixon 1970: the conserved quantity of each rotation; radius 1e3 b, so
// the rounding floor of x ∧ p is ~1e-13), and every non-canonical member
// drifts by an amount of first order in coupling and spin (ε|a|/b = 2.7e-2
// here; checked to be above 1e-4 so that a change of theirs is seen).
func TestRootKerrFamilyAngularMomentum(t *testing.T) {
	in := genericIn(t, 1.5)
	for _, m := range RootKerrFamily(em.Coulomb{Q: 0.1}, 1, 1, 0) {
		dJ, dE, _ := conservation(t, m, in)
		t.Logf("%-24s canonical %-5v |ΔJ|/(p b) = %.2e, |ΔE|/E = %.1e", m.Name(), Canonical(m), dJ, dE)
		if Canonical(m) && dJ > 1e-12 {
			t.Errorf("%s: |ΔJ|/(p b) = %.2g, want ≤ 1e-12", m.Name(), dJ)
		}
		if !Canonical(m) && dJ < 1e-4 {
			t.Errorf("%s: |ΔJ|/(p b) = %.2g, expected a first-order drift", m.Name(), dJ)
		}
	}
}
