#!/bin/sh
# Builds the plain C comparison loops with gcc -O2 (outside the cargo build) and runs them.
# Usage: benches/c/run.sh [out_dir]   prints "rainbow_2000x2000 <rate>", "tasep_ring_1e5 <rate>" and
# "tasep_ring_1e5_tuned <rate>".
set -eu
here=$(cd "$(dirname "$0")" && pwd)
out=${1:-${TMPDIR:-/tmp}/motley-bench-c}
mkdir -p "$out"
gcc -O2 -o "$out/rainbow_sweep" "$here/rainbow_sweep.c"
gcc -O2 -o "$out/tasep_ring" "$here/tasep_ring.c"
gcc -O2 -DTUNED -o "$out/tasep_ring_tuned" "$here/tasep_ring.c"
echo "rainbow_2000x2000 $("$out/rainbow_sweep" 2000 2000 15 | awk '/^rate/ {print $2}')"
echo "tasep_ring_1e5 $("$out/tasep_ring" 100000 10000000 15 | awk '/^rate/ {print $2}')"
echo "tasep_ring_1e5_tuned $("$out/tasep_ring_tuned" 100000 10000000 15 | awk '/^rate/ {print $2}')"
