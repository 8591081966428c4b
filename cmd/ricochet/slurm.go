package main

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"ricochet/observables/scan"
	"ricochet/observables/scenario"
)

var slurmFlags struct {
	common
	epsMin, epsMax float64
	points         int
	spread         bool
	dir            string
	shards         int
	taskTime       string
	cpus           int
	time           string
	mem            string
	safety         float64
	sample         int
	sampleTime     time.Duration
	pointCost      time.Duration
	partition      string
	account        string
	maxRunning     int
	sbatch         sbatchOptions
	ricochet       string
}

var cmdSlurm = &Command{
	Name:      "slurm",
	UsageLine: "slurm --dir DIR [flags] [scenario.toml]",
	Short:     "write Slurm batch scripts for a sharded scan and its merge",
	Long: `Slurm writes the batch scripts that run a scan on a Slurm cluster as a job
array, one array task per shard ('ricochet scan --shard K/N'), and a merge
job to run after it ('ricochet merge'), and prints the commands that
submit them. Everything goes below --dir DIR:

	DIR/scenario.toml              the scenario (the flags below are passed on)
	DIR/scan.sbatch                the array job, tasks 1..N
	DIR/merge.sbatch               the merge job
	DIR/plan.json                  the shard plan and its cost model
	DIR/shards/shard-K-of-N.jsonl  the record file of each shard
	DIR/scan.jsonl                 the merged record file
	DIR/merge-report.txt           what the last merge found
	DIR/logs/                      the jobs' output

Resources come from a cost model measured here: a few points of the scan
(--sample, spread over every axis) are integrated one after the other on
one worker and timed. A shard of n points on c CPUs is expected to take
T = n t/c + (1 - 1/c) t_max, with t the mean time per point plus two
standard errors and t_max the slowest point timed (Graham's bound for
list scheduling); its time limit is --safety x T plus one minute for
start-up, rounded up to whole minutes. Memory is --safety x (the peak of
this process + three copies of each record of a shard), at least 256 MiB.
Without --shards, the fewest shards whose time limit fits in --task-time
are used. --time, --mem and --point-cost override the model.

An array task that failed or was cancelled is rerun with
'sbatch --array=K DIR/scan.sbatch': it resumes its shard's record file and
computes only the points it lacks. The merge job lists exactly which points
are missing, per shard, and prints the command that reruns those tasks;
then submit DIR/merge.sbatch again. Regenerating the scripts into the same
DIR for the same scan keeps the shard files.`,
	Example: `ricochet slurm my.toml --dir runs/my
jid=$(sbatch --parsable runs/my/scan.sbatch)
sbatch --dependency=afterany:${jid%%;*} runs/my/merge.sbatch
ricochet slurm my.toml --dir runs/my --shards 64 --cpus 4 --partition short
ricochet slurm --scenario kerr-skim --dir runs/kerr --task-time 4h --account phys`,
	Flags: pflag.NewFlagSet("slurm", pflag.ContinueOnError),
	Run:   runSlurm,
}

// slurmPass lists the scan flags passed on to every array task.
var slurmPass = []string{"gamma", "b", "tol", "radius", "method", "eps-min", "eps-max", "points", "spread"}

