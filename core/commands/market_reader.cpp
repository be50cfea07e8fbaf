// Hedgeleaf commands: reading the market (see market_reader.hpp).
#include "commands/market_reader.hpp"

#include "commands/market_table.hpp"
#include "commands/smile_reader.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

/// A tenor when `text` reads as one (contract/dates.hpp), else none.
std::optional<tenor> tenor_of(const std::string& text) {
    try {
        return parse_tenor(text, "");
    } catch (const input_error&) {
        return std::nullopt;
    }
}

/// Where one point of a curve was written: its JSON path, or the table's field and line.
struct point_place {
    std::string base;                // "market.rate.points" or "market.rate.table"
    std::vector<std::size_t> lines;  // a table: the text line of each point
    std::string field(std::size_t i, const std::string& key) const {
        return lines.empty() ? join_path(index_path(base, i), key) : base;
    }
    std::string prefix(std::size_t i) const { return lines.empty() ? "" : "line " + std::to_string(lines[i]) + ": "; }
};

/// A rate within its bounds; `floor` is -max_abs_rate, or 0 for a fee.
void check_rate(double rate, double floor, const std::string& field, const std::string& prefix) {
    if (prefix.empty()) {
        require_at_least(rate, floor, field);
        require_at_most(rate, max_abs_rate, field);
        return;
    }
    if (!(rate >= floor && rate <= max_abs_rate))
        fail(field, prefix + "a rate must be within " + format_number(floor) + " .. " + format_number(max_abs_rate) +
                        " (decimals: 0.031 = 3.1 %), got " + format_number(rate));
}

/// One point {tenor | date | years, rate} of a curve.
std::pair<double, double> read_point(const json& node, std::size_t i, const point_place& place,
                                     const years_reader& times, double floor) {
    field_reader p(node, place.lines.empty() ? index_path(place.base, i) : place.base);
    const std::string prefix = place.prefix(i);
    const char* keys[] = {"tenor", "date", "years"};
    int given = 0;
    std::string key = "tenor";
    for (const char* k : keys)
        if (p.has(k)) {
            ++given;
            key = k;
        }
    if (given != 1) {
        for (const char* k : keys) p.raw_optional(k);
        fail(place.field(i, "tenor"),
             prefix + "give the point's time as exactly one of tenor (\"3m\"), date (YYYY-MM-DD) or years");
    }
    const std::string time_field = place.field(i, key);
    const json& when = p.raw(key);
    if (key == "years" && !when.is_number()) as_number(when, time_field);
    if (key == "tenor" && !(when.is_string() && tenor_of(when.get<std::string>())))
        fail(time_field, prefix + "must be a tenor such as 3m, 6m, 1y, 2w or 10d, got " + describe(when));
    if (key == "date" && !(when.is_string() && when.get_ref<const std::string&>().size() == 10))
        times.years_from_date(when, time_field);  // refuses it as a date
    const double years = times.time_point(when, time_field, prefix);
    if (!(years > 0))
        fail(time_field, prefix + "must be after the valuation date, got " + format_number(years) + " years");
    if (years > max_expiry_years)
        fail(time_field, prefix + "must be at most " + format_number(max_expiry_years) + " years away, got " +
                             format_number(years));
    const std::string rate_field = place.field(i, "rate");
    const double rate = place.lines.empty() ? p.number("rate") : as_number(p.raw("rate"), rate_field);
    check_rate(rate, floor, rate_field, prefix);
    p.finish();
    return {years, rate};
}

curve read_points(const json& list, const point_place& place, const years_reader& times, double floor) {
    const std::string& path = place.base;
    if (!list.is_array()) fail(path, "must be a list of points {tenor | date | years, rate}, got " + describe(list));
    if (list.empty()) fail(path, "must hold at least one point");
    if (list.size() > max_curve_points)
        fail(path, "has " + std::to_string(list.size()) + " points, at most " + std::to_string(max_curve_points));
    std::vector<double> years, rates;
    for (std::size_t i = 0; i < list.size(); ++i) {
        const auto [t, r] = read_point(list[i], i, place, times, floor);
        if (!years.empty()) {
            const std::string time_at = place.lines.empty() ? index_path(path, i) : path;
            if (t == years.back())
                fail(time_at, place.prefix(i) + "repeats the time of the point before (" + format_number(years.back()) +
                                  " years); give each maturity once");
            if (t < years.back())
                fail(time_at, place.prefix(i) + "at " + format_number(t) + " years comes after a point at " +
                                  format_number(years.back()) + " years; list the points from the nearest");
            // Flat forwards between points: an absurd forward means a typo in a rate or a time.
            const double forward = (r * t - rates.back() * years.back()) / (t - years.back());
            if (!(std::fabs(forward) <= max_abs_rate))
                fail(time_at, place.prefix(i) + "the forward rate from the point before (" +
                                  format_number(years.back()) + " years) to this one is " +
                                  format_number(std::round(forward * 1e6) / 1e6) + " a year, outside -" +
                                  format_number(max_abs_rate) + " .. " + format_number(max_abs_rate) +
                                  "; check the rates and the times");
        }
        years.push_back(t);
        rates.push_back(r);
    }
    return curve::from_points(std::move(years), std::move(rates));
}

