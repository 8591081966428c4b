package fit

import (
	"fmt"

	"gonum.org/v1/gonum/mat"
)

// WeightedLeastSquares solves min Σ_i ((y_i − Σ_j a_ij c_j)/s_i)² by QR
// factorisation and returns the coefficients c, their covariance
// (AᵀWA)⁻¹ (not scaled by the Birge ratio), χ² and the number of degrees
// of freedom. It returns ErrTooFewPoints when A has no more rows than
// columns.
func WeightedLeastSquares(a *mat.Dense, y, s []float64) (c []float64, cov *mat.SymDense, chi2 float64, dof int, err error) {
	n, k := a.Dims()
	if n <= k {
		return nil, nil, 0, 0, ErrTooFewPoints
	}
	aw := mat.NewDense(n, k, nil)
	yw := mat.NewVecDense(n, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < k; j++ {
			aw.Set(i, j, a.At(i, j)/s[i])
		}
		yw.SetVec(i, y[i]/s[i])
	}
	var qr mat.QR
	qr.Factorize(aw)
	var x mat.VecDense
	if err := qr.SolveVecTo(&x, false, yw); err != nil {
		return nil, nil, 0, 0, fmt.Errorf("fit: singular design: %w", err)
	}
	var r mat.Dense
	qr.RTo(&r)
	rk := mat.NewTriDense(k, mat.Upper, nil)
	for i := 0; i < k; i++ {
		for j := i; j < k; j++ {
			rk.SetTri(i, j, r.At(i, j))
		}
	}
	var ri mat.TriDense
	if err := ri.InverseTri(rk); err != nil {
		return nil, nil, 0, 0, fmt.Errorf("fit: singular design: %w", err)
	}
	// (AᵀWA)⁻¹ = R⁻¹R⁻ᵀ.
	cov = mat.NewSymDense(k, nil)
	cov.SymOuterK(1, &ri)
	var res mat.VecDense
	res.MulVec(aw, &x)
	res.SubVec(&res, yw)
	c = make([]float64, k)
	for j := range c {
		c[j] = x.AtVec(j)
	}
	return c, cov, mat.Dot(&res, &res), n - k, nil
}