func init() {
	f := cmdSlurm.Flags
	slurmFlags.register(f)
	for _, name := range []string{"signature", "units", "impact", "spin"} {
		f.MarkHidden(name) // output conventions: they do not enter the records
	}
	f.Float64Var(&slurmFlags.epsMin, "eps-min", 0, "override scan.eps_min (smallest |eps|, > 0)")
	f.Float64Var(&slurmFlags.epsMax, "eps-max", 0, "override scan.eps_max (largest |eps|)")
	f.IntVar(&slurmFlags.points, "points", 0, "override scan.points (2..10000)")
	f.BoolVar(&slurmFlags.spread, "spread", false, "scan every completion of the root-Kerr probe or the Kerr probe (as scan --spread)")
	f.StringVar(&slurmFlags.dir, "dir", "", "directory of the scripts, shard files, merged file and logs (created; required)")
	f.IntVar(&slurmFlags.shards, "shards", 0, "number of shards, one array task each (0: the fewest that fit in --task-time)")
	f.StringVar(&slurmFlags.taskTime, "task-time", "1h", "longest time limit wanted per task when --shards is not given (e.g. 30m, 4h, 1-00:00:00)")
	f.IntVar(&slurmFlags.cpus, "cpus", 1, "CPUs per task (the workers of each shard), 1..1024")
	f.StringVar(&slurmFlags.time, "time", "", "override the time limit per task (e.g. 2h, 90, 1-12:00:00)")
	f.StringVar(&slurmFlags.mem, "mem", "", "override the memory per task (e.g. 2G, 512M)")
	f.Float64Var(&slurmFlags.safety, "safety", scan.DefaultSafety, "factor on the expected time and memory, 1..100")
	f.IntVar(&slurmFlags.sample, "sample", 8, "points timed here for the cost model, 1..1000")
	f.DurationVar(&slurmFlags.sampleTime, "sample-time", 20*time.Second, "stop timing points after this long (at least one point is timed)")
	f.DurationVar(&slurmFlags.pointCost, "point-cost", 0, "time per point on one CPU, instead of timing points here (e.g. 40ms; one point is still integrated for the size of its record)")
	f.StringVar(&slurmFlags.partition, "partition", "", "Slurm partition of both jobs")
	f.StringVar(&slurmFlags.account, "account", "", "Slurm account of both jobs")
	f.IntVar(&slurmFlags.maxRunning, "max-running", 0, "at most this many array tasks at once (0: no limit)")
	f.Var(&slurmFlags.sbatch, "sbatch", "further #SBATCH option for both jobs, e.g. --sbatch=--qos=long (repeatable)")
	f.StringVar(&slurmFlags.ricochet, "ricochet", "", "the ricochet program the jobs run (default: this one)")
}

// shardPlanFile is DIR/plan.json.
type shardPlanFile struct {
	Format   string         `json:"format"`
	Scenario string         `json:"scenario"`
	Hash     string         `json:"hash"`
	Jobs     int            `json:"points"`
	Shards   int            `json:"shards"`
	Per      int            `json:"points_per_shard"`
	CPUs     int            `json:"cpus_per_task"`
	Safety   float64        `json:"safety"`
	Cost     shardPlanCost  `json:"cost_per_point"`
	Expected float64        `json:"expected_seconds_per_task"`
	Time     string         `json:"time_limit"`
	Memory   string         `json:"memory"`
	Merge    shardPlanMerge `json:"merge_job"`
	CPUHours float64        `json:"cpu_hours"`
	Program  string         `json:"ricochet"`
	Args     []string       `json:"scan_flags"`
}

type shardPlanCost struct {
	Given   bool    `json:"given"`
	Sampled int     `json:"points_timed"`
	Mean    float64 `json:"mean_seconds"`
	SE      float64 `json:"standard_error_seconds"`
	Max     float64 `json:"max_seconds"`
	Record  int     `json:"record_bytes"`
	Peak    uint64  `json:"peak_bytes"`
}

type shardPlanMerge struct {
	Time   string `json:"time_limit"`
	Memory string `json:"memory"`
}

const shardPlanFormat = "ricochet-slurm-plan/1"

