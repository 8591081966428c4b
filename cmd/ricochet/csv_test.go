package main

import (
	"encoding/csv"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestCSVLoads: the point and fit CSV load with Go's encoding/csv, with
// Python's csv module and, where numpy is installed, with
// numpy.genfromtxt(names=True) without any option for comments; the
// fitted next-order coefficient is in the fit CSV.
func TestCSVLoads(t *testing.T) {
	dir := t.TempDir()
	for _, format := range []string{"csv", "csv-fits"} {
		code, out, e := run("scan", "--scenario", "coulomb-darwin", "--points", "9", "--observable", "dp_b,dp_l", "--format", format, "--quiet")
		if code != 0 {
			t.Fatalf("%s: exit %d: %s", format, code, e)
		}
		recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
		if err != nil {
			t.Fatalf("%s: %v", format, err)
		}
		want := 1 + 2*9
		if format == "csv-fits" {
			want = 1 + 2
			// Darwin 1913: the ε² coefficient of Δp_b/m is −π/(2γv),
			// γ = 1.25, v = 0.6 (exact.DarwinSeries).
			c2, err1 := strconv.ParseFloat(recs[1][7], 64)
			s2, err2 := strconv.ParseFloat(recs[1][8], 64)
			if recs[0][7] != "next_order" || err1 != nil || err2 != nil || c2+2.0943951023931953 > 2*s2 || c2+2.0943951023931953 < -2*s2 {
				t.Errorf("fit csv: %v / %v", recs[0], recs[1])
			}
		}
		if len(recs) != want {
			t.Errorf("%s: %d rows, want %d", format, len(recs), want)
		}
		path := filepath.Join(dir, format+".csv")
		os.WriteFile(path, []byte(out), 0o644)
		col := "eps"
		if format == "csv-fits" {
			col = "next_order"
		}
		pythonLoads(t, format, path, want-1, col)
	}
}
