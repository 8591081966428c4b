// Package em provides static flat-space electromagnetic fields as the
// complex (Riemann–Silberstein) field
//
//	𝐅 = E + iB     (Gaussian units, G = c = 1)
//
// evaluable at complex positions z ∈ ℂ³, together with its exact Jacobian
// ∂𝐅_i/∂z_j and the complex scalar potential 𝒱 with 𝐅 = −∇𝒱.
//
// In a source-free static region Maxwell's equations read ∇·𝐅 = 0 and
// ∇×𝐅 = 0, and every field here is holomorphic in each z_j away from its
// sources. Evaluating at a complex point is the Newman–Janis shift: the
// Coulomb field of a charge at the imaginary position i a is the
// electromagnetic field of the Kerr–Newman solution at G → 0, the
// "root-Kerr" field (Newman 1973, J. Math. Phys. 14, 102; Lynden-Bell 2004,
// Phys. Rev. D 70, 105017; both from memory). A probe whose field is felt at
// x − i a carries a magnetic moment μ = q a (gyromagnetic ratio 2).
//
// Conventions: the real part of 𝒱 is the electric potential Φ and its
// imaginary part the magnetic scalar potential Ψ, so that E = −∇Φ and,
// away from sources, B = −∇Ψ. Electric charge Q and magnetic charge P enter
// together as Q + iP: a dyon's field is (Q + iP) x/|x|³.
//
// Members: Uniform, Coulomb, Monopole, Dyon and RootKerr. RootKerr has a
// branch cut on the real section, the disk a·x = 0, |x_⊥| < |a|; Disk and
// RootKerr.CrossesDisk describe and detect it.
package em