func runSlurm(cmd *Command, args []string, w io.Writer) error {
	fl := &slurmFlags
	if fl.dir == "" {
		return badf("--dir DIR is required (the directory of the scripts and results)")
	}
	switch {
	case fl.sample < 1 || fl.sample > 1000:
		return badf("--sample = %d; allowed: 1 ≤ sample ≤ 1000", fl.sample)
	case fl.sampleTime <= 0:
		return badf("--sample-time = %v; allowed: > 0", fl.sampleTime)
	case fl.pointCost < 0:
		return badf("--point-cost = %v; allowed: > 0", fl.pointCost)
	case fl.maxRunning < 0:
		return badf("--max-running = %d; allowed: ≥ 0", fl.maxRunning)
	case fl.cpus < 1 || fl.cpus > 1024:
		return badf("--cpus = %d; allowed: 1 ≤ cpus ≤ 1024", fl.cpus)
	case fl.safety < 1 || fl.safety > 100 || math.IsNaN(fl.safety):
		return badf("--safety = %g; allowed: 1 ≤ safety ≤ 100", fl.safety)
	}
	req := scan.ShardRequest{Shards: fl.shards, CPUs: fl.cpus, Safety: fl.safety}
	var err error
	if req.TaskTime, err = parseSlurmTime(fl.taskTime); err != nil {
		return badf("--task-time = %q; %v", fl.taskTime, err)
	}
	if fl.time != "" {
		if req.Time, err = parseSlurmTime(fl.time); err != nil {
			return badf("--time = %q; %v", fl.time, err)
		}
	}
	if fl.mem != "" {
		if req.Memory, err = parseSlurmMemory(fl.mem); err != nil {
			return badf("--mem = %q; %v", fl.mem, err)
		}
	}
	for _, o := range fl.sbatch {
		if !strings.HasPrefix(o, "-") || strings.ContainsAny(o, "\n\r") {
			return badf("--sbatch = %q; allowed: one sbatch option starting with '-'", o)
		}
	}
	prog := fl.ricochet
	if prog == "" {
		if prog, err = os.Executable(); err != nil {
			return fmt.Errorf("cannot find this program (%v); give --ricochet PATH", err)
		}
		if strings.Contains(prog, string(filepath.Separator)+"go-build") {
			return badf("--ricochet: this program runs from a temporary build ('go run') that the jobs cannot run; build it (go build -o DIR/ricochet ./cmd/ricochet) and give --ricochet PATH")
		}
	}
	if prog, err = filepath.Abs(prog); err != nil {
		return badf("--ricochet: %v", err)
	}
	dir, err := filepath.Abs(fl.dir)
	if err != nil {
		return badf("--dir: %v", err)
	}

	fl.extra = func(s *Scenario) {
		if fl.epsMin != 0 {
			s.Scan.EpsMin = fl.epsMin
		}
		if fl.epsMax != 0 {
			s.Scan.EpsMax = fl.epsMax
		}
		if fl.points != 0 {
			s.Scan.Points = fl.points
		}
	}
	s, raw, err := fl.load(args)
	if err != nil {
		return err
	}
	var members []string
	if fl.spread {
		if members = s.SpreadMembers(); members == nil {
			return badf("--spread: allowed only for probe kinds root-kerr, root-kerr-body and kerr-probe; this scenario's probe is %q", s.Probe.Kind)
		}
	}
	p, err := scan.NewPlan(s, members, version)
	if err != nil {
		return err
	}
	pass := []string{}
	for _, name := range slurmPass {
		if f := cmd.Flags.Lookup(name); f.Changed {
			if f.Value.Type() == "bool" {
				pass = append(pass, "--"+name)
			} else {
				pass = append(pass, "--"+name+"="+f.Value.String())
			}
		}
	}
	// The scenario as the tasks read it: the same text, named as here
	// (an unnamed scenario takes its file name, which enters the hash).
	text := raw
	if named, err := scenario.Parse([]byte(raw), "copy"); err == nil && named.Name == "" {
		text = "name = " + strconv.Quote(s.Name) + "\n" + raw
	}
	if err := checkSlurmDir(dir, p.Hash); err != nil {
		return err
	}
	for _, d := range []string{dir, filepath.Join(dir, "shards"), filepath.Join(dir, "logs")} {
		if err := os.MkdirAll(d, 0o755); err != nil {
			return badf("--dir: %v", err)
		}
	}
	scenPath := filepath.Join(dir, "scenario.toml")
	if err := os.WriteFile(scenPath, []byte(text), 0o644); err != nil {
		return err
	}
	if err := sameScan(scenPath, p.Hash, members); err != nil {
		return err
	}

	var cost *scan.Cost
	if fl.pointCost > 0 {
		cost = scan.GivenCost(p, fl.pointCost.Seconds())
	} else {
		ctx, stop := interruptible(context.Background())
		cost, err = scan.Measure(ctx, p, fl.sample, fl.sampleTime)
		stop()
		if err != nil {
			return err
		}
	}
	sp, err := scan.NewShardPlan(p.Jobs(), cost, req)
	if err != nil {
		return badf("%v", err)
	}
	js := &slurmJob{dir: dir, prog: prog, scen: scenPath, pass: pass, plan: sp, hash: p.Hash, name: s.Name}
	files := map[string]string{
		"scan.sbatch":  js.arrayScript(),
		"merge.sbatch": js.mergeScript(),
	}
	for name, body := range files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o755); err != nil {
			return err
		}
	}
	if err := writePlanFile(filepath.Join(dir, "plan.json"), js); err != nil {
		return err
	}
	js.report(w, fl.taskTime, req.TaskTime)
	return nil
}

