// Package scenario describes a scattering set-up — background, probe,
// incoming kinematics, scan range and integrator settings — as read from a
// TOML file, validates it, and turns it into the library objects of one
// event: the probe model in its background, the asymptotic in-state and the
// first-order prediction.
//
// Decoding is strict: unknown keys are errors. Validation fills the
// documented zero-value defaults (probe mass 1, impact parameter 1, scan
// 1e-4 ≤ |ε| ≤ 0.1 at 13 points, the integrator's own tolerance and
// radius) and rejects anything else out of range with an InputError whose
// one-line message names the field and the allowed range.
//
// The coupling ε is |(q − ig)(Q + iP)|/(m b) for flat backgrounds
// (electromagnetic duality phase, Gaussian units) and |M + iN|/b for curved
// ones (mass–NUT phase), signed by its real part. WithEpsilon rescales the
// source's charges (or mass and NUT parameter) to a given |ε| at fixed
// γ, phases and spin-to-b ratios: the scan of package scan.
//
// Built-in scenarios of our own design are embedded (BuiltinNames,
// Builtin); they are starting points for scenario files.
package scenario
