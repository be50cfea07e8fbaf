#!/usr/bin/env bash
# Line and branch coverage of core/ by the fuzz corpus (build/fuzz/corpus, grown by
# tests/fuzz/run.sh): builds the fuzz target with clang's source-based coverage in
# build/fuzz-cov, replays the corpus once and prints llvm-cov's report for core/.
#
#   bash tests/fuzz/coverage.sh
set -euo pipefail
root=$(cd "$(dirname "$0")/../.." && pwd)
build=$root/build/fuzz-cov
corpus=$root/build/fuzz/corpus
[ -d "$corpus" ] || { echo "no corpus yet: run tests/fuzz/run.sh first" >&2; exit 2; }

cmake -S "$root" -B "$build" -DCMAKE_CXX_COMPILER=clang++ -DCMAKE_BUILD_TYPE=Debug -DCMAKE_CXX_FLAGS_DEBUG="-O1 -g1" \
      -DCMAKE_CXX_FLAGS="-fprofile-instr-generate -fcoverage-mapping" \
      -DCMAKE_EXE_LINKER_FLAGS="-fprofile-instr-generate" \
      -DHEDGELEAF_FUZZ=ON -DHEDGELEAF_TESTS=OFF -DHEDGELEAF_BENCH=OFF >/dev/null
cmake --build "$build" --target trade_fuzz -j2 >/dev/null

rm -f "$build"/*.profraw
(cd "$build" && LLVM_PROFILE_FILE="$build/corpus-%p.profraw" ./trade_fuzz -runs=0 "$corpus" >/dev/null 2>&1)
llvm-profdata-14 merge -sparse "$build"/*.profraw -o "$build/corpus.profdata"
llvm-cov-14 report "$build/trade_fuzz" -instr-profile="$build/corpus.profdata" "$root"/core/*/*.cpp