// checkSlurmDir refuses a directory that holds shard files of another
// scan. (Shard files of the same scan in another number of shards are
// refused by the tasks themselves: a shard file resumes only as the same
// shard.)
func checkSlurmDir(dir, hash string) error {
	b, err := os.ReadFile(filepath.Join(dir, "plan.json"))
	if err != nil {
		return nil
	}
	var old shardPlanFile
	if json.Unmarshal(b, &old) != nil || old.Hash == hash {
		return nil
	}
	shards, _ := filepath.Glob(filepath.Join(dir, "shards", "*.jsonl"))
	if len(shards) == 0 {
		return nil
	}
	return badf("--dir %s holds %d shard files of another scan (hash %s, this one %s); choose another --dir", dir, len(shards), old.Hash, hash)
}

// sameScan checks that the scenario file the tasks read, with the flags
// passed on, is the scan planned here.
func sameScan(path, hash string, members []string) error {
	c := slurmFlags.common
	c.scenario = ""
	s, _, err := c.load([]string{path})
	if err != nil {
		return fmt.Errorf("the scenario written to %s does not load: %v", path, err)
	}
	p, err := scan.NewPlan(s, members, version)
	if err != nil {
		return err
	}
	if p.Hash != hash {
		return fmt.Errorf("the scenario written to %s is another scan (hash %s, want %s)", path, p.Hash, hash)
	}
	return nil
}

// slurmJob is what the scripts are written from.
type slurmJob struct {
	dir, prog, scen string
	pass            []string
	plan            *scan.ShardPlan
	hash, name      string
}

func (j *slurmJob) path(name ...string) string {
	return filepath.Join(append([]string{j.dir}, name...)...)
}

// jobName is the scenario's name as a Slurm job name.
func (j *slurmJob) jobName() string {
	var b strings.Builder
	for _, r := range j.name {
		if r < 128 && (r == '-' || r == '_' || r == '.' || r >= '0' && r <= '9' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z') {
			b.WriteRune(r)
		} else {
			b.WriteByte('_')
		}
	}
	n := b.String()
	if len(n) > 40 {
		n = n[:40]
	}
	return "ricochet-" + n
}

