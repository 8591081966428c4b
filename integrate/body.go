package integrate

import (
	"math"

	"ricochet/background/em"
	"ricochet/background/spacetime"
	"ricochet/background/vec"
)

// The tensor algebra of the spinning-body core (Dixon and the models built
// on it): the local geometry and field at an event, and the pole–dipole
// state (x, p, a) with its spin tensor. Components are in the background's
// coordinates; in flat space the metric is η and nothing curved is
// evaluated.

// bodyLocal is the geometry and the charge-weighted field at one event.
type bodyLocal struct {
	curved bool
	g, gi  [4][4]float64
	sqrtg  float64             // √−det g
	gam    [4][4][4]float64    // Γ^μ_αβ
	R      [4][4][4][4]float64 // R^μ_νρσ
	F      [4][4]float64       // q F_μν
	Fm     [4][4]float64       // q F^μ_ν
	DF     [4][4][4]float64    // q ∇_λ F_μν as [λ][μ][ν]
	A      [4]float64          // q A_μ (curved space; flat: see potential)
	// flat-space field for the potential
	field em.Field
	c     complex128
	x     [4]float64
	// RL is R_μνρσ in bivector form (spacetime.Point.RiemannLow); with
	// lowered set it is filled and R is not (bodyGeometry.lowered).
	RL      [6][6]float64
	lowered bool
	// ∇Riemann for the quadrupole (curved, order 3), lowered in
	// bivector form [λ][A][B] (spacetime.Point.DRiemannLow)
	DRL *[4][6][6]float64
	// charged records that F, Fm, DF and A hold a field; zeroed that they
	// have been cleared for a neutral probe in curved space.
	charged, zeroed bool
	// contracted: pt is in contracted mode, gam and RL are not filled
	// (gamFilled once gamma has filled gam); pt is the evaluated point.
	contracted, gamFilled bool
	pt                    *spacetime.Point
}

// gamma returns Γ^μ_αβ, filling it first in contracted mode.
func (l *bodyLocal) gamma() *[4][4][4]float64 {
	if !l.gamFilled {
		l.pt.FillGamma()
		l.gam, l.gamFilled = l.pt.Gamma, true
	}
	return &l.gam
}

// bodyGeometry evaluates bodyLocal, keeping the evaluator between calls.
type bodyGeometry struct {
	ev    *spacetime.Evaluator
	evM   spacetime.Metric
	evLin bool
	order int
	pt    spacetime.Point
	loc   bodyLocal
	// lowered selects the lowered Riemann tensor (and at order 3 its
	// lowered derivative) only (bodyLocal.RL, DRL; R is left unset):
	// enough for lorentzCurvature and quadrupole, the curvature terms of
	// the body.
	lowered bool
	evLow   bool
	// evNeutral: the evaluator was set up for a neutral probe, which
	// does not read the field gradient (Evaluator.SetFieldGradient).
	evNeutral bool
	// contracted requests the contracted mode of the evaluator
	// (spacetime.Evaluator.SetContracted) where the metric has one: the
	// body then reads the Christoffel symbols and the curvature only
	// through bodyLocal.christoffelUV and riemannS (and gamma); for the
	// Tulczyjew pole–dipole body without charge (Dixon.local).
	contracted, evCon bool
}

var etaDiag = [4][4]float64{{-1, 0, 0, 0}, {0, 1, 0, 0}, {0, 0, 1, 0}, {0, 0, 0, 1}}

// at fills the local data at x for the metric m (nil: flat, with field f
// and probe charges q, g) and returns it. order is 2, or 3 when ∇Riemann
// is needed.
func (b *bodyGeometry) at(m spacetime.Metric, lin bool, f em.Field, q, gm float64, x [4]float64) *bodyLocal {
	return b.atOrder(m, lin, f, q, gm, x, 2)
}

