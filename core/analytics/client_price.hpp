// Hedgeleaf analytics: the price command, the trade's price and the client price.
//
// The desk's mid is the lattice premium. A margin on each side gives the
// client's bid (what the client receives when selling) and offer (what the
// client pays when buying):
//   absolute             margin in price units per unit of the trade
//   fraction_of_premium  margin = fraction * |mid| (0.02 = 2 % of the premium)
//   volatility           re-price at volatility +- margin (0.01 = one volatility point)
// Prices round to the tick in the desk's favour (offer up, bid down). The
// premium is also given as a fraction of notional, notional = quantity * spot.
// A two-way quote shows both sides to the client; a one-way quote only the side
// the client deals on. The sheet's own terms (who prepared it, the desk's
// contact, until when it is indicative) and the client's existing holding ride
// along: the holding is shown with the trade, never priced into it.
#pragma once

#include "analytics/pricing.hpp"

#include <optional>
#include <string>

namespace hedgeleaf {

enum class margin_kind {
    absolute,
    fraction_of_premium,
    volatility
};  // the order of contract/limits.hpp's margin_types

/// The `quote` section, read and checked (commands/quote.hpp).
struct quote_terms {
    std::string currency;  ///< ISO 4217 code, or "" for none
    margin_kind margin_type = margin_kind::absolute;
    double margin = 0;  ///< on each side of the mid: the spread offer - bid is twice this before rounding
    std::optional<double> tick;
    bool two_way = false;              ///< show the client both the bid and the offer
    std::optional<std::string> label;  ///< the trade's short name on the sheet and in comparisons
    std::optional<std::string> client;
    std::optional<std::string> prepared_by;       ///< the preparer's name
    std::optional<std::string> contact;           ///< the desk's telephone or e-mail
    std::optional<std::string> indicative_until;  ///< ISO 8601 date or date and time, as given
    std::optional<std::string> notes;
    double holding_shares = 0;  ///< shares the client already holds (shown with the trade, not priced)
};

/// A price per unit, for the whole quantity, and as a fraction of notional.
struct price_level {
    double per_unit = 0;
    double total = 0;
    double fraction_of_notional = 0;
};

/// The client's price: bid, offer and the desk's mid, and the side the client deals on.
struct client_price {
    price_level mid, bid, offer;  ///< mid rounded to the nearest tick when a tick is given
    bool client_buys = true;      ///< buys at the offer, or sells at the bid
    double per_unit = 0;          ///< the price the client deals at
    double total = 0;
    double fraction_of_notional = 0;
    double notional = 0;  ///< quantity x spot
    double desk_margin_total = 0;
    double spread = 0;  ///< offer - bid per unit, after rounding
};

/// The client price of a priced trade under `terms`.
client_price price_for_client(const trade& t, const trade_result& priced, const quote_terms& terms);

}  // namespace hedgeleaf
