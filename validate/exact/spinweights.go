package exact

// SpinWeights returns the second-order spin weights of a spinning charge
// passing a Coulomb source with both spins normal to the plane of motion:
// the coefficients w of ε² a/b in the impulse along b per unit mass,
//
//	Δp_b/m = (first order) + ε² [c₀ + w_probe a_probe/b + w_source a_source/b + O(a²)] + O(ε³),
//
// for speed v at infinity and probe gyromagnetic ratio g, in the frame
// and units of CoulombSpinOrbit (covariant impact parameter, m = b = 1).
// w_probe comes from the canonical Thomas–BMT Hamiltonian
// (CoulombSpinOrbit), w_source from the radial quadrature of a spinless
// charge in the root-Kerr field (RootKerrAligned): two quadratures
// independent of any equations of motion integrated by ricochet.
//
// Both are extracted numerically: the part linear in a by a Richardson
// step in a (a = 0.005, remainder O(a⁴) ≈ 1e-9 relative), the ε²
// coefficient by the even part in ε and two Richardson steps (ε = 0.004
// v²/0.36, halved twice, remainder O(ε⁶)); the quadratures are exact to
// ~1e-15, so the result is good to ~1e-8 relative (the ratio
// w_probe/w_source = (g − 1)/2 holds to 1e-7 in the tests).
func SpinWeights(v, g float64) (probe, source float64, err error) {
	wrap := func(f func(eps, a float64) (Scattering, error)) (float64, error) {
		var ferr error
		dp := func(eps, a float64) float64 {
			s, e := f(eps, a)
			if e != nil && ferr == nil {
				ferr = e
			}
			return s.ImpulsePerMass[2]
		}
		return secondOrderLinear(dp, v), ferr
	}
	if probe, err = wrap(func(eps, a float64) (Scattering, error) { return CoulombSpinOrbit(v, eps, a, g) }); err != nil {
		return 0, 0, err
	}
	source, err = wrap(func(eps, a float64) (Scattering, error) { return RootKerrAligned(v, eps, a) })
	return probe, source, err
}

// secondOrderLinear returns the ε² coefficient of the part of dp(ε, a)
// linear in a (see SpinWeights).
func secondOrderLinear(dp func(eps, a float64) float64, v float64) float64 {
	const h = 0.005
	odd := func(e float64) float64 {
		d := func(a float64) float64 { return (dp(e, a) - dp(e, -a)) / (2 * a) }
		return (4*d(h/2) - d(h)) / 3
	}
	A := func(eps float64) float64 { return (odd(eps) + odd(-eps)) / (2 * eps * eps) }
	r1 := func(e float64) float64 { return (4*A(e/2) - A(e)) / 3 }
	eps := 0.004 * v * v / 0.36
	return (16*r1(eps/2) - r1(eps)) / 15
}
