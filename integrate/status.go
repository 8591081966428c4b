package integrate

import (
	"errors"
	"math"
)

var sqrt = math.Sqrt

// Status is the way a scattering run ended. Only StatusScattered yields
// observables; every other status is an outcome reported to the user, never
// a number.
type Status int

const (
	// StatusRunning is the status while integrating (and "no hazard").
	StatusRunning Status = iota
	// StatusScattered: the probe came in from and escaped to infinity.
	StatusScattered
	// StatusCaptured: the probe fell into the source (horizon or r → 0).
	StatusCaptured
	// StatusCrossedDisk: the path crossed a branch disk (the ring
	// singularity's disk of a root-Kerr source or a Kerr black hole).
	StatusCrossedDisk
	// StatusNearString: the path came too close to a Misner string.
	StatusNearString
	// StatusDidNotEscape: the probe did not reach the stop radius.
	StatusDidNotEscape
	// StatusIntegratorFailed: step too small, step limit or non-finite state.
	StatusIntegratorFailed
	// StatusReachedRing: the path ran into the singular ring of a
	// root-Kerr source (the rim of its branch disk), coming closer to it
	// than RingReach times its radius: the flat-space counterpart of
	// capture, for an attractive source.
	StatusReachedRing
)

// RingReach is the distance from the singular ring of a root-Kerr source,
// in units of the ring's radius, below which a path is reported as
// StatusReachedRing. Near the ring the field grows like d^{-3/2} (the
// complex distance [(x − ia)²]^{1/2} vanishes like d^{1/2} there); an
// attracted path in the ring's plane falls in, and the integrator gave up
// once its accepted steps came within 6.5e-7 |a| (measured on equatorial
// charge paths, |a| = 0.5 and 1.2 b). The reach is set about fifteen
// times wider, so that the outcome is named before the step size
// collapses; like the capture radius, it is a numerical choice.
const RingReach = 1e-5

// RingFailReach is the distance from the singular ring, in units of its
// radius, within which a failed integration (the step size collapsed) is
// reported as StatusReachedRing instead of StatusIntegratorFailed: the
// path ran into the ring, where the field grows like d^{-3/2}. Measured:
// at a loose tolerance (1e-7) with a strongly coupled, widely shifted
// root-Kerr probe the step size collapsed 1.2e-5 |a| from the ring; the
// reach is about a hundred times wider.
const RingFailReach = 1e-3

var statusNames = [...]string{
	StatusRunning:          "running",
	StatusScattered:        "scattered",
	StatusCaptured:         "captured",
	StatusCrossedDisk:      "crossed branch disk",
	StatusNearString:       "reached Misner string",
	StatusDidNotEscape:     "did not escape",
	StatusIntegratorFailed: "integrator failed",
	StatusReachedRing:      "reached ring singularity",
}

func (s Status) String() string {
	if int(s) < len(statusNames) {
		return statusNames[s]
	}
	return "unknown status"
}

// Err returns nil for StatusScattered and an error naming the outcome
// otherwise.
func (s Status) Err() error {
	if s == StatusScattered {
		return nil
	}
	return errors.New("integrate: " + s.String())
}
