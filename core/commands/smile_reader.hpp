// Hedgeleaf commands: reading a volatility grid (market.volatility as an object).
//
//   {"expiries": [0.25, "2027-06-18", "1y"], "strikes": [90, 100, 110],
//    "strike_basis": "percent_of_spot", "vols": [[0.26, 0.22, 0.20], ...]}
// or the same grid as table text: {"table": "expiry\t90\t100\t110\n3m\t0.26\t0.22\t0.20\n...",
// "strike_basis": ...} (commands/market_table.hpp). Rows are expiries, columns strikes.
// Each fault has its own message naming the cell (market.volatility.vols[1][2], or the
// table's line and column): an empty or ragged grid, expiries or strikes out of order or
// repeated, a volatility that is not positive or too large, and calendar or butterfly
// arbitrage (analytics/smile_checks.hpp).
#pragma once

#include "commands/market_reader.hpp"

namespace hedgeleaf {

/// Read the grid at `path` into `m.smile` (rates, yields, borrow and dividends of `m` read
/// first: the checks price calls). Sets m.volatility to the smile's at-the-money-forward
/// volatility at its last expiry until the trade's legs choose their own.
void read_smile(const json& node, const std::string& path, const years_reader& times, market_data& m);

}  // namespace hedgeleaf
