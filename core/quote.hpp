// Hedgeleaf core: the client price from a trade's `quote` section.
//
// The desk's mid is the lattice premium. A margin on each side gives the
// client's bid (what the client receives when selling) and offer (what the
// client pays when buying):
//   "absolute"             margin in price units per unit of the trade
//   "fraction_of_premium"  margin = fraction * |mid| (0.02 = 2 % of the premium)
//   "volatility"           re-price at volatility +- margin (0.01 = one volatility point)
// Prices round to the tick in the desk's favour (offer up, bid down). The
// premium is also given as a fraction of notional, notional = quantity * spot.
#pragma once

#include "pricer.hpp"
#include "trade.hpp"

#include <string>

namespace hedgeleaf {

/// The caution shown wherever a price reaches a client.
const char* client_caution();

/// Longest client name and notes, in characters (they are printed on the sheet).
inline constexpr std::size_t max_client_name_chars = 80;
inline constexpr std::size_t max_notes_chars = 500;

/// The client price for a priced trade, or null when the trade has no
/// `quote` section. Throws input_error naming the quote field at fault.
json client_price_json(const trade& t, const trade_result& priced);

}  // namespace hedgeleaf
