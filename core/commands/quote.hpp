// Hedgeleaf commands: the trade's `quote` section in, the client price out (JSON).
#pragma once

#include "analytics/client_price.hpp"
#include "commands/json_read.hpp"

#include <optional>

namespace hedgeleaf {

/// Read and check the `quote` section (none when the trade has none). Throws
/// input_error naming the quote field at fault.
std::optional<quote_terms> read_quote_terms(const json& document, const trade& t);

/// The `client_price` object of the price result.
json write_client_price(const quote_terms& terms, const client_price& price, bool term_structures = false);

}  // namespace hedgeleaf
