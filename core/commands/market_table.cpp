// Hedgeleaf commands: volatility grids and curves as text tables (see market_table.hpp).
#include "commands/market_table.hpp"

#include "contract/limits.hpp"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <optional>

namespace hedgeleaf {

namespace {

struct table_text {
    std::vector<std::vector<std::string>> rows;  // non-blank lines, cells trimmed
    std::vector<std::size_t> lines;              // 1-based text line of each row
    char separator = '\t';
};

std::string trimmed(const std::string& s) {
    const auto first = s.find_first_not_of(" \t\r\v\f\xc2\xa0");
    if (first == std::string::npos) return "";
    const auto last = s.find_last_not_of(" \t\r\v\f\xc2\xa0");
    return s.substr(first, last - first + 1);
}

table_text split(const std::string& text, const table_source& source) {
    table_text out;
    out.separator = text.find('\t') != std::string::npos ? '\t' : text.find(';') != std::string::npos ? ';' : ',';
    std::size_t line_no = 0, cells = 0, start = 0;
    while (start <= text.size()) {
        const std::size_t end = std::min(text.find('\n', start), text.size());
        const std::string line = text.substr(start, end - start);
        start = end + 1;
        ++line_no;
        if (trimmed(line).empty()) continue;
        std::vector<std::string> row;
        std::size_t from = 0;
        while (true) {
            const std::size_t cut = line.find(out.separator, from);
            row.push_back(trimmed(line.substr(from, cut == std::string::npos ? std::string::npos : cut - from)));
            if (cut == std::string::npos) break;
            from = cut + 1;
        }
        while (row.size() > 1 && row.back().empty()) row.pop_back();  // a trailing separator
        cells += row.size();
        if (cells > max_table_cells)
            fail(source.field, "the table has more than " + std::to_string(max_table_cells) + " cells");
        out.rows.push_back(std::move(row));
        out.lines.push_back(line_no);
    }
    if (out.rows.empty()) fail(source.field, "the table is empty");
    return out;
}

/// A cell as a number: digits with one decimal point (or, when cells are not separated by
/// commas, one decimal comma), an optional sign and exponent, and an optional trailing %.
struct cell_number {
    double value = 0;
    bool percent = false;
};
std::optional<cell_number> number_in(std::string cell, char separator) {
    cell_number out;
    if (!cell.empty() && cell.back() == '%') {
        out.percent = true;
        cell = trimmed(cell.substr(0, cell.size() - 1));
    }
    if (separator != ',' && cell.find(',') != std::string::npos && cell.find('.') == std::string::npos)
        cell[cell.find(',')] = '.';
    if (cell.empty() || cell.size() > 40 || cell.find_first_not_of("0123456789+-.eE") != std::string::npos ||
        cell.find_first_of("0123456789") == std::string::npos)
        return std::nullopt;
    char* end = nullptr;
    out.value = std::strtod(cell.c_str(), &end);
    if (end != cell.c_str() + cell.size() || !std::isfinite(out.value)) return std::nullopt;
    return out;
}

std::string place(std::size_t line, std::size_t column) {
    return "line " + std::to_string(line) + ", column " + std::to_string(column) + ": ";
}

double number_at(const table_text& t, std::size_t r, std::size_t c, const table_source& source, bool as_fraction) {
    const std::string& cell = t.rows[r][c];
    const auto n = number_in(cell, t.separator);
    if (!n) {
        std::string problem = place(t.lines[r], c + 1);
        if (cell.empty())
            problem += "is empty; a number is needed";
        else
            problem += "\"" + shorten(cell, 40) + "\" is not a number";
        fail(source.field, problem);
    }
    return n->percent && as_fraction ? n->value / 100 : n->value;
}

/// A time cell as JSON: a number of years, or the text (a date or a tenor) for the reader.
json time_cell(const table_text& t, std::size_t r, std::size_t c) {
    const std::string& cell = t.rows[r][c];
    if (const auto n = number_in(cell, t.separator); n && !n->percent) return n->value;
    return cell;
}

}  // namespace

std::string smile_table::vol_place(std::size_t row, std::size_t column) const {
    return place(lines[row], column + 2) + "(vols[" + std::to_string(row) + "][" + std::to_string(column) + "]) ";
}
std::string smile_table::expiry_place(std::size_t row) const { return place(lines[row], 1); }
std::string smile_table::strike_place(std::size_t column) const { return place(strike_line, column + 2); }

smile_table read_smile_table(const std::string& text, const table_source& source) {
    const table_text t = split(text, source);
    smile_table out;
    out.strike_line = t.lines[0];
    const std::size_t strikes = t.rows[0].size() - 1;
    if (strikes == 0)
        fail(source.field, place(t.lines[0], 2) + "the first line must hold the strikes after one label cell");
    json strike_list = json::array();
    for (std::size_t c = 1; c <= strikes; ++c) strike_list.push_back(number_at(t, 0, c, source, false));
    if (t.rows.size() < 2) fail(source.field, "the table holds strikes but no expiry lines below them");
    json expiries = json::array(), vols = json::array();
    for (std::size_t r = 1; r < t.rows.size(); ++r) {
        const auto& row = t.rows[r];
        if (row.size() != strikes + 1)
            fail(source.field, place(t.lines[r], 1) + "the line holds " + std::to_string(row.size() - 1) +
                                   " volatilities after its expiry; the first line has " + std::to_string(strikes) +
                                   " strikes");
        expiries.push_back(time_cell(t, r, 0));
        json line = json::array();
        for (std::size_t c = 1; c <= strikes; ++c) line.push_back(number_at(t, r, c, source, true));
        vols.push_back(line);
        out.lines.push_back(t.lines[r]);
    }
    out.grid = json{{"expiries", expiries}, {"strikes", strike_list}, {"vols", vols}};
    return out;
}

curve_table read_curve_table(const std::string& text, const table_source& source) {
    const table_text t = split(text, source);
    const bool header = t.rows[0].size() >= 2 && !number_in(t.rows[0][1], t.separator);
    curve_table out;
    json points = json::array();
    for (std::size_t r = header ? 1 : 0; r < t.rows.size(); ++r) {
        if (t.rows[r].size() != 2)
            fail(source.field, place(t.lines[r], 1) + "a line holds a time and a rate (2 cells), got " +
                                   std::to_string(t.rows[r].size()));
        const json when = time_cell(t, r, 0);
        const char* key = when.is_number() ? "years" : when.get<std::string>().size() == 10 ? "date" : "tenor";
        points.push_back(json{{key, when}, {"rate", number_at(t, r, 1, source, true)}});
        out.lines.push_back(t.lines[r]);
    }
    if (points.empty()) fail(source.field, "the table has a header but no points");
    out.curve = json{{"points", points}};
    return out;
}

json cells_json(const std::string& text, const table_source& source) {
    const table_text t = split(text, source);
    json rows = json::array();
    for (const auto& row : t.rows) {
        json line = json::array();
        for (const auto& cell : row) {
            const auto n = number_in(cell, t.separator);
            line.push_back(n ? json(n->value) : json(cell));
        }
        rows.push_back(line);
    }
    return rows;
}

}  // namespace hedgeleaf
