package spacetime

import "ricochet/background/jet"

// The fast path of Evaluator for the static metrics of this package
// (staticMetric): the metric and potential are evaluated once in static
// Taylor arithmetic (taylor.go) to the order needed, and every derived
// tensor is then formed in plain floating point from the closed-form
// expressions in the metric derivatives (Misner, Thorne & Wheeler 1973,
// eqs. 8.24 and 8.51, from memory; ∂_0 = 0 throughout):
//
//	Γ_ναβ    = ½(∂_α g_νβ + ∂_β g_να − ∂_ν g_αβ),   Γ^μ_αβ = g^{μν} Γ_ναβ,
//	R_μνρσ   = ½(∂_ν∂_ρ g_μσ + ∂_μ∂_σ g_νρ − ∂_ν∂_σ g_μρ − ∂_μ∂_ρ g_νσ)
//	           + Γ_κνρ Γ^κ_μσ − Γ_κνσ Γ^κ_μρ,
//	∂_λΓ^κ_αβ = −g^{κι}(∂_λ g_ιη) Γ^η_αβ + g^{κη} ∂_λΓ_ηαβ,
//	∇_λR_μνρσ = ∂_λR_μνρσ − Γ^κ_λμ R_κνρσ − Γ^κ_λν R_μκρσ
//	           − Γ^κ_λρ R_μνκσ − Γ^κ_λσ R_μνρκ,
//
// R^μ_νρσ = g^{μκ} R_κνρσ and ∇_λR^μ_νρσ = g^{μκ} ∇_λR_κνρσ (g is
// covariantly constant). The lowered tensors are computed once per pair of
// antisymmetric index pairs (21 components, R_[μν][ρσ] = R_[ρσ][μν]). In
// linear mode the ΓΓ and ΓR terms are dropped and indices move with η, as
// documented at NewLinearEvaluator.

// ksDerivs holds the metric and potential of a static metric with their
// first and second spatial derivatives, in plain floating point: the input
// of the curvature assembly (assemble).
type ksDerivs struct {
	g   [4][4]float64       // g_μν
	dg  [4][4][4]float64    // ∂_λ g_μν as [λ][μ][ν] (λ = 0 zero)
	d2  [4][4][4][4]float64 // ∂_a∂_b g_μν as [a][b][μ][ν] (time index zero)
	a   [4]float64          // A_μ
	da  [4][4]float64       // ∂_λ A_ν as [λ][ν]
	d2a [4][4][4]float64    // ∂_λ∂_μ A_ν as [λ][μ][ν]
}

// staticWork is the work storage of the fast path.
type staticWork struct {
	x  [3]tay
	g  [4][4]tay
	a  [4]tay
	d  ksDerivs
	gl [4][4][4]float64 // Γ_ναβ
}

// bivectors lists the index pairs μ < ν.
var bivectors = [6][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}}

