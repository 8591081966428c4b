package rk

// Tableau is an embedded explicit Runge–Kutta pair given as coefficient
// data, together with the coefficients of its continuous extension (dense
// output).
//
// With s stages, a step of size h from (t, y) computes
//
//	k_i = f(t + C[i]·h, y + h Σ_{j<i} A[i][j] k_j),   i = 0 … s−1
//	y_new = y + h Σ_i B[i] k_i,   ŷ = y + h Σ_i BHat[i] k_i
//
// and the dense output at t + θh, 0 ≤ θ ≤ 1, is
//
//	y(t + θh) ≈ y + h Σ_i b_i(θ) k_i,   b_i(θ) = Σ_m Dense[i][m] θ^(m+1),
//
// where the sum over i also runs over the extra stages (DenseC, DenseA) that
// some methods evaluate only when dense output is requested.
//
// A Tableau is read-only once it is handed to a Solver.
type Tableau struct {
	// Name identifies the method in output.
	Name string

	// Order is the order of the propagated solution (B), EmbeddedOrder the
	// order of the embedded one (BHat), DenseOrder the order of the
	// continuous extension.
	Order, EmbeddedOrder, DenseOrder int

	// EstimateOrder is the power of h with which the error estimate
	// scales; the step controller uses the exponent 1/EstimateOrder.
	// For a plain embedded pair it is EmbeddedOrder+1.
	EstimateOrder int

	// C holds the nodes, A the strictly lower triangular coupling
	// coefficients (len(A[i]) == i), B and BHat the weights of the
	// propagated and the embedded solution; all have s entries.
	C    []float64
	A    [][]float64
	B    []float64
	BHat []float64

	// BHat3, if non-nil, holds the weights of a second (third-order)
	// embedded solution. The error is then estimated with Hairer's
	// combined formula (see DormandPrince853) instead of ‖y_new − ŷ‖.
	BHat3 []float64

	// FSAL (first same as last) reports that the last stage is evaluated
	// at (t + h, y_new), so that it is the first stage of the next step:
	// C[s−1] = 1 and A[s−1] = B.
	FSAL bool

	// DenseC and DenseA are the nodes and couplings of extra stages needed
	// only by the dense output; DenseA[m] has s+m entries.
	DenseC []float64
	DenseA [][]float64

	// Dense[i] holds the coefficients of θ, θ², … of the dense-output
	// weight b_i(θ), for the s main stages followed by the extra stages.
	Dense [][]float64
}

// Stages returns the number of main stages s.
func (tab *Tableau) Stages() int { return len(tab.C) }

// poly is a polynomial in θ with coefficients of θ⁰, θ¹, ….
type poly []float64

func (p poly) mul(q poly) poly {
	r := make(poly, len(p)+len(q)-1)
	for i, a := range p {
		for j, b := range q {
			r[i+j] += a * b
		}
	}
	return r
}

// denseFromBasis converts a dense output written as
// Σ_j basis_j(θ)·(Σ_i coef[j][i] k_i) into per-stage monomial coefficients
// of θ¹, θ², … (the basis polynomials must vanish at θ = 0).
func denseFromBasis(stages int, basis []poly, coef [][]float64) [][]float64 {
	deg := 0
	for _, p := range basis {
		if len(p)-1 > deg {
			deg = len(p) - 1
		}
	}
	out := make([][]float64, stages)
	for i := range out {
		out[i] = make([]float64, deg)
		for j, p := range basis {
			if i >= len(coef[j]) || coef[j][i] == 0 {
				continue
			}
			for m := 1; m < len(p); m++ {
				out[i][m-1] += coef[j][i] * p[m]
			}
		}
	}
	return out
}
