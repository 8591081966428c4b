package integrate

import (
	"math"
	"testing"

	"ricochet/background/spacetime"
	"ricochet/background/vec"
	"ricochet/integrate/rk"
)

// oksDeriv is the Mathisson–Papapetrou–Dixon pole–dipole body under the
// Ohashi–Kyrian–Semerák condition S^{μν}w_ν = 0 with w parallel
// transported (Ohashi 2003; Kyrian & Semerák 2007, from memory): then the
// velocity is p/m, m = √(−p·p) is constant, and the spin tensor is
// parallel transported,
//
//	dx/dτ = p/m,   Dp^μ/dτ = −½ R^μ_νρσ u^ν S^{ρσ},   DS^{μν}/dτ = 0.
//
// State: x (4), p (4), S^{01}, S^{02}, S^{03}, S^{12}, S^{13}, S^{23}.
func oksDeriv(metric spacetime.Metric, m float64) func(t float64, y, dy []float64) {
	var geo bodyGeometry
	return func(_ float64, y, dy []float64) {
		l := geo.at(metric, false, nil, 0, 0, event(y))
		var S [4][4]float64
		for k, pr := range bivectors6 {
			S[pr[0]][pr[1]], S[pr[1]][pr[0]] = y[8+k], -y[8+k]
		}
		var u [4]float64
		for i := 0; i < 4; i++ {
			u[i] = y[IP+i] / m
			dy[IX+i] = u[i]
		}
		for mu := 0; mu < 4; mu++ {
			f := 0.0
			for a := 0; a < 4; a++ {
				for b := 0; b < 4; b++ {
					f -= l.gam[mu][a][b] * u[a] * y[IP+b]
				}
				for r := 0; r < 4; r++ {
					for s := r + 1; s < 4; s++ {
						f -= l.R[mu][a][r][s] * u[a] * S[r][s]
					}
				}
			}
			dy[IP+mu] = f
		}
		for k, pr := range bivectors6 {
			mu, nu := pr[0], pr[1]
			d := 0.0
			for a := 0; a < 4; a++ {
				for b := 0; b < 4; b++ {
					d -= l.gam[mu][a][b]*u[a]*S[b][nu] + l.gam[nu][a][b]*u[a]*S[mu][b]
				}
			}
			dy[8+k] = d
		}
	}
}

var bivectors6 = [6][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}}

