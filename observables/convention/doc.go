// Package convention transforms scattering output between the conventions a
// reader may expect, and names each choice so that every output can state
// the conventions it uses.
//
// The library computes in one set of conventions (G = c = 1, Gaussian
// electromagnetic units, metric signature (−,+,+,+), ε_{0123} = +1, the
// covariant impact parameter, spin vectors a^μ = S^μ/m). This package
// re-expresses results without changing the physics:
//
//	Signature  (−,+,+,+) or (+,−,−,−): contravariant components v^μ are
//	           the same numbers in both; covariant components v_μ and scalar
//	           products u·v change sign (η ↦ −η).
//	Units      Gaussian or Heaviside–Lorentz: q_HL = √(4π) q_G for every
//	           charge (Jackson, Classical Electrodynamics, 3rd ed., Appendix,
//	           Table 3, from memory). The electromagnetic coupling, always
//	           written ε = qQ/(m b) with the charges of the chosen system,
//	           becomes ε_HL = 4π ε_G; momenta and impulses do not change.
//	Impact     covariant b (orthogonal to both incoming velocities), b_J =
//	           |J|/|p⃗_in|, or the eikonal b (orthogonal to p_in + p_out); they
//	           differ at next-to-leading order, so the coupling ε = C/b and a
//	           first-order formula evaluated at b inherit the choice.
//	Spin       the spin vector a^μ = S^μ/m, or the spin tensor
//	           S^{μν} = m ε^{μνρσ} u_ρ a_σ = ε^{μνρσ} p_ρ a_σ, ε^{0123} = −1,
//	           so that a rest-frame a along +z gives S^{xy} = m a_z = J_z
//	           (e.g. Vines 2017, eq. (2.2), from memory; the sign is fixed by
//	           the project's convention that a spin along +z is angular
//	           momentum along +z).
package convention
