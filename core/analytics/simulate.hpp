// Hedgeleaf analytics: Monte Carlo of discrete delta hedging (the simulate command).
//
// Many spot paths (geometric Brownian motion on the diffusing spot with their
// own drift and realised volatility) are hedged exactly as `hedge` does on one
// path: delta in shares on each rebalancing date, the rest in cash at the
// trade's rate, optional costs. The P&L of a path is portfolio - payoff per unit
// of the trade (the replication error; the desk that sold the trade keeps it).
// The paths come from numerics/random.hpp, the same for a seed on every platform.
#pragma once

#include "analytics/schedule.hpp"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

/// The `simulate` section, read and checked (commands/simulate.hpp).
struct simulate_settings {
    long paths = default_paths;
    std::uint64_t seed = 1;
    double drift = 0;       ///< default market.rate
    double volatility = 0;  ///< realised; default market.volatility
    double cost_bp = 0;
    int bins = default_bins;
    std::vector<rebalance_spec> frequencies;  ///< default: every business day, week, month
    int lattice_steps = 0;                    ///< delta table for non-European legs; 0 = automatic
};

/// Summary of one frequency's P&L distribution.
struct pnl_summary {
    rebalance_spec frequency;
    int rebalancings = 0;  ///< hedge trades after the first (dates after valuation)
    double mean = 0;
    double sd = 0;
    double sd_standard_error = 0;  ///< Monte Carlo error of sd (from the sample kurtosis)
    double mean_standard_error = 0;
    double p01 = 0, p05 = 0, p50 = 0, p95 = 0, p99 = 0;
    double min = 0, max = 0;
    double mean_costs = 0;
    double desk_mean = 0, desk_sd = 0;      ///< per position, the desk's view (costs on |quantity|)
    std::optional<double> derman_kamal_sd;  ///< the reference sd for one European call or put (derman_kamal_sd)
    std::vector<long> counts;               ///< histogram over the shared bin edges
    long below = 0, above = 0;              ///< outside the edges
    std::vector<double> pnl;                ///< per path (kept for tests; not printed)
};

struct simulation {
    std::vector<pnl_summary> frequencies;
    std::vector<double> edges;  ///< bins + 1 edges shared by every frequency
    double premium = 0;
    bool closed_form_delta = false;  ///< every leg European: closed-form delta
    bool derman_kamal = false;       ///< one European call or put: frequencies carry derman_kamal_sd
    int lattice_steps = 0;           ///< delta table steps for other legs
    std::vector<std::string> notes;
};

/// Simulate and hedge `settings.paths` paths at every frequency; refuses (simulate.paths)
/// more than max_path_rebalancings paths x rebalancings.
simulation run_simulation(const trade& t, const simulate_settings& settings);

/// Refuse (naming simulate.paths) more than max_path_rebalancings paths x rebalancings.
void check_simulation_size(double path_rebalancings);

/// Derman and Kamal (1999): sd of the hedging error of an at-the-money European
/// option hedged `n` times ~ sqrt(pi/4) * vega * sigma / sqrt(n).
double derman_kamal_sd(double vega, double sigma, int n);

}  // namespace hedgeleaf
