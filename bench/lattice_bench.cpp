// Hedgeleaf benchmark: speed of the backward induction, natively.
//
// Prints node updates per second and reference cycles per node of the kernel
// in core/numerics/lattice_kernel.cpp and of the usual loop (bench/usual_loop.hpp) at 1,000,
// 10,000 and 50,000 steps, European and American; the latency of one dependent
// multiply on this machine (what bounds the usual loop); and the peak resident
// memory of one 1,000 / 10,000 / 50,000-step price, each in its own process.
// Usage: lattice_bench            all figures
//        lattice_bench --rss N    (internal) price once at N steps, print peak RSS in KiB
#include "bench_common.hpp"
#include "numerics/lattice.hpp"
#include "numerics/lattice_price.hpp"
#include "usual_loop.hpp"

#include <sys/resource.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <vector>

using namespace hedgeleaf;
using namespace hedgeleaf::bench;

namespace {

market_data bench_market() {
    market_data m;
    m.spot = 100;
    m.volatility = 0.25;
    m.rate = curve::flat(0.05);
    m.carry_yield = curve::flat(0.01);
    return m;
}

option_leg bench_put(exercise_style style) {
    option_leg leg;
    leg.type = payoff_kind::put;
    leg.strike = 100;
    leg.expiry_years = 1.0;
    leg.exercise = style;
    return leg;
}

struct timing {
    double seconds_per_price = 0;  // thread CPU seconds
    double value = 0;
};

// CPU time per call of `price`: the best mean over batches of calls (each batch at
// least budget/16 of CPU time, `budget` in all; prices longer than a batch are
// timed singly, best of two). Other processes share this machine: the best batch
// is the one least disturbed by them, for the usual loop and the kernel alike.
template <class F>
timing time_prices(F&& price, double budget) {
    timing t;
    double start = cpu_seconds();
    t.value = price();  // warm-up: buffers, caches, branch predictors
    const double first = cpu_seconds() - start;
    const double batch = budget / 16;
    t.seconds_per_price = first;
    if (first >= batch) {
        start = cpu_seconds();
        t.value = price();
        t.seconds_per_price = std::min(first, cpu_seconds() - start);
        return t;
    }
    double spent = 0;
    t.seconds_per_price = 1e300;
    while (spent < budget) {
        int calls = 0;
        double elapsed = 0;
        start = cpu_seconds();
        while (elapsed < batch) {
            t.value = price();
            ++calls;
            elapsed = cpu_seconds() - start;
        }
        spent += elapsed;
        t.seconds_per_price = std::min(t.seconds_per_price, elapsed / calls);
    }
    return t;
}

// CPU seconds of one multiply that waits for the previous one: the bound on a
// loop whose nodes are chained by s *= ratio.
double dependent_multiply_seconds() {
    volatile double seed = 1.0000001;
    double s = 1.0;
    const double r = seed;
    const long count = 200'000'000;
    const double start = cpu_seconds();
    for (long i = 0; i < count; ++i) s *= r;
    const double elapsed = cpu_seconds() - start;
    volatile double sink = s;
    (void)sink;
    return elapsed / count;
}

// TSC ticks per second, from the steady clock over a quarter of a second.
double tsc_rate() {
    const double s0 = now_seconds();
    const std::uint64_t c0 = tsc();
    while (now_seconds() - s0 < 0.25) {}
    return static_cast<double>(tsc() - c0) / (now_seconds() - s0);
}

long peak_rss_kib() {
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return usage.ru_maxrss;
}

// One American put priced with default method and extrapolation at `steps` (0: no price).
int rss_child(int steps) {
    if (steps > 0) {
        lattice_settings s;
        s.steps = steps;
        const lattice_price p = price_leg(bench_market(), bench_put(exercise_style::american), s);
        if (!std::isfinite(p.premium)) return 1;
    }
    std::printf("%ld\n", peak_rss_kib());
    return 0;
}

// This program's own path (popen runs a shell, whose /proc/self/exe is the shell).
std::string self_path() {
    char buf[4096];
    const ssize_t n = readlink("/proc/self/exe", buf, sizeof buf - 1);
    return n > 0 ? std::string(buf, static_cast<std::size_t>(n)) : std::string("lattice_bench");
}

long rss_of_child(int steps) {
    std::string command = "'";
    command += self_path();
    command += "' --rss ";
    command += std::to_string(steps);
    FILE* pipe = popen(command.c_str(), "r");
    if (!pipe) return -1;
    long kib = -1;
    if (std::fscanf(pipe, "%ld", &kib) != 1) kib = -1;
    pclose(pipe);
    return kib;
}

const char* clone_in_use() {
#if defined(__x86_64__) && defined(__linux__) && defined(__GNUC__) && !defined(__clang__)
    __builtin_cpu_init();
    if (__builtin_cpu_supports("x86-64-v4")) return "x86-64-v4 clone (AVX-512)";
    return __builtin_cpu_supports("x86-64-v3") ? "x86-64-v3 clone (AVX2+FMA)" : "baseline x86-64 clone (SSE2)";
#else
    return "single build";
#endif
}

// What exact event dates cost: a leg whose exercise or dividend dates fall inside its life is
// priced on a piecewise-uniform grid whose segments end on every event (numerics/time_grid.hpp),
// against the uniform grid of a leg without events, at the default settings (price_leg as the
// price command calls it, error bound included).
void event_grid_cost(const market_data& flat) {
    std::printf("# Exact event dates: default settings, one American or Bermudan put, 1 year\n");
    std::printf("%-44s %14s %10s %12s\n", "events inside the life", "time/price ms", "vs none", "premium");
    const lattice_settings settings{};
    option_leg american = bench_put(exercise_style::american);
    double none_seconds = 0;
    const auto row = [&](const char* name, const market_data& m, const option_leg& leg) {
        const timing t =
            time_prices([&] { return price_leg(m, leg, settings, bumped_greeks::off, error_bound::on).premium; }, 0.6);
        if (none_seconds == 0) none_seconds = t.seconds_per_price;
        std::printf("%-44s %14.3f %9.2fx %12.6f\n", name, t.seconds_per_price * 1e3, t.seconds_per_price / none_seconds,
                    t.value);
    };
    row("none (uniform grid)", flat, american);
    option_leg bermudan = bench_put(exercise_style::bermudan);
    bermudan.exercise_years = {0.502};
    row("Bermudan, one date at 0.502 y", flat, bermudan);
    bermudan.exercise_years.clear();
    for (int k = 1; k < 12; ++k) bermudan.exercise_years.push_back(k / 12.0 + 0.003);
    row("Bermudan, 11 monthly dates off the grid", flat, bermudan);
    market_data paying = flat;
    for (int k = 1; k <= 4; ++k) paying.dividends.push_back({k * 0.25 - 0.1, 0.5});
    row("American, 4 quarterly cash dividends", paying, american);
    std::printf(
        "(the dividends add the day before each ex-date for early exercise: 8 events; "
        "ratios above 1 are the price of exact dates; docs/performance.md)\n\n");
}

}  // namespace

