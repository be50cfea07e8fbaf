#!/usr/bin/env bash
# Build the libFuzzer target (clang, ASan + UBSan: the "sanitize" preset, which builds it
# beside the sanitizer tests from the same instrumented core) and fuzz every command.
#
#   bash tests/fuzz/run.sh replay               the test command's step: deterministic
#   bash tests/fuzz/run.sh [SECONDS] [flags...]  open-ended fuzzing (default 60 s)
#
# replay: every committed input (examples/ and tests/fuzz/seeds/, each document once per
# command, plus tests/fuzz/regressions/) and then a fixed number of mutations from a fixed
# seed (-seed=1 -runs=20000) into an empty corpus: the same inputs on every machine and
# every run, so the step passes or fails for the code alone (docs/reliability.md). Address
# randomisation is off (setarch -R) and comparison operands are not fed back (-use_cmp=0):
# both let heap addresses steer the mutations, and two runs then drifted apart.
# Open-ended: the corpus grows in build/fuzz/corpus and the random seed differs each run.
# Crash, leak and slow-unit reproducers land in build/fuzz/artifacts. Exit status is
# libFuzzer's (0 = clean).
set -euo pipefail
root=$(cd "$(dirname "$0")/../.." && pwd)
build=$root/build/fuzz  # seeds, corpus and reproducers
limit=${1:-60}
shift || true

# The target from the "sanitize" preset (build/sanitize; nothing to do when the test command
# has just built it there).
(cd "$root" && cmake --preset sanitize >/dev/null && cmake --build build/sanitize --target trade_fuzz -j2 >/dev/null)
fuzzer=$root/build/sanitize/trade_fuzz
mkdir -p "$build"

# Seeds: "<command>\n<document>" for every command and every example document.
seeds=$build/seeds
rm -rf "$seeds"; mkdir -p "$seeds" "$build/corpus" "$build/artifacts"
commands=$(HEDGELEAF_FUZZ_LIST_COMMANDS=1 "$fuzzer")
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

# -timeout: a single run over 5 s counts as a hang (20 s in the replay, which must not
# fail on a loaded machine); -max_len: trade documents are small, 4 KB leaves room for
# several legs and sections while keeping mutations effective.
cd "$build"
common=(-dict="$root/tests/fuzz/trade.dict" -max_len=4096 -rss_limit_mb=2048 -artifact_prefix="$build/artifacts/"
        -print_final_stats=1)
if [ "$limit" = replay ]; then
    fresh=$build/replay-corpus
    rm -rf "$fresh"; mkdir -p "$fresh"
    fixed=()  # where the kernel refuses setarch -R, the replay still runs (addresses may then vary)
    if setarch "$(uname -m)" -R true 2>/dev/null; then fixed=(setarch "$(uname -m)" -R); fi
    exec "${fixed[@]}" "$fuzzer" "$fresh" "$seeds" "${common[@]}" -timeout=20 -seed=1 -runs=20000 -use_cmp=0 "$@"
fi
exec "$fuzzer" "$build/corpus" "$seeds" "${common[@]}" -timeout=5 -max_total_time="$limit" "$@"
