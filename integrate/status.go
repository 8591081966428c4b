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
)

var statusNames = [...]string{
	StatusRunning:          "running",
	StatusScattered:        "scattered",
	StatusCaptured:         "captured",
	StatusCrossedDisk:      "crossed branch disk",
	StatusNearString:       "reached Misner string",
	StatusDidNotEscape:     "did not escape",
	StatusIntegratorFailed: "integrator failed",
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
