// Hedgeleaf core: trade-level pricing and its JSON result.
#include "pricer.hpp"

#include <cmath>

namespace hedgeleaf {

namespace {
trade_result price_with(const trade& t, bool with_bumps) {
    trade_result out;
    out.method = t.lattice.method;
    for (const auto& leg : t.legs) {
        leg_result lr;
        lr.leg = leg;
        lr.lattice = with_bumps ? price_on_lattice(t.market, leg, t.lattice)
                                : price_lattice_only(t.market, leg, t.lattice);
        lr.reference = closed_form(t.market, leg);
        out.premium += leg.quantity * lr.lattice.premium;
        out.sensitivities = out.sensitivities + leg.quantity * lr.lattice.sensitivities;
        out.reference.premium += leg.quantity * lr.reference.premium;
        out.reference.sensitivities = out.reference.sensitivities + leg.quantity * lr.reference.sensitivities;
        out.error_estimate += std::fabs(leg.quantity) * lr.lattice.error_estimate;
        if (leg.type != payoff_kind::stock) {
            out.steps = lr.lattice.steps;
            out.coarse_steps = lr.lattice.coarse_steps;
            out.extrapolated = lr.lattice.extrapolated;
        }
        if (leg.exercise != exercise_style::european) out.has_early_exercise = true;
        out.legs.push_back(lr);
    }
    out.early_exercise_premium = out.has_early_exercise ? out.premium - out.reference.premium : 0.0;
    out.replication.spot = t.market.spot;
    out.replication.value = out.premium;
    out.replication.shares = out.sensitivities.delta;
    out.replication.cash = out.premium - out.sensitivities.delta * t.market.spot;
    return out;
}
}  // namespace

trade_result price_trade(const trade& t) { return price_with(t, true); }
trade_result price_trade_fast(const trade& t) { return price_with(t, false); }

json greeks_json(const greeks& g) {
    return json{{"delta", g.delta}, {"gamma", g.gamma}, {"theta", g.theta}, {"vega", g.vega}, {"rho", g.rho}};
}

json price_result_json(const trade& t, const trade_result& r) {
    const double q = t.signed_quantity();
    json legs = json::array();
    for (const auto& lr : r.legs) {
        json leg{{"type", to_string(lr.leg.type)}, {"quantity", lr.leg.quantity}, {"premium", lr.lattice.premium},
                 {"greeks", greeks_json(lr.lattice.sensitivities)}, {"closed_form_premium", lr.reference.premium},
                 {"error_estimate", lr.lattice.error_estimate}};
        if (lr.leg.type != payoff_kind::stock) {
            leg["strike"] = lr.leg.strike;
            leg["expiry_years"] = lr.leg.expiry;
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
         {{"method", to_string(r.method)}, {"steps", r.steps}, {"coarse_steps", r.coarse_steps},
          {"extrapolated", r.extrapolated}, {"error_estimate", r.error_estimate}}},
        {"replication",
         {{"spot", r.replication.spot}, {"shares", r.replication.shares}, {"cash", r.replication.cash},
          {"value", r.replication.value}}},
        {"position",
         {{"quantity", t.quantity}, {"side", t.client_sells ? "sell" : "buy"}, {"premium", q * r.premium},
          {"greeks", greeks_json(q * r.sensitivities)}}},
        {"legs", legs},
        {"spot", t.market.spot},
        {"expiry_years", t.final_expiry()},
    };
    return out;
}

}  // namespace hedgeleaf
