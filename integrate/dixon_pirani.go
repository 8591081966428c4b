package integrate

import "math"

// The Dixon body under the Pirani condition (Dixon.SSC = Pirani).
//
// Condition: S^{μν}u_ν = 0 (Pirani 1956, Acta Phys. Pol. 15, 389; from
// memory). Differentiating it with DS^{μν}/dτ = p^μu^ν − p^νu^μ gives the
// hidden-momentum form of the momentum (Costa, Herdeiro, Natário &
// Zilhão 2012, "Mathisson's helical motions for a spinning particle: are
// they unphysical?", Phys. Rev. D 85, 024001, arXiv:1109.1019: abstract
// read, the equations from memory, in our sign conventions and derived
// again here)
//
//	p^μ = m u^μ + S^{μν} a_ν,   m = −p·u,   a = Du/dτ,
//
// and with it m is constant (dm/dτ = −f·u − a·S·a = 0 for the Papapetrou
// force f = −½ R^μ_{νρσ}u^νS^{ρσ}, f·u = 0) and the spin is
// Fermi–Walker transported: S^{μν} = ε^{μνρσ}u_ρ s_σ with
// Ds^μ/dτ = u^μ (a·s). Dp/dτ = f then reads m a + S·Da/dτ = f, a
// third-order equation for x whose extra solutions are Mathisson's
// helical motions of frequency m/|S| about the non-helical one (Costa et
// al. 2012). Solved for the acceleration (derived here:
// S^{μκ}S_{κν} = −s² P^μ_ν with P the projector orthogonal to u and s,
// and the s-component m a·s = f·s of the momentum equation):
//
//	a^μ = −S^{μν}p_ν/s² + (f·s) s^μ/(m s²),   s² = ½ S_{μν}S^{μν}.
//
// State: (x, p, a_PL, v) with the Pauli–Lubanski vector a_PL of p (IA;
// the spin observable of every condition) and the hidden velocity
// v = u − p/m (IE), small, so that the velocity is split as for
// Tulczyjew (VelocitySplit) and S·p = −m S·v is formed without the
// cancellation of p against m u. The spin tensor follows from the
// state: contracting ε p with S = ε u s gives a_PL = (m s + (s·p) u)/𝓜²,
// and s·p = 0 (p − m u = S·a is orthogonal to s), so s = (𝓜²/m) a_PL and
//
//	S^{μν} = (𝓜²/m) ε^{μνρσ} u_ρ a_σ,   𝓜² = −p·p = m²(1 − v·v),
//
// which satisfies the condition identically. The equations integrated:
//
//	dx^μ/dτ = p^μ/m + v^μ,
//	Dp^μ/dτ = f^μ,
//	Da_μ/dτ = (2 p·f/𝓜²) a_μ − (1/(2𝓜²)) ε_{μνρσ} f^ν S^{ρσ},
//	Dv^μ/dτ = a^μ − f^μ/m = −(S^{μν}p_ν + s² (P f)^μ/m)/s²
//
// (the s-components of a and f/m cancel exactly).
//
// Non-helical initial data (the convenient choice wherever the
// non-helical solution can be recognised: Costa, Lukes-Gerakopoulos &
// Semerák 2018, Phys. Rev. D 97, 084023, arXiv:1712.07281, abstract
// read): the slow solution, on which the hidden
// velocity follows the force adiabatically, v = −S·f/m² + O(|S| f/(m r))
// (from Dv/dτ ≈ 0; at first order the Tulczyjew hidden velocity, derived
// here). Scatter
// sets v so at the start radius and at the nodes of the asymptotic tails
// (slaveExtra); the remainder excites a helix of relative amplitude
// O(|a| b/R) of the already first-order hidden velocity. At infinity
// v = 0, so the Pirani and Tulczyjew centroids share their incoming
// asymptote (see SSC). The non-helical solution is only defined
// asymptotically: an encounter short against the helical period excites
// the helix, whose outgoing amplitude falls like exp(−κ b/|a|)
// (TestSSCPiraniHelicalExcitation). Numerically the helical mode is a fast
// oscillation of frequency m/|S| that the explicit steps must follow
// even at zero amplitude (stability): the number of steps grows like
// R/|a| — the price of the exact Pirani dynamics.
//
// Conserved: m = −p·u (MassShell), S² = s², the condition's consequences
// u·u = −1 and a_PL·u = 0 (SpinConstraints' orth, with a·p = 0), and
// Dixon 1970's Killing energy and J_z with their spin terms.

// piraniSpin sets the spin tensor of b (loaded with S = ε p a) to the
// Pirani one for the hidden velocity v and the mass m.
func (b *bodyState) piraniSpin(l *bodyLocal, v [4]float64, m float64) {
	M2 := b.mass * b.mass
	vl := lowerVec(&l.g, v)
	E := dual(l, vl, b.al)
	c1, c2 := M2/(m*m), M2/m
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			b.S[mu][nu] = c1*b.S[mu][nu] + c2*E[mu][nu]
		}
	}
	b.setSm(l)
}

