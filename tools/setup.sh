#!/usr/bin/env bash
# Hedgeleaf set-up on a fresh Debian machine: installs what it needs (idempotent),
# builds, then either runs the main job or every test.
#
#   bash tools/setup.sh main   # build the CLI and the page, price the example trade
#   bash tools/setup.sh test   # build everything and run all tests
set -euo pipefail
mode=${1:-main}
root=$(cd "$(dirname "$0")/.." && pwd)
cd "$root"
jobs=2

say() { printf '\n== %s\n' "$*"; }

install_packages() {
    local wanted=(cmake g++ make emscripten nlohmann-json3-dev catch2 libboost-dev chromium
                  clang libclang-rt-14-dev python3 python3-scipy python3-mpmath python3-jsonschema)
    local missing=()
    for p in "${wanted[@]}"; do dpkg -s "$p" >/dev/null 2>&1 || missing+=("$p"); done
    # Node.js may come from another package source (with npm inside); only add Debian's when absent.
    command -v node >/dev/null 2>&1 || missing+=(nodejs)
    command -v npm >/dev/null 2>&1 || missing+=(npm)
    if [ ${#missing[@]} -gt 0 ]; then
        say "installing Debian packages: ${missing[*]}"
        local sudo=""; [ "$(id -u)" -eq 0 ] || sudo=sudo
        $sudo apt-get update -qq
        DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq "${missing[@]}"
    fi
    if [ -f web/package.json ] && [ ! -d web/node_modules/playwright-core ]; then
        say "installing npm packages for the browser tests"
        (cd web && npm ci --no-audit --no-fund --loglevel=error)
    fi
}

build_native() {
    say "native build (CLI, tests, benchmarks)"
    cmake --preset native >/dev/null
    cmake --build build/native -j"$jobs"
}

build_page() {
    say "WebAssembly module and the one-file page"
    # NODE_PATH: Debian's emscripten optimiser needs acorn from /usr/share/nodejs.
    NODE_PATH=/usr/share/nodejs emcmake cmake --preset wasm >/dev/null
    NODE_PATH=/usr/share/nodejs cmake --build build/wasm -j"$jobs"
    node web/build.mjs
}

install_packages
case "$mode" in
    main)
        build_native
        build_page
        say "pricing examples/american-put.json"
        ./build/native/hedgeleaf price examples/american-put.json --table
        say "page written to dist/hedgeleaf.html (open it in a browser; it needs no network)"
        ;;
    test)
        build_native
        say "native tests"
        (cd build/native && ctest --output-on-failure -j"$jobs")
        build_page
        say "module tests (node)"
        node --test tests/node/
        say "browser tests (headless Chromium)"
        node --test tests/browser/
        ;;
    *)
        echo "usage: bash tools/setup.sh main|test" >&2
        exit 2
        ;;
esac