func (b *bodyGeometry) atOrder(m spacetime.Metric, lin bool, f em.Field, q, gm float64, x [4]float64, order int) *bodyLocal {
	l := &b.loc
	l.x = x
	if m == nil {
		b.flat(f, q, gm, x)
		return l
	}
	low := b.lowered
	neutral := q == 0
	con := b.contracted && low && neutral && order == 2
	if b.ev == nil || b.evLin != lin || b.order != order || b.evLow != low || b.evNeutral != neutral || b.evCon != con || !sameMetric(b.evM, m) {
		ln, ok := m.(spacetime.Linearizable)
		if lin && ok {
			b.ev = spacetime.NewLinearEvaluator(ln, order)
		} else {
			b.ev = spacetime.NewEvaluator(m, order)
		}
		b.ev.SetLowered(low)
		b.ev.SetFieldGradient(!neutral)
		b.ev.SetContracted(con)
		b.evM, b.evLin, b.order, b.evLow, b.evNeutral, b.evCon = m, lin, order, low, neutral, con
	}
	pt := &b.pt
	b.ev.Eval(x, pt)
	l.curved = true
	l.field = nil
	l.pt = pt
	l.g, l.gi, l.lowered = pt.G, pt.GInv, low
	l.contracted = pt.Contracted()
	if l.contracted {
		l.gamFilled = false
	} else {
		l.gam, l.RL, l.gamFilled = pt.Gamma, pt.RiemannLow, true
	}
	if !low {
		l.R = pt.Riemann
	}
	if l.contracted {
		l.sqrtg = 1 // Kerr–Schild: det(η + f l l) = −1 for null l
	} else {
		l.sqrtg = math.Sqrt(math.Abs(det4(&pt.G)))
	}
	if order >= 3 {
		l.DRL = &pt.DRiemannLow
	} else {
		l.DRL = nil
	}
	if q == 0 {
		// Neutral probe: no field work (the zero field set once).
		if l.charged || !l.zeroed {
			l.A, l.F, l.Fm, l.DF = [4]float64{}, [4][4]float64{}, [4][4]float64{}, [4][4][4]float64{}
			l.charged, l.zeroed = false, true
		}
		return l
	}
	l.charged = true
	for mu := 0; mu < 4; mu++ {
		l.A[mu] = q * pt.A[mu]
		for nu := 0; nu < 4; nu++ {
			l.F[mu][nu] = q * pt.F[mu][nu]
		}
	}
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			s := 0.0
			for a := 0; a < 4; a++ {
				s += l.gi[mu][a] * l.F[a][nu]
			}
			l.Fm[mu][nu] = s
		}
	}
	// ∇_λF_μν = ∂_λF_μν − Γ^κ_λμ F_κν − Γ^κ_λν F_μκ.
	for la := 0; la < 4; la++ {
		for mu := 0; mu < 4; mu++ {
			for nu := 0; nu < 4; nu++ {
				s := q * pt.DF[la][mu][nu]
				for k := 0; k < 4; k++ {
					s -= l.gam[k][la][mu]*l.F[k][nu] + l.gam[k][la][nu]*l.F[mu][k]
				}
				l.DF[la][mu][nu] = s
			}
		}
	}
	return l
}

// flat fills the local data of Minkowski space with the duality-rotated
// field Re[(q − ig)𝔽] of f.
func (b *bodyGeometry) flat(f em.Field, q, gm float64, x [4]float64) {
	l := &b.loc
	l.curved = false
	l.g, l.gi, l.sqrtg = etaDiag, etaDiag, 1
	l.field = f
	l.c = complex(q, -gm)
	l.F, l.Fm, l.DF = [4][4]float64{}, [4][4]float64{}, [4][4][4]float64{}
	l.DRL = nil
	l.contracted, l.gamFilled = false, true
	l.charged, l.zeroed = f != nil, false
	if f == nil {
		return
	}
	F, D := f.At(vec.Vec3{x[1], x[2], x[3]}.Lift())
	c := l.c
	var E, B [3]float64
	for i := 0; i < 3; i++ {
		v := c * F[i]
		E[i], B[i] = real(v), imag(v)
	}
	setEB(&l.F, E, B)
	// ∂_l of E_i and B_i: D[i][j] = ∂𝐅_i/∂x_j.
	for j := 0; j < 3; j++ {
		var dE, dB [3]float64
		for i := 0; i < 3; i++ {
			v := c * D[i][j]
			dE[i], dB[i] = real(v), imag(v)
		}
		setEB(&l.DF[j+1], dE, dB)
	}
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			l.Fm[mu][nu] = etaDiag[mu][mu] * l.F[mu][nu]
		}
	}
}

// setEB writes F_μν with F_i0 = E_i, F_ij = ε_ijk B_k.
func setEB(F *[4][4]float64, E, B [3]float64) {
	for i := 0; i < 3; i++ {
		F[i+1][0] = E[i]
		F[0][i+1] = -E[i]
	}
	F[1][2], F[2][1] = B[2], -B[2]
	F[2][3], F[3][2] = B[0], -B[0]
	F[3][1], F[1][3] = B[1], -B[1]
	F[0][0], F[1][1], F[2][2], F[3][3] = 0, 0, 0, 0
}

// potentialT returns q A_t at the event (flat: −Re[(q − ig)𝒱]).
func (l *bodyLocal) potentialT() float64 {
	if l.curved {
		return l.A[0]
	}
	if l.field == nil {
		return 0
	}
	return -real(l.c * l.field.Potential(vec.Vec3{l.x[1], l.x[2], l.x[3]}.Lift()))
}

// det4 returns the determinant of a 4 × 4 matrix, by the Laplace
// expansion in the 2 × 2 minors of the first two rows and of the last two
// (common practice).
func det4(m *[4][4]float64) float64 {
	s0 := m[0][0]*m[1][1] - m[1][0]*m[0][1]
	s1 := m[0][0]*m[1][2] - m[1][0]*m[0][2]
	s2 := m[0][0]*m[1][3] - m[1][0]*m[0][3]
	s3 := m[0][1]*m[1][2] - m[1][1]*m[0][2]
	s4 := m[0][1]*m[1][3] - m[1][1]*m[0][3]
	s5 := m[0][2]*m[1][3] - m[1][2]*m[0][3]
	c5 := m[2][2]*m[3][3] - m[3][2]*m[2][3]
	c4 := m[2][1]*m[3][3] - m[3][1]*m[2][3]
	c3 := m[2][1]*m[3][2] - m[3][1]*m[2][2]
	c2 := m[2][0]*m[3][3] - m[3][0]*m[2][3]
	c1 := m[2][0]*m[3][2] - m[3][0]*m[2][2]
	c0 := m[2][0]*m[3][1] - m[3][0]*m[2][1]
	return s0*c5 - s1*c4 + s2*c3 + s3*c2 - s4*c1 + s5*c0
}

