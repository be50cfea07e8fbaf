// Hedgeleaf commands: reading the market (spot, smile, curves, dividends, borrow) into market_data.
//
// The same object is a trade's `market` and a market snapshot file (docs/market.md): a
// snapshot is a market with its `as_of` time, given to every command beside a trade that has
// no market of its own (dispatch/dispatch.hpp). Volatility is one number or a grid by expiry
// and strike (contract/smile.hpp); rate, carry_yield and borrow are one number or a curve of
// zero rates (contract/curve.hpp); grids and curves may also be written as table text
// (commands/market_table.hpp).
#pragma once

#include "commands/json_read.hpp"
#include "contract/trade.hpp"

#include <optional>
#include <string>

namespace hedgeleaf {

/// Reads times given as years or, with a valuation date, as dates (ACT/365F).
struct years_reader {
    std::optional<date> valuation_date;
    /// Years from either `years_key` or `date_key` of `r` (exactly one of them).
    double read_years(field_reader& r, const std::string& years_key, const std::string& date_key) const;
    /// Years from a date string at `path`.
    double years_from_date(const json& value, const std::string& path) const;
    /// Years to a point written as a number of years, a YYYY-MM-DD date or a tenor ("3m", "1y";
    /// contract/dates.hpp tenor_years). `prefix` goes in front of the problem (a table's line).
    double time_point(const json& value, const std::string& path, const std::string& prefix = "") const;
};

/// `key` of `r` (`rate`, `carry_yield`, `borrow`, a pair's `domestic_rate`...): one number, or
/// a curve {"points": [...]} or {"table": "..."}; a flat 0 when absent and not `required`.
/// Rates below `floor` (-max_abs_rate, or 0 for a fee) are refused.
curve read_curve(field_reader& r, const std::string& key, const years_reader& times, bool required, double floor);

/// The date of an ISO 8601 date-time ("2026-12-03T16:30:00Z", "2026-12-03T17:30+01:00",
/// seconds and the zone optional); throws input_error naming `path` for anything else.
date parse_as_of(const std::string& text, const std::string& path);

/// The date of the market's `as_of`, when `node` is an object that gives one (checked).
std::optional<date> as_of_date(const json& node, const std::string& path);

/// Read and check the market at `path`. Throws input_error naming the field (a grid's cell,
/// a curve's point).
market_data read_market(const json& node, const years_reader& times, const std::string& path = "market");

/// The trade `document` priced in the market `snapshot` (a market with its as_of, from its
/// own file): the snapshot becomes the document's `market`. A trade that carries its own
/// market is refused (neither overrides the other), as is a snapshot without as_of. Fields
/// in the snapshot are then named market.<field>.
json with_market_snapshot(const json& document, const json& snapshot);

}  // namespace hedgeleaf
