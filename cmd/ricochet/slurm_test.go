package main

import (
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// TestMain lets the test binary stand in for the ricochet program that the
// generated batch scripts run (RICOCHET_TEST_AS_PROGRAM=1).
func TestMain(m *testing.M) {
	if os.Getenv("RICOCHET_TEST_AS_PROGRAM") == "1" {
		os.Exit(mainWith(os.Args[1:], os.Stdout, os.Stderr))
	}
	os.Exit(m.Run())
}

// TestSlurmScripts writes the batch scripts of a sharded scan and runs
// them with bash as Slurm would (SLURM_ARRAY_TASK_ID set; the #SBATCH
// lines are comments to bash): the merge job's file equals one run's; with
// a shard missing it reports exactly its points, writes nothing and prints
// the command that reruns that task; the rerun completes the scan. The
// real scheduler is exercised by validate/cluster/slurm-test.sh.
func TestSlurmScripts(t *testing.T) {
	bash, err := exec.LookPath("bash")
	if err != nil {
		t.Skip("bash not found: the batch scripts are bash scripts")
	}
	dir := t.TempDir()
	prog, err := os.Executable()
	if err != nil {
		t.Fatal(err)
	}
	rdir := filepath.Join(dir, "run")
	code, out, e := run("slurm", "--scenario", "coulomb-darwin", "--points", "6", "--gamma", "1.5",
		"--dir", rdir, "--shards", "3", "--point-cost", "2ms", "--ricochet", prog, "--cpus", "2",
		"--partition", "short", "--sbatch=--qos=long", "--max-running", "2")
	if code != 0 {
		t.Fatalf("slurm: exit %d\n%s\n%s", code, out, e)
	}
	for _, want := range []string{
		"6 points in 3 shards of at most 2 points",
		"jid=$(sbatch --parsable " + filepath.Join(rdir, "scan.sbatch") + ")",
		"sbatch --dependency=afterany:${jid%%;*} " + filepath.Join(rdir, "merge.sbatch"),
		"sbatch --array=K " + filepath.Join(rdir, "scan.sbatch"),
	} {
		if !strings.Contains(out, want) {
			t.Errorf("slurm output lacks %q:\n%s", want, out)
		}
	}
	script, _ := os.ReadFile(filepath.Join(rdir, "scan.sbatch"))
	// 2 points of 2 ms on 2 CPUs: T = 2 ms + 1 ms; limit ⌈2 T + 1 min⌉ = 2 min.
	for _, want := range []string{"#SBATCH --array=1-3%2\n", "#SBATCH --time=00:02:00\n", "#SBATCH --mem=256M\n",
		"#SBATCH --cpus-per-task=2\n", "#SBATCH --partition=short\n", "#SBATCH --qos=long\n", "--gamma=1.5 --points=6"} {
		if !strings.Contains(string(script), want) {
			t.Errorf("scan.sbatch lacks %q:\n%s", want, script)
		}
	}
	var plan shardPlanFile
	if b, err := os.ReadFile(filepath.Join(rdir, "plan.json")); err != nil || json.Unmarshal(b, &plan) != nil || plan.Shards != 3 || plan.Jobs != 6 || !plan.Cost.Given || plan.Time != "00:02:00" {
		t.Errorf("plan.json: %+v %v", plan, err)
	}

	one := filepath.Join(dir, "one.jsonl")
	if code, _, e := run("scan", "--scenario", "coulomb-darwin", "--points", "6", "--gamma", "1.5", "--quiet", "--output", one); code != 0 {
		t.Fatalf("one run: %d %s", code, e)
	}
	sh := func(script string, task int) (string, error) {
		cmd := exec.Command(bash, filepath.Join(rdir, script))
		cmd.Env = append(os.Environ(), "RICOCHET_TEST_AS_PROGRAM=1")
		if task > 0 {
			cmd.Env = append(cmd.Env, "SLURM_ARRAY_TASK_ID="+string(rune('0'+task)), "SLURM_CPUS_PER_TASK=2")
		}
		b, err := cmd.CombinedOutput()
		return string(b), err
	}
	for _, k := range []int{1, 3} {
		if out, err := sh("scan.sbatch", k); err != nil {
			t.Fatalf("task %d: %v\n%s", k, err, out)
		}
	}
	merged := filepath.Join(rdir, "scan.jsonl")
	out, err = sh("merge.sbatch", 0)
	if err == nil || !strings.Contains(out, "  shard 2/3 (no file given): 2 of 2 points missing: 1, 4") ||
		!strings.Contains(out, "to complete the scan: sbatch --array=2 "+filepath.Join(rdir, "scan.sbatch")) {
		t.Errorf("merge without shard 2: %v\n%s", err, out)
	}
	if _, err := os.Stat(merged); err == nil {
		t.Error("merge with points missing wrote a file")
	}
	if out, err := sh("scan.sbatch", 2); err != nil {
		t.Fatalf("task 2: %v\n%s", err, out)
	}
	// A rerun of a complete task resumes its file and changes nothing.
	f1 := filepath.Join(rdir, "shards", "shard-1-of-3.jsonl")
	before, _ := os.ReadFile(f1)
	if out, err := sh("scan.sbatch", 1); err != nil || !strings.Contains(out, "resuming "+f1) {
		t.Fatalf("rerun of task 1: %v\n%s", err, out)
	}
	if after, _ := os.ReadFile(f1); !bytes.Equal(before, after) {
		t.Error("rerunning a complete task changed its shard file")
	}
	if out, err := sh("merge.sbatch", 0); err != nil || !strings.Contains(out, "6 points, complete") {
		t.Fatalf("merge: %v\n%s", err, out)
	}
	want, _ := os.ReadFile(one)
	if got, _ := os.ReadFile(merged); !bytes.Equal(got, want) {
		t.Error("merged file differs from the file of one rdir")
	}
	report, _ := os.ReadFile(filepath.Join(rdir, "merge-report.txt"))
	if !strings.Contains(string(report), "complete") {
		t.Errorf("merge-report.txt: %s", report)
	}

	// Regenerating for the same scan keeps the shard files; another scan
	// into the same directory is refused.
	if code, _, e := run("slurm", "--scenario", "coulomb-darwin", "--points", "6", "--gamma", "1.5", "--dir", rdir, "--shards", "3", "--point-cost", "2ms", "--ricochet", prog); code != 0 {
		t.Errorf("regenerate: %d %s", code, e)
	}
	if code, _, e := run("slurm", "--scenario", "coulomb-darwin", "--points", "7", "--dir", rdir, "--point-cost", "2ms", "--ricochet", prog); code != 2 || !strings.Contains(e, "holds 3 shard files of another scan") {
		t.Errorf("another scan into the same directory: %d %q", code, e)
	}
}

// TestSlurmNamesUnnamedScenario: a scenario without a name takes its file
// name, which enters the scan's hash; the copy the tasks read is named so
// (the command checks it reproduces the hash).
func TestSlurmNamesUnnamedScenario(t *testing.T) {
	dir := t.TempDir()
	text := "[background]\nkind = \"coulomb\"\ncharge = 0.05\n[probe]\nkind = \"charge\"\ncharge = 1\n[kinematics]\nv = 0.5\n[scan]\npoints = 4\n"
	path := filepath.Join(dir, "plain.toml")
	os.WriteFile(path, []byte(text), 0o644)
	code, out, e := run("slurm", path, "--dir", filepath.Join(dir, "run"), "--point-cost", "1s", "--ricochet", "ricochet")
	if code != 0 {
		t.Fatalf("exit %d %s %s", code, out, e)
	}
	b, _ := os.ReadFile(filepath.Join(dir, "run", "scenario.toml"))
	if !strings.HasPrefix(string(b), "name = \""+path+"\"\n") || !strings.HasSuffix(string(b), text) {
		t.Errorf("scenario copy:\n%s", b)
	}
}

// TestSlurmBadInput: one line naming the flag and the allowed range,
// exit 2.
func TestSlurmBadInput(t *testing.T) {
	dir := t.TempDir()
	base := []string{"slurm", "--scenario", "coulomb-darwin", "--dir", dir, "--point-cost", "1ms", "--ricochet", "ricochet"}
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"slurm", "--scenario", "coulomb-darwin"}, "--dir DIR is required"},
		{append(base, "--shards", "14"), "shards = 14; allowed: 1 ≤ shards ≤ 13"},
		{append(base, "--time", "soon"), "--time = \"soon\"; allowed"},
		{append(base, "--mem", "lots"), "--mem = \"lots\"; allowed"},
		{append(base, "--cpus", "0"), "--cpus = 0; allowed"},
		{append(base, "--safety", "0.5"), "--safety = 0.5; allowed"},
		{append(base, "--sample", "0"), "--sample = 0; allowed"},
		{append(base, "--sbatch", "qos=long"), "--sbatch = \"qos=long\""},
		{append(base, "--spread"), "--spread: allowed only for probe kind root-kerr"},
		{append(base, "--points", "1"), "--points = 1 (scan.points)"},
		{append(base[:len(base):len(base)], "--point-cost", "1h", "--task-time", "30m"), "too short for one point"},
	} {
		code, _, e := run(c.args...)
		if code != 2 || !strings.Contains(e, c.want) || strings.Count(strings.TrimSpace(e), "\n") != 0 {
			t.Errorf("%v: exit %d, %q; want one line containing %q", c.args[1:], code, e, c.want)
		}
	}
}

