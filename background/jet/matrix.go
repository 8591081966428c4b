package jet

import "math"

// Inverse4 returns the inverse of the 4×4 matrix a by Gauss–Jordan
// elimination with partial pivoting, and false if a is singular to working
// precision.
func Inverse4(a [4][4]float64) ([4][4]float64, bool) {
	var inv [4][4]float64
	for i := range inv {
		inv[i][i] = 1
	}
	for col := 0; col < 4; col++ {
		p := col
		for r := col + 1; r < 4; r++ {
			if math.Abs(a[r][col]) > math.Abs(a[p][col]) {
				p = r
			}
		}
		if a[p][col] == 0 || math.IsNaN(a[p][col]) {
			return inv, false
		}
		a[col], a[p] = a[p], a[col]
		inv[col], inv[p] = inv[p], inv[col]
		d := 1 / a[col][col]
		for c := 0; c < 4; c++ {
			a[col][c] *= d
			inv[col][c] *= d
		}
		for r := 0; r < 4; r++ {
			if r == col || a[r][col] == 0 {
				continue
			}
			f := a[r][col]
			for c := 0; c < 4; c++ {
				a[r][c] -= f * a[col][c]
				inv[r][c] -= f * inv[col][c]
			}
		}
	}
	return inv, true
}

// MatInv4 sets z to the inverse of the 4×4 matrix of jets g, to the
// smallest order among the entries of g, and reports whether the value
// matrix was invertible. With G = G₀ + H (H the non-constant part), the
// Taylor coefficients of Y = G⁻¹ follow degree by degree from G·Y = I:
//
//	Y_0 = G₀⁻¹,  Y_α = −G₀⁻¹ Σ_{β+γ=α, γ≠0} G_γ Y_β.
//
// z must not alias g.
func MatInv4(z, g *[4][4]Jet) bool {
	o := MaxOrder
	var g0 [4][4]float64
	for i := 0; i < 4; i++ {
		for j := 0; j < 4; j++ {
			o = minOrder(o, g[i][j].order)
			g0[i][j] = g[i][j].c[0]
		}
	}
	inv, ok := Inverse4(g0)
	for i := 0; i < 4; i++ {
		for j := 0; j < 4; j++ {
			z[i][j].order = o
			z[i][j].c[0] = inv[i][j]
		}
	}
	n := lens[o]
	for k := 1; k < n; k++ {
		var s [4][4]float64
		for _, p := range pairs[pairOff[k]:pairOff[k+1]] {
			gi, yj := p[0], p[1]
			if gi == 0 {
				continue
			}
			for a := 0; a < 4; a++ {
				for m := 0; m < 4; m++ {
					gam := g[a][m].c[gi]
					if gam == 0 {
						continue
					}
					for b := 0; b < 4; b++ {
						s[a][b] += gam * z[m][b].c[yj]
					}
				}
			}
		}
		for a := 0; a < 4; a++ {
			for b := 0; b < 4; b++ {
				v := 0.0
				for m := 0; m < 4; m++ {
					v += inv[a][m] * s[m][b]
				}
				z[a][b].c[k] = -v
			}
		}
	}
	return ok
}
