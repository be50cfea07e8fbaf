// Hedgeleaf commands: a currency pair in the trade document (see currency.hpp).
#include "commands/currency.hpp"

#include "analytics/currency.hpp"
#include "commands/smile_reader.hpp"

#include <cmath>

namespace hedgeleaf {

namespace {

const char* const pair_rates =
    "a currency pair takes domestic_rate (the quote currency's) and foreign_rate (the base "
    "currency's)";

std::string read_code(field_reader& r, const std::string& key) {
    const std::string code = r.text(key, 8);
    if (!is_currency_code(code))
        fail(r.child(key), "must be an ISO 4217 currency code, three capital letters such as EUR or USD, got \"" +
                               shorten(code, 8) + "\"");
    return code;
}

/// A money-market quote {rate, day_count, compounding}.
quoted_rate read_quoted_rate(const json& node, const std::string& path) {
    field_reader q(node, path);
    quoted_rate out;
    out.rate = q.number("rate");
    require_at_least(out.rate, -max_abs_rate, q.child("rate"));
    require_at_most(out.rate, max_abs_rate, q.child("rate"));
    out.basis = enum_of<day_count>(day_counts, q.choice_or("day_count", day_counts, "ACT/360"));
    out.compounds = enum_of<compounding>(compoundings, q.choice_or("compounding", compoundings, "simple"));
    q.finish();
    return out;
}

/// `domestic_rate` or `foreign_rate`: a continuously compounded number or curve, or a quote.
void read_pair_rate(field_reader& r, const std::string& key, const years_reader& times, curve& out,
                    std::optional<quoted_rate>& quoted) {
    const json& node = r.raw(key);
    if (node.is_object() && !node.contains("points") && !node.contains("table")) {
        quoted = read_quoted_rate(node, r.child(key));
        out = curve::flat(quoted->rate);  // until the dates convert it (settle_currency_trade)
        return;
    }
    out = read_curve(r, key, times, true, -max_abs_rate);
}

/// The quote's continuously compounded ACT/365F equivalent over the spot-to-delivery days.
curve converted(const quoted_rate& q, long days, const std::string& path) {
    if (!(growth_over(q, days) > 0))
        fail(path, "at " + format_number(q.rate) + " " + to_string(q.compounds) + " " + to_string(q.basis) +
                       " the deposit from spot to delivery would lose everything; check the rate");
    return curve::flat(continuous_act365f(q, days));
}

/// The expiry date of a leg whose expiry was a date or a tenor (whole days from the trade date).
date expiry_date_of(const currency_terms& terms, double years, const std::string& path) {
    const double days = years * 365;
    const long whole = std::lround(days);
    if (!(std::fabs(days - static_cast<double>(whole)) < 1e-6))
        fail(path,
             "a currency option's expiry is a date: give expiry_date or expiry_tenor (valuation_date is the "
             "trade date)");
    return add_days(terms.dates.trade, whole);
}

/// `terms` with its dates from `expiry` and its quoted rates converted.
void settle_terms(currency_terms& terms, const date& expiry, const std::string& path) {
    const date trade = terms.dates.trade;
    terms.dates = settle_dates(trade, expiry, terms.spot_lag_days);
    if (terms.premium_date) {
        if (days_from_civil(*terms.premium_date) > days_from_civil(terms.dates.delivery))
            fail("conventions.premium_date",
                 "is " + to_iso(*terms.premium_date) + ", after the delivery date " + to_iso(terms.dates.delivery));
        terms.dates.premium = *terms.premium_date;
    }
    const long days = days_from_civil(terms.dates.delivery) - days_from_civil(terms.dates.spot);
    if (days <= 0) fail(path, "delivers on or before the spot date; the expiry must come after the trade date");
    if (terms.domestic_quoted) terms.domestic = converted(*terms.domestic_quoted, days, "market.domestic_rate");
    if (terms.foreign_quoted) terms.foreign = converted(*terms.foreign_quoted, days, "market.foreign_rate");
}

std::string expiry_path(const json& document, std::size_t leg) {
    if (document.contains("option")) return "option.expiry_date";
    if (document.contains("structure")) return "structure.expiry_date";
    return join_path(index_path("legs", leg), "expiry_date");
}

/// The strike every option leg shares, or 0 when they differ (a spread).
double common_strike(const trade& t) {
    double k = 0;
    for (const auto& leg : t.legs) {
        if (leg.type == payoff_kind::stock) continue;
        if (k != 0 && leg.strike != k) return 0;
        k = leg.strike;
    }
    return k;
}

json quoted_json(const std::optional<quoted_rate>& q) {
    if (!q) return nullptr;
    return {{"rate", q->rate}, {"day_count", to_string(q->basis)}, {"compounding", to_string(q->compounds)}};
}

/// The conventions per unit of the quote-currency notional, which converts at the strike: they
/// need one strike shared by the legs.
bool per_quote_notional(premium_convention convention) {
    return convention == premium_convention::percent_of_domestic || convention == premium_convention::foreign_pips;
}

json premium_json(const trade& t, double value) {
    const currency_terms& c = *t.currency;
    const double strike = common_strike(t), spot = t.market.spot;
    json all = json::object();
    for (std::size_t i = 0; i < premium_conventions.size(); ++i) {
        const auto convention = static_cast<premium_convention>(i);
        all[premium_conventions[i]] = per_quote_notional(convention) && strike == 0
                                          ? json(nullptr)
                                          : json(premium_in(convention, value, spot, strike, c.pair.pip_size));
    }
    const double domestic_amount = t.signed_quantity() * value;
    const bool in_foreign = c.premium_currency == c.pair.base;
    return {{"convention", to_string(c.premium)},
            {"value", all[to_string(c.premium)]},
            {"currency", c.premium_currency},
            {"amount", in_foreign ? domestic_amount / spot : domestic_amount},
            {"in_each_convention", all},
            {"note", "per unit of " + c.pair.base + " notional; amount = the position's premium in " +
                         c.premium_currency + (in_foreign ? " (converted at spot)" : "") +
                         "; percent_of_domestic and foreign_pips need one strike shared by the legs"}};
}

json delta_json(const trade& t, const trade_result& r) {
    const currency_terms& c = *t.currency;
    const forward_view f = forward_view_of(t.market, c.volatility_years);
    json all = json::object();
    for (std::size_t i = 0; i < delta_conventions.size(); ++i)
        all[delta_conventions[i]] = delta_in(static_cast<delta_convention>(i), r.premium, r.sensitivities.delta, f);
    const double value = all[to_string(c.delta)].get<double>();
    return {{"convention", to_string(c.delta)},
            {"value", value},
            {"in_each_convention", all},
            {"position_" + c.pair.base, t.signed_quantity() * value}};
}

/// The points a smile quoted by delta gave, per expiry.
json smile_by_delta_json(const currency_terms& c) {
    json rows = json::array();
    for (const auto& row : c.smile_by_delta) {
        json points = json::object();
        for (const auto& p : row.points)
            points[p.name] = {{"strike", p.strike},
                              {"volatility", p.volatility},
                              {"percent_of_forward", 100 * p.strike / row.forward}};
        rows.push_back({{"expiry_years", row.expiry_years}, {"forward", row.forward}, {"points", points}});
    }
    return rows;
}

}  // namespace

std::optional<currency_terms> read_underlying_kind(const json& document, const std::optional<date>& valuation_date) {
    if (!document.is_object() || !document.contains("underlying")) return std::nullopt;
    field_reader r(document.at("underlying"), "underlying");
    if (r.choice("kind", underlying_kinds) == "equity") {
        r.finish();
        return std::nullopt;
    }
    currency_terms terms;
    terms.pair.base = read_code(r, "base");
    terms.pair.quote = read_code(r, "quote");
    if (terms.pair.base == terms.pair.quote)
        fail(r.child("quote"), "must differ from underlying.base (" + terms.pair.base + ")");
    terms.pair.pip_size = r.number_or("pip_size", default_pip_size(terms.pair.quote));
    require_positive(terms.pair.pip_size, r.child("pip_size"));
    require_at_most(terms.pair.pip_size, max_pip_size, r.child("pip_size"));
    terms.spot_lag_days = static_cast<int>(
        r.integer_or("spot_lag_days", default_spot_lag(terms.pair.base, terms.pair.quote), 0, max_spot_lag_days));
    r.finish();
    if (!valuation_date)
        fail("valuation_date",
             "is required for a currency pair: it is the trade date the spot and delivery dates "
             "count from");
    terms.dates.trade = *valuation_date;
    terms.premium_currency = terms.pair.quote;
    return terms;
}

market_data read_currency_market(const json& node, const years_reader& times, currency_terms& terms) {
    field_reader r(node, "market");
    for (const char* key : {"rate", "carry_yield"})
        if (r.has(key)) fail(r.child(key), pair_rates);
    if (r.has("borrow")) fail(r.child("borrow"), "a currency pair has no borrow fee");
    if (r.has("dividends")) fail(r.child("dividends"), "a currency pair pays no dividends");
    if (r.has("underlying"))
        fail(r.child("underlying"),
             "a currency pair is named by underlying.base and underlying.quote at the top of "
             "the trade");
    market_data m;
    if (const auto text = r.text_optional("as_of", max_as_of_chars)) {
        parse_as_of(*text, r.child("as_of"));
        m.as_of = *text;
    }
    m.underlying = terms.pair.name();
    m.spot = r.number("spot");
    require_price_level(m.spot, r.child("spot"));
    const json& volatility = r.raw("volatility");
    if (!volatility.is_object()) {
        m.volatility = as_number(volatility, r.child("volatility"));
        require_volatility(m.volatility, r.child("volatility"));
    }
    read_pair_rate(r, "domestic_rate", times, terms.domestic, terms.domestic_quoted);
    read_pair_rate(r, "foreign_rate", times, terms.foreign, terms.foreign_quoted);
    m.rate = terms.domestic;
    m.carry_yield = terms.foreign;
    // A smile quoted by delta waits for the delta convention (read_smile_by_delta).
    if (volatility.is_object() && !volatility.contains("quotes_by_delta"))
        read_smile(volatility, r.child("volatility"), times, m);
    r.finish();
    return m;
}

std::optional<date> read_conventions(const json& document, currency_terms& terms) {
    const json* node = document.contains("conventions") ? &document.at("conventions") : nullptr;
    static const json empty = json::object();
    field_reader r(node ? *node : empty, "conventions");
    terms.premium = enum_of<premium_convention>(premium_conventions,
                                                r.choice_or("premium", premium_conventions, "domestic_per_foreign"));
    if (r.has("premium_currency")) {
        terms.premium_currency = read_code(r, "premium_currency");
        if (terms.premium_currency != terms.pair.base && terms.premium_currency != terms.pair.quote)
            fail(r.child("premium_currency"),
                 "must be " + terms.pair.base + " or " + terms.pair.quote + ", got " + terms.premium_currency);
    }
    // A premium paid in the foreign currency is what the premium-adjusted deltas allow for.
    const bool foreign_premium = terms.premium_currency == terms.pair.base;
    terms.delta = enum_of<delta_convention>(
        delta_conventions, r.choice_or("delta", delta_conventions, foreign_premium ? "spot_premium_adjusted" : "spot"));
    if (const auto text = r.text_optional("premium_date", max_date_chars)) {
        terms.premium_date = parse_iso_date(*text, r.child("premium_date"));
        if (days_from_civil(*terms.premium_date) < days_from_civil(terms.dates.trade))
            fail(r.child("premium_date"), "is " + *text + ", before the trade date " + to_iso(terms.dates.trade));
    }
    r.finish();
    return terms.premium_date;
}

market_data currency_market_to(const currency_terms& terms, const market_data& quoted, const date& expiry,
                               const std::string& path) {
    currency_terms settled = terms;
    settle_terms(settled, expiry, path);
    return settle_currency_market(quoted, settled);
}

market_data currency_leg_market(const trade& t, const option_leg& leg, const std::string& path) {
    return currency_market_to(*t.currency, t.market, expiry_date_of(*t.currency, leg.expiry_years, path), path);
}

void settle_currency_trade(const json& document, std::optional<date> premium_date, trade& t) {
    currency_terms& terms = *t.currency;
    terms.premium_date = premium_date;
    double expiry = -1;
    for (std::size_t i = 0; i < t.legs.size(); ++i) {
        if (t.legs[i].type == payoff_kind::stock) continue;
        if (expiry >= 0 && t.legs[i].expiry_years != expiry)
            fail(expiry_path(document, i), "the options of a currency trade share one expiry date");
        expiry = t.legs[i].expiry_years;
    }
    const std::string path = expiry_path(document, 0);
    settle_terms(terms, expiry_date_of(terms, expiry, path), path);
    t.market = settle_currency_market(t.market, terms);

    if (document.contains("quantity"))
        fail("quantity", "a currency trade's size is its notional: {\"amount\": 5000000, \"currency\": \"" +
                             terms.pair.base + "\"}");
    if (!document.contains("notional"))
        fail("notional",
             "is required for a currency pair: {\"amount\": 5000000, \"currency\": \"" + terms.pair.base + "\"}");
    field_reader n(document.at("notional"), "notional");
    terms.notional_amount = n.number("amount");
    require_positive(terms.notional_amount, n.child("amount"));
    require_at_most(terms.notional_amount, max_quantity, n.child("amount"));
    terms.notional_currency = read_code(n, "currency");
    n.finish();
    if (terms.notional_currency == terms.pair.base) {
        t.quantity = terms.notional_amount;
    } else if (terms.notional_currency == terms.pair.quote) {
        const double strike = common_strike(t);
        if (strike == 0)
            fail("notional.currency", "a notional in " + terms.pair.quote +
                                          " converts at the strike, and these legs have several; give it in " +
                                          terms.pair.base);
        t.quantity = terms.notional_amount / strike;
    } else {
        fail("notional.currency",
             "must be " + terms.pair.base + " or " + terms.pair.quote + ", got " + terms.notional_currency);
    }
    if (per_quote_notional(terms.premium) && common_strike(t) == 0)
        fail("conventions.premium", to_string(terms.premium) + " is per unit of the " + terms.pair.quote +
                                        " notional, which converts at the strike, and these legs have several; "
                                        "use domestic_per_foreign, domestic_pips or percent_of_foreign");
}

json write_currency_section(const trade& t, const trade_result& r) {
    const currency_terms& c = *t.currency;
    const currency_dates& d = c.dates;
    const double spot_years = year_fraction(d.trade, d.spot), delivery_years = year_fraction(d.trade, d.delivery);
    const double strike = common_strike(t);
    const auto rate_json = [&](const curve& k, const std::optional<quoted_rate>& q) {
        return json{{"zero_rate", k.average(spot_years, delivery_years)},
                    {"discount_factor", k.discount(spot_years, delivery_years)},
                    {"quoted", quoted_json(q)}};
    };
    json out = {
        {"pair", c.pair.name()},
        {"base", c.pair.base},
        {"quote", c.pair.quote},
        {"pip_size", c.pair.pip_size},
        {"spot_lag_days", c.spot_lag_days},
        {"dates",
         {{"trade", to_iso(d.trade)},
          {"spot", to_iso(d.spot)},
          {"expiry", to_iso(d.expiry)},
          {"delivery", to_iso(d.delivery)},
          {"premium", to_iso(d.premium)}}},
        {"years",
         {{"volatility", c.volatility_years},
          {"discounting", year_fraction(d.premium, d.delivery)},
          {"forward", year_fraction(d.spot, d.delivery)}}},
        {"rates",
         {{"domestic", rate_json(c.domestic, c.domestic_quoted)},
          {"foreign", rate_json(c.foreign, c.foreign_quoted)},
          {"note",
           "zero_rate: continuously compounded ACT/365F from the spot date to the delivery date; "
           "discount_factor over the same days"}}},
        {"forward", c.forward},
        {"forward_points", forward_points(c, t.market.spot)},
        {"discount_factor", c.discount},
        {"lattice",
         {{"rate", t.market.rate.first_rate()},
          {"carry", t.market.carry_yield.first_rate()},
          {"years", c.volatility_years},
          {"note",
           "flat continuously compounded rate and carry over the volatility time: exp(-rate x years) is "
           "the domestic discount factor from delivery to the premium date, spot x exp((rate - carry) x "
           "years) the forward"}}},
        {"notional",
         {{"amount", c.notional_amount},
          {"currency", c.notional_currency},
          {c.pair.base, t.quantity},
          {c.pair.quote, strike == 0 ? json(nullptr) : json(t.quantity * strike)}}},
        {"premium", premium_json(t, r.premium)},
        {"delta", delta_json(t, r)},
    };
    if (!c.smile_by_delta.empty()) out["smile_by_delta"] = smile_by_delta_json(c);
    return out;
}

namespace {

void replace_all(std::string& text, const std::string& from, const std::string& to) {
    for (std::size_t at = text.find(from); at != std::string::npos; at = text.find(from, at + to.size()))
        text.replace(at, from.size(), to);
}

/// A name (a key, or a column listed by name) in a pair's words.
std::string pair_name(std::string name) {
    replace_all(name, "shares", "foreign");
    replace_all(name, "dividends", "foreign_interest");  // what the foreign currency held earns
    replace_all(name, "carry_yield", "carry");
    return name;
}

/// A sentence in a pair's words.
std::string pair_sentence(std::string text) {
    replace_all(text, "shares_", "foreign_");
    replace_all(text, "shares", "foreign currency");
    replace_all(text, "dividend yield", "foreign rate");
    replace_all(text, "dividends", "foreign interest");
    replace_all(text, "carry_yield", "carry");
    return text;
}

}  // namespace

void use_currency_words(json& result) {
    if (result.is_string()) {
        const std::string& text = result.get_ref<const std::string&>();
        result = text.find(' ') == std::string::npos ? pair_name(text) : pair_sentence(text);
        return;
    }
    if (result.is_array()) {
        for (auto& item : result) use_currency_words(item);
        return;
    }
    if (!result.is_object()) return;
    json renamed = json::object();
    for (auto& [key, value] : result.items()) {
        use_currency_words(value);
        renamed[pair_name(key)] = std::move(value);
    }
    result = std::move(renamed);
}

}  // namespace hedgeleaf
