package integrate

import (
	"math"

	"ricochet/background/em"
	"ricochet/background/spacetime"
)

// Dixon is a spinning test body — pole, dipole and optionally the
// spin-induced quadrupole — in a stationary metric together with an
// electromagnetic field: the Mathisson–Papapetrou–Dixon equations
// (Mathisson 1937, Acta Phys. Pol. 6, 163; Papapetrou 1951, Proc. R. Soc.
// A 209, 248; Dixon 1970, Proc. R. Soc. A 314, 499 and 319, 509) with the
// electromagnetic forces and torques of a charged body with magnetic dipole
// moment (Dixon 1970; Souriau 1974, Ann. Inst. H. Poincaré 20, 315; all
// from memory). Flat space is the special case Metric == nil, with the
// field given by a static em.Field, evaluated without any curvature work.
//
// Equations. With u = dx/dτ, spin tensor S^{μν}, charge q (folded into
// the field tensor F_{μν}, see below), dipole moment m^{μν} = κ S^{μν},
// κ = g/(2m) for gyromagnetic ratio g and mass parameter m, and D/dτ the
// covariant derivative along the worldline,
//
//	Dp^μ/dτ    = F^μ_ν u^ν + ½ m^{αβ} ∇^μF_{αβ} − ½ R^μ_{νρσ} u^ν S^{ρσ} + f_Q^μ,
//	DS^{μν}/dτ = p^μ u^ν − p^ν u^μ + m^{μκ}F^ν_κ − m^{νκ}F^μ_κ + τ_Q^{μν}
//
// (Dixon 1970 eqs. for a pole–dipole body; the electromagnetic dipole
// terms as in Souriau 1974 and Künzle 1972, J. Math. Phys. 13, 739; the
// quadrupole force f_Q and torque τ_Q of CES2 below). The dipole force is the
// gradient form, and together with the tensor torque it gives the exact
// conservation laws below.
//
// Spin supplementary condition. The default condition (SSC, zero value
// Tulczyjew; the others in ssc.go, dixon_pirani.go and dixon_oks.go) is
// Tulczyjew–Dixon, S^{μν}p_ν = 0 (Tulczyjew 1959, Acta
// Phys. Pol. 18, 393; Dixon 1970). It makes the spin tensor the dual of a
// spin vector a^μ orthogonal to p,
//
//	S^{μν} = ε^{μνρσ} p_ρ a_σ,   a_μ = −(1/(2𝓜²)) ε_{μνρσ} p^ν S^{ρσ},
//	𝓜² = −p·p,   S² = ½ S_{μν}S^{μν} = 𝓜² a·a,
//
// with ε_{0123} = +√−g (so a rest-frame spin along +z is angular
// momentum along +z), and the state carries (x, p, a) in the layout of the
// other models (IX, IP, IA). The velocity follows from keeping the
// condition: d(S^{μν}p_ν)/dτ = 0 with the equations above gives the
// momentum–velocity relation of Ehlers & Rudolph 1977 (Gen. Rel. Grav. 8,
// 197) and Dixon 1970, here with the electromagnetic torque and the
// u-dependence of the Lorentz and curvature forces included: with
// u = p/𝓜 + w, w·p = 0 (the normalisation u·p = −𝓜 fixes τ),
//
//	(𝓜² δ^μ_λ + S^{μν} C_{νλ}) w^λ = −T^{μν} p_ν − S^{μν} (f₀ + C p/𝓜)_ν,
//
// where f = f₀ + C u splits the force into its u-independent part f₀
// (dipole and quadrupole forces) and the u-linear part C_{νλ} = F_{νλ} −
// ½ R_{νλρσ}S^{ρσ}, and T is the torque. The 4 × 4 system is solved in
// closed form (bodyState.velocityCorrection: S is simple, so
// (S C)² = −σ S C with σ = ½ S^{αβ}C_αβ; for the neutral body in Kerr,
// whose geometry comes in contracted form, the same closed form without
// the metric, neutralContracted). The small correction w is what enters the spin equation:
// following the design rule of the package, the spin tensor's p∧u term is
// never formed as p^μu^ν − p^νu^μ (the difference of two nearly equal
// numbers). In the spin-vector form it drops out altogether, since
// ε_{μνρσ}p^ν(p^ρw^σ − p^σw^ρ) = 0:
//
//	Da^μ/dτ = (1/𝓜²)[p^μ (f·a) + a^μ (f·p)] − (1/(2𝓜²)) ε^μ_{νρσ} p^ν T^{ρσ},
//
// (differentiating a_μ = −ε p S/(2𝓜²); the first bracket keeps a·p = 0 and
// S² fixed).
//
// Conserved quantities. For a Killing vector ξ of the background that also
// leaves the field invariant (L_ξ g = 0, L_ξ F = 0),
//
//	Q_ξ = ξ_μ (p^μ + q A^μ) + ½ S^{μν} ∇_μ ξ_ν
//
// is constant along every solution, whatever the velocity (Dixon 1970; the
// derivation uses only the force, the torque and the antisymmetry of
// ∇ξ; the electromagnetic dipole terms cancel between force and torque by
// L_ξ F = 0). Hence the Killing energy E = −Q_{∂_t} (Energy) and, about an
// axis of symmetry, J_z = Q_{∂_φ} (AngularMomentumZ); in flat space with a
// rotation-invariant field (Coulomb) every component of J^{ij} = x^i p^j −
// x^j p^i + S^{ij} (AngularMomentum). The spin magnitude S² is conserved
// exactly (torque and force are orthogonal to the spin in the required
// sense), and in pure gravity without quadrupole so is 𝓜. With the
// electromagnetic dipole, 𝓜 itself changes at first order in the field:
// the conserved combination is the mass function
//
//	m_D = 𝓜 + ½ m^{αβ} F_{αβ}
//
// (rest frame: 𝓜 = m_D − μ·B, i.e. 𝓜 carries the dipole energy), constant
// to rounding in the tests (MassShell reports its drift).
//
// Spin-induced quadrupole (CES2 ≠ 0, curved space). With the reduced
// quadrupole J^{αβγδ} = (3C_ES²/𝓜) p^{[α}a^{β]} a^{[γ}p^{δ]} (so that
// at p = m u the interaction is L = (C_ES²/2m) R_μανβ u^α u^β S^μ S^ν;
// Porto 2006, Steinhoff & Puetzfeld 2010, from memory)
//
//	f_Q^μ = −(1/6) J^{αβγδ} ∇^μR_αβγδ,   τ_Q^{μν} = (4/3) J^{αβγ[μ}R^{ν]}_{γαβ}
//
// (Dixon 1974's quadrupole terms, from memory; bodyState.quadrupole). They
// are u-independent and enter f₀ and T of the momentum–velocity relation.
// The Killing charges Q_ξ stay exactly conserved (measured to rounding),
// and so does S² here; 𝓜 is not, and the mass function
// 𝓜 − (1/6) J^{αβγδ}R_αβγδ (MassShell) is conserved to O(S⁴) (measured:
// its drift falls 16-fold per halving of the spin).
//
// Charge and units. The field F_{μν} is multiplied by the probe's charge
// Q. In flat space the probe may also carry a magnetic charge G: the field
// it couples to is then the duality-rotated Re[(Q − iG) 𝔽] (as for
// Charge), its magnetic dipole (g/2) Q a and its electric dipole
// −(g/2) G a. In curved space the field is the metric's own potential and
// G must be zero.
type Dixon struct {
	// Metric is the background; nil means Minkowski space in Cartesian
	// coordinates (no curvature is evaluated).
	Metric spacetime.Metric
	// Field is the static electromagnetic field in flat space (Metric
	// nil); nil means no field. It is ignored in curved space, where the
	// field is the metric's potential.
	Field em.Field
	M     float64 // mass parameter m > 0 (the asymptotic rest mass)
	Q     float64 // electric charge
	G     float64 // magnetic charge (flat space only)
	Gyro  float64 // gyromagnetic ratio g of the dipole moment (g/2m) q S
	// Linear selects the first-order geometry of a Linearizable metric.
	Linear bool
	// CES2 is the coefficient C_ES² of the spin-induced quadrupole
	// (bodyState.quadrupole; 1 for a Kerr black hole); 0 is the
	// pole–dipole body. Curved space only.
	CES2 float64
	// SSC is the spin supplementary condition; the zero value is
	// Tulczyjew (S^{μν}p_ν = 0). Pirani and OhashiKyrianSemerak are
	// implemented for a neutral pole–dipole body (Q = G = 0, CES2 = 0):
	// their state has 16 components, the extra block at IE.
	SSC SSC

	// extra adds further u-independent forces and torques (the higher
	// multipoles of a body built on this core: KerrDixon); nil for none.
	extra multipoleCoupling

	geo bodyGeometry
	rhsWork
	alpha float64    // 1/𝓜 of the last Deriv
	w     [4]float64 // velocity correction of the last Deriv
}

