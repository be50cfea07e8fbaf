// Shared builders for the Catch2 tests: a market and one leg in a line.
#pragma once

#include "trade.hpp"

namespace hedgeleaf::testing {

inline market_data market(double spot, double vol, double rate, double carry = 0) {
    return flat_market(spot, vol, rate, carry);
}

inline option_leg make_leg(payoff_kind type, double strike, double expiry,
                           exercise_style ex = exercise_style::european, double payout = 1) {
    return single_leg(type, strike, expiry, ex, payout);
}

}  // namespace hedgeleaf::testing
