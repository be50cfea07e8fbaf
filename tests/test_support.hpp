// Shared builders for the Catch2 tests: a market and one leg in a line.
#pragma once

#include "trade.hpp"

namespace hedgeleaf::testing {

inline market_data market(double spot, double vol, double rate, double carry = 0) {
    market_data m;
    m.spot = spot;
    m.volatility = vol;
    m.rate = rate;
    m.carry_yield = carry;
    return m;
}

inline option_leg make_leg(payoff_kind type, double strike, double expiry,
                           exercise_style ex = exercise_style::european, double payout = 1) {
    option_leg leg;
    leg.type = type;
    leg.strike = strike;
    leg.expiry = expiry;
    leg.exercise = ex;
    leg.payout = payout;
    return leg;
}

}  // namespace hedgeleaf::testing
