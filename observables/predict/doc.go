// Package predict checks a user's own prediction of a scattering
// observable against the nonlinear result: it classifies the agreement
// order by order in the coupling, with the numerical error bars, and when
// the first order disagrees it searches a catalogue of convention changes
// for one that explains the difference.
//
// # Predictions
//
// A prediction is a formula or a table of values for one observable, a
// frame component (t, l, b, n) of the impulse, dp_X, or of the spin kick,
// da_X (see observables.Frame). Formulas are written in a small language
// over complex scalars and complex 3-vectors in the source rest frame:
//
//	numbers, + − * / and ^ (or **), unary ±, parentheses
//	let x = …; …             local names
//	u.x, u.y, u.z            components of a vector
//	scalars  i pi gamma v p E b m q g Q P M N eps
//	vectors  a1 a2 lhat bhat nhat vvec bvec
//	functions sqrt exp log sin cos tan asin acos atan sinh cosh tanh asinh
//	          acosh atanh re im conj abs arg atan2 (scalars),
//	          dot cross perp norm unit vec vre vim vconj (vectors)
//
// m, q, g are the probe's mass and electric and magnetic charges, Q, P, M,
// N the source's charges, mass and NUT parameter, a1 and a2 the spin
// vectors a = S/m of probe (rest frame) and source, eps the coupling
// (qQ/(mb) or M/b, signed), p and E the incoming momentum and energy.
// dot is bilinear (no complex conjugation), so that 𝐁·𝐁 of a complex
// impact parameter 𝐁 = b − iΠa is dot(B, B); perp(u) is Πu, the part
// orthogonal to l̂; every function takes the principal branch. A formula's
// value must be real at every configuration: take re(...) of a complex
// expression. Example, the Coulomb impulse: dp_b = 2*q*Q/(v*b).
//
// The expression library github.com/expr-lang/expr parses the text (it has
// no file, network or code access); its syntax tree is compiled here into
// typed closures, because its own virtual machine has no complex numbers
// and its operator overloading does not carry the types of let-bound
// values. Anything but the language above is refused with a one-line
// error naming the column; a compiled formula evaluates in at most one
// operation per node of its syntax tree (no loops, no collections), and
// formulas are limited to MaxFormulaLen bytes and MaxFormulaNodes nodes.
//
// # Conventions
//
// Conventions declares the prediction's conventions: index position and
// signature, units, impact-parameter definition, spin sense, the body
// that receives the impulse, and the claimed order. The formula reads the
// quantities converted to them, and its value is converted back.
//
// # Verdicts
//
// Check takes a short scan of one configuration: the nonlinear result N_k
// with its error estimate σ_k at couplings ε_k (Couplings: the given ε and
// successive halvings) and the prediction U_k, and fits the residual
// r = N − U as r/ε = c₁ + c₂ ε + … by weighted least squares (polynomial
// degree by the corrected Akaike criterion; uncertainties with the Birge
// ratio, the truncation change and the window change). With Significance
// = 3 standard deviations:
//
//	every |r_k| consistent with σ_k (χ² test)  agrees to all orders within errors
//	|c₁| > 3σ₁                                 disagrees at first order; −c₁/(N/ε)
//	                                           is the relative error, and the
//	                                           exponent n of |r| ∝ εⁿ is fitted
//	|c₁| ≤ 3σ₁, |c₂| > 3σ₂                     agrees at first order (r ∝ ε²)
//	|c₁| ≤ 3σ₁, |c₂| ≤ 3σ₂                     agrees beyond first order (r ∝ ε³ or faster)
//
// The library's own first-order residual is fitted the same way and
// reported beside (its c₂ is the true ε² coefficient).
//
// # Diagnosis
//
// For a first-order disagreement, each change of Catalogue (data: spin
// signs, magnetic-charge and NUT signs, orientation of ε_{μνρσ}, in and
// out swapped, impulse on the other body, index lowered in either
// signature, factors 4π of the unit system, factors 2 in the coupling or
// the spin normalisation, sign of b, canonical instead of covariant b) is
// applied to the prediction, and those after which the first-order part of
// the residual vanishes within errors are reported; pairs of changes are
// tried when no single one works. Changes that give the same values for
// the observable are reported together. When none works the verdict says
// that no convention in the catalogue explains the difference. A table of
// values admits only the changes that act on values (signs, factors).
//
// # Scenarios
//
// A scenario's [prediction] table (scenario.PredictionSpec), or one read
// from a predictions file (scenario.ParsePrediction), compiles with
// CompileSpec into a Spec: the conventions, the formulas and a Table of
// values (ReadTable: CSV, header row eps, dp_X, …, one column per
// parameter axis). ShortScan turns a scenario into its short scan (its
// own |ε| and exact halvings, parameter axes kept), scan.Run integrates
// it, and Evaluate returns one Configuration per combination of the
// parameter axes with its verdicts:
//
//	sp, _ := predict.CompileSpec(s.Prediction, dir)
//	short, _ := predict.ShortScan(s, 0)
//	recs, _ := scan.Run(ctx, short, nil)
//	cfgs, _ := predict.Evaluate(short, recs, sp, nil)
//
// QuantitiesOf and PointOf read the quantities and the numbers from the
// scenario and its records, so every background and probe model the
// scenario package builds is checked the same way. Errors of the input
// are scenario.InputErrors whose one line names the field.
package predict
