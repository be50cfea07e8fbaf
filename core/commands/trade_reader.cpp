// Hedgeleaf commands: reading and validating the trade document (see trade_reader.hpp).
#include "commands/trade_reader.hpp"

#include "analytics/currency.hpp"
#include "analytics/leg_market.hpp"
#include "analytics/strikes.hpp"
#include "commands/currency.hpp"
#include "commands/smile_by_delta.hpp"
#include "contract/structures.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

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
    // (shorter is expiry itself, and the lattice's steps would vanish in double precision)
    if (years < time_tolerance_years)
        fail(expiry_path, "must be at least " + format_number(time_tolerance_years) + " years (about " +
                              format_number(std::round(time_tolerance_years * 365 * 86400 * 100) / 100) +
                              " seconds), got " + format_number(years));
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
        require_price_level(payout, r.child("payout"));
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

/// A strike as written: a price (105), or one of {"percent_of_spot": 95},
/// {"percent_of_forward": 100} or {"delta": -0.25} (analytics/strikes.hpp). `type` is the
/// option the strike belongs to (a delta's sign follows it).
strike_terms read_strike_terms(const json& value, const std::string& path, payoff_kind type) {
    strike_terms out;
    if (!value.is_object()) {
        out.value = as_number(value, path);
        require_price_level(out.value, path);
        out.unrounded = out.value;
        return out;
    }
    field_reader r(value, path);
    std::string key;
    for (const auto& form : strike_forms)
        if (r.has(form)) key = key.empty() ? form : "two";
    if (key.empty() || key == "two") {
        for (const auto& form : strike_forms) r.raw_optional(form);
        r.finish();  // a misspelt form is named first
        fail(path,
             "write a strike as a price (105) or as one of {\"percent_of_spot\": 95}, "
             "{\"percent_of_forward\": 100} or {\"delta\": -0.25}");
    }
    out.form = enum_of<strike_form>(strike_forms, key);
    out.form = static_cast<strike_form>(static_cast<int>(out.form) + 1);  // after strike_form::price
    const std::string field = r.child(key);
    out.value = r.number(key);
    r.finish();
    if (out.form != strike_form::delta) {
        require_positive(out.value, field);
        require_at_most(out.value, max_strike_percent, field);
        return out;
    }
    const bool call = type == payoff_kind::call, put = type == payoff_kind::put;
    if (!call && !put)
        fail(field, "a strike by delta is for calls and puts; give a digital's strike as a price or a percentage");
    if (call && !(out.value > 0 && out.value < 1))
        fail(field, "a call's delta lies between 0 and 1 (0.25 for a 25-delta call), got " + format_number(out.value));
    if (put && !(out.value < 0 && out.value > -1))
        fail(field, "a put's delta lies between -1 and 0 (-0.25 for a 25-delta put), got " + format_number(out.value));
    return out;
}

/// Dividends worth spot or more before `expiry` leave no forward: refused, naming the dividends.
void require_dividends_below_spot(const market_data& m, double expiry) {
    const double pv = m.dividend_pv(0, expiry);
    if (!(pv < m.spot))
        fail("market.dividends", "present value " + format_number(pv) +
                                     " of dividends before expiry must be below market.spot " + format_number(m.spot));
}

