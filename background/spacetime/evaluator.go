package spacetime

import (
	"ricochet/background/jet"
)

// Metric is a stationary spacetime given by its metric in asymptotically
// Cartesian coordinates (t, x, y, z).
type Metric interface {
	// Eval writes the metric g_μν(x) (all 16 entries, symmetric) and the
	// electromagnetic potential A_μ(x) (zero if uncharged) in jet
	// arithmetic. The coordinate jets x[μ] are the independent variables
	// x^μ expanded about the event, all of one order K; the outputs must
	// have order K.
	Eval(x *[4]jet.Jet, g *[4][4]jet.Jet, A *[4]jet.Jet)
	// Name returns a short human-readable description with parameters.
	Name() string
}

// Linearizable is a Metric that also knows its linearization about flat
// space, first order in the couplings (what "first order" keeps is stated
// by each family).
type Linearizable interface {
	Metric
	// EvalLinear writes the first-order perturbation h_μν = g_μν − η_μν
	// and the first-order potential A_μ, with the conventions of Eval.
	EvalLinear(x *[4]jet.Jet, h *[4][4]jet.Jet, A *[4]jet.Jet)
}

// Point holds the geometry at one event, exact to rounding.
type Point struct {
	G, GInv [4][4]float64       // g_μν, g^μν
	Gamma   [4][4][4]float64    // Γ^μ_αβ as [μ][α][β]
	Riemann [4][4][4][4]float64 // R^μ_νρσ as [μ][ν][ρ][σ] (filled when order ≥ 2, see SetLowered)
	// RiemannLow is R_μνρσ in bivector form: RiemannLow[A][B] =
	// R_{μν ρσ} with (μ, ν) = Bivectors[A], (ρ, σ) = Bivectors[B]
	// (filled when order ≥ 2; symmetric in A, B).
	RiemannLow [6][6]float64
	// DRiemann is ∇_λR^μ_νρσ stored as [λ][μ][ν][ρ][σ] (filled when
	// order ≥ 3).
	DRiemann [4][4][4][4][4]float64
	// DRiemannLow is ∇_λR_μνρσ in bivector form, [λ][A][B] as
	// RiemannLow (filled when order ≥ 3).
	DRiemannLow [4][6][6]float64
	A           [4]float64       // A_μ
	F           [4][4]float64    // F_μν = ∂_μA_ν − ∂_νA_μ
	DF          [4][4][4]float64 // ∂_λF_μν as [λ][μ][ν] (filled when order ≥ 2)
	con         contracted       // contracted mode (SetContracted)
}

// Evaluator evaluates a Metric and its derived tensors at events. It holds
// all work storage, so Eval allocates nothing after its first call; an
// Evaluator must not be used by several goroutines at once.
//
// For the metrics of this package (KerrNewman, DyonicKerrNewman,
// KerrNewmanNUT and their rotations) Eval takes a fast path: the metric in static Taylor arithmetic
// in the three spatial coordinates and the curvature from its closed-form
// expressions in the metric derivatives (evalstatic.go); for KerrNewman at
// order 2 the curvature itself is in closed form (the type D Weyl tensor
// and the Maxwell stress, kerrcurv.go), with g^μν = η^μν − f l^μ l^ν
// exact and first derivatives of the metric only. Other metrics are
// differentiated in jet arithmetic. All paths agree to rounding (tested).
type Evaluator struct {
	m     Metric
	lin   Linearizable // non-nil in linear mode
	order int
	sm    staticMetric // non-nil: fast path
	// lowered: at order 2 fill RiemannLow only (SetLowered).
	lowered bool
	// noFieldGradient: DF is not needed (SetFieldGradient).
	noFieldGradient bool
	// contracted: contracted mode where available (SetContracted).
	contracted bool
	sw         *staticWork
	jw         *jetWork // allocated on first use of the jet path
}

