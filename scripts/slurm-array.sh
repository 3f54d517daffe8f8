#!/usr/bin/env bash
# slurm-array.sh: run the shards of one motley scenario as a Slurm job array, then merge them.
#
# Usage:
#   scripts/slurm-array.sh SCENARIO N [--out REPORT_DIR] [--work DIR] [--partition P] [--time T]
#                          [--mem M] [--cpus C] [--motley PATH] [--samples S] [--wait]
#
# What it does:
#   1. `motley check SCENARIO --json` validates the scenario and gives its name and its cost estimate.
#   2. ONE `sbatch --array=1-N` job: task K runs
#        motley run SCENARIO --shard K/N --out WORK/shard-K --threads $SLURM_CPUS_PER_TASK
#   3. ONE merge job with `--dependency=afterok:<array job id>` (cancelled by Slurm if a shard fails):
#        motley merge WORK/shard-1 ... WORK/shard-N --out REPORT_DIR
#   It prints both job ids. With --wait it polls `squeue -h -j ID` until both jobs are gone and exits
#   non-zero unless REPORT_DIR/result.json exists (no accounting needed: sacct is not used).
#
# Options (defaults in brackets):
#   --out REPORT_DIR  merged report folder [reports/<scenario name>, where a single `motley run` writes]
#   --work DIR        shard folders and Slurm logs (DIR/logs) [REPORT_DIR-shards]
#   --partition P     Slurm partition [the cluster's default partition]
#   --time T          time limit per task, any sbatch --time form [3 × the per-shard share of
#                     `motley check`'s time estimate on C threads, at least 5 minutes]
#   --mem M           memory per task, any sbatch --mem form [`motley check`'s peak-memory estimate on
#                     C threads × 1.25, rounded up to a multiple of 64M, at least 256M]
#   --cpus C          CPUs per task, passed to motley as --threads [1]
#   --motley PATH     the motley binary, which every node must see at the same path [motley on PATH]
#   --samples S       override the scenario's sample count (shards and any single run must agree)
#   --wait            wait for both jobs; exit 1 if the merged result.json is missing
#
# Paths are made absolute before submission, so the jobs do not depend on the submit directory; they
# must lie on a file system the compute nodes share. Results do not depend on N or C: sample i of
# every model draws from its own random stream, so the merged report equals a single run's
# (timing and git_commit aside).
set -euo pipefail

die() {
  echo "slurm-array.sh: $*" >&2
  exit 2
}

usage() {
  sed -n '3,5p' "$0" | sed 's/^# \{0,1\}//' >&2
  exit 2
}

