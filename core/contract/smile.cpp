// Hedgeleaf contract: reading volatilities off a smile (see smile.hpp).
#include "contract/smile.hpp"

#include <algorithm>
#include <cmath>
#include <utility>

namespace hedgeleaf {

namespace {

double sign(double x) { return x > 0 ? 1.0 : (x < 0 ? -1.0 : 0.0); }

// Fritsch-Carlson derivatives at the knots (F. N. Fritsch and R. E. Carlson, "Monotone
// Piecewise Cubic Interpolation", SIAM J. Numer. Anal. 17, 1980), with the weighted harmonic
// mean inside and the shape-preserving three-point formula at the ends: the same choice as
// scipy.interpolate.PchipInterpolator, which tests/contract/smile_test.cpp checks against.
std::vector<double> monotone_slopes(const std::vector<double>& x, const std::vector<double>& y) {
    const std::size_t n = x.size();
    std::vector<double> d(n, 0.0);
    if (n < 2) return d;
    std::vector<double> h(n - 1), delta(n - 1);
    for (std::size_t k = 0; k + 1 < n; ++k) {
        h[k] = x[k + 1] - x[k];
        delta[k] = (y[k + 1] - y[k]) / h[k];
    }
    if (n == 2) return {delta[0], delta[0]};
    for (std::size_t k = 1; k + 1 < n; ++k) {
        if (delta[k - 1] * delta[k] <= 0) continue;
        const double w1 = 2 * h[k] + h[k - 1], w2 = h[k] + 2 * h[k - 1];
        d[k] = (w1 + w2) / (w1 / delta[k - 1] + w2 / delta[k]);
    }
    const auto end_slope = [](double h0, double h1, double m0, double m1) {
        double s = ((2 * h0 + h1) * m0 - h0 * m1) / (h0 + h1);
        if (sign(s) != sign(m0)) return 0.0;
        if (sign(m0) != sign(m1) && std::fabs(s) > 3 * std::fabs(m0)) return 3 * m0;
        return s;
    };
    d[0] = end_slope(h[0], h[1], delta[0], delta[1]);
    d[n - 1] = end_slope(h[n - 2], h[n - 3], delta[n - 2], delta[n - 3]);
    return d;
}

}  // namespace

volatility_smile::volatility_smile(smile_grid grid) : grid_(std::move(grid)) {
    for (double k : grid_.strikes) log_strikes_.push_back(std::log(k));
    for (const auto& row : grid_.vols) slopes_.push_back(monotone_slopes(log_strikes_, row));
}

double volatility_smile::row_at(std::size_t i, double x) const {
    const std::vector<double>& v = grid_.vols[i];
    const std::vector<double>& k = grid_.strikes;
    if (x <= k.front()) return v.front();
    if (x >= k.back()) return v.back();
    const std::size_t j = static_cast<std::size_t>(std::upper_bound(k.begin(), k.end(), x) - k.begin()) - 1;
    if (x == k[j]) return v[j];
    const double h = log_strikes_[j + 1] - log_strikes_[j];
    const double t = (std::log(x) - log_strikes_[j]) / h;
    // Cubic Hermite, written so that a flat stretch (equal volatilities, zero slopes) returns
    // its volatility exactly: a flat grid prices exactly as the same number given alone.
    const double t2 = t * t, t3 = t2 * t;
    const double h01 = 3 * t2 - 2 * t3, h10 = t3 - 2 * t2 + t, h11 = t3 - t2;
    const std::vector<double>& d = slopes_[i];
    return v[j] + (v[j + 1] - v[j]) * h01 + h * (d[j] * h10 + d[j + 1] * h11);
}

smile_point volatility_smile::at(double x, double years) const {
    smile_point out;
    const std::vector<double>& e = grid_.expiries;
    out.beyond_strikes = x < grid_.strikes.front() || x > grid_.strikes.back();
    if (years <= e.front() || years >= e.back()) {
        out.beyond_expiries = years < e.front() || years > e.back();
        out.volatility = row_at(years <= e.front() ? 0 : e.size() - 1, x);
        return out;
    }
    const std::size_t i = static_cast<std::size_t>(std::upper_bound(e.begin(), e.end(), years) - e.begin()) - 1;
    const double v0 = row_at(i, x);
    if (years == e[i]) {
        out.volatility = v0;
        return out;
    }
    const double v1 = row_at(i + 1, x);
    if (v0 == v1) {  // flat in time: the volatility itself, not a round trip through variance
        out.volatility = v0;
        return out;
    }
    const double w0 = v0 * v0 * e[i], w1 = v1 * v1 * e[i + 1];
    const double w = w0 + (w1 - w0) * (years - e[i]) / (e[i + 1] - e[i]);
    out.volatility = std::sqrt(std::max(w, 0.0) / years);
    return out;
}

}  // namespace hedgeleaf
