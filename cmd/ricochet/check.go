package main

import (
	"errors"
	"fmt"
	"io"

	"github.com/olekukonko/tablewriter/tw"
	"github.com/spf13/pflag"

	"ricochet/validate"
)

var checkFlags struct{ short bool }

var cmdCheck = &Command{
	Name:      "check",
	UsageLine: "check [--short]",
	Short:     "run the reference suite against exact published results",
	Long: `Check integrates every case of the reference suite (exact published
scattering solutions: Darwin's relativistic Coulomb deflection, Poincaré's
monopole cone, the dyon-dyon cone, closed-form first-order formulas) and
prints a pass/fail table with the sources, the relative difference and the
tolerance of each case. It exits with status 1 if any case fails.`,
	Example: `ricochet check`,
	Flags:   pflag.NewFlagSet("check", pflag.ContinueOnError),
	Run:     runCheck,
}

func init() {
	cmdCheck.Flags.BoolVar(&checkFlags.short, "short", false, "skip the long cases")
}

func runCheck(cmd *Command, args []string, w io.Writer) error {
	if len(args) > 0 {
		return badf("check takes no arguments, got %q", args)
	}
	table := newAlignedTable(w, tw.AlignLeft)
	table.Header("check", "source", "rel. diff", "tolerance", "result")
	failed := 0
	for _, c := range validate.Suite(checkFlags.short) {
		r := c.Check()
		res, diff := "pass", fmt.Sprintf("%.1e", r.RelDiff)
		switch {
		case r.Err != nil:
			res, diff = "FAIL: "+r.Err.Error(), "-"
			failed++
		case !r.Pass:
			res = "FAIL"
			failed++
		}
		table.Append(c.Name, c.Source, diff, fmt.Sprintf("%.0e", c.Tol), res)
	}
	if err := table.Render(); err != nil {
		return err
	}
	if failed > 0 {
		return errors.New(fmt.Sprint(failed, " check(s) failed"))
	}
	fmt.Fprintln(w, "all checks passed")
	return nil
}
