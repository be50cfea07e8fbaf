// Hedgeleaf commands: reading a volatility grid (see smile_reader.hpp).
#include "commands/smile_reader.hpp"

#include "analytics/smile_checks.hpp"
#include "commands/market_table.hpp"

#include <cmath>
#include <memory>

namespace hedgeleaf {

namespace {

/// Where each part of the grid was written: JSON paths, or the table's field and a line and
/// column in front of the problem.
struct grid_places {
    std::string base;  // "market.volatility"
    const smile_table* table = nullptr;

    std::string list(const char* key) const { return table ? join_path(base, "table") : join_path(base, key); }
    std::string expiry(std::size_t i) const { return table ? list("") : index_path(list("expiries"), i); }
    std::string strike(std::size_t j) const { return table ? list("") : index_path(list("strikes"), j); }
    std::string row(std::size_t i) const { return table ? list("") : index_path(list("vols"), i); }
    std::string vol(std::size_t i, std::size_t j) const { return table ? list("") : index_path(row(i), j); }
    std::string expiry_at(std::size_t i) const { return table ? table->expiry_place(i) : ""; }
    std::string strike_at(std::size_t j) const { return table ? table->strike_place(j) : ""; }
    std::string vol_at(std::size_t i, std::size_t j) const { return table ? table->vol_place(i, j) : ""; }
};

/// A broken bound: the reader's usual message (with its detail) for a JSON path, the same
/// words after the line and column for a table.
void check_bound(bool ok, const std::string& field, const std::string& prefix, double value, const char* relation,
                 double limit, const std::string& hint = "") {
    if (ok) return;
    if (prefix.empty() && hint.empty()) fail_bound(field, value, relation, limit);
    fail(field, prefix + "must be " + relation + " " + format_number(limit) + ", got " + format_number(value) + hint);
}

const json& list_at(const json& value, const std::string& field, const char* what, std::size_t most) {
    if (!value.is_array()) fail(field, std::string("must be a list of ") + what + ", got " + describe(value));
    if (value.empty()) fail(field, std::string("must hold at least one ") + what + "; the grid is empty");
    if (value.size() > most)
        fail(field, "has " + std::to_string(value.size()) + " entries, at most " + std::to_string(most));
    return value;
}

/// Strictly increasing: each its own message for a repeat and for a step back.
void check_order(const std::vector<double>& xs, std::size_t i, const std::string& field, const std::string& prefix,
                 const char* what, const char* plural, const char* unit) {
    if (i == 0) return;
    const std::string before = format_number(xs[i - 1]) + unit;
    if (xs[i] == xs[i - 1])
        fail(field, prefix + "repeats the " + what + " before it (" + before + "); give each " + what + " once");
    if (xs[i] < xs[i - 1])
        fail(field, prefix + format_number(xs[i]) + unit + " comes after " + before + "; list the " + plural +
                        " in increasing order");
}

std::vector<double> read_expiries(const json& list, const grid_places& at, const years_reader& times) {
    list_at(list, at.list("expiries"), "expiry", max_smile_expiries);
    std::vector<double> out;
    for (std::size_t i = 0; i < list.size(); ++i) {
        const double t = times.time_point(list[i], at.expiry(i), at.expiry_at(i));
        if (!(t > 0))
            fail(at.expiry(i),
                 at.expiry_at(i) + "must be after the valuation date, got " + format_number(t) + " years");
        check_bound(t <= max_expiry_years, at.expiry(i), at.expiry_at(i), t, "<=", max_expiry_years);
        out.push_back(t);
        check_order(out, i, at.expiry(i), at.expiry_at(i), "expiry", "expiries", " years");
    }
    return out;
}

std::vector<double> read_strikes(const json& list, const grid_places& at, strike_basis basis) {
    list_at(list, at.list("strikes"), "strike", max_smile_strikes);
    const bool percent = basis != strike_basis::absolute;
    const double highest = percent ? max_strike_percent : max_price_level;
    std::vector<double> out;
    for (std::size_t j = 0; j < list.size(); ++j) {
        const double k = as_number(list[j], at.strike(j));
        check_bound(k > 0, at.strike(j), at.strike_at(j), k, ">", 0);
        check_bound(k <= highest, at.strike(j), at.strike_at(j), k, "<=", highest,
                    percent ? " (percent: 90 = 90 %)" : "");
        out.push_back(k);
        check_order(out, j, at.strike(j), at.strike_at(j), "strike", "strikes", "");
    }
    return out;
}

double read_vol(const json& value, std::size_t i, std::size_t j, double years, const grid_places& at) {
    const std::string field = at.vol(i, j), prefix = at.vol_at(i, j);
    const double v = as_number(value, field);
    check_bound(v > 0, field, prefix, v, ">", 0);
    check_bound(v >= min_volatility, field, prefix, v, ">=", min_volatility);
    check_bound(v <= max_volatility, field, prefix, v, "<=", max_volatility,
                v <= 100 * max_volatility ? " (volatilities are decimals: 0.25 = 25 %)" : "");
    const double highest = highest_volatility(years);
    if (v > highest * (1 + 1e-12))
        fail(field, prefix + format_number(v) + " over " + format_number(years) +
                        " years spreads spot too wide for the lattice (volatility x sqrt(expiry) at most " +
                        format_number(max_spread) + "); at this expiry use at most " + format_number(highest));
    return v;
}

std::vector<std::vector<double>> read_vols(const json& rows, const grid_places& at, const smile_grid& g) {
    const std::string field = at.list("vols");
    if (!rows.is_array())
        fail(field, "must be a list of rows, one per expiry, each a list of volatilities, got " + describe(rows));
    if (rows.size() > max_smile_expiries)
        fail(field, "has " + std::to_string(rows.size()) + " rows, at most " + std::to_string(max_smile_expiries));
    if (rows.size() != g.expiries.size())
        fail(field, "has " + std::to_string(rows.size()) + " rows; the grid has " + std::to_string(g.expiries.size()) +
                        " expiries (one row of volatilities per expiry)");
    std::vector<std::vector<double>> out;
    for (std::size_t i = 0; i < rows.size(); ++i) {
        const json& row = rows[i];
        if (!row.is_array()) fail(at.row(i), "must be a list of volatilities, one per strike, got " + describe(row));
        if (row.size() > max_smile_strikes)
            fail(at.row(i),
                 "has " + std::to_string(row.size()) + " volatilities, at most " + std::to_string(max_smile_strikes));
        if (row.size() != g.strikes.size())
            fail(at.row(i), "has " + std::to_string(row.size()) + " volatilities; the grid has " +
                                std::to_string(g.strikes.size()) +
                                " strikes (a ragged grid: every row needs one per strike)");
        std::vector<double> vols;
        for (std::size_t j = 0; j < row.size(); ++j) vols.push_back(read_vol(row[j], i, j, g.expiries[i], at));
        out.push_back(std::move(vols));
    }
    return out;
}

}  // namespace

void read_smile(const json& node, const std::string& path, const years_reader& times, market_data& m) {
    field_reader r(node, path);
    if (r.has("quotes_by_delta"))
        fail(r.child("quotes_by_delta"),
             "a smile quoted by delta (at-the-money, risk reversals, butterflies) is a currency pair's; "
             "give this trade's smile as a strike grid (expiries, strikes, vols)");
    smile_grid g;
    g.basis = enum_of<strike_basis>(strike_bases, r.choice_or("strike_basis", strike_bases, "percent_of_spot"));
    g.spot = m.spot;
    const json* table = r.raw_optional("table");
    smile_table parsed;
    grid_places at{path};
    json expiries, strikes, vols;
    if (table) {
        for (const char* key : {"expiries", "strikes", "vols"})
            if (r.has(key))
                fail(r.child("table"), "give the grid either as table text or as expiries, strikes and vols, not both");
        r.finish();
        if (!table->is_string())
            fail(r.child("table"),
                 "must be text: strikes on the first line, then one line per expiry; got " + describe(*table));
        parsed = read_smile_table(table->get<std::string>(), {r.child("table")});
        at.table = &parsed;
        expiries = parsed.grid["expiries"];
        strikes = parsed.grid["strikes"];
        vols = parsed.grid["vols"];
    } else {
        expiries = r.raw("expiries");
        strikes = r.raw("strikes");
        vols = r.raw("vols");
        r.finish();
    }
    g.expiries = read_expiries(expiries, at, times);
    g.strikes = read_strikes(strikes, at, g.basis);
    g.vols = read_vols(vols, at, g);
    m.smile = std::make_shared<const volatility_smile>(g);
    m.smile_spot = m.spot;
    if (const auto v = find_smile_arbitrage(m))
        fail(at.vol(v->row, v->column), at.vol_at(v->row, v->column) + v->problem);
    const double last = g.expiries.back();
    m.volatility = m.volatility_at(m.forward(last), last).volatility;
}

}  // namespace hedgeleaf