// TestSlurmTime: the time-limit forms of sbatch --time (Slurm's sbatch
// manual: minutes, minutes:seconds, hours:minutes:seconds, days-hours,
// days-hours:minutes, days-hours:minutes:seconds) and Go durations.
func TestSlurmTime(t *testing.T) {
	for _, c := range []struct {
		in   string
		want time.Duration
	}{
		{"90", 90 * time.Minute},
		{"5:30", 5*time.Minute + 30*time.Second},
		{"2:03:04", 2*time.Hour + 3*time.Minute + 4*time.Second},
		{"1-12", 36 * time.Hour},
		{"1-0:30", 24*time.Hour + 30*time.Minute},
		{"2-01:02:03", 49*time.Hour + 2*time.Minute + 3*time.Second},
		{"4h", 4 * time.Hour},
		{"90m", 90 * time.Minute},
	} {
		if got, err := parseSlurmTime(c.in); err != nil || got != c.want {
			t.Errorf("parseSlurmTime(%q) = %v, %v; want %v", c.in, got, err, c.want)
		}
	}
	for _, bad := range []string{"", "0", "-1h", "1-", "a:b", "1:2:3:4", "x-1", "0:00"} {
		if _, err := parseSlurmTime(bad); err == nil {
			t.Errorf("parseSlurmTime(%q): want an error", bad)
		}
	}
	for d, want := range map[time.Duration]string{
		2 * time.Minute:                       "00:02:00",
		25*time.Hour + 61*time.Second:         "1-01:01:01",
		59*time.Minute + 500*time.Millisecond: "00:59:01",
	} {
		if got := formatSlurmTime(d); got != want {
			t.Errorf("formatSlurmTime(%v) = %q, want %q", d, got, want)
		}
	}
	for in, want := range map[string]uint64{"512": 512 << 20, "512M": 512 << 20, "4G": 4 << 30, "2048K": 2 << 20, "1T": 1 << 40, "3gb": 3 << 30} {
		if got, err := parseSlurmMemory(in); err != nil || got != want {
			t.Errorf("parseSlurmMemory(%q) = %d, %v; want %d", in, got, err, want)
		}
	}
	for _, bad := range []string{"", "0", "G", "-1G", "1.5G", "lots"} {
		if _, err := parseSlurmMemory(bad); err == nil {
			t.Errorf("parseSlurmMemory(%q): want an error", bad)
		}
	}
	if formatSlurmMemory(3<<30) != "3G" || formatSlurmMemory(401<<20) != "401M" || formatSlurmMemory(1) != "1M" {
		t.Error("formatSlurmMemory")
	}
}

// TestShellQuote: words the shell would split or expand are quoted.
func TestShellQuote(t *testing.T) {
	for in, want := range map[string]string{"/a/b.toml": "/a/b.toml", "--gamma=1.5": "--gamma=1.5", "a b": "'a b'", "it's": `'it'\''s'`, "$x": "'$x'", "": "''"} {
		if got := shq(in); got != want {
			t.Errorf("shq(%q) = %s, want %s", in, got, want)
		}
	}
}
