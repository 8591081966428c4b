package convention

import (
	"math"

	"ricochet/background/vec"
)

// SpinTensorErr propagates component-wise error bars δp, δa (non-negative)
// of p and a to the spin tensor S^{μν} = ε^{μνρσ} p_ρ a_σ, linearly:
//
//	δS^{μν} = Σ_{ρσ} |ε^{μνρσ}| (|p_ρ| δa_σ + δp_ρ |a_σ|),
//
// i.e. |∂S/∂p|·δp + |∂S/∂a|·δa component-wise (lowering an index changes
// signs only, which the moduli absorb). The second-order term δp δa is
// dropped: the error bars are many orders below the values.
func SpinTensorErr(p, a, dp, da vec.Vec4) [4][4]float64 {
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

// SpinTensorKick1 is the first-order spin-tensor kick: S is bilinear, so
// to first order in the coupling
//
//	ΔS₁ = S(Δp₁, a_in) + S(p_in, Δa₁);
//
// the product S(Δp₁, Δa₁) is of second order and belongs to the residual.
func SpinTensorKick1(pin, ain, dp1, da1 vec.Vec4) [4][4]float64 {
	x, y := SpinTensor(dp1, ain), SpinTensor(pin, da1)
	for m := range x {
		for n := range x[m] {
			x[m][n] += y[m][n]
		}
	}
	return x
}

// TensorDiff returns S − T.
func TensorDiff(s, t [4][4]float64) [4][4]float64 {
	for m := range s {
		for n := range s[m] {
			s[m][n] -= t[m][n]
		}
	}
	return s
}
