// Hedgeleaf analytics: no-arbitrage checks on a volatility grid.
//
// Two static-arbitrage conditions, checked on the grid's own points (the reader refuses a grid
// that fails either, naming the cell):
//   calendar:  along each column of the grid (a fixed strike coordinate: fixed moneyness in the
//              grid's basis) total variance vol^2 x years must not fall from one expiry to the
//              next; if it did, a longer option would be worth less than a shorter one at the
//              same moneyness (a calendar spread for less than nothing);
//   butterfly: along each expiry, the Black-Scholes-Merton call prices at the grid's strikes
//              (with the market's rates, yields, borrow and dividends) must fall with the strike
//              no faster than the discount factor, -discount <= dC/dK <= 0, and be convex in the
//              strike (a butterfly costs at least nothing).
// Both are textbook no-arbitrage bounds (e.g. J. Gatheral, The Volatility Surface, Wiley 2006,
// ch. 2; from memory). Prices within 1e-9 of spot count as equal.
#pragma once

#include "contract/trade.hpp"

#include <cstddef>
#include <optional>
#include <string>

namespace hedgeleaf {

/// The first cell found to break a condition (expiry row by row, strikes left to right).
struct smile_violation {
    std::size_t row = 0, column = 0;  ///< the cell to change, 0-based (vols[row][column])
    /// What is wrong with the cell, with the two values involved and what would fix it; the
    /// reader puts the cell's field path in front (market.volatility.vols[row][column]).
    std::string problem;
};

/// The first arbitrage in `market`'s smile, or none (a market without a smile has none).
std::optional<smile_violation> find_smile_arbitrage(const market_data& market);

}  // namespace hedgeleaf