/// The strike of a leg written as a percentage or a delta, rounded to the trade's strike_tick.
void resolve_strike(const trade& t, option_leg& leg, const std::string& path) {
    if (leg.type == payoff_kind::stock || leg.strike_given.form == strike_form::price) return;
    // (before the forward or the delta is solved from them: no forward, no strike)
    if (!t.currency) require_dividends_below_spot(t.market, leg.expiry_years);
    // A pair's strikes: its forward to delivery, its delta in the trade's convention.
    const market_data market = t.currency ? currency_leg_market(t, leg, path) : t.market;
    const double k = t.currency && leg.strike_given.form == strike_form::delta
                         ? strike_for_currency_delta(market, leg, t.currency->delta, leg.strike_given.value, path)
                         : strike_from_terms(market, leg, leg.strike_given, path);
    leg.strike_given.unrounded = k;
    leg.strike = t.strike_tick ? round_to_tick(k, *t.strike_tick) : k;
    if (!(leg.strike > 0))
        fail(path, "gives a strike of " + format_number(k) + ", which rounds to 0 with strike_tick " +
                       format_number(*t.strike_tick) + "; use a smaller strike_tick");
    if (!(leg.strike <= max_price_level))
        fail(path, "gives a strike of " + format_number(k) + ", above " + format_number(max_price_level));
}

}  // namespace

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
    leg.strike_given = read_strike_terms(r.raw("strike"), r.child("strike"), leg.type);
    leg.strike = leg.strike_given.form == strike_form::price ? leg.strike_given.value : 0.0;  // others: resolved later
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
std::vector<option_leg> read_structure(const json& node, const years_reader& times, const trade& t) {
    field_reader r(node, "structure");
    const std::string name = r.choice("shape", structure_shapes());
    const int strike_count = shape_strike_count(name);

    const json& list = r.raw("strikes");
    const std::string path = r.child("strikes");
    if (!list.is_array()) fail(path, "must be a list of strikes in ascending order, got " + describe(list));
    if (static_cast<int>(list.size()) != strike_count)
        fail(path, "a " + name + " takes " + std::to_string(strike_count) + " strike" + (strike_count > 1 ? "s" : "") +
                       ", got " + std::to_string(list.size()));
    // Which option each strike belongs to (a delta's sign follows it): the shape's legs on
    // placeholder strikes 1, 2, 3.
    std::vector<double> places;
    for (int i = 0; i < strike_count; ++i) places.push_back(i + 1);
    const std::vector<option_leg> shape = structure_legs(name, places, single_leg(payoff_kind::call, 1, 1));
    const auto type_of = [&](std::size_t i) {
        std::vector<payoff_kind> types;
        for (const auto& leg : shape)
            if (leg.type != payoff_kind::stock && leg.strike == places[i]) types.push_back(leg.type);
        if (list[i].is_object() && list[i].contains("delta") && types.size() > 1 && types[0] != types[1])
            fail(index_path(path, i),
                 "a delta names one option type, and this strike serves a call and a put; "
                 "give it as a price or a percentage");
        return types.front();
    };
    std::vector<strike_terms> given;
    for (std::size_t i = 0; i < list.size(); ++i)
        given.push_back(read_strike_terms(list[i], index_path(path, i), type_of(i)));

    // The option fields shared by every leg are read once through the leg reader,
    // with a dummy type and strike so the same checks and messages apply.
    json common = json::object();
    for (const char* key : {"expiry_years", "expiry_date", "expiry_tenor", "exercise"})
        if (r.has(key)) common[key] = r.raw(key);
    if (common.contains("exercise") &&
        common["exercise"] == "bermudan")  // any type: read_option_leg names a non-string
        fail(r.child("exercise"), "structures are european or american; give bermudan options as legs");
    common["type"] = "call";
    common["strike"] = 1;
    field_reader common_reader(common, "structure");
    const option_leg terms = read_option_leg(common_reader, times, false);
    r.finish();

    std::vector<double> strikes;
    for (std::size_t i = 0; i < given.size(); ++i) {
        option_leg leg = terms;
        leg.type = type_of(i);
        leg.strike = given[i].value;
        leg.strike_given = given[i];
        resolve_strike(t, leg, index_path(path, i));
        given[i] = leg.strike_given;
        const double k = leg.strike;
        if (!strikes.empty() && !(k > strikes.back()))
            fail(index_path(path, i), "strikes must be in ascending order, got " + format_number(k) +
                                          (given[i].form == strike_form::price ? "" : " (as written here)") +
                                          " after " + format_number(strikes.back()));
        strikes.push_back(k);
    }
    std::vector<option_leg> legs = structure_legs(name, strikes, terms);
    for (auto& leg : legs)
        for (std::size_t i = 0; i < strikes.size(); ++i)
            if (leg.type != payoff_kind::stock && leg.strike == strikes[i]) leg.strike_given = given[i];
    return legs;
}

