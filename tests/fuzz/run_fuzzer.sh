#!/bin/sh
# Builds a libFuzzer target with AddressSanitizer and UndefinedBehaviorSanitizer and runs it.
# Usage: tests/fuzz/run_fuzzer.sh TARGET SECONDS   (TARGET: paste_parser | share_link)
# Needs clang-14 and libclang-rt-14-dev (Debian). Findings land in $OUT (crash-*, timeout-*).
set -eu
TARGET=${1:?usage: run_fuzzer.sh TARGET SECONDS}
SECONDS_TO_RUN=${2:?usage: run_fuzzer.sh TARGET SECONDS}
HERE=$(cd "$(dirname "$0")" && pwd)
ROOT=$(cd "$HERE/../.." && pwd)
OUT=${OUT:-${TMPDIR:-/tmp}/tallyproof_fuzz_$TARGET}
CXX=${CXX:-clang++-14}
mkdir -p "$OUT/corpus"
case "$TARGET" in
  paste_parser)
    SOURCES="input/paste_parser input/parsed_input text/number_reading text/delimited_text input/table_shape input/previous_sample_header input/raw_observations input/binning input/equal_probability_bins model/analysis input/digit_extraction statistics/digit_laws text/number_format"
    SEEDS="$HERE/corpus_paste" ;;
  share_link)
    # the decoder reads the document back, so it links the whole core
    SOURCES=$(cd "$ROOT/core" && ls */*.cpp | sed 's/\.cpp$//')
    SEEDS="$HERE/corpus_share_link" ;;
  *) echo "unknown target $TARGET" >&2; exit 2 ;;
esac
mkdir -p "$SEEDS"
FILES=""
for s in $SOURCES; do FILES="$FILES $ROOT/core/$s.cpp"; done
# every layer folder of core/ on the include path (includes are bare file names)
CORE_INCLUDES=""
for d in "$ROOT"/core/*/; do CORE_INCLUDES="$CORE_INCLUDES -I ${d%/}"; done
# utf8proc (core/text/label_text.cpp), a C file from .ci/bootstrap's .cache, compiled as C
UTF8PROC="$ROOT/.cache/utf8proc"
"${CC:-clang-14}" -O1 -g -fsanitize=fuzzer-no-link,address -DUTF8PROC_STATIC -c "$UTF8PROC/utf8proc.c" -o "$OUT/utf8proc.o"
# shellcheck disable=SC2086
"$CXX" -std=c++17 -O1 -g -fsanitize=fuzzer,address,undefined -fno-sanitize-recover=undefined -DUTF8PROC_STATIC \
  $CORE_INCLUDES -I "$ROOT/build/native/core/generated" -isystem "$UTF8PROC" "$HERE/fuzz_$TARGET.cpp" $FILES "$OUT/utf8proc.o" -o "$OUT/fuzz_$TARGET"
cd "$OUT"
# The working corpus grows in $OUT/corpus; the starting corpus in the repository is only read.
exec ./"fuzz_$TARGET" -max_total_time="$SECONDS_TO_RUN" -timeout=10 -rss_limit_mb=2048 -max_len=65536 \
  -print_final_stats=1 corpus "$SEEDS"
