package rk

// Tsitouras 5(4).
//
// Ch. Tsitouras, Runge–Kutta pairs of order 5(4) satisfying only the first
// column simplifying assumption, Comput. Math. Appl. 62 (2011) 770–775,
// Table 1 (coefficients and the error weights b − b̂) and its continuous
// extension of order 4. Decimal values from memory; they are proven by the
// order-condition tests of this package (rooted trees up to order 5 for b,
// 4 for b̂, and the θ-dependent conditions up to order 4 for the
// interpolant), not trusted as typed. Seven stages, the last one FSAL.

// Tsitouras54 returns the Tsitouras 5(4) pair with its 4th-order continuous
// extension.
func Tsitouras54() *Tableau {
	b := []float64{
		0.09646076681806523, 0.01, 0.4798896504144996, 1.379008574103742,
		-3.290069515436081, 2.324710524099774, 0,
	}
	// b − b̂ (Tsitouras 2011, Table 1).
	e := []float64{
		-0.00178001105222577714, -0.0008164344596567469, 0.007880878010261995,
		-0.1447110071732629, 0.5823571654525552, -0.45808210592918697,
		1.0 / 66,
	}
	bhat := make([]float64, len(b))
	for i := range b {
		bhat[i] = b[i] - e[i]
	}
	return &Tableau{
		Name:          "Tsitouras54",
		Order:         5,
		EmbeddedOrder: 4,
		DenseOrder:    4,
		EstimateOrder: 5,
		FSAL:          true,
		C:             []float64{0, 0.161, 0.327, 0.9, 0.9800255409045097, 1, 1},
		A: [][]float64{
			{},
			{0.161},
			{-0.008480655492356989, 0.335480655492357},
			{2.897153057105493, -6.359448489975075, 4.3622954328695815},
			{5.325864828439257, -11.748883564062828, 7.4955393428898365, -0.09249506636175525},
			{5.86145544294642, -12.92096931784711, 8.159367898576159, -0.071584973281401, -0.028269050394068383},
			b[:6],
		},
		B:    b,
		BHat: bhat,
		// b_i(θ) = r_i1 θ + r_i2 θ² + r_i3 θ³ + r_i4 θ⁴.
		Dense: [][]float64{
			{1, -2.763706197274826, 2.9132554618219126, -1.0530884977290216},
			{0, 0.13169999999999998, -0.2234, 0.1017},
			{0, 3.9302962368947516, -5.941033872131505, 2.490627285651253},
			{0, -12.411077166933676, 30.33818863028232, -16.548102889244902},
			{0, 37.50931341651104, -88.1789048947664, 47.37952196281928},
			{0, -27.896526289197286, 65.09189467479366, -34.87065786149661},
			{0, 1.5, -4, 2.5},
		},
	}
}
