package main

import (
	"io"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/tw"
)

// newTable returns a terminal table that prints headers exactly as given
// (no automatic upper-casing, which would mangle symbols such as eps^2) and
// right-aligns numbers.
func newTable(w io.Writer) *tablewriter.Table { return newAlignedTable(w, tw.AlignRight) }

// newAlignedTable is newTable with the given row alignment.
func newAlignedTable(w io.Writer, align tw.Align) *tablewriter.Table {
	return tablewriter.NewTable(w,
		tablewriter.WithHeaderConfig(tw.CellConfig{Formatting: tw.CellFormatting{AutoFormat: tw.Off}}),
		tablewriter.WithRowAlignment(align),
	)
}
