// Hedgeleaf benchmarks: the backward induction as it is usually written, the
// baseline the optimised kernel in core/numerics/lattice_kernel.cpp is measured against.
//
// A running spot product (s *= up/down, one multiply per node that waits for
// the previous one) and one max per node. Vanilla put or call, no dividends.
// Shared by the native benchmark and the WebAssembly benchmark exports so both
// time the same source, compiled the same way as the kernel.
#pragma once

#include "numerics/lattice.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

namespace hedgeleaf::bench {

// The same code-generation choice as the kernel's sweep (core/numerics/lattice_kernel.cpp):
// AVX-512, AVX2+FMA and baseline clones on x86-64 Linux with GCC.
#if defined(__x86_64__) && defined(__linux__) && defined(__GNUC__) && !defined(__clang__)
#define HEDGELEAF_BENCH_CLONES __attribute__((target_clones("arch=x86-64-v4", "arch=x86-64-v3", "default")))
#else
#define HEDGELEAF_BENCH_CLONES
#endif

/// Value of a vanilla leg (American or European) by the usual loop; `v` is the
/// caller's buffer (resized to steps + 1), so timing excludes allocation.
HEDGELEAF_BENCH_CLONES inline double usual_induce(const market_data& market, const option_leg& leg,
                                                  lattice_method method, int steps, std::vector<double>& v) {
    const int n_steps = effective_steps(method, steps);
    const lattice_step st = make_step(method, market, leg.strike, leg.expiry_years, n_steps);
    const double s0 = diffusing_spot(market, leg.expiry_years);
    const double k = leg.strike;
    const bool put = leg.type == payoff_kind::put;
    const bool american = leg.exercise == exercise_style::american;
    const double ratio = st.up / st.down;
    const double p = st.p_up, disc = st.discount;
    v.resize(static_cast<std::size_t>(n_steps) + 1);
    double s = s0 * std::pow(st.down, n_steps);
    for (int i = 0; i <= n_steps; ++i) {
        v[i] = put ? std::max(k - s, 0.0) : std::max(s - k, 0.0);
        s *= ratio;
    }
    for (int n = n_steps - 1; n >= 0; --n) {
        if (american) {
            s = s0 * std::pow(st.down, n);
            for (int i = 0; i <= n; ++i) {
                const double hold = disc * (p * v[i + 1] + (1 - p) * v[i]);
                v[i] = std::max(hold, put ? k - s : s - k);
                s *= ratio;
            }
        } else {
            for (int i = 0; i <= n; ++i) v[i] = disc * (p * v[i + 1] + (1 - p) * v[i]);
        }
    }
    return v[0];
}

}  // namespace hedgeleaf::bench
