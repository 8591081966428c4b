// Package spacetime provides stationary curved backgrounds given by their
// metric in asymptotically Cartesian coordinates (t, x, y, z), and evaluates
// at any event the metric, its inverse, the Christoffel symbols, the Riemann
// tensor and its covariant derivative, and the electromagnetic potential and
// field, all exactly to rounding: the metric and potential are
// differentiated automatically in truncated Taylor arithmetic, and the
// curvature follows from its closed form in the metric derivatives. The
// families of this package take a fast path (static three-variable Taylor
// arithmetic, taylor.go, and the curvature formulas of evalstatic.go); any
// other Metric is differentiated in four-variable jets (package jet). For
// Kerr–Newman (orders 2 and 3) and, without the field gradient,
// Kerr–Newman–Taub–NUT (order 2) the curvature itself is in closed form:
// the type D Weyl tensor from Ψ₂ and the self-dual principal bivector, the
// Ricci part from the Maxwell stress (kerrcurv.go, kntncurv.go). The tests
// hold the paths to rounding of each other.
//
// Conventions: G = c = 1, Gaussian units (Coulomb field E = Q r̂/r²),
// signature (−,+,+,+), coordinates x^μ = (t, x, y, z),
//
//	Γ^μ_αβ   = ½ g^{μν}(∂_α g_νβ + ∂_β g_να − ∂_ν g_αβ)
//	R^μ_νρσ  = ∂_ρΓ^μ_νσ − ∂_σΓ^μ_νρ + Γ^μ_ρλΓ^λ_νσ − Γ^μ_σλΓ^λ_νρ
//	R_νσ     = R^μ_νμσ
//	F_μν     = ∂_μA_ν − ∂_νA_μ,   A_μ = (−Φ, A⃗),   E_i = F_{i0}
//
// so that for Kerr–Newman the Einstein–Maxwell equations read
// R_μν = 8π T_μν with T_μν = (1/4π)(F_μα F_ν^α − ¼ g_μν F_αβF^αβ) (Misner,
// Thorne & Wheeler 1973, §21 and eq. 22.14, from memory).
//
// Families: KerrNewman (Kerr–Schild coordinates; Schwarzschild,
// Reissner–Nordström and Kerr are members), its dyonic form
// DyonicKerrNewman (magnetic charge P, with a Dirac string of the
// potential on the negative z axis) and KerrNewmanNUT (Boyer–
// Lindquist-type form of Demiański & Newman 1966 mapped to oblate-spheroidal
// Cartesian coordinates, with the Misner-string gauge as a parameter, and
// a magnetic charge P whose Dirac string lies on the Misner string). Each
// family also provides its linearization, first order in the couplings,
// evaluated by NewLinearEvaluator.
package spacetime

//go:generate go run gen_taylor.go
