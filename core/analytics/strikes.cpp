// Hedgeleaf analytics: strikes the way desks say them (see strikes.hpp).
#include "analytics/strikes.hpp"

#include "analytics/leg_market.hpp"
#include "contract/errors.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/root_finder.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

double widest_volatility(const market_data& m) {
    double v = m.volatility;
    if (m.smile)
        for (const auto& row : m.smile->grid().vols)
            for (double x : row) v = std::max(v, x);
    return v + std::max(0.0, m.smile_shift);
}

namespace {

double strike_for_delta(const market_data& m, option_leg leg, double delta, const std::string& path) {
    const bool call = leg.type == payoff_kind::call;
    const double edge = std::exp(-m.carry_average(0, leg.expiry_years) * leg.expiry_years);  // |delta| < e^(-qT)
    if (!(std::fabs(delta) < edge)) {
        // the range appended, not "0 and " + ...: GCC 12 warns falsely (-Wrestrict) on a literal + temporary
        std::string range = call ? "0 and " : "-";
        range += format_number(edge);
        if (!call) range += " and 0";
        fail(path, "a delta of " + format_number(delta) + " is out of reach: the spot delta of a " +
                       std::string(call ? "call" : "put") + " to this expiry lies strictly between " + range);
    }
    const double forward = m.forward(leg.expiry_years);
    const double reach = 12 * widest_volatility(m) * std::sqrt(leg.expiry_years) + 1;
    const auto gap = [&](double log_strike) {
        leg.strike = std::exp(log_strike);
        return spot_delta(m, leg) - delta;
    };
    root_options options;
    options.x_tolerance = 1e-13;
    const double lo = std::log(forward) - reach, hi = std::min(std::log(forward) + reach, std::log(max_price_level));
    const root_result r = find_root(gap, lo, hi, options);
    if (!r.bracketed)
        fail(path, "no strike between " + format_number(std::exp(lo)) + " and " + format_number(std::exp(hi)) +
                       " has a spot delta of " + format_number(delta) + " on this smile (deltas there run from " +
                       format_number(r.f_lower + delta) + " to " + format_number(r.f_upper + delta) + ")");
    return std::exp(r.x);
}

}  // namespace

double spot_delta(const market_data& market, const option_leg& leg) {
    return closed_form(leg_market(market, leg), leg).sensitivities.delta;
}

double strike_from_terms(const market_data& m, const option_leg& leg, const strike_terms& given,
                         const std::string& path) {
    switch (given.form) {
        case strike_form::price: return given.value;
        case strike_form::percent_of_spot: return given.value / 100 * m.spot;
        case strike_form::percent_of_forward: return given.value / 100 * m.forward(leg.expiry_years);
        case strike_form::delta: return strike_for_delta(m, leg, given.value, path);
    }
    return given.value;
}

double round_to_tick(double strike, double tick) {
    const double rounded = std::round(strike / tick) * tick;
    // Tidy to two decimals finer than the tick's own (a tick of 0.05: 8 decimals at most).
    const double scale = std::pow(10.0, std::clamp(std::ceil(-std::log10(tick)) + 2, 0.0, 12.0));
    return std::fabs(rounded * scale) < 1e15 ? std::round(rounded * scale) / scale : rounded;
}

}  // namespace hedgeleaf
