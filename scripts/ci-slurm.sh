#!/usr/bin/env bash
# ci-slurm.sh: the CI check that shards merge into exactly the single-run report, on a real Slurm
# one-node cluster (job array + dependent merge) and with GNU parallel; and that merge refuses an
# incomplete or mixed set of shards.
#
# Usage: scripts/ci-slurm.sh [MOTLEY_BINARY] [SAMPLES]     (defaults: target/release/motley, 20000)
#
# Needs root (it installs packages and starts daemons). Steps:
#   1. installs slurm-wlm and munge (apt-get) if sbatch is missing, GNU parallel if parallel is missing;
#   2. starts a one-node cluster with ../shared/cluster/start-one-node-slurm (relative to the
#      repository root), records the process ids of the munged, slurmctld and slurmd it started, and
#      stops exactly those ids (kill, then kill -9 after 15 s) in an EXIT trap, also on failure;
#   3. waits for `sinfo` to show the node idle, runs scripts/slurm-array.sh on the worked scenario
#      with N = 4 and --wait, runs the same scenario as one `motley run`, and compares the two
#      result.json files without the top-level keys `timing` and `git_commit`;
#   4. the same with `parallel motley run … --shard {}/4 ::: 1 2 3 4` and `motley merge`;
#   5. merges with one shard missing, a shard duplicated, and a shard of another scenario, and
#      requires exit code 2 with a message each time.
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$PWD

MOTLEY=${1:-target/release/motley}
SAMPLES=${2:-20000}
SCENARIO=scenarios/rainbow-symmetry.yaml
FOREIGN=scenarios/rainbow-near-miss.yaml
RECIPE=../shared/cluster/start-one-node-slurm

fail() {
  echo "ci-slurm: FAIL: $*" >&2
  exit 1
}