// rhsPirani is the right-hand side under the Pirani condition.
func (d *Dixon) rhsPirani(l *bodyLocal, y, dy []float64) {
	w := &d.rhsWork
	*w = rhsWork{}
	b, C := &w.b, &w.C
	b.load(l, y)
	m := d.M
	im := 1 / m
	var v [4]float64
	copy(v[:], y[IE:IE+4])
	M2 := b.mass * b.mass
	vl := lowerVec(&l.g, v)
	E := dual(l, vl, b.al) // ε v a: S·p = (𝓜²/m) E·p
	b.piraniSpin(l, v, m)
	b.lorentzCurvature(l, C)
	var u, f [4]float64
	for mu := 0; mu < 4; mu++ {
		u[mu] = b.p[mu]*im + v[mu]
	}
	for mu := 0; mu < 4; mu++ {
		f[mu] = C[mu][0]*u[0] + C[mu][1]*u[1] + C[mu][2]*u[2] + C[mu][3]*u[3]
	}
	da := b.spinVectorRate(l, f)
	fl := lowerVec(&l.g, f)
	ul := lowerVec(&l.g, u)
	fu := fl[0]*u[0] + fl[1]*u[1] + fl[2]*u[2] + fl[3]*u[3]
	fa := fl[0]*b.a[0] + fl[1]*b.a[1] + fl[2]*b.a[2] + fl[3]*b.a[3]
	aa := b.al[0]*b.a[0] + b.al[1]*b.a[1] + b.al[2]*b.a[2] + b.al[3]*b.a[3]
	uu := -(ul[0]*u[0] + ul[1]*u[1] + ul[2]*u[2] + ul[3]*u[3])
	// s = (𝓜²/m) a, s² = (𝓜⁴/m²) a·a; P f = f + (f·u)u/(−u·u) − (f·a) a/(a·a).
	// A spinless body (a = 0) is a geodesic: no hidden velocity.
	s2 := M2 * M2 * im * im * aa
	c, ia := 0.0, 0.0
	if aa > 0 {
		c, ia = M2*im/s2, 1/aa
	}
	for mu := 0; mu < 4; mu++ {
		dy[IX+mu] = u[mu]
		dy[IP+mu] = f[mu]
		dy[IA+mu] = da[mu]
		dy[IE+mu] = 0
		if aa > 0 {
			Sp := c * (E[mu][0]*b.pl[0] + E[mu][1]*b.pl[1] + E[mu][2]*b.pl[2] + E[mu][3]*b.pl[3])
			Pf := f[mu] + fu/uu*u[mu] - fa*ia*b.a[mu]
			dy[IE+mu] = -Sp - Pf*im
		}
	}
	connection(l, u, b.p, dy[IP:IP+4])
	connection(l, u, b.a, dy[IA:IA+4])
	connection(l, u, v, dy[IE:IE+4])
	d.alpha, d.w = im, v
}

// piraniVelocity returns the slow (non-helical) hidden velocity
// v = −S·f/m² at the state y, iterated twice on v (u and S depend on it).
func (d *Dixon) piraniVelocity(l *bodyLocal, y []float64) (v [4]float64) {
	m := d.M
	im := 1 / m
	copy(v[:], y[IE:IE+4])
	var b bodyState
	var C [4][4]float64
	for it := 0; it < 3; it++ {
		b.load(l, y)
		b.piraniSpin(l, v, m)
		C = [4][4]float64{}
		b.lorentzCurvature(l, &C)
		var u, f [4]float64
		for mu := 0; mu < 4; mu++ {
			u[mu] = b.p[mu]*im + v[mu]
		}
		for mu := 0; mu < 4; mu++ {
			f[mu] = C[mu][0]*u[0] + C[mu][1]*u[1] + C[mu][2]*u[2] + C[mu][3]*u[3]
		}
		fl := lowerVec(&l.g, f)
		for mu := 0; mu < 4; mu++ {
			S := &b.S[mu]
			v[mu] = -(S[0]*fl[0] + S[1]*fl[1] + S[2]*fl[2] + S[3]*fl[3]) * im * im
		}
	}
	return v
}

// normalizePirani is Normalize under Pirani: the non-helical hidden
// velocity, p⁰ from 𝓜² = m²(1 − v·v) (so that −p·u = m and u·u = −1),
// a⁰ from a·p = 0 and a rescaled so that s² = (𝓜⁴/m²) a·a = m² a2.
func (d *Dixon) normalizePirani(y []float64, a2 float64) {
	l := d.local(y)
	g := &l.g
	m := d.M
	for it := 0; it < 3; it++ {
		var v [4]float64
		copy(v[:], y[IE:IE+4])
		vl := lowerVec(g, v)
		vv := vl[0]*v[0] + vl[1]*v[1] + vl[2]*v[2] + vl[3]*v[3]
		M := m * math.Sqrt(1-vv)
		massShellP0(g, y, M)
		r := m / M
		normalizeSpin(g, y, r*r*r*r*a2)
		v = d.piraniVelocity(l, y)
		copy(y[IE:IE+4], v[:])
	}
}

// piraniMass returns m = −p·u = 𝓜²/m − p·v for the mass parameter m.
func (b *bodyState) piraniMass(l *bodyLocal, v [4]float64, m float64) float64 {
	return b.mass*b.mass/m - (b.pl[0]*v[0] + b.pl[1]*v[1] + b.pl[2]*v[2] + b.pl[3]*v[3])
}
