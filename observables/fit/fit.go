package fit

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// Point is one entry of a coupling scan.
type Point struct {
	// Eps is the coupling; it must be positive.
	Eps float64
	// First is the first-order prediction (used by Breakdown).
	First float64
	// Residual is numeric − first order.
	Residual float64
	// Sigma is the standard error of Residual; it must be positive.
	Sigma float64
}

// ErrTooFewPoints is returned when a fit has fewer usable points than it
// has parameters plus one.
var ErrTooFewPoints = errors.New("fit: too few usable points")

// sorted returns a copy of pts sorted by Eps, after validation.
func sorted(pts []Point) ([]Point, error) {
	out := append([]Point(nil), pts...)
	for i, p := range out {
		if !(p.Eps > 0) || math.IsInf(p.Eps, 0) {
			return nil, fmt.Errorf("fit: point %d: ε = %v must be positive and finite", i, p.Eps)
		}
		if !(p.Sigma > 0) || math.IsInf(p.Sigma, 0) {
			return nil, fmt.Errorf("fit: point %d: σ = %v must be positive and finite", i, p.Sigma)
		}
		if math.IsNaN(p.Residual) || math.IsInf(p.Residual, 0) {
			return nil, fmt.Errorf("fit: point %d: residual %v is not finite", i, p.Residual)
		}
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Eps < out[j].Eps })
	return out, nil
}

// linearFit solves the weighted least-squares problem min Σ ((y − A c)/s)²
// and returns the coefficients, their covariance (not yet scaled), χ² and
// the number of degrees of freedom.
func linearFit(a *mat.Dense, y, s []float64) (c []float64, cov *mat.SymDense, chi2 float64, dof int, err error) {
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
	// cov = (AᵀWA)⁻¹ = R⁻¹R⁻ᵀ with R the k×k upper triangle.
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
	cov = mat.NewSymDense(k, nil)
	cov.SymOuterK(1, &ri)
	var res mat.VecDense
	res.MulVec(aw, &x)
	res.SubVec(&res, yw)
	chi2 = mat.Dot(&res, &res)
	c = make([]float64, k)
	for j := range c {
		c[j] = x.AtVec(j)
	}
	return c, cov, chi2, n - k, nil
}

// birge returns max(1, √(χ²/dof)).
func birge(chi2 float64, dof int) float64 {
	if dof <= 0 {
		return 1
	}
	return math.Max(1, math.Sqrt(chi2/float64(dof)))
}