// multipoleCoupling adds u-independent forces f₀ and torques T at the local
// geometry l to the state b (see Dixon.extra).
type multipoleCoupling interface {
	add(l *bodyLocal, b *bodyState, f0 *[4]float64, T *[4][4]float64)
}

// Name implements Model.
func (d *Dixon) Name() string {
	s := "dixon"
	if d.SSC != Tulczyjew {
		s += " (" + d.SSC.String() + ")"
	}
	if d.Metric != nil {
		s += " in " + d.Metric.Name()
		if d.Linear {
			s += " (linearized)"
		}
	}
	return s
}

// Dim implements Model.
func (d *Dixon) Dim() int {
	if d.SSC != Tulczyjew {
		return 16
	}
	return 12
}

// Mass implements Model.
func (d *Dixon) Mass() float64 { return d.M }

// Deriv implements Model.
func (d *Dixon) Deriv(y, dy []float64) { d.rhs(y, dy, false) }

// LinearDeriv writes the part of Deriv that is of first order in the
// coupling (for the straight-line quadratures of FirstOrder and the
// asymptotic tails): force and torque with u = p/𝓜, and the velocity
// p/𝓜 + w₁ with w₁ = −(T p + S (f₀ + C p/𝓜))/𝓜², the first-order part
// of the velocity correction (it vanishes at g = 2 in a pure field).
func (d *Dixon) LinearDeriv(y, dy []float64) { d.rhs(y, dy, true) }