[ -x "$MOTLEY" ] || fail "motley binary $MOTLEY not found or not executable (build it with cargo build --release)"
case "$MOTLEY" in /*) ;; *) MOTLEY=$ROOT/$MOTLEY ;; esac
[ -f "$SCENARIO" ] || fail "worked scenario $SCENARIO not found"
[ -f "$RECIPE" ] || fail "cluster recipe $RECIPE (relative to $ROOT) not found; it is expected beside the repository"
[ "$(id -u)" = 0 ] || fail "must run as root: it installs Slurm and starts its daemons"

apt_install() {
  command -v apt-get >/dev/null 2>&1 || fail "apt-get not available to install $*"
  echo "ci-slurm: installing $* with apt-get"
  (apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@") >/dev/null \
    || fail "apt-get install $* failed"
}
command -v sbatch >/dev/null 2>&1 || apt_install slurm-wlm munge
command -v parallel >/dev/null 2>&1 || apt_install parallel
command -v python3 >/dev/null 2>&1 || command -v jq >/dev/null 2>&1 || fail "need python3 or jq to compare results"

# --- the cluster -----------------------------------------------------------------------------------
DAEMONS="munged slurmctld slurmd"
# A daemon's start leaves a defunct parent behind where PID 1 does not reap: zombies do not count.
alive() { kill -0 "$1" 2>/dev/null && [ "$(ps -o stat= -p "$1" 2>/dev/null | cut -c1)" != Z ]; }
pids_of() {
  local p
  for p in $(pgrep -x "$1" 2>/dev/null || true); do
    if alive "$p"; then printf '%s ' "$p"; fi
  done
}
for d in slurmctld slurmd; do
  [ -z "$(pids_of "$d")" ] || fail "$d is already running (pid $(pids_of "$d")); this script starts and stops its own cluster"
done
declare -A BEFORE
for d in $DAEMONS; do BEFORE[$d]=$(pids_of "$d"); done
[ -z "${BEFORE[munged]}" ] || echo "ci-slurm: munged already running (pid ${BEFORE[munged]}); it is left running"

WORK=$(mktemp -d /tmp/motley-ci-slurm.XXXXXX)
STARTED=""
# The ids this script started: those running now that were not running before the recipe.
new_pids() {
  local d p out=""
  for d in $DAEMONS; do
    for p in $(pids_of "$d"); do
      case " ${BEFORE[$d]} " in *" $p "*) ;; *) out+="$p " ;; esac
    done
  done
  echo "$out"
}
stop_cluster() {
  local rc=$? p left
  set +e
  if command -v squeue >/dev/null 2>&1 && [ -n "$(new_pids)" ]; then
    for j in $(squeue -h -o %A 2>/dev/null); do scancel "$j" 2>/dev/null; done
  fi
  STARTED="$STARTED $(new_pids)"
  STARTED=$(echo "$STARTED" | tr ' ' '\n' | sed '/^$/d' | sort -u | tr '\n' ' ')
  if [ -n "$STARTED" ]; then
    echo "ci-slurm: stopping the daemons this script started, by process id: $STARTED"
    for p in $STARTED; do kill "$p" 2>/dev/null; done
    for _ in $(seq 30); do
      left=""
      for p in $STARTED; do alive "$p" && left+="$p "; done
      [ -z "$left" ] && break
      sleep 0.5
    done
    for p in $left; do echo "ci-slurm: pid $p ignored SIGTERM; kill -9"; kill -9 "$p" 2>/dev/null; done
    for p in $STARTED; do alive "$p" && echo "ci-slurm: pid $p is still running" && rc=1; done
    echo "ci-slurm: daemons stopped"
  fi
  if [ "$rc" = 0 ]; then rm -rf "$WORK"; else echo "ci-slurm: work files kept in $WORK" >&2; fi
  exit "$rc"
}
trap stop_cluster EXIT
trap 'exit 130' INT TERM

echo "== ci-slurm: starting a one-node Slurm cluster with $RECIPE"
bash "$RECIPE" || fail "the cluster recipe $RECIPE failed"
for d in $DAEMONS; do
  p=$(pids_of "$d")
  [ -n "$p" ] || fail "$d is not running after the recipe"
  echo "ci-slurm: $d pid $p"
done
STARTED=$(new_pids)
echo "ci-slurm: started by this script (to be stopped by id): $STARTED"
# shellcheck disable=SC2086
ps -o pid,ppid,comm,args -p "$(echo $STARTED | tr ' ' ',')" || true
for _ in $(seq 60); do
  sinfo -h -o %T 2>/dev/null | grep -qE '^(idle|mixed)' && break
  sleep 1
done
sinfo -h -o %T 2>/dev/null | grep -qE '^(idle|mixed)' || { sinfo || true; fail "the node did not become idle within 60 s"; }
sinfo

# --- comparison ----------------------------------------------------------------------------------
# Equal after removing the top-level keys timing and git_commit.
same_result() {
  if command -v python3 >/dev/null 2>&1; then
    python3 -c '
import json, sys
a, b = (json.load(open(p)) for p in sys.argv[1:3])
for d in (a, b):
    d.pop("timing", None)
    d.pop("git_commit", None)
if a != b:
    keys = sorted(k for k in set(a) | set(b) if a.get(k) != b.get(k))
    print("differing top-level keys:", ", ".join(keys), file=sys.stderr)
    sys.exit(1)
' "$1" "$2"
  else
    diff <(jq -S 'del(.timing, .git_commit)' "$1") <(jq -S 'del(.timing, .git_commit)' "$2") >&2
  fi
}

echo "== ci-slurm: single run ($SAMPLES samples)"
"$MOTLEY" run "$SCENARIO" --samples "$SAMPLES" --out "$WORK/single" --quiet
[ -f "$WORK/single/result.json" ] || fail "the single run wrote no result.json"

echo "== ci-slurm: Slurm job array of 4 shards plus a dependent merge"
scripts/slurm-array.sh "$SCENARIO" 4 --samples "$SAMPLES" --motley "$MOTLEY" \
  --out "$WORK/slurm/report" --work "$WORK/slurm/shards" --wait \
  || fail "scripts/slurm-array.sh failed"
for k in 1 2 3 4; do
  echo "shard task $k: $(cat "$WORK/slurm/shards/logs/shard-$k.out")"
done
same_result "$WORK/slurm/report/result.json" "$WORK/single/result.json" \
  || fail "slurm: the 4-shard array merged result differs from the single run"
echo "slurm: 4-shard array merged result equals the single run"

echo "== ci-slurm: GNU parallel, 4 shards plus merge"
parallel --halt now,fail=1 "$MOTLEY" run "$SCENARIO" --samples "$SAMPLES" --threads 1 --quiet \
  --shard {}/4 --out "$WORK/parallel/shard-{}" ::: 1 2 3 4 || fail "a GNU parallel shard failed"
"$MOTLEY" merge "$WORK"/parallel/shard-{1,2,3,4} --out "$WORK/parallel/report" || fail "merge of the parallel shards failed"
same_result "$WORK/parallel/report/result.json" "$WORK/single/result.json" \
  || fail "parallel: the 4-shard merged result differs from the single run"
echo "parallel: 4-shard merged result equals the single run"

echo "== ci-slurm: merges that must be refused (exit 2)"
"$MOTLEY" run "$FOREIGN" --samples "$SAMPLES" --quiet --shard 4/4 --out "$WORK/foreign-shard-4" >/dev/null
S=$WORK/parallel
expect_refusal() {
  local what=$1 rc=0 msg
  shift
  msg=$("$MOTLEY" merge "$@" --out "$WORK/refused" 2>&1) || rc=$?
  [ "$rc" = 2 ] || fail "merge with $what exited $rc, expected 2 (output: $msg)"
  [ -n "$msg" ] || fail "merge with $what exited 2 without a message"
  [ ! -e "$WORK/refused" ] || fail "merge with $what wrote a report anyway"
  echo "merge with $what: exit 2: $msg"
}
expect_refusal "shard 4/4 missing" "$S/shard-1" "$S/shard-2" "$S/shard-3"
expect_refusal "shard 3/4 given twice" "$S/shard-1" "$S/shard-2" "$S/shard-3" "$S/shard-3" "$S/shard-4"
expect_refusal "shard 4/4 from another scenario" "$S/shard-1" "$S/shard-2" "$S/shard-3" "$WORK/foreign-shard-4"
echo "ci-slurm: all cluster checks passed"
