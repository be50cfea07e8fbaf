#!/usr/bin/env bash
# Hedgeleaf speed and accuracy figures: native and module in one run.
#
#   bash bench/run.sh              build what is needed, then print every figure
#   bash bench/run.sh --reference  also recompute bench/american_reference.csv (about 10 minutes)
#
# Builds: build/native (preset "native"), build/wasm (preset "wasm", the shipped
# -msimd128 module, for the page figures), build/wasm-bench (preset "wasm-bench": the
# benchmark module hedgeleaf_bench.js, the page's bindings plus bench/bench_exports.cpp)
# and build/wasm-scalar (the benchmark module without SIMD, for comparison).
# Prints: native kernel speed and memory (lattice_bench), accuracy per time on the
# 500 random American options (accuracy_bench, which also redraws
# bench/accuracy.svg), the module against the usual loop and a plain-JavaScript
# peer (module_bench.mjs), and the page in headless Chromium (page_bench.mjs).
# Benchmarks print figures; nothing here passes or fails on a time.
set -euo pipefail
cd "$(dirname "$0")/.."
export NODE_PATH=/usr/share/nodejs

step() { printf '\n==== %s\n' "$*" >&2; }

step "native build (build/native)"
cmake --preset native >/dev/null
cmake --build build/native -j2 --target lattice_bench accuracy_bench >/dev/null

step "module builds (build/wasm: the page's; build/wasm-bench with SIMD and build/wasm-scalar without: the benchmark module)"
emcmake cmake --preset wasm >/dev/null
cmake --build build/wasm -j2 >/dev/null
emcmake cmake --preset wasm-bench >/dev/null
cmake --build build/wasm-bench -j2 --target hedgeleaf_bench_wasm >/dev/null
emcmake cmake -S . -B build/wasm-scalar -DCMAKE_BUILD_TYPE=Release -DHEDGELEAF_TESTS=OFF -DHEDGELEAF_BENCH=OFF \
  -DHEDGELEAF_WASM_SIMD=OFF -DHEDGELEAF_WASM_BENCH=ON >/dev/null
cmake --build build/wasm-scalar -j2 --target hedgeleaf_bench_wasm >/dev/null

if [[ "${1:-}" == "--reference" ]]; then
  step "converged reference for the random set (slow)"
  build/native/bench/accuracy_bench reference bench/american_reference.csv
fi

step "native kernel"
build/native/bench/lattice_bench

step "accuracy per time (native)"
build/native/bench/accuracy_bench bench/american_reference.csv --svg bench/accuracy.svg

step "module (Node)"
node bench/module_bench.mjs --module build/wasm-bench/hedgeleaf_bench.js=simd128 \
  --module build/wasm-scalar/hedgeleaf_bench.js=scalar

if [[ -d web/node_modules/playwright-core ]]; then
  step "page (headless Chromium)"
  mkdir -p build/bench-page
  node web/build.mjs --module build/wasm/hedgeleaf.js --out build/bench-page/hedgeleaf.html >/dev/null
  node bench/page_bench.mjs build/bench-page/hedgeleaf.html
else
  step "page figures skipped: no web/node_modules/playwright-core (cd web && npm ci)"
fi
