package integrate

import (
	"ricochet/background/spacetime"
)

// Specialised right-hand sides of Geodesic (DerivFuncer).
//
// Spherically symmetric Kerr–Schild members (Kerr–Newman with a = 0:
// Schwarzschild, Reissner–Nordström), g_μν = η_μν + f(r) l_μ l_ν with
// l_μ = (1, n̂), n̂ = x⃗/r, f = 2M/r − Q²/r², and A_μ = s(r) l_μ with
// s = −Q/r (the a = 0 limit of the KerrNewman data). Derivation (ours,
// the a = 0 case of spacetime.KerrSchildPoint.Accel): with
// w = l_μ u^μ = u⁰ + n̂·u⃗, ν = n̂·u⃗, q = |u⃗|² − ν², and ∂_i l_j =
// (δ_ij − n_i n_j)/r, the lowered contraction Γ_μαβ u^α u^β is
// l_μ S − ½ f' w² (0, n̂) with S = f' ν w + f q/r; raising it with
// g^μν = η^μν − f l^μ l^ν (l^μ = (−1, n̂) is null) gives
//
//	−Γ⁰_αβ u^α u^β = S + ½ f f' w²,
//	−Γⁱ_αβ u^α u^β = −nⁱ [S − ½ f' (1 − f) w²],
//
// and the Lorentz term F^μ_ν u^ν, from (F u)_μ = s' w (0, n̂) − s' ν l_μ,
//
//	(F u)⁰ = s' (ν + f w),   (F u)ⁱ = s' nⁱ [(1 − f) w − ν],
//
// with f' = −2M/r² + 2Q²/r³ and s' = Q/r². At Q = 0 this is the
// contraction derived for the comparison peer of validate/peer. Tested
// against the general Kerr–Schild form and the automatic differentiation
// (TestDerivFuncs). sphericalForce holds the force (pointForce).
type sphericalForce struct {
	M, q2 float64 // background mass and Q²
	sq    float64 // Q q: the Lorentz term's s' r² times the probe charge
	im    float64 // 1/m
}

func newSphericalForce(M, Qbh, m, q float64) *sphericalForce {
	return &sphericalForce{M: M, q2: Qbh * Qbh, sq: Qbh * q, im: 1 / m}
}

// force implements pointForce: the force is central, (−Γⁱ_αβ u^α u^β
// + Lorentz term) m = a_r nⁱ = (a_r/r) xⁱ.
func (k *sphericalForce) force(x1, x2, x3, r2, r, p0, p1, p2, p3 float64) (f0, s, g1, g2, g3 float64) {
	ir := 1 / r
	n1, n2, n3 := x1*ir, x2*ir, x3*ir
	ir2 := ir * ir
	f := (2*k.M - k.q2*ir) * ir
	fp := (-2*k.M + 2*k.q2*ir) * ir2
	nu := n1*p1 + n2*p2 + n3*p3
	w := p0 + nu
	qq := p1*p1 + p2*p2 + p3*p3 - nu*nu
	S := fp*nu*w + f*qq*ir
	a0 := S + 0.5*f*fp*w*w
	ar := -(S - 0.5*fp*(1-f)*w*w)
	if k.sq != 0 {
		sp := k.sq * ir2
		a0 += sp * (nu + f*w)
		ar += sp * ((1-f)*w - nu)
	}
	f0 = a0 * k.im
	s = ar * k.im * ir
	return
}

// pointForce implements pointForcer: the closed form above for the
// spherically symmetric Kerr–Newman members, nil for other metrics or with
// Linear set.
func (g *Geodesic) pointForce() pointForce {
	if g.Linear {
		return nil
	}
	if kn, ok := g.Metric.(spacetime.KerrNewman); ok && kn.A == 0 {
		if kn.Q == 0 {
			return &schwarzschildForce{M: kn.M, im: 1 / g.M}
		}
		return newSphericalForce(kn.M, kn.Q, g.M, g.Q)
	}
	return nil
}

// schwarzschildForce is sphericalForce at Q = 0 (Schwarzschild), with the
// terms collected: with A = 2M/r², ν = n̂·p and w = p⁰ + ν,
//
//	S = A (|p⃗|² − ν² − ν w),   m dp⁰/dτ = S − M A w²/r,
//	m dp⃗/dτ = −(S + ½ A (1 − 2M/r) w²) n̂,
//
// and ν = (x⃗·p⃗)/r formed from x⃗·p⃗, which does not wait for r, and 1/r
// from 1/r², so that fewer operations follow the square root.
type schwarzschildForce struct {
	M  float64 // background mass
	im float64 // 1/m
}

// force implements pointForce.
func (k *schwarzschildForce) force(x1, x2, x3, r2, r, p0, p1, p2, p3 float64) (f0, s, g1, g2, g3 float64) {
	xp := x1*p1 + x2*p2 + x3*p3
	pp := p1*p1 + p2*p2 + p3*p3
	// 1/r as r/r², whose division runs beside the square root.
	ir2 := 1 / r2
	ir := r * ir2
	A := 2 * k.M * ir2
	nu := xp * ir
	w := p0 + nu
	S := A * (pp - nu*nu - nu*w)
	ww := A * w * w
	f0 = (S - k.M*ww*ir) * k.im
	s = -(S + 0.5*ww*(1-2*k.M*ir)) * (k.im * ir)
	return
}

// DerivFunc implements DerivFuncer: the closed form above for the
// spherically symmetric Kerr–Newman members, the closed-form Kerr–Schild
// data with the metric's family resolved once for the others, the
// closed-form accelerations of KerrNewmanNUT.Accel for that family, and Deriv
// (automatic differentiation) for metrics without a Kerr–Schild form or
// with Linear set.
func (g *Geodesic) DerivFunc() func(y, dy []float64) {
	if g.Linear {
		return nil
	}
	if k := g.pointForce(); k != nil {
		return pointDeriv(g.M, k)
	}
	im := 1 / g.M
	q := g.Q
	if kt, ok := g.Metric.(spacetime.KerrNewmanNUT); ok {
		// Closed form in the (t, r, cos θ, φ) chart (KerrNewmanNUT.Accel).
		return func(y, dy []float64) {
			p := [4]float64{y[IP], y[IP+1], y[IP+2], y[IP+3]}
			geo, lor := kt.Accel(event(y), p)
			for mu := 0; mu < 4; mu++ {
				dy[IX+mu] = p[mu] * im
				dy[IP+mu] = (geo[mu] + q*lor[mu]) * im
			}
		}
	}
	ks, ok := g.Metric.(spacetime.KerrSchildForm)
	if !ok {
		return nil
	}
	pt := new(spacetime.KerrSchildPoint)
	return func(y, dy []float64) {
		ks.KerrSchild(event(y), pt)
		p := [4]float64{y[IP], y[IP+1], y[IP+2], y[IP+3]}
		geo, lor := pt.Accel(p)
		for mu := 0; mu < 4; mu++ {
			dy[IX+mu] = p[mu] * im
			dy[IP+mu] = (geo[mu] + q*lor[mu]) * im
		}
	}
}
