package main

import (
	"fmt"
	"io"

	"github.com/spf13/pflag"

	"ricochet/observables/scenario"
)

var cmdScenarios = &Command{
	Name:      "scenarios",
	UsageLine: "scenarios [name]",
	Short:     "list the built-in scenarios or print one as TOML",
	Long: `Scenarios lists the built-in example scenarios; with a name it prints that
scenario's TOML, a starting point for a scenario file of your own.`,
	Example: `ricochet scenarios
ricochet scenarios rootkerr-pair > my.toml`,
	Flags: pflag.NewFlagSet("scenarios", pflag.ContinueOnError),
	Run: func(cmd *Command, args []string, w io.Writer) error {
		switch len(args) {
		case 0:
			for _, n := range scenario.BuiltinNames() {
				b, _ := scenario.Builtin(n)
				s, err := scenario.Parse(b, n)
				if err != nil {
					return err
				}
				fmt.Fprintf(w, "%-20s %s\n", n, s.Description)
			}
			return nil
		case 1:
			b, err := scenario.Builtin(args[0])
			if err != nil {
				return badf("%v", err)
			}
			_, err = w.Write(b)
			return err
		}
		return badf("scenarios takes at most one name")
	},
}
