// Hedgeleaf CLI: generic table and CSV rendering of JSON results, so every
// command gets --table (and --csv where it has rows) without its own printer.
#include "table.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>
#include <vector>

namespace hedgeleaf::cli {

namespace {
using json = nlohmann::ordered_json;  // objects keep the order they are built in (premium first)

std::string cell(const json& v) {
    if (v.is_number_float()) {
        const double x = v.get<double>();
        char buf[32];
        if (x != 0 && (std::fabs(x) < 1e-4 || std::fabs(x) >= 1e9))
            std::snprintf(buf, sizeof buf, "%.6e", x);
        else
            std::snprintf(buf, sizeof buf, "%.6f", x);
        return buf;
    }
    if (v.is_string()) return v.get<std::string>();
    if (v.is_null()) return "-";
    return v.dump(-1, ' ', false, json::error_handler_t::replace);
}

bool is_row_list(const json& v) {
    return v.is_array() && !v.empty() && std::all_of(v.begin(), v.end(), [](const json& e) { return e.is_object(); });
}

bool is_flat(const json& row) {
    return std::none_of(row.begin(), row.end(), [](const json& e) { return e.is_object() || e.is_array(); });
}

// Columns of a row list: those named in `order` (a result's "columns" or
// "table_columns" list) first, in that order, then any others as met. With
// `only`, just the named ones (the table's narrower view).
std::vector<std::string> columns_of(const json& rows, const json* order = nullptr, bool only = false) {
    std::vector<std::string> cols;
    if (order && order->is_array())
        for (const auto& c : *order)
            if (c.is_string()) cols.push_back(c.get<std::string>());
    if (only && !cols.empty()) return cols;
    for (const auto& row : rows)
        for (auto it = row.begin(); it != row.end(); ++it)
            if (!it->is_object() && !it->is_array() && std::find(cols.begin(), cols.end(), it.key()) == cols.end())
                cols.push_back(it.key());
    return cols;
}

void render_rows(std::ostringstream& out, const json& rows, const std::string& indent, const json* order = nullptr) {
    const auto cols = columns_of(rows, order, true);
    std::vector<std::size_t> width(cols.size());
    for (std::size_t c = 0; c < cols.size(); ++c) {
        width[c] = cols[c].size();
        for (const auto& row : rows)
            if (row.contains(cols[c])) width[c] = std::max(width[c], cell(row[cols[c]]).size());
    }
    out << indent;
    for (std::size_t c = 0; c < cols.size(); ++c) {
        out << std::string(width[c] - cols[c].size() + (c ? 2 : 0), ' ') << cols[c];
    }
    out << "\n";
    for (const auto& row : rows) {
        out << indent;
        for (std::size_t c = 0; c < cols.size(); ++c) {
            const std::string s = row.contains(cols[c]) ? cell(row[cols[c]]) : "";
            out << std::string(width[c] - s.size() + (c ? 2 : 0), ' ') << s;
        }
        out << "\n";
    }
}

void render(std::ostringstream& out, const json& v, const std::string& indent) {
    std::size_t key_width = 0;
    for (auto it = v.begin(); it != v.end(); ++it) key_width = std::max(key_width, it.key().size());
    // A result may name the order of its "rows" columns ("columns") and the ones a table shows ("table_columns").
    const bool has_rows = v.contains("rows");
    const json* order = has_rows && v.contains("table_columns") ? &v.at("table_columns")
                        : has_rows && v.contains("columns")     ? &v.at("columns")
                                                                : nullptr;
    // ... and the top-level keys a table shows ("table_sections"; the JSON keeps every detail).
    const json* sections = v.contains("table_sections") ? &v.at("table_sections") : nullptr;
    const auto shown = [&](const std::string& key) {
        return !sections || std::find(sections->begin(), sections->end(), json(key)) != sections->end();
    };
    for (auto it = v.begin(); it != v.end(); ++it) {
        const json& x = *it;
        if (has_rows && (it.key() == "columns" || it.key() == "table_columns")) continue;
        if (it.key() == "table_sections" || !shown(it.key())) continue;
        if (x.is_object()) {
            out << indent << it.key() << "\n";
            render(out, x, indent + "  ");
        } else if (is_row_list(x) && std::all_of(x.begin(), x.end(), is_flat)) {
            out << indent << it.key() << "\n";
            render_rows(out, x, indent + "  ", it.key() == "rows" ? order : nullptr);
        } else if (is_row_list(x)) {
            for (std::size_t i = 0; i < x.size(); ++i) {
                out << indent << it.key() << "[" << i << "]\n";
                render(out, x[i], indent + "  ");
            }
        } else if (x.is_array()) {
            std::string joined;
            for (const auto& e : x) joined += (joined.empty() ? "" : ", ") + cell(e);
            out << indent << it.key() << std::string(key_width - it.key().size() + 2, ' ') << joined << "\n";
        } else {
            out << indent << it.key() << std::string(key_width - it.key().size() + 2, ' ') << cell(x) << "\n";
        }
    }
}

std::string csv_field(const std::string& s) {
    if (s.find_first_of(",\"\n") == std::string::npos) return s;
    std::string q = "\"";
    for (char c : s) q += c == '"' ? std::string("\"\"") : std::string(1, c);
    return q + "\"";
}

const json* find_rows(const json& v) {
    if (!v.is_object()) return nullptr;
    if (v.contains("rows") && is_row_list(v["rows"])) return &v["rows"];
    for (auto it = v.begin(); it != v.end(); ++it)
        if (is_row_list(*it) && std::all_of(it->begin(), it->end(), is_flat)) return &*it;
    return nullptr;
}
}  // namespace

std::string render_table(const json& result) {
    std::ostringstream out;
    render(out, result, "");
    return out.str();
}

std::string render_csv(const json& result) {
    const json* rows = find_rows(result);
    if (!rows) return "";
    std::ostringstream out;
    const auto cols =
        columns_of(*rows, result.contains("rows") && rows == &result.at("rows") && result.contains("columns")
                              ? &result.at("columns")
                              : nullptr);
    for (std::size_t c = 0; c < cols.size(); ++c) out << (c ? "," : "") << csv_field(cols[c]);
    out << "\n";
    for (const auto& row : *rows) {
        for (std::size_t c = 0; c < cols.size(); ++c) {
            std::string s;
            if (row.contains(cols[c])) {
                const json& x = row[cols[c]];
                s = x.is_string() ? x.get<std::string>() : (x.is_null() ? "" : x.dump());
            }
            out << (c ? "," : "") << csv_field(s);
        }
        out << "\n";
    }
    return out.str();
}

}  // namespace hedgeleaf::cli
