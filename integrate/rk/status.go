package rk

import "errors"

// Status is the way an integration ended.
type Status int

const (
	// StatusSuccess: the integration reached t1.
	StatusSuccess Status = iota
	// StatusEvent: the integration stopped at a terminal event.
	StatusEvent
	// StatusStepTooSmall: the step size fell below the resolution of t
	// (16 ulp of the largest |t| involved) without an acceptable step.
	StatusStepTooSmall
	// StatusMaxSteps: Settings.MaxSteps attempted steps were used up.
	StatusMaxSteps
	// StatusNonFinite: the state or the derivative was NaN or ±Inf at the
	// initial point, or in every trial step down to the smallest step size.
	StatusNonFinite
)

var statuses = [...]struct {
	name string
	err  error
}{
	StatusSuccess:      {"Success", nil},
	StatusEvent:        {"Event", nil},
	StatusStepTooSmall: {"StepTooSmall", errors.New("rk: step size too small")},
	StatusMaxSteps:     {"MaxSteps", errors.New("rk: maximum number of steps reached")},
	StatusNonFinite:    {"NonFinite", errors.New("rk: non-finite state or derivative")},
}

// String returns the name of the status.
func (s Status) String() string {
	if s < 0 || int(s) >= len(statuses) {
		return "Status(?)"
	}
	return statuses[s].name
}

// Err returns nil for the successful outcomes (StatusSuccess, StatusEvent)
// and a descriptive error otherwise.
func (s Status) Err() error {
	if s < 0 || int(s) >= len(statuses) {
		return errors.New("rk: unknown status")
	}
	return statuses[s].err
}
