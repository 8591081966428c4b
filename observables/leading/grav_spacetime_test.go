package leading

import (
	"math"
	"testing"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// spacetimeQuadImpulse integrates the first-order force
//
//	dp^μ/dτ = −m Γ^μ_αβ u^α u^β + q η^{μν} F_νλ u^λ
//
// (geodesic equation plus Lorentz force, textbook) of the linearized
// geometry of the background package along x(τ) = b + u τ.
func spacetimeQuadImpulse(lin spacetime.Linearizable, m, q float64, u, b vec.Vec4) vec.Vec4 {
	ev := spacetime.NewLinearEvaluator(lin, 1)
	var p spacetime.Point
	T := math.Sqrt(b.Dot(b)) / u.Spatial().Norm()
	f := func(tau float64) vec.Vec4 {
		x := b.Add(u.Scale(tau))
		ev.Eval([4]float64(x), &p)
		var acc vec.Vec4
		for mu := 0; mu < 4; mu++ {
			s := 0.0
			for al := 0; al < 4; al++ {
				for be := 0; be < 4; be++ {
					s -= m * p.Gamma[mu][al][be] * u[al] * u[be]
				}
				s += q * vec.Eta[mu] * p.F[mu][al] * u[al]
			}
			acc[mu] = s
		}
		return acc
	}
	return gravLine(f, T, gravQuadDefault)
}

// TestGravVsSpacetime cross-checks Impulse1PM against the straight-line
// quadrature of the first-order Christoffel symbols and field of the
// linearized Kerr–Newman (Kerr–Schild) and Kerr–Newman–Taub–NUT
// (Boyer–Lindquist-type, three Misner-string placements) metrics of the
// background package.
func TestGravVsSpacetime(t *testing.T) {
	const (
		b   = 1.5
		tol = 1e-9 // as in TestGravKerrVsQuadrature
	)
	worst := 0.0
	dirs := []vec.Vec3{{1, 0, 0}, {0.3, 0.5, -0.2}, {0, 0.2, 1}}
	for _, gamma := range []float64{1.05, 3, 10} {
		for _, n := range dirs {
			u, bv := gravFrame(gamma, b, n, vec.Vec3{-0.4, 0.2, 0.7})
			for _, ratio := range []float64{0, 0.5, -0.9} {
				a := ratio * b
				pr := GravProbe{M: 1.2, Q: 0.4}
				cases := []struct {
					src GravSource
					lin spacetime.Linearizable
				}{
					{GravSource{M: 0.9, Q: 0.7, A: vec.Vec3{0, 0, a}}, spacetime.KerrNewman{M: 0.9, A: a, Q: 0.7}},
					{GravSource{M: 0.9, N: -0.6, Q: 0.7, A: vec.Vec3{0, 0, a}}, spacetime.KerrNewmanNUT{M: 0.9, A: a, Q: 0.7, N: -0.6}},
					{GravSource{M: 0.4, N: 1.1, A: vec.Vec3{0, 0, a}}, spacetime.KerrNewmanNUT{M: 0.4, A: a, N: 1.1, StringGauge: 1}},
					{GravSource{M: 0.4, N: 1.1, A: vec.Vec3{0, 0, a}}, spacetime.KerrNewmanNUT{M: 0.4, A: a, N: 1.1, StringGauge: -1}},
				}
				for _, c := range cases {
					want := Impulse1PM(pr, c.src, u, bv)
					got := spacetimeQuadImpulse(c.lin, pr.M, pr.Q, u, bv)
					err := gravRelErr(got, want)
					worst = math.Max(worst, err)
					if err > tol {
						t.Errorf("γ=%v n=%v %s: closed form %v, quadrature %v, rel. err %.2e",
							gamma, n, c.lin.Name(), want, got, err)
					}
				}
			}
		}
	}
	t.Logf("worst relative difference closed form vs quadrature: %.2e", worst)
}
