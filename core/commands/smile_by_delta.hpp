// Hedgeleaf commands: a currency pair's smile quoted by delta (docs/currency.md).
//
//   market.volatility = {"quotes_by_delta": [
//       {"expiry": "1m", "atm": 0.075, "rr25": -0.004, "bf25": 0.0025, "rr10": -0.007, "bf10": 0.008},
//       {"expiry": "2027-09-03", "atm": 0.08, "rr25": -0.005, "bf25": 0.003}, ...]}
// One entry per expiry (a tenor, a date or years), in increasing expiry; decimals; rr10 and
// bf10 together or not at all. The quotes become a strike grid in percent of the forward
// (analytics/smile_by_delta.hpp) that everything downstream reads as any other smile; the grid's
// calendar and butterfly checks name the quote that breaks them.
#pragma once

#include "commands/market_reader.hpp"

namespace hedgeleaf {

/// True when `volatility` (market.volatility) is a smile quoted by delta.
bool is_smile_by_delta(const json& volatility);

/// Read the quotes at `path` (market.volatility) into `m.smile` and `terms.smile_by_delta`.
/// `m` holds the pair's spot and curves (domestic as rate, foreign as carry_yield) and `terms`
/// the trade date, delta convention and premium date.
void read_smile_by_delta(const json& node, const std::string& path, const years_reader& times, currency_terms& terms,
                         market_data& m);

}  // namespace hedgeleaf
