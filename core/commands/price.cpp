// Hedgeleaf commands: the price command (see price.hpp).
#include "commands/price.hpp"

#include "analytics/leg_market.hpp"
#include "commands/currency.hpp"
#include "commands/quote.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>

namespace hedgeleaf {

price_settings read_price_settings(const json& document, const trade& t) { return {read_quote_terms(document, t)}; }

json greeks_json(const greeks& g) {
    return json{{"delta", g.delta}, {"gamma", g.gamma}, {"theta", g.theta}, {"vega", g.vega}, {"rho", g.rho}};
}

namespace {

// The market a leg was priced in: its volatility (and whether the smile was held flat beyond
// its grid) and the curves' averages from today to its expiry, continuously compounded.
json leg_market_json(const market_data& m, const leg_result& lr) {
    const double t = lr.leg.expiry_years;
    return json{{"volatility", lr.volatility.volatility},
                {"volatility_extrapolated", lr.volatility.extrapolated()},
                {"rate", m.rate.average(0, t)},
                {"carry_yield", m.carry_yield.average(0, t)},
                {"borrow", m.borrow.average(0, t)}};
}

}  // namespace

json write_price_result(const trade& t, const price_settings& settings, const price_result& result) {
    const trade_result& r = result.priced;
    const double q = t.signed_quantity();
    const bool detail = shows_market_detail(t);  // a plain trade keeps the result it always had
    json legs = json::array();
    for (const auto& lr : r.legs) {
        json leg{{"type", to_string(lr.leg.type)},
                 {"quantity", lr.leg.quantity},
                 {"premium", lr.lattice.premium},
                 {"greeks", greeks_json(lr.lattice.sensitivities)},
                 {"closed_form_premium", lr.reference.premium},
                 {"error_estimate", lr.lattice.error_estimate}};
        if (lr.leg.type != payoff_kind::stock) {
            leg["strike"] = lr.leg.strike;
            leg["expiry_years"] = lr.leg.expiry_years;
            leg["exercise"] = to_string(lr.leg.exercise);
            if (detail) {
                leg["strike_percent_of_spot"] = 100 * lr.leg.strike / t.market.spot;
                leg["market"] = leg_market_json(t.market, lr);
                const strike_terms& given = lr.leg.strike_given;
                if (given.form != strike_form::price)
                    leg["strike_written"] = {{"form", strike_forms[static_cast<int>(given.form) - 1]},
                                             {"value", given.value},
                                             {"before_rounding", given.unrounded}};
            }
        }
        legs.push_back(leg);
    }
    json out{
        {"premium", r.premium},
        {"greeks", greeks_json(r.sensitivities)},
        {"closed_form", {{"premium", r.reference.premium}, {"greeks", greeks_json(r.reference.sensitivities)}}},
        {"early_exercise_premium", r.has_early_exercise ? json(r.early_exercise_premium) : json(nullptr)},
        {"lattice",
         {{"method", to_string(r.method)},
          {"steps", r.steps},
          {"coarse_steps", r.coarse_steps},
          {"extrapolated", r.extrapolated},
          {"error_estimate", r.error_estimate}}},
        {"replication",
         {{"spot", r.replication.spot},
          {"shares", r.replication.shares},
          {"cash", r.replication.cash},
          {"value", r.replication.value}}},
        {"position",
         {{"quantity", t.quantity},
          {"side", t.client_sells ? "sell" : "buy"},
          {"premium", q * r.premium},
          {"greeks", greeks_json(q * r.sensitivities)}}},
        {"legs", legs},
        {"spot", t.market.spot},
        {"expiry_years", t.final_expiry_years()},
    };
    // What the lattices say (not extrapolated and why, a fallback, rough Greeks), each line once.
    json notes = json::array();
    for (const auto& lr : r.legs)
        for (const auto& note : lr.lattice.notes)
            if (std::find(notes.begin(), notes.end(), note) == notes.end()) notes.push_back(note);
    out["notes"] = notes;
    if (detail) {
        out["market"] = {{"as_of", t.market.as_of.empty() ? json(nullptr) : json(t.market.as_of)},
                         {"underlying", t.market.underlying.empty() ? json(nullptr) : json(t.market.underlying)},
                         {"smile", t.market.smile != nullptr},
                         {"rates",
                          "leg rate, carry_yield and borrow: averages of the continuously compounded "
                          "curves (ACT/365F) from today to the leg's expiry"}};
        if (t.strike_tick) out["strike_tick"] = *t.strike_tick;
    }
    if (t.currency) out["currency"] = write_currency_section(t, r);
    if (result.quote)
        out["client_price"] = write_client_price(t, *settings.quote, *result.quote, *result.client, result.outcomes);
    return out;
}

void add_price_comparison(json& out, const premium_comparison& c, const std::string& card,
                          const std::string& steps_field, int steps) {
    out["price_premium"] = c.price_premium;
    out["difference_from_price"] = c.difference();
    if (!(std::fabs(c.difference()) >= 5e-5 * std::max(1.0, std::fabs(c.price_premium)))) return;
    if (!out.contains("notes") || !out["notes"].is_array()) out["notes"] = json::array();
    const auto shown = [](double x) {  // six significant digits: the note is read, not computed with
        char buf[32];
        std::snprintf(buf, sizeof buf, "%.6g", x);
        return std::string(buf);
    };
    out["notes"].push_back(card + " values the trade today at " + shown(c.card_premium) + " on its " +
                           std::to_string(steps) + "-step lattice (" + steps_field + "), " +
                           shown(std::fabs(c.difference())) + (c.difference() > 0 ? " above" : " below") +
                           " the price command's premium " + shown(c.price_premium) + "; more steps bring it closer");
}

}  // namespace hedgeleaf