// header is the #SBATCH block common to both jobs.
func (j *slurmJob) header(b *strings.Builder, name string, t time.Duration, mem uint64, cpus int, output string) {
	fmt.Fprintf(b, "#SBATCH --job-name=%s\n", name)
	fmt.Fprintf(b, "#SBATCH --time=%s\n", formatSlurmTime(t))
	fmt.Fprintf(b, "#SBATCH --mem=%s\n", formatSlurmMemory(mem))
	b.WriteString("#SBATCH --nodes=1\n#SBATCH --ntasks=1\n")
	fmt.Fprintf(b, "#SBATCH --cpus-per-task=%d\n", cpus)
	fmt.Fprintf(b, "#SBATCH --output=%s\n", output)
	if slurmFlags.partition != "" {
		fmt.Fprintf(b, "#SBATCH --partition=%s\n", slurmFlags.partition)
	}
	if slurmFlags.account != "" {
		fmt.Fprintf(b, "#SBATCH --account=%s\n", slurmFlags.account)
	}
	for _, o := range slurmFlags.sbatch {
		fmt.Fprintf(b, "#SBATCH %s\n", o)
	}
}

// costLines describes the cost model in comment lines.
func (j *slurmJob) costLines() string {
	sp := j.plan
	c := sp.Cost
	var b strings.Builder
	if c.Given {
		fmt.Fprintf(&b, "# Cost per point (given): %s on one CPU.\n", fmtSeconds(c.Mean))
	} else {
		fmt.Fprintf(&b, "# Cost per point, %d points timed on one CPU where the scripts were written:\n", len(c.Seconds))
		fmt.Fprintf(&b, "#   mean %s ± %s, slowest %s.\n", fmtSeconds(c.Mean), fmtSeconds(c.SE), fmtSeconds(c.Max))
	}
	fmt.Fprintf(&b, "# Largest shard: %s on %s, expected %s; limit %s (x%g + 1 min start-up%s);\n",
		plural(sp.PointsPerShard, "point"), plural(sp.CPUs, "CPU"), fmtSeconds(sp.Expected.Seconds()), formatSlurmTime(sp.Time), sp.Safety, given(sp.TimeGiven))
	fmt.Fprintf(&b, "# memory %s (record %d bytes, peak %s%s). Whole scan: %.3g CPU hours.\n",
		formatSlurmMemory(sp.Memory), c.RecordBytes, formatSlurmMemory(c.PeakBytes), given(sp.MemoryGiven), sp.CPUHours)
	return b.String()
}

func given(g bool) string {
	if g {
		return "; given, overrides the model"
	}
	return ""
}

// arrayScript is DIR/scan.sbatch.
func (j *slurmJob) arrayScript() string {
	sp := j.plan
	var b strings.Builder
	b.WriteString("#!/bin/bash\n")
	j.header(&b, j.jobName(), sp.Time, sp.Memory, sp.CPUs, j.path("logs", "scan-%A_%a.out"))
	array := fmt.Sprintf("1-%d", sp.Shards)
	if slurmFlags.maxRunning > 0 {
		array += fmt.Sprintf("%%%d", slurmFlags.maxRunning)
	}
	fmt.Fprintf(&b, "#SBATCH --array=%s\n", array)
	fmt.Fprintf(&b, "#\n# Written by %s: scan %s (hash %s), %s in %s, one array task each.\n", versionString(), j.name, j.hash, plural(sp.Jobs, "point"), plural(sp.Shards, "shard"))
	b.WriteString(j.costLines())
	fmt.Fprintf(&b, "#\n# Submit: sbatch %s\n", shq(j.path("scan.sbatch")))
	fmt.Fprintf(&b, "# Rerun task K (it resumes its shard file): sbatch --array=K %s\n", shq(j.path("scan.sbatch")))
	b.WriteString("set -euo pipefail\n")
	fmt.Fprintf(&b, "k=${SLURM_ARRAY_TASK_ID:?submit this script with sbatch: it runs as an array task}\n")
	fmt.Fprintf(&b, "n=%d\n", sp.Shards)
	b.WriteString("if [ \"$k\" -lt 1 ] || [ \"$k\" -gt \"$n\" ]; then echo \"array task $k: allowed 1..$n\" >&2; exit 2; fi\n")
	fmt.Fprintf(&b, "out=%s/shard-$k-of-$n.jsonl\n", shq(j.path("shards")))
	b.WriteString("resume=\nif [ -s \"$out\" ]; then resume=--resume; fi\n")
	b.WriteString("echo \"ricochet: shard $k/$n on $(hostname) at $(date -u +%FT%TZ)${resume:+, resuming $out}\"\n")
	fmt.Fprintf(&b, "exec %s scan %s", shq(j.prog), shq(j.scen))
	for _, a := range j.pass {
		b.WriteString(" " + shq(a))
	}
	fmt.Fprintf(&b, " \\\n  --shard \"$k/$n\" --output \"$out\" $resume --workers \"${SLURM_CPUS_PER_TASK:-%d}\" --quiet\n", sp.CPUs)
	return b.String()
}

