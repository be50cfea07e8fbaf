// Hedgeleaf analytics: the market each leg is priced in (see leg_market.hpp).
#include "analytics/leg_market.hpp"

#include "contract/errors.hpp"
#include "numerics/closed_form.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

smile_point leg_volatility(const market_data& market, const option_leg& leg) {
    if (leg.volatility) return {*leg.volatility};
    if (leg.type == payoff_kind::stock) return {market.volatility};
    return market.volatility_at(leg.strike, leg.expiry_years);
}

market_data leg_market(const market_data& market, const option_leg& leg) {
    market_data out = market;
    out.volatility = leg_volatility(market, leg).volatility;
    return out;
}

std::vector<option_leg> with_fixed_volatilities(const market_data& market, std::vector<option_leg> legs) {
    if (!market.smile) return legs;
    for (auto& leg : legs)
        if (leg.type != payoff_kind::stock && !leg.volatility) leg.volatility = leg_volatility(market, leg).volatility;
    return legs;
}

trade with_fixed_volatilities(const trade& t) {
    trade out = t;
    out.legs = with_fixed_volatilities(t.market, t.legs);
    return out;
}

double shared_volatility(const market_data& market, const std::vector<option_leg>& legs) {
    std::vector<double> vols, weights;
    for (const auto& leg : legs) {
        if (leg.type == payoff_kind::stock) continue;
        const market_data m = leg_market(market, leg);
        vols.push_back(m.volatility);
        weights.push_back(std::fabs(leg.quantity * closed_form(m, leg).sensitivities.vega));
    }
    if (vols.empty()) return market.volatility;
    // Written as the first volatility plus weighted differences: legs at one volatility give
    // exactly that volatility.
    double total = 0, moved = 0;
    for (std::size_t i = 0; i < vols.size(); ++i) {
        total += weights[i];
        moved += weights[i] * (vols[i] - vols[0]);
    }
    if (!(total > 0)) {  // no leg has vega (deep digitals): the plain average
        total = static_cast<double>(vols.size());
        moved = 0;
        for (double v : vols) moved += v - vols[0];
    }
    return vols[0] + moved / total;
}

volatility_span leg_volatility_span(const market_data& market, const std::vector<option_leg>& legs) {
    volatility_span out{market.volatility, market.volatility};
    bool first = true;
    for (const auto& leg : legs) {
        if (leg.type == payoff_kind::stock) continue;
        const double v = leg_volatility(market, leg).volatility;
        out.lowest = first ? v : std::min(out.lowest, v);
        out.highest = first ? v : std::max(out.highest, v);
        first = false;
    }
    return out;
}

bool shows_market_detail(const trade& t) {
    if (!t.market.is_plain() || t.strike_tick || !t.market.as_of.empty()) return true;
    return std::any_of(t.legs.begin(), t.legs.end(),
                       [](const option_leg& l) { return l.strike_given.form != strike_form::price; });
}

std::string delta_volatility_note(const trade& t) {
    if (!t.market.smile) return "";
    std::string vols;
    for (std::size_t i = 0; i < t.legs.size(); ++i) {
        if (t.legs[i].type == payoff_kind::stock) continue;
        vols += (vols.empty() ? "" : ", ") + std::string("legs[") + std::to_string(i) + "] " +
                format_number(std::round(leg_volatility(t.market, t.legs[i]).volatility * 1e6) / 1e6);
    }
    return "each leg's value and delta use its own volatility from today's smile at its strike and expiry (" + vols +
           "), held as time passes (the smile does not move with spot or time here)";
}

std::string shared_lattice_note(const trade& t) {
    if (!t.market.smile) return "";
    return "one lattice carries one volatility: " + format_number(std::round(t.market.volatility * 1e6) / 1e6) +
           ", the legs' own smile volatilities weighted by |quantity x vega| (a single option: its own), so the "
           "lattice's premium is near the sum of the legs priced alone; the price command prices each leg at its own";
}

}  // namespace hedgeleaf
