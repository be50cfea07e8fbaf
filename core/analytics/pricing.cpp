// Hedgeleaf analytics: trade-level pricing (see pricing.hpp).
#include "analytics/pricing.hpp"

#include "analytics/leg_market.hpp"

#include <cmath>
#include <cstddef>
#include <vector>

namespace hedgeleaf {

namespace {

/// A leg priced once, with everything its price depends on.
struct priced_leg {
    market_data market;
    option_leg leg;  ///< quantity 1: a leg's price is per unit
    lattice_settings settings;
    bumped_greeks bumps;
    error_bound bound;
    lattice_price price;
};

/// One trade, one premium, priced once: the price, profile, hedge schedule and ladder of one
/// edit each need the trade's premium, and an engine that runs several of them for the same
/// trade (a page worker runs the profile, schedule and ladder in turn) prices each leg once.
/// The last few legs are remembered; a price depends on its inputs alone, so a remembered one
/// is the same to the last bit. One memory per thread (a page worker is one thread).
lattice_price price_leg_once(const market_data& m, const option_leg& leg, const lattice_settings& settings,
                             bumped_greeks bumps, error_bound bound) {
    constexpr std::size_t remembered = 16;
    thread_local std::vector<priced_leg> memory;
    thread_local std::size_t next = 0;
    option_leg unit = leg;
    unit.quantity = 1;
    for (const priced_leg& p : memory)
        if (p.bumps == bumps && p.bound == bound && p.settings == settings && p.leg == unit && p.market == m)
            return p.price;
    lattice_price price = price_leg(m, unit, settings, bumps, bound);
    priced_leg entry{m, unit, settings, bumps, bound, price};
    if (memory.size() < remembered) {
        memory.push_back(std::move(entry));
    } else {
        memory[next] = std::move(entry);
        next = (next + 1) % remembered;
    }
    return price;
}

}  // namespace

trade_result price_trade(const trade& t, bumped_greeks bumps, error_bound estimate) {
    trade_result out;
    out.method = t.lattice.method;
    for (const auto& leg : t.legs) {
        leg_result lr;
        lr.leg = leg;
        const market_data m = leg_market(t.market, leg);
        lr.volatility = leg_volatility(t.market, leg);
        lr.lattice = price_leg_once(m, leg, t.lattice, bumps, estimate);
        lr.reference = closed_form(m, leg);
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