// jetWork is the work storage of the jet path.
type jetWork struct {
	x      [4]jet.Jet
	g      [4][4]jet.Jet       // metric (or h in linear mode), order K
	a      [4]jet.Jet          // potential, order K
	gt     [4][4]jet.Jet       // metric truncated to order K−1
	ginv   [4][4]jet.Jet       // inverse metric, order K−1
	dg     [4][4][4]jet.Jet    // ∂_λ g_μν as [λ][μ][ν], order K−1
	gamL   [4][4][4]jet.Jet    // Γ_ναβ, order K−1
	gam    [4][4][4]jet.Jet    // Γ^μ_αβ, order K−1
	gamT   [4][4][4]jet.Jet    // Γ^μ_αβ truncated to order K−2
	riem   [4][4][4][4]jet.Jet // R^μ_νρσ, order K−2
	t1, t2 jet.Jet
}

// NewEvaluator returns an Evaluator of the exact geometry of m. The order
// selects what Eval fills: 1: G, GInv, Gamma, A, F; 2: also Riemann and DF;
// 3: also DRiemann. It panics if order is not 1, 2 or 3.
func NewEvaluator(m Metric, order int) *Evaluator {
	if order < 1 || order > 3 {
		panic("spacetime: evaluator order must be 1, 2 or 3")
	}
	e := &Evaluator{m: m, order: order}
	if sm, ok := m.(staticMetric); ok {
		e.sm, e.sw = sm, new(staticWork)
	}
	return e
}

// newJetEvaluator returns an Evaluator that always takes the jet path (the
// reference for the fast path in the tests).
func newJetEvaluator(m Metric, order int, linear bool) *Evaluator {
	e := NewEvaluator(m, order)
	e.sm, e.sw = nil, nil
	if linear {
		e.lin = m.(Linearizable)
	}
	return e
}

// NewLinearEvaluator returns an Evaluator of the geometry of m to first
// order in the couplings: with g = η + h and h the family's first-order
// perturbation (Linearizable.EvalLinear),
//
//	G        = η + h,   GInv = η − η h η
//	Γ^μ_αβ   = ½ η^{μν}(∂_α h_νβ + ∂_β h_να − ∂_ν h_αβ)
//	R^μ_νρσ  = ∂_ρΓ^μ_νσ − ∂_σΓ^μ_νρ       (ΓΓ terms are second order)
//	∇_λR     = ∂_λR                        (ΓR terms are second order)
//
// and A, F, DF from the first-order potential.
func NewLinearEvaluator(m Linearizable, order int) *Evaluator {
	e := NewEvaluator(m, order)
	e.lin = m
	return e
}

// Bivectors lists the index pairs μ < ν in the order of Point.RiemannLow.
var Bivectors = bivectors

// SetLowered selects, for lowered true, that Eval fills Point.RiemannLow
// (and at order 3 Point.DRiemannLow) but leaves Point.Riemann (and
// Point.DRiemann) unchanged on the fast path: the contractions a
// pole–dipole(–quadrupole) body needs, R_μνρσ S^{ρσ} and
// P^{αβ}P^{γδ}∇_λR_αβγδ, come from the lowered components directly, and
// raising all of them is most of the remaining cost. The jet path always
// fills both.
func (e *Evaluator) SetLowered(lowered bool) { e.lowered = lowered }

// SetFieldGradient selects, for need false, that Eval may leave
// Point.DF zero when the field is not zero (a neutral probe does not read
// it): the Kerr–Newman–Taub–NUT family then needs only first derivatives of
// its metric at order 2, and Kerr–Newman skips the gradient of its
// closed-form field. The default is true.
func (e *Evaluator) SetFieldGradient(need bool) { e.noFieldGradient = !need }

// Order returns the derivative order of e.
func (e *Evaluator) Order() int { return e.order }

// Metric returns the metric evaluated by e.
func (e *Evaluator) Metric() Metric { return e.m }

var eta = [4]float64{-1, 1, 1, 1}

// Eval fills p at the event x. Fields beyond the evaluator's order are left
// unchanged.
func (e *Evaluator) Eval(x [4]float64, p *Point) {
	p.con.on = false
	p.con.zero, p.con.wasZero = false, p.con.zero
	if e.sm != nil {
		e.evalStatic(x, p)
		return
	}
	if e.jw == nil {
		e.jw = new(jetWork)
	}
	e.jw.eval(e, x, p)
}