// sscEvent integrates one event from x = −X to +X along x (no asymptotic
// tails: the comparison is between conditions at the same start) with the
// Tulczyjew body (Dixon) and the OKS body from the same state, and returns
// Δp and the Pauli–Lubanski spin kick of each.
func sscEvent(t *testing.T, M, aBg, gam float64, spin vec.Vec3) (dpT, daT, dpO, daO vec.Vec4) {
	t.Helper()
	const X = 1e5
	metric := spacetime.Kerr(M, aBg)
	d := &Dixon{Metric: metric, M: 1, Gyro: 2}
	in, _ := Incoming(1, gam, 1, spin)
	y := make([]float64, 12)
	v := math.Sqrt(gam*gam-1) / gam
	y[IX+1], y[IX+2] = -X, 1
	copy(y[IP:], in.P[:])
	copy(y[IA:], in.A[:])
	d.Normalize(y, in.A.Dot(in.A))
	T := 2 * X / (gam * v)
	set := &rk.Settings{RelTol: 1e-13, AbsTol: 1e-16}
	solT := rk.NewSolver(12, set)
	y0 := append([]float64(nil), y...)
	rT := solT.Solve(func(_ float64, y, dy []float64) { d.Deriv(y, dy) }, 0, y0, T, nil)
	if rT.Status != rk.StatusSuccess {
		t.Fatalf("Tulczyjew: %v", rT.Status)
	}
	yT := append([]float64(nil), rT.Y...)
	// The OKS state: the same x and p, the Tulczyjew spin tensor at the
	// start (there S·p = 0, so w = p/m at the start).
	var geo bodyGeometry
	l := geo.at(metric, false, nil, 0, 0, event(y))
	var b bodyState
	b.load(l, y)
	z := make([]float64, 14)
	copy(z, y[:8])
	for k, pr := range bivectors6 {
		z[8+k] = b.S[pr[0]][pr[1]]
	}
	solO := rk.NewSolver(14, set)
	rO := solO.Solve(oksDeriv(metric, b.mass), 0, z, T, nil)
	if rO.Status != rk.StatusSuccess {
		t.Fatalf("OKS: %v", rO.Status)
	}
	zO := rO.Y
	// Pauli–Lubanski vector of the OKS end state: a_μ = −(1/(2𝓜²)) ε_{μνρσ} p^ν S^{ρσ}.
	l = geo.at(metric, false, nil, 0, 0, event(zO))
	var S [4][4]float64
	for k, pr := range bivectors6 {
		S[pr[0]][pr[1]], S[pr[1]][pr[0]] = zO[8+k], -zO[8+k]
	}
	p := [4]float64{zO[IP], zO[IP+1], zO[IP+2], zO[IP+3]}
	pl := lowerVec(&l.g, p)
	m2 := -(pl[0]*p[0] + pl[1]*p[1] + pl[2]*p[2] + pl[3]*p[3])
	var al [4]float64
	for _, pm := range perms4 {
		i := pm.i
		al[i[0]] -= l.sqrtg * pm.sign * p[i[1]] * S[i[2]][i[3]] / (2 * m2)
	}
	var aO vec.Vec4
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			aO[mu] += l.gi[mu][nu] * al[nu]
		}
	}
	for i := 0; i < 4; i++ {
		dpT[i] = yT[IP+i] - y[IP+i]
		daT[i] = yT[IA+i] - y[IA+i]
		dpO[i] = zO[IP+i] - y[IP+i]
		daO[i] = aO[i] - y[IA+i]
	}
	return dpT, daT, dpO, daO
}

// oksCharges returns the Killing energy and J_z (with their spin terms,
// Dixon 1970), the mass and S² = ½S_{μν}S^{μν} of an OKS state.
func oksCharges(metric spacetime.Metric, z []float64) (E, Jz, m, S2 float64) {
	var geo bodyGeometry
	l := geo.at(metric, false, nil, 0, 0, event(z))
	var S [4][4]float64
	for k, pr := range bivectors6 {
		S[pr[0]][pr[1]], S[pr[1]][pr[0]] = z[8+k], -z[8+k]
	}
	p := [4]float64{z[IP], z[IP+1], z[IP+2], z[IP+3]}
	pl := lowerVec(&l.g, p)
	K := l.killingT()
	E = -pl[0] - halfContract(&S, &K)
	xi, KP := l.killingPhi()
	Jz = xi[1]*pl[1] + xi[2]*pl[2] + halfContract(&S, &KP)
	m = math.Sqrt(-(pl[0]*p[0] + pl[1]*p[1] + pl[2]*p[2] + pl[3]*p[3]))
	for mu := 0; mu < 4; mu++ {
		Sl := lowerVec(&l.g, S[mu]) // S^μ_ν
		for nu := 0; nu < 4; nu++ {
			for a := 0; a < 4; a++ {
				S2 += 0.5 * l.g[mu][a] * Sl[nu] * S[a][nu]
			}
		}
	}
	return E, Jz, m, S2
}

