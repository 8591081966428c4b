// Package jet implements truncated multivariate Taylor arithmetic ("jets"):
// a Jet carries the value of a function of four variables x⁰…x³ together
// with all its partial derivatives up to a fixed total order K ≤ 4.
//
// Arithmetic on jets propagates derivatives exactly (to rounding); this is
// forward-mode automatic differentiation with truncated Taylor polynomials,
// Griewank & Walther, Evaluating Derivatives, 2nd ed., SIAM 2008, Ch. 13
// (from memory). Elementary functions f(u) are composed through their
// univariate Taylor series in the nilpotent part h = u − u(0),
//
//	f(u) = Σ_{k=0}^{K} f⁽ᵏ⁾(u₀)/k! · hᵏ,
//
// evaluated by Horner's rule, which is exact for truncated jets because
// h^{K+1} = 0.
//
// Storage and conventions:
//
//   - Coefficients are Taylor coefficients c_α = ∂^α f(x₀)/α! indexed by
//     multi-indices α = (α₀, α₁, α₂, α₃), |α| ≤ K, ordered by total degree
//     (degree 0 first). A Jet is a fixed-size array of 70 = C(8,4)
//     coefficients and an order field; operations touch only the first
//     Len(K) coefficients, so low orders are cheap, and nothing allocates.
//   - Operations are methods on the receiver in the style of math/big:
//     z.Mul(x, y) sets z = x·y and returns z. The result order is the
//     smallest order among the operands. Receivers may alias operands unless
//     a method says otherwise.
//   - Orders 0 and 1 (value and gradient, a dual number in four directions)
//     take dedicated straight-line code paths.
package jet
