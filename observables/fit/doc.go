// Package fit analyses coupling scans: how the residual between a numerical
// result and its first-order prediction scales with the coupling ε.
//
// A scan is a list of Points (ε_k, first-order value, residual_k, σ_k),
// where residual = numeric − first order and σ is the numerical error of
// the residual. Three analyses are provided:
//
//	Exponent   slope n of log|residual| against log ε (residual ∝ ε^n)
//	NextOrder  the ε → 0 limit c₂ of residual/ε², by a weighted polynomial fit
//	Breakdown  the coupling where |residual|/|first order| reaches a threshold
//
// All fits are weighted least squares (Gauss–Markov; e.g. Press et al.,
// Numerical Recipes, 3rd ed., §15.4, from memory) solved by QR factorisation
// with gonum mat. Parameter uncertainties are the square roots of the
// diagonal of the covariance (AᵀWA)⁻¹, multiplied by √(χ²/dof) when that
// exceeds one (the Birge ratio; common practice), so that an imperfect model
// or underestimated σ widens rather than hides the uncertainty.
package fit
