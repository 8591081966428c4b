// Package observables reads scattering observables off asymptotic states:
// the impulse Δp^μ and spin kick Δa^μ resolved in the frame of record,
// scattering and out-of-plane angles, and the alternative impact-parameter
// definitions that differ at next-to-leading order.
//
// Frame of record: the background's rest frame, background spin along +z,
// probe incoming along +x with the covariant impact parameter b along +y
// (orthogonal to both incoming four-velocities, from the background to the
// probe's incoming asymptote). Components are reported in the orthonormal
// triad
//
//	l̂ = p̂_in (longitudinal),  b̂ (impact direction),  n̂ = l̂ × b̂ (normal),
//
// so that for the default set-up (l, b, n) = (x, y, z).
//
// Sub-packages: leading (first-order closed forms), fit (convergence
// analysis of coupling scans), convention (output conventions), numfmt
// (numbers with uncertainties), scenario (scattering set-ups and their
// events) and scan (coupling scans, record files and their fits).
package observables
