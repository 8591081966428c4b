// Package vec provides small value types for the vectors of scattering
// kinematics: real and complex Euclidean three-vectors and Minkowski
// four-vectors.
//
// Conventions (shared by every package of the module):
//
//	signature (−,+,+,+):  a·b = −a⁰b⁰ + a¹b¹ + a²b² + a³b³
//	Levi-Civita symbol:   ε_{0123} = +1 (lower indices), hence ε^{0123} = −1
//	three-vectors:        right-handed, x × y = z
//
// Complex three-vectors use the bilinear (not Hermitian) dot product, as
// needed for the complex field F = E + iB evaluated at complex positions
// x − i a (Newman & Janis 1965; Newman 1973).
package vec
