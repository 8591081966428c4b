package spacetime

import (
	"math"
	"math/rand/v2"
)

// blToCart maps Boyer–Lindquist-type (r, cos θ, φ) to the Cartesian event
// x = √(r²+a²) sin θ cos φ, y = √(r²+a²) sin θ sin φ, z = r cos θ.
func blToCart(r, c, phi, a float64) [4]float64 {
	s := math.Sqrt(1 - c*c)
	R := math.Sqrt(r*r + a*a)
	return [4]float64{0.37, R * s * math.Cos(phi), R * s * math.Sin(phi), r * c}
}

// randomEvents returns n events at r ∈ [rmin, rmax], |cos θ| ≤ 0.95.
func randomEvents(rng *rand.Rand, n int, a, rmin, rmax float64) [][4]float64 {
	out := make([][4]float64, n)
	for i := range out {
		r := rmin + (rmax-rmin)*rng.Float64()
		c := 0.95 * (2*rng.Float64() - 1)
		phi := 2 * math.Pi * rng.Float64()
		out[i] = blToCart(r, c, phi, a)
	}
	return out
}

// lowerRiemann returns R_μνρσ = g_μκ R^κ_νρσ.
func lowerRiemann(p *Point) (out [4][4][4][4]float64) {
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			for r := 0; r < 4; r++ {
				for s := 0; s < 4; s++ {
					v := 0.0
					for k := 0; k < 4; k++ {
						v += p.G[m][k] * p.Riemann[k][n][r][s]
					}
					out[m][n][r][s] = v
				}
			}
		}
	}
	return out
}

// kretschmann returns R_abcd R^abcd.
func kretschmann(p *Point) float64 {
	lo := lowerRiemann(p)
	// R^{abcd} = g^{bβ} g^{cγ} g^{dδ} R^a_βγδ
	var sum float64
	for a := 0; a < 4; a++ {
		var t1 [4][4][4]float64 // R^a_b^c_d partially raised
		for b := 0; b < 4; b++ {
			for c := 0; c < 4; c++ {
				for d := 0; d < 4; d++ {
					v := 0.0
					for k := 0; k < 4; k++ {
						v += p.GInv[c][k] * p.Riemann[a][b][k][d]
					}
					t1[b][c][d] = v
				}
			}
		}
		var t2 [4][4][4]float64
		for b := 0; b < 4; b++ {
			for c := 0; c < 4; c++ {
				for d := 0; d < 4; d++ {
					v := 0.0
					for k := 0; k < 4; k++ {
						v += p.GInv[d][k] * t1[b][c][k]
					}
					t2[b][c][d] = v
				}
			}
		}
		for b := 0; b < 4; b++ {
			for c := 0; c < 4; c++ {
				for d := 0; d < 4; d++ {
					v := 0.0
					for k := 0; k < 4; k++ {
						v += p.GInv[b][k] * t2[k][c][d]
					}
					sum += lo[a][b][c][d] * v
				}
			}
		}
	}
	return sum
}

// ricci returns R_νσ = R^μ_νμσ.
func ricci(p *Point) (out [4][4]float64) {
	for n := 0; n < 4; n++ {
		for s := 0; s < 4; s++ {
			for m := 0; m < 4; m++ {
				out[n][s] += p.Riemann[m][n][m][s]
			}
		}
	}
	return out
}

// maxwellStress returns 8π T_μν = 2(F_μα F_ν^α − ¼ g_μν F_αβF^αβ).
func maxwellStress(p *Point) (out [4][4]float64) {
	var Fmix [4][4]float64 // F_μ^α
	for m := 0; m < 4; m++ {
		for a := 0; a < 4; a++ {
			for b := 0; b < 4; b++ {
				Fmix[m][a] += p.F[m][b] * p.GInv[b][a]
			}
		}
	}
	var F2 float64 // F_αβ F^αβ
	for m := 0; m < 4; m++ {
		for a := 0; a < 4; a++ {
			var Fup float64 // F^{m a}
			for b := 0; b < 4; b++ {
				Fup += p.GInv[m][b] * Fmix[b][a]
			}
			F2 += p.F[m][a] * Fup
		}
	}
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			var v float64
			for a := 0; a < 4; a++ {
				v += p.F[m][a] * Fmix[n][a]
			}
			out[m][n] = 2 * (v - 0.25*p.G[m][n]*F2)
		}
	}
	return out
}

func maxAbsRiemann(p *Point) float64 {
	m := 0.0
	for _, a := range p.Riemann {
		for _, b := range a {
			for _, c := range b {
				for _, d := range c {
					m = math.Max(m, math.Abs(d))
				}
			}
		}
	}
	return m
}

// ringEvents returns n events within 0.05–0.5 of the ring of radius |a|
// (off the disk); none for a = 0.
func ringEvents(rng *rand.Rand, n int, a float64) [][4]float64 {
	if a == 0 {
		return nil
	}
	out := make([][4]float64, n)
	for i := range out {
		d := 0.05 + 0.45*rng.Float64()
		th := math.Pi * (rng.Float64() - 0.5)
		ph := 2 * math.Pi * rng.Float64()
		rho := math.Abs(a) + d*math.Cos(th)
		out[i] = [4]float64{0, rho * math.Cos(ph), rho * math.Sin(ph), d * math.Sin(th)}
	}
	return out
}
