package main

import (
	"encoding/csv"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/spf13/pflag"

	"ricochet/validate"
)

var checkFlags struct {
	short  bool
	format string
}

var cmdCheck = &Command{
	Name:      "check",
	UsageLine: "check [--short] [--format table|csv|json|json-schema]",
	Short:     "run the reference suite (published, derived and consistency checks)",
	Long: `Check integrates every case of the reference suite and prints, for
each case, pass or fail, the relative difference from the reference, the
tolerance, what is checked and the source, in three sections by the kind
of reference: published exact results (Darwin's relativistic Coulomb
deflection, Poincaré's monopole cone, geodesic deflections by radial
quadrature), exact solutions derived here from published laws (the
dyon-dyon cone, the canonical spin–orbit Hamiltonian) and internal
consistency checks (a model against a closed form or reduction of itself,
which test the numerics, not the physics). The table fits
100 columns; --format csv (header row first) and --format json give the
same fields for programs. It exits with status 1 if any case fails.`,
	Example: `ricochet check
ricochet check --short --format json`,
	Flags: pflag.NewFlagSet("check", pflag.ContinueOnError),
	Run:   runCheck,
}

func init() {
	cmdCheck.Flags.BoolVar(&checkFlags.short, "short", false, "skip the long cases")
	cmdCheck.Flags.StringVar(&checkFlags.format, "format", "table", "output format: table, csv, json or json-schema (the JSON Schema of the json output)")
}

// checkRow is one case of the suite as reported.
type checkRow struct {
	Name      string  `json:"check"`
	Source    string  `json:"source"`
	Reference string  `json:"reference"`
	RelDiff   float64 `json:"rel_diff"`
	Tolerance float64 `json:"tolerance"`
	Estimate  float64 `json:"error_estimate"`
	Pass      bool    `json:"pass"`
	Error     string  `json:"error,omitempty"`
}

func (r checkRow) result() string {
	switch {
	case r.Error != "":
		return "FAIL"
	case !r.Pass:
		return "FAIL"
	}
	return "pass"
}

func runCheck(cmd *Command, args []string, w io.Writer) error {
	if len(args) > 0 {
		return badf("check takes no arguments, got %q", args)
	}
	switch checkFlags.format {
	case "table", "csv", "json":
	case "json-schema":
		return writeSchema(w, "check")
	default:
		return badf("--format = %q; allowed: table, csv, json, json-schema", checkFlags.format)
	}
	var rows []checkRow
	failed := 0
	for _, c := range validate.Suite(checkFlags.short) {
		r := c.Check()
		row := checkRow{Name: c.Name, Source: c.Source, Reference: c.Kind, RelDiff: r.RelDiff, Tolerance: c.Tol, Estimate: r.Est, Pass: r.Pass && r.Err == nil}
		if r.Err != nil {
			row.Error, row.RelDiff = r.Err.Error(), math.NaN()
		}
		if !row.Pass {
			failed++
		}
		rows = append(rows, row)
	}
	var err error
	switch checkFlags.format {
	case "csv":
		err = writeCheckCSV(w, rows)
	case "json":
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		err = enc.Encode(nanFree(map[string]any{"schema": checkSchemaID, "checks": rows, "passed": len(rows) - failed, "failed": failed}))
	default:
		err = writeCheckTable(w, rows, failed)
	}
	if err != nil {
		return err
	}
	if failed > 0 {
		return errors.New(fmt.Sprint(failed, " check(s) failed"))
	}
	return nil
}

// checkWidth is the width of the check table.
const checkWidth = 100

// writeCheckTable prints one block per case: result, relative difference
// and tolerance in fixed columns, then what is checked and its source
// wrapped into the remaining width.
func writeCheckTable(w io.Writer, rows []checkRow, failed int) error {
	const lead = "%-6s %-9s %-9s "
	indent := strings.Repeat(" ", 27)
	fmt.Fprintf(w, lead+"%s\n", "result", "rel.diff", "tolerance", "check / source")
	for _, sec := range checkSections {
		fmt.Fprintln(w, strings.Repeat("-", checkWidth))
		fmt.Fprintln(w, sec.title)
		for _, r := range rows {
			if r.Reference == sec.kind {
				writeCheckRow(w, r, lead, indent)
			}
		}
	}
	if failed == 0 {
		fmt.Fprintf(w, "all %d checks passed\n", len(rows))
	}
	return nil
}

// checkSections orders the table by the kind of reference.
var checkSections = []struct{ kind, title string }{
	{validate.Published, "against published exact results:"},
	{validate.Derived, "against exact solutions derived here from published laws (independent of the integrated equations):"},
	{validate.Consistency, "internal consistency (a model against another form of itself; checks the numerics, not the physics):"},
}

// writeCheckRow prints one case of the check table.
func writeCheckRow(w io.Writer, r checkRow, lead, indent string) {
	{
		diff := "-"
		if r.Error == "" {
			diff = fmt.Sprintf("%.1e", r.RelDiff)
		}
		lines := wrap(r.Name, checkWidth-len(indent))
		lines = append(lines, wrap("source: "+r.Source, checkWidth-len(indent))...)
		if r.Error != "" {
			lines = append(lines, wrap("error: "+r.Error, checkWidth-len(indent))...)
		}
		fmt.Fprintf(w, lead+"%s\n", r.result(), diff, fmt.Sprintf("%.0e", r.Tolerance), lines[0])
		for _, l := range lines[1:] {
			fmt.Fprintln(w, indent+l)
		}
	}
}

// wrap splits text into lines of at most width runes at spaces (a word
// longer than width gets a line of its own).
func wrap(text string, width int) []string {
	var lines []string
	line := ""
	for _, word := range strings.Fields(text) {
		switch {
		case line == "":
			line = word
		case len([]rune(line))+1+len([]rune(word)) <= width:
			line += " " + word
		default:
			lines = append(lines, line)
			line = word
		}
	}
	return append(lines, line)
}

func writeCheckCSV(w io.Writer, rows []checkRow) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"check", "source", "rel_diff", "tolerance", "error_estimate", "result", "error", "reference"})
	for _, r := range rows {
		cw.Write([]string{r.Name, r.Source, g6(r.RelDiff), g6(r.Tolerance), g6(r.Estimate), r.result(), r.Error, r.Reference})
	}
	cw.Flush()
	return cw.Error()
}
