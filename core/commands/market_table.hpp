// Hedgeleaf commands: volatility grids and curves as text tables (CSV or tab-separated).
//
// What a spreadsheet copies, or a desk system exports, read into the JSON the market reader
// takes, so the CLI (hedgeleaf --read-table, or "table" inside a market) and the page (pasting
// into the grid) read one format (docs/market.md):
//
//   smile:  the first line holds the strikes after one label cell; each following line an
//           expiry (years, a YYYY-MM-DD date or a tenor such as 3m) and its volatilities
//               expiry   90     100    110
//               3m       0.26   0.22   0.20
//               1y       0.25   0.22   0.205
//   curve:  one point per line, a time and a rate; a first line of words is a header
//               tenor    rate
//               3m       0.031
//               2027-06-30   0.033
//
// Cells are separated by tabs, else semicolons, else commas (the first of the three the text
// holds). Decimal commas are read when the separator is not a comma ("0,25"). A number ending
// in % is a percentage: 25% = 0.25 for a volatility or a rate, and 90% = 90 for a strike in
// percent. Blank lines and spaces around cells are ignored.
#pragma once

#include "commands/json_read.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// Where a table came from, for messages: its field ("market.volatility.table") and the
/// words in front of the line ("line 3, column 2: ").
struct table_source {
    std::string field;
};

/// A smile table read into the grid's JSON and the text line of each expiry row (for messages).
struct smile_table {
    json grid;                       ///< {"expiries": [...], "strikes": [...], "vols": [[...]]}
    std::vector<std::size_t> lines;  ///< 1-based text line of expiry row i (the strikes' line is before)
    std::size_t strike_line = 1;     ///< 1-based text line of the strikes
    /// "line 3, column 4 (vols[1][2]): " for grid cell (row, column), 0-based; column 1 holds expiries.
    std::string vol_place(std::size_t row, std::size_t column) const;
    std::string expiry_place(std::size_t row) const;
    std::string strike_place(std::size_t column) const;
};

/// A smile table: expiries stay as written (numbers of years, or text: dates and tenors),
/// strikes and volatilities become numbers.
smile_table read_smile_table(const std::string& text, const table_source& source);
/// A curve table read into the curve's JSON and the text line of each point (for messages).
struct curve_table {
    json curve;                      ///< {"points": [{"years" | "date" | "tenor": ..., "rate": ...}, ...]}
    std::vector<std::size_t> lines;  ///< 1-based text line of point i
};
curve_table read_curve_table(const std::string& text, const table_source& source);
/// A block of cells as [[...], ...]: numbers where a cell reads as one, else its text (what
/// the page pastes into the middle of its grid).
json cells_json(const std::string& text, const table_source& source);

}  // namespace hedgeleaf
