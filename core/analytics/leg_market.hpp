// Hedgeleaf analytics: the market each leg is priced in (its own volatility on the smile).
//
// With a volatility smile every option leg is priced at the smile's volatility for its own
// strike and expiry; with one volatility every leg shares it. The rate, yield and borrow of a
// leg are the curves' averages to its expiry (numerics/closed_form.hpp). Views that move time
// (hedge schedules, simulations, time ladders, the profile's later expiries) hold each leg at
// today's volatility for its strike and expiry: the smile is today's, not a model of how it
// will move.
#pragma once

#include "contract/trade.hpp"

#include <vector>

namespace hedgeleaf {

/// The volatility `leg` is priced at: its own when fixed, else the market's for its strike and
/// expiry (the smile's, or the one number). A stock leg gets market.volatility.
smile_point leg_volatility(const market_data& market, const option_leg& leg);

/// `market` with `volatility` set to the leg's: what the closed form and the lattice price it in.
market_data leg_market(const market_data& market, const option_leg& leg);

/// The legs with their volatilities fixed at today's (no change without a smile).
std::vector<option_leg> with_fixed_volatilities(const market_data& market, std::vector<option_leg> legs);
/// The trade with its legs' volatilities fixed at today's (no change without a smile).
trade with_fixed_volatilities(const trade& t);

/// One volatility for a lattice shared by all legs (the tree, a lattice hedge path, the
/// simulation's tables of American legs): the legs' own volatilities weighted by
/// |quantity x vega|, so the shared lattice's premium is near the sum of the legs priced
/// alone. A single option leg: its own volatility; legs at one volatility: that volatility.
double shared_volatility(const market_data& market, const std::vector<option_leg>& legs);

/// The lowest and highest volatility of the option legs.
struct volatility_span {
    double lowest = 0, highest = 0;
};
volatility_span leg_volatility_span(const market_data& market, const std::vector<option_leg>& legs);

/// True when the trade uses a smile, a curve, a borrow fee, a strike written as a percentage
/// or a delta, a strike_tick or a dated market (as_of): its results then also show the market
/// each leg used. A trade written without any of them keeps the result it always had.
bool shows_market_detail(const trade& t);

/// The sentence a result gives about the volatility its deltas use, or "" for a plain market.
std::string delta_volatility_note(const trade& t);
/// The sentence a result gives about its shared lattice's volatility, or "" without a smile.
std::string shared_lattice_note(const trade& t);

}  // namespace hedgeleaf
