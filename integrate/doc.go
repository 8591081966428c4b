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
//	ssc.go       the spin supplementary condition of the Dixon body (SSC):
//	             dixon_pirani.go (S^{μν}u_ν = 0, non-helical data) and
//	             dixon_oks.go (Ohashi–Kyrian–Semerák, u = p/m), with the
//	             extra state block at IE that Scatter carries
//	kerrprobe.go the all-multipole Kerr probe in Kerr–Newman(–Taub–NUT): the spin
//	             couples at linear order in the curvature through the
//	             linearized Kerr–Schild metric of the spin a_bg + a⃗ (Vines
//	             2017: at 1PM a test black hole moves as a spinless body
//	             off a source of spin a_bg + a⃗; a NUT parameter through
//	             the mass–NUT phase, nutSpin)
//	kerrdixon.go the same probe completed on the Dixon body: Dixon's
//	             pole–dipole dynamics plus the Kerr–Schild densities from
//	             the quadrupole on
//	rootkerr_body.go
//	             the root-Kerr probe as a Dixon body: one interaction
//	             function W built from the Newman–Janis shifted field, with
//	             the force and torque it defines
//
// and beside them the perturbative evaluators: line.go (FirstOrder, the
// straight-line quadrature of the first-order force and torque) and
// second.go (SecondOrder, the second-order impulse and spin kick by
// iterating the equations of motion once about the straight line).
//
// # What is physical at second order
//
// Model by model (the root-Kerr family, RootKerrFamily; Canonical reports
// the kind):
//
//   - Dixon (any g; in the family at g = 2) is a consistent spinning
//     charge: it conserves E, every component of J = x ∧ p + S in a
//     Coulomb field, the mass function and S² to rounding, and its
//     second-order coefficient linear in the probe spin agrees with the
//     canonical Thomas–BMT Hamiltonian to ≤ 1e-7 at v = 0.3, 0.6, 0.9
//     (dixon_secondorder_test.go): the probe spin weighs (g − 1)/2 times
//     the source spin at second order (1/2 at g = 2). Physical: first
//     order, and second order linear in spin. Beyond linear order in spin
//     it is the dipole truncation (no quadrupole or higher).
//   - RootKerrBody (below) is the all-multipole root-Kerr probe as a
//     consistent body: first order equal to the root-Kerr closed form to
//     rounding at all orders in spin, O(a) truncation the Dixon body at
//     g = 2, exact E, J, mass function and S². Physical: first order (all
//     orders in spin) and second order linear in spin (the same weights as
//     Dixon, tested to ≤ 1e-7). A completion choice: second order at O(a²)
//     and beyond (contact terms; RootKerrBody.Contact is one).
//   - BMT, RootKerr and RootKerrConservative are not consistent bodies
//     beyond first order (non-canonical): their directional Stern–Gerlach
//     force and dx/dτ = p/m give the probe spin the source spin's weight
//     at second order and drift J at first order in coupling and spin
//     (measured: |ΔJ|/(|p|b) = 2.9e-2 at ε|a|/b = 2.7e-2 in a generic
//     orientation). Physical: first order only. They are kept as
//     non-canonical members of the model spread.
//
// # The root-Kerr body
//
// Dixon's pole–dipole equations hold for any interaction of the body with
// the field, once force and torque are defined as the response of the
// interaction to translations and Lorentz rotations (Dixon 1970, Proc. R.
// Soc. A 314, 499; Harte 2012, Class. Quantum Grav. 29, 055012; from
// memory). With an interaction function W(x, p, a) (a the spin vector,
// S^{μν} = ε^{μνρσ}p_ρa_σ), u = dx/dτ and F the charge-weighted field,
//
//	dp^μ/dτ    = F^μ_ν u^ν − ∂^μ W,
//	dS^{μν}/dτ = p^μu^ν − p^νu^μ + T^{μν},
//	T^{μν}     = P^μp^ν − P^νp^μ + A^μa^ν − A^νa^μ,   P_μ = ∂W/∂p^μ, A_μ = ∂W/∂a^μ,
//
// and u fixed by keeping S^{μν}p_ν = 0 (Tulczyjew 1959), solved as in
// Dixon. Conservation (derived here): for a Lorentz-invariant W,
// invariance under a rotation ω of (x, p, a) together reads
// x^μ∂^νW − x^ν∂^μW = T^{μν}, so dJ^{μν}/dτ = x^μṗ^ν − x^νṗ^μ + T^{μν}
// vanishes when the field is invariant, the Lorentz force being balanced
// as for a point charge by the field term q x ∧ A of J where there is one
// (every component of J in a Coulomb field; J_z about the axis of an
// electric root-Kerr source);
// dE/dτ = 0 for E = p⁰ + Re[c𝒱(x)] because ∂_tW = 0 for a static field;
// S² is kept because T is a rotation of S plus terms along p. The same
// equations with W = −(g/4m)S^{αβ}F_αβ are the Dixon body.
//
// The interaction. The root-Kerr coupling at linear order in the field is
// u·Re 𝒜(x − i a), 𝒜 = A + iÃ the self-dual potential (Newman & Janis
// 1965; Arkani-Hamed, Huang & O'Connell 2020; from memory). Dropping total
// τ-derivatives at fixed spin, (a·∂)ⁿ(u·A) ≃ u^ρa^σ(a·∂)ⁿ⁻¹F_σρ, and
// u·Re 𝒜(x − i a) ≃ u·A(x) + u^ρa^σ Re[((e^{−i a·∂} − 1)/(a·∂)) 𝔽_σρ]
// = u·A(x) + u^ρa^σ ∫₀¹ Im 𝔽_σρ(x − i s a) ds: the monopole plus the
// magnetic-dipole coupling spread uniformly over the imaginary segment
// from x to the Newman–Janis point. Hence, with u → p/m,
//
//	W = −(1/m) ∫₀¹ Im[c𝐅(x⃗ − i s â⃗)·𝐍] ds,   𝐍 = p⁰a⃗ − a⁰p⃗ − i a⃗ × p⃗,
//
// in the source's rest frame (𝐍 the self-dual part of S), with the shift
// â = (𝓜/m) a, i.e. the spin tensor over the constant mass parameter along
// the direction of p. That choice makes W a function of S and the
// direction of p only, and then the mass function 𝓜 − W is conserved.
// Derivation (here): let W = W(x, p, S) with P_μ = ∂W/∂p^μ at fixed S,
// p·P = 0 (degree zero in p) and W_{αβ} = ∂W/∂S^{αβ}. The Tulczyjew
// condition with u·p = −𝓜 gives u = p/𝓜 + P + (2S(pW) − S f)/𝓜², where
// (pW)_β = p^αW_{αβ} and f = Fu − ∂W; then, using W_{αβ}Σ^{αβ} = 0 for
// the rotation part Σ of T and the antisymmetry of S and F,
// d(𝓜 − W)/dτ reduces to −u_μF^μ_νu^ν = 0. (With p·P ≠ 0 the normalisation
// u·p = −𝓜 is not compatible with the condition.) With the shift a
// instead of â, W has degree −1 in p and the mass function drifts at
// second order in the coupling — measured 1.4e-5 at ε = 0.1, |a| = 0.27 b
// — so that the outgoing rest mass would differ from the incoming one; the
// same excludes p/𝓜 for u in W (Dixon's κ = g/2m has the constant m). At
// O(a), W is Dixon's −(1/2m)S^{αβ}F_αβ at g = 2 exactly (the right-hand sides
// agree to rounding), and the first-order impulse and spin kick are the
// root-Kerr closed form (gradient and directional forces differ by a
// total derivative; agreement ≤ 7e-16 at |a| up to 0.7 b).
//
// What stays undetermined. A consistent completion may add to W any
// Lorentz-invariant term of second or higher order in the field. Linear in
// the spin and quadratic in the field without derivatives there is none
// that is parity even: the candidates vanish by antisymmetry of S against
// the symmetric F·F, by p·F·p = 0 or by S^{μν}p_ν = 0, or are parity odd
// (derived here; terms with derivatives of the field need a further power
// of a length: of a, and then they are of higher order in spin, or of the
// classical radius q²/m, a self-field effect outside the test-body
// expansion). So the second order
// linear in spin is fixed by the first-order coupling, and the tests find
// every consistent member at the same value. At O(a²) and beyond it is
// not: e.g. the spin-induced polarisability (β/m)(S^{αβ}F_αβ/(2m))² =
// (β/m)(μ·B)² in the rest frame (RootKerrBody.Contact), whose coefficient
// the root-Kerr coupling does not fix; RootKerrFamily carries β = 0 and
// β = 1.
//
// Hamiltonian form. The equations above are the constrained Hamiltonian
// flow of Künzle (1972, J. Math. Phys. 13, 739, from memory) for the
// Dixon–Souriau body, with the interaction W: on (x, p, S) with
// {x^μ, p^ν} = η^{μν}, {p^μ, p^ν} = qF^{μν} and for S the Lorentz algebra
// of x ∧ p ({S^{μν}, S^{κλ}} = η^{μκ}S^{νλ} + η^{νλ}S^{μκ} − η^{νκ}S^{μλ}
// − η^{μλ}S^{νκ}, so that J = x ∧ p + S generates the rotations), the
// Hamiltonian H = 𝓜 − W − m (its constraint H = 0 is the conserved
// mass function) and the Tulczyjew constraints χ^μ = S^{μν}p_ν = 0 added
// with a multiplier λ (equivalently the Dirac bracket). The flow is
//
//	u = p/𝓜 + ∂W/∂p|_S + ω,   ṗ = F u − ∂W,   Ṡ = Σ + p ∧ ω,
//
// Σ^{μν} = 2(W^μ_β S^{νβ} − W^ν_β S^{μβ}) the rotation generated by
// W_{αβ} = ∂W/∂S^{αβ}, and ω = −Sλ fixed by dχ/dτ = 0 (the p-component of
// the multiplier is the reparametrisation freedom, fixed by u·p = −𝓜; the
// flow is ż = {z, W − 𝓜} + λ_a{z, χ^a}).
// This is Dixon's form with T = (∂W/∂p|_S) ∧ p + Σ. Verified in the tests
// from the scalar W alone (its derivatives in (x, p, S) by finite
// differences, independent of the model's (p, a) derivatives and torque):
// u, ṗ and Ṡ agree with the model's right-hand side to 6e-12 relative.
//
// # Non-canonical completions of the root-Kerr probe
//
// The earlier members of the family, kept as non-canonical members of the
// spread (their first order is right; their second order is not that of a
// consistent body). The root-Kerr probe is defined by its first-order coupling: linear in the
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
// Angular momentum (the three non-canonical members; Dixon and
// RootKerrBody conserve J). None of them conserves the total angular
// momentum J^{ij} = x^i p^j − x^j p^i + S^{ij}, S^{μν} = ε^{μνρσ} p_ρ a_σ,
// outside the aligned configuration: measured between the asymptotes
// (R = 1e5 b, Coulomb source, γ = 1.5, generic orientation, rest spin
// |a|/b = 0.27 and 0.027, ε = 0.02 and 0.002), |ΔJ|/(|p_in| b) =
// (2.2–2.4) ε |a|/b for BMT at g = 2 and at g = 0 alike, and ΔJ_z is of the
// same size for both root-Kerr completions: first order in the coupling and
// the spin. Two ingredients are missing, and only both together give
// dJ/dτ = 0 (Dixon, RootKerrBody): the velocity that the spin
// supplementary condition S^{μν}p_ν = 0 fixes, u^μ = p^μ/m − (S^{μν} f_ν +
// T^{μν} p_ν)/m² (the hidden-momentum term; Mathisson 1937, Papapetrou
// 1951, Tulczyjew 1959, from memory), and the gradient form of the dipole
// force with the tensor torque, instead of the directional force; adding
// the velocity alone leaves the second-order coefficient unchanged. This
// holds even for g = 0, where the spin is only Fermi–Walker transported
// along a Coulomb orbit. The first-order impulse and spin kick do not see
// it (they are integrals of force and torque along the straight line), but
// the worldline moves by O(ε a), so the second-order impulse of these
// members is not that of a consistent body.
//
// Dipole truncation (BMT with Gyro = 2). The first-order-in-spin member:
// BMT precession (Bargmann, Michel & Telegdi 1959) and the Stern–Gerlach
// force of μ = q a. Its first-order law differs from the full probe's at
// O(a²) (the quadrupole and higher terms of the shift).
//
// Aligned configuration. With both spins normal to the plane of motion and
// Im[c(Q + iP)] = 0, a⁰ = 0 all along, so the two full completions
// coincide and conserve E = p⁰ + U and L = (x × p)_z + A U; the deflection
// reduces to a radial quadrature (validate/exact.RootKerrAligned), which
// depends on a_source + a_probe only. That is these completions' dynamics,
// not the physics of a spinning probe: a consistent body weights the probe
// spin half as much at second order (Dixon, RootKerrBody).
//
// Model spread. For a scan at fixed spins, each member's next-order
// coefficient (Δp − Δp₁)/ε² (Δp₁ its own first-order impulse) is a
// number. What is physical in the spread: (i) the first-order impulse and
// spin kick, common to every full member (and to the dipole members up to
// O(a²)); (ii) the second order linear in the spins, equal for the
// canonical members (Dixon, RootKerrBody with any contact term) and tested
// against independent computations in the aligned configuration; (iii)
// energy conservation: a non-zero second-order Δp⁰ for a static source is
// an artefact of the Lorentz-generator completion (and of BMT, whose
// energy is conserved to first order only). What is not physical: the
// second order of the non-canonical members in any orientation, and the
// differences among the canonical members at O(a²) and beyond, which
// measure terms quadratic in field and spin that the first-order coupling
// does not fix; a residual read off a scan agrees with a second-order
// formula beyond linear order in spin only to within that spread unless
// the formula states which completion it describes.
//
// # Completions of the Kerr probe
//
// The all-multipole Kerr probe is defined by its first-order coupling,
// like the root-Kerr probe: linear in the curvature, all orders in the
// spin. Two completions are provided; both have the first-order impulse and
// spin kick of the Kerr body exact in both spins (leading.SpinImpulse1PM,
// Vines 2017: quadrature vs closed form ≤ 1.1e-14 for KerrProbe,
// TestKerrProbeFirstOrder; ≤ 6e-11 for KerrDixon, limited by Dixon's
// metric contractions in the weak test background, TestKerrDixonFirstOrder).
//
// KerrProbe (scenario kind kerr-probe-ks) integrates the background
// geodesic plus the line densities of the Kerr–Schild gauge of the
// linearized background — the spin force −M[Γ^lin(a_bg + a⃗) −
// Γ^lin(a_bg)](u, u) and the spin generator ∂L/∂A of L = (M/2) h(u, u) —
// with dx/dτ = p/M, p and a rotated by one generator. Another gauge
// changes the densities by total derivatives along the line, which leaves
// the first order alone but moves the worldline at O(ε): already at linear
// order in the probe spin its second-order coefficient is not the
// consistent body's (Schwarzschild background, γ = 1.4, spin normal to the
// plane, a/b = ±0.02: the part of lim (Δp_b − Δp₁)/ε² odd in the spin is
// −66.78 a/b, against −46.72 a/b for Dixon, whose value carries the
// published 3 : 4 weighting of probe and background spin, Bini & Damour
// 2018; Vines, Steinhoff & Buonanno 2019). Its O(a) and O(a²) first orders
// are those of Dixon without and with C_ES² = 1
// (TestKerrProbeTruncations).
//
// KerrDixon (scenario kind kerr-probe, the default) is the Dixon body
// (Tulczyjew condition, the covariant pole–dipole force −½R(u, S) and its
// momentum–velocity relation) plus the Kerr–Schild densities from the
// quadrupole on: the force with its part linear in the spin removed (by a
// complex step in the spin, exact to rounding), the whole generator. Its
// O(a) dynamics is Dixon's, so its second order linear in the probe spin
// is the consistent body's (TestKerrDixonSecondOrderLinearSpin: the
// difference of the direct second orders from Dixon's falls by 4.0–4.4 per
// halving of the spin, KerrProbe's by 1.8–2.9, off Kerr–Taub–NUT too; from scans in the aligned
// case above, −46.78 a/b against Dixon's −46.72 a/b, the rest O(a³)). From the quadrupole on the
// completion is still a choice: the second-order coefficients of a scan
// beyond O(a) are not predictions of the Kerr probe.
//
// Conservation: both keep S² and a·p exactly, KerrProbe also 𝓜 (KerrDixon:
// 𝓜 drifts at O(ε², ≈ 0.75 ε² at a/b ≈ 0.45, γ = 1.3); their Killing
// energy is corrected to first order in the coupling only (drift ≈ 16 ε²
// for KerrProbe, ≈ 3.9 ε² for KerrDixon at a/b ≈ 0.45, γ = 1.3), so a
// second-order Δp⁰ ≠ 0 off a static background is an artefact of the
// completion, and neither conserves J_z exactly. Because 𝓜 of KerrDixon
// changes, Scatter puts its outgoing momentum on the shell of 𝓜 at the
// stop (outMassModel), so that Δp_l is the model's own: with the
// asymptotic mass it differed from the direct second order by the
// second-order mass-shell term −(p_in·Δp₂ + ½Δp₁·Δp₁)/|p⃗_in| per ε²
// (kerr-test-hole 0.2527, predicted 0.2526). Impact parameter: the
// covariant b of the incoming asymptote of the worldline (KerrDixon: the
// Tulczyjew centroid; KerrProbe: dx/dτ = p/M, which on the asymptote is the
// same line), the b of the closed form. The other members of the spread
// (scan --spread) are Dixon without and with C_ES² = 1: beyond first order
// in the spin their differences from the Kerr probe measure the
// multipoles they drop, and in the second-order coefficient also the
// completion. A completion derived from an action, with exact energy and
// angular momentum, is not provided.
//
// Off Kerr–Taub–NUT backgrounds (and for a NUT-charged probe, integrated
// in the background duality-rotated by the probe's phase) both completions
// add the NUT part of the coupling: the first order is fixed by the
// mass–NUT phase of (m + in)(M − iN) exact in both spins (quadrature vs
// closed form ≤ 1e-14, TestKerrProbeFirstOrder; ≤ 6e-11 for KerrDixon),
// its O(a) part is Dixon's in the same background, and the densities
// chosen for it (the harmonic-gauge NUT force, whose work has the local
// first-order energy p⁰(1 − U), and the unit-mass Kerr–Schild force as the
// NUT generator) are again a choice: beyond first order the NUT completion
// is a choice of ours, not a prediction. Energy drifts stay O(ε²)
// (TestKerrProbeInvariants, TestKerrDixonInvariants on Kerr–Taub–NUT).
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
// encounter and still pass the error test. Scatter integrates in the angle
// clock σ with
//
//	dτ/dσ = r²/(b K),   K = |p⃗_in|/m,
//
// (a Sundman time transformation, Sundman 1912, from memory; common
// practice in celestial mechanics), the angle that the position vector
// sweeps on the straight line of impact parameter b. The whole path, from
// r = ∞ in to r = ∞ out, spans σ ≈ π up to the deflection, and the
// integrated variables (osculating.go) are smooth in σ up to both ends, so
// the far zone costs a step or two at any start radius, while the step in
// σ is bounded (Settings.MaxStep) so that the encounter is always resolved
// by several steps.
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
// reported numbers) and at a 10-fold looser one with twice the radius and
// step bounds longer by the matching factor, so that every error source
// grows from the first run to the second. Their difference bounds the
// error of the reported run, floored by the accumulated local error bound
// of the steps; a truncation bound and a rounding floor are added
// (Outcome.ImpulseErr). Against exact solutions the bars bound the actual
// error in ≥ 99 % of impulse components at a median of 11–13 times the
// actual error (TestErrorCoverage).
package integrate
