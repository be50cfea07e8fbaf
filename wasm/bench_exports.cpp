// Hedgeleaf module: benchmark entry points (bench/module_bench.mjs), kept out of
// bindings.cpp so the page's glue stays thin. Plain numbers in and out: the
// kernels are timed without JSON around them. Not part of the page's contract.
#include "lattice.hpp"

#include "../bench/usual_loop.hpp"

#include <emscripten/bind.h>

#include <string>
#include <vector>

namespace {

using namespace hedgeleaf;

market_data make_market(double spot, double volatility, double rate, double carry) {
    market_data m;
    m.spot = spot;
    m.volatility = volatility;
    m.rate = rate;
    m.carry_yield = carry;
    return m;
}

option_leg make_leg(bool put, bool american, double strike, double expiry) {
    option_leg leg;
    leg.type = put ? payoff_kind::put : payoff_kind::call;
    leg.strike = strike;
    leg.expiry = expiry;
    leg.exercise = american ? exercise_style::american : exercise_style::european;
    return leg;
}

/// One backward induction of the benchmark put (spot 100, strike 100, vol 25 %,
/// rate 5 %, carry 1 %, 1 year, CRR) by `loop`: "kernel" (the core's sweep over
/// every node), "band" (the sweep as the pricer runs it, over the probable band)
/// or "usual" (bench/usual_loop.hpp). Returns the value; -1 for an unknown loop.
double bench_kernel(const std::string& loop, int steps, bool american) {
    static std::vector<double> buffer;
    const market_data m = make_market(100, 0.25, 0.05, 0.01);
    const option_leg leg = make_leg(true, american, 100, 1.0);
    if (loop == "kernel") return induce(m, leg, lattice_method::crr, steps, lattice_extent::full).value;
    if (loop == "band") return induce(m, leg, lattice_method::crr, steps).value;
    if (loop == "usual") return bench::usual_induce(m, leg, lattice_method::crr, steps, buffer);
    return -1;
}

/// Node updates of the "band" sweep for bench_kernel's option.
double bench_band_updates(int steps, bool american) {
    return induce(make_market(100, 0.25, 0.05, 0.01), make_leg(true, american, 100, 1.0), lattice_method::crr, steps)
        .node_updates;
}

/// Premium of an American vanilla by price_lattice_only (the page's price without
/// bumped Greeks). `method` as in trade files; steps 0 = default.
double bench_price(bool put, double spot, double strike, double volatility, double rate, double carry, double expiry,
                   const std::string& method, int steps, bool extrapolate) {
    try {
        const lattice_settings s{parse_lattice_method(method), steps, extrapolate};
        return price_lattice_only(make_market(spot, volatility, rate, carry), make_leg(put, true, strike, expiry), s)
            .premium;
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
