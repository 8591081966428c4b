package validate

import (
	"fmt"
	"math"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/integrate"
	"ricochet/observables/leading"
	"ricochet/validate/exact"
)

// Reference kinds of a Case: what the reference is, relative to the code
// it checks.
const (
	// Published: an exact result in the literature (a closed form or a
	// textbook quadrature of the published equations of motion).
	Published = "published"
	// Derived: an exact solution derived in validate/exact from
	// published laws, independent of the equations ricochet integrates.
	Derived = "derived"
	// Consistency: a model against another form of itself (a closed form
	// of its own first order, a reduction of its own dynamics): a check
	// of the numerics, not of the physics.
	Consistency = "consistency"
)

// Case is one check of the reference suite.
type Case struct {
	Name   string // what is checked
	Source string // where the reference comes from
	// Kind is Published, Derived or Consistency.
	Kind string
	Tol  float64
	// Long cases are skipped by Suite(true).
	Long bool
	// Run returns the value computed by ricochet, the reference value and
	// ricochet's own numerical error estimate (NaN if none).
	Run func() (got, want, est float64, err error)
}

// Result is the outcome of a Case.
type Result struct {
	Case
	Got, Want, Est, RelDiff float64
	Pass                    bool
	Err                     error
}

// Check runs the case. A case passes when the relative difference is
// within Tol.
func (c Case) Check() Result {
	r := Result{Case: c}
	r.Got, r.Want, r.Est, r.Err = c.Run()
	if r.Err != nil {
		return r
	}
	r.RelDiff = math.Abs(r.Got-r.Want) / math.Abs(r.Want)
	r.Pass = r.RelDiff <= c.Tol
	return r
}

// impulseNorm runs a flat-space scattering and returns |Δp⃗|, |Δp⃗_ref|
// and the error estimate. It compares the full vectors: the returned
// "got" is |Δp⃗_ref| + |Δp⃗ − Δp⃗_ref| signed so that RelDiff is the
// relative vector difference.
func vectorCheck(m integrate.Model, in integrate.InState, want vec.Vec4) (got, w, est float64, err error) {
	out, err := integrate.Scatter(m, in, nil)
	if err != nil {
		return 0, 0, 0, err
	}
	if out.Status != integrate.StatusScattered {
		return 0, 0, 0, out.Status.Err()
	}
	w = want.Spatial().Norm()
	d := out.Impulse.Spatial().Sub(want.Spatial()).Norm()
	return w + d, w, out.ImpulseErr.Spatial().Norm(), nil
}

// spinLinear returns the part of a spinning model's Δp_b linear in a spin
// normal to the plane (Richardson step in a at a = 0.01 b) in the Coulomb
// field of charge eps, and the same from exact.CoulombSpinOrbit at g, with
// the integration error estimate of the difference quotient.
func spinLinear(v, eps, g float64, model func(em.Field) integrate.Model) (got, want, est float64, err error) {
	const h = 0.01
	gam := 1 / math.Sqrt((1-v)*(1+v))
	odd := func(f func(a float64) (float64, float64, error)) (float64, float64, error) {
		var e float64
		d := func(a float64) (float64, error) {
			p, ep, err := f(a)
			if err != nil {
				return 0, err
			}
			m, em, err := f(-a)
			e = math.Max(e, (ep+em)/(2*a))
			return (p - m) / (2 * a), err
		}
		d1, err := d(h)
		if err != nil {
			return 0, 0, err
		}
		d2, err := d(h / 2)
		return (4*d2 - d1) / 3, 2 * e, err
	}
	got, est, err = odd(func(a float64) (float64, float64, error) {
		in, err := integrate.Incoming(1, gam, 1, vec.Vec3{0, 0, a})
		if err != nil {
			return 0, 0, err
		}
		out, err := integrate.Scatter(model(em.Coulomb{Q: eps}), in, nil)
		if err == nil && out.Status != integrate.StatusScattered {
			err = out.Status.Err()
		}
		return out.Impulse[2], out.ImpulseErr[2], err
	})
	if err != nil {
		return 0, 0, 0, err
	}
	want, _, err = odd(func(a float64) (float64, float64, error) {
		s, err := exact.CoulombSpinOrbit(v, eps, a, g)
		return s.ImpulsePerMass[2], 0, err
	})
	return got, want, est, err
}

