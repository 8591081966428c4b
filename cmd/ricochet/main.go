// Command ricochet integrates the full nonlinear motion of charged and
// spinning probes scattering off charges, dyons and root-Kerr sources,
// reads off the asymptotic impulse and spin kick with error estimates, and
// compares them with first-order analytic formulas over a coupling scan.
//
// Run "ricochet help" for the list of commands.
package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"runtime/debug"
	"strings"

	"github.com/spf13/pflag"
)

// version is the program version; the VCS revision is appended from the
// build information when available.
const version = "0.1.0"

// Command is one subcommand: its usage, help text, flags and action.
type Command struct {
	Name      string
	UsageLine string
	Short     string
	Long      string
	Example   string
	Flags     *pflag.FlagSet
	Run       func(cmd *Command, args []string, stdout io.Writer) error
}

var commands []*Command

func init() {
	commands = []*Command{cmdRun, cmdScan, cmdVerify, cmdMerge, cmdSlurm, cmdCheck, cmdScenarios}
}

// exitCode maps an error to the exit status: 2 for bad input or usage, 1
// for failures while running.
func exitCode(err error) int {
	var ie inputError
	if errors.As(err, &ie) || errors.Is(err, pflag.ErrHelp) {
		return 2
	}
	return 1
}

func versionString() string {
	v := "ricochet " + version
	if info, ok := debug.ReadBuildInfo(); ok {
		for _, s := range info.Settings {
			if s.Key == "vcs.revision" && len(s.Value) >= 12 {
				v += " (" + s.Value[:12] + ")"
			}
		}
	}
	return v
}

func main() {
	os.Exit(mainWith(os.Args[1:], os.Stdout, os.Stderr))
}

// mainWith runs the command line args and returns the exit status.
func mainWith(args []string, stdout, stderr io.Writer) int {
	stderrW = stderr
	cmdArgs = args
	if len(args) == 0 {
		usage(stderr)
		return 2
	}
	switch args[0] {
	case "-h", "--help", "help":
		if len(args) > 1 {
			for _, c := range commands {
				if c.Name == args[1] {
					fmt.Fprint(stdout, helpText(c))
					return 0
				}
			}
			fmt.Fprintf(stderr, "ricochet help: unknown command %q\n", args[1])
			return 2
		}
		usage(stdout)
		return 0
	case "--version", "version":
		fmt.Fprintln(stdout, versionString())
		return 0
	}
	for _, c := range commands {
		if c.Name != args[0] {
			continue
		}
		c.Flags.SetOutput(io.Discard)
		// Reset every flag to its default so that repeated invocations in
		// one process (tests) do not inherit values.
		c.Flags.VisitAll(func(f *pflag.Flag) {
			f.Value.Set(f.DefValue)
			f.Changed = false
		})
		if err := c.Flags.Parse(args[1:]); err != nil {
			if errors.Is(err, pflag.ErrHelp) {
				fmt.Fprint(stdout, helpText(c))
				return 0
			}
			if strings.Contains(err.Error(), "allowed") {
				fmt.Fprintf(stderr, "ricochet %s: %v (see 'ricochet help %s')\n", c.Name, err, c.Name)
			} else {
				fmt.Fprintf(stderr, "ricochet %s: %v; allowed: the flags of 'ricochet help %s'\n", c.Name, err, c.Name)
			}
			return 2
		}
		if err := c.Run(c, c.Flags.Args(), stdout); err != nil {
			fmt.Fprintf(stderr, "ricochet %s: %v\n", c.Name, err)
			return exitCode(err)
		}
		return 0
	}
	fmt.Fprintf(stderr, "ricochet: unknown command %q (see 'ricochet help')\n", args[0])
	return 2
}

// usage prints the command table.
func usage(w io.Writer) {
	fmt.Fprint(w, usageText())
}

func usageText() string {
	var b strings.Builder
	b.WriteString("ricochet integrates scattering of charged and spinning probes and checks\nleading-order formulas against the full nonlinear motion.\n\nUsage:\n\n\tricochet <command> [flags] [scenario.toml]\n\nCommands:\n\n")
	for _, c := range commands {
		fmt.Fprintf(&b, "\t%-10s %s\n", c.Name, c.Short)
	}
	b.WriteString("\nUse \"ricochet help <command>\" for more about a command; \"ricochet --version\" prints the version.\n")
	return b.String()
}

// helpText renders a command's help from its table entry.
func helpText(c *Command) string {
	var b strings.Builder
	fmt.Fprintf(&b, "usage: ricochet %s\n\n%s\n", c.UsageLine, strings.TrimSpace(c.Long))
	if c.Flags.HasFlags() {
		b.WriteString("\nFlags:\n")
		b.WriteString(c.Flags.FlagUsages())
	}
	if c.Example != "" {
		b.WriteString("\nExample:\n\n")
		for _, l := range strings.Split(strings.TrimSpace(c.Example), "\n") {
			b.WriteString("\t" + l + "\n")
		}
	}
	return b.String()
}
