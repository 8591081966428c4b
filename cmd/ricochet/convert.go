package main

import (
	"math"

	"ricochet/background/vec"
	"ricochet/observables"
	"ricochet/observables/convention"
)

// Output-convention helpers shared by run and scan. The library computes
// contravariant components in signature (−,+,+,+) and Gaussian units; these
// functions re-express its numbers for printing.

// frameVec returns the contravariant components (v^t, v^l, v^b, v^n) of v
// in the orthonormal frame of record.
func frameVec(fr observables.Frame, v vec.Vec4) vec.Vec4 { return vec.Vec4(fr.Components(v)) }

// frameErr bounds the frame components of an error vector given
// component-wise in the source frame: the time part is unchanged, and the
// Euclidean norm of the spatial part bounds every rotated spatial
// component.
func frameErr(e vec.Vec4) vec.Vec4 {
	n := norm3(e)
	return vec.Vec4{math.Abs(e[0]), n, n, n}
}

// covariant returns the covariant components v_μ = η_{μν} v^ν in signature
// sig of contravariant components v^ν given in an orthonormal frame.
func covariant(sig convention.Signature, v vec.Vec4) vec.Vec4 { return sig.Lower(v) }

// spinTensorErr propagates component-wise error bars δp, δa (non-negative)
// of p and a to the spin tensor S^{μν} = ε^{μνρσ} p_ρ a_σ, linearly:
//
//	δS^{μν} = Σ_{ρσ} |ε^{μνρσ}| (|p_ρ| δa_σ + δp_ρ |a_σ|),
//
// i.e. |∂S/∂p|·δp + |∂S/∂a|·δa component-wise (lowering an index changes
// signs only, which the moduli absorb). The second-order term δp δa is
// dropped: the error bars are many orders below the values.
func spinTensorErr(p, a, dp, da vec.Vec4) [4][4]float64 {
	var e [4][4]float64
	for m := 0; m < 4; m++ {
		for n := 0; n < 4; n++ {
			var s float64
			for r := 0; r < 4; r++ {
				for q := 0; q < 4; q++ {
					if vec.Levi(m, n, r, q) == 0 {
						continue
					}
					s += math.Abs(p[r])*da[q] + dp[r]*math.Abs(a[q])
				}
			}
			e[m][n] = s
		}
	}
	return e
}

// spinTensorKick1 is the first-order spin-tensor kick: S is bilinear, so
// to first order in the coupling
//
//	ΔS₁ = S(Δp₁, a_in) + S(p_in, Δa₁);
//
// the product S(Δp₁, Δa₁) is of second order and belongs to the residual.
func spinTensorKick1(pin, ain, dp1, da1 vec.Vec4) [4][4]float64 {
	x, y := convention.SpinTensor(dp1, ain), convention.SpinTensor(pin, da1)
	for m := range x {
		for n := range x[m] {
			x[m][n] += y[m][n]
		}
	}
	return x
}

// tensorDiff returns S − T.
func tensorDiff(s, t [4][4]float64) [4][4]float64 {
	for m := range s {
		for n := range s[m] {
			s[m][n] -= t[m][n]
		}
	}
	return s
}

// tensorPairs are the independent components of an antisymmetric tensor
// in the frame of record, with their labels.
var tensorPairs = [6][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}}

var frameLabels = [4]string{"t", "l", "b", "n"}
