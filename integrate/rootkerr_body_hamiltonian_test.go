package integrate

import (
	"math"
	"testing"

	"ricochet/background/em"
	"ricochet/background/vec"
)

// spinTensor returns S^{μν} = ε^{μνρσ} p_ρ a_σ in flat space (ε^{0123} = −1).
func spinTensor(p, a [4]float64) (S [4][4]float64) {
	pl, al := lowerVec(&etaDiag, p), lowerVec(&etaDiag, a)
	for _, pm := range perms4 {
		i := pm.i
		S[i[0]][i[1]] -= pm.sign * pl[i[2]] * al[i[3]]
	}
	return S
}

// spinVector returns a^μ = −(1/(2𝓜²)) ε^μ_{νρσ} p^ν S^{ρσ}, the inverse of
// spinTensor on a·p = 0.
func spinVector(p [4]float64, S [4][4]float64) (a [4]float64) {
	M2 := (p[0]-p[1])*(p[0]+p[1]) - p[2]*p[2] - p[3]*p[3]
	var al [4]float64
	for _, pm := range perms4 {
		i := pm.i
		al[i[0]] -= pm.sign * p[i[1]] * S[i[2]][i[3]] / (2 * M2)
	}
	for mu := 0; mu < 4; mu++ {
		a[mu] = etaDiag[mu][mu] * al[mu]
	}
	return a
}

