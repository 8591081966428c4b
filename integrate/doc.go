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
//	geodesic.go  geodesic and charged geodesic (Lorentz force in curved
//	             spacetime) in the backgrounds of background/spacetime
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
// leaves an O(ε b/R) error. Scatter removes it at first order:
//
//   - the initial state is the asymptotic line with the first-order tail
//     (from −∞ to the start) already applied: momentum and spin tilted by
//     the straight-line integral of the force and torque, position shifted
//     transversally by the first-order displacement;
//   - the conserved energy is then set exactly to its asymptotic value
//     (the dominant finite-R error of a naive start is a mis-set energy);
//   - after the stop, the first-order tail to +∞ is added by the same
//     straight-line quadrature, and the energy is read from the conserved
//     quantity.
//
// The remaining truncation error is of relative order ε (b/R)² and is
// estimated by varying R; the integrator error by varying the tolerance.
package integrate
