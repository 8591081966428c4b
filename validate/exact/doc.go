// Package exact holds exact, published solutions of test-body scattering
// problems, used as references for the numerical integrators.
//
// Every function works in the frame of record of the module: the source is
// at rest at the origin, the probe comes in along +x with impact parameter b
// along +y, and a source spin points along +z. Units G = c = 1; Gaussian
// electromagnetic units (Coulomb field E = Q r/r³, Lorentz force
// q(E + v×B)). The probe is a test body: the source does not recoil.
//
// Results are returned as a Scattering value holding the deflection angle χ,
// the outgoing unit direction and the impulse per unit probe mass
// Δp^μ/m = u_out − u_in. Closed forms are exact up to rounding; results
// from a radial quadrature carry an error estimate.
//
// Sign of χ: for the electromagnetic problems (Darwin, dyon) χ > 0 means the
// probe is pushed away from the source (the sign of the coupling qQ at first
// order, as in Rutherford's formula); for the problems on a curved
// background (Schwarzschild, Kerr, Reissner–Nordström) χ > 0 means
// deflection towards the source (the sign of M at first order). Each
// function states its convention; the outgoing direction is unambiguous.
//
// Capture by the source (spiralling into a point charge, falling through a
// horizon) and crossing the ring singularity of Kerr are outcomes, reported
// as the errors ErrCaptured and ErrRing, never as numbers.
//
// References (details beside each function):
//
//	C. G. Darwin, Phil. Mag. 25, 201 (1913)             relativistic Coulomb orbit
//	E. Rutherford, Phil. Mag. 21, 669 (1911)            non-relativistic limit
//	H. Poincaré, C. R. Acad. Sci. 123, 530 (1896)       charge–monopole cone
//	B. Carter, Phys. Rev. 174, 1559 (1968)              Kerr constants of motion
//	K. Westpfahl, Fortschr. Phys. 33, 417 (1985)        2PM scattering angle
//	T. Damour, Phys. Rev. D 97, 044038 (2018)           test-mass PM coefficients
//	J. Vines, Class. Quantum Grav. 35, 084002 (2018)    1PM aligned-spin angle
package exact