void read_dividends(field_reader& r, const years_reader& times, market_data& m) {
    const json* divs = r.raw_optional("dividends");
    if (!divs) return;
    const std::string path = r.child("dividends");
    if (!divs->is_array()) fail(path, "must be a list of {time_years or date, amount}, got " + describe(*divs));
    if (divs->size() > max_dividends)
        fail(path, "has " + std::to_string(divs->size()) + " entries, at most " + std::to_string(max_dividends));
    for (std::size_t i = 0; i < divs->size(); ++i) {
        field_reader d((*divs)[i], index_path(path, i));
        dividend div;
        div.years = times.read_years(d, "time_years", "date");
        if (d.has("date") && !(div.years > 0))  // (a date is given by date, as the expiry's is)
            fail(d.child("date"), "must be after valuation_date " + to_iso(*times.valuation_date));
        require_positive(div.years, d.child("time_years"));
        div.amount = d.number("amount");
        require_non_negative(div.amount, d.child("amount"));
        if (!(div.amount < m.spot))
            fail(d.child("amount"),
                 "must be below market.spot " + format_number(m.spot) + ", got " + format_number(div.amount));
        d.finish();
        m.dividends.push_back(div);
    }
    std::sort(m.dividends.begin(), m.dividends.end(),
              [](const dividend& a, const dividend& b) { return a.years < b.years; });
}

/// The share's name: plain text on one line (it is printed on the sheet).
std::string read_underlying(field_reader& r) {
    const auto text = r.text_optional("underlying", 4 * max_underlying_chars);
    if (!text) return "";
    std::size_t chars = 0;
    for (unsigned char c : *text) {
        if (c < 0x20 || c == 0x7F) fail(r.child("underlying"), "must be plain text on one line");
        if ((c & 0xC0) != 0x80) ++chars;
    }
    if (chars > max_underlying_chars)
        fail(r.child("underlying"), "is too long (" + std::to_string(chars) + " characters, at most " +
                                        std::to_string(max_underlying_chars) + ")");
    return *text;
}

int digits(const std::string& s, std::size_t from, std::size_t count) {
    int v = 0;
    for (std::size_t i = from; i < from + count; ++i) {
        if (i >= s.size() || s[i] < '0' || s[i] > '9') return -1;
        v = v * 10 + (s[i] - '0');
    }
    return v;
}

}  // namespace

curve read_curve(field_reader& r, const std::string& key, const years_reader& times, bool required, double floor) {
    const json* node = required ? &r.raw(key) : r.raw_optional(key);
    if (!node) return curve::flat(0);
    const std::string path = r.child(key);
    if (!node->is_object()) {
        const double rate = as_number(*node, path);
        check_rate(rate, floor, path, "");
        return curve::flat(rate);
    }
    field_reader c(*node, path);
    const json* table = c.raw_optional("table");
    const json* points = c.raw_optional("points");
    if (table && points) fail(c.child("table"), "give the curve either as points or as table text, not both");
    if (!table && !points) {
        c.finish();  // an unknown key is the likelier mistake
        fail(c.child("points"), "is required: a curve is {\"points\": [{\"tenor\": \"3m\", \"rate\": 0.031}, ...]}");
    }
    c.finish();
    if (points) return read_points(*points, {c.child("points"), {}}, times, floor);
    const std::string field = c.child("table");
    if (!table->is_string()) fail(field, "must be text, one point a line: time, rate; got " + describe(*table));
    const curve_table parsed = read_curve_table(table->get<std::string>(), {field});
    return read_points(parsed.curve["points"], {field, parsed.lines}, times, floor);
}

double years_reader::years_from_date(const json& value, const std::string& path) const {
    if (!value.is_string()) fail(path, "must be a date written YYYY-MM-DD, got " + describe(value));
    const date d = parse_iso_date(value.get<std::string>(), path);
    if (!valuation_date) fail(path, "a date needs valuation_date at the top of the trade (or give years instead)");
    return year_fraction(*valuation_date, d);
}

double years_reader::read_years(field_reader& r, const std::string& years_key, const std::string& date_key) const {
    const bool has_years = r.has(years_key);
    const bool has_date = r.has(date_key);
    if (has_years && has_date) fail(r.child(years_key), "give either " + years_key + " or " + date_key + ", not both");
    if (!has_years && !has_date) {
        r.raw_optional(years_key);
        r.raw_optional(date_key);
        fail(r.child(years_key), "is required (or give " + date_key + " as YYYY-MM-DD)");
    }
    if (has_years) return r.number(years_key);
    return years_from_date(r.raw(date_key), r.child(date_key));
}

