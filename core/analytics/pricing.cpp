// Hedgeleaf analytics: trade-level pricing (see pricing.hpp).
#include "analytics/pricing.hpp"

#include <cmath>

namespace hedgeleaf {

trade_result price_trade(const trade& t, bumped_greeks bumps, error_bound estimate) {
    trade_result out;
    out.method = t.lattice.method;
    for (const auto& leg : t.legs) {
        leg_result lr;
        lr.leg = leg;
        lr.lattice = price_leg(t.market, leg, t.lattice, bumps, estimate);
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

premium_comparison compare_with_price(const trade& t, double card_premium) {
    return {price_trade(t, bumped_greeks::off).premium, card_premium};
}

}  // namespace hedgeleaf
