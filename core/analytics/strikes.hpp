// Hedgeleaf analytics: strikes the way desks say them.
//
// A strike may be written as a price, as a percentage of spot, as a percentage of the forward
// to the leg's own expiry (market_data::forward: spot net of the dividends paid by then, grown
// at rate - carry_yield - borrow), or as a spot delta: the strike at which the
// Black-Scholes-Merton delta dV/dS of the European option, at the smile's volatility for that
// strike, equals the number written (a 25-delta put is -0.25, a 25-delta call 0.25; common desk
// practice, without the smile's own slope). Derived strikes round to the trade's strike_tick.
#pragma once

#include "contract/trade.hpp"

#include <string>

namespace hedgeleaf {

/// The strike of `leg` (its type and expiry) written as `given`, before rounding. Throws
/// input_error naming `path` when no strike has that delta on this smile.
double strike_from_terms(const market_data& market, const option_leg& leg, const strike_terms& given,
                         const std::string& path);

/// The spot delta of `leg` as a European option at its own volatility (for strikes by delta).
double spot_delta(const market_data& market, const option_leg& leg);

/// The highest volatility anywhere on the market (the smile's highest cell, shifted): the
/// width of a strike search.
double widest_volatility(const market_data& m);

/// `strike` rounded to the nearest multiple of `tick` (tidy decimals: 102.5, not 102.50000000001).
double round_to_tick(double strike, double tick);

}  // namespace hedgeleaf