double years_reader::time_point(const json& value, const std::string& path, const std::string& prefix) const {
    if (value.is_number()) return as_number(value, path);
    const std::string shape = "must be years (a number), a date YYYY-MM-DD or a tenor such as 3m, 6m, 1y, 2w, 10d";
    if (!value.is_string()) fail(path, prefix + shape + ", got " + describe(value));
    const std::string& text = value.get_ref<const std::string&>();
    // A tenor falls on its date from the valuation date (modified following), else counts
    // months as twelfths of a year (contract/dates.hpp).
    if (const auto t = tenor_of(text))
        return valuation_date ? year_fraction(*valuation_date, tenor_date(*valuation_date, *t)) : tenor_years(*t);
    if (text.size() == 10 && text[4] == '-' && text[7] == '-') {
        if (!valuation_date)
            fail(path, prefix + "the date \"" + text +
                           "\" needs valuation_date at the top of the trade (or the market's as_of); or give a "
                           "tenor or years");
        try {
            return year_fraction(*valuation_date, parse_iso_date(text, path));
        } catch (const input_error& e) {
            fail(path, prefix + "is not a calendar date: \"" + text + "\"");
        }
    }
    fail(path, prefix + shape + ", got " + describe(value));
}

date parse_as_of(const std::string& text, const std::string& path) {
    const auto bad = [&] {
        fail(path, "must be an ISO 8601 date and time such as 2026-12-03T16:30:00Z (the zone optional), got \"" +
                       shorten(text, 40) + "\"");
    };
    if (text.size() < 16 || text[10] != 'T' || text[13] != ':') bad();
    const date d = parse_iso_date(text.substr(0, 10), path);
    const int hour = digits(text, 11, 2), minute = digits(text, 14, 2);
    if (hour < 0 || hour > 23 || minute < 0 || minute > 59) bad();
    std::size_t at = 16;
    if (at < text.size() && text[at] == ':') {
        const int second = digits(text, at + 1, 2);
        if (second < 0 || second > 60) bad();
        at += 3;
        if (at < text.size() && text[at] == '.') {
            ++at;
            const std::size_t from = at;
            while (at < text.size() && text[at] >= '0' && text[at] <= '9') ++at;
            if (at == from) bad();
        }
    }
    if (at == text.size()) return d;
    if (text[at] == 'Z' && at + 1 == text.size()) return d;
    if ((text[at] == '+' || text[at] == '-') && at + 6 == text.size() && text[at + 3] == ':') {
        const int zh = digits(text, at + 1, 2), zm = digits(text, at + 4, 2);
        if (zh >= 0 && zh <= 14 && zm >= 0 && zm <= 59) return d;
    }
    bad();
    return d;
}

std::optional<date> as_of_date(const json& node, const std::string& path) {
    if (!node.is_object() || !node.contains("as_of")) return std::nullopt;
    const json& v = node.at("as_of");
    const std::string field = join_path(path, "as_of");
    if (!v.is_string())
        fail(field, "must be an ISO 8601 date and time such as 2026-12-03T16:30:00Z, got " + describe(v));
    if (v.get_ref<const std::string&>().size() > max_as_of_chars)
        fail(field, "is too long (at most " + std::to_string(max_as_of_chars) + " characters)");
    return parse_as_of(v.get<std::string>(), field);
}

market_data read_market(const json& node, const years_reader& times, const std::string& path) {
    field_reader r(node, path);
    market_data m;
    if (const auto text = r.text_optional("as_of", max_as_of_chars)) {
        parse_as_of(*text, r.child("as_of"));
        m.as_of = *text;
    }
    m.underlying = read_underlying(r);
    m.spot = r.number("spot");
    require_price_level(m.spot, r.child("spot"));
    // One number is checked at once (as always); a grid after the curves it needs.
    const json& volatility = r.raw("volatility");
    const bool grid = volatility.is_object();
    if (!grid) {
        m.volatility = as_number(volatility, r.child("volatility"));
        require_volatility(m.volatility, r.child("volatility"));
    }
    m.rate = read_curve(r, "rate", times, true, -max_abs_rate);
    m.carry_yield = read_curve(r, "carry_yield", times, false, -max_abs_rate);
    m.borrow = read_curve(r, "borrow", times, false, 0.0);
    read_dividends(r, times, m);
    if (grid) read_smile(volatility, r.child("volatility"), times, m);
    r.finish();
    return m;
}

json with_market_snapshot(const json& document, const json& snapshot) {
    if (!snapshot.is_object())
        fail("market",
             "a market snapshot must be an object {as_of, spot, volatility, rate, ...}, got " + describe(snapshot));
    if (!snapshot.contains("as_of"))
        fail("market.as_of",
             "is required in a market snapshot: when the market was taken, an ISO 8601 date and "
             "time such as 2026-12-03T16:30:00Z");
    if (!document.is_object()) return document;  // the trade reader names what is wrong with it
    if (document.contains("market"))
        fail("market",
             "the trade carries its own market and a market snapshot was given too; remove the trade's "
             "market or leave out the snapshot (neither overrides the other)");
    json out = document;
    out["market"] = snapshot;
    return out;
}

}  // namespace hedgeleaf
