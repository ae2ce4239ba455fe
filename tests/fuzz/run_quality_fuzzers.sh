#!/bin/sh
# Builds one of the analysis-quality libFuzzer targets (fuzz_engine.cpp, fuzz_analysis_document.cpp)
# with -fsanitize=fuzzer,address,undefined and runs it for SECONDS, one process (the machine is shared).
# Usage: tests/fuzz/run_quality_fuzzers.sh TARGET SECONDS   (TARGET: engine | analysis_document)
# Needs clang-14 and libclang-rt-14-dev (Debian). Findings (crash-*, timeout-*, oom-*) land in $OUT;
# the working corpus grows in $OUT/corpus, the starting corpus in the repository is only read.
# Replay a finding: $OUT/fuzz_TARGET $OUT/crash-...
set -eu
TARGET=${1:?usage: run_quality_fuzzers.sh TARGET SECONDS}
SECONDS_TO_RUN=${2:?usage: run_quality_fuzzers.sh TARGET SECONDS}
HERE=$(cd "$(dirname "$0")" && pwd)
ROOT=$(cd "$HERE/../.." && pwd)
OUT=${OUT:-${TMPDIR:-/tmp}/tallyproof_fuzz_$TARGET}
CXX=${CXX:-clang++-14}
FLAGS="-std=c++17 -O1 -g -fsanitize=fuzzer-no-link,address,undefined -fno-sanitize-recover=undefined"
case "$TARGET" in
  engine) SEEDS="" ;;
  analysis_document) SEEDS="$HERE/corpus_document" ;;
  *) echo "unknown target $TARGET (engine, analysis_document)" >&2; exit 2 ;;
esac
mkdir -p "$OUT/corpus" "$OUT/obj"
# The core is compiled into $OUT/obj, each file again only when that .cpp changes (other engineers
# edit headers all day; after a header change that matters, rm -rf "$OUT/obj"). report.cpp, which
# needs the generated version header, is not used by these targets.
OBJS=""
for src in "$ROOT"/core/*.cpp; do
  name=$(basename "$src" .cpp)
  [ "$name" = report ] && continue
  obj="$OUT/obj/$name.o"
  if [ ! -f "$obj" ] || [ "$src" -nt "$obj" ]; then
    # shellcheck disable=SC2086
    "$CXX" $FLAGS -I "$ROOT/core" -c "$src" -o "$obj"
  fi
  OBJS="$OBJS $obj"
done
# shellcheck disable=SC2086
"$CXX" $FLAGS -fsanitize=fuzzer -I "$ROOT/core" "$HERE/fuzz_$TARGET.cpp" $OBJS -o "$OUT/fuzz_$TARGET"
cd "$OUT"
# shellcheck disable=SC2086
exec ./"fuzz_$TARGET" -max_total_time="$SECONDS_TO_RUN" -timeout=10 -rss_limit_mb=2048 -max_len=65536 \
  -print_final_stats=1 corpus $SEEDS
