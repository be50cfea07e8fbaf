// Hedgeleaf core: reading and validating the trade document.
#include "trade.hpp"

#include "structures.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

constexpr double max_price_level = 1e9;    // spot, strike: larger is a typo, not a trade
constexpr double max_abs_rate = 1.0;       // +-100 % a year, negative rates allowed
constexpr double max_expiry_years = 50.0;
constexpr double max_quantity = 1e12;
constexpr std::size_t max_dividends = 200;
constexpr std::size_t max_exercise_dates = 2000;
constexpr std::size_t max_legs = 12;

const std::vector<std::string> option_types = {"call", "put", "digital-call", "digital-put"};
const std::vector<std::string> leg_types = {"call", "put", "digital-call", "digital-put", "stock"};
const std::vector<std::string> exercise_styles = {"european", "american", "bermudan"};
const std::vector<std::string> method_names = {"crr", "jarrow-rudd", "tian", "leisen-reimer"};

payoff_kind parse_payoff(const std::string& s) {
    if (s == "call") return payoff_kind::call;
    if (s == "put") return payoff_kind::put;
    if (s == "digital-call") return payoff_kind::digital_call;
    if (s == "digital-put") return payoff_kind::digital_put;
    return payoff_kind::stock;
}

exercise_style parse_exercise(const std::string& s) {
    if (s == "american") return exercise_style::american;
    if (s == "bermudan") return exercise_style::bermudan;
    return exercise_style::european;
}

market_data read_market(const json& node, const time_reader& times) {
    field_reader r(node, "market");
    market_data m;
    m.spot = r.number("spot");
    require_positive(m.spot, r.child("spot"));
    require_at_most(m.spot, max_price_level, r.child("spot"));
    m.volatility = r.number("volatility");
    require_positive(m.volatility, r.child("volatility"));
    require_at_most(m.volatility, max_volatility, r.child("volatility"));
    m.rate = r.number("rate");
    require_at_least(m.rate, -max_abs_rate, r.child("rate"));
    require_at_most(m.rate, max_abs_rate, r.child("rate"));
    m.carry_yield = r.number_or("carry_yield", 0.0);
    require_at_least(m.carry_yield, -max_abs_rate, r.child("carry_yield"));
    require_at_most(m.carry_yield, max_abs_rate, r.child("carry_yield"));
    if (const json* divs = r.raw_optional("dividends")) {
        const std::string path = r.child("dividends");
        if (!divs->is_array()) fail(path, "must be a list of {time_years or date, amount}, got " + describe(*divs));
        if (divs->size() > max_dividends)
            fail(path, "has " + std::to_string(divs->size()) + " entries, at most " + std::to_string(max_dividends));
        for (std::size_t i = 0; i < divs->size(); ++i) {
            field_reader d((*divs)[i], index_path(path, i));
            dividend div;
            div.time = times.read_time(d, "time_years", "date");
            require_positive(div.time, d.child(d.has("date") ? "date" : "time_years"));
            div.amount = d.number("amount");
            require_non_negative(div.amount, d.child("amount"));
            if (!(div.amount < m.spot))
                fail(d.child("amount"), "must be below market.spot " + format_number(m.spot) + ", got " +
                                            format_number(div.amount));
            d.finish();
            m.dividends.push_back(div);
        }
        std::sort(m.dividends.begin(), m.dividends.end(),
                  [](const dividend& a, const dividend& b) { return a.time < b.time; });
    }
    r.finish();
    return m;
}

lattice_settings read_lattice(const json* node) {
    lattice_settings s;
    if (!node) return s;
    field_reader r(*node, "lattice");
    const std::string method = r.choice_or("method", method_names, "leisen-reimer");
    s.method = parse_lattice_method(method);
    s.steps = static_cast<int>(r.integer_or("steps", 0, 1, max_lattice_steps));
    s.extrapolate = r.boolean_or("extrapolate", true);
    r.finish();
    return s;
}

}  // namespace

double market_data::dividend_pv(double from, double until) const {
    double pv = 0;
    for (const auto& d : dividends)
        if (d.time > from && d.time <= until) pv += d.amount * std::exp(-rate * (d.time - from));
    return pv;
}

double highest_volatility(double years) {
    // rounded down to 4 decimals so that the limit is the number the messages show
    return years > 0 ? std::min(max_volatility, std::floor(max_spread / std::sqrt(years) * 1e4) / 1e4) : max_volatility;
}

void require_spread(double volatility, double years, const std::string& path) {
    if (volatility <= highest_volatility(years) * (1 + 1e-12)) return;
    fail(path, format_number(volatility) + " over " + format_number(years) +
                   " years spreads spot too wide for the lattice (volatility x sqrt(expiry) = " +
                   format_number(std::round(volatility * std::sqrt(years) * 100) / 100) + ", at most " +
                   format_number(max_spread) + "); for this expiry use a volatility of at most " +
                   format_number(highest_volatility(years)));
}

double trade::final_expiry() const {
    double t = 0;
    for (const auto& leg : legs) t = std::max(t, leg.expiry);
    return t;
}

