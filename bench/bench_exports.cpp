// Hedgeleaf benchmark module: entry points for bench/module_bench.mjs, linked with the
// page's wasm/bindings.cpp into build/wasm-bench/hedgeleaf_bench.js (bench/CMakeLists.txt),
// never into the page's module. Plain numbers in and out: the kernels are timed without
// JSON around them. Not part of the page's contract.
#include "numerics/lattice.hpp"
#include "numerics/lattice_price.hpp"
#include "usual_loop.hpp"

#include <emscripten/bind.h>

#include <string>
#include <vector>

namespace {

using namespace hedgeleaf;

option_leg bench_leg(bool put, bool american, double strike, double expiry) {
    return single_leg(put ? payoff_kind::put : payoff_kind::call, strike, expiry,
                      american ? exercise_style::american : exercise_style::european);
}

/// One backward induction of the benchmark put (spot 100, strike 100, vol 25 %,
/// rate 5 %, carry 1 %, 1 year, CRR) by `loop`: "kernel" (the core's sweep over
/// every node), "band" (the sweep as the pricer runs it, over the probable band)
/// or "usual" (bench/usual_loop.hpp). Returns the value; -1 for an unknown loop.
double bench_kernel(const std::string& loop, int steps, bool american) {
    static std::vector<double> buffer;
    const market_data m = flat_market(100, 0.25, 0.05, 0.01);
    const option_leg leg = bench_leg(true, american, 100, 1.0);
    if (loop == "kernel") return induce(m, leg, lattice_method::crr, steps, lattice_extent::full).value;
    if (loop == "band") return induce(m, leg, lattice_method::crr, steps).value;
    if (loop == "usual") return bench::usual_induce(m, leg, lattice_method::crr, steps, buffer);
    return -1;
}

/// Node updates of the "band" sweep for bench_kernel's option.
double bench_band_updates(int steps, bool american) {
    return induce(flat_market(100, 0.25, 0.05, 0.01), bench_leg(true, american, 100, 1.0), lattice_method::crr, steps)
        .node_updates;
}

/// Premium of an American vanilla by price_leg (the page's price without bumped Greeks).
/// `method` as in trade files; steps 0 = default.
double bench_price(bool put, double spot, double strike, double volatility, double rate, double carry, double expiry,
                   const std::string& method, int steps, bool extrapolate) {
    try {
        const lattice_settings s{parse_lattice_method(method), steps, extrapolate};
        return price_leg(flat_market(spot, volatility, rate, carry), bench_leg(put, true, strike, expiry), s).premium;
    } catch (...) {
        return -1;
    }
}

}  // namespace

EMSCRIPTEN_BINDINGS(hedgeleaf_bench) {
    emscripten::function("benchKernel", &bench_kernel);
    emscripten::function("benchBandUpdates", &bench_band_updates);
    emscripten::function("benchPrice", &bench_price);
}
