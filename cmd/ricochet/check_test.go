package main

import (
	"encoding/csv"
	"encoding/json"
	"strings"
	"testing"
	"unicode/utf8"
)

// TestCheckFormats: the reference-suite table fits 100 columns; CSV has
// its header row first and one row per case; JSON decodes with one
// snake_case object per case.
func TestCheckFormats(t *testing.T) {
	code, table, e := run("check", "--short")
	if code != 0 {
		t.Fatalf("check: exit %d: %s", code, e)
	}
	for _, l := range strings.Split(table, "\n") {
		if n := utf8.RuneCountInString(l); n > checkWidth {
			t.Errorf("table line of %d columns: %q", n, l)
		}
	}
	code, out, e := run("check", "--short", "--format", "csv")
	if code != 0 {
		t.Fatalf("csv: exit %d: %s", code, e)
	}
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) < 2 || recs[0][0] != "check" || recs[0][2] != "rel_diff" {
		t.Fatalf("csv header %v", recs[0])
	}
	code, out, e = run("check", "--short", "--format", "json")
	if code != 0 {
		t.Fatalf("json: exit %d: %s", code, e)
	}
	validateJSON(t, "check", out)
	var doc struct {
		Checks []struct {
			Check     string  `json:"check"`
			RelDiff   float64 `json:"rel_diff"`
			Tolerance float64 `json:"tolerance"`
			Pass      bool    `json:"pass"`
		} `json:"checks"`
		Passed, Failed int
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Checks) != len(recs)-1 || doc.Failed != 0 || doc.Passed != len(doc.Checks) {
		t.Errorf("json: %d checks (csv %d), passed %d, failed %d", len(doc.Checks), len(recs)-1, doc.Passed, doc.Failed)
	}
	for _, c := range doc.Checks {
		if !c.Pass || !(c.RelDiff <= c.Tolerance) {
			t.Errorf("%s: rel. diff %v, tolerance %v, pass %v", c.Check, c.RelDiff, c.Tolerance, c.Pass)
		}
	}
	if code, _, _ := run("check", "--format", "xml"); code != 2 {
		t.Errorf("--format xml: exit %d, want 2", code)
	}
}
