#!/bin/sh
# Runs, in one go, the plain C comparison loops (benches/c, gcc -O2), the criterion benches of the
# six-vertex and exclusion engines (strip, portable and reference kernels, ChaCha8 limit loops,
# line ASEP, exact solvers), and prints a table of rates and the ratios the speed issue asks for.
# Usage: scripts/bench-ratios.sh            (CARGO_TARGET_DIR is honoured; one thread each)
# Criterion options can be passed in BENCH_OPTS (default: 2 s warm-up, 5 s measurement).
set -eu
root=$(cd "$(dirname "$0")/.." && pwd)
cd "$root"
opts=${BENCH_OPTS:---warm-up-time 2 --measurement-time 5 --noplot}
log=${TMPDIR:-/tmp}/motley-bench-ratios.$$
mkdir -p "$log"

echo "date: $(date -u '+%Y-%m-%d %H:%M:%S UTC')"
echo "cpu: $(awk -F': ' '/model name/ {print $2; exit}' /proc/cpuinfo), $(nproc) cores"
echo "load average before: $(cut -d' ' -f1-3 /proc/loadavg)"

benches/c/run.sh "$log/c" > "$log/c.txt"
cargo bench -q -p motley-sixvertex --bench sweep -- $opts > "$log/sixvertex.txt" 2>/dev/null
cargo bench -q -p motley-exclusion --bench exclusion -- $opts > "$log/exclusion.txt" 2>/dev/null
echo "load average after: $(cut -d' ' -f1-3 /proc/loadavg)"

# Criterion prints "<id>\n  time: [lo mid hi]\n  thrpt: [lo mid hi]" (or the id on the time line).
# Emits "<id> <median throughput per second or 0> <median time in seconds>".
parse() {
    awk '
    function scale(u) {
        if (u ~ /^Gelem/) return 1e9; if (u ~ /^Melem/) return 1e6; if (u ~ /^Kelem/) return 1e3;
        if (u == "ns") return 1e-9; if (u == "µs" || u == "us") return 1e-6; if (u == "ms") return 1e-3;
        return 1
    }
    /time:/ {
        if ($1 != "time:") { id = $1 }
        else { id = prev }
        i = index($0, "["); split(substr($0, i + 1), f, " ");
        t[id] = f[3] * scale(f[4]); order[++n] = id; cur = id; next
    }
    /thrpt:/ && cur != "" { i = index($0, "["); split(substr($0, i + 1), f, " "); r[cur] = f[3] * scale(f[4]); cur = ""; next }
    NF == 1 { prev = $1 }
    END { for (k = 1; k <= n; k++) printf "%s %s %s\n", order[k], (order[k] in r) ? r[order[k]] : 0, t[order[k]] }
    ' "$1"
}
parse "$log/sixvertex.txt" > "$log/rates.txt"
parse "$log/exclusion.txt" >> "$log/rates.txt"

get() { awk -v k="$1" '$1 == k {print $2}' "$log/rates.txt"; }
gett() { awk -v k="$1" '$1 == k {print $3}' "$log/rates.txt"; }
c_rainbow=$(awk '$1 == "rainbow_2000x2000" {print $2}' "$log/c.txt")
c_ring=$(awk '$1 == "tasep_ring_1e5" {print $2}' "$log/c.txt")
c_ring_tuned=$(awk '$1 == "tasep_ring_1e5_tuned" {print $2}' "$log/c.txt")
strip=$(get sweep/colored_rainbow_2000x2000/strip)
portable=$(get sweep/colored_rainbow_2000x2000/strip_portable)
reference=$(get sweep/colored_rainbow_2000x2000/reference)
blind=$(get sweep/colorblind_step_2000x2000/strip)
blind_ref=$(get sweep/colorblind_step_2000x2000/reference)
limit=$(get limit/chacha8_2000x2000)
ring=$(get ring_1e5_tasep/attempted_moves)
ring_asep=$(get ring_1e5_tasep/attempted_moves_asep)
ring_limit=$(get ring_1e5_tasep/chacha8_limit)
line=$(get line_step_asep_t1000/one_sample)
ex5=$(gett exact/rainbow_5x5_rational)
ex5f=$(gett exact/rainbow_5x5_f64)
ex7=$(gett exact_packed7/solve_t1)
ex7b=$(gett exact_packed7/solve_t20)

awk -v cr="$c_rainbow" -v cg="$c_ring" -v ct="$c_ring_tuned" -v s="$strip" -v p="$portable" -v rf="$reference" \
    -v b="$blind" -v br="$blind_ref" -v l="$limit" -v g="$ring" -v ga="$ring_asep" \
    -v gl="$ring_limit" -v ln="$line" -v e5="$ex5" -v e5f="$ex5f" -v e7="$ex7" -v e7b="$ex7b" 'BEGIN {
    printf "\n%-52s %12s %10s %10s\n", "kernel (one thread)", "rate /s", "x plain C", "x limit"
    printf "%-52s %12.3e %10.2f %10.2f\n", "six-vertex rainbow 2000x2000, strip (AVX2)", s, s / cr, s / l
    printf "%-52s %12.3e %10.2f %10.2f\n", "six-vertex rainbow 2000x2000, strip (portable)", p, p / cr, p / l
    printf "%-52s %12.3e %10.2f %10.2f\n", "six-vertex rainbow 2000x2000, reference rows", rf, rf / cr, rf / l
    printf "%-52s %12.3e %10.2f %10.2f\n", "six-vertex colorblind step 2000x2000, strip", b, b / cr, b / l
    printf "%-52s %12.3e %10.2f %10.2f\n", "six-vertex colorblind step 2000x2000, reference", br, br / cr, br / l
    printf "%-52s %12.3e %10.2f %10.2f\n", "ChaCha8 limit loop (six-vertex)", l, l / cr, 1
    printf "%-52s %12.3e %10.2f %10s\n", "plain C -O2 rainbow 2000x2000 (double uniforms)", cr, 1, "-"
    printf "%-52s %12.3e %10.2f %10.2f\n", "TASEP ring 1e5 (attempted moves)", g, g / cg, g / gl
    printf "%-52s %12.3e %10.2f %10.2f\n", "ASEP ring 1e5, p=1 q=0.5 (attempted moves)", ga, ga / cg, ga / gl
    printf "%-52s %12.3e %10.2f %10.2f\n", "ChaCha8 limit loop (ring)", gl, gl / cg, 1
    printf "%-52s %12.3e %10.2f %10s\n", "plain C -O2 TASEP ring 1e5 (double uniform, %)", cg, 1, "-"
    printf "%-52s %12.3e %10.2f %10s\n", "tuned C -O2 TASEP ring 1e5 (multiply-shift)", ct, ct / cg, "-"
    printf "%-52s %12.3e %10s %10s\n", "ASEP p=1 q=0.5 on Z from step, t=1000 (attempts)", ln, "-", "-"
    printf "\n%-52s %12s\n", "exact solver", "seconds"
    printf "%-52s %12.4f\n", "six-vertex 5x5 rainbow law, rationals", e5
    printf "%-52s %12.4f\n", "six-vertex 5x5 rainbow law, f64", e5f
    printf "%-52s %12.4f\n", "ASEP packed 7 sites, law at t=1", e7
    printf "%-52s %12.4f\n", "ASEP packed 7 sites, law at t=20", e7b
}'
echo "raw criterion output: $log"
