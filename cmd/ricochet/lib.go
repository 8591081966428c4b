package main

import (
	"ricochet/observables/scan"
	"ricochet/observables/scenario"
)

// The command is a thin layer over the library: scenarios come from
// package scenario, scans and their fits from package scan. The names
// below let the writers and figures speak of them briefly.
type (
	Scenario      = scenario.Scenario
	Event         = scenario.Event
	scanResult    = scan.Result
	series        = scan.Series
	scanPoint     = scan.Point
	scanFits      = scan.Fits
	spreadSummary = scan.SpreadSummary
	inputError    = scenario.InputError
)

// badf returns an input error (exit status 2) with a formatted message.
func badf(format string, args ...any) error { return scenario.Badf(format, args...) }
