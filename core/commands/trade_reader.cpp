// Hedgeleaf commands: reading and validating the trade document (see trade_reader.hpp).
#include "commands/trade_reader.hpp"

#include "contract/structures.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

market_data read_market(const json& node, const years_reader& times) {
    field_reader r(node, "market");
    market_data m;
    m.spot = r.number("spot");
    require_positive(m.spot, r.child("spot"));
    require_at_most(m.spot, max_price_level, r.child("spot"));
    m.volatility = r.number("volatility");
    require_positive(m.volatility, r.child("volatility"));
    require_at_most(m.volatility, max_volatility, r.child("volatility"));
    // One number each for now: a flat curve (term structures are read in the market section's own reader).
    const double rate = r.number("rate");
    require_at_least(rate, -max_abs_rate, r.child("rate"));
    require_at_most(rate, max_abs_rate, r.child("rate"));
    m.rate = curve::flat(rate);
    const double carry_yield = r.number_or("carry_yield", 0.0);
    require_at_least(carry_yield, -max_abs_rate, r.child("carry_yield"));
    require_at_most(carry_yield, max_abs_rate, r.child("carry_yield"));
    m.carry_yield = curve::flat(carry_yield);
    if (const json* divs = r.raw_optional("dividends")) {
        const std::string path = r.child("dividends");
        if (!divs->is_array()) fail(path, "must be a list of {time_years or date, amount}, got " + describe(*divs));
        if (divs->size() > max_dividends)
            fail(path, "has " + std::to_string(divs->size()) + " entries, at most " + std::to_string(max_dividends));
        for (std::size_t i = 0; i < divs->size(); ++i) {
            field_reader d((*divs)[i], index_path(path, i));
            dividend div;
            div.years = times.read_years(d, "time_years", "date");
            require_positive(div.years, d.child(d.has("date") ? "date" : "time_years"));
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
    r.finish();
    return m;
}

lattice_settings read_lattice(const json* node) {
    lattice_settings s;
    if (!node) return s;
    field_reader r(*node, "lattice");
    const std::string method = r.choice_or("method", lattice_methods, "leisen-reimer");
    s.method = parse_lattice_method(method);
    s.steps = static_cast<int>(r.integer_or("steps", 0, 1, max_lattice_steps));
    s.extrapolate = r.boolean_or("extrapolate", true);
    r.finish();
    return s;
}

// expiry_tenor: the tenor itself first (its own message), then that it comes alone.
double read_expiry_tenor(field_reader& r, const years_reader& times) {
    const std::string path = r.child("expiry_tenor");
    const json& given = r.raw("expiry_tenor");
    if (!given.is_string()) fail(path, "must be a tenor such as 6m (text), got " + describe(given));
    const tenor t = parse_tenor(given.get<std::string>(), path);
    for (const char* other : {"expiry_years", "expiry_date"})
        if (r.has(other)) {
            r.raw(other);
            fail(path, std::string("give one of expiry_years, expiry_date or expiry_tenor, not ") + other + " as well");
        }
    if (!times.valuation_date) {
        const double years = tenor_years(t);
        require_at_most(years, max_expiry_years, path);
        return years;
    }
    const date& today = *times.valuation_date;
    const date expiry = tenor_date(today, t);
    const double years = year_fraction(today, expiry);
    // 1d from a Friday the 30th lands on Saturday the 31st, which modified following rolls back.
    if (!(years > 0))
        fail(path, to_string(t) + " from valuation_date " + to_iso(today) + " rolls back to " + to_iso(expiry) +
                       " (modified following); give expiry_date instead");
    require_at_most(years, max_expiry_years, path);
    return years;
}

// The expiry: exactly one of expiry_years, expiry_date (after the valuation date) or
// expiry_tenor ("6m": contract/dates.hpp's tenor_date from the valuation date, ACT/365F; without
// a valuation date months / 12), at most max_expiry_years.
double read_expiry(field_reader& r, const years_reader& times) {
    if (r.has("expiry_tenor")) return read_expiry_tenor(r, times);
    r.raw_optional("expiry_tenor");
    if (!r.has("expiry_years") && !r.has("expiry_date")) {
        r.raw_optional("expiry_years");
        r.raw_optional("expiry_date");
        fail(r.child("expiry_years"), "is required (or give expiry_date as YYYY-MM-DD, or expiry_tenor such as 6m)");
    }
    const bool by_date = r.has("expiry_date");
    const double years = times.read_years(r, "expiry_years", "expiry_date");
    const std::string expiry_path = r.child(by_date ? "expiry_date" : "expiry_years");
    if (!(years > 0)) {
        if (by_date) fail(expiry_path, "must be after valuation_date " + to_iso(*times.valuation_date));
        fail(expiry_path, "must be > 0, got " + format_number(years));
    }
    require_at_most(years, max_expiry_years, expiry_path);
    return years;
}

// A digital's payout (default 1); no other option takes one.
double read_payout(field_reader& r, const option_leg& leg) {
    const bool digital = leg.type == payoff_kind::digital_call || leg.type == payoff_kind::digital_put;
    if (digital && leg.exercise != exercise_style::european)
        fail(r.child("exercise"), "digital options are European only, got \"" + to_string(leg.exercise) + "\"");
    if (digital) {
        const double payout = r.number_or("payout", 1.0);
        require_positive(payout, r.child("payout"));
        require_at_most(payout, max_price_level, r.child("payout"));
        return payout;
    }
    if (r.has("payout")) {
        r.raw("payout");
        fail(r.child("payout"), "only digital-call and digital-put pay a fixed payout");
    }
    return leg.payout;
}

// A Bermudan option's exercise dates (or years), sorted; no other option takes them.
std::vector<double> read_exercise_schedule(field_reader& r, const years_reader& times, const option_leg& leg) {
    const json* dates = r.raw_optional("exercise_dates");
    const json* years = r.raw_optional("exercise_years");
    std::vector<double> out;
    if (leg.exercise != exercise_style::bermudan) {
        if (dates) fail(r.child("exercise_dates"), "only a bermudan option takes exercise dates");
        if (years) fail(r.child("exercise_years"), "only a bermudan option takes exercise dates");
        return out;
    }
    if (dates && years) fail(r.child("exercise_dates"), "give either exercise_dates or exercise_years, not both");
    if (!dates && !years) fail(r.child("exercise_dates"), "a bermudan option needs a list of exercise dates");
    const std::string path = r.child(dates ? "exercise_dates" : "exercise_years");
    const json& list = dates ? *dates : *years;
    if (!list.is_array() || list.empty()) fail(path, "must be a non-empty list, got " + describe(list));
    if (list.size() > max_exercise_dates)
        fail(path, "has " + std::to_string(list.size()) + " dates, at most " + std::to_string(max_exercise_dates));
    for (std::size_t i = 0; i < list.size(); ++i) {
        const std::string p = index_path(path, i);
        const double t = dates ? times.years_from_date(list[i], p) : as_number(list[i], p);
        if (!(t > 0)) fail(p, "must be after the valuation date");
        if (t > leg.expiry_years + 1e-12) fail(p, "must be on or before the expiry");
        out.push_back(t);
    }
    std::sort(out.begin(), out.end());
    return out;
}

}  // namespace

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

option_leg read_option_leg(field_reader& r, const years_reader& times, bool signed_quantity) {
    option_leg leg;
    leg.type = parse_payoff_kind(r.choice("type", signed_quantity ? leg_types : option_types));
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
    leg.expiry_years = read_expiry(r, times);
    leg.exercise = parse_exercise_style(r.choice_or("exercise", exercise_styles, "european"));
    leg.payout = read_payout(r, leg);
    leg.exercise_years = read_exercise_schedule(r, times, leg);
    r.finish();
    return leg;
}

namespace {

// A `structure` object {shape, strikes (ascending), expiry_years|expiry_date, exercise}
// as signed legs (contract/structures.hpp).
std::vector<option_leg> read_structure(const json& node, const years_reader& times) {
    field_reader r(node, "structure");
    const std::string name = r.choice("shape", structure_shapes());
    const int strike_count = shape_strike_count(name);

    const json& list = r.raw("strikes");
    const std::string path = r.child("strikes");
    if (!list.is_array()) fail(path, "must be a list of strikes in ascending order, got " + describe(list));
    if (static_cast<int>(list.size()) != strike_count)
        fail(path, "a " + name + " takes " + std::to_string(strike_count) + " strike" + (strike_count > 1 ? "s" : "") +
                       ", got " + std::to_string(list.size()));
    std::vector<double> strikes;
    for (std::size_t i = 0; i < list.size(); ++i) {
        const double k = as_number(list[i], index_path(path, i));
        require_positive(k, index_path(path, i));
        require_at_most(k, max_price_level, index_path(path, i));
        if (!strikes.empty() && !(k > strikes.back()))
            fail(index_path(path, i), "strikes must be in ascending order, got " + format_number(k) + " after " +
                                          format_number(strikes.back()));
        strikes.push_back(k);
    }

    // The option fields shared by every leg are read once through the leg reader,
    // with a dummy type and strike so the same checks and messages apply.
    json common = json::object();
    for (const char* key : {"expiry_years", "expiry_date", "expiry_tenor", "exercise"})
        if (r.has(key)) common[key] = r.raw(key);
    if (common.contains("exercise") &&
        common["exercise"] == "bermudan")  // any type: read_option_leg names a non-string
        fail(r.child("exercise"), "structures are european or american; give bermudan options as legs");
    common["type"] = "call";
    common["strike"] = strikes.front();
    field_reader common_reader(common, "structure");
    const option_leg terms = read_option_leg(common_reader, times, false);
    r.finish();
    return structure_legs(name, strikes, terms);
}

// Exactly one of `option`, `legs` (signed legs) or `structure` (a ready-made shape).
void read_contract(field_reader& r, const years_reader& times, trade& t) {
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
        t.legs = read_structure(r.raw("structure"), times);
        t.is_structure = true;
    }
}

}  // namespace

