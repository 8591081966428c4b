package integrate

// The Dixon body under the Ohashi–Kyrian–Semerák condition
// (Dixon.SSC = OhashiKyrianSemerak).
//
// Condition: S^{μν}w_ν = 0 for a timelike vector w that is parallel
// transported along the worldline, Dw/dτ = 0 (Ohashi 2003, Phys. Rev. D
// 68, 044009; Kyrian & Semerák 2007, Mon. Not. R. Astron. Soc. 382, 1922,
// sec. 3; Semerák 1999, Mon. Not. R. Astron. Soc. 308, 863, for the
// family of conditions; all from memory). Differentiating the condition
// with the MPD equations gives (DS^{μν}/dτ)w_ν = 0, i.e.
// p^μ(u·w) = u^μ(p·w): the velocity is parallel to the momentum, and then
// the spin tensor is parallel transported (Kyrian & Semerák 2007):
//
//	dx^μ/dτ = u^μ = p^μ/m,   m = √(−p·p) constant,
//	Dp^μ/dτ = −½ R^μ_{νρσ} u^ν S^{ρσ},
//	DS^{μν}/dτ = 0.
//
// With u ∥ p the equations are those of a geodesic with the
// Mathisson–Papapetrou force, and the system has no hidden momentum. The
// vector w itself never enters: a parallel-transported S keeps its
// kernel (the plane containing every admissible w) parallel transported,
// so the condition holds along the whole path once it holds at the start,
// and the statement "S^{μν}w_ν = 0 for some timelike w" is the statement
// that S is a simple spacelike bivector, ε_{μνρσ}S^{μν}S^{ρσ} = 0.
//
// State. S is not orthogonal to p here, so it is not the dual of a spin
// vector alone: the state carries (x, p, a, d) with the Pauli–Lubanski
// vector a (IA, orthogonal to p, the spin observable of every condition)
// and the mass dipole d^μ = S^{μν}p_ν/𝓜 relative to p (IE, orthogonal to
// p), so that
//
//	S^{μν} = ε^{μνρσ} p_ρ a_σ + (p^μ d^ν − p^ν d^μ)/𝓜,
//
// 𝓜 = √(−p·p), and d/𝓜 is the displacement of the Tulczyjew centroid
// from the OKS centroid (Δx of SSC with v = w). Then
//
//	Da_μ/dτ = (2 p·f/𝓜²) a_μ − (1/(2𝓜²)) ε_{μνρσ} f^ν S^{ρσ}
//	Dd^μ/dτ = S^{μν} f_ν/𝓜
//
// with f the Papapetrou force (bodyState.spinVectorRate; the second from
// DS = 0 and D𝓜 = 0).
//
// Initial data: w_in = p_in/m, hence S·p = 0 and d = 0 at infinity (the
// three conditions' centroids coincide there, see SSC); d at the start
// radius is its first-order tail ∫ S f/𝓜 dτ from infinity, added by
// Scatter from the tail's integral of the extra block.
//
// Conserved (Dixon 1970's Killing charges hold under any condition):
// 𝓜 (MassShell), S² = 𝓜² a·a − d·d (SpinConstraints' norm), the
// condition a·d = 0, i.e. ε_{μνρσ}S^{μν}S^{ρσ} = 0, and a·p = 0
// (SpinConstraints' orth), the Killing energy and J_z with their spin
// terms ½ S^{μν}∇_μξ_ν.

// addMassDipole adds (p^μ d^ν − p^ν d^μ)/𝓜 to the spin tensor of b.
func (b *bodyState) addMassDipole(l *bodyLocal, d [4]float64) {
	im := 1 / b.mass
	for mu := 0; mu < 4; mu++ {
		for nu := mu + 1; nu < 4; nu++ {
			v := (b.p[mu]*d[nu] - b.p[nu]*d[mu]) * im
			b.S[mu][nu] += v
			b.S[nu][mu] -= v
		}
	}
	b.setSm(l)
}

// rhsOKS is the right-hand side under the OKS condition; with linear the
// mass dipole is left out of S (first order in the coupling).
func (d *Dixon) rhsOKS(l *bodyLocal, y, dy []float64, linear bool) {
	w := &d.rhsWork
	*w = rhsWork{}
	b, C := &w.b, &w.C
	b.load(l, y)
	var e [4]float64
	copy(e[:], y[IE:IE+4])
	if !linear {
		b.addMassDipole(l, e)
	}
	b.lorentzCurvature(l, C)
	im := 1 / b.mass
	var u, f [4]float64
	for mu := 0; mu < 4; mu++ {
		u[mu] = b.p[mu] * im
	}
	for mu := 0; mu < 4; mu++ {
		f[mu] = C[mu][0]*u[0] + C[mu][1]*u[1] + C[mu][2]*u[2] + C[mu][3]*u[3]
	}
	da := b.spinVectorRate(l, f)
	fl := lowerVec(&l.g, f)
	for mu := 0; mu < 4; mu++ {
		S := &b.S[mu]
		dy[IX+mu] = u[mu]
		dy[IP+mu] = f[mu]
		dy[IA+mu] = da[mu]
		dy[IE+mu] = (S[0]*fl[0] + S[1]*fl[1] + S[2]*fl[2] + S[3]*fl[3]) * im
	}
	connection(l, u, b.p, dy[IP:IP+4])
	connection(l, u, b.a, dy[IA:IA+4])
	connection(l, u, e, dy[IE:IE+4])
	d.alpha, d.w = im, [4]float64{}
}

// normalizeOKS is Normalize under OKS: 𝓜 = m, d⁰ from d·p = 0, a⁰ from
// a·p = 0, d projected orthogonal to a (the condition), and a rescaled so
// that S² = 𝓜² a·a − d·d = m² a2.
func (d *Dixon) normalizeOKS(y []float64, a2 float64) {
	l := d.local(y)
	g := &l.g
	massShellP0(g, y, d.M)
	pl := lowerVec(g, [4]float64{y[IP], y[IP+1], y[IP+2], y[IP+3]})
	y[IE] = -(y[IE+1]*pl[1] + y[IE+2]*pl[2] + y[IE+3]*pl[3]) / pl[0]
	for it := 0; it < 2; it++ {
		normalizeSpin(g, y, a2)
		var a, e [4]float64
		copy(a[:], y[IA:IA+4])
		copy(e[:], y[IE:IE+4])
		al := lowerVec(g, a)
		aa := al[0]*a[0] + al[1]*a[1] + al[2]*a[2] + al[3]*a[3]
		ae := al[0]*e[0] + al[1]*e[1] + al[2]*e[2] + al[3]*e[3]
		el := lowerVec(g, e)
		ee := el[0]*e[0] + el[1]*e[1] + el[2]*e[2] + el[3]*e[3]
		if aa > 0 {
			for i := 0; i < 4; i++ {
				y[IE+i] -= ae / aa * a[i]
			}
		}
		normalizeSpin(g, y, a2+ee/(d.M*d.M))
	}
}