// Suite returns the reference cases; short drops the long ones.
func Suite(short bool) []Case {
	var cs []Case
	for _, eps := range []float64{1e-4, 1e-3, 0.1, 0.3, -0.1} {
		eps := eps
		cs = append(cs, Case{
			Name:   fmt.Sprintf("Coulomb impulse, eps = %g, v = 0.6", eps),
			Source: "Darwin 1913 (exact relativistic Coulomb deflection)",
			Kind:   Published,
			Tol:    1e-10,
			Run: func() (float64, float64, float64, error) {
				in, _ := integrate.Incoming(1, 1.25, 1, vec.Vec3{})
				ex, err := exact.Darwin(0.6, eps)
				if err != nil {
					return 0, 0, 0, err
				}
				return vectorCheck(&integrate.Charge{Field: em.Coulomb{Q: eps}, M: 1, Q: 1}, in, ex.ImpulsePerMass)
			},
		})
	}
	for _, qP := range []float64{0.01, 0.3} {
		qP := qP
		cs = append(cs, Case{
			Name:   fmt.Sprintf("charge-monopole impulse, qP = %g, v = 0.745", qP),
			Source: "Poincaré 1896 (monopole cone)",
			Kind:   Published,
			Tol:    1e-10,
			Run: func() (float64, float64, float64, error) {
				in, _ := integrate.Incoming(1, 1.5, 1, vec.Vec3{})
				v := math.Sqrt(1 - 1/(1.5*1.5))
				ex, err := exact.Poincare(v, 1, 1, qP)
				if err != nil {
					return 0, 0, 0, err
				}
				return vectorCheck(&integrate.Charge{Field: em.Monopole{P: qP}, M: 1, Q: 1}, in, ex.ImpulsePerMass)
			},
		})
	}
	cs = append(cs, Case{
		Name:   "dyon-dyon impulse, (q,g) = (1,0.5), (Q,P) = (0.02,0.03), v = 0.866",
		Source: "Poincaré 1896 cone with Coulomb radial motion (derived in validate/exact)",
		Kind:   Derived,
		Tol:    1e-10,
		Run: func() (float64, float64, float64, error) {
			in, _ := integrate.Incoming(1, 2, 1, vec.Vec3{})
			ex, err := exact.Dyon(math.Sqrt(0.75), 1, 1, exact.Charge{Electric: 1, Magnetic: 0.5}, exact.Charge{Electric: 0.02, Magnetic: 0.03})
			if err != nil {
				return 0, 0, 0, err
			}
			return vectorCheck(&integrate.Charge{Field: em.Dyon{Q: 0.02, P: 0.03}, M: 1, Q: 1, G: 0.5}, in, ex.ImpulsePerMass)
		},
	})
	cs = append(cs, Case{
		Name:   "root-Kerr probe past root-Kerr source: first-order quadrature vs closed form",
		Source: "Newman–Janis shift: complex impact parameter b − iΠ(a₁+a₂) (Arkani-Hamed, Huang & O'Connell 2020, from memory)",
		Kind:   Consistency,
		Tol:    1e-12,
		Run: func() (float64, float64, float64, error) {
			src := leading.EMSource{Q: 0.01, P: 0.004, A: vec.Vec3{0.2, 0.3, -0.4}}
			in, _ := integrate.Incoming(1, 1.7, 1, vec.Vec3{0.1, -0.25, 0.35})
			m := &integrate.RootKerr{Field: src.Field(), M: 1, Q: 0.8, G: -0.3}
			dp, _ := integrate.FirstOrder(m, in, 0)
			want, _ := leading.EMImpulse(leading.EMProbe{M: 1, Q: 0.8, G: -0.3, A: in.A}, src, in.P, in.B)
			w := want.Spatial().Norm()
			return w + dp.Spatial().Sub(want.Spatial()).Norm(), w, math.NaN(), nil
		},
	})
	cs = append(cs, Case{
		Name:   "Kerr probe past Kerr, generic spins: first-order quadrature (impulse and spin kick) vs closed form",
		Source: "1PM test black hole, b − iΠ(a₁+a₂) exact in both spins (Vines 2017, from memory; the spin kick as the rotation generated by the eikonal, leading.SpinImpulse1PM)",
		Kind:   Consistency,
		Tol:    1e-12,
		Run: func() (float64, float64, float64, error) {
			in, _ := integrate.IncomingDir(0.7, 1.3, 1.5, vec.Vec3{1, 0.2, -0.3}, vec.Vec3{0, 1, 0.2}, vec.Vec3{0.3, -0.375, 0.45})
			m := &integrate.KerrProbe{Metric: spacetime.Kerr(1, 0.6), M: 0.7, Linear: true}
			dp, da := integrate.FirstOrder(m, in, 400)
			wp, wa := leading.SpinImpulse1PM(leading.GravSpinProbe{M: 0.7, A: in.A, Body: leading.KerrBody},
				leading.GravSource{M: 1, A: vec.Vec3{0, 0, 0.6}}, in.P.Scale(1/0.7), in.B)
			w := wp.Spatial().Norm() + wa.Spatial().Norm()
			return w + dp.Spatial().Sub(wp.Spatial()).Norm() + da.Spatial().Sub(wa.Spatial()).Norm(), w, math.NaN(), nil
		},
	})
	for _, rk := range []struct {
		name  string
		model func(f em.Field) integrate.Model
	}{
		{"Lorentz-generator", func(f em.Field) integrate.Model { return &integrate.RootKerr{Field: f, M: 1, Q: 1} }},
		{"conservative", func(f em.Field) integrate.Model { return &integrate.RootKerrConservative{Field: f, M: 1, Q: 1} }},
	} {
		rk := rk
		cs = append(cs, Case{
			Name:   fmt.Sprintf("root-Kerr probe, %s completion, spins along z (0.3, 0.2 b), eps = 0.05, v = 0.6", rk.name),
			Source: "aligned-spin radial quadrature with conserved energy and canonical angular momentum (derived in validate/exact): the reduction of these completions' own dynamics",
			Kind:   Consistency,
			Tol:    1e-10,
			Run: func() (float64, float64, float64, error) {
				in, _ := integrate.Incoming(1, 1.25, 1, vec.Vec3{0, 0, 0.2})
				ex, err := exact.RootKerrAligned(0.6, 0.05, 0.5)
				if err != nil {
					return 0, 0, 0, err
				}
				return vectorCheck(rk.model(em.RootKerr{Q: 0.05, A: vec.Vec3{0, 0, 0.3}}), in, ex.ImpulsePerMass)
			},
		})
	}
	cs = append(cs, Case{
		Name:   "Dixon body (g = 2), spin normal to the plane, Coulomb, eps = 0.05, v = 0.6: impulse linear in the spin",
		Source: "canonical Hamiltonian with Thomas–BMT spin–orbit coupling (Thomas 1927; Bargmann, Michel & Telegdi 1959), radial quadrature and Newton–Wigner to covariant b (derived in validate/exact)",
		Kind:   Derived,
		// The Richardson remainders O(h⁴) of the two formulations, which
		// need not cancel (they are different bodies at O(a²)): h⁴ = 1e-8
		// at h = 0.01 b; the integration error over 2h is ~1e-11.
		Tol: 1e-8,
		Run: func() (float64, float64, float64, error) {
			return spinLinear(0.6, 0.05, 2, func(f em.Field) integrate.Model { return &integrate.Dixon{Field: f, M: 1, Q: 1, Gyro: 2} })
		},
	})
	cs = append(cs, Case{
		Name:   "root-Kerr body (all multipoles), spin normal to the plane, Coulomb, eps = 0.05, v = 0.6: impulse linear in the spin",
		Source: "canonical Hamiltonian with Thomas–BMT spin–orbit coupling at g = 2 (Thomas 1927; Bargmann, Michel & Telegdi 1959; derived in validate/exact)",
		Kind:   Derived,
		// As for the Dixon body (the body's O(h⁴) remainder includes its
		// octupole, still below h⁴).
		Tol: 1e-8,
		Run: func() (float64, float64, float64, error) {
			return spinLinear(0.6, 0.05, 2, func(f em.Field) integrate.Model { return &integrate.RootKerrBody{Field: f, M: 1, Q: 1} })
		},
	})
	grav := func(name, src string, model func() integrate.Model, ref func() (exact.Scattering, error), gamma float64) Case {
		return Case{
			Name: name, Source: src, Kind: Published, Tol: 1e-10,
			Run: func() (float64, float64, float64, error) {
				ex, err := ref()
				if err != nil {
					return 0, 0, 0, err
				}
				in, _ := integrate.Incoming(1, gamma, 1, vec.Vec3{})
				return vectorCheck(model(), in, ex.ImpulsePerMass)
			},
		}
	}
	g05 := 1 / math.Sqrt(0.75) // v = 0.5
	for _, mu := range []float64{1e-3, 0.05} {
		mu := mu
		cs = append(cs, grav(fmt.Sprintf("Schwarzschild geodesic, M/b = %g, v = 0.5", mu),
			"timelike deflection by radial quadrature (e.g. Chandrasekhar 1983 §19, from memory)",
			func() integrate.Model { return &integrate.Geodesic{Metric: spacetime.Schwarzschild(mu), M: 1} },
			func() (exact.Scattering, error) { return exact.Schwarzschild(0.5, 1, mu) }, g05))
	}
	for _, a := range []float64{0.3, -0.3} {
		a := a
		cs = append(cs, grav(fmt.Sprintf("Kerr equatorial geodesic, M/b = 0.02, a/b = %+g, v = 0.6", a),
			"Kerr equatorial deflection by radial quadrature (Carter 1968 constants, from memory)",
			func() integrate.Model { return &integrate.Geodesic{Metric: spacetime.Kerr(0.02, a), M: 1} },
			func() (exact.Scattering, error) { return exact.KerrEquatorial(0.6, 1, 0.02, a) }, 1.25))
	}
	for _, sp := range [][2]float64{{0.06, 0.05}, {-0.06, -0.07}} {
		a, s := sp[0], sp[1]
		cs = append(cs, Case{
			Name:   fmt.Sprintf("spinning body (Tulczyjew) in Kerr, equatorial, M/b = 0.08, a/b = %+g, s/b = %+g, v = 0.6", a, s),
			Source: "radial quadrature of the conserved energy and angular momentum (Saijo, Maeda, Shibata & Mino 1998, from memory)",
			Kind:   Published,
			Tol:    1e-10,
			Run: func() (float64, float64, float64, error) {
				ex, err := exact.SpinningEquatorial(0.6, 1, 0.08, a, s)
				if err != nil {
					return 0, 0, 0, err
				}
				in, _ := integrate.Incoming(1, 1.25, 1, vec.Vec3{0, 0, s})
				return vectorCheck(&integrate.Dixon{Metric: spacetime.Kerr(0.08, a), M: 1, Gyro: 2}, in, ex.ImpulsePerMass)
			},
		})
	}
	cs = append(cs, grav("Reissner–Nordström charged probe, M/b = 0.01, Q/b = 0.005, q/m = 1, v = 0.6",
		"charged-particle deflection by radial quadrature (Reissner 1916, Nordström 1918 metric)",
		func() integrate.Model {
			return &integrate.Geodesic{Metric: spacetime.ReissnerNordstrom(0.01, 0.005), M: 1, Q: 1}
		},
		func() (exact.Scattering, error) { return exact.ReissnerNordstrom(0.6, 1, 0.01, 0.005, 1) }, 1.25))
	dyonRN := grav("dyonic Reissner–Nordström charged probe, M/b = 0.01, Q/b = 0.005, P/b = 0.008, q/m = 1, v = 0.6",
		"Poincaré 1896 cone on the Reissner–Nordström radial quadrature (derived; validate/exact.DyonicReissnerNordstrom)",
		func() integrate.Model {
			return &integrate.Geodesic{Metric: spacetime.DyonicReissnerNordstrom(0.01, 0.005, 0.008), M: 1, Q: 1}
		},
		func() (exact.Scattering, error) { return exact.DyonicReissnerNordstrom(0.6, 1, 0.01, 0.005, 0.008, 1) }, 1.25)
	dyonRN.Kind = Derived
	cs = append(cs, dyonRN)
	if short {
		var s []Case
		for _, c := range cs {
			if !c.Long {
				s = append(s, c)
			}
		}
		return s
	}
	return cs
}
