// Package integrate holds the equations of motion of ricochet's probes and
// the scattering driver that carries a probe from asymptotic in-data to
// asymptotic out-data.
//
// One file per probe model holds its equations of motion and the paper they
// come from:
//
//	charge.go    point charge or dyon, Lorentz force (with the duality-covariant
//	             magnetic-charge coupling)
//	bmt.go       spinning charge with any gyromagnetic ratio: BMT precession
//	             (Bargmann, Michel & Telegdi 1959) and the Stern–Gerlach force
//	rootkerr.go  the all-multipole root-Kerr probe: one Lorentz generator,
//	             built from the self-dual field at the Newman–Janis shifted
//	             position x − i a, rotates both momentum and spin
//	rootkerr_conservative.go
//	             the conservative completion of the root-Kerr probe and
//	             RootKerrFamily
//	geodesic.go  geodesic and charged geodesic (Lorentz force in curved
//	             spacetime) in the backgrounds of background/spacetime
//	dixon.go     the spinning-body core: Mathisson–Papapetrou–Dixon with
//	             the Dixon–Souriau electromagnetic dipole (any g), Tulczyjew
//	             condition, flat space (em.Field) and curved (spacetime);
//	             body.go holds its tensor algebra
//
// # What is physical at second order
//
// Dixon (flat space, any g) is the physical spinning charge: it conserves
// E, every component of J = x ∧ p + S in a Coulomb field, the mass
// function and S² to rounding, and its second-order coefficient linear in
// the probe spin agrees with the canonical Thomas–BMT Hamiltonian to
// ≤ 1e-7 at v = 0.3, 0.6, 0.9 (tests in dixon_secondorder_test.go): the
// probe spin weighs (g − 1)/2 times the source spin at second order (1/2
// at g = 2). BMT, RootKerr and RootKerrConservative below are not
// consistent bodies beyond first order: their directional Stern–Gerlach
// force and dx/dτ = p/m give the probe spin the source spin's weight at
// second order and drift J at first order in coupling and spin (measured:
// |ΔJ|/(|p|b) ≈ 1.05 ε|a|/b). Keep them only as non-canonical members of
// a model spread; their first-order impulse and spin kick are right.
//
// and beside them the perturbative evaluators: line.go (FirstOrder, the
// straight-line quadrature of the first-order force and torque) and
// second.go (SecondOrder, the second-order impulse and spin kick by
// iterating the equations of motion once about the straight line).
//
// # Completions of the root-Kerr probe
//
// The root-Kerr probe is defined by its first-order coupling: linear in the
// field, all orders in spin, the field evaluated at the Newman–Janis
// shifted point x − i a (Newman & Janis 1965; Arkani-Hamed, Huang &
// O'Connell 2020; Guevara, Ochirov & Vines 2019; all from memory).
// Integrated nonlinearly, that law must be completed at second order in
// the field, and the completion is a choice. Work in the rest frame of a
// static source with the complex potential 𝒱 (𝐅 = E + iB = −∇𝒱), probe
// charges (q, g), c = q − ig, a⃗ the spatial part of the spin vector and
//
//	U(x⃗, a⃗) = Re[c 𝒱(x⃗ − i a⃗)],
//	𝔈 = Re[c 𝐅(x⃗ − i a⃗)] = −∇ₓU,   𝔅 = Im[c 𝐅(x⃗ − i a⃗)] = −∇ₐU
//
// (the second form of each because 𝒱 is holomorphic: ∂/∂a = −i ∂/∂z).
//
// Lorentz-generator completion (RootKerr). One generator rotates p and a;
// per coordinate time t, with v = p⃗/p⁰,
//
//	dx⃗/dt = v,   dp⃗/dt = 𝔈 + v × 𝔅,   da⃗/dt = (a⁰𝔈 + a⃗ × 𝔅)/p⁰,
//
// so d(p⁰ + U)/dt = v·𝔈 − 𝔈·v − 𝔅·da⃗/dt = −a⁰ 𝔈·𝔅/p⁰: the Killing energy
// drifts at second order in the field when the spin has a component along
// the motion (a⁰ = a⃗·v ≠ 0).
//
// Conservative completion (RootKerrConservative). Take H = √(m² + p⃗²) +
// U(x⃗, a⃗) on the variables (x⃗, p⃗, a⃗), with the spin condition a·p = 0
// (a⁰ ≡ a⃗·p⃗/p⁰; covariant, of Tulczyjew type), and ask for an
// antisymmetric bracket whose flow has the Lorentz-generator momentum and
// spin laws. With {x_i, p_j} = δ_ij and the kinetic bracket
// {p_i, p_j} = ε_ijk 𝔅_k (the usual magnetic bracket of a charge, with the
// shifted field), ṗ = {p, H} = −∇ₓU + v × 𝔅 = 𝔈 + v × 𝔅. For the spin,
//
//	ȧ_i = {a_i, x_j}(−𝔈_j) + {a_i, a_j}(−𝔅_j)
//
// reproduces (a⁰𝔈 + a⃗ × 𝔅)/p⁰ for all fields only with
//
//	{x_i, a_j} = (a⁰/p⁰) δ_ij,   {a_i, a_j} = ε_ijk a_k/p⁰,   {p_i, a_j} = 0,
//
// and then ẋ = {x, H} = v − (a⁰/p⁰)𝔅. Energy conservation, dH/dt = {H, H}
// = 0, needs only antisymmetry; directly, dH/dt = v·(𝔈 + v×𝔅) −
// 𝔈·(v − a⁰𝔅/p⁰) − 𝔅·(a⁰𝔈 + a⃗×𝔅)/p⁰ = 0. The momentum and spin laws are
// those of the Lorentz-generator completion, so p·p, a·p and a·a are kept
// exactly; the only change is the velocity term −a⁰𝔅/p⁰, of first order in
// the field, which moves the worldline by O(ε) and the observables by
// O(ε²). The bracket fails the Jacobi identity (already at zero field), so
// this is an almost-Poisson (not symplectic) Hamiltonian flow; a completion
// with a genuine Poisson structure (canonical variables with the
// rest-frame spin algebra, as in the relativistic top of Hanson & Regge
// 1974 or the Lagrangian of Bailey & Israel 1975, from memory) would need
// velocity-dependent spin–orbit terms fixed order by order in spin and is
// not provided.
//
// Angular momentum (the three models above; Dixon conserves J). None of them conserves the total
// angular momentum J^{ij} = x^i p^j − x^j p^i + S^{ij}, S^{μν} =
// ε^{μνρσ} p_ρ a_σ, outside the aligned configuration: measured between the
// asymptotes (R = 1e5 b, Coulomb source, γ = 1.5, generic orientation,
// rest spin |a|/b = 0.27 and 0.027, ε = 0.02 and 0.002), |ΔJ|/(|p_in| b)
// = (2.2–2.4) ε |a|/b for BMT at g = 2 and at g = 0 alike, and ΔJ_z is of
// the same size for both root-Kerr completions: first order in the
// coupling and the spin. The cause is common to all: they set
// dx/dτ = p/m (or p/m − a⁰𝔅/m), whereas the spin supplementary condition
// S^{μν}p_ν = 0 together with Ṡ^{μν} = p^μ u^ν − p^ν u^μ + torque fixes
// the velocity; that velocity is one ingredient; the other is the gradient form of the dipole force
// with the tensor torque (adding the velocity alone leaves the second-order
// coefficient unchanged); together they give dJ/dτ = 0 (Dixon), with the velocity u^μ = p^μ/m − (S^{μν} f_ν +
// T^{μν} p_ν)/m² (the hidden-momentum term; Mathisson 1937, Papapetrou
// 1951, Tulczyjew 1959, from memory) — even for g = 0, where the spin is
// only Fermi–Walker transported along a Coulomb orbit. The first-order
// impulse and spin kick do not see this (they are integrals of force and
// torque along the straight line), but the worldline moves by O(ε a), so
// the second-order impulse of every member here depends on it: a
// second-order formula derived with the Tulczyjew condition is to be
// compared with these members only up to that term.
//
// Dipole truncation (BMT with Gyro = 2). The first-order-in-spin member:
// BMT precession (Bargmann, Michel & Telegdi 1959) and the Stern–Gerlach
// force of μ = q a. Its first-order law differs from the full probe's at
// O(a²) (the quadrupole and higher terms of the shift).
//
// Aligned configuration. With both spins normal to the plane of motion and
// Im[c(Q + iP)] = 0, a⁰ = 0 all along, so the two full completions
// coincide and conserve E = p⁰ + U and L = (x × p)_z + A U; the deflection
// reduces to a radial quadrature (validate/exact.RootKerrAligned).
//
// Model spread. For a scan at fixed spins, each member's next-order
// coefficient (Δp − Δp₁)/ε² (Δp₁ its own first-order impulse) is a
// number; their spread is what the first-order coupling leaves
// undetermined. What is physical in it: (i) the first-order impulse and
// spin kick, common to the two full completions (and to the dipole
// truncation up to O(a²)); (ii) in the aligned configuration, where the
// spread of the full completions vanishes, the second-order coefficient;
// (iii) energy conservation: only the conservative member has Δp⁰ = 0 for
// a static source, so a non-zero second-order Δp⁰ is an artefact of the
// completion. What is not physical: in generic orientations the
// difference of the second-order coefficients of the full completions
// measures terms quadratic in the field that the first-order coupling does
// not fix (contact terms of a specific theory of the probe); a residual
// read off a scan agrees with a second-order formula only to within that
// spread unless the formula states which completion it describes. The
// dipole truncation's spread against the others adds the multipoles it
// drops.
//
// # State vector
//
// Every model integrates the same layout (see the constants IX, IP, IA):
//
//	y[0:4]   x^μ   position in the background's rest frame
//	y[4:8]   p^μ   kinetic four-momentum
//	y[8:12]  a^μ   spin vector a^μ = S^μ/m (spinning models only; Dim() = 12)
//
// # Independent variable
//
// Proper time is a poor independent variable for scattering: far from the
// source the step grows with r until a single step can jump over the whole
// encounter and still pass the error test. Scatter integrates in the
// Sundman-type variable s with
//
//	dτ/ds = r/K,   K = |p⃗_in|/m,
//
// (Sundman 1912; common practice in celestial mechanics) so that on the
// asymptotes r ≈ r₀ e^{±s}: the far tails cost a number of steps growing
// only like ln(R/b), while the encounter (r ~ b) spans Δs of order one and
// is always resolved by several steps because the step in s is bounded.
//
// # Asymptotics
//
// Forces fall like 1/r², so starting and stopping at a finite radius R
// leaves an O(ε b/R) error. Scatter removes it order by order (tail.go):
//
//   - the initial state is the asymptotic line with the tail from −∞ to
//     the start already applied: momentum and spin tilted by the integral
//     of the force and torque, position shifted transversally by the
//     displacement, to Settings.TailOrder orders in the coupling (3 by
//     default) by Picard passes on the tail;
//   - the conserved energy is then set exactly to its asymptotic value
//     (the dominant finite-R error of a naive start is a mis-set energy);
//   - after the stop, the tail to +∞ is added in the same way, and the
//     energy is read from the conserved quantity.
//
// With tails of order k the remaining truncation error falls like
// (b/R)^(k+1); for k = 3 and the automatic radius R = 1e3 max(1, θ₁) b it
// is below 1e-14 relative. It is bounded by the measured law truncBound,
// not estimated by varying R.
//
// # Error estimate
//
// Scatter integrates every event twice: at the requested tolerance (the
// reported numbers) and at a 5-fold looser one with twice the radius and
// step bounds longer by the matching factor, so that every error source
// grows from the first run to the second. Their difference bounds the
// error of the reported run, floored by the accumulated local error bound
// of the steps; a truncation bound and a rounding floor are added
// (Outcome.ImpulseErr). Against exact solutions the bars bound the actual
// error in ≥ 99 % of impulse components at a median of 6–8 times the actual
// error (TestErrorCoverage).
package integrate
