package scan

import (
	"bytes"
	"context"
	"errors"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// TestRecordValidation: a resumed record file is checked record by record;
// whatever does not check out is reported in one warning line and
// recomputed, and the result is the file of an undisturbed run, byte for
// byte. A file of another scan or not a record file is refused.
func TestRecordValidation(t *testing.T) {
	dir := t.TempDir()
	s := mustScenario(t, strings.Replace(twoParam, "values = [1.25, 1.5, 2, 3]", "values = [1.25, 2]", 1))
	good := filepath.Join(dir, "good.jsonl")
	if _, err := Run(context.Background(), s, &Settings{Record: good, Version: "test"}); err != nil {
		t.Fatal(err)
	}
	want, _ := os.ReadFile(good)
	lines := strings.SplitAfter(string(want), "\n")
	// lines[0] header, lines[1..12] records, lines[13] trailer, lines[14] "".
	edit := func(k int, from, to string) string {
		out := append([]string(nil), lines...)
		if !strings.Contains(out[k], from) {
			t.Fatalf("line %d lacks %q", k, from)
		}
		out[k] = strings.Replace(out[k], from, to, 1)
		return strings.Join(out, "")
	}
	drop := func(k int) string {
		out := append([]string(nil), lines[:k]...)
		return strings.Join(append(out, lines[k+1:]...), "")
	}
	cases := []struct{ name, text, warn string }{
		{"status", edit(3, `"status":"scattered"`, `"status":"banana"`), `status "banana" is not an outcome`},
		{"deleted record", drop(5), "holds 11 valid records of 12"},
		{"index out of range", edit(4, `"i":3,`, `"i":999,`), "index 999 outside 0..11"},
		{"moved index", edit(4, `"i":3,`, `"i":4,`), "eps = 0.0024022488679628627 at index 4; the grid has"},
		{"conflicting duplicate", strings.Join(lines[:13], "") + strings.Replace(lines[4], `"evals":`, `"evals":1`, 1), "recorded before with other values"},
		{"changed eps", edit(2, `"eps":0.`, `"eps":0.5`), "the grid has"},
		{"corrupted key", edit(6, `"status"`, `"stauts"`), "line 7: not a record"},
		{"deleted error key", edit(6, `"dp_err":[`, `"dp_err_x":[`), "line 7: not a record"},
		{"deleted key", strings.Replace(edit(6, `"dp_err":[`, `"dp_err":[`), lines[6], regexp.MustCompile(`"dp_err":\[[^]]*\],`).ReplaceAllString(lines[6], ""), 1), `line 7: not a record (key "dp_err" missing)`},
		{"changed in-state", edit(7, `"p_in":[`, `"p_in":[2`), "the scenario gives"},
		{"other hash", edit(8, `"hash":"`, `"hash":"0`), "is not this scan's"},
		{"duplicate", strings.Join(append(append([]string(nil), lines[:13]...), lines[3:]...), ""), "10 points recorded twice with identical values (2-11)"},
		{"no trailer", strings.Join(lines[:13], ""), ""},
		{"cut line", strings.Join(lines[:9], "") + `{"i":9,"hash":`, ""},
		{"wrong trailer", edit(13, `"points":12`, `"points":13`), ""},
	}
	for _, c := range cases {
		f := filepath.Join(dir, "case.jsonl")
		os.WriteFile(f, []byte(c.text), 0o644)
		var warns []string
		_, err := Run(context.Background(), s, &Settings{Record: f, Resume: true, Version: "test", Warn: func(m string) { warns = append(warns, m) }})
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		got, _ := os.ReadFile(f)
		if !bytes.Equal(got, want) {
			t.Errorf("%s: resumed file differs from the undisturbed one", c.name)
		}
		all := strings.Join(warns, "\n")
		if c.warn != "" && !strings.Contains(all, c.warn) {
			t.Errorf("%s: warnings %q, want %q", c.name, warns, c.warn)
		}
		for _, w := range warns {
			if strings.Contains(w, "\n") {
				t.Errorf("%s: warning of several lines: %q", c.name, w)
			}
		}
	}
	// Refused: another scan, another shard, not a record file.
	refuse := []struct{ name, text, want string }{
		{"header hash", edit(0, `"hash":"`, `"hash":"0`), "recorded for another scenario"},
		{"not records", "hello\n", "is not a ricochet scan record file"},
		{"old format", strings.Replace(lines[0], RecordFormat, "ricochet-scan-records/1", 1), "of another format version"},
		{"empty", "", "empty or not a ricochet scan record file"},
	}
	for _, c := range refuse {
		f := filepath.Join(dir, "refuse.jsonl")
		os.WriteFile(f, []byte(c.text), 0o644)
		_, err := Run(context.Background(), s, &Settings{Record: f, Resume: true, Version: "test"})
		var fe *FileError
		if !errors.As(err, &fe) || !strings.Contains(err.Error(), c.want) || strings.Contains(err.Error(), "\n") {
			t.Errorf("%s: %v, want a one-line FileError with %q", c.name, err, c.want)
		}
		if got, _ := os.ReadFile(f); string(got) != c.text {
			t.Errorf("%s: refused file was changed", c.name)
		}
	}
	f := filepath.Join(dir, "shard.jsonl")
	os.WriteFile(f, want, 0o644)
	if _, err := Run(context.Background(), s, &Settings{Record: f, Resume: true, Shard: Shard{1, 2}, Version: "test"}); err == nil || !strings.Contains(err.Error(), "holds shard") {
		t.Errorf("whole-scan file resumed as a shard: %v", err)
	}
}

// TestCancel: a cancelled scan returns context.Canceled with a file that
// resumes to the file of an uninterrupted run.
func TestCancel(t *testing.T) {
	dir := t.TempDir()
	s := mustScenario(t, twoParam)
	full, part := filepath.Join(dir, "full.jsonl"), filepath.Join(dir, "part.jsonl")
	if _, err := Run(context.Background(), s, &Settings{Record: full, Version: "test"}); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithCancel(context.Background())
	n := 0
	_, err := Run(ctx, s, &Settings{Record: part, Version: "test", Workers: 2, Progress: func(done, total int) {
		if n++; n == 5 {
			cancel()
		}
	}})
	if !errors.Is(err, context.Canceled) {
		t.Fatalf("cancelled run: %v", err)
	}
	b, _ := os.ReadFile(part)
	if k := strings.Count(string(b), "\n"); k < 6 || k > 8 {
		t.Errorf("cancelled file has %d lines, want header + 5..7 points (the points in flight finish)", k)
	}
	if _, err := Run(context.Background(), s, &Settings{Record: part, Resume: true, Version: "test"}); err != nil {
		t.Fatal(err)
	}
	f1, _ := os.ReadFile(full)
	f2, _ := os.ReadFile(part)
	if !bytes.Equal(f1, f2) {
		t.Errorf("resumed file differs from the uninterrupted one")
	}
}