type perm4 struct {
	i    [4]int
	sign float64
}

// perms4 lists the 24 permutations of (0, 1, 2, 3) with their signs: the
// non-zero entries of the Levi-Civita symbol [μνρσ], [0123] = +1.
var perms4 = func() []perm4 {
	var out []perm4
	for a := 0; a < 4; a++ {
		for b := 0; b < 4; b++ {
			for c := 0; c < 4; c++ {
				for d := 0; d < 4; d++ {
					if a == b || a == c || a == d || b == c || b == d || c == d {
						continue
					}
					idx := [4]int{a, b, c, d}
					out = append(out, perm4{idx, vec.Levi(a, b, c, d)})
				}
			}
		}
	}
	return out
}()

// bodyState is the pole–dipole state at one event.
type bodyState struct {
	p, a   [4]float64    // p^μ, a^μ
	pl, al [4]float64    // p_μ, a_μ
	mass   float64       // 𝓜 = √(−p·p)
	S      [4][4]float64 // S^{μν} = ε^{μνρσ} p_ρ a_σ
	Sm     [4][4]float64 // S^μ_ν = S^{μα} g_αν
}

func lowerVec(g *[4][4]float64, v [4]float64) (out [4]float64) {
	for m := 0; m < 4; m++ {
		out[m] = g[m][0]*v[0] + g[m][1]*v[1] + g[m][2]*v[2] + g[m][3]*v[3]
	}
	return out
}

func (b *bodyState) dot(l *bodyLocal, x, y [4]float64) float64 {
	xl := lowerVec(&l.g, x)
	return xl[0]*y[0] + xl[1]*y[1] + xl[2]*y[2] + xl[3]*y[3]
}

// load fills the state from y at the local geometry l.
func (b *bodyState) load(l *bodyLocal, y []float64) {
	for i := 0; i < 4; i++ {
		b.p[i] = y[IP+i]
		if len(y) > IA+i {
			b.a[i] = y[IA+i]
		}
	}
	b.pl = lowerVec(&l.g, b.p)
	b.al = lowerVec(&l.g, b.a)
	pp := b.pl[0]*b.p[0] + b.pl[1]*b.p[1] + b.pl[2]*b.p[2] + b.pl[3]*b.p[3]
	b.mass = math.Sqrt(-pp)
	// S^{μν} = ε^{μνρσ} p_ρ a_σ with ε^{μνρσ} = −[μνρσ]/√−g: for each
	// pair μ < ν, with (ρ, σ) the complementary pair in the order that
	// makes [μνρσ] = +1, S^{μν} = −(p_ρ a_σ − p_σ a_ρ)/√−g.
	is := -1 / l.sqrtg
	w := func(r, s int) float64 { return is * (b.pl[r]*b.al[s] - b.pl[s]*b.al[r]) }
	s01, s02, s03 := w(2, 3), w(3, 1), w(1, 2)
	s12, s13, s23 := w(0, 3), w(2, 0), w(0, 1)
	b.S = [4][4]float64{
		{0, s01, s02, s03},
		{-s01, 0, s12, s13},
		{-s02, -s12, 0, s23},
		{-s03, -s13, -s23, 0},
	}
	if l.contracted {
		// g = η + f l l: S^μ_ν = S^{μν} η_νν + f (S l)^μ l_ν.
		f, kl, _ := l.pt.KerrSchild()
		for mu := 0; mu < 4; mu++ {
			S := &b.S[mu]
			sl := f * (S[0]*kl[0] + S[1]*kl[1] + S[2]*kl[2] + S[3]*kl[3])
			b.Sm[mu] = [4]float64{-S[0] + sl*kl[0], S[1] + sl*kl[1], S[2] + sl*kl[2], S[3] + sl*kl[3]}
		}
		return
	}
	g := &l.g
	for mu := 0; mu < 4; mu++ {
		S := &b.S[mu]
		for nu := 0; nu < 4; nu++ {
			b.Sm[mu][nu] = g[nu][0]*S[0] + g[nu][1]*S[1] + g[nu][2]*S[2] + g[nu][3]*S[3]
		}
	}
}

// dipole writes the u-independent dipole force f₀^μ = ½ κ g^{μλ} S^{αβ}
// ∇_λF_αβ and the torque T^{μν} = κ (S^{μκ}F^ν_κ − S^{νκ}F^μ_κ).
func (b *bodyState) dipole(l *bodyLocal, kappa float64, f0 *[4]float64, T *[4][4]float64) {
	if kappa == 0 || !l.charged {
		return // no field at the body: F, ∇F zero
	}
	var fl [4]float64
	for la := 0; la < 4; la++ {
		s := 0.0
		for al := 0; al < 4; al++ {
			for be := al + 1; be < 4; be++ {
				s += b.S[al][be] * l.DF[la][al][be]
			}
		}
		fl[la] = kappa * s // ½ Σ over both orders = Σ over α < β
	}
	for mu := 0; mu < 4; mu++ {
		f0[mu] += l.gi[mu][0]*fl[0] + l.gi[mu][1]*fl[1] + l.gi[mu][2]*fl[2] + l.gi[mu][3]*fl[3]
	}
	for mu := 0; mu < 4; mu++ {
		for nu := mu + 1; nu < 4; nu++ {
			s := 0.0
			for k := 0; k < 4; k++ {
				s += b.S[mu][k]*l.Fm[nu][k] - b.S[nu][k]*l.Fm[mu][k]
			}
			T[mu][nu] += kappa * s
			T[nu][mu] -= kappa * s
		}
	}
}

