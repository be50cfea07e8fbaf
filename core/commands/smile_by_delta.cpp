// Hedgeleaf commands: a currency pair's smile quoted by delta (see smile_by_delta.hpp).
#include "commands/smile_by_delta.hpp"

#include "analytics/smile_by_delta.hpp"
#include "analytics/smile_checks.hpp"
#include "commands/currency.hpp"

#include <cmath>
#include <memory>

namespace hedgeleaf {

namespace {

/// A volatility the quotes imply (`what`, from the fields in `formula`) within the grid's bounds.
void check_implied(double v, double years, const std::string& field, const std::string& what,
                   const std::string& formula) {
    const std::string lead = "gives the " + what + " volatility " + formula + " = " + format_number(v) + "; ";
    if (!(v >= min_volatility))
        fail(field, lead + "it must be at least " + format_number(min_volatility) +
                        " (decimals: 0.004 = 0.4 %; a risk reversal is call minus put)");
    if (!(v <= max_volatility)) fail(field, lead + "it must be at most " + format_number(max_volatility));
    const double highest = highest_volatility(years);
    if (v > highest * (1 + 1e-12))
        fail(field, lead + "over " + format_number(years) +
                        " years that spreads spot too wide for the lattice; at this expiry at most " +
                        format_number(highest));
}

delta_quote read_quote(const json& node, const std::string& path, const years_reader& times) {
    field_reader r(node, path);
    delta_quote q;
    q.expiry_years = times.time_point(r.raw("expiry"), r.child("expiry"));
    if (!(q.expiry_years > 0))
        fail(r.child("expiry"), "must be after the valuation date, got " + format_number(q.expiry_years) + " years");
    require_at_most(q.expiry_years, max_expiry_years, r.child("expiry"));
    q.atm = r.number("atm");
    check_implied(q.atm, q.expiry_years, r.child("atm"), "at-the-money", "atm");
    q.rr25 = r.number("rr25");
    q.bf25 = r.number("bf25");
    q.rr10 = r.number_optional("rr10");
    q.bf10 = r.number_optional("bf10");
    if (q.rr10.has_value() != q.bf10.has_value()) {
        const char* given = q.rr10 ? "rr10" : "bf10";
        fail(r.child(q.rr10 ? "bf10" : "rr10"),
             std::string("is missing: ") + given + " is given, and the 10-delta wings need both rr10 and bf10");
    }
    r.finish();
    const auto check_wings = [&](double rr, double bf, const char* tag) {
        const std::string t = tag, bf_key = "bf" + t, rr_key = "rr" + t;
        const wing_volatilities w = wings_of(q.atm, rr, bf);
        check_implied(w.put, q.expiry_years, r.child(bf_key), t + "-delta put",
                      "atm + " + bf_key + " - " + rr_key + " / 2");
        check_implied(w.call, q.expiry_years, r.child(bf_key), t + "-delta call",
                      "atm + " + bf_key + " + " + rr_key + " / 2");
    };
    check_wings(q.rr25, q.bf25, "25");
    if (q.rr10) check_wings(*q.rr10, *q.bf10, "10");
    return q;
}

/// The quote field behind column `column` of row `row`: the point's own field, else the entry.
std::string field_of(const delta_smile_row& row, double moneyness, const std::string& entry) {
    for (const auto& p : row.points) {
        if (std::fabs(100 * p.strike / row.forward - moneyness) > 1e-12 * moneyness) continue;
        if (p.name == "atm") return join_path(entry, "atm");
        return join_path(entry, p.name.substr(p.name.size() - 2) == "25" ? "bf25" : "bf10");
    }
    return entry;
}

}  // namespace

bool is_smile_by_delta(const json& volatility) {
    return volatility.is_object() && volatility.contains("quotes_by_delta");
}

void read_smile_by_delta(const json& node, const std::string& path, const years_reader& times, currency_terms& terms,
                         market_data& m) {
    field_reader r(node, path);
    const json& list = r.raw("quotes_by_delta");
    r.finish();
    const std::string field = r.child("quotes_by_delta");
    if (!list.is_array() || list.empty())
        fail(field,
             "must be a list of quotes, one per expiry: {expiry, atm, rr25, bf25, rr10, bf10}, got " + describe(list));
    if (list.size() > max_smile_expiries)
        fail(field, "has " + std::to_string(list.size()) + " expiries, at most " + std::to_string(max_smile_expiries));
    // Quotes are the market's: their premium is paid on the spot date, whatever the trade's.
    currency_terms quoted = terms;
    quoted.premium_date.reset();
    std::vector<delta_smile_row> rows;
    for (std::size_t i = 0; i < list.size(); ++i) {
        const std::string entry = index_path(field, i);
        const delta_quote q = read_quote(list[i], entry, times);
        if (i > 0 && !(q.expiry_years > rows.back().expiry_years))
            fail(join_path(entry, "expiry"),
                 format_number(q.expiry_years) + " years comes " +
                     (q.expiry_years == rows.back().expiry_years ? "again after " : "after ") +
                     format_number(rows.back().expiry_years) +
                     " years; list the quotes once each, in increasing expiry");
        // Each expiry's forward and discounting from its own dates (an expiry in years: the nearest day).
        const date expiry = add_days(terms.dates.trade, std::lround(q.expiry_years * 365));
        const market_data at_expiry = currency_market_to(quoted, m, expiry, join_path(entry, "expiry"));
        rows.push_back(smile_row_of(at_expiry, q, terms.delta, entry));
    }
    m.smile = std::make_shared<const volatility_smile>(grid_of_rows(rows, m.spot));
    m.smile_spot = m.spot;
    if (const auto v = find_smile_arbitrage(m)) {
        const std::string entry = index_path(field, v->row);
        const double moneyness = m.smile->grid().strikes[v->column];
        fail(field_of(rows[v->row], moneyness, entry),
             "at " + format_number(moneyness) + " % of the forward (the grid the quotes make): " + v->problem);
    }
    const double last = rows.back().expiry_years;
    m.volatility = m.volatility_at(m.forward(last), last).volatility;
    terms.smile_by_delta = std::move(rows);
}

}  // namespace hedgeleaf