// evalStatic fills p by the fast path.
func (e *Evaluator) evalStatic(x [4]float64, p *Point) {
	K := e.order
	w := e.sw
	lin := e.lin != nil
	d := &w.d
	if kn, ok := e.sm.(KerrNewman); ok && K == 2 && !lin && e.contracted && e.lowered && kn.Q == 0 {
		kn.kerrContracted(x, p)
		return
	}
	if kn, ok := e.sm.(KerrNewman); ok && K >= 2 && !lin {
		kn.kerrSchildCurvature(x, p, !e.lowered, K == 3, !e.noFieldGradient)
		return
	}
	if kt, ok := e.sm.(KerrNewmanNUT); ok && K == 2 && !lin && (kt.Q == 0 && kt.P == 0 || e.noFieldGradient) {
		kt.kntnFirst(x, d)
		e.assemble(p, d, 1, false)
		p.DF = [4][4][4]float64{}
		kt.kntnCurvature(x, p, !e.lowered)
		return
	}
	for i := 0; i < 3; i++ {
		w.x[i].setVar(K, x[i+1], i)
	}
	e.sm.evalStatic(&w.x, &w.g, &w.a, lin)
	d.fromTay(&w.g, &w.a, K)
	e.assemble(p, d, K, lin)
	if K < 3 {
		return
	}
	g := &w.g
	dg := &d.dg
	d2 := &d.d2
	gi := &p.GInv
	G := &p.Gamma
	gl := &w.gl
	RL := &p.RiemannLow

	// ∂_λΓ_ναβ and ∂_λΓ^κ_αβ for spatial λ.
	var dgl, dG [4][4][4][4]float64 // [λ][κ][α][β]
	for l := 1; l < 4; l++ {
		for n := 0; n < 4; n++ {
			for a := 0; a < 4; a++ {
				for b := a; b < 4; b++ {
					v := 0.5 * (d2[l][a][n][b] + d2[l][b][n][a] - d2[l][n][a][b])
					dgl[l][n][a][b], dgl[l][n][b][a] = v, v
				}
			}
		}
		if lin {
			continue
		}
		// (∂_λ g_ιη) Γ^η_αβ, then −g^{κι}(…) + g^{κη}∂_λΓ_ηαβ.
		var t [4][4][4]float64
		for i := 0; i < 4; i++ {
			for a := 0; a < 4; a++ {
				for b := a; b < 4; b++ {
					t[i][a][b] = dgl[l][i][a][b] - (dg[l][i][0]*G[0][a][b] + dg[l][i][1]*G[1][a][b] + dg[l][i][2]*G[2][a][b] + dg[l][i][3]*G[3][a][b])
				}
			}
		}
		for k := 0; k < 4; k++ {
			for a := 0; a < 4; a++ {
				for b := a; b < 4; b++ {
					v := gi[k][0]*t[0][a][b] + gi[k][1]*t[1][a][b] + gi[k][2]*t[2][a][b] + gi[k][3]*t[3][a][b]
					dG[l][k][a][b], dG[l][k][b][a] = v, v
				}
			}
		}
	}
	var DL [6][6]float64
	var d3 [4][4][4][4]float64 // ∂_λ∂_a∂_b g_μν as [a][b][μ][ν] for the current λ
	for l := 0; l < 4; l++ {
		if l > 0 {
			for a := 1; a < 4; a++ {
				for b := a; b < 4; b++ {
					for m := 0; m < 4; m++ {
						for n := m; n < 4; n++ {
							v := g[m][n].d3(l-1, a-1, b-1)
							d3[a][b][m][n], d3[a][b][n][m] = v, v
						}
					}
					d3[b][a] = d3[a][b]
				}
			}
		}
		for A := 0; A < 6; A++ {
			mu, nu := bivectors[A][0], bivectors[A][1]
			for B := A; B < 6; B++ {
				rho, sig := bivectors[B][0], bivectors[B][1]
				var v float64
				if l > 0 {
					v = 0.5 * (d3[nu][rho][mu][sig] + d3[mu][sig][nu][rho] - d3[nu][sig][mu][rho] - d3[mu][rho][nu][sig])
					if !lin {
						for k := 0; k < 4; k++ {
							v += dgl[l][k][nu][rho]*G[k][mu][sig] + gl[k][nu][rho]*dG[l][k][mu][sig] -
								dgl[l][k][nu][sig]*G[k][mu][rho] - gl[k][nu][sig]*dG[l][k][mu][rho]
						}
					}
				}
				DL[A][B], DL[B][A] = v, v
			}
		}
		if !lin {
			// The ΓR terms: with M_κμ = Γ^κ_λμ acting on each bivector
			// index, ∇R = ∂R − (M̂ R + R M̂ᵀ), M̂ its 6×6 bivector form.
			var Mb [6][6]float64
			for A := 0; A < 6; A++ {
				mu, nu := bivectors[A][0], bivectors[A][1]
				for k := 0; k < 4; k++ {
					if k != nu {
						Mb[A][bivectorOf[k][nu]] += G[k][l][mu] * bivectorSign[k][nu]
					}
					if k != mu {
						Mb[A][bivectorOf[mu][k]] += G[k][l][nu] * bivectorSign[mu][k]
					}
				}
			}
			var MR [6][6]float64
			for A := 0; A < 6; A++ {
				for B := 0; B < 6; B++ {
					MR[A][B] = Mb[A][0]*RL[0][B] + Mb[A][1]*RL[1][B] + Mb[A][2]*RL[2][B] +
						Mb[A][3]*RL[3][B] + Mb[A][4]*RL[4][B] + Mb[A][5]*RL[5][B]
				}
			}
			for A := 0; A < 6; A++ {
				for B := 0; B < 6; B++ {
					DL[A][B] -= MR[A][B] + MR[B][A]
				}
			}
		}
		p.DRiemannLow[l] = DL
		if !e.lowered {
			raiseRiemann(&p.DRiemann[l], &DL, gi, lin)
		}
	}
}

