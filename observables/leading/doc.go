// Package leading gives the impulse Δp^μ and spin kick Δa^μ of a probe
// scattering off a stationary source to first order in the coupling, in
// closed form where one is known, to all orders in the spins.
//
// Frame and kinematics: the source rest frame; the probe comes in on the
// straight line x(t) = b + v t with four-velocity u = γ(1, v) and covariant
// impact parameter b (orthogonal to u and to the source's four-velocity,
// pointing from the source to the probe). Signature (−,+,+,+), G = c = 1,
// Gaussian units, ε_{0123} = +1. Spin vectors a = S/m.
//
// # Newman–Janis structure
//
// The root-Kerr and Kerr fields are the point-source fields shifted to the
// imaginary position i a (Newman & Janis 1965, J. Math. Phys. 6, 915;
// Newman 1973, J. Math. Phys. 14, 102; from memory), and a root-Kerr or
// Kerr probe feels the field at its own shifted position x − i a₁. At first
// order the line integral of the field then depends on the spins only
// through the complex impact parameter
//
//	𝐁 = b − i Π(a₁ + a₂),
//
// Π the projection orthogonal to v: the spin components along v shift the
// time contour and drop out as long as the line does not cross the branch
// disk of the combined spin. Moving spin between probe and source at fixed
// a₁ + a₂ therefore leaves Δp unchanged (Vines 2017, Class. Quantum Grav.
// 35, 084002, for gravity, from memory).
//
// # Electromagnetism
//
// A probe of electric charge q and magnetic charge g in the complex field
// 𝐅 = E + iB feels the force Re[(q − ig)(𝐅 − i v×𝐅)], that is
// q(E + v×B) + g(B − v×E). The root-Kerr probe's momentum and spin are
// rotated by one Lorentz generator built from the self-dual field tensor at
// its shifted position; see EMImpulse for the closed form. The couplings
// enter only through the product (q − ig)(Q + iP): a common duality
// rotation (q − ig) → e^{−iθ}(q − ig), (Q + iP) → e^{iθ}(Q + iP) changes
// nothing.
//
// # Gravity
//
// The first-order (1PM) impulse and spin kick off Kerr have the same
// Newman–Janis structure, with the mass M in place of the charge and a
// velocity dependence of their own (Vines 2017, from memory); a NUT charge
// N enters through a mass–NUT duality phase, as a magnetic charge enters
// through Q + iP: with the complex impact parameter 𝐁 = b − iΠa used here
// the combination is M − iN (equivalently M + iN with b + iΠa, the form of
// Emond, Huang, Kol, Moynihan & O'Connell 2020, from memory), for N the NUT
// parameter of background/spacetime.KerrNewmanNUT. Each gravitational
// formula carries its own reference in its doc comment.
//
// Every closed form is checked in the tests against a quadrature of the
// first-order force and torque along the straight line, which the package
// also exports for backgrounds without a closed form.
package leading