// quadrupole adds the force and torque of the spin-induced quadrupole of
// coefficient C to f₀ and T (curved space, l.DRL filled): with
// P^{αβ} = p^α a^β − p^β a^α and the reduced quadrupole
//
//	J^{αβγδ} = (3C/𝓜) p^{[α}a^{β]} a^{[γ}p^{δ]} = −(3C/(4𝓜)) P^{αβ} P^{γδ},
//
// the force −(1/6) J^{αβγδ} ∇^μR_αβγδ and the torque
// (4/3) J^{αβγ[μ} R^{ν]}_{γαβ} (Dixon 1970; Steinhoff & Puetzfeld 2010,
// Phys. Rev. D 81, 044019; from memory):
//
//	f^μ    = (C/(8𝓜)) g^{μλ} P^{αβ} P^{γδ} ∇_λR_αβγδ,
//	T^{μν} = −(C/(2𝓜)) (P^{γμ} Y^ν_γ − P^{γν} Y^μ_γ),   Y^ν_γ = P^{αβ} R^ν_{γαβ}.
//
// At p = m u this is the interaction L = (C/2m) R_μανβ u^α u^β S^μ S^ν:
// f = ½Cm ∇R(a, u, a, u).
func (b *bodyState) quadrupole(l *bodyLocal, C float64, f0 *[4]float64, T *[4][4]float64) {
	var P [4][4]float64
	var Pb [6]float64 // P^{αβ} on the bivectors α < β
	for A, pr := range spacetime.Bivectors {
		al, be := pr[0], pr[1]
		v := b.p[al]*b.a[be] - b.p[be]*b.a[al]
		P[al][be], P[be][al] = v, -v
		Pb[A] = v
	}
	// P^{αβ}P^{γδ} ∇_λR_αβγδ = 4 Σ_{A,B} P^A P^B ∇_λR_AB, and
	// Z_κγ = P^{αβ} R_κγαβ = 2 Σ_B R_[κγ]B P^B.
	var X [4]float64
	for la := 0; la < 4; la++ {
		D := &l.DRL[la]
		s := 0.0
		for A := 0; A < 6; A++ {
			R := &D[A]
			s += Pb[A] * (R[0]*Pb[0] + R[1]*Pb[1] + R[2]*Pb[2] + R[3]*Pb[3] + R[4]*Pb[4] + R[5]*Pb[5])
		}
		X[la] = 4 * s
	}
	c := C / (8 * b.mass)
	for mu := 0; mu < 4; mu++ {
		f0[mu] += c * (l.gi[mu][0]*X[0] + l.gi[mu][1]*X[1] + l.gi[mu][2]*X[2] + l.gi[mu][3]*X[3])
	}
	var Zl [4][4]float64 // Z_κγ
	for A, pr := range spacetime.Bivectors {
		R := &l.RL[A]
		v := 2 * (R[0]*Pb[0] + R[1]*Pb[1] + R[2]*Pb[2] + R[3]*Pb[3] + R[4]*Pb[4] + R[5]*Pb[5])
		Zl[pr[0]][pr[1]], Zl[pr[1]][pr[0]] = v, -v
	}
	var Y [4][4]float64 // Y^ν_γ = g^{νκ} Z_κγ
	for nu := 0; nu < 4; nu++ {
		g := &l.gi[nu]
		for ga := 0; ga < 4; ga++ {
			Y[nu][ga] = g[0]*Zl[0][ga] + g[1]*Zl[1][ga] + g[2]*Zl[2][ga] + g[3]*Zl[3][ga]
		}
	}
	ct := -C / (2 * b.mass)
	for mu := 0; mu < 4; mu++ {
		for nu := mu + 1; nu < 4; nu++ {
			s := 0.0
			for g := 0; g < 4; g++ {
				s += P[g][mu]*Y[nu][g] - P[g][nu]*Y[mu][g]
			}
			T[mu][nu] += ct * s
			T[nu][mu] -= ct * s
		}
	}
}