// mergeScript is DIR/merge.sbatch.
func (j *slurmJob) mergeScript() string {
	sp := j.plan
	var b strings.Builder
	b.WriteString("#!/bin/bash\n")
	j.header(&b, j.jobName()+"-merge", sp.MergeTime, sp.MergeMemory, 1, j.path("logs", "merge-%j.out"))
	fmt.Fprintf(&b, "#\n# Written by %s: merges the %d shards of scan %s (hash %s) into\n# %s and reports the points missing.\n", versionString(), sp.Shards, j.name, j.hash, j.path("scan.jsonl"))
	fmt.Fprintf(&b, "# Submit after the array job J: sbatch --dependency=afterany:J %s\n", shq(j.path("merge.sbatch")))
	b.WriteString("set -uo pipefail\n")
	fmt.Fprintf(&b, "dir=%s\nn=%d\n", shq(j.dir), sp.Shards)
	b.WriteString(`files=()
for ((k = 1; k <= n; k++)); do
  f="$dir/shards/shard-$k-of-$n.jsonl"
  if [ -s "$f" ]; then files+=("$f"); fi
done
if [ ${#files[@]} -eq 0 ]; then
  echo "ricochet merge: no shard of $dir has recorded a point; rerun the array job: sbatch $dir/scan.sbatch" | tee "$dir/merge-report.txt" >&2
  exit 1
fi
`)
	fmt.Fprintf(&b, "%s merge --quiet --output \"$dir/scan.jsonl\" \"${files[@]}\" 2>&1 | tee \"$dir/merge-report.txt\"\n", shq(j.prog))
	b.WriteString("rc=${PIPESTATUS[0]}\n")
	b.WriteString(`if [ "$rc" -eq 1 ]; then
  tasks=$(sed -n 's|^  shard \([0-9]*\)/.*|\1|p' "$dir/merge-report.txt" | paste -sd, -)
  if [ -n "$tasks" ]; then
    echo "to complete the scan: sbatch --array=$tasks $dir/scan.sbatch, then sbatch $dir/merge.sbatch" | tee -a "$dir/merge-report.txt"
  fi
fi
`)
	fmt.Fprintf(&b, "if [ \"$rc\" -eq 0 ]; then\n  echo \"tables and figures: %s scan %s%s --output $dir/scan.jsonl --resume [--format ...] [--plot FILE]\"\nfi\n", j.prog, j.scen, passText(j.pass))
	b.WriteString("exit \"$rc\"\n")
	return b.String()
}

func passText(pass []string) string {
	var b strings.Builder
	for _, a := range pass {
		b.WriteString(" " + shq(a))
	}
	return b.String()
}