func (d *Dixon) kappa() float64 { return d.Gyro / (2 * d.M) }

// rhs is the right-hand side; with linear the velocity correction w is
// dropped.
func (d *Dixon) rhs(y, dy []float64, linear bool) {
	l := d.local(y)
	if d.SSC != Tulczyjew {
		if d.Q != 0 || d.G != 0 || d.CES2 != 0 || d.extra != nil {
			panic("integrate: Dixon: spin supplementary condition " + d.SSC.String() + " needs a neutral pole–dipole body")
		}
		switch {
		case d.SSC == OhashiKyrianSemerak:
			d.rhsOKS(l, y, dy, linear)
			return
		case linear:
			// Pirani at first order: the Tulczyjew first order (the
			// hidden velocities agree there), no extra rate.
			dy[IE], dy[IE+1], dy[IE+2], dy[IE+3] = 0, 0, 0, 0
		default:
			d.rhsPirani(l, y, dy)
			return
		}
	}
	if l.contracted && !linear {
		d.alpha, d.w = neutralContracted(l, y, dy)
		return
	}
	// The body state and force operators live in the model (passed to the
	// multipole coupling through an interface, stack values would escape
	// to the heap on every evaluation).
	w := &d.rhsWork
	*w = rhsWork{}
	b, f0, T, C := &w.b, &w.f0, &w.T, &w.C
	b.load(l, y)
	b.dipole(l, d.kappa(), f0, T)
	if d.CES2 != 0 && l.curved {
		b.quadrupole(l, d.CES2, f0, T)
	}
	if d.extra != nil && l.curved {
		d.extra.add(l, b, f0, T)
	}
	b.lorentzCurvature(l, C)
	if linear {
		w1 := b.velocityFirstOrder(l, f0, T, C)
		b.derivatives(l, f0, T, C, &w.w, dy)
		for mu := 0; mu < 4; mu++ {
			dy[IX+mu] += w1[mu]
		}
		d.alpha, d.w = 1/b.mass, w1
		return
	}
	w.w = b.velocityCorrection(l, f0, T, C)
	b.derivatives(l, f0, T, C, &w.w, dy)
	d.alpha, d.w = 1/b.mass, w.w
}

// rhsWork is the scratch of one right-hand side evaluation.
type rhsWork struct {
	b     bodyState
	f0, w [4]float64
	T, C  [4][4]float64 // C^μ_λ: the u-linear force operator
}

// VelocitySplit returns the split dx/dτ = α p + w of the last Deriv or
// LinearDeriv (α = 1/𝓜), for the scattering driver.
func (d *Dixon) VelocitySplit() (float64, [4]float64) { return d.alpha, d.w }

// local evaluates the geometry and field at the event of y.
func (d *Dixon) local(y []float64) *bodyLocal {
	order := 2
	if d.CES2 != 0 {
		order = 3
	}
	d.geo.lowered = true
	d.geo.contracted = d.SSC == Tulczyjew && d.Q == 0 && d.CES2 == 0 && d.extra == nil
	return d.geo.atOrder(d.Metric, d.Linear, d.Field, d.Q, d.G, event(y), order)
}