// lorentzCurvature writes the u-linear force operator
// C^μ_λ = q F^μ_λ − ½ R^μ_{λρσ} S^{ρσ}.
func (b *bodyState) lorentzCurvature(l *bodyLocal, C *[4][4]float64) {
	if l.curved && l.lowered {
		// W_κλ = ½ R_κλρσ S^{ρσ} = Σ_B RL[κλ][B] S^B over the bivectors
		// B = (ρ < σ), then C^μ_λ = q F^μ_λ − g^{μκ} W_κλ.
		var Wb [6]float64
		if l.contracted {
			Wb = l.pt.RiemannS(&b.S)
		} else {
			var sb [6]float64
			for B, pr := range spacetime.Bivectors {
				sb[B] = b.S[pr[0]][pr[1]]
			}
			for A := 0; A < 6; A++ {
				R := &l.RL[A]
				Wb[A] = R[0]*sb[0] + R[1]*sb[1] + R[2]*sb[2] + R[3]*sb[3] + R[4]*sb[4] + R[5]*sb[5]
			}
		}
		var W [4][4]float64
		for A, pr := range spacetime.Bivectors {
			W[pr[0]][pr[1]], W[pr[1]][pr[0]] = Wb[A], -Wb[A]
		}
		if l.contracted {
			// g^{μκ} = η^{μκ} − f l^μ l^κ (the field is zero here).
			f, kl, _ := l.pt.KerrSchild()
			lu := [4]float64{-kl[0], kl[1], kl[2], kl[3]}
			var lW [4]float64 // f l^κ W_κλ
			for la := 0; la < 4; la++ {
				lW[la] = f * (lu[0]*W[0][la] + lu[1]*W[1][la] + lu[2]*W[2][la] + lu[3]*W[3][la])
			}
			for mu := 0; mu < 4; mu++ {
				e := 1.0
				if mu == 0 {
					e = -1
				}
				for la := 0; la < 4; la++ {
					C[mu][la] += lu[mu]*lW[la] - e*W[mu][la]
				}
			}
			return
		}
		for mu := 0; mu < 4; mu++ {
			g := &l.gi[mu]
			for la := 0; la < 4; la++ {
				C[mu][la] += l.Fm[mu][la] - (g[0]*W[0][la] + g[1]*W[1][la] + g[2]*W[2][la] + g[3]*W[3][la])
			}
		}
		return
	}
	for mu := 0; mu < 4; mu++ {
		for la := 0; la < 4; la++ {
			s := l.Fm[mu][la]
			if l.curved {
				R := &l.R[mu][la]
				for r := 0; r < 4; r++ {
					for sg := r + 1; sg < 4; sg++ {
						s -= R[r][sg] * b.S[r][sg]
					}
				}
			}
			C[mu][la] += s
		}
	}
}

// velocityCorrection solves the Tulczyjew momentum–velocity relation for
// w = u − p/𝓜 (see Dixon):
//
//	(𝓜² δ + S C) w = −T p − S (f₀ + C p/𝓜)   (S acting on lower indices),
//
// in closed form. S^{μν} = ε^{μνρσ} p_ρ a_σ is a simple bivector, so that
// for any antisymmetric X, S X S = −σ_X S with σ_X = ½ S^{αβ} X_αβ
// (write S = u ∧ v); C_νλ is antisymmetric, hence M = S C obeys
// M² = −σ M with σ = ½ S^{αβ} C_αβ = −½ tr M, and
//
//	(𝓜² δ + M)⁻¹ = (δ − M/(𝓜² − σ))/𝓜²
//
// (ours; in pure gravity this is the closed form of the Tulczyjew
// velocity, Ehlers & Rudolph 1977, Kyrian & Semerák 2007, MNRAS 382,
// 1922, from memory). Tested against gonum's LU solution.
func (b *bodyState) velocityCorrection(l *bodyLocal, f0 *[4]float64, T, C *[4][4]float64) [4]float64 {
	M := b.mass
	iM := 1 / M
	var X, rhs, Cr, w [4]float64
	for mu := 0; mu < 4; mu++ {
		X[mu] = f0[mu] + (C[mu][0]*b.p[0]+C[mu][1]*b.p[1]+C[mu][2]*b.p[2]+C[mu][3]*b.p[3])*iM
	}
	trM := 0.0
	for mu := 0; mu < 4; mu++ {
		sm, tm := &b.Sm[mu], &T[mu]
		rhs[mu] = -(tm[0]*b.pl[0] + tm[1]*b.pl[1] + tm[2]*b.pl[2] + tm[3]*b.pl[3] +
			sm[0]*X[0] + sm[1]*X[1] + sm[2]*X[2] + sm[3]*X[3])
		trM += sm[0]*C[0][mu] + sm[1]*C[1][mu] + sm[2]*C[2][mu] + sm[3]*C[3][mu]
	}
	for nu := 0; nu < 4; nu++ {
		Cr[nu] = C[nu][0]*rhs[0] + C[nu][1]*rhs[1] + C[nu][2]*rhs[2] + C[nu][3]*rhs[3]
	}
	iM2 := iM * iM
	c := iM2 / (M*M + 0.5*trM) // 1/(𝓜²(𝓜² − σ))
	for mu := 0; mu < 4; mu++ {
		sm := &b.Sm[mu]
		w[mu] = rhs[mu]*iM2 - c*(sm[0]*Cr[0]+sm[1]*Cr[1]+sm[2]*Cr[2]+sm[3]*Cr[3])
	}
	return w
}

