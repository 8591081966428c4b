// Package validate holds ricochet's reference suite: scattering problems
// with exact published solutions, run through the full integrator and
// compared with the reference. The same cases back the tests and the
// `ricochet check` command.
//
// Each Case names its source (authors, year) and its tolerance; the
// reference values themselves come from package validate/exact, which
// implements the published closed forms and quadratures.
package validate