int main(int argc, char** argv) {
    if (argc == 3 && std::string(argv[1]) == "--rss") return rss_child(std::atoi(argv[2]));

    const double rate = tsc_rate();
    std::printf("# Native backward induction (bench/lattice_bench.cpp)\n");
    std::printf("cpu: %s\n", cpu_name().c_str());
    std::printf(
        "time-stamp counter: %.3f GHz (reference cycles: the TSC ticks at the nominal rate; "
        "the core may run faster under turbo)\n",
        rate / 1e9);
    std::printf("sweep code path: %s\n", clone_in_use());
    const double chain = dependent_multiply_seconds() * rate;
    std::printf(
        "one dependent double multiply (s *= r chain): %.2f reference cycles; it takes 4 core cycles on "
        "recent Intel and AMD cores (vendor latency tables), so the core clock is about %.2f GHz\n",
        chain, 4 / chain * rate / 1e9);
    std::printf("times are CPU time of the benchmark thread; cycles = CPU time x TSC rate\n\n");

    std::printf("%-9s %6s  %-8s %14s %12s %16s %12s %10s\n", "exercise", "steps", "loop", "time/price ms",
                "node updates", "node updates/s", "cycles/node", "speed-up");
    const market_data m = bench_market();
    std::vector<double> buffer;
    for (const exercise_style style : {exercise_style::european, exercise_style::american}) {
        const option_leg leg = bench_put(style);
        for (const int steps : {1000, 10000, 50000}) {
            const double nodes = node_updates(steps);
            const timing usual =
                time_prices([&] { return usual_induce(m, leg, lattice_method::crr, steps, buffer); }, 0.6);
            const timing kernel = time_prices(
                [&] { return induce(m, leg, lattice_method::crr, steps, lattice_extent::full).value; }, 0.6);
            const timing band = time_prices([&] { return induce(m, leg, lattice_method::crr, steps).value; }, 0.6);
            const double band_nodes = induce(m, leg, lattice_method::crr, steps).node_updates;
            const struct {
                const char* name;
                timing t;
                double nodes;
            } rows[] = {{"usual", usual, nodes}, {"kernel", kernel, nodes}, {"band", band, band_nodes}};
            for (const auto& r : rows) {
                std::printf("%-9s %6d  %-8s %14.3f %12.4g %16.3e %12.3f %10.2f\n", to_string(style).c_str(), steps,
                            r.name, r.t.seconds_per_price * 1e3, r.nodes, r.nodes / r.t.seconds_per_price,
                            r.t.seconds_per_price * rate / r.nodes, usual.seconds_per_price / r.t.seconds_per_price);
            }
            for (const double v : {kernel.value, band.value}) {
                const double diff = std::fabs(usual.value - v) / std::fabs(v);
                if (diff > 1e-9) std::printf("  WARNING: values differ by %.2e relative\n", diff);
            }
        }
    }
    std::printf(
        "(CRR lattice, put, spot 100, strike 100, vol 25 %%, rate 5 %%, carry 1 %%, 1 year. usual = "
        "bench/usual_loop.hpp; kernel = hedgeleaf::induce over every node (lattice_extent::full), set-up "
        "included; band = hedgeleaf::induce as the pricer calls it, over the probable band only, same value; "
        "speed-up = usual time / this time)\n\n");

    event_grid_cost(m);

    std::printf(
        "# Memory: one American put, default method with extrapolation (fine + coarse lattice), "
        "peak resident set of a fresh process\n");
    const long base = rss_of_child(0);
    std::printf("%8s %14s %16s\n", "steps", "peak RSS KiB", "above empty KiB");
    std::printf("%8s %14ld %16s\n", "none", base, "-");
    for (const int steps : {1000, 10000, 25000, 50000}) {
        const long kib = rss_of_child(steps);
        std::printf("%8d %14ld %16ld\n", steps, kib, kib - base);
    }
    std::printf(
        "(an N x N grid at 50,000 steps would need %.1f GiB; the kernel keeps one row of values, "
        "a table of N+1 powers and N+1 exercise flags)\n",
        node_updates(50000) * 8 / (1 << 30));
    return 0;
}
