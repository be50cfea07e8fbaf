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
    # The browser tests drive three engines: chromium; firefox-esr (WebDriver BiDi);
    # WebKitGTK's MiniBrowser (webkit2gtk-driver brings it and WebKitWebDriver) under xvfb.
    # poppler-utils: pdftotext and pdfinfo read the printed sheets back (tests/browser/compare.test.mjs).
    local wanted=(cmake g++ make emscripten nlohmann-json3-dev catch2 libboost-dev chromium
                  firefox-esr webkit2gtk-driver xvfb poppler-utils
                  clang libclang-rt-14-dev clang-format python3 python3-scipy python3-mpmath python3-jsonschema)
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
    if [ -f web/package.json ] && ! npm_packages_current; then
        say "installing npm packages (browser drivers, axe-core, JavaScript formatter and linter)"
        (cd web && npm ci --no-audit --no-fund --loglevel=error)
    fi
}

# True when web/node_modules holds every package of web/package-lock.json at its locked
# version (a package added or moved to another version since the last `npm ci` => false).
npm_packages_current() {
    (cd web && node -e '
        const fs = require("fs");
        const locked = require("./package-lock.json").packages;
        const installed = (dir) => fs.existsSync(`${dir}/package.json`) && JSON.parse(fs.readFileSync(`${dir}/package.json`, "utf8")).version;
        const current = Object.entries(locked).every(([dir, entry]) => !dir || entry.optional || entry.link || installed(dir) === entry.version);
        process.exit(current ? 0 : 1);
    ')
}

# Prettier and ESLint over the page, its build, the tests and the benchmarks (the file
# list and both configurations are in web/: package.json "config.js", prettier.config.mjs,
# eslint.config.mjs). Fails on any file Prettier would change and on any ESLint finding.
check_javascript() {
    say "JavaScript format (Prettier) and lint (ESLint)"
    (cd web && npm run --silent format:check && npm run --silent lint)
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

# The whole native suite again under ASan + UBSan with clang (preset "sanitize", build/sanitize,
# which also builds the libFuzzer target from the same instrumented core). Prints its time: CI
# has 2 cores and a 15-minute budget for the whole test command.
sanitize() {
    local start=$SECONDS
    say "native tests and the fuzz target under AddressSanitizer + UndefinedBehaviorSanitizer (clang)"
    cmake --preset sanitize >/dev/null
    cmake --build build/sanitize -j"$jobs"
    # (the style and layering checks run no engine code: the native run covers them)
    (cd build/sanitize && UBSAN_OPTIONS=print_stacktrace=1 ctest --output-on-failure -j"$jobs" -E '^(format|layering|layering_self_test)$')
    say "sanitizer build and tests took $((SECONDS - start)) s"
}

# The deterministic libFuzzer replay over every command (tests/fuzz/run.sh replay: the committed
# inputs and 20,000 mutations from a fixed seed), into build/fuzz.log. One process on one core:
# the test command runs it beside the WebAssembly build (fuzz_start, then fuzz_result).
fuzz_start() {
    say "fuzzing every command (committed inputs and 20,000 fixed-seed mutations; libFuzzer + ASan + UBSan), beside the page build"
    mkdir -p build
    fuzz_began=$SECONDS
    bash tests/fuzz/run.sh replay > build/fuzz.log 2>&1 &
    fuzz_pid=$!
    # a failed page build ends the command: take the replay with it
    trap 'kill "$fuzz_pid" 2>/dev/null || true' EXIT
}

fuzz_result() {
    local status=0
    wait "$fuzz_pid" || status=$?
    trap - EXIT
    if [ "$status" -ne 0 ]; then
        tail -n 60 build/fuzz.log
        echo "fuzzing found a problem: the reproducer is in build/fuzz/artifacts (log: build/fuzz.log)" >&2
        return 1
    fi
    grep -E '^(#[0-9]+ +(INITED|DONE)|stat::)' build/fuzz.log || true
    say "fuzz run took $((SECONDS - fuzz_began)) s (beside the page build)"
}

# The browser tests, each engine with its time (CI: 2 cores, 15 minutes for everything). The
# core scenarios (tests/browser/scenarios.mjs) run on all three; the other files of
# tests/browser/ are Chromium's. Firefox and WebKit, which run only the core scenarios and mostly
# wait on their browsers, run side by side after Chromium, each into its own log.
browser_tests() {
    local start=$SECONDS files f engine failed=0
    say "browser tests: chromium"
    files=(tests/browser/chromium.engine.test.mjs)
    for f in tests/browser/*.test.mjs; do
        case "$f" in *.engine.test.mjs) ;; *) files+=("$f") ;; esac
    done
    # two files at a time: each mostly waits on its page (debounces, engine workers), so two share the cores
    node --test --test-concurrency=2 "${files[@]}"
    say "chromium browser tests took $((SECONDS - start)) s"
    start=$SECONDS
    say "browser tests: firefox and webkit, side by side"
    mkdir -p build
    local -A pids=()
    for engine in firefox webkit; do
        node --test tests/browser/"$engine".engine.test.mjs > build/"$engine"-tests.log 2>&1 &
        pids[$engine]=$!
    done
    for engine in firefox webkit; do
        if wait "${pids[$engine]}"; then
            grep -E '^# (tests|pass|fail|duration_ms)' build/"$engine"-tests.log | sed "s/^/$engine: /"
        else
            failed=1
            say "$engine browser tests failed (build/$engine-tests.log):"
            cat build/"$engine"-tests.log
        fi
    done
    say "firefox and webkit browser tests took $((SECONDS - start)) s"
    return $failed
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
        check_javascript
        build_native
        say "native tests"
        (cd build/native && ctest --output-on-failure -j"$jobs")
        sanitize
        fuzz_start
        build_page
        fuzz_result
        say "module tests (node)"
        node --test tests/node/
        browser_tests
        ;;
    *)
        echo "usage: bash tools/setup.sh main|test" >&2
        exit 2
        ;;
esac