abspath() {
  case "$1" in
    /*) printf '%s\n' "$1" ;;
    *) printf '%s/%s\n' "$PWD" "$1" ;;
  esac
}

[ $# -ge 2 ] || usage
SCENARIO=$1
N=$2
shift 2
OUT=""
WORK=""
PARTITION=""
TIME=""
MEM=""
CPUS=1
MOTLEY=motley
SAMPLES=""
WAIT=0
while [ $# -gt 0 ]; do
  case "$1" in
    --out) OUT=${2:?--out needs a folder}; shift 2 ;;
    --work) WORK=${2:?--work needs a folder}; shift 2 ;;
    --partition) PARTITION=${2:?--partition needs a name}; shift 2 ;;
    --time) TIME=${2:?--time needs a limit}; shift 2 ;;
    --mem) MEM=${2:?--mem needs a size}; shift 2 ;;
    --cpus) CPUS=${2:?--cpus needs a number}; shift 2 ;;
    --motley) MOTLEY=${2:?--motley needs a path}; shift 2 ;;
    --samples) SAMPLES=${2:?--samples needs a number}; shift 2 ;;
    --wait) WAIT=1; shift ;;
    -h | --help) usage ;;
    *) die "unknown argument \"$1\" (see the header of $0)" ;;
  esac
done

[[ $N =~ ^[1-9][0-9]*$ ]] || die "N must be a whole number ≥ 1, got \"$N\""
[[ $CPUS =~ ^[1-9][0-9]*$ ]] || die "--cpus must be a whole number ≥ 1, got \"$CPUS\""
[ -z "$SAMPLES" ] || [[ $SAMPLES =~ ^[1-9][0-9]*$ ]] || die "--samples must be a whole number ≥ 1, got \"$SAMPLES\""
[ -f "$SCENARIO" ] || die "scenario file $SCENARIO not found"
command -v sbatch >/dev/null 2>&1 || die "sbatch not found: this script needs a Slurm cluster"
MOTLEY_PATH=$(command -v "$MOTLEY" 2>/dev/null) || die "motley binary \"$MOTLEY\" not found (give --motley PATH)"
MOTLEY=$(abspath "$MOTLEY_PATH")
SCENARIO=$(abspath "$SCENARIO")
SAMPLE_ARGS=()
[ -z "$SAMPLES" ] || SAMPLE_ARGS=(--samples "$SAMPLES")

# --- name and cost from `motley check` --------------------------------------------------------------
CHECK=$("$MOTLEY" check "$SCENARIO" --json --threads "$CPUS" "${SAMPLE_ARGS[@]}") || die "motley check refused $SCENARIO (see above)"
# `check --json` prints one top-level key per line, indented by two spaces: `  "seconds": 12.3,`.
json_field() {
  printf '%s\n' "$CHECK" | sed -n 's/^  "'"$1"'": "\{0,1\}\([^",]*\)"\{0,1\},\{0,1\}$/\1/p' | head -n 1
}
NAME=$(json_field name)
[ -n "$NAME" ] || die "motley check --json gave no scenario name"
ALL_SECONDS=$(json_field seconds)
PEAK_BYTES=$(json_field peak_bytes)
[ -n "$ALL_SECONDS" ] && [ -n "$PEAK_BYTES" ] || die "motley check --json gave no estimate"
echo "motley check: scenario $NAME, about $ALL_SECONDS s on $CPUS threads in all, peak memory about $PEAK_BYTES bytes per process"
# Seconds are for the whole run; a shard runs 1/N of the samples. Memory is per process.
EST_SECONDS=$(awk -v s="$ALL_SECONDS" -v n="$N" 'BEGIN { printf "%.3f", s / n }')
EST_MIB=$(awk -v b="$PEAK_BYTES" 'BEGIN { printf "%.3f", b / 1048576 }')

if [ -z "$TIME" ]; then
  MINUTES=$(awk -v s="$EST_SECONDS" 'BEGIN { m = s * 3 / 60; m = (m == int(m)) ? m : int(m) + 1; if (m < 5) m = 5; print m }')
  TIME=$(printf '%d:%02d:00' $((MINUTES / 60)) $((MINUTES % 60)))
fi
if [ -z "$MEM" ]; then
  MEM=$(awk -v m="$EST_MIB" 'BEGIN { x = m * 1.25; x = int((x + 63) / 64) * 64; if (x < 256) x = 256; print x "M" }')
fi

# --- folders -------------------------------------------------------------------------------------------
OUT=$(abspath "${OUT:-reports/$NAME}")
WORK=$(abspath "${WORK:-$OUT-shards}")
[ ! -e "$OUT" ] || die "report folder $OUT exists; remove it or give another --out"
[ ! -e "$WORK" ] || die "work folder $WORK exists; remove it or give another --work"
mkdir -p "$WORK/logs" "$(dirname "$OUT")"

SBATCH_COMMON=(--parsable --time="$TIME" --mem="$MEM" --cpus-per-task="$CPUS")
[ -z "$PARTITION" ] || SBATCH_COMMON+=(--partition="$PARTITION")

# The job scripts are written out (and kept in WORK) so a user can read or resubmit exactly what ran.
q() { printf '%q' "$1"; }
SAMPLE_Q=""
[ -z "$SAMPLES" ] || SAMPLE_Q=" --samples $(q "$SAMPLES")"
cat >"$WORK/shard.sbatch" <<EOF
#!/bin/bash
# One shard of $(q "$NAME"): array task K runs shard K/$N.
set -euo pipefail
K=\$SLURM_ARRAY_TASK_ID
exec $(q "$MOTLEY") run $(q "$SCENARIO") --shard "\$K/$N" --out $(q "$WORK")/shard-"\$K" --threads "\${SLURM_CPUS_PER_TASK:-1}" --quiet --yes$SAMPLE_Q
EOF
SHARD_DIRS=""
for k in $(seq 1 "$N"); do SHARD_DIRS+=" $(q "$WORK/shard-$k")"; done
cat >"$WORK/merge.sbatch" <<EOF
#!/bin/bash
# Merge the $N shards of $(q "$NAME") into the report a single run would write.
set -euo pipefail
exec $(q "$MOTLEY") merge$SHARD_DIRS --out $(q "$OUT")
EOF

echo "submitting: $N shard tasks of \`$NAME\` (time $TIME, memory $MEM, $CPUS CPU(s) per task${PARTITION:+, partition $PARTITION})"
ARRAY_ID=$(sbatch "${SBATCH_COMMON[@]}" --array="1-$N" --job-name="motley-$NAME" \
  --output="$WORK/logs/shard-%a.out" "$WORK/shard.sbatch") || die "sbatch refused the array job"
ARRAY_ID=${ARRAY_ID%%;*}
MERGE_ID=$(sbatch --parsable --time=0:10:00 --mem=512M --cpus-per-task=1 ${PARTITION:+--partition="$PARTITION"} \
  --dependency="afterok:$ARRAY_ID" --kill-on-invalid-dep=yes --job-name="motley-$NAME-merge" \
  --output="$WORK/logs/merge.out" "$WORK/merge.sbatch") || die "sbatch refused the merge job (array job $ARRAY_ID is queued; scancel $ARRAY_ID)"
MERGE_ID=${MERGE_ID%%;*}
echo "array job: $ARRAY_ID (tasks 1-$N, logs $WORK/logs/shard-K.out)"
echo "merge job: $MERGE_ID (after array job $ARRAY_ID succeeds; log $WORK/logs/merge.out)"
echo "report:    $OUT"

[ "$WAIT" = 1 ] || exit 0

# squeue prints nothing (or errors, once Slurm has forgotten the job) when a job has left the queue.
wait_gone() {
  local id=$1 what=$2
  while [ -n "$(squeue -h -j "$id" -o %i 2>/dev/null || true)" ]; do sleep 2; done
  echo "$what job $id has left the queue"
}
wait_gone "$ARRAY_ID" "array"
missing=0
for k in $(seq 1 "$N"); do
  if [ ! -f "$WORK/shard-$k/partial.json" ]; then
    echo "slurm-array.sh: shard $k/$N wrote no partial.json; its log:" >&2
    tail -n 20 "$WORK/logs/shard-$k.out" >&2 2>/dev/null || true
    missing=1
  fi
done
[ "$missing" = 0 ] && echo "all $N shards wrote their partial results"
wait_gone "$MERGE_ID" "merge"
if [ ! -f "$OUT/result.json" ]; then
  echo "slurm-array.sh: the merged $OUT/result.json is missing; merge log:" >&2
  cat "$WORK/logs/merge.out" >&2 2>/dev/null || echo "(no merge log: the merge job never ran)" >&2
  exit 1
fi
cat "$WORK/logs/merge.out" 2>/dev/null || true
echo "merged report: $OUT/result.json"
