// Hedgeleaf commands: the trade's `quote` section in, the client price out (JSON).
#pragma once

#include "analytics/client_price_outcomes.hpp"
#include "commands/json_read.hpp"

#include <optional>

namespace hedgeleaf {

/// Read and check the `quote` section (none when the trade has none). Throws
/// input_error naming the quote field at fault.
std::optional<quote_terms> read_quote_terms(const json& document, const trade& t);

/// The plain text at `key` of `r` for the page and the printed sheet: at most `max_chars`
/// characters, no control characters (line breaks and tabs allowed where `multi_line`).
std::string read_plain_text(field_reader& r, const std::string& key, std::size_t max_chars, bool multi_line);

/// The `client_price` object of the price result: the price, the sheet's terms, the holding,
/// the client's figures at expiry (`at_expiry`) and the outcome table (`outcomes`).
json write_client_price(const trade& t, const quote_terms& terms, const client_price& price,
                        const client_outcomes& client, const std::vector<client_outcome>& outcomes);

/// The client's figures at expiry: break-evens (alone and with the holding), best and worst
/// P&L (total and per unit; null = unbounded), protection and cap.
json client_figures_json(const trade& t, const client_outcomes& c);

/// The client's outcome at each spot, one object per row.
json client_outcomes_json(const std::vector<client_outcome>& rows);

/// The ISO date `years` (ACT/365F) after the valuation date; none without a valuation date.
std::optional<std::string> date_after_years(const trade& t, double years);

/// {per_unit, total, fraction_of_notional}.
json price_level_json(const price_level& level);

/// The sheet's own terms of a quote: label, client, prepared_by, contact, indicative_until,
/// notes (null where not given).
json sheet_terms_json(const quote_terms& terms);

}  // namespace hedgeleaf
