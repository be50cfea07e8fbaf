// Hedgeleaf benchmarks: an independent reference for American and Bermudan options.
//
// Not the engine's lattice: a plain Cox-Ross-Rubinstein induction written out here, with the
// Black-Scholes value over the last step (Broadie and Detemple 1996, "BBS") and Richardson
// extrapolation 2 V(2N) - V(N) ("BBSR"). Smoothing the last step removes the odd-even
// oscillation of a plain lattice, so the error falls like 1/N and the extrapolation is reliable.
// Bermudan dates must be multiples of T / N (the caller picks N to make them so). Flat rates only.
#pragma once

#include "contract/trade.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

namespace hedgeleaf::bench {

/// Black-Scholes value of a European call or put (no cash dividends), written out here.
inline double black_scholes(bool call, double s, double k, double vol, double rate, double carry, double t) {
    const double v = vol * std::sqrt(t);
    const double d1 = (std::log(s / k) + (rate - carry + 0.5 * vol * vol) * t) / v;
    const double d2 = d1 - v;
    const auto cdf = [](double x) { return 0.5 * std::erfc(-x / std::sqrt(2.0)); };
    const double df_r = std::exp(-rate * t), df_q = std::exp(-carry * t);
    return call ? s * df_q * cdf(d1) - k * df_r * cdf(d2) : k * df_r * cdf(-d2) - s * df_q * cdf(-d1);
}

/// One BBS lattice of `steps` steps: American (every step) or Bermudan (the rows of the leg's
/// exercise dates, which must fall on rows) call or put on a market without cash dividends.
/// Nodes more than 8 sqrt(n) + 2 up-moves from the mean of row n under both the pricing and
/// the share measure are not swept: a path reaches them with probability below 1e-50
/// (Hoeffding 1963), and they read as their exercise value (or 0 for a European row).
inline double bbs_price(const market_data& m, const option_leg& leg, int steps) {
    const bool call = leg.type == payoff_kind::call;
    const double T = leg.expiry_years, dt = T / steps;
    const double u = std::exp(m.volatility * std::sqrt(dt));
    const double growth = std::exp((m.rate.first_rate() - m.carry_yield.first_rate()) * dt);
    const double p = (growth - 1 / u) / (u - 1 / u);
    const double p_share = p * u / growth;
    const double df = std::exp(-m.rate.first_rate() * dt);
    const double pu = df * p, pd = df * (1 - p);
    std::vector<char> allowed(static_cast<std::size_t>(steps) + 1, leg.exercise == exercise_style::american);
    for (double t : leg.exercise_years) allowed[static_cast<std::size_t>(std::lround(t / dt))] = 1;
    // spot(n, i) = S u^(2i - n): a table of u^k, k in [-steps, steps].
    std::vector<double> power(2 * static_cast<std::size_t>(steps) + 1);
    for (int k = -steps; k <= steps; ++k)
        power[static_cast<std::size_t>(k + steps)] = m.spot * std::exp(k * std::log(u));
    const auto spot = [&](int n, int i) { return power[static_cast<std::size_t>(2 * i - n + steps)]; };
    const auto exercise = [&](double s) { return std::max(call ? s - leg.strike : leg.strike - s, 0.0); };
    const auto band = [&](int n, int& lo, int& hi) {
        const double t = 8 * std::sqrt(static_cast<double>(n)) + 2;
        lo = std::max(0, static_cast<int>(std::floor(n * std::min(p, p_share) - t)));
        hi = std::min(n, static_cast<int>(std::ceil(n * std::max(p, p_share) + t)));
    };
    std::vector<double> v(static_cast<std::size_t>(steps) + 1, 0.0);
    const int last = steps - 1;
    int lo = 0, hi = 0;
    band(last, lo, hi);
    for (int i = lo; i <= hi; ++i) {
        const double s = spot(last, i);
        v[i] = black_scholes(call, s, leg.strike, m.volatility, m.rate.first_rate(), m.carry_yield.first_rate(), dt);
        if (allowed[last]) v[i] = std::max(v[i], exercise(s));
    }
    for (int n = last - 1; n >= 0; --n) {
        const int below_lo = lo, below_hi = hi;
        band(n, lo, hi);
        // Neighbours outside the band of row n + 1: their exercise value (what a path there gets at least).
        for (int j = lo; j <= hi + 1; ++j)
            if (j < below_lo || j > below_hi) v[j] = allowed[n + 1] ? exercise(spot(n + 1, j)) : 0.0;
        for (int i = lo; i <= hi; ++i) {
            const double hold = pu * v[i + 1] + pd * v[i];
            v[i] = allowed[n] ? std::max(hold, exercise(spot(n, i))) : hold;
        }
    }
    return v[0];
}

/// BBSR: 2 V(2N) - V(N).
inline double bbsr_price(const market_data& m, const option_leg& leg, int steps) {
    return 2 * bbs_price(m, leg, 2 * steps) - bbs_price(m, leg, steps);
}

}  // namespace hedgeleaf::bench
