#!/usr/bin/env bash
# Integration test of 'ricochet slurm' on a real Slurm cluster of one node
# on localhost: installs Debian's slurm-wlm and munge when missing, starts
# munged, slurmctld and slurmd from a configuration written here (proctrack
# linuxproc, task none, no cgroups), and
#   1. submits a sharded two-parameter scan (4 shards x 6 points, Coulomb)
#      with the printed commands and the generated scripts, waits for the
#      array and its dependent merge job, and compares the merged record file
#      with a one-machine run of the same scan: byte for byte, so every
#      physics column is bit-identical;
#   2. submits it again held, cancels array task 3 (scancel of that index),
#      releases the others, and checks that the merge job reports exactly the
#      points of shard 3 missing and writes nothing; cuts the file of shard 1
#      back to two records (what a task killed while running leaves) and checks
#      the merge reports exactly its four lost points; reruns tasks 3 and 1
#      (sbatch --array=1,3: each resumes its shard file) and checks that the
#      merge then completes and matches the one-machine run;
#   3. kills a running array task (scancel once its shard file holds two of
#      its 30 nut-lens points), checks that the task stopped as a scan does
#      on SIGTERM and that the merge reports exactly the points it had not
#      recorded, reruns it and compares the merge with a one-machine run.
# It fails loudly, never skips, when Slurm cannot be installed or started,
# and shuts its daemons down on exit. Wall time: about 75 s on 2 shared cores.
#
# Usage: bash validate/cluster/slurm-test.sh   (as root, or with sudo)
set -euo pipefail
cd "$(dirname "$0")/../.."
t0=$(date +%s)
say() { echo "slurm-test: $*"; }
fail() { echo "slurm-test: FAIL: $*" >&2; exit 1; }

sudo=""
if [ "$(id -u)" != 0 ]; then
	command -v sudo >/dev/null || fail "not root and no sudo: cannot install or start Slurm"
	sudo=sudo
fi
if ! command -v slurmctld >/dev/null || ! command -v slurmd >/dev/null || ! command -v sbatch >/dev/null || ! command -v munged >/dev/null; then
	say "installing slurm-wlm and munge"
	{ $sudo apt-get update -q && DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -q --no-install-recommends slurm-wlm munge; } >/dev/null ||
		fail "apt-get could not install slurm-wlm and munge"
fi
for c in slurmctld slurmd sbatch squeue scancel scontrol sinfo munged; do
	command -v $c >/dev/null || fail "$c not found after installing slurm-wlm and munge"
done