// eval fills p by the jet path.
func (e *jetWork) eval(ev *Evaluator, x [4]float64, p *Point) {
	K := ev.order
	for i := range e.x {
		e.x[i].SetVar(K, x[i], i)
	}
	if ev.lin != nil {
		ev.lin.EvalLinear(&e.x, &e.g, &e.a)
	} else {
		ev.m.Eval(&e.x, &e.g, &e.a)
	}
	for m := 0; m < 4; m++ {
		p.A[m] = e.a[m].Value()
		for n := 0; n < 4; n++ {
			p.G[m][n] = e.g[m][n].Value()
			p.F[m][n] = e.a[n].D(m) - e.a[m].D(n)
		}
	}
	if ev.lin != nil {
		for m := 0; m < 4; m++ {
			p.G[m][m] += eta[m]
			for n := 0; n < 4; n++ {
				p.GInv[m][n] = -eta[m] * eta[n] * e.g[m][n].Value()
			}
			p.GInv[m][m] += eta[m]
		}
	}
	if K == 1 {
		e.evalOrder1(ev, p)
		return
	}

	// ∂_λ g_μν at order K−1.
	for l := 0; l < 4; l++ {
		for m := 0; m < 4; m++ {
			for n := m; n < 4; n++ {
				e.dg[l][m][n].Deriv(&e.g[m][n], l)
				if n != m {
					e.dg[l][n][m].Set(&e.dg[l][m][n])
				}
			}
		}
	}
	// Γ_ναβ = ½(∂_α g_νβ + ∂_β g_να − ∂_ν g_αβ).
	for n := 0; n < 4; n++ {
		for a := 0; a < 4; a++ {
			for b := a; b < 4; b++ {
				c := &e.gamL[n][a][b]
				c.Add(&e.dg[a][n][b], &e.dg[b][n][a])
				c.Sub(c, &e.dg[n][a][b])
				c.Scale(0.5, c)
			}
		}
	}
	// Raise the index.
	if ev.lin != nil {
		for m := 0; m < 4; m++ {
			for a := 0; a < 4; a++ {
				for b := a; b < 4; b++ {
					e.gam[m][a][b].Scale(eta[m], &e.gamL[m][a][b])
				}
			}
		}
	} else {
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				e.gt[m][n].Truncate(&e.g[m][n], K-1)
			}
		}
		jet.MatInv4(&e.ginv, &e.gt)
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				p.GInv[m][n] = e.ginv[m][n].Value()
			}
		}
		for m := 0; m < 4; m++ {
			for a := 0; a < 4; a++ {
				for b := a; b < 4; b++ {
					c := &e.gam[m][a][b]
					c.SetConst(K-1, 0)
					for n := 0; n < 4; n++ {
						c.AddMul(&e.ginv[m][n], &e.gamL[n][a][b])
					}
				}
			}
		}
	}
	for m := 0; m < 4; m++ {
		for a := 0; a < 4; a++ {
			for b := a; b < 4; b++ {
				if b != a {
					e.gam[m][b][a].Set(&e.gam[m][a][b])
				}
				p.Gamma[m][a][b] = e.gam[m][a][b].Value()
				p.Gamma[m][b][a] = p.Gamma[m][a][b]
			}
		}
	}

	// ∂_λF_μν = ∂_λ∂_μA_ν − ∂_λ∂_νA_μ.
	for l := 0; l < 4; l++ {
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				var am, an [4]int
				am[l]++
				am[m]++
				an[l]++
				an[n]++
				p.DF[l][m][n] = e.a[n].Partial(am) - e.a[m].Partial(an)
			}
		}
	}

	// Riemann tensor at order K−2.
	for m := 0; m < 4; m++ {
		for a := 0; a < 4; a++ {
			for b := 0; b < 4; b++ {
				e.gamT[m][a][b].Truncate(&e.gam[m][a][b], K-2)
			}
		}
	}
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			for r := 0; r < 4; r++ {
				e.riem[m][n][r][r].SetConst(K-2, 0)
				for s := r + 1; s < 4; s++ {
					c := &e.riem[m][n][r][s]
					c.Deriv(&e.gam[m][n][s], r)
					e.t1.Deriv(&e.gam[m][n][r], s)
					c.Sub(c, &e.t1)
					if ev.lin == nil {
						for l := 0; l < 4; l++ {
							c.AddMul(&e.gamT[m][r][l], &e.gamT[l][n][s])
							e.t1.Neg(&e.gamT[m][s][l])
							c.AddMul(&e.t1, &e.gamT[l][n][r])
						}
					}
					e.riem[m][n][s][r].Neg(c)
				}
			}
		}
	}
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			for r := 0; r < 4; r++ {
				for s := 0; s < 4; s++ {
					p.Riemann[m][n][r][s] = e.riem[m][n][r][s].Value()
				}
			}
		}
	}
	// R_κνρσ = g_κμ R^μ_νρσ, on bivectors (the pair symmetry of the
	// exact tensor holds to rounding; the upper triangle is kept).
	for A := 0; A < 6; A++ {
		k, n := bivectors[A][0], bivectors[A][1]
		for B := A; B < 6; B++ {
			r, s := bivectors[B][0], bivectors[B][1]
			v := 0.0
			if ev.lin != nil {
				v = eta[k] * p.Riemann[k][n][r][s]
			} else {
				for m := 0; m < 4; m++ {
					v += p.G[k][m] * p.Riemann[m][n][r][s]
				}
			}
			p.RiemannLow[A][B], p.RiemannLow[B][A] = v, v
		}
	}
	if K < 3 {
		return
	}
	// ∇_λR^μ_νρσ = ∂_λR^μ_νρσ + Γ^μ_λκR^κ_νρσ − Γ^κ_λνR^μ_κρσ
	//              − Γ^κ_λρR^μ_νκσ − Γ^κ_λσR^μ_νρκ.
	G := &p.Gamma
	R := &p.Riemann
	for l := 0; l < 4; l++ {
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				for r := 0; r < 4; r++ {
					for s := r + 1; s < 4; s++ {
						v := e.riem[m][n][r][s].D(l)
						if ev.lin == nil {
							for k := 0; k < 4; k++ {
								v += G[m][l][k]*R[k][n][r][s] - G[k][l][n]*R[m][k][r][s] -
									G[k][l][r]*R[m][n][k][s] - G[k][l][s]*R[m][n][r][k]
							}
						}
						p.DRiemann[l][m][n][r][s] = v
						p.DRiemann[l][m][n][s][r] = -v
					}
					p.DRiemann[l][m][n][r][r] = 0
				}
			}
		}
	}
	for l := 0; l < 4; l++ {
		for A := 0; A < 6; A++ {
			k, n := bivectors[A][0], bivectors[A][1]
			for B := 0; B < 6; B++ {
				r, s := bivectors[B][0], bivectors[B][1]
				v := 0.0
				if ev.lin != nil {
					v = eta[k] * p.DRiemann[l][k][n][r][s]
				} else {
					for m := 0; m < 4; m++ {
						v += p.G[k][m] * p.DRiemann[l][m][n][r][s]
					}
				}
				p.DRiemannLow[l][A][B] = v
			}
		}
	}
}