// velocityFirstOrder returns the first-order part of w,
// −(T p + S (f₀ + C p/𝓜))/𝓜².
func (b *bodyState) velocityFirstOrder(l *bodyLocal, f0 *[4]float64, T, C *[4][4]float64) [4]float64 {
	M := b.mass
	var X, w [4]float64
	for mu := 0; mu < 4; mu++ {
		X[mu] = f0[mu] + (C[mu][0]*b.p[0]+C[mu][1]*b.p[1]+C[mu][2]*b.p[2]+C[mu][3]*b.p[3])/M
	}
	for mu := 0; mu < 4; mu++ {
		s := 0.0
		for nu := 0; nu < 4; nu++ {
			s -= T[mu][nu]*b.pl[nu] + b.Sm[mu][nu]*X[nu]
		}
		w[mu] = s / (M * M)
	}
	return w
}

// derivatives writes dy/dτ from the force parts and the velocity
// correction w.
func (b *bodyState) derivatives(l *bodyLocal, f0 *[4]float64, T, C *[4][4]float64, w *[4]float64, dy []float64) {
	M := b.mass
	var u, f [4]float64
	for mu := 0; mu < 4; mu++ {
		u[mu] = b.p[mu]/M + w[mu]
	}
	for mu := 0; mu < 4; mu++ {
		f[mu] = f0[mu] + C[mu][0]*u[0] + C[mu][1]*u[1] + C[mu][2]*u[2] + C[mu][3]*u[3]
	}
	fl := lowerVec(&l.g, f)
	fa := fl[0]*b.a[0] + fl[1]*b.a[1] + fl[2]*b.a[2] + fl[3]*b.a[3]
	fp := fl[0]*b.p[0] + fl[1]*b.p[1] + fl[2]*b.p[2] + fl[3]*b.p[3]
	iM2 := 1 / (M * M)
	// Torque part of the spin-vector equation, lower index:
	// −(1/(2𝓜²)) ε_{κβρσ} p^β T^{ρσ}, ε_{κβρσ} = √−g [κβρσ].
	var tl [4]float64
	if *T != ([4][4]float64{}) {
		for k := range perms4 {
			pm := &perms4[k]
			i := &pm.i
			if t := T[i[2]][i[3]]; t != 0 {
				tl[i[0]] += pm.sign * b.p[i[1]] * t
			}
		}
	}
	c := -0.5 * l.sqrtg * iM2
	for mu := 0; mu < 4; mu++ {
		ta := c * (l.gi[mu][0]*tl[0] + l.gi[mu][1]*tl[1] + l.gi[mu][2]*tl[2] + l.gi[mu][3]*tl[3])
		dy[IX+mu] = u[mu]
		dy[IP+mu] = f[mu]
		dy[IA+mu] = (b.p[mu]*fa+b.a[mu]*fp)*iM2 + ta
	}
	if l.contracted {
		gp, ga := l.pt.ChristoffelUV2(&u, &b.p, &b.a)
		for mu := 0; mu < 4; mu++ {
			dy[IP+mu] -= gp[mu]
			dy[IA+mu] -= ga[mu]
		}
	} else if l.curved {
		for mu := 0; mu < 4; mu++ {
			G := &l.gam[mu]
			var gp, ga float64
			for al := 0; al < 4; al++ {
				if u[al] == 0 {
					continue
				}
				gp += u[al] * (G[al][0]*b.p[0] + G[al][1]*b.p[1] + G[al][2]*b.p[2] + G[al][3]*b.p[3])
				ga += u[al] * (G[al][0]*b.a[0] + G[al][1]*b.a[1] + G[al][2]*b.a[2] + G[al][3]*b.a[3])
			}
			dy[IP+mu] -= gp
			dy[IA+mu] -= ga
		}
	}
}

// killingT returns ∇_μ ξ_ν for ξ = ∂_t: Γ_{νμt} = g_{νκ} Γ^κ_{μt}.
func (l *bodyLocal) killingT() (K [4][4]float64) {
	if !l.curved {
		return K
	}
	gam := l.gamma()
	for mu := 0; mu < 4; mu++ {
		for nu := 0; nu < 4; nu++ {
			s := 0.0
			for k := 0; k < 4; k++ {
				s += l.g[nu][k] * gam[k][mu][0]
			}
			K[mu][nu] = s
		}
	}
	return K
}

// killingPhi returns ξ^μ and ∇_μ ξ_ν for ξ = ∂_φ = x∂_y − y∂_x.
func (l *bodyLocal) killingPhi() (xi [4]float64, K [4][4]float64) {
	xi = [4]float64{0, -l.x[2], l.x[1], 0}
	// ∇_μ ξ^κ = ∂_μ ξ^κ + Γ^κ_μλ ξ^λ.
	var D [4][4]float64 // [μ][κ]
	D[1][2], D[2][1] = 1, -1
	if l.curved {
		gam := l.gamma()
		for mu := 0; mu < 4; mu++ {
			for k := 0; k < 4; k++ {
				D[mu][k] += gam[k][mu][1]*xi[1] + gam[k][mu][2]*xi[2]
			}
		}
	}
	for mu := 0; mu < 4; mu++ {
		K[mu] = lowerVec(&l.g, D[mu])
	}
	return xi, K
}

