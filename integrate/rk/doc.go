// Package rk integrates systems of ordinary differential equations
// y' = f(t, y) with embedded explicit Runge–Kutta pairs, adaptive step-size
// control, dense output and event location.
//
// The package knows only []float64 state vectors; it holds no physics.
//
// Methods are coefficient data (a Tableau), one file per family, all driven
// by one generic stepper:
//
//	DormandPrince54  Dormand & Prince 1980, 5(4), FSAL, 4th-order dense output
//	                 (Shampine 1986; Hairer, Nørsett & Wanner 1993, §II.6)
//	DormandPrince853 Hairer, Nørsett & Wanner 1993, §II.10: 8(5,3), FSAL,
//	                 7th-order dense output (three extra stages)
//	Tsitouras54      Tsitouras 2011, 5(4), FSAL, 4th-order dense output
//
// Conventions. The error of a step is measured in the mixed root-mean-square
// norm of Hairer, Nørsett & Wanner (1993, §II.4, eq. (4.11)):
//
//	err = sqrt( (1/n) Σ_i (e_i / sc_i)² ),  sc_i = AbsTol + RelTol·max(|y_i|, |ŷ_i|)
//
// where e is the difference between the two solutions of the pair; a step is
// accepted when err ≤ 1. The propagated solution is the higher-order one
// (local extrapolation). Step sizes follow the PI controller of Gustafsson
// (1991) in the form used by Hairer's codes (Hairer & Wanner 1996, §IV.2);
// the starting step is chosen by the algorithm of Hairer, Nørsett & Wanner
// (1993, §II.4). Integration may run backwards (t1 < t0).
//
// References:
//
//	J. R. Dormand, P. J. Prince, A family of embedded Runge–Kutta formulae,
//	  J. Comput. Appl. Math. 6 (1980) 19–26.
//	L. F. Shampine, Some practical Runge–Kutta formulas, Math. Comp. 46
//	  (1986) 135–150.
//	E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential
//	  Equations I, 2nd ed., Springer 1993.
//	E. Hairer, G. Wanner, Solving Ordinary Differential Equations II, 2nd ed.,
//	  Springer 1996.
//	K. Gustafsson, Control theoretic techniques for stepsize selection in
//	  explicit Runge–Kutta methods, ACM Trans. Math. Softw. 17 (1991) 533–554.
//	Ch. Tsitouras, Runge–Kutta pairs of order 5(4) satisfying only the first
//	  column simplifying assumption, Comput. Math. Appl. 62 (2011) 770–775.
//	R. P. Brent, Algorithms for Minimization without Derivatives,
//	  Prentice-Hall 1973, ch. 4 (root finding on the dense output).
//
// Each built-in pair also has a generated stepper (unrolled.go, written
// by gen_unrolled.go with go generate): the same operations in the same
// order with the coefficients as literals, used automatically when a
// Solver's tableau has exactly the generated coefficients, and tested
// step for step against the generic stepper. The default pair also has
// fixed-size steppers for 8 and 12 components (with or without one
// carried component): every component written out on arrays of that
// length, and with Settings.Weights the error vectors and the norm's sums
// of squares in one pass, again the same operations in the same order.
package rk

//go:generate go run gen_unrolled.go
