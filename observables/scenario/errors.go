package scenario

import (
	"fmt"
	"math"
)

// InputError is an error caused by the input (a scenario field, a record
// file, a request that cannot be met): the command reports it with exit
// status 2. Its message is one line naming the field and the allowed range.
type InputError struct{ Msg string }

func (e InputError) Error() string { return e.Msg }

// Badf returns an InputError with a formatted message.
func Badf(format string, args ...any) error { return InputError{fmt.Sprintf(format, args...)} }

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