double time_reader::from_date_text(const json& value, const std::string& path) const {
    if (!value.is_string()) fail(path, "must be a date written YYYY-MM-DD, got " + describe(value));
    const date d = parse_iso_date(value.get<std::string>(), path);
    if (!valuation_date) fail(path, "a date needs valuation_date at the top of the trade (or give years instead)");
    return year_fraction(*valuation_date, d);
}

double time_reader::read_time(field_reader& r, const std::string& years_key, const std::string& date_key) const {
    const bool has_years = r.has(years_key);
    const bool has_date = r.has(date_key);
    if (has_years && has_date)
        fail(r.child(years_key), "give either " + years_key + " or " + date_key + ", not both");
    if (!has_years && !has_date) {
        r.raw_optional(years_key);
        r.raw_optional(date_key);
        fail(r.child(years_key), "is required (or give " + date_key + " as YYYY-MM-DD)");
    }
    if (has_years) return r.number(years_key);
    return from_date_text(r.raw(date_key), r.child(date_key));
}

option_leg read_option_leg(field_reader& r, const time_reader& times, bool signed_quantity) {
    option_leg leg;
    leg.type = parse_payoff(r.choice("type", signed_quantity ? leg_types : option_types));
    if (signed_quantity) {
        leg.quantity = r.number("quantity");
        if (leg.quantity == 0) fail(r.child("quantity"), "must not be 0 (+ client buys, - client sells)");
        require_at_most(std::fabs(leg.quantity), max_quantity, r.child("quantity"));
    }
    if (leg.type == payoff_kind::stock) {
        r.finish();
        return leg;
    }
    leg.strike = r.number("strike");
    require_positive(leg.strike, r.child("strike"));
    require_at_most(leg.strike, max_price_level, r.child("strike"));

    const bool by_date = r.has("expiry_date");
    leg.expiry = times.read_time(r, "expiry_years", "expiry_date");
    const std::string expiry_path = r.child(by_date ? "expiry_date" : "expiry_years");
    if (!(leg.expiry > 0)) {
        if (by_date) fail(expiry_path, "must be after valuation_date " + to_iso(*times.valuation_date));
        fail(expiry_path, "must be > 0, got " + format_number(leg.expiry));
    }
    require_at_most(leg.expiry, max_expiry_years, expiry_path);

    leg.exercise = parse_exercise(r.choice_or("exercise", exercise_styles, "european"));
    const bool digital = leg.type == payoff_kind::digital_call || leg.type == payoff_kind::digital_put;
    if (digital && leg.exercise != exercise_style::european)
        fail(r.child("exercise"), "digital options are European only, got \"" + to_string(leg.exercise) + "\"");
    if (digital) {
        leg.payout = r.number_or("payout", 1.0);
        require_positive(leg.payout, r.child("payout"));
        require_at_most(leg.payout, max_price_level, r.child("payout"));
    } else if (r.has("payout")) {
        r.raw("payout");
        fail(r.child("payout"), "only digital-call and digital-put pay a fixed payout");
    }

    const json* dates = r.raw_optional("exercise_dates");
    const json* years = r.raw_optional("exercise_years");
    if (leg.exercise != exercise_style::bermudan) {
        if (dates) fail(r.child("exercise_dates"), "only a bermudan option takes exercise dates");
        if (years) fail(r.child("exercise_years"), "only a bermudan option takes exercise dates");
    } else {
        if (dates && years) fail(r.child("exercise_dates"), "give either exercise_dates or exercise_years, not both");
        if (!dates && !years) fail(r.child("exercise_dates"), "a bermudan option needs a list of exercise dates");
        const std::string path = r.child(dates ? "exercise_dates" : "exercise_years");
        const json& list = dates ? *dates : *years;
        if (!list.is_array() || list.empty())
            fail(path, "must be a non-empty list, got " + describe(list));
        if (list.size() > max_exercise_dates)
            fail(path, "has " + std::to_string(list.size()) + " dates, at most " + std::to_string(max_exercise_dates));
        for (std::size_t i = 0; i < list.size(); ++i) {
            const std::string p = index_path(path, i);
            const double t = dates ? times.from_date_text(list[i], p) : as_number(list[i], p);
            if (!(t > 0)) fail(p, "must be after the valuation date");
            if (t > leg.expiry + 1e-12) fail(p, "must be on or before the expiry");
            leg.exercise_times.push_back(t);
        }
        std::sort(leg.exercise_times.begin(), leg.exercise_times.end());
    }
    r.finish();
    return leg;
}