// TestRootKerrBodyHamiltonian: the body's right-hand side is the
// Hamiltonian flow of H = 𝓜 − W − m on (x, p, S) with {x^μ, p^ν} = η^{μν},
// {p^μ, p^ν} = qF^{μν} and the Lorentz algebra for S, constrained to
// S^{μν}p_ν = 0 by a multiplier (Künzle 1972, from memory; see "The
// root-Kerr body" in the package documentation): with ω the multiplier's
// velocity term (in the range of S),
//
//	u = p/𝓜 + ∂W/∂p|_S + ω,   ṗ = F u − ∂W,   Ṡ = Σ + p ∧ ω,
//	Σ^{μν} = 2(W^μ_β S^{νβ} − W^ν_β S^{μβ}),   W_{αβ} = ∂W/∂S^{αβ},
//
// ω fixed by d(S p)/dτ = 0. Here the derivatives of the scalar W(x, p, S)
// are taken by finite differences (the spin vector rebuilt from S and p),
// independently of the model's own (p, a) derivatives and torque, and the
// flow is compared with Deriv. Tolerance 1e-10 relative to the
// interaction terms: Richardson-extrapolated central differences at
// h = 1e-4 (truncation ~h⁴ ≈ 1e-16, rounding 1e-16/h ≈ 1e-12; measured
// 6e-12).
func TestRootKerrBodyHamiltonian(t *testing.T) {
	f := em.RootKerr{Q: 0.3, A: vec.Vec3{0.1, -0.2, 0.15}}
	for _, contact := range []float64{0, 2} {
		r := &RootKerrBody{Field: f, M: 1.3, Q: 0.9, G: 0.2, Contact: contact}
		y := sampleState(vec.Vec3{0.2, -0.3, 0.25})
		r.Normalize(y, 0.15)
		x := event(y)
		p, a := [4]float64(Mom(y)), [4]float64(Spin(y))
		S := spinTensor(p, a)
		if b := spinVector(p, S); math.Abs(b[1]-a[1])+math.Abs(b[2]-a[2])+math.Abs(b[3]-a[3]) > 1e-15 {
			t.Fatalf("spin vector from S: %v, want %v", b, a)
		}
		W := func(x, p [4]float64, S [4][4]float64) float64 {
			z := make([]float64, 12)
			b := spinVector(p, S)
			for i := 0; i < 4; i++ {
				z[IX+i], z[IP+i], z[IA+i] = x[i], p[i], b[i]
			}
			return r.Interaction(z)
		}
		// d/dt W(t) at 0, Richardson on central differences.
		const h = 1e-4
		deriv := func(g func(t float64) float64) float64 {
			d := func(e float64) float64 { return (g(e) - g(-e)) / (2 * e) }
			return (4*d(h/2) - d(h)) / 3
		}
		var dx, P [4]float64
		var WS [4][4]float64
		for mu := 1; mu < 4; mu++ {
			dx[mu] = deriv(func(e float64) float64 { xx := x; xx[mu] += e; return W(xx, p, S) })
		}
		for mu := 0; mu < 4; mu++ {
			P[mu] = deriv(func(e float64) float64 { pp := p; pp[mu] += e; return W(x, pp, S) })
			for nu := mu + 1; nu < 4; nu++ {
				g := deriv(func(e float64) float64 { s := S; s[mu][nu] += e; s[nu][mu] -= e; return W(x, p, s) })
				WS[mu][nu], WS[nu][mu] = g/2, -g/2
			}
		}
		// Raise: ∂^μW, P^μ, W^μ_β.
		for mu := 0; mu < 4; mu++ {
			dx[mu] *= etaDiag[mu][mu]
			P[mu] *= etaDiag[mu][mu]
			for b := 0; b < 4; b++ {
				WS[mu][b] *= etaDiag[mu][mu]
			}
		}
		var Sig [4][4]float64
		for mu := 0; mu < 4; mu++ {
			for nu := 0; nu < 4; nu++ {
				for b := 0; b < 4; b++ {
					Sig[mu][nu] += 2 * (WS[mu][b]*S[nu][b] - WS[nu][b]*S[mu][b])
				}
			}
		}
		l := r.local(y)
		Fl := l.F // q F_μν
		M := math.Sqrt((p[0]-p[1])*(p[0]+p[1]) - p[2]*p[2] - p[3]*p[3])
		pl := lowerVec(&etaDiag, p)
		// (𝓜² δ + S F) ω = −Σ p − S (F (p/𝓜 + P) − ∂W), indices: S^{μν} F_{νλ}.
		var A [4][4]float64
		var rhs [4]float64
		var f0 [4]float64 // F_{νλ}(p/𝓜 + P)^λ − ∂_νW, lower
		for nu := 0; nu < 4; nu++ {
			s := -dx[nu] * etaDiag[nu][nu]
			for la := 0; la < 4; la++ {
				s += Fl[nu][la] * (p[la]/M + P[la])
			}
			f0[nu] = s
		}
		for mu := 0; mu < 4; mu++ {
			for la := 0; la < 4; la++ {
				for nu := 0; nu < 4; nu++ {
					A[mu][la] += S[mu][nu] * Fl[nu][la]
				}
			}
			A[mu][mu] += M * M
			for nu := 0; nu < 4; nu++ {
				rhs[mu] -= Sig[mu][nu]*pl[nu] + S[mu][nu]*f0[nu]
			}
		}
		om := solve4(A, rhs)
		var u, pd [4]float64
		for mu := 0; mu < 4; mu++ {
			u[mu] = p[mu]/M + P[mu] + om[mu]
		}
		for mu := 0; mu < 4; mu++ {
			pd[mu] = -dx[mu]
			for la := 0; la < 4; la++ {
				pd[mu] += l.Fm[mu][la] * u[la]
			}
		}
		dy := make([]float64, 12)
		r.Deriv(y, dy)
		var ad [4]float64
		for i := 0; i < 4; i++ {
			ad[i] = dy[IA+i]
		}
		// Ṡ of the model from ṗ and ȧ (S bilinear in p and a).
		S1, S2 := spinTensor([4]float64(Mom(dy)), a), spinTensor(p, ad)
		scale := 0.0
		for mu := 0; mu < 4; mu++ {
			scale = math.Max(scale, math.Abs(P[mu])+math.Abs(om[mu])+math.Abs(dx[mu]))
		}
		worst := 0.0
		for mu := 0; mu < 4; mu++ {
			worst = math.Max(worst, math.Max(math.Abs(u[mu]-dy[IX+mu]), math.Abs(pd[mu]-dy[IP+mu])))
			for nu := mu + 1; nu < 4; nu++ {
				worst = math.Max(worst, math.Abs(Sig[mu][nu]+p[mu]*om[nu]-p[nu]*om[mu]-S1[mu][nu]-S2[mu][nu]))
			}
			if d := math.Abs(u[mu] - dy[IX+mu]); d > 1e-10*scale {
				t.Errorf("contact %g: u^%d Hamiltonian %.15g, model %.15g", contact, mu, u[mu], dy[IX+mu])
			}
			if d := math.Abs(pd[mu] - dy[IP+mu]); d > 1e-10*scale {
				t.Errorf("contact %g: ṗ^%d Hamiltonian %.15g, model %.15g", contact, mu, pd[mu], dy[IP+mu])
			}
			for nu := mu + 1; nu < 4; nu++ {
				hs := Sig[mu][nu] + p[mu]*om[nu] - p[nu]*om[mu]
				if d := math.Abs(hs - S1[mu][nu] - S2[mu][nu]); d > 1e-10*scale*(1+math.Abs(hs)) {
					t.Errorf("contact %g: Ṡ^%d%d Hamiltonian %.15g, model %.15g", contact, mu, nu, hs, S1[mu][nu]+S2[mu][nu])
				}
			}
		}
		t.Logf("contact %g: largest difference of u, ṗ, Ṡ %.1e (interaction scale %.2g)", contact, worst, scale)
	}
}

// solve4 solves A x = r by Gaussian elimination with partial pivoting.
func solve4(A [4][4]float64, r [4]float64) [4]float64 {
	for c := 0; c < 4; c++ {
		p := c
		for i := c + 1; i < 4; i++ {
			if math.Abs(A[i][c]) > math.Abs(A[p][c]) {
				p = i
			}
		}
		A[c], A[p] = A[p], A[c]
		r[c], r[p] = r[p], r[c]
		for i := c + 1; i < 4; i++ {
			f := A[i][c] / A[c][c]
			for j := c; j < 4; j++ {
				A[i][j] -= f * A[c][j]
			}
			r[i] -= f * r[c]
		}
	}
	var x [4]float64
	for i := 3; i >= 0; i-- {
		s := r[i]
		for j := i + 1; j < 4; j++ {
			s -= A[i][j] * x[j]
		}
		x[i] = s / A[i][i]
	}
	return x
}
