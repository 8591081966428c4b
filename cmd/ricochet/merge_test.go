package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestMergeCommand: shards of a scan merge into the file of one run; a
// missing shard is reported per point with exit status 1 and nothing
// written; a shard of another scenario is refused with exit status 2.
func TestMergeCommand(t *testing.T) {
	dir := t.TempDir()
	base := []string{"scan", "--scenario", "coulomb-darwin", "--points", "6", "--quiet"}
	one := filepath.Join(dir, "one.jsonl")
	if code, _, e := run(append(base, "--output", one)...); code != 0 {
		t.Fatalf("one run: %d %s", code, e)
	}
	var shards []string
	for _, k := range []string{"1", "2", "3"} {
		f := filepath.Join(dir, "s"+k+".jsonl")
		code, out, e := run(append(base, "--shard", k+"/3", "--output", f)...)
		if code != 0 || !strings.Contains(out, "shard "+k+"/3") {
			t.Fatalf("shard %s: %d %s %s", k, code, out, e)
		}
		shards = append(shards, f)
	}
	merged := filepath.Join(dir, "m.jsonl")
	code, out, e := run(append([]string{"merge", "--output", merged}, shards...)...)
	want, _ := os.ReadFile(one)
	got, _ := os.ReadFile(merged)
	if code != 0 || !bytes.Equal(got, want) || !strings.Contains(out, "complete") {
		t.Fatalf("merge: %d %s %s (identical: %v)", code, out, e, bytes.Equal(got, want))
	}
	os.Remove(merged)
	code, out, e = run("merge", "--output", merged, shards[0], shards[2])
	if _, err := os.Stat(merged); code != 1 || err == nil || !strings.Contains(out, "shard 2/3 (no file given): 2 of 2 points missing: 1, 4") || !strings.Contains(e, "2 of 6 points missing") {
		t.Errorf("merge without shard 2: exit %d\n%s\n%s", code, out, e)
	}
	other := filepath.Join(dir, "other.jsonl")
	run("scan", "--scenario", "coulomb-darwin", "--points", "7", "--quiet", "--shard", "2/3", "--output", other)
	code, _, e = run("merge", "--output", merged, shards[0], other)
	if code != 2 || !strings.Contains(e, "belongs to another scan") || strings.Count(strings.TrimSpace(e), "\n") != 0 {
		t.Errorf("foreign shard: exit %d, %q", code, e)
	}
	if code, _, e := run("scan", "--scenario", "coulomb-darwin", "--shard", "4/3", "--output", other); code != 2 || !strings.Contains(e, "--shard") {
		t.Errorf("bad shard: %d %q", code, e)
	}
}
