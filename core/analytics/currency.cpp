// Hedgeleaf analytics: currency options as currency desks quote them (see currency.hpp).
#include "analytics/currency.hpp"

#include "analytics/leg_market.hpp"
#include "analytics/strikes.hpp"
#include "contract/errors.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/root_finder.hpp"

#include <cmath>

namespace hedgeleaf {

namespace {

/// Foreign pips are counted in 0.0001 of foreign currency per unit of domestic (docs/currency.md).
constexpr double foreign_pip = 0.0001;

double years_between(const date& from, const date& to) { return year_fraction(from, to); }

}  // namespace

market_data settle_currency_market(const market_data& quoted, currency_terms& terms) {
    const currency_dates& d = terms.dates;
    const double spot_years = years_between(d.trade, d.spot);
    const double delivery_years = years_between(d.trade, d.delivery);
    const double premium_years = years_between(d.trade, d.premium);
    terms.volatility_years = years_between(d.trade, d.expiry);
    // Covered interest parity from the spot date: the forward grows spot at the two rates.
    terms.forward = quoted.spot * terms.domestic.growth(spot_years, delivery_years) /
                    terms.foreign.growth(spot_years, delivery_years);
    terms.discount = terms.domestic.discount(premium_years, delivery_years);
    const double t = terms.volatility_years;
    market_data m = quoted;
    const double rate = -std::log(terms.discount) / t;
    m.rate = curve::flat(rate);
    m.carry_yield = curve::flat(rate - std::log(terms.forward / quoted.spot) / t);
    m.borrow = curve::flat(0);
    m.dividends.clear();
    return m;
}

double forward_points(const currency_terms& terms, double spot) { return (terms.forward - spot) / terms.pair.pip_size; }

forward_view forward_view_of(const market_data& m, double years) {
    return {m.spot, m.forward(years), m.rate.discount(0, years)};
}

double delta_in(delta_convention convention, double value, double spot_delta, const forward_view& f) {
    const double forward_delta = spot_delta * f.spot / (f.discount * f.forward);
    switch (convention) {
        case delta_convention::spot: return spot_delta;
        case delta_convention::forward: return forward_delta;
        case delta_convention::spot_premium_adjusted: return spot_delta - value / f.spot;
        case delta_convention::forward_premium_adjusted: return forward_delta - value / (f.discount * f.forward);
    }
    return spot_delta;
}

double premium_in(premium_convention convention, double value, double spot, double strike, double pip) {
    switch (convention) {
        case premium_convention::domestic_per_foreign: return value;
        case premium_convention::domestic_pips: return value / pip;
        case premium_convention::percent_of_foreign: return 100 * value / spot;
        case premium_convention::percent_of_domestic: return 100 * value / strike;
        case premium_convention::foreign_pips: return value / (spot * strike) / foreign_pip;
    }
    return value;
}

double premium_from(premium_convention convention, double written, double spot, double strike, double pip) {
    // premium_in is linear in the value: divide by its image of 1.
    return written / premium_in(convention, 1.0, spot, strike, pip);
}

double leg_delta_in(const market_data& m, const option_leg& leg, delta_convention convention) {
    const valuation v = closed_form(leg_market(m, leg), leg);
    return delta_in(convention, v.premium, v.sensitivities.delta, forward_view_of(m, leg.expiry_years));
}

double strike_for_currency_delta(const market_data& m, option_leg leg, delta_convention convention, double delta,
                                 const std::string& path) {
    const double forward = m.forward(leg.expiry_years);
    const double reach = 12 * widest_volatility(m) * std::sqrt(leg.expiry_years) + 1;
    double lo = std::log(forward) - reach;
    const double hi = std::min(std::log(forward) + reach, std::log(max_price_level));
    const auto gap = [&](double log_strike) {
        leg.strike = std::exp(log_strike);
        return leg_delta_in(m, leg, convention) - delta;
    };
    const bool adjusted = convention == delta_convention::spot_premium_adjusted ||
                          convention == delta_convention::forward_premium_adjusted;
    if (adjusted && leg.type == payoff_kind::call) {
        // The falling branch starts at the highest delta: find it on a fine grid of strikes.
        constexpr int points = 2000;
        const double spacing = (hi - lo) / points;
        double best = lo, best_gap = gap(lo);
        for (int i = 1; i <= points; ++i) {
            const double x = lo + (hi - lo) * i / points;
            const double g = gap(x);
            if (g > best_gap) best = x, best_gap = g;
        }
        // ... then between the grid's neighbours by golden sections (the delta is smooth there),
        // so that a delta just below the true highest is not refused as out of reach.
        const double step = (std::sqrt(5.0) - 1) / 2;
        double a = std::max(lo, best - spacing), b = std::min(hi, best + spacing);
        double c = b - step * (b - a), d = a + step * (b - a), gc = gap(c), gd = gap(d);
        for (int i = 0; i < 100 && b - a > 1e-15; ++i) {
            if (gc > gd) {
                b = d, d = c, gd = gc, c = b - step * (b - a), gc = gap(c);
            } else {
                a = c, c = d, gc = gd, d = a + step * (b - a), gd = gap(d);
            }
        }
        if (std::max(gc, gd) > best_gap) best_gap = std::max(gc, gd), best = gc > gd ? c : d;
        if (best_gap < 0)
            fail(path, "a premium-adjusted call delta of " + format_number(delta) +
                           " is out of reach: the highest on this market is " + format_number(best_gap + delta));
        lo = best;
    }
    root_options options;
    options.x_tolerance = 1e-13;
    const root_result r = find_root(gap, lo, hi, options);
    if (!r.bracketed)
        fail(path, "no strike between " + format_number(std::exp(lo)) + " and " + format_number(std::exp(hi)) +
                       " has a " + to_string(convention) + " delta of " + format_number(delta) +
                       " (deltas there run from " + format_number(r.f_lower + delta) + " to " +
                       format_number(r.f_upper + delta) + ")");
    return std::exp(r.x);
}

}  // namespace hedgeleaf
