#!/usr/bin/env bash
# Builds the benchmark programs (Release, build/bench), runs them and the same workloads through
# R 4.2 (Rscript) and SciPy 1.10 (/usr/bin/python3), and writes docs/benchmarks.md. Not a test.
# Usage: tests/bench/run_benchmarks.sh [--quick | --exact-only | --bracket-only]   (JOBS=N for the build, default 1;
# --quick runs the R and NumPy Monte Carlo at a tenth of the replicates, for trying the script out;
# --exact-only runs only bench_exact_dp, numpy_exact_dp.py, bench_monte_carlo and numpy_monte_carlo.py
# and rewrites only their section of docs/benchmarks.md, keeping the others; --bracket-only runs only
# bench_exact_bracket, bench_exact_reference and bench_exact_tail_width and rewrites only the
# decision-aimed bracket's section)
set -euo pipefail
top=$(cd "$(dirname "$0")/../.." && pwd)
dir="$top/build/bench"
out="$dir/results"
jobs=${JOBS:-1}
quick=${1:-}
mkdir -p "$out"
[ -f "$dir/CMakeCache.txt" ] || cmake -S "$top" -B "$dir" -DCMAKE_BUILD_TYPE=Release >/dev/null
bin="$dir/tests"
# The polynomial exact methods and Monte Carlo at many categories (issues 13, 15), each beside its
# NumPy reference; its own load average, since --exact-only runs this part alone.
exact_and_many_categories() {
    echo "== exact p-values, equal shares and grid bracket (bench_exact_dp), beside the NumPy DP"
    "$bin/bench_exact_dp" | tee "$out/bench_exact_dp.txt"
    /usr/bin/python3 "$top/tests/bench/numpy_exact_dp.py" | tee "$out/numpy_exact_dp.txt"
    echo "== Monte Carlo at many categories (bench_monte_carlo), beside NumPy"
    "$bin/bench_monte_carlo" | tee "$out/bench_monte_carlo.txt"
    /usr/bin/python3 "$top/tests/bench/numpy_monte_carlo.py" | tee "$out/numpy_monte_carlo.txt"
    cat /proc/loadavg > "$out/loadavg_exact.txt"
}
# The decision-aimed bracket (issue 32), with the walk as reference where it fits; the same exact p
# beside the 1e7-replicate NumPy Monte Carlo reference; the relative width reached for tail p.
exact_bracket() {
    echo "== exact p-values, decision-aimed bracket (bench_exact_bracket)"
    "$bin/bench_exact_bracket" walk | tee "$out/bench_exact_bracket.txt"
    cat /proc/loadavg > "$out/loadavg_bracket.txt"
    echo "== the exact p beside NumPy Monte Carlo (bench_exact_reference)"
    "$bin/bench_exact_reference" | tee "$out/bench_exact_reference.txt"
    cat /proc/loadavg > "$out/loadavg_reference.txt"
    echo "== tail p: relative width of the grid bracket (bench_exact_tail_width)"
    "$bin/bench_exact_tail_width" | tee "$out/bench_exact_tail_width.txt"
    cat /proc/loadavg > "$out/loadavg_tail_width.txt"
}
if [ "$quick" = "--bracket-only" ]; then
    for t in bench_exact_bracket bench_exact_reference bench_exact_tail_width; do cmake --build "$dir" -j"$jobs" --target "$t" >/dev/null; done
    exact_bracket
    /usr/bin/python3 "$top/tests/bench/write_benchmarks_md.py" "$out" "$top/docs/benchmarks.md" --bracket-section-only
    echo "rewrote the decision-aimed bracket's section of $top/docs/benchmarks.md"
    exit 0
fi
if [ "$quick" = "--exact-only" ]; then
    for t in bench_exact_dp bench_monte_carlo; do cmake --build "$dir" -j"$jobs" --target "$t" >/dev/null; done
    exact_and_many_categories
    /usr/bin/python3 "$top/tests/bench/write_benchmarks_md.py" "$out" "$top/docs/benchmarks.md" --exact-section-only
    echo "rewrote the exact and many-categories section of $top/docs/benchmarks.md"
    exit 0
fi
targets="bench_tails bench_pvalues bench_tail_grid bench_exact_dp bench_exact_bracket bench_exact_reference bench_exact_tail_width bench_monte_carlo tallyproof"
help=$(cmake --build "$dir" --target help)
case "$help" in *bench_parse*) targets="$targets bench_parse" ;; esac
# shellcheck disable=SC2086
for t in $targets; do cmake --build "$dir" -j"$jobs" --target "$t" >/dev/null; done
echo "== bench_tails";   "$bin/bench_tails"   | tee "$out/bench_tails.txt"
echo "== bench_pvalues"; "$bin/bench_pvalues" | tee "$out/bench_pvalues.txt"
if [ -x "$bin/bench_parse" ]; then
    echo "== bench_parse"; "$bin/bench_parse" | tee "$out/bench_parse.txt"
else
    rm -f "$out/bench_parse.txt"
fi
exact_and_many_categories
exact_bracket
echo "== one million raw values, whole process, beside R and NumPy/SciPy"
/usr/bin/python3 "$top/tests/bench/parse_reference.py" "$dir/shell/tallyproof" | tee "$out/parse_reference.txt"
echo "== screening 10,000 groups, whole process, beside NumPy/SciPy/statsmodels"
/usr/bin/python3 "$top/tests/bench/screen_reference.py" "$dir/shell/tallyproof" | tee "$out/screen_reference.txt"
# The page, when it has been built (./.ci/build) and the browser tests' packages are installed.
if [ -f "$top/dist/tallyproof.html" ] && [ -d "$top/tests/browser/node_modules/playwright-core" ]; then
    echo "== the page in headless Chromium"
    (cd "$top/tests/browser" && node bench_page.mjs) | tee "$out/bench_page.txt"
else
    rm -f "$out/bench_page.txt"
fi
if command -v emcc >/dev/null && [ -f "$top/.cache/utf8proc/utf8proc.c" ]; then
    echo "== what utf8proc adds to the single file"
    /usr/bin/python3 "$top/tests/bench/utf8proc_size.py" "$top/.cache/utf8proc" "$top/dist/tallyproof.html" | tee "$out/utf8proc_size.txt"
else
    rm -f "$out/utf8proc_size.txt"
fi
echo "== tail accuracy (mpmath 50 digits, R, SciPy)"
/usr/bin/python3 "$top/tests/bench/tail_accuracy.py" "$bin/bench_tail_grid" "$out" | tee "$out/tail_accuracy.json"
echo "== Monte Carlo and exact workloads in R and NumPy"
/usr/bin/python3 "$top/tests/bench/reference_pvalues.py" $quick | tee "$out/reference_pvalues.json"
cat /proc/loadavg > "$out/loadavg.txt"
/usr/bin/python3 "$top/tests/bench/write_benchmarks_md.py" "$out" "$top/docs/benchmarks.md"
echo "wrote $top/docs/benchmarks.md"
