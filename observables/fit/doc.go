// Package fit analyses coupling scans: how the residual between a numerical
// result and its first-order prediction scales with the coupling ε, and
// what it says about the next orders, with uncertainties that include the
// truncation of the fitted series.
//
// A scan is a list of Points (ε_k, first-order value, residual_k, σ_k),
// where residual = numeric − first order and σ is the numerical error of
// the residual. Three analyses are provided:
//
//	Exponent   exponent n of |residual| ≈ A ε^n (1 + d₁ε + …)
//	NextOrder  the ε → 0 limit c₂ of residual/ε² and its slope c₃ there
//	Breakdown  the coupling where |residual|/|first order| reaches a threshold
//
// Fits are weighted least squares (Gauss–Markov; e.g. Press et al.,
// Numerical Recipes, 3rd ed., §15.4, from memory), accumulated by Givens
// rotations so that one pass over the points serves every window and every
// model of a nested family (nested.go).
//
// Uncertainty of a fitted number. Three published ingredients, combined so
// that the coverage test of this package (scans integrated with
// integrate.Scatter, exact answers from validate/exact) holds the truth
// within 2σ in at least 95 % of its cases:
//
//   - Model averaging: in each window every model of the family (polynomial
//     degrees 0 … n − 3, or 0 … n − 4 correction terms of the power law) is
//     fitted and weighted by Akaike's criterion, w ∝ exp(−ΔAIC/2) with
//     AIC = χ² + 2k for known point errors (Akaike 1974; equivalent to
//     Mallows' C_p, Technometrics 15, 661 (1973); from memory),
//     and the unconditional variance Σ w_i [var_i + (θ_i − θ̄)²] of
//     Burnham & Anderson (2002, eq. (6.12)) carries the spread of the
//     models the criterion cannot tell apart. When the criterion prefers
//     the most flexible model a window allows, the last change (from the
//     next-to-last model) is added as the truncation estimate.
//   - Overdispersion: if the most flexible model leaves χ²/dof = ĉ > 1,
//     every variance is multiplied by ĉ and the criterion uses χ²/ĉ
//     (QAIC; Burnham & Anderson 2002, §2.5) — the Birge-ratio inflation
//     (Birge 1932) applied consistently to the whole family.
//   - Correlated point errors: integration errors vary smoothly with ε and
//     have one sign over a scan (measured: error/σ ≈ 0.8–0.9 on most points
//     of a Darwin scan), so a fit that treats them as independent would
//     claim a precision √n too good. For errors of any common non-negative
//     correlation ρ, Var(Σ L_i e_i) = ρ(Σ L_i σ_i)² + (1 − ρ) Σ L_i² σ_i²
//     ≤ max of the two terms; each model's variance is that maximum, the
//     first term being the response of the fit to a shift of every point by
//     its own σ (the "offset" treatment of a fully correlated systematic
//     error; e.g. Pumplin et al., JHEP 07 (2002) 012, from memory).
//
// Window: the rule of intersecting confidence intervals (Goldenshluger &
// Nemirovski 1997; Katkovnik 1999) over windows made of the k smallest
// couplings keeps the windows whose estimates agree with all smaller ones,
// and the most precise of them is reported; it stops before couplings where
// the series converges too slowly (a radius of convergence, a capture) for
// the models to follow.
//
// Quality (χ², dof, Birge ratio, p-value, the inflation applied) is part of
// every result; Quality.Poor marks fits whose model does not describe the
// points within their errors.
package fit