json parse_json_text(const std::string& text) {
    // nlohmann reports empty input as an error at character 1; say what it is.
    if (text.find_first_not_of(" \t\r\n") == std::string::npos) fail("", "not a valid JSON document (empty input)");
    // Copying and printing a JSON value recurse once per level: a document nested
    // thousands deep would overflow the stack (found by a hand-made 150,000-level
    // object: a crash natively, "maximum call stack size exceeded" in the module).
    // A trade is a few levels deep; refuse deep nesting before building anything.
    int depth = 0;
    bool in_string = false, escaped = false;
    for (const char c : text) {
        if (in_string) {
            if (escaped) escaped = false;
            else if (c == '\\') escaped = true;
            else if (c == '"') in_string = false;
        } else if (c == '"') {
            in_string = true;
        } else if (c == '{' || c == '[') {
            if (++depth > max_document_depth)
                fail("", "not a valid trade document (nested more than " + std::to_string(max_document_depth) +
                             " levels deep; a trade needs fewer than 10)");
        } else if (c == '}' || c == ']') {
            --depth;
        }
    }
    json doc = json::parse(text, nullptr, false);
    if (doc.is_discarded()) {
        try {
            const json unused = json::parse(text);
            (void)unused;
        } catch (const json::parse_error& e) {
            fail("", std::string("not a valid JSON document (") +
                         (e.byte > 0 ? "near character " + std::to_string(e.byte) : "empty input") + ")");
        } catch (const json::exception&) {
            // e.g. out_of_range 406 for 1e400: found by tests/fuzz, was an "internal error".
            fail("", "not a valid JSON document (a number is too large to read)");
        }
        fail("", "not a valid JSON document");
    }
    return doc;
}

trade parse_trade(const json& document) {
    field_reader r(document, "");
    trade t;
    t.source = document;
    time_reader times;
    if (auto text = r.text_optional("valuation_date", 40))
        times.valuation_date = parse_iso_date(*text, "valuation_date");
    t.valuation_date = times.valuation_date;
    t.market = read_market(r.raw("market"), times);

    const bool has_option = r.has("option");
    const bool has_legs = r.has("legs");
    const bool has_structure = r.has("structure");
    const int given = int(has_option) + int(has_legs) + int(has_structure);
    if (given == 0) {
        r.raw_optional("option");
        fail("option", "is required (or give legs, or a structure)");
    }
    if (given > 1) fail(has_option ? "option" : "legs", "give only one of option, legs or structure");
    if (has_option) {
        field_reader o(r.raw("option"), "option");
        t.legs.push_back(read_option_leg(o, times, false));
    } else if (has_legs) {
        const json& legs = r.raw("legs");
        if (!legs.is_array()) fail("legs", "must be a list of options, got " + describe(legs));
        if (legs.empty()) fail("legs", "must hold at least one leg");
        if (legs.size() > max_legs)
            fail("legs", "has " + std::to_string(legs.size()) + " legs, at most " + std::to_string(max_legs));
        for (std::size_t i = 0; i < legs.size(); ++i) {
            field_reader l(legs[i], index_path("legs", i));
            t.legs.push_back(read_option_leg(l, times, true));
        }
        t.is_structure = true;
    } else {
        t.legs = expand_structure(r.raw("structure"), times);
        t.is_structure = true;
    }
    if (t.final_expiry() <= 0) fail("legs", "need at least one option leg (stock alone has no expiry)");

    t.quantity = r.number_or("quantity", 1.0);
    require_positive(t.quantity, "quantity");
    require_at_most(t.quantity, max_quantity, "quantity");
    t.client_sells = r.choice_or("side", {"buy", "sell"}, "buy") == "sell";
    t.lattice = read_lattice(r.raw_optional("lattice"));

    require_spread(t.market.volatility, t.final_expiry(), "market.volatility");

    const double pv = t.market.dividend_pv(0, t.final_expiry());
    if (!(pv < t.market.spot))
        fail("market.dividends", "present value " + format_number(pv) + " of dividends before expiry must be below market.spot " +
                                     format_number(t.market.spot));

    // Sections read by their own modules; named here so misspellings are caught.
    for (const char* section : {"quote", "hedge", "simulate", "solve", "ladder", "profile"}) r.raw_optional(section);
    r.finish();
    return t;
}

std::string to_string(payoff_kind k) {
    switch (k) {
        case payoff_kind::call: return "call";
        case payoff_kind::put: return "put";
        case payoff_kind::digital_call: return "digital-call";
        case payoff_kind::digital_put: return "digital-put";
        case payoff_kind::stock: return "stock";
    }
    return "call";
}

std::string to_string(exercise_style e) {
    switch (e) {
        case exercise_style::european: return "european";
        case exercise_style::american: return "american";
        case exercise_style::bermudan: return "bermudan";
    }
    return "european";
}

std::string to_string(lattice_method m) {
    switch (m) {
        case lattice_method::crr: return "crr";
        case lattice_method::jarrow_rudd: return "jarrow-rudd";
        case lattice_method::tian: return "tian";
        case lattice_method::leisen_reimer: return "leisen-reimer";
    }
    return "leisen-reimer";
}

lattice_method parse_lattice_method(const std::string& text) {
    if (text == "crr") return lattice_method::crr;
    if (text == "jarrow-rudd") return lattice_method::jarrow_rudd;
    if (text == "tian") return lattice_method::tian;
    return lattice_method::leisen_reimer;
}

}  // namespace hedgeleaf