// energy returns E = −p_t − q A_t − ½ S^{μν} ∇_μ ξ_ν, ξ = ∂_t.
func (b *bodyState) energy(l *bodyLocal) float64 {
	E := -b.pl[0] - l.potentialT()
	if l.curved {
		K := l.killingT()
		E -= halfContract(&b.S, &K)
	}
	return E
}

// angularMomentumZ returns Q_ξ for ξ = ∂_φ: ξ_μ p^μ + q ξ^μ A_μ +
// ½ S^{μν}∇_μ ξ_ν. In flat space the vector potential of a root-Kerr
// source is included through flatVectorPotential.
func (b *bodyState) angularMomentumZ(l *bodyLocal) float64 {
	xi, K := l.killingPhi()
	J := xi[1]*b.pl[1] + xi[2]*b.pl[2] + halfContract(&b.S, &K)
	if l.curved {
		J += xi[1]*l.A[1] + xi[2]*l.A[2]
	} else if A, ok := flatVectorPotential(l); ok {
		J += xi[1]*A[1] + xi[2]*A[2]
	}
	return J
}

// flatVectorPotential returns q A_μ of a flat-space field whose vector
// potential is known in closed form: the Coulomb field (zero) and the
// electric root-Kerr field with spin along z (the Kerr–Newman potential at
// zero mass, Kerr–Schild gauge, A_μ = −(Q r³/(r⁴ + a²z²)) l_μ).
func flatVectorPotential(l *bodyLocal) ([4]float64, bool) {
	var A [4]float64
	switch f := l.field.(type) {
	case em.Coulomb:
		return A, true
	case em.RootKerr:
		if f.P != 0 || f.A[0] != 0 || f.A[1] != 0 || imag(l.c) != 0 {
			return A, false
		}
		var ks spacetime.KerrSchildPoint
		spacetime.KerrNewman{A: f.A[2], Q: f.Q}.KerrSchild(l.x, &ks)
		for m := 0; m < 4; m++ {
			A[m] = real(l.c) * ks.S * ks.L[m]
		}
		return A, true
	}
	return A, false
}

// halfContract returns ½ S^{μν} K_μν.
func halfContract(S, K *[4][4]float64) float64 {
	s := 0.0
	for mu := 0; mu < 4; mu++ {
		for nu := mu + 1; nu < 4; nu++ {
			s += S[mu][nu] * (K[mu][nu] - K[nu][mu]) / 2
		}
	}
	return s
}

// massFunction returns 𝓜 + ½ κ S^{αβ} F_αβ, the mass function conserved by
// the Dixon body (see Dixon), and with the spin-induced quadrupole of
// coefficient C (curved space) also − (1/6) J^{αβγδ}R_αβγδ =
// (C/(8𝓜)) P^{αβ}P^{γδ}R_αβγδ (see quadrupole), conserved to O(S⁴).
func (b *bodyState) massFunctionQ(l *bodyLocal, kappa, C float64) float64 {
	m := b.massFunction(l, kappa)
	if C == 0 || !l.curved {
		return m
	}
	var Pb [6]float64 // P^{αβ} on the bivectors
	for A, pr := range spacetime.Bivectors {
		Pb[A] = b.p[pr[0]]*b.a[pr[1]] - b.p[pr[1]]*b.a[pr[0]]
	}
	Z := 0.0 // P^{κβ}P^{γδ}R_κβγδ = 4 Σ_{A,B} P^A P^B R_AB
	for A := 0; A < 6; A++ {
		R := &l.RL[A]
		Z += 4 * Pb[A] * (R[0]*Pb[0] + R[1]*Pb[1] + R[2]*Pb[2] + R[3]*Pb[3] + R[4]*Pb[4] + R[5]*Pb[5])
	}
	return m + C*Z/(8*b.mass)
}

// massFunction returns 𝓜 + ½ κ S^{αβ} F_αβ (see massFunctionQ).
func (b *bodyState) massFunction(l *bodyLocal, kappa float64) float64 {
	s := 0.0
	for al := 0; al < 4; al++ {
		for be := al + 1; be < 4; be++ {
			s += b.S[al][be] * l.F[al][be]
		}
	}
	return b.mass + kappa*s
}

