#!/usr/bin/env bash
# Measures the overhead of sharding: the wall time of one run of a scan on
# one worker against the sum of its N shards, each run on one worker one
# after the other, plus the merge; checks the merged file equals the one
# run's. No scheduler involved (validate/cluster/slurm-test.sh times the
# Slurm path, whose latency is the scheduler's).
#
# Usage: bash validate/cluster/overhead.sh [SHARDS [SCENARIO-NAME [AXIS-POINTS]]]
#   default: 8 shards of the built-in rootkerr-pair scan with a gamma axis of
#   10 values (13 couplings x 10 = 130 points)
set -euo pipefail
cd "$(dirname "$0")/../.."
n=${1:-8}
name=${2:-rootkerr-pair}
axis=${3:-10}
T=$(mktemp -d -t ricochet-overhead.XXXXXX)
trap 'rm -rf "$T"' EXIT
go build -o "$T/ricochet" ./cmd/ricochet
ric="$T/ricochet"
{
	"$ric" scenarios "$name"
	printf '\n[[scan.axis]]\nparam = "gamma"\nspacing = "linear"\nmin = 1.2\nmax = 3\npoints = %d\n' "$axis"
} >"$T/scan.toml"
# timed CMD...: appends "wall cpu" (seconds; cpu = user + system) of CMD.
TIMEFORMAT='%R %U %S'
timed() { { time "$@" >/dev/null 2>&1; } 2>>"$T/times"; }
: >"$T/times"
timed "$ric" scan "$T/scan.toml" --quiet --workers 1 --output "$T/one.jsonl"
files=()
for ((k = 1; k <= n; k++)); do
	timed "$ric" scan "$T/scan.toml" --quiet --workers 1 --shard "$k/$n" --output "$T/s$k.jsonl"
	files+=("$T/s$k.jsonl")
done
timed "$ric" merge --quiet --output "$T/merged.jsonl" "${files[@]}"
cmp "$T/merged.jsonl" "$T/one.jsonl"
echo "scan $name x gamma ($axis values): $(grep -c '"i":' "$T/one.jsonl") points, merged file identical to one run's"
awk -v n="$n" '
	{ w[NR] = $1; c[NR] = $2 + $3 }
	END {
		for (k = 2; k <= n + 1; k++) { sw += w[k]; sc += c[k] }
		printf "one run, one worker:              wall %.3f s, cpu %.3f s\n", w[1], c[1]
		printf "%d shards in sequence, one worker: wall %.3f s, cpu %.3f s\n", n, sw, sc
		printf "merge:                            wall %.3f s, cpu %.3f s\n", w[n + 2], c[n + 2]
		printf "overhead of sharding (shards + merge against one run): wall %+.1f%%, cpu %+.1f%%\n", 100 * (sw + w[n + 2] - w[1]) / w[1], 100 * (sc + c[n + 2] - c[1]) / c[1]
	}' "$T/times"