// evalOrder1 fills GInv and Gamma from first derivatives in plain floats.
func (e *jetWork) evalOrder1(ev *Evaluator, p *Point) {
	var dg [4][4][4]float64 // [λ][μ][ν]
	for m := 0; m < 4; m++ {
		for n := m; n < 4; n++ {
			c := &e.g[m][n]
			for l := 0; l < 4; l++ {
				d := c.D(l)
				dg[l][m][n] = d
				dg[l][n][m] = d
			}
		}
	}
	if ev.lin == nil {
		inv, _ := jet.Inverse4(p.G)
		p.GInv = inv
	}
	var gl [4][4][4]float64
	for n := 0; n < 4; n++ {
		for a := 0; a < 4; a++ {
			for b := a; b < 4; b++ {
				gl[n][a][b] = 0.5 * (dg[a][n][b] + dg[b][n][a] - dg[n][a][b])
			}
		}
	}
	for m := 0; m < 4; m++ {
		for a := 0; a < 4; a++ {
			for b := a; b < 4; b++ {
				var v float64
				if ev.lin != nil {
					v = eta[m] * gl[m][a][b]
				} else {
					v = p.GInv[m][0]*gl[0][a][b] + p.GInv[m][1]*gl[1][a][b] +
						p.GInv[m][2]*gl[2][a][b] + p.GInv[m][3]*gl[3][a][b]
				}
				p.Gamma[m][a][b] = v
				p.Gamma[m][b][a] = v
			}
		}
	}
}
