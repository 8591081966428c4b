//go:build !linux

package integrate

import "time"

var budgetStart = time.Now()

// budgetClock returns the wall time (no per-thread CPU clock here).
func budgetClock() time.Duration { return time.Since(budgetStart) }

func budgetLock()   {}
func budgetUnlock() {}