trade read_trade(const json& document) {
    field_reader r(document, "");
    trade t;
    years_reader times;
    if (auto text = r.text_optional("valuation_date", max_date_chars))
        times.valuation_date = parse_iso_date(*text, "valuation_date");
    t.valuation_date = times.valuation_date;
    t.market = read_market(r.raw("market"), times);

    read_contract(r, times, t);
    if (t.final_expiry_years() <= 0) fail("legs", "need at least one option leg (stock alone has no expiry)");

    t.quantity = r.number_or("quantity", 1.0);
    require_positive(t.quantity, "quantity");
    require_at_most(t.quantity, max_quantity, "quantity");
    t.client_sells = r.choice_or("side", sides, "buy") == "sell";
    t.lattice = read_lattice(r.raw_optional("lattice"));

    require_spread(t.market.volatility, t.final_expiry_years(), "market.volatility");

    const double pv = t.market.dividend_pv(0, t.final_expiry_years());
    if (!(pv < t.market.spot))
        fail("market.dividends", "present value " + format_number(pv) +
                                     " of dividends before expiry must be below market.spot " +
                                     format_number(t.market.spot));

    // Sections read by their own modules; named here so misspellings are caught.
    for (const auto& section : command_sections) r.raw_optional(section);
    r.finish();
    return t;
}

const json* section_of(const json& document, const std::string& name) {
    if (!document.is_object() || !document.contains(name) || document.at(name).is_null()) return nullptr;
    return &document.at(name);
}

const json& section_or_empty(const json& document, const std::string& name) {
    static const json empty = json::object();
    const json* section = section_of(document, name);
    return section ? *section : empty;
}

}  // namespace hedgeleaf
