// Hedgeleaf benchmarks: an independent reference for Bermudan options by numerical integration.
//
// Not a lattice. Between two exercise dates spot moves lognormally, so the value of holding
// on at date k is a Gaussian integral of the value at date k + 1 over x = log spot:
//   C_k(x) = e^(-r dt) * integral of max(exercise(y), C_(k+1)(y)) phi(y; x + (r - q - s^2/2) dt, s^2 dt) dy,
// (the "QUAD" idea of Andricopoulos, Widdicks, Duck and Newton 2003). Over the last interval
// C is the Black-Scholes value; on the side of the exercise boundary where exercising pays
// the integral has a closed form, on the other it is taken by Gauss-Legendre panels of the
// previous date's C, tabulated on a fine grid of x and read by four-point interpolation. No
// oscillation in the number of grid points; the error falls like h^4.
#pragma once

#include "contract/trade.hpp"
#include "reference_lattice.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

namespace hedgeleaf::bench {

namespace quadrature_detail {

inline double normal_cdf(double x) { return 0.5 * std::erfc(-x / std::sqrt(2.0)); }

/// Nodes and weights of n-point Gauss-Legendre on [-1, 1] (Newton on the Legendre recurrence).
inline void gauss_legendre(int n, std::vector<double>& nodes, std::vector<double>& weights) {
    nodes.assign(n, 0);
    weights.assign(n, 0);
    for (int i = 0; i < n; ++i) {
        double x = std::cos(M_PI * (i + 0.75) / (n + 0.5)), dp = 0;
        for (int iteration = 0; iteration < 100; ++iteration) {
            double p0 = 1, p1 = x;
            for (int k = 2; k <= n; ++k) {
                const double p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
                p0 = p1;
                p1 = p2;
            }
            dp = n * (x * p1 - p0) / (x * x - 1);
            const double step = p1 / dp;
            x -= step;
            if (std::fabs(step) < 1e-16) break;
        }
        nodes[i] = x;
        weights[i] = 2 / ((1 - x * x) * dp * dp);
    }
}

/// A function tabulated on a uniform grid, read by four-point Lagrange interpolation.
struct table {
    double x0 = 0, h = 0;
    std::vector<double> y;
    double operator()(double x) const {
        const int n = static_cast<int>(y.size());
        const double s = (x - x0) / h;
        const int i = std::clamp(static_cast<int>(std::floor(s)) - 1, 0, n - 4);
        const double t = s - i;  // in [0, 3] inside the grid
        const double a = y[i], b = y[i + 1], c = y[i + 2], d = y[i + 3];
        return -a * (t - 1) * (t - 2) * (t - 3) / 6 + b * t * (t - 2) * (t - 3) / 2 - c * t * (t - 1) * (t - 3) / 2 +
               d * t * (t - 1) * (t - 2) / 6;
    }
};

}  // namespace quadrature_detail

/// A Bermudan call or put (no cash dividends) exercisable on the leg's exercise dates and at
/// expiry, by integration over log spot on a grid of `points` points.
inline double bermudan_by_quadrature(const market_data& m, const option_leg& leg, int points = 8001) {
    using namespace quadrature_detail;
    const bool call = leg.type == payoff_kind::call;
    const double K = leg.strike, sigma = m.volatility, r = m.rate.first_rate(), q = m.carry_yield.first_rate();
    const double mu = r - q - 0.5 * sigma * sigma;
    std::vector<double> dates = leg.exercise_years;
    std::sort(dates.begin(), dates.end());
    const double x_spot = std::log(m.spot), width = 11 * sigma * std::sqrt(leg.expiry_years);
    table c;  // the value of holding on at the current date, on the grid
    c.x0 = x_spot - width;
    c.h = 2 * width / (points - 1);
    c.y.resize(static_cast<std::size_t>(points));
    const auto exercise = [&](double x) { return std::max(call ? std::exp(x) - K : K - std::exp(x), 0.0); };
    const auto x_at = [&](int i) { return c.x0 + i * c.h; };
    std::vector<double> gl_x, gl_w;
    gauss_legendre(8, gl_x, gl_w);

    // The last interval: Black-Scholes.
    const std::size_t last = dates.size() - 1;
    const double tail = leg.expiry_years - dates[last];
    for (int i = 0; i < points; ++i) c.y[i] = black_scholes(call, std::exp(x_at(i)), K, sigma, r, q, tail);

    // E[max(exercise, C)(y)] e^(-r dt) with y ~ N(x + mu dt, sigma^2 dt), given the boundary b.
    const auto hold_value = [&](const table& next, double boundary, bool has_boundary, double x, double dt) {
        const double mean = x + mu * dt, sd = sigma * std::sqrt(dt);
        const double lo = mean - 10 * sd, hi = mean + 10 * sd;
        double value = 0;
        // Where exercising pays: closed form of the payoff against the normal density.
        double from = lo, to = hi;  // the part where holding on pays, integrated numerically
        if (has_boundary) {
            const double forward = std::exp(mean + 0.5 * sd * sd);
            if (call) {
                value +=
                    forward * normal_cdf((mean + sd * sd - boundary) / sd) - K * normal_cdf((mean - boundary) / sd);
                to = std::min(hi, boundary);
            } else {
                value +=
                    K * normal_cdf((boundary - mean) / sd) - forward * normal_cdf((boundary - mean - sd * sd) / sd);
                from = std::max(lo, boundary);
            }
        }
        if (to > from) {
            const int panels = 96;
            const double span = (to - from) / panels;
            for (int p = 0; p < panels; ++p)
                for (std::size_t g = 0; g < gl_x.size(); ++g) {
                    const double y = from + span * (p + 0.5 * (gl_x[g] + 1));
                    const double z = (y - mean) / sd;
                    value += 0.5 * span * gl_w[g] * next(y) * std::exp(-0.5 * z * z) / (sd * std::sqrt(2 * M_PI));
                }
        }
        return std::exp(-r * dt) * value;
    };
    // Where exercising starts to pay at a date whose holding value is `next`.
    const auto boundary_of = [&](const table& next, bool& found) {
        const auto gain = [&](double x) { return exercise(x) - next(x); };
        found = false;
        int i = call ? points - 1 : 0;
        if (!(gain(x_at(i)) > 0)) return 0.0;
        const int step = call ? -1 : 1;
        while (i + step >= 0 && i + step < points && gain(x_at(i + step)) > 0) i += step;
        if (i + step < 0 || i + step >= points) return x_at(i);
        double a = x_at(i), b = x_at(i + step);  // gain(a) > 0 >= gain(b)
        for (int k = 0; k < 200 && std::fabs(b - a) > 1e-15; ++k) {
            const double mid = 0.5 * (a + b);
            (gain(mid) > 0 ? a : b) = mid;
        }
        found = true;
        return 0.5 * (a + b);
    };

    for (std::size_t k = last; k-- > 0;) {
        bool found = false;
        const double boundary = boundary_of(c, found);
        const double dt = dates[k + 1] - dates[k];
        table held = c;
        for (int i = 0; i < points; ++i) held.y[i] = hold_value(c, boundary, found, x_at(i), dt);
        c = held;
    }
    bool found = false;
    const double boundary = boundary_of(c, found);
    return hold_value(c, boundary, found, x_spot, dates[0]);
}

}  // namespace hedgeleaf::bench
