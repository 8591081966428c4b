// Package scan runs coupling scans of a scenario and analyses them: the
// grid of couplings, the points integrated in parallel (cancellable, with a
// progress callback, results independent of the number of workers), the
// resumable record file, the observables read off each point in a chosen
// set of output conventions, and the fits of the residual of the
// first-order prediction (package fit) with the model spread of the
// root-Kerr completions.
//
// A scan varies |ε| over Grid at fixed γ, phases and spin-to-b ratios
// (scenario.WithEpsilon). Run returns one Record per job, in job order
// (member × points + grid index for a spread scan), each in the library's
// own conventions (Gaussian units, covariant b, contravariant components in
// the source frame), so that one recorded scan serves every output
// convention. Analyze turns records into Series of Points for chosen
// Observables and fits every series (Fit).
//
// Record file (Settings.Record): JSON lines, a Header with the scenario,
// the grid and a Hash of everything that determines the numbers, then one
// Record per finished point, appended and synced as it finishes, so that an
// interruption loses at most the points in flight. On completion the file
// is rewritten in job order with a Trailer, through a temporary file and a
// rename: the final file does not depend on the order in which points
// finished, on the number of workers or on interruptions. Settings.Resume
// computes only the missing points of a recorded scan and refuses a file
// recorded for another scenario or other settings (FileError).
package scan