// neutralContracted writes dy/dτ of the neutral Tulczyjew pole–dipole body
// (no field, no quadrupole, no further multipoles: f₀ = 0, T = 0) at a
// geometry in contracted mode (g = η + f l l), and returns 1/𝓜 and the
// velocity correction w. It is bodyState.load, lorentzCurvature,
// velocityCorrection and derivatives of that case with the metric kept
// out of the algebra: with W_κλ = ½ R_κλρσ S^{ρσ} (lower indices, on the
// bivectors) the force operator is C^μ_λ = −g^{μκ} W_κλ, so that
// S^μ_ν C^ν_λ = −S^{μκ} W_κλ and
//
//	w = (S W p)/𝓜³ + S W (S W p)/(𝓜³ (𝓜² + ½ S^{αβ}W_αβ)),
//	f_μ = −(W u)_μ,   f^μ = −η^{μκ}(W u)_κ + f l^μ (l^κ (W u)_κ),
//
// (S W v)^μ = S^{μκ} W_κλ v^λ: the closed form of velocityCorrection with
// σ = −½ S^{αβ}W_αβ, the same numbers up to rounding; every product of an
// antisymmetric tensor with a vector runs over its 6 components.
func neutralContracted(l *bodyLocal, y, dy []float64) (alpha float64, w [4]float64) {
	_ = y[IA+3]
	_ = dy[IA+3]
	f, kl, _ := l.pt.KerrSchild()
	p := [4]float64{y[IP], y[IP+1], y[IP+2], y[IP+3]}
	a := [4]float64{y[IA], y[IA+1], y[IA+2], y[IA+3]}
	flp := f * (kl[0]*p[0] + kl[1]*p[1] + kl[2]*p[2] + kl[3]*p[3])
	fla := f * (kl[0]*a[0] + kl[1]*a[1] + kl[2]*a[2] + kl[3]*a[3])
	pl := [4]float64{-p[0] + flp*kl[0], p[1] + flp*kl[1], p[2] + flp*kl[2], p[3] + flp*kl[3]}
	al := [4]float64{-a[0] + fla*kl[0], a[1] + fla*kl[1], a[2] + fla*kl[2], a[3] + fla*kl[3]}
	M := math.Sqrt(-(pl[0]*p[0] + pl[1]*p[1] + pl[2]*p[2] + pl[3]*p[3]))
	// S^{μν} = ε^{μνρσ} p_ρ a_σ, √−g = 1 (see bodyState.load).
	S := [6]float64{
		pl[3]*al[2] - pl[2]*al[3], pl[1]*al[3] - pl[3]*al[1], pl[2]*al[1] - pl[1]*al[2],
		pl[3]*al[0] - pl[0]*al[3], pl[0]*al[2] - pl[2]*al[0], pl[1]*al[0] - pl[0]*al[1],
	}
	W := l.pt.RiemannBivector(&S)
	s01, s02, s03, s12, s13, s23 := S[0], S[1], S[2], S[3], S[4], S[5]
	w01, w02, w03, w12, w13, w23 := W[0], W[1], W[2], W[3], W[4], W[5]
	iM := 1 / M
	iM2 := iM * iM
	sw := s01*w01 + s02*w02 + s03*w03 + s12*w12 + s13*w13 + s23*w23
	// Products of the antisymmetric S and W with vectors written out
	// (X v)_μ = Σ_ν X_μν v_ν over the 6 components (a function for them
	// is not inlined).
	p0, p1, p2, p3 := p[0], p[1], p[2], p[3]
	wp0 := w01*p1 + w02*p2 + w03*p3 // (W p)_κ
	wp1 := -w01*p0 + w12*p2 + w13*p3
	wp2 := -w02*p0 - w12*p1 + w23*p3
	wp3 := -w03*p0 - w13*p1 - w23*p2
	// r = S W p/𝓜: 𝓜 × the right-hand side −T p − S (f₀ + C p/𝓜)
	r0 := (s01*wp1 + s02*wp2 + s03*wp3) * iM
	r1 := (-s01*wp0 + s12*wp2 + s13*wp3) * iM
	r2 := (-s02*wp0 - s12*wp1 + s23*wp3) * iM
	r3 := (-s03*wp0 - s13*wp1 - s23*wp2) * iM
	wr0 := w01*r1 + w02*r2 + w03*r3 // (W r)_κ
	wr1 := -w01*r0 + w12*r2 + w13*r3
	wr2 := -w02*r0 - w12*r1 + w23*r3
	wr3 := -w03*r0 - w13*r1 - w23*r2
	c := iM2 / (M*M + sw)
	w = [4]float64{
		r0*iM2 + c*(s01*wr1+s02*wr2+s03*wr3),
		r1*iM2 + c*(-s01*wr0+s12*wr2+s13*wr3),
		r2*iM2 + c*(-s02*wr0-s12*wr1+s23*wr3),
		r3*iM2 + c*(-s03*wr0-s13*wr1-s23*wr2),
	}
	u := [4]float64{p0*iM + w[0], p1*iM + w[1], p2*iM + w[2], p3*iM + w[3]}
	wu0 := w01*u[1] + w02*u[2] + w03*u[3] // (W u)_κ
	wu1 := -w01*u[0] + w12*u[2] + w13*u[3]
	wu2 := -w02*u[0] - w12*u[1] + w23*u[3]
	wu3 := -w03*u[0] - w13*u[1] - w23*u[2]
	lw := f * (-kl[0]*wu0 + kl[1]*wu1 + kl[2]*wu2 + kl[3]*wu3)
	F := [4]float64{wu0 - lw*kl[0], -wu1 + lw*kl[1], -wu2 + lw*kl[2], -wu3 + lw*kl[3]}
	fa := -(wu0*a[0] + wu1*a[1] + wu2*a[2] + wu3*a[3])
	fp := -(wu0*p0 + wu1*p1 + wu2*p2 + wu3*p3)
	gp, ga := l.pt.ChristoffelUV2(&u, &p, &a)
	for mu := 0; mu < 4; mu++ {
		dy[IX+mu] = u[mu]
		dy[IP+mu] = F[mu] - gp[mu]
		dy[IA+mu] = (p[mu]*fa+a[mu]*fp)*iM2 - ga[mu]
	}
	return iM, w
}