// bivectorOf and bivectorSign locate the pair (μ, ν) in bivectors:
// R_μν.. = bivectorSign[μ][ν] · RL[bivectorOf[μ][ν]] (sign 0 for μ = ν).
var (
	bivectorOf   [4][4]int
	bivectorSign [4][4]float64
)

func init() {
	for A, p := range bivectors {
		bivectorOf[p[0]][p[1]], bivectorOf[p[1]][p[0]] = A, A
		bivectorSign[p[0]][p[1]], bivectorSign[p[1]][p[0]] = 1, -1
	}
}

// raiseRiemann sets out^μ_νρσ = g^{μκ} R_κνρσ (η^{μκ} when lin) from the
// bivector components RL of R_κνρσ.
func raiseRiemann(out *[4][4][4][4]float64, RL *[6][6]float64, gi *[4][4]float64, lin bool) {
	for n := 0; n < 4; n++ {
		// Column κ of R_κν[B], for each bivector B.
		var col [4][6]float64
		for k := 0; k < 4; k++ {
			if k == n {
				continue
			}
			sg, row := bivectorSign[k][n], &RL[bivectorOf[k][n]]
			for B := 0; B < 6; B++ {
				col[k][B] = sg * row[B]
			}
		}
		for m := 0; m < 4; m++ {
			var v [6]float64
			if lin {
				for B := 0; B < 6; B++ {
					v[B] = eta[m] * col[m][B]
				}
			} else {
				g := &gi[m]
				for B := 0; B < 6; B++ {
					v[B] = g[0]*col[0][B] + g[1]*col[1][B] + g[2]*col[2][B] + g[3]*col[3][B]
				}
			}
			o := &out[m][n]
			o[0][0], o[1][1], o[2][2], o[3][3] = 0, 0, 0, 0
			o[0][1], o[1][0] = v[0], -v[0]
			o[0][2], o[2][0] = v[1], -v[1]
			o[0][3], o[3][0] = v[2], -v[2]
			o[1][2], o[2][1] = v[3], -v[3]
			o[1][3], o[3][1] = v[4], -v[4]
			o[2][3], o[3][2] = v[5], -v[5]
		}
	}
}

// fromTay copies the metric and potential with their derivatives (up to
// second order, first when K = 1) out of the Taylor polynomials.
func (d *ksDerivs) fromTay(g *[4][4]tay, a *[4]tay, K int) {
	for m := 0; m < 4; m++ {
		d.a[m] = a[m].c[0]
		for i := 0; i < 3; i++ {
			d.da[i+1][m] = a[m].c[1+i]
		}
		for n := 0; n < 4; n++ {
			d.g[m][n] = g[m][n].c[0]
			for i := 0; i < 3; i++ {
				d.dg[i+1][m][n] = g[m][n].c[1+i]
			}
		}
	}
	if K < 2 {
		return
	}
	for i := 1; i < 4; i++ {
		for j := i; j < 4; j++ {
			for m := 0; m < 4; m++ {
				v := a[m].d2(i-1, j-1)
				d.d2a[i][j][m], d.d2a[j][i][m] = v, v
				for n := m; n < 4; n++ {
					v := g[m][n].d2(i-1, j-1)
					d.d2[i][j][m][n], d.d2[i][j][n][m] = v, v
				}
			}
			d.d2[j][i] = d.d2[i][j]
		}
	}
}

