// Hedgeleaf analytics: the statistics of simulated P&L (analytics/simulate.hpp): each
// frequency's summary, the histogram on edges every frequency shares, the desk's view.
#pragma once

#include "analytics/simulate.hpp"

#include <vector>

namespace hedgeleaf {

/// The histogram's range: edges from `lo` to `hi`.
struct histogram_range {
    double lo = 0, hi = 0;
};

/// The p-quantile of an ascending sample, linear between order statistics.
double quantile(const std::vector<double>& sorted, double p);

/// Mean, sd (with its Monte Carlo error from the sample kurtosis), quantiles, extremes and
/// mean costs (from `cost_sum`) of every frequency's P&L in `out`; sets out.edges to span
/// every frequency's 0.1 % to 99.9 % quantiles and returns that range.
histogram_range summarise_pnl(const simulate_settings& st, const std::vector<double>& cost_sum, simulation& out);

/// Each frequency's counts on the shared edges, and those below and above them.
void fill_histograms(const simulate_settings& st, const histogram_range& range, simulation& out);

/// Mean and sd of the desk's P&L per position (`desk_pnl` per frequency and path).
void desk_figures(const simulate_settings& st, const std::vector<std::vector<double>>& desk_pnl, simulation& out);

}  // namespace hedgeleaf
