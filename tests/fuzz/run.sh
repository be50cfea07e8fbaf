#!/usr/bin/env bash
# Build the libFuzzer target with clang (build/fuzz, ASan + UBSan) and fuzz every
# command for a while.
#
#   bash tests/fuzz/run.sh [SECONDS | -runs=N] [extra libFuzzer flags...]
#
# Default: 60 seconds. The corpus grows in build/fuzz/corpus (seeded from examples/
# and tests/fuzz/seeds/, each document once per command, plus tests/fuzz/regressions/); crash, leak and slow-unit
# reproducers land in build/fuzz/artifacts. Exit status is libFuzzer's (0 = clean).
set -euo pipefail
root=$(cd "$(dirname "$0")/../.." && pwd)
build=$root/build/fuzz
limit=${1:-60}
shift || true

# -O1 -g1: quick to compile under the sanitizers, line numbers in reports.
cmake -S "$root" -B "$build" -DCMAKE_CXX_COMPILER=clang++ -DCMAKE_BUILD_TYPE=Debug -DCMAKE_CXX_FLAGS_DEBUG="-O1 -g1" \
      -DHEDGELEAF_FUZZ=ON -DHEDGELEAF_TESTS=OFF -DHEDGELEAF_BENCH=OFF >/dev/null
cmake --build "$build" --target trade_fuzz -j2 >/dev/null

# Seeds: "<command>\n<document>" for every command and every example document.
seeds=$build/seeds
rm -rf "$seeds"; mkdir -p "$seeds" "$build/corpus" "$build/artifacts"
commands=$(HEDGELEAF_FUZZ_LIST_COMMANDS=1 "$build/trade_fuzz")
n=0
for doc in "$root"/examples/*.json "$root"/tests/fuzz/seeds/*.json; do
    [ -f "$doc" ] || continue
    for command in $commands; do
        { printf '%s\n' "$command"; cat "$doc"; } > "$seeds/$n-$command-$(basename "$doc")"
        n=$((n + 1))
    done
done

# Inputs that once broke the contract are replayed first (tests/fuzz/regressions).
cp "$root"/tests/fuzz/regressions/* "$seeds/"

case "$limit" in
    -runs=*) budget=$limit ;;
    *) budget=-max_total_time=$limit ;;
esac
# -timeout: a single run over 5 s counts as a hang; -max_len: trade documents are small,
# 4 KB leaves room for several legs and sections while keeping mutations effective.
cd "$build"
exec ./trade_fuzz "$build/corpus" "$seeds" -dict="$root/tests/fuzz/trade.dict" -max_len=4096 -timeout=5 \
     -rss_limit_mb=2048 -artifact_prefix="$build/artifacts/" -print_final_stats=1 "$budget" "$@"