// report prints the plan and the commands to submit.
func (j *slurmJob) report(w io.Writer, taskText string, task time.Duration) {
	sp := j.plan
	fmt.Fprintf(w, "ricochet slurm: scan %s (hash %s): %s in %s of at most %s, one array task each\n", j.name, j.hash, plural(sp.Jobs, "point"), plural(sp.Shards, "shard"), plural(sp.PointsPerShard, "point"))
	fmt.Fprint(w, strings.ReplaceAll(j.costLines(), "# ", ""))
	if slurmFlags.shards == 0 && !sp.TimeGiven && sp.Time > task {
		fmt.Fprintf(w, "warning: %d shards (the most allowed) need %s each, more than --task-time %s\n", sp.Shards, formatSlurmTime(sp.Time), taskText)
	}
	fmt.Fprintf(w, "merge job: limit %s, memory %s\n", formatSlurmTime(sp.MergeTime), formatSlurmMemory(sp.MergeMemory))
	fmt.Fprintf(w, "wrote %s, %s, %s and %s\n", j.path("scan.sbatch"), j.path("merge.sbatch"), j.scen, j.path("plan.json"))
	fmt.Fprintf(w, "\nsubmit:\n\n")
	fmt.Fprintf(w, "  jid=$(sbatch --parsable %s)\n", shq(j.path("scan.sbatch")))
	fmt.Fprintf(w, "  sbatch --dependency=afterany:${jid%%%%;*} %s\n", shq(j.path("merge.sbatch")))
	fmt.Fprintf(w, "\nrerun a failed array task K (it resumes its shard): sbatch --array=K %s; then sbatch %s\n", shq(j.path("scan.sbatch")), shq(j.path("merge.sbatch")))
	fmt.Fprintf(w, "results: %s; tables and figures: %s scan %s%s --output %s --resume\n", j.path("scan.jsonl"), shq(j.prog), shq(j.scen), passText(j.pass), shq(j.path("scan.jsonl")))
}

func writePlanFile(path string, j *slurmJob) error {
	sp := j.plan
	c := sp.Cost
	pf := shardPlanFile{
		Format: shardPlanFormat, Scenario: j.name, Hash: j.hash, Jobs: sp.Jobs, Shards: sp.Shards, Per: sp.PointsPerShard,
		CPUs: sp.CPUs, Safety: sp.Safety,
		Cost:     shardPlanCost{Given: c.Given, Sampled: len(c.Seconds), Mean: c.Mean, SE: c.SE, Max: c.Max, Record: c.RecordBytes, Peak: c.PeakBytes},
		Expected: sp.Expected.Seconds(), Time: formatSlurmTime(sp.Time), Memory: formatSlurmMemory(sp.Memory),
		Merge:    shardPlanMerge{Time: formatSlurmTime(sp.MergeTime), Memory: formatSlurmMemory(sp.MergeMemory)},
		CPUHours: sp.CPUHours, Program: j.prog, Args: j.pass,
	}
	b, err := json.MarshalIndent(pf, "", "  ")
	if err != nil {
		return err
	}
	return os.WriteFile(path, append(b, '\n'), 0o644)
}

// sbatchOptions is the repeatable --sbatch flag. Setting it to "" clears
// it (the flag's default, as the command resets its flags before parsing).
type sbatchOptions []string

func (o *sbatchOptions) String() string { return strings.Join(*o, " ") }
func (o *sbatchOptions) Type() string   { return "option" }
func (o *sbatchOptions) Set(v string) error {
	if v == "" {
		*o = nil
		return nil
	}
	*o = append(*o, v)
	return nil
}

