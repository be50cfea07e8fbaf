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

}  // namespace hedgeleaf