T=$(mktemp -d -t ricochet-slurm.XXXXXX)
chmod 755 "$T"
export SLURM_CONF="$T/etc/slurm.conf"
cleanup() {
	rc=$?
	if [ -f "$T/etc/slurm.conf" ]; then
		scancel --quiet --user="$(id -un)" 2>/dev/null || true
		$sudo env SLURM_CONF="$SLURM_CONF" scontrol shutdown >/dev/null 2>&1 || true
		for pf in "$T/run/slurmd.pid" "$T/run/slurmctld.pid"; do
			for _ in 1 2 3 4 5 6 7 8 9 10; do
				[ -s "$pf" ] && $sudo kill -0 "$(cat "$pf")" 2>/dev/null || break
				sleep 0.5
			done
			[ -s "$pf" ] && $sudo kill -9 "$(cat "$pf")" 2>/dev/null || true
		done
	fi
	[ -S "$T/munge/munge.socket" ] && $sudo munged --stop --socket="$T/munge/munge.socket" >/dev/null 2>&1 || true
	if [ "$rc" != 0 ]; then
		for f in "$T"/log/*.log "$T"/*/logs/*.out; do
			[ -f "$f" ] && { echo "--- $f (last lines)"; tail -n 15 "$f"; }
		done >&2
		echo "slurm-test: FAILED after $(($(date +%s) - t0)) s" >&2
	fi
	$sudo rm -rf "$T"
	exit "$rc"
}
trap cleanup EXIT
trap 'exit 130' INT TERM
# A Unix socket's path has at most 107 bytes.
[ ${#T} -le 80 ] || fail "temporary directory $T: path too long for the munge socket; set TMPDIR shorter"

# Two free ports for slurmctld and slurmd.
ports=()
for p in $(seq $((20000 + RANDOM % 20000)) 45000); do
	(echo >/dev/tcp/127.0.0.1/$p) 2>/dev/null && continue
	ports+=("$p")
	[ ${#ports[@]} = 2 ] && break
done
[ ${#ports[@]} = 2 ] || fail "no free ports for slurmctld and slurmd"

say "building ricochet"
mkdir -p "$T/bin"
go build -o "$T/bin/ricochet" ./cmd/ricochet || fail "go build ./cmd/ricochet"
ric="$T/bin/ricochet"

# The scan: 6 couplings x 4 speeds of a point charge past a Coulomb charge.
cat >"$T/coulomb-grid.toml" <<'TOML'
name = "coulomb-grid"
description = "point charge past a Coulomb charge, coupling x speed"
[background]
kind = "coulomb"
charge = 0.05
[probe]
kind = "charge"
charge = 1.0
[kinematics]
v = 0.6
[scan]
eps_min = 1e-3
eps_max = 0.05
points = 6
[[scan.axis]]
param = "v"
values = [0.3, 0.5, 0.7, 0.9]
TOML
scen="$T/coulomb-grid.toml"

say "one-machine run of the scan"
s1=$(date +%s%N)
"$ric" scan "$scen" --quiet --workers 1 --output "$T/one.jsonl" >/dev/null || fail "one-machine scan"
one_ms=$((($(date +%s%N) - s1) / 1000000))
[ "$(grep -c '"i":' "$T/one.jsonl")" = 24 ] || fail "one-machine run: want 24 records"

say "starting munged, slurmctld and slurmd"
mkdir -p "$T/munge" "$T/etc" "$T/state" "$T/spool" "$T/log" "$T/run"
chmod 700 "$T/munge"
if command -v mungekey >/dev/null; then
	mungekey --create --keyfile="$T/munge/munge.key" || fail "mungekey"
else
	dd if=/dev/urandom of="$T/munge/munge.key" bs=1024 count=1 status=none || fail "munge key"
fi
chmod 600 "$T/munge/munge.key"
chmod 755 "$T/munge"
$sudo chown root:root "$T/munge/munge.key"
$sudo munged --force --key-file="$T/munge/munge.key" --socket="$T/munge/munge.socket" \
	--pid-file="$T/run/munged.pid" --log-file="$T/log/munged.log" --seed-file="$T/munge/seed" ||
	fail "munged did not start (see $T/log/munged.log)"
munge --socket="$T/munge/munge.socket" -n | unmunge --socket="$T/munge/munge.socket" >/dev/null ||
	fail "munge credentials do not round-trip"

host=$(hostname -s)
cpus=$(nproc)
mem=$(($(awk '/^MemTotal:/ {print $2}' /proc/meminfo) / 1024 * 9 / 10))
cat >"$SLURM_CONF" <<CONF
ClusterName=ricochettest
SlurmctldHost=$host(127.0.0.1)
SlurmUser=root
SlurmdUser=root
SlurmctldPort=${ports[0]}
SlurmdPort=${ports[1]}
AuthType=auth/munge
CredType=cred/munge
AuthInfo=socket=$T/munge/munge.socket
StateSaveLocation=$T/state
SlurmdSpoolDir=$T/spool
SlurmctldPidFile=$T/run/slurmctld.pid
SlurmdPidFile=$T/run/slurmd.pid
SlurmctldLogFile=$T/log/slurmctld.log
SlurmdLogFile=$T/log/slurmd.log
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
JobAcctGatherType=jobacct_gather/none
AccountingStorageType=accounting_storage/none
JobCompType=jobcomp/none
SelectType=select/cons_tres
SelectTypeParameters=CR_Core_Memory
SchedulerType=sched/backfill
MpiDefault=none
SwitchType=switch/none
ReturnToService=2
MinJobAge=600
KillWait=5
NodeName=$host NodeAddr=127.0.0.1 CPUs=$cpus RealMemory=$mem State=UNKNOWN
PartitionName=ricochet Nodes=$host Default=YES MaxTime=INFINITE State=UP
CONF
$sudo env SLURM_CONF="$SLURM_CONF" slurmctld -f "$SLURM_CONF" || fail "slurmctld did not start"
$sudo env SLURM_CONF="$SLURM_CONF" slurmd -f "$SLURM_CONF" -N "$host" || fail "slurmd did not start"
up=""
for _ in $(seq 60); do
	st=$(sinfo -h -n "$host" -o %T 2>/dev/null || true)
	case "$st" in idle*) up=1; break ;; esac
	sleep 0.5
done
[ -n "$up" ] || fail "the node did not come up idle within 30 s (sinfo: '${st:-no answer}')"
say "cluster up: node $host, $cpus CPUs, $mem MiB, ports ${ports[*]}"

# wait_gone JOBID...: wait until none of the jobs is pending or running.
wait_gone() {
	for _ in $(seq 240); do
		[ -z "$(squeue -h -j "$(
			IFS=,
			echo "$*"
		)" -t PENDING,RUNNING,CONFIGURING,COMPLETING,SUSPENDED 2>/dev/null)" ] && return 0
		sleep 0.5
	done
	squeue >&2 || true
	fail "jobs $* still queued or running after 120 s"
}
# exit_code JOBID: the exit code of a finished job (scontrol keeps it for MinJobAge).
exit_code() { scontrol -o show job "$1" | sed -n 's/.* ExitCode=\([0-9]*\):.*/\1/p' | head -n 1; }
job_state() { scontrol -o show job "$1" | sed -n 's/.* JobState=\([A-Z_]*\) .*/\1/p' | head -n 1; }

# 1. The commands a user types, as printed.
say "1: the printed commands, four array tasks and the merge job"
"$ric" slurm "$scen" --dir "$T/clean" --shards 4 >"$T/slurm-out.txt" || fail "ricochet slurm"
cat "$T/slurm-out.txt"
submit=$(sed -n '/^submit:$/,/^rerun/p' "$T/slurm-out.txt" | grep -E '^  (jid=|sbatch )' | sed 's/^  //')
[ "$(echo "$submit" | wc -l)" = 2 ] || fail "ricochet slurm did not print the two submit lines"
echo "$submit" | grep -q -- "--dependency=afterany:" || fail "no dependent merge job in the printed commands"
grep -q '^#SBATCH --array=1-4$' "$T/clean/scan.sbatch" || fail "scan.sbatch: want --array=1-4"
s2=$(date +%s%N)
merge_line=$(eval "$submit") || fail "submitting the printed commands"
jid=$(squeue -h -o %F -n ricochet-coulomb-grid | head -n 1)
mid=$(echo "$merge_line" | sed -n 's/^Submitted batch job \([0-9]*\).*/\1/p')
[ -n "$mid" ] || fail "no merge job id in '$merge_line'"
wait_gone "$mid"
clean_ms=$((($(date +%s%N) - s2) / 1000000))
[ "$(exit_code "$mid")" = 0 ] || fail "merge job $mid: exit $(exit_code "$mid"), state $(job_state "$mid"): $(cat "$T/clean/merge-report.txt" 2>/dev/null)"
grep -q "wrote $T/clean/scan.jsonl: 24 points, complete" "$T/clean/merge-report.txt" || fail "merge report: $(cat "$T/clean/merge-report.txt")"
cmp "$T/clean/scan.jsonl" "$T/one.jsonl" || fail "merged file differs from the one-machine run"
say "1: merged file of 4 array tasks identical to the one-machine run (array job $jid, merge job $mid)"
for f in "$T"/clean/shards/*.jsonl; do [ -s "$f" ] || fail "missing $f"; done

# 2. A cancelled task and a task cut short.
say "2: array held, task 3 cancelled, the others released"
"$ric" slurm "$scen" --dir "$T/fail" --shards 4 >/dev/null || fail "ricochet slurm"
jid=$(sbatch --parsable --hold "$T/fail/scan.sbatch") || fail "sbatch --hold"
jid=${jid%%;*}
scancel "${jid}_3" || fail "scancel ${jid}_3"
# A pending array task cancelled leaves the array (scontrol forgets it).
for _ in $(seq 20); do
	left=$(squeue -h -r -j "$jid" -o %K | sort -n | paste -sd, -)
	[ "$left" = "1,2,4" ] && break
	sleep 0.5
done
[ "$left" = "1,2,4" ] || fail "after scancel ${jid}_3 the held array has tasks '$left', want 1,2,4"
scontrol release "$jid" || fail "scontrol release $jid"
mid=$(sbatch --parsable --dependency=afterany:"$jid" "$T/fail/merge.sbatch") || fail "sbatch merge"
mid=${mid%%;*}
wait_gone "$jid" "$mid"
report=$(cat "$T/fail/merge-report.txt")
echo "$report"
[ "$(exit_code "$mid")" = 1 ] || fail "merge with task 3 cancelled: exit $(exit_code "$mid"), want 1"
[ ! -e "$T/fail/scan.jsonl" ] || fail "merge wrote a file with points missing"
echo "$report" | grep -qx "missing: 6 points: 2, 6, 10, 14, 18, 22" || fail "merge did not report exactly the points of shard 3 missing"
echo "$report" | grep -qx "  shard 3/4 (no file given): 6 of 6 points missing: 2, 6, 10, 14, 18, 22" || fail "merge did not name shard 3"
[ "$(echo "$report" | grep -c '^  shard ')" = 1 ] || fail "merge reports other shards than 3"
echo "$report" | grep -q "sbatch --array=3 $T/fail/scan.sbatch" || fail "merge job did not print the rerun command"

say "2: shard 1 cut back to two records, as a task killed while running leaves it"
f1="$T/fail/shards/shard-1-of-4.jsonl"
head -n 3 "$f1" >"$f1.cut" && mv "$f1.cut" "$f1"
mid=$(sbatch --parsable "$T/fail/merge.sbatch") || fail "sbatch merge"
mid=${mid%%;*}
wait_gone "$mid"
report=$(cat "$T/fail/merge-report.txt")
echo "$report"
echo "$report" | grep -qx "missing: 10 points: 2, 6, 8, 10, 12, 14, 16, 18, 20, 22" || fail "merge did not report exactly the 10 points of shards 1 and 3 missing"
echo "$report" | grep -qx "  shard 1/4 ($f1): 4 of 6 points missing: 8, 12, 16, 20" || fail "merge did not report the four lost points of shard 1"
echo "$report" | grep -q "sbatch --array=1,3 $T/fail/scan.sbatch" || fail "merge job did not print the rerun command for tasks 1 and 3"

say "2: rerun of tasks 1 and 3, then the merge"
rid=$(sbatch --parsable --array=1,3 "$T/fail/scan.sbatch") || fail "sbatch --array=1,3"
rid=${rid%%;*}
mid=$(sbatch --parsable --dependency=afterany:"$rid" "$T/fail/merge.sbatch") || fail "sbatch merge"
mid=${mid%%;*}
wait_gone "$rid" "$mid"
grep -q "resuming $f1" "$T"/fail/logs/scan-"${rid}"_1.out || fail "task 1 did not resume its shard file"
[ "$(exit_code "$mid")" = 0 ] || fail "merge after the rerun: exit $(exit_code "$mid"): $(cat "$T/fail/merge-report.txt")"
cmp "$T/fail/scan.jsonl" "$T/one.jsonl" || fail "merged file after the rerun differs from the one-machine run"
say "2: after the rerun the merge is complete and identical to the one-machine run"

# 3. A running task killed: 60 points of the nut-lens scenario (~80 ms each)
# in 2 shards; task 2 is cancelled once its file holds two points. Its
# remaining points are then exactly those missing.
say "3: a running task cancelled (scancel), the merge, the rerun"
"$ric" slurm --scenario nut-lens --points 60 --dir "$T/kill" --shards 2 >/dev/null || fail "ricochet slurm"
jid=$(sbatch --parsable "$T/kill/scan.sbatch") || fail "sbatch"
jid=${jid%%;*}
f2="$T/kill/shards/shard-2-of-2.jsonl"
rec() { grep -o '^{"i":[0-9]*' "$1" 2>/dev/null | sed 's/.*://' | sort -n; }
for _ in $(seq 1200); do
	[ "$(rec "$f2" | wc -l)" -ge 2 ] && break
	sleep 0.1
done
scancel "${jid}_2" || fail "scancel ${jid}_2"
mid=$(sbatch --parsable --dependency=afterany:"$jid" "$T/kill/merge.sbatch") || fail "sbatch merge"
mid=${mid%%;*}
wait_gone "$jid" "$mid"
grep -q '"complete":true' "$f2" && fail "task 2 finished before it was cancelled: no running task was killed"
have=$(rec "$f2" | wc -l)
[ "$have" -ge 2 ] || fail "task 2 recorded $have points before it was cancelled, want at least 2"
want=$(comm -23 <(seq 1 2 59 | sort) <(rec "$f2" | sort) | sort -n | paste -sd, - | sed 's/,/, /g')
nmiss=$((30 - have))
report=$(cat "$T/kill/merge-report.txt")
echo "$report"
grep -q "terminated: finishing the points in flight" "$T"/kill/logs/scan-"${jid}"_2.out || fail "task 2 did not stop on SIGTERM as a scan does"
[ "$(exit_code "$mid")" = 1 ] || fail "merge with task 2 cancelled: exit $(exit_code "$mid"), want 1"
echo "$report" | grep -qx "missing: $nmiss points: $want" || fail "merge did not report exactly the $nmiss points task 2 had not recorded ($want)"
echo "$report" | grep -qx "  shard 2/2 ($f2): $nmiss of 30 points missing: $want" || fail "merge did not name shard 2"
[ "$(echo "$report" | grep -c '^  shard ')" = 1 ] || fail "merge reports other shards than 2"
rid=$(sbatch --parsable --array=2 "$T/kill/scan.sbatch") || fail "sbatch --array=2"
rid=${rid%%;*}
mid=$(sbatch --parsable --dependency=afterany:"$rid" "$T/kill/merge.sbatch") || fail "sbatch merge"
mid=${mid%%;*}
"$ric" scan --scenario nut-lens --points 60 --quiet --output "$T/kill-one.jsonl" >/dev/null || fail "one-machine nut-lens scan"
wait_gone "$rid" "$mid"
grep -q "resuming $f2" "$T"/kill/logs/scan-"${rid}"_2.out || fail "the rerun of task 2 did not resume its shard file"
[ "$(exit_code "$mid")" = 0 ] || fail "merge after the rerun of task 2: exit $(exit_code "$mid"): $(cat "$T/kill/merge-report.txt")"
cmp "$T/kill/scan.jsonl" "$T/kill-one.jsonl" || fail "merged nut-lens file differs from the one-machine run"
say "3: task 2 killed after $have of 30 points; the merge listed the other $nmiss; after the rerun the merge matches the one-machine run"

# The merged file serves tables: the next-order coefficient against v,
# compared with Darwin's (1913) closed form, from memory: -pi/(2 gamma v).
"$ric" scan "$T/fail/scenario.toml" --output "$T/fail/scan.jsonl" --resume --quiet --expect '-pi/(2*gamma*v)' | tail -n 9

say "one-machine scan ${one_ms} ms on one worker; the same scan as 4 array tasks and a merge job, submission to merged file: ${clean_ms} ms"
say "PASS in $(($(date +%s) - t0)) s"
