// Package peer holds ricochet's performance comparison harness; it has no
// Go API.
//
// c/peer.c is a stand-alone scattering solver of the kind a careful user
// would write around a general-purpose library: GSL's gsl_odeiv2 rk8pd
// pair (Prince & Dormand 1981) with the standard y-scaled control, a
// hand-coded right-hand side, a start at radius R with the exact conserved
// energy and angular momentum, and closed-form first-order straight-line
// tails at both ends. It solves the two reference problems of
// cmd/ricochet-bench:
//
//	P1  point charge, repulsive Coulomb field, qQ = 1, v = 0.6, b = 10
//	    (exact: Darwin 1913)
//	P2  timelike geodesic of Schwarzschild, M = 1, Kerr–Schild coordinates,
//	    v = 0.5, b = 30 (exact: radial quadrature)
//
// compare.sh builds the peer (gcc -O2, installing libgsl-dev if missing)
// and cmd/ricochet-bench in a temporary directory, runs both over the same
// ladders of tolerances and radii in interleaved rounds (so that a change
// of the machine's load affects both codes alike), and prints for each
// target accuracy the cheapest configuration of each code, by evaluations
// and by wall time, with the ratios peer/ricochet (ricochet-bench select).
// The rule is the same for both codes: a configuration counts only if it
// and every tighter tolerance at the same radius reach the target, so that
// a tolerance meeting it by a cancellation of integration and truncation
// errors is not chosen. Then ricochet's cost against radius and
// tolerance, the one- versus two-worker scan speed-up, the allocations per
// trajectory, and the check that loose tolerances at large radii never
// return a silent χ ≈ 0. With --quick it runs a few configurations and
// fails if either code misses the exact deflections or the silent-zero
// check fails; it never asserts timings.
//
//	bash validate/peer/compare.sh [--quick]
package peer
