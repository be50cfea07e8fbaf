// Hedgeleaf commands: a currency pair in the trade document (docs/currency.md).
//
// `underlying` {kind: "currency_pair", base, quote, pip_size, spot_lag_days}, the pair's
// market (domestic_rate, foreign_rate as numbers, curves or money-market quotes), `notional`
// {amount, currency} and `conventions` {premium, premium_currency, premium_date, delta}; and
// the `currency` section of a result: dates, forward and forward points, the premium in every
// convention and the delta in every convention.
#pragma once

#include "analytics/pricing.hpp"
#include "commands/json_read.hpp"
#include "commands/market_reader.hpp"
#include "contract/trade.hpp"

#include <optional>

namespace hedgeleaf {

/// The pair named by the document's `underlying`, or none for an equity (absent or kind
/// "equity"); `valuation_date` is required with a pair.
std::optional<currency_terms> read_underlying_kind(const json& document, const std::optional<date>& valuation_date);

/// A currency pair's `market`: spot, volatility (a number or a grid), domestic_rate,
/// foreign_rate and as_of. The curves go to `terms`; the market returned holds them as rate
/// and carry_yield until settle_currency_trade replaces them.
market_data read_currency_market(const json& node, const years_reader& times, currency_terms& terms);

/// `conventions`: premium convention and currency, premium date, delta convention.
/// Returns the premium date when one was given.
std::optional<date> read_conventions(const json& document, currency_terms& terms);

/// The lattice market of a pair for an option expiring on `expiry` (its dates settled from it).
market_data currency_market_to(const currency_terms& terms, const market_data& quoted, const date& expiry,
                               const std::string& path);

/// The market a leg of a pair is priced in, and its strikes by delta solved in (the dates
/// settled from the leg's expiry). Throws input_error naming `path` when the expiry is no date.
market_data currency_leg_market(const trade& t, const option_leg& leg, const std::string& path);

/// After the contract is read: the dates from the legs' one expiry, rates converted, the
/// lattice's market in t.market and the notional in t.quantity (foreign units).
void settle_currency_trade(const json& document, std::optional<date> premium_date, trade& t);

/// The `currency` section of a price result.
json write_currency_section(const trade& t, const trade_result& r);

/// A result's words for a pair: keys naming shares name the foreign currency instead
/// ("shares" -> "foreign", "shares_held" -> "foreign_held", ...), recursively.
void use_currency_words(json& result);

}  // namespace hedgeleaf
