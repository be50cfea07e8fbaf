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
    double margin = 0;
    std::optional<double> tick;
    std::optional<std::string> client;
    std::optional<std::string> notes;
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
};

/// The client price of a priced trade under `terms`.
client_price price_for_client(const trade& t, const trade_result& priced, const quote_terms& terms);

/// The price command's settings: the `quote` section, if the trade has one.
struct price_settings {
    std::optional<quote_terms> quote;
};

/// The price command's result.
struct price_result {
    trade_result priced;                ///< with vega and rho by re-pricing
    std::optional<client_price> quote;  ///< with a quote section
};

/// Price the trade (bumped Greeks on) and, with a quote section, the client price.
price_result run_price(const trade& t, const price_settings& settings);

}  // namespace hedgeleaf
