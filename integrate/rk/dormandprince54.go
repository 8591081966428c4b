package rk

// Dormand–Prince 5(4).
//
// J. R. Dormand, P. J. Prince, A family of embedded Runge–Kutta formulae,
// J. Comput. Appl. Math. 6 (1980) 19–26, Table 2 ("RK5(4)7M"); the same
// coefficients are Table 5.2 of Hairer, Nørsett & Wanner, Solving ODEs I
// (1993), §II.5. Seven stages, the last one FSAL.
//
// Continuous extension of order 4: L. F. Shampine, Some practical
// Runge–Kutta formulas, Math. Comp. 46 (1986) 135–150, with the free
// parameter chosen as in Hairer, Nørsett & Wanner (1993, §II.6, dense output
// of their 5(4) code). The exact rationals below are the monomial coefficients of
// b_i(θ) = Σ_m P_im θ^m, m = 1 … 4.

// DormandPrince54 returns the Dormand–Prince 5(4) pair with its 4th-order
// continuous extension.
func DormandPrince54() *Tableau {
	return &Tableau{
		Name:          "DormandPrince54",
		Order:         5,
		EmbeddedOrder: 4,
		DenseOrder:    4,
		EstimateOrder: 5,
		FSAL:          true,
		C:             []float64{0, 1.0 / 5, 3.0 / 10, 4.0 / 5, 8.0 / 9, 1, 1},
		A: [][]float64{
			{},
			{1.0 / 5},
			{3.0 / 40, 9.0 / 40},
			{44.0 / 45, -56.0 / 15, 32.0 / 9},
			{19372.0 / 6561, -25360.0 / 2187, 64448.0 / 6561, -212.0 / 729},
			{9017.0 / 3168, -355.0 / 33, 46732.0 / 5247, 49.0 / 176, -5103.0 / 18656},
			{35.0 / 384, 0, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84},
		},
		B:    []float64{35.0 / 384, 0, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84, 0},
		BHat: []float64{5179.0 / 57600, 0, 7571.0 / 16695, 393.0 / 640, -92097.0 / 339200, 187.0 / 2100, 1.0 / 40},
		Dense: [][]float64{
			{1, -8048581381.0 / 2820520608, 8663915743.0 / 2820520608, -12715105075.0 / 11282082432},
			{0, 0, 0, 0},
			{0, 131558114200.0 / 32700410799, -68118460800.0 / 10900136933, 87487479700.0 / 32700410799},
			{0, -1754552775.0 / 470086768, 14199869525.0 / 1410260304, -10690763975.0 / 1880347072},
			{0, 127303824393.0 / 49829197408, -318862633887.0 / 49829197408, 701980252875.0 / 199316789632},
			{0, -282668133.0 / 205662961, 2019193451.0 / 616988883, -1453857185.0 / 822651844},
			{0, 40617522.0 / 29380423, -110615467.0 / 29380423, 69997945.0 / 29380423},
		},
	}
}
