// Hedgeleaf commands: the price command (see price.hpp).
#include "commands/price.hpp"

#include "commands/quote.hpp"

namespace hedgeleaf {

price_settings read_price_settings(const json& document, const trade& t) { return {read_quote_terms(document, t)}; }

json greeks_json(const greeks& g) {
    return json{{"delta", g.delta}, {"gamma", g.gamma}, {"theta", g.theta}, {"vega", g.vega}, {"rho", g.rho}};
}

json write_price_result(const trade& t, const price_settings& settings, const price_result& result) {
    const trade_result& r = result.priced;
    const double q = t.signed_quantity();
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
    if (result.quote)
        out["client_price"] = write_client_price(t, *settings.quote, *result.quote, *result.client, result.outcomes);
    return out;
}

}  // namespace hedgeleaf