// shq quotes a word for the shell where it needs it.
func shq(s string) string {
	if s != "" && strings.IndexFunc(s, func(r rune) bool {
		return !(r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9' || strings.ContainsRune("-_./:=+,@%", r))
	}) < 0 {
		return s
	}
	return "'" + strings.ReplaceAll(s, "'", `'\''`) + "'"
}

// parseSlurmTime reads a time limit as a Go duration (90m, 4h) or in
// Slurm's forms: minutes, minutes:seconds, hours:minutes:seconds,
// days-hours, days-hours:minutes, days-hours:minutes:seconds.
func parseSlurmTime(s string) (time.Duration, error) {
	bad := errors.New("allowed: a positive duration such as 90m or 4h, or Slurm's MM, MM:SS, HH:MM:SS, D-HH, D-HH:MM, D-HH:MM:SS")
	if d, err := time.ParseDuration(s); err == nil {
		if d <= 0 {
			return 0, bad
		}
		return d, nil
	}
	days := 0
	rest := s
	if k := strings.IndexByte(s, '-'); k >= 0 {
		var err error
		if days, err = strconv.Atoi(s[:k]); err != nil || days < 0 {
			return 0, bad
		}
		rest = s[k+1:]
	}
	var f []int
	for _, p := range strings.Split(rest, ":") {
		v, err := strconv.Atoi(p)
		if err != nil || v < 0 {
			return 0, bad
		}
		f = append(f, v)
	}
	var d time.Duration
	switch {
	case strings.Contains(s, "-") && len(f) == 1:
		d = time.Duration(f[0]) * time.Hour
	case strings.Contains(s, "-") && len(f) == 2:
		d = time.Duration(f[0])*time.Hour + time.Duration(f[1])*time.Minute
	case len(f) == 1:
		d = time.Duration(f[0]) * time.Minute
	case len(f) == 2:
		d = time.Duration(f[0])*time.Minute + time.Duration(f[1])*time.Second
	case len(f) == 3:
		d = time.Duration(f[0])*time.Hour + time.Duration(f[1])*time.Minute + time.Duration(f[2])*time.Second
	default:
		return 0, bad
	}
	d += time.Duration(days) * 24 * time.Hour
	if d <= 0 {
		return 0, bad
	}
	return d, nil
}

// formatSlurmTime writes a time limit as HH:MM:SS or D-HH:MM:SS, rounded
// up to whole seconds.
func formatSlurmTime(d time.Duration) string {
	s := int64((d + time.Second - 1) / time.Second)
	days, s := s/86400, s%86400
	hms := fmt.Sprintf("%02d:%02d:%02d", s/3600, s/60%60, s%60)
	if days > 0 {
		return fmt.Sprintf("%d-%s", days, hms)
	}
	return hms
}

// parseSlurmMemory reads a memory size as Slurm does: a number of MiB,
// or with a suffix K, M, G or T (binary units).
func parseSlurmMemory(s string) (uint64, error) {
	bad := errors.New("allowed: a positive size in MiB, or with a suffix K, M, G or T (e.g. 512M, 4G)")
	t := strings.ToUpper(strings.TrimSuffix(strings.TrimSuffix(s, "B"), "b"))
	unit := uint64(1 << 20)
	if t != "" {
		switch t[len(t)-1] {
		case 'K':
			unit, t = 1<<10, t[:len(t)-1]
		case 'M':
			unit, t = 1<<20, t[:len(t)-1]
		case 'G':
			unit, t = 1<<30, t[:len(t)-1]
		case 'T':
			unit, t = 1<<40, t[:len(t)-1]
		}
	}
	v, err := strconv.ParseUint(t, 10, 64)
	if err != nil || v == 0 || v > 1<<50/unit {
		return 0, bad
	}
	return v * unit, nil
}

// formatSlurmMemory writes a memory size in whole MiB (rounded up), or in
// GiB when it is a whole number of them.
func formatSlurmMemory(b uint64) string {
	mib := (b + 1<<20 - 1) >> 20
	if mib >= 1024 && mib%1024 == 0 {
		return fmt.Sprintf("%dG", mib/1024)
	}
	return fmt.Sprintf("%dM", mib)
}

// plural writes "1 point", "2 points".
func plural(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	return fmt.Sprintf("%d %ss", n, word)
}

// fmtSeconds writes a duration in seconds with a readable unit.
func fmtSeconds(s float64) string {
	switch {
	case s < 1e-3:
		return fmt.Sprintf("%.3g µs", s*1e6)
	case s < 1:
		return fmt.Sprintf("%.3g ms", s*1e3)
	case s < 120:
		return fmt.Sprintf("%.3g s", s)
	case s < 7200:
		return fmt.Sprintf("%.3g min", s/60)
	}
	return fmt.Sprintf("%.3g h", s/3600)
}
