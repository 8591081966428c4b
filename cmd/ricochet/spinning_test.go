package main

import (
	"encoding/json"
	"strings"
	"testing"
)

// TestSuperExtremalWarnings: a scan whose background is super-extremal at
// some points says so in the table, the CSV comments and the JSON (which
// validates against the published schema), as does the run JSON; a scan
// of a black hole at every point (kerr-skim, a/M held at 0.9) has none.
func TestSuperExtremalWarnings(t *testing.T) {
	args := []string{"scan", "--scenario", "kerr-spinning", "--points", "3", "--observable", "dp_b,da_n", "--quiet"}
	code, out, errs := run(append(args, "--format", "table")...)
	if code != 0 || !strings.Contains(out, "warning: super-extremal background") || !strings.Contains(out, "at 3 of 3 points") {
		t.Errorf("table: exit %d, %q %q", code, out, errs)
	}
	code, out, _ = run(append(args, "--format", "csv", "--csv-comments")...)
	if code != 0 || !strings.Contains(out, "# warning: super-extremal background") {
		t.Errorf("csv comments: exit %d, %q", code, out)
	}
	code, out, _ = run(append(args, "--format", "json")...)
	validateJSON(t, "scan", out)
	var doc struct{ Warnings []string }
	if err := json.Unmarshal([]byte(out), &doc); err != nil || len(doc.Warnings) != 1 || !strings.Contains(doc.Warnings[0], "super-extremal") {
		t.Errorf("scan json: exit %d, warnings %q (%v)", code, doc.Warnings, err)
	}
	code, out, _ = run("run", "--scenario", "kerr-spinning", "--format", "json")
	validateJSON(t, "run", out)
	doc.Warnings = nil
	if err := json.Unmarshal([]byte(out), &doc); err != nil || len(doc.Warnings) != 1 {
		t.Errorf("run json: exit %d, warnings %q (%v)", code, doc.Warnings, err)
	}
	code, out, _ = run("scan", "--scenario", "kerr-skim", "--points", "3", "--quiet", "--format", "json")
	validateJSON(t, "scan", out)
	doc.Warnings = nil
	if err := json.Unmarshal([]byte(out), &doc); err != nil || code != 0 || len(doc.Warnings) != 0 {
		t.Errorf("kerr-skim: exit %d, warnings %q (%v)", code, doc.Warnings, err)
	}
}
