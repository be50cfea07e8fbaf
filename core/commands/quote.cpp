// Hedgeleaf commands: the `quote` section (see quote.hpp).
#include "commands/quote.hpp"

#include "commands/cautions.hpp"
#include "commands/table_columns.hpp"
#include "commands/trade_reader.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>

namespace hedgeleaf {

namespace {

/// Characters (not bytes) of UTF-8 text: continuation bytes are not counted.
std::size_t char_count(const std::string& s) {
    return static_cast<std::size_t>(
        std::count_if(s.begin(), s.end(), [](char c) { return (static_cast<unsigned char>(c) & 0xC0) != 0x80; }));
}

// Optional: a quote for a client name alone must not refuse the trade ("" = no label).
std::string read_currency(field_reader& r) {
    const std::string path = r.child("currency");
    const json* given = r.raw_optional("currency");
    if (!given) return "";
    const json& v = *given;
    const std::string shape = "must be an ISO 4217 currency code of three capital letters (e.g. EUR, USD, GBP)";
    if (!v.is_string()) fail(path, shape + ", got " + describe(v));
    const std::string& s = v.get_ref<const std::string&>();
    const bool ok = s.size() == 3 && std::all_of(s.begin(), s.end(), [](char c) { return c >= 'A' && c <= 'Z'; });
    if (!ok) fail(path, shape + ", got " + describe(v));
    return s;
}

void check_margin(const trade& t, margin_kind kind, double margin, const std::string& margin_path) {
    require_non_negative(margin, margin_path);
    if (kind == margin_kind::absolute) require_at_most(margin, t.market.spot, margin_path);
    if (kind == margin_kind::fraction_of_premium) require_at_most(margin, max_margin_fraction, margin_path);
    if (kind == margin_kind::volatility) {
        require_at_most(margin, max_volatility_margin, margin_path);
        if (!(margin < t.market.volatility))
            fail(margin_path, "must be below market.volatility " + format_number(t.market.volatility) +
                                  " (the bid re-prices at volatility - margin), got " + format_number(margin));
        const double highest = highest_volatility(t.final_expiry_years());  // the lattice's limit for this expiry
        if (t.market.volatility + margin > highest)
            fail(margin_path, "takes the volatility above " + format_number(highest) +
                                  (highest < max_volatility ? ", the most the lattice holds over this expiry" : ""));
    }
}

/// Optional plain text: absent or null gives none.
std::optional<std::string> optional_text(field_reader& r, const std::string& key, std::size_t max_chars,
                                         bool multi_line = false) {
    if (!r.has(key)) {
        r.raw_optional(key);
        return std::nullopt;
    }
    return read_plain_text(r, key, max_chars, multi_line);
}

/// Two digits at `at` of `text`, within [lo, hi]; -1 when they are not.
int two_digits(const std::string& text, std::size_t at, int lo, int hi) {
    if (at + 2 > text.size() || !std::isdigit(static_cast<unsigned char>(text[at])) ||
        !std::isdigit(static_cast<unsigned char>(text[at + 1])))
        return -1;
    const int v = (text[at] - '0') * 10 + (text[at + 1] - '0');
    return v >= lo && v <= hi ? v : -1;
}

/// The rest of an ISO 8601 date and time after its date: "", "THH:MM", "THH:MM:SS", each
/// optionally followed by "Z" or a UTC offset "+HH:MM" / "-HH:MM".
bool valid_time_part(const std::string& rest) {
    if (rest.empty()) return true;
    if (rest[0] != 'T' || two_digits(rest, 1, 0, 23) < 0 || rest.size() < 6 || rest[3] != ':' ||
        two_digits(rest, 4, 0, 59) < 0)
        return false;
    std::size_t at = 6;
    if (at < rest.size() && rest[at] == ':') {
        if (two_digits(rest, at + 1, 0, 59) < 0) return false;
        at += 3;
    }
    if (at == rest.size()) return true;
    if (rest[at] == 'Z') return at + 1 == rest.size();
    return (rest[at] == '+' || rest[at] == '-') && rest.size() == at + 6 && two_digits(rest, at + 1, 0, 23) >= 0 &&
           rest[at + 3] == ':' && two_digits(rest, at + 4, 0, 59) >= 0;
}

/// Until when the quote is indicative: a date, or a date and time, not before the valuation date.
std::optional<std::string> read_indicative_until(field_reader& r, const trade& t) {
    const std::string path = r.child("indicative_until");
    const std::optional<std::string> text = r.text_optional("indicative_until", max_datetime_chars);
    if (!text) return std::nullopt;
    const auto bad = [&] {
        fail(path,
             "must be a date YYYY-MM-DD or a date and time YYYY-MM-DDTHH:MM (seconds and a UTC offset such as Z or "
             "+01:00 optional), got \"" +
                 *text + "\"");
    };
    if (text->size() < 10 || !valid_time_part(text->substr(10))) bad();
    date day{};
    try {
        day = parse_iso_date(text->substr(0, 10), path);
    } catch (const input_error&) {
        bad();
    }
    if (t.valuation_date && days_from_civil(day) < days_from_civil(*t.valuation_date))
        fail(path, "must not be before valuation_date " + to_iso(*t.valuation_date) + ", got \"" + *text + "\"");
    return text;
}

/// The client's holding, {"shares": N}: shown with the trade, never priced into it.
double read_holding(field_reader& r) {
    const json* given = r.raw_optional("holding");
    if (!given || given->is_null()) return 0;
    field_reader h(*given, r.child("holding"));
    const double shares = h.number("shares");
    require_positive(shares, h.child("shares"));
    require_at_most(shares, max_quantity, h.child("shares"));
    h.finish();
    return shares;
}

json optional_json(const std::optional<std::string>& text) { return text ? json(*text) : json(nullptr); }

const std::vector<column<client_outcome>>& outcome_columns() {
    static const std::vector<column<client_outcome>> columns = {
        {"spot", &client_outcome::spot},
        {"spot_change", &client_outcome::spot_change},
        {"payoff", &client_outcome::payoff},
        {"pnl", &client_outcome::pnl},
        {"pnl_per_unit", &client_outcome::pnl_per_unit},
        {"holding_pnl", &client_outcome::holding_pnl},
        {"pnl_with_holding", &client_outcome::pnl_with_holding},
        {"pnl_with_holding_per_unit", &client_outcome::pnl_with_holding_per_unit},
    };
    return columns;
}

json break_evens_json(const break_evens& b) {
    json ranges = json::array();
    for (const auto& [from, to] : b.ranges) ranges.push_back({from, to});
    return json{{"points", b.points}, {"ranges", ranges}};
}

}  // namespace

std::string read_plain_text(field_reader& r, const std::string& key, std::size_t max_chars, bool multi_line) {
    const std::string path = r.child(key);
    std::string s = r.text(key, 4 * max_chars);  // bytes; the character limit follows
    const std::size_t n = char_count(s);
    if (n > max_chars)
        fail(path, "is too long (" + std::to_string(n) + " characters, at most " + std::to_string(max_chars) + ")");
    for (std::size_t i = 0; i < s.size(); ++i) {
        const unsigned char c = static_cast<unsigned char>(s[i]);
        const bool allowed_break = multi_line && (c == '\n' || c == '\r' || c == '\t');
        if ((c < 0x20 || c == 0x7F) && !allowed_break)
            fail(path, "must be plain text without control characters (character " +
                           std::to_string(char_count(s.substr(0, i)) + 1) + ")");  // counted as characters, not bytes
    }
    return s;
}

json price_level_json(const price_level& level) {
    return json{
        {"per_unit", level.per_unit}, {"total", level.total}, {"fraction_of_notional", level.fraction_of_notional}};
}

json sheet_terms_json(const quote_terms& terms) {
    return json{{"label", optional_json(terms.label)},
                {"client", optional_json(terms.client)},
                {"prepared_by", optional_json(terms.prepared_by)},
                {"contact", optional_json(terms.contact)},
                {"indicative_until", optional_json(terms.indicative_until)},
                {"notes", optional_json(terms.notes)}};
}

std::optional<quote_terms> read_quote_terms(const json& document, const trade& t) {
    const json* section = section_of(document, "quote");
    if (!section) return std::nullopt;
    field_reader r(*section, "quote");
    quote_terms q;
    q.currency = read_currency(r);
    // A pair's client price is in its quote currency (per unit of the base, and in total).
    if (t.currency && !q.currency.empty() && q.currency != t.currency->pair.quote)
        fail(r.child("currency"),
             "the client price of a " + t.currency->pair.name() + " trade is in " + t.currency->pair.quote + " (per " +
                 t.currency->pair.base + " and in total), got " + q.currency + "; give " + t.currency->pair.quote +
                 " or leave it out (the premium in " + t.currency->pair.base + " is conventions.premium_currency's)");
    q.margin_type = enum_of<margin_kind>(margin_types, r.choice_or("margin_type", margin_types, "absolute"));
    const std::string margin_path = r.child("margin");
    q.margin = r.number_or("margin", 0.0);
    check_margin(t, q.margin_type, q.margin, margin_path);
    q.tick = r.number_optional("tick");
    if (q.tick) {
        require_tick(*q.tick, t.market.spot, r.child("tick"));
    }
    q.two_way = r.boolean_or("two_way", false);
    q.label = optional_text(r, "label", max_label_chars);
    q.client = optional_text(r, "client", max_client_name_chars);
    q.prepared_by = optional_text(r, "prepared_by", max_preparer_chars);
    q.contact = optional_text(r, "contact", max_contact_chars);
    q.indicative_until = read_indicative_until(r, t);
    q.notes = optional_text(r, "notes", max_notes_chars, true);
    q.holding_shares = read_holding(r);
    r.finish();
    return q;
}

std::optional<std::string> date_after_years(const trade& t, double years) {
    if (!t.valuation_date) return std::nullopt;
    return to_iso(add_days(*t.valuation_date, std::lround(years * 365)));
}

json client_outcomes_json(const std::vector<client_outcome>& rows) { return row_objects(outcome_columns(), rows); }

json client_figures_json(const trade& t, const client_outcomes& c) {
    const double q = t.quantity;
    const auto total = [q](const std::optional<double>& x) { return x ? json(q * *x + 0.0) : json(nullptr); };
    json protection = nullptr;
    if (c.protection) protection = {{"from", c.protection->from}, {"down_to", number_or_null(c.protection->down_to)}};
    const auto horizon = date_after_years(t, c.horizon_years);
    return json{{"horizon_years", c.horizon_years},
                {"horizon_date", horizon ? json(*horizon) : json(nullptr)},
                {"break_even", break_evens_json(c.alone)},
                {"break_even_with_holding", c.holding_per_unit != 0 ? break_evens_json(c.with_holding) : json(nullptr)},
                {"best_pnl", total(c.best_per_unit)},
                {"worst_pnl", total(c.worst_per_unit)},
                {"best_pnl_per_unit", number_or_null(c.best_per_unit)},
                {"worst_pnl_per_unit", number_or_null(c.worst_per_unit)},
                {"protection", protection},
                {"cap", number_or_null(c.cap)}};
}

json write_client_price(const trade& t, const quote_terms& terms, const client_price& price,
                        const client_outcomes& client, const std::vector<client_outcome>& outcomes) {
    json out{{"currency", terms.currency.empty() ? json(nullptr) : json(terms.currency)},
             {"margin_type", word_of(margin_types, terms.margin_type)},
             {"margin", terms.margin},
             {"tick", terms.tick ? json(*terms.tick) : json(nullptr)},
             {"two_way", terms.two_way},
             {"mid", price_level_json(price.mid)},
             {"bid", price_level_json(price.bid)},
             {"offer", price_level_json(price.offer)},
             {"spread", price.spread},
             {"client_side", price.client_buys ? "buys at the offer" : "sells at the bid"},
             {"per_unit", price.per_unit},
             {"total", price.total},
             {"fraction_of_notional", price.fraction_of_notional},
             {"notional", price.notional},
             {"notional_basis", "quantity x spot"},
             {"desk_margin_total", price.desk_margin_total}};
    const json sheet = sheet_terms_json(terms);
    for (const auto& [key, value] : sheet.items()) out[key] = value;
    out["holding"] = terms.holding_shares > 0 ? json{{"shares", terms.holding_shares}} : json(nullptr);
    out["at_expiry"] = client_figures_json(t, client);
    out["outcomes"] = client_outcomes_json(outcomes);
    out["caution"] = client_caution(!t.market.is_plain());
    return out;
}

}  // namespace hedgeleaf