// loadState fills b from y at l with the spin tensor of the condition in
// use, and returns the extra block (zero for Tulczyjew).
func (d *Dixon) loadState(l *bodyLocal, b *bodyState, y []float64) [4]float64 {
	b.load(l, y)
	if d.SSC == Tulczyjew {
		return [4]float64{}
	}
	return d.generalSpin(l, b, y)
}

// Energy implements Model: the Killing energy
// E = −p_t − q A_t − ½ S^{μν}∇_μ ξ_ν with ξ = ∂_t; in flat space
// E = p⁰ + Re[(Q − iG) 𝒱(x)].
func (d *Dixon) Energy(y []float64) float64 {
	l := d.local(y)
	var b bodyState
	d.loadState(l, &b, y)
	return b.energy(l)
}

// EnergyExact implements Model: true.
func (d *Dixon) EnergyExact() bool { return true }

// AngularMomentumZ returns the conserved quantity of ∂_φ = x∂_y − y∂_x,
//
//	J_z = ξ_μ (p^μ + q A^μ) + ½ S^{μν} ∇_μ ξ_ν,
//
// exact for a background axisymmetric about z.
func (d *Dixon) AngularMomentumZ(y []float64) float64 {
	l := d.local(y)
	var b bodyState
	d.loadState(l, &b, y)
	return b.angularMomentumZ(l)
}

// ConservesJz reports whether AngularMomentumZ is a constant of the
// motion: for the axisymmetric metric families (KerrNewman,
// DyonicKerrNewman, KerrNewmanNUT) and, in flat space, for no field, the Coulomb field and
// an electric root-Kerr field with spin along z.
func (d *Dixon) ConservesJz() bool {
	switch m := d.Metric.(type) {
	case spacetime.KerrNewman, spacetime.KerrNewmanNUT, spacetime.DyonicKerrNewman:
		return true
	case nil:
		switch f := d.Field.(type) {
		case nil, em.Coulomb:
			return true
		case em.RootKerr:
			return f.P == 0 && f.A[0] == 0 && f.A[1] == 0 && d.G == 0
		}
	default:
		_ = m
	}
	return false
}

// AngularMomentum returns, in flat space, J^{ij} = x^i p^j − x^j p^i +
// S^{ij} as the axial vector (J^{23}, J^{31}, J^{12}) (the field's
// contribution q x ∧ A is not included: it vanishes for the Coulomb field
// and the dyon's electric part, the rotation-invariant cases in which all
// three components are conserved).
func (d *Dixon) AngularMomentum(y []float64) [3]float64 {
	l := d.local(y)
	var b bodyState
	d.loadState(l, &b, y)
	x := event(y)
	J := func(i, j int) float64 { return x[i]*b.p[j] - x[j]*b.p[i] + b.S[i][j] }
	return [3]float64{J(2, 3), J(3, 1), J(1, 2)}
}

// DynamicalMass returns 𝓜 = √(−p·p) at y.
func (d *Dixon) DynamicalMass(y []float64) float64 {
	l := d.local(y)
	var b bodyState
	b.load(l, y)
	return b.mass
}

// MassShell returns the relative deviation of the conserved mass function
// from the mass parameter, (m_D − m)/m (see the type's comment).
func (d *Dixon) MassShell(y []float64) float64 {
	l := d.local(y)
	var b bodyState
	e := d.loadState(l, &b, y)
	switch d.SSC {
	case OhashiKyrianSemerak:
		return (b.mass - d.M) / d.M
	case Pirani:
		return (b.piraniMass(l, e, d.M) - d.M) / d.M
	}
	return (b.massFunctionQ(l, d.kappa(), d.CES2) - d.M) / d.M
}

// SpinConstraints returns the relative violations of the spin condition
// and of the spin magnitude: for Tulczyjew |S^{μν}p_ν| through
// |a·p|/(𝓜|a|); for OKS the larger of that and |a·d|/(𝓜 a·a) (S simple,
// dixon_oks.go); for Pirani the larger of |a·p|/(𝓜|a|), |a·u|/|a| and
// |u·u + 1| (dixon_pirani.go); and S²/(m² a2) − 1 for the asymptotic
// a·a = a2, with S² = ½ S_{μν}S^{μν} of the condition's spin tensor.
func (d *Dixon) SpinConstraints(y []float64, a2 float64) (orth, norm float64) {
	l := d.local(y)
	var b bodyState
	e := d.loadState(l, &b, y)
	aa := b.dot(l, b.a, b.a)
	orth = math.Abs(b.dot(l, b.a, b.p)) / (b.mass * math.Sqrt(math.Abs(aa)))
	if d.SSC != Tulczyjew {
		var c float64
		switch d.SSC {
		case OhashiKyrianSemerak:
			c = math.Abs(b.dot(l, b.a, e)) / (b.mass * aa)
		case Pirani:
			var u [4]float64
			for i := range u {
				u[i] = b.p[i]/d.M + e[i]
			}
			c = math.Max(math.Abs(b.dot(l, b.a, u))/math.Sqrt(math.Abs(aa)), math.Abs(b.dot(l, u, u)+1))
		}
		orth = math.Max(orth, c)
		if a2 > 0 {
			norm = b.spinSquare(l)/(d.M*d.M*a2) - 1
		}
		return orth, norm
	}
	if a2 > 0 {
		norm = b.mass*b.mass*aa/(d.M*d.M*a2) - 1
	}
	return orth, norm
}