// assemble fills p up to order min(K, 2) from the metric derivatives d by
// the closed-form expressions of the file comment (time derivatives zero).
func (e *Evaluator) assemble(p *Point, d *ksDerivs, K int, lin bool) {
	w := e.sw
	p.G = d.g
	p.A = d.a
	for m := 0; m < 4; m++ {
		p.F[0][m] = -d.da[m][0]
		p.F[m][0] = d.da[m][0]
	}
	for m := 1; m < 4; m++ {
		for n := 1; n < 4; n++ {
			p.F[m][n] = d.da[m][n] - d.da[n][m]
		}
	}
	p.F[0][0] = 0
	gi := &p.GInv
	switch {
	case lin:
		// G holds h: g^μν = η^μν − η^μμ η^νν h_μν, g = η + h.
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				gi[m][n] = -eta[m] * eta[n] * p.G[m][n]
			}
			gi[m][m] += eta[m]
			p.G[m][m] += eta[m]
		}
	default:
		*gi, _ = jet.Inverse4(p.G)
	}
	gl := &w.gl // Γ_ναβ
	G := &p.Gamma
	d.assembleGamma(gl, G, gi, lin)
	if K == 1 {
		return
	}

	// ∂_λF_μν from second derivatives of A.
	for l := 0; l < 4; l++ {
		for m := 0; m < 4; m++ {
			for n := 0; n < 4; n++ {
				p.DF[l][m][n] = d.d2a[l][m][n] - d.d2a[l][n][m]
			}
		}
	}

	d2 := &d.d2
	RL := &p.RiemannLow // R_[μν][ρσ]
	for A := 0; A < 6; A++ {
		mu, nu := bivectors[A][0], bivectors[A][1]
		for B := A; B < 6; B++ {
			rho, sig := bivectors[B][0], bivectors[B][1]
			v := 0.5 * (d2[nu][rho][mu][sig] + d2[mu][sig][nu][rho] - d2[nu][sig][mu][rho] - d2[mu][rho][nu][sig])
			if !lin {
				for k := 0; k < 4; k++ {
					v += gl[k][nu][rho]*G[k][mu][sig] - gl[k][nu][sig]*G[k][mu][rho]
				}
			}
			RL[A][B], RL[B][A] = v, v
		}
	}
	if !e.lowered {
		raiseRiemann(&p.Riemann, RL, gi, lin)
	}
}

// assembleGamma forms Γ_ναβ from the metric derivatives and raises it
// (loops with constant bounds, so that the compiler drops the bounds
// checks).
func (d *ksDerivs) assembleGamma(gl, G *[4][4][4]float64, gi *[4][4]float64, lin bool) {
	dg := &d.dg
	for n := 0; n < 4; n++ {
		gn := &gl[n]
		for a := 0; a < 4; a++ {
			for b := a; b < 4; b++ {
				v := 0.5 * (dg[a][n][b] + dg[b][n][a] - dg[n][a][b])
				gn[a][b], gn[b][a] = v, v
			}
		}
	}
	for m := 0; m < 4; m++ {
		g := &gi[m]
		Gm := &G[m]
		for a := 0; a < 4; a++ {
			for b := a; b < 4; b++ {
				var v float64
				if lin {
					v = eta[m] * gl[m][a][b]
				} else {
					v = g[0]*gl[0][a][b] + g[1]*gl[1][a][b] + g[2]*gl[2][a][b] + g[3]*gl[3][a][b]
				}
				Gm[a][b], Gm[b][a] = v, v
			}
		}
	}
}