// TestSSCTulczyjewOKS compares the Tulczyjew–Dixon condition S^{μν}p_ν = 0
// (Dixon) with the Ohashi–Kyrian–Semerák condition S^{μν}w_ν = 0, w
// parallel transported from w = p_in/m (oksDeriv), for the same body (at
// infinity both centroids coincide) in Kerr with a generic spin
// orientation, from the same start at 1e5 b.
//
//   - The OKS body conserves the Killing energy and J_z with their spin
//     terms, m and S² (Dixon 1970: the conservation law holds under any
//     condition): ≤ 1e-11 relative over the path at tolerance 1e-13.
//   - The impulse and the spin kick differ at O(ε² a³) (measured local
//     exponents in ε → 2 and in a = 3): the Tulczyjew velocity differs
//     from p/m by the hidden momentum w = O(R S² p/m²) (Ehlers & Rudolph
//     1977; the form in Dixon), whose curvature force ½R(w, S) is
//     O(ε² S³) (derived here). Through O(a²) the two conditions give the
//     same Δp and Δa: a model difference that appears only beyond the
//     pole–dipole accuracy (O(S²) needs the quadrupole anyway).
//
// Tolerances: the ε exponent from couplings 1.25e-3 and 2.5e-3 carries the
// O(ε) correction of the next order, measured ≈ 0.06 here; 0.15 allows
// for it; the spin exponent from a = 0.05, 0.1 carries an O(a²) correction
// (measured < 0.02); 0.05.
func TestSSCTulczyjewOKS(t *testing.T) {
	dir := vec.Vec3{0.3, -0.5, 0.6}.Unit()
	const gam, aBg = 1.4, 0.3
	diff := func(M, a float64) (dp, da float64) {
		dpT, daT, dpO, daO := sscEvent(t, M, aBg, gam, dir.Scale(a))
		return dpT.Sub(dpO).Spatial().Norm(), daT.Sub(daO).Spatial().Norm()
	}
	p1, a1 := diff(0.00125, 0.1)
	p2, a2 := diff(0.0025, 0.1)
	p3, a3 := diff(0.0025, 0.05)
	ne, na := math.Log2(p2/p1), math.Log2(p2/p3)
	ne2, na2 := math.Log2(a2/a1), math.Log2(a2/a3)
	t.Logf("|Δp_T − Δp_OKS|: %.3e (ε = 1.25e-3), %.3e (2.5e-3), %.3e (a = 0.05): exponents ε %.3f, a %.3f", p1, p2, p3, ne, na)
	t.Logf("|Δa_T − Δa_OKS|: %.3e, %.3e, %.3e: exponents ε %.3f, a %.3f", a1, a2, a3, ne2, na2)
	if math.Abs(ne-2) > 0.15 || math.Abs(ne2-2) > 0.15 || math.Abs(na-3) > 0.05 || math.Abs(na2-3) > 0.05 {
		t.Errorf("SSC difference exponents: Δp (ε %.3f, a %.3f), Δa (ε %.3f, a %.3f); want ε², a³", ne, na, ne2, na2)
	}
	// Conservation along the OKS path.
	metric := spacetime.Kerr(0.01, aBg)
	in, _ := Incoming(1, gam, 1, dir.Scale(0.2))
	d := &Dixon{Metric: metric, M: 1, Gyro: 2}
	y := make([]float64, 12)
	y[IX+1], y[IX+2] = -1e3, 1
	copy(y[IP:], in.P[:])
	copy(y[IA:], in.A[:])
	d.Normalize(y, in.A.Dot(in.A))
	var geo bodyGeometry
	var b bodyState
	b.load(geo.at(metric, false, nil, 0, 0, event(y)), y)
	z := make([]float64, 14)
	copy(z, y[:8])
	for k, pr := range bivectors6 {
		z[8+k] = b.S[pr[0]][pr[1]]
	}
	E0, J0, m0, S0 := oksCharges(metric, z)
	sol := rk.NewSolver(14, &rk.Settings{RelTol: 1e-13, AbsTol: 1e-16})
	r := sol.Solve(oksDeriv(metric, m0), 0, z, 2e3/0.7, nil)
	E1, J1, m1, S1 := oksCharges(metric, r.Y)
	dE, dJ := math.Abs(E1-E0)/E0, math.Abs(J1-J0)/math.Abs(J0)
	dm, dS := math.Abs(m1-m0)/m0, math.Abs(S1-S0)/S0
	t.Logf("OKS drifts: E %.1e, J_z %.1e, m %.1e, S² %.1e", dE, dJ, dm, dS)
	if dE > 1e-11 || dJ > 1e-11 || dm > 1e-11 || dS > 1e-11 {
		t.Errorf("OKS drifts: E %.2g, J_z %.2g, m %.2g, S² %.2g", dE, dJ, dm, dS)
	}
}