// Exactly one of `option`, `legs` (signed legs) or `structure` (a ready-made shape); strikes
// written as percentages or deltas resolved against the market.
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
        resolve_strike(t, t.legs.back(), "option.strike");
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
        for (std::size_t i = 0; i < t.legs.size(); ++i)
            resolve_strike(t, t.legs[i], join_path(index_path("legs", i), "strike"));
        t.is_structure = true;
    } else {
        t.legs = read_structure(r.raw("structure"), times, t);
        t.is_structure = true;
    }
}

// The valuation date: as written, else the date of the market's as_of; a market taken after
// the valuation date is refused.
std::optional<date> read_valuation_date(field_reader& r, const json* market) {
    std::optional<date> out;
    if (auto text = r.text_optional("valuation_date", max_date_chars)) out = parse_iso_date(*text, "valuation_date");
    const std::optional<date> as_of = market ? as_of_date(*market, "market") : std::nullopt;
    if (!as_of) return out;
    if (!out) return as_of;
    if (days_from_civil(*as_of) > days_from_civil(*out))
        fail("market.as_of", "is " + to_iso(*as_of) + ", after valuation_date " + to_iso(*out) +
                                 "; a market cannot be taken after the day it prices");
    return out;
}

// With a smile every leg has its own volatility: each must fit the lattice over its own life,
// and the market's one volatility becomes the shared lattice's (analytics/leg_market.hpp).
void settle_volatility(trade& t) {
    if (t.market.smile) {
        for (const auto& leg : t.legs)
            if (leg.type != payoff_kind::stock)
                require_spread(leg_volatility(t.market, leg).volatility, leg.expiry_years, "market.volatility");
        t.market.volatility = shared_volatility(t.market, t.legs);
    }
    require_spread(t.market.volatility, t.final_expiry_years(), "market.volatility");
}

}  // namespace

trade read_trade(const json& document) {
    field_reader r(document, "");
    trade t;
    years_reader times;
    times.valuation_date =
        read_valuation_date(r, document.is_object() && document.contains("market") ? &document.at("market") : nullptr);
    t.valuation_date = times.valuation_date;
    r.raw_optional("underlying");
    t.currency = read_underlying_kind(document, times.valuation_date);
    std::optional<date> premium_date;
    if (t.currency) {
        t.market = read_currency_market(r.raw("market"), times, *t.currency);
        premium_date = read_conventions(document, *t.currency);
        const json& market = document.at("market");
        if (market.contains("volatility") && is_smile_by_delta(market.at("volatility")))
            read_smile_by_delta(market.at("volatility"), "market.volatility", times, *t.currency, t.market);
    } else {
        t.market = read_market(r.raw("market"), times, "market");
        for (const char* key : {"notional", "conventions"})
            if (r.has(key))
                fail(key, "only a currency pair (underlying.kind \"currency_pair\") takes " + std::string(key) +
                              "; an equity trade's size is quantity");
    }
    t.strike_tick = r.number_optional("strike_tick");
    if (t.strike_tick) {
        require_tick(*t.strike_tick, t.market.spot, "strike_tick");
    }

    read_contract(r, times, t);
    if (t.final_expiry_years() <= 0) fail("legs", "need at least one option leg (stock alone has no expiry)");

    if (t.currency) {
        for (const char* key : {"notional", "conventions", "quantity"}) r.raw_optional(key);
        settle_currency_trade(document, premium_date, t);
    } else {
        t.quantity = r.number_or("quantity", 1.0);
        require_positive(t.quantity, "quantity");
        require_at_most(t.quantity, max_quantity, "quantity");
    }
    t.client_sells = r.choice_or("side", sides, "buy") == "sell";
    t.lattice = read_lattice(r.raw_optional("lattice"));

    settle_volatility(t);

    require_dividends_below_spot(t.market, t.final_expiry_years());

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