// Normalize implements Model: p⁰ from the mass shell with the dynamical
// mass 𝓜 for which the mass function equals m, a⁰ from a·p = 0, and a
// rescaled so that S² = 𝓜² a·a = m² a2.
func (d *Dixon) Normalize(y []float64, a2 float64) {
	switch d.SSC {
	case OhashiKyrianSemerak:
		d.normalizeOKS(y, a2)
		return
	case Pirani:
		d.normalizePirani(y, a2)
		return
	}
	l := d.local(y)
	target := d.M
	for it := 0; it < 3; it++ {
		massShellP0(&l.g, y, target)
		var b bodyState
		b.load(l, y)
		// m_D − 𝓜 does not depend on the normalisation of p at this
		// order: one correction suffices; the loop polishes it.
		target = d.M - (b.massFunctionQ(l, d.kappa(), d.CES2) - b.mass)
	}
	normalizeSpin(&l.g, y, d.M*d.M*a2/(target*target))
}

// Hazard implements Model: in flat space the branch disk of a root-Kerr
// source, in curved space the horizon, disk, ring and string checks of
// Geodesic.
func (d *Dixon) Hazard(y0, y1 []float64) Status {
	if d.Metric == nil {
		if d.Field == nil {
			return StatusRunning
		}
		dk := fieldDisk(d.Field, [3]float64{})
		if dk.Crosses(spatial(y0, IX), spatial(y1, IX)) {
			return StatusCrossedDisk
		}
		return StatusRunning
	}
	g := Geodesic{Metric: d.Metric}
	return g.Hazard(y0, y1)
}

// massShellP0 solves g_μν p^μ p^ν = −m² for p⁰ given p⃗ (future root; see
// Geodesic.Normalize) and stores it in y[IP]. It leaves y unchanged if the
// shell has no real root.
func massShellP0(G *[4][4]float64, y []float64, m float64) {
	p1, p2, p3 := y[IP+1], y[IP+2], y[IP+3]
	beta := G[0][1]*p1 + G[0][2]*p2 + G[0][3]*p3
	c := m*m + G[1][1]*p1*p1 + G[2][2]*p2*p2 + G[3][3]*p3*p3 +
		2*(G[1][2]*p1*p2+G[1][3]*p1*p3+G[2][3]*p2*p3)
	a := G[0][0]
	disc := beta*beta - a*c
	if disc < 0 || a == 0 {
		return
	}
	// Cancellation-free roots of a x² + 2β x + c = 0.
	q := -(beta + math.Copysign(math.Sqrt(disc), beta))
	r1, r2 := q/a, c/q
	if q == 0 {
		r1, r2 = math.Sqrt(-c/a), -math.Sqrt(-c/a)
	}
	switch {
	case r1 > 0 && r2 > 0:
		if math.Abs(r1-y[IP]) <= math.Abs(r2-y[IP]) {
			y[IP] = r1
		} else {
			y[IP] = r2
		}
	case r1 > 0:
		y[IP] = r1
	case r2 > 0:
		y[IP] = r2
	}
}

// normalizeSpin solves g(a, p) = 0 for a⁰ and rescales a to g(a, a) = aa.
func normalizeSpin(G *[4][4]float64, y []float64, aa float64) {
	var pl [4]float64
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			pl[m] += G[m][n] * y[IP+n]
		}
	}
	y[IA] = -(y[IA+1]*pl[1] + y[IA+2]*pl[2] + y[IA+3]*pl[3]) / pl[0]
	cur := 0.0
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			cur += G[m][n] * y[IA+m] * y[IA+n]
		}
	}
	if cur > 0 && aa > 0 {
		f := math.Sqrt(aa / cur)
		for i := IA; i < IA+4; i++ {
			y[i] *= f
		}
	}
}
