package fit

import "gonum.org/v1/gonum/mat"

// WeightedLeastSquares solves min Σ_i ((y_i − Σ_j a_ij c_j)/s_i)² by QR
// factorisation and returns the coefficients c, their covariance
// (AᵀWA)⁻¹ (not scaled by the Birge ratio), χ² and the number of degrees
// of freedom. It returns ErrTooFewPoints when A has no more rows than
// columns. It is the solver of the fits of this package, exported for
// other analyses of scans.
func WeightedLeastSquares(a *mat.Dense, y, s []float64) (c []float64, cov *mat.SymDense, chi2 float64, dof int, err error) {
	return linearFit(a, y, s)
}
