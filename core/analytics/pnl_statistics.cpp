// Hedgeleaf analytics: the statistics of simulated P&L (see pnl_statistics.hpp).
#include "analytics/pnl_statistics.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace hedgeleaf {

double quantile(const std::vector<double>& sorted, double p) {
    const double h = p * static_cast<double>(sorted.size() - 1);
    const std::size_t i = static_cast<std::size_t>(std::floor(h));
    if (i + 1 >= sorted.size()) return sorted.back();
    return sorted[i] + (h - static_cast<double>(i)) * (sorted[i + 1] - sorted[i]);
}

histogram_range summarise_pnl(const simulate_settings& st, const std::vector<double>& cost_sum, simulation& out) {
    std::vector<std::vector<double>> sorted(out.frequencies.size());
    double lo = INFINITY, hi = -INFINITY;
    for (std::size_t f = 0; f < out.frequencies.size(); ++f) {
        pnl_summary& s = out.frequencies[f];
        sorted[f] = s.pnl;
        std::sort(sorted[f].begin(), sorted[f].end());
        const double n = static_cast<double>(st.paths);
        s.mean = std::accumulate(s.pnl.begin(), s.pnl.end(), 0.0) / n;
        double m2 = 0, m4 = 0;
        for (double x : s.pnl) {
            const double d2 = (x - s.mean) * (x - s.mean);
            m2 += d2;
            m4 += d2 * d2;
        }
        s.sd = st.paths > 1 ? std::sqrt(m2 / (n - 1)) : 0.0;
        s.mean_standard_error = s.sd / std::sqrt(n);
        const double var = m2 / n;
        const double kurtosis = var > 0 ? (m4 / n) / (var * var) : 3.0;
        s.sd_standard_error = 0.5 * s.sd * std::sqrt(std::max(0.0, kurtosis - 1) / n);
        s.p01 = quantile(sorted[f], 0.01);
        s.p05 = quantile(sorted[f], 0.05);
        s.p50 = quantile(sorted[f], 0.50);
        s.p95 = quantile(sorted[f], 0.95);
        s.p99 = quantile(sorted[f], 0.99);
        s.min = sorted[f].front();
        s.max = sorted[f].back();
        s.mean_costs = cost_sum[f] / n;
        lo = std::min(lo, quantile(sorted[f], 0.001));
        hi = std::max(hi, quantile(sorted[f], 0.999));
    }
    if (!(hi > lo)) {
        const double pad = 1e-6 * std::max(1.0, std::fabs(lo));
        lo -= pad;
        hi += pad;
    }
    for (int b = 0; b <= st.bins; ++b) out.edges.push_back(lo + (hi - lo) * b / st.bins);
    return {lo, hi};
}

void fill_histograms(const simulate_settings& st, const histogram_range& range, simulation& out) {
    const double lo = range.lo, hi = range.hi;
    for (auto& s : out.frequencies) {
        s.counts.assign(static_cast<std::size_t>(st.bins), 0);
        for (double x : s.pnl) {
            if (x < lo)
                ++s.below;
            else if (x > hi)
                ++s.above;
            else
                s.counts[std::min(st.bins - 1, static_cast<int>((x - lo) / (hi - lo) * st.bins))]++;
        }
    }
}

void desk_figures(const simulate_settings& st, const std::vector<std::vector<double>>& desk_pnl, simulation& out) {
    for (std::size_t f = 0; f < out.frequencies.size(); ++f) {
        pnl_summary& s = out.frequencies[f];
        const double n = static_cast<double>(st.paths);
        s.desk_mean = std::accumulate(desk_pnl[f].begin(), desk_pnl[f].end(), 0.0) / n;
        double m2 = 0;
        for (double x : desk_pnl[f]) m2 += (x - s.desk_mean) * (x - s.desk_mean);
        s.desk_sd = st.paths > 1 ? std::sqrt(m2 / (n - 1)) : 0.0;
    }
}

}  // namespace hedgeleaf
