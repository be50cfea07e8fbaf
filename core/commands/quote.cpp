// Hedgeleaf commands: the `quote` section (see quote.hpp).
#include "commands/quote.hpp"

#include "commands/cautions.hpp"
#include "commands/trade_reader.hpp"

#include <algorithm>

namespace hedgeleaf {

namespace {

/// Characters (not bytes) of UTF-8 text: continuation bytes are not counted.
std::size_t char_count(const std::string& s) {
    return static_cast<std::size_t>(
        std::count_if(s.begin(), s.end(), [](char c) { return (static_cast<unsigned char>(c) & 0xC0) != 0x80; }));
}

/// Plain text for the page and the printed sheet: length-limited, no control
/// characters (line breaks allowed where `multi_line`).
std::string plain_text(field_reader& r, const std::string& key, std::size_t max_chars, bool multi_line) {
    const std::string path = r.child(key);
    std::string s = r.text(key, 4 * max_chars);  // bytes; the character limit follows
    const std::size_t n = char_count(s);
    if (n > max_chars)
        fail(path, "is too long (" + std::to_string(n) + " characters, at most " + std::to_string(max_chars) + ")");
    for (std::size_t i = 0; i < s.size(); ++i) {
        const unsigned char c = static_cast<unsigned char>(s[i]);
        const bool allowed_break = multi_line && (c == '\n' || c == '\r' || c == '\t');
        if ((c < 0x20 || c == 0x7F) && !allowed_break)
            fail(path, "must be plain text without control characters (character " + std::to_string(i + 1) + ")");
    }
    return s;
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

json level_json(const price_level& level) {
    return json{
        {"per_unit", level.per_unit}, {"total", level.total}, {"fraction_of_notional", level.fraction_of_notional}};
}

}  // namespace

std::optional<quote_terms> read_quote_terms(const json& document, const trade& t) {
    const json* section = section_of(document, "quote");
    if (!section) return std::nullopt;
    field_reader r(*section, "quote");
    quote_terms q;
    q.currency = read_currency(r);
    q.margin_type = enum_of<margin_kind>(margin_types, r.choice_or("margin_type", margin_types, "absolute"));
    const std::string margin_path = r.child("margin");
    q.margin = r.number_or("margin", 0.0);
    check_margin(t, q.margin_type, q.margin, margin_path);
    q.tick = r.number_optional("tick");
    if (q.tick) {
        require_positive(*q.tick, r.child("tick"));
        require_at_most(*q.tick, t.market.spot, r.child("tick"));
    }
    if (r.has("client"))
        q.client = plain_text(r, "client", max_client_name_chars, false);
    else
        r.raw_optional("client");
    if (r.has("notes"))
        q.notes = plain_text(r, "notes", max_notes_chars, true);
    else
        r.raw_optional("notes");
    r.finish();
    return q;
}

json write_client_price(const quote_terms& terms, const client_price& price, bool term_structures) {
    return json{{"currency", terms.currency.empty() ? json(nullptr) : json(terms.currency)},
                {"margin_type", word_of(margin_types, terms.margin_type)},
                {"margin", terms.margin},
                {"tick", terms.tick ? json(*terms.tick) : json(nullptr)},
                {"mid", level_json(price.mid)},
                {"bid", level_json(price.bid)},
                {"offer", level_json(price.offer)},
                {"client_side", price.client_buys ? "buys at the offer" : "sells at the bid"},
                {"per_unit", price.per_unit},
                {"total", price.total},
                {"fraction_of_notional", price.fraction_of_notional},
                {"notional", price.notional},
                {"notional_basis", "quantity x spot"},
                {"desk_margin_total", price.desk_margin_total},
                {"client", terms.client ? json(*terms.client) : json(nullptr)},
                {"notes", terms.notes ? json(*terms.notes) : json(nullptr)},
                {"caution", client_caution(term_structures)}};
}

}  // namespace hedgeleaf
