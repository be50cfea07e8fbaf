// Hedgeleaf analytics: no-arbitrage checks on a volatility grid (see smile_checks.hpp).
#include "analytics/smile_checks.hpp"

#include "contract/errors.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/root_finder.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

namespace hedgeleaf {

namespace {

std::string cell(std::size_t i, std::size_t j) { return "vols[" + std::to_string(i) + "][" + std::to_string(j) + "]"; }

// Volatilities in messages: 4 decimals, rounded the way that makes the suggested fix work.
std::string vol_up(double v) { return format_number(std::ceil(v * 1e4) / 1e4); }
std::string vol_down(double v) { return format_number(std::floor(v * 1e4) / 1e4); }
std::string vol_text(double v) { return format_number(std::round(v * 1e6) / 1e6); }
std::string price_text(double p) { return format_number(std::round(p * 1e6) / 1e6); }

/// The absolute strike of grid column j at expiry row i.
double absolute_strike(const market_data& m, std::size_t i, std::size_t j) {
    const smile_grid& g = m.smile->grid();
    const double x = g.strikes[j];
    if (g.basis == strike_basis::percent_of_spot) return x / 100 * m.smile_spot;
    if (g.basis == strike_basis::percent_of_forward) return x / 100 * m.forward(g.expiries[i], m.smile_spot);
    return x * (m.smile_spot / g.spot);
}

double call_price(const market_data& m, double strike, double years, double vol) {
    market_data at = m;
    at.volatility = vol;
    return closed_form(at, single_leg(payoff_kind::call, strike, years)).premium;
}

/// The volatility at which the call is worth `price`, if one in (0, max_volatility] does.
std::optional<double> implied(const market_data& m, double strike, double years, double price) {
    const root_result r =
        find_root([&](double v) { return call_price(m, strike, years, v) - price; }, 1e-4, max_volatility);
    if (!r.bracketed) return std::nullopt;
    return r.x;
}

std::optional<smile_violation> calendar_at(const smile_grid& g, std::size_t i, std::size_t j) {
    const double v0 = g.vols[i - 1][j], v1 = g.vols[i][j];
    const double t0 = g.expiries[i - 1], t1 = g.expiries[i];
    const double w0 = v0 * v0 * t0, w1 = v1 * v1 * t1;
    if (!(w1 < w0 * (1 - 1e-12))) return std::nullopt;
    return smile_violation{
        i, j,
        "total variance " + vol_text(w1) + " (volatility " + vol_text(v1) + " over " + vol_text(t1) +
            " years) is below " + vol_text(w0) + ", that of " + cell(i - 1, j) + " (" + vol_text(v0) + " over " +
            vol_text(t0) +
            " years) in the same strike column: total variance must not fall with maturity (calendar "
            "arbitrage); raise this volatility to at least " +
            vol_up(std::sqrt(w0 / t1)) + " or lower " + cell(i - 1, j)};
}

// "lower this volatility to at most 0.2213 or raise vols[0][1]": the volatility that would
// just remove the arbitrage, when one does.
std::string fix(bool lower, const std::optional<double>& vol, const std::string& other) {
    std::string out = lower ? "lower this volatility" : "raise this volatility";
    if (vol) out += lower ? " to at most " + vol_down(*vol) : " to at least " + vol_up(*vol);
    return out + " or " + other;
}

std::optional<smile_violation> butterfly_in_row(const market_data& m, std::size_t i) {
    const smile_grid& g = m.smile->grid();
    const std::size_t n = g.strikes.size();
    const double years = g.expiries[i];
    const double discount = m.rate.discount(0, years);
    std::vector<double> k(n), c(n);
    for (std::size_t j = 0; j < n; ++j) {
        k[j] = absolute_strike(m, i, j);
        c[j] = call_price(m, k[j], years, g.vols[i][j]);
    }
    // Rounding of the prices themselves is no arbitrage: a tolerance of a part in 1e9 of spot, or
    // of a few parts in 1e13 of the dearest call where a far forward makes calls worth far more
    // (a flat grid at a 20-year expiry and a rate-carry gap of 2 was refused on 1e-16 noise).
    const double eps = std::max(1e-9 * m.smile_spot, 1e-12 * *std::max_element(c.begin(), c.end()));
    const auto strike_words = [&](std::size_t j) { return "the call at strike " + price_text(k[j]); };
    for (std::size_t j = 0; j + 1 < n; ++j) {
        const double gap = k[j + 1] - k[j];
        if (c[j + 1] > c[j] + eps)
            return smile_violation{i, j + 1,
                                   strike_words(j + 1) + " is worth " + price_text(c[j + 1]) + ", more than " +
                                       price_text(c[j]) + " at the lower strike " + price_text(k[j]) + " (" +
                                       cell(i, j) + "), by " + format_number(c[j + 1] - c[j]) +
                                       ": a call must not gain value as its strike rises (butterfly arbitrage); " +
                                       fix(true, implied(m, k[j + 1], years, c[j]), "raise " + cell(i, j))};
        if (c[j] - c[j + 1] > discount * gap + eps)
            return smile_violation{
                i, j + 1,
                strike_words(j + 1) + " is worth " + price_text(c[j + 1]) + ", less than " +
                    price_text(c[j] - discount * gap) + " = the call at " + price_text(k[j]) + " (" + cell(i, j) +
                    ") less the discounted strike gap, short by " + format_number(c[j] - discount * gap - c[j + 1]) +
                    ": a call must not fall faster than the discount factor " + price_text(discount) +
                    " per unit of strike (butterfly arbitrage); " +
                    fix(false, implied(m, k[j + 1], years, c[j] - discount * gap), "lower " + cell(i, j))};
    }
    for (std::size_t j = 1; j + 1 < n; ++j) {
        const double chord = c[j - 1] + (c[j + 1] - c[j - 1]) * (k[j] - k[j - 1]) / (k[j + 1] - k[j - 1]);
        if (c[j] > chord + eps)
            return smile_violation{
                i, j,
                strike_words(j) + " is worth " + price_text(c[j]) + ", above " + price_text(chord) +
                    " on the straight line between its neighbours at " + price_text(k[j - 1]) + " and " +
                    price_text(k[j + 1]) + " (" + cell(i, j - 1) + ", " + cell(i, j + 1) +
                    "): call prices must be convex in the strike, or a butterfly would cost less than nothing "
                    "(butterfly arbitrage); " +
                    fix(true, implied(m, k[j], years, chord), "raise its neighbours")};
    }
    return std::nullopt;
}

}  // namespace

std::optional<smile_violation> find_smile_arbitrage(const market_data& market) {
    if (!market.smile) return std::nullopt;
    const smile_grid& g = market.smile->grid();
    for (std::size_t i = 0; i < g.expiries.size(); ++i) {
        if (auto v = butterfly_in_row(market, i)) return v;
        if (i == 0) continue;
        for (std::size_t j = 0; j < g.strikes.size(); ++j)
            if (auto v = calendar_at(g, i, j)) return v;
    }
    return std::nullopt;
}

}  // namespace hedgeleaf
