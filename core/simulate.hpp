// Hedgeleaf core: Monte Carlo of discrete delta hedging (the `simulate` section).
//
// Many spot paths (geometric Brownian motion on the diffusing spot with their
// own drift and realised volatility) are hedged exactly as `hedge` does on one
// path: delta in shares on each rebalancing date, the rest in cash at the
// trade's rate, optional costs. The P&L of a path is portfolio - payoff per unit
// of the trade (the replication error; the desk that sold the trade keeps it).
//
// Random numbers are our own so a seed gives the same paths natively and in
// WebAssembly: xoshiro256** seeded through splitmix64, and normals by inverting
// the normal distribution (Wichura's AS241) rather than std::normal_distribution,
// whose output differs between standard libraries.
#pragma once

#include "hedge.hpp"
#include "trade.hpp"

#include <cstdint>
#include <vector>

namespace hedgeleaf {

/// xoshiro256** (Blackman and Vigna), seeded by splitmix64.
class random_stream {
public:
    explicit random_stream(std::uint64_t seed);
    std::uint64_t next();
    /// Uniform in (0, 1), never 0 or 1 (53 random bits, centred in their cell).
    double uniform() { return (static_cast<double>(next() >> 11) + 0.5) * 0x1.0p-53; }
    /// Standard normal by inverse transform.
    double normal();

private:
    std::uint64_t s_[4];
};

/// Inverse of the standard normal distribution function (Wichura 1988, AS241 PPND16),
/// accurate to about 1e-16 relative over (0, 1).
double normal_quantile(double p);

/// Most paths one simulation runs.
inline constexpr long max_paths = 200000;
/// Most paths times rebalancings over all frequencies (keeps a run to a few seconds).
inline constexpr double max_path_rebalancings = 5e7;

struct simulate_settings {
    long paths = 10000;
    std::uint64_t seed = 1;
    double drift = 0;           ///< default market.rate
    double volatility = 0;      ///< realised; default market.volatility
    double cost_bp = 0;
    int bins = 40;
    std::vector<rebalance_spec> frequencies;  ///< default: every business day, week, month
    int lattice_steps = 0;      ///< delta table for non-European legs; 0 = automatic
};

simulate_settings read_simulate_settings(const trade& t);

/// Summary of one frequency's P&L distribution.
struct pnl_summary {
    rebalance_spec frequency;
    int rebalancings = 0;       ///< hedge trades after the first (dates after valuation)
    double mean = 0;
    double sd = 0;
    double sd_standard_error = 0;  ///< Monte Carlo error of sd (from the sample kurtosis)
    double mean_standard_error = 0;
    double p01 = 0, p05 = 0, p50 = 0, p95 = 0, p99 = 0;
    double min = 0, max = 0;
    double mean_costs = 0;
    double desk_mean = 0, desk_sd = 0;  ///< per position, the desk's view (costs on |quantity|)
    std::vector<long> counts;   ///< histogram over the shared bin edges
    long below = 0, above = 0;  ///< outside the edges
    std::vector<double> pnl;    ///< per path (kept for tests; not printed)
};

struct simulation {
    std::vector<pnl_summary> frequencies;
    std::vector<double> edges;  ///< bins + 1 edges shared by every frequency
    double premium = 0;
    bool closed_form_delta = false;  ///< every leg European: closed-form delta
    int lattice_steps = 0;           ///< delta table steps for other legs
    std::vector<std::string> notes;
};

simulation run_simulation(const trade& t, const simulate_settings& settings);
json simulate_result_json(const trade& t, const simulate_settings& settings, const simulation& sim);
json simulate_command(const trade& t);

/// Derman and Kamal (1999): sd of the hedging error of an at-the-money European
/// option hedged `n` times ~ sqrt(pi/4) * vega * sigma / sqrt(n).
double derman_kamal_sd(double vega, double sigma, int n);

}  // namespace hedgeleaf
