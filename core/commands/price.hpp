// Hedgeleaf commands: the price command's JSON in and out.
#pragma once

#include "analytics/client_price_outcomes.hpp"
#include "commands/json_read.hpp"

namespace hedgeleaf {

/// The price command reads the `quote` section, if any.
price_settings read_price_settings(const json& document, const trade& t);
/// The JSON the CLI prints and the module returns for `price`.
json write_price_result(const trade& t, const price_settings& settings, const price_result& result);

/// {delta, gamma, theta, vega, rho}.
json greeks_json(const greeks& g);

/// One trade, one premium: a card's value of the trade today beside the price command's premium.
/// Sets out["price_premium"] and out["difference_from_price"] (card - price, per unit) and, when
/// the two differ by 0.00005 or more per unit of premium (what four decimals show), adds to
/// out["notes"] a line saying so and naming `steps_field`, the field that sets the card's lattice.
void add_price_comparison(json& out, const premium_comparison& c, const std::string& card,
                          const std::string& steps_field, int steps);

}  // namespace hedgeleaf
