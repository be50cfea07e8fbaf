// Hedgeleaf core: the client price (see quote.hpp).
#include "quote.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

constexpr double max_fraction = 1.0;         // a margin of the whole premium on each side
constexpr double max_vol_margin = 0.5;       // fifty volatility points

/// Characters (not bytes) of UTF-8 text: continuation bytes are not counted.
std::size_t char_count(const std::string& s) {
    return static_cast<std::size_t>(std::count_if(s.begin(), s.end(), [](char c) {
        return (static_cast<unsigned char>(c) & 0xC0) != 0x80;
    }));
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

// Ticks: a price within a billionth of a tick of a tick is on it (binary
// fractions would otherwise push 1.10 up to 1.11).
double round_up(double x, double tick) { return std::ceil(x / tick - 1e-9) * tick; }
double round_down(double x, double tick) { return std::floor(x / tick + 1e-9) * tick; }
double round_near(double x, double tick) { return std::round(x / tick) * tick; }
// Show 1.1, not 1.1000000000000001, after multiplying by a tick.
double tidy(double x) { return x == 0 ? 0.0 : std::round(x * 1e10) / 1e10; }

json price_level(double per_unit, double quantity, double spot) {
    return json{{"per_unit", per_unit}, {"total", per_unit * quantity + 0.0}, {"fraction_of_notional", per_unit / spot}};
}

}  // namespace

const char* client_caution() {
    return "Indicative only: not an offer to deal, not a commitment to trade and not advice. Model values from a "
           "binomial lattice with constant volatility and interest rates; they hold only for the inputs shown. "
           "Follow your firm's and your jurisdiction's sales rules.";
}

json client_price_json(const trade& t, const trade_result& priced) {
    if (!t.source.is_object() || !t.source.contains("quote") || t.source.at("quote").is_null()) return nullptr;
    field_reader r(t.source.at("quote"), "quote");
    const std::string currency = read_currency(r);
    const std::string kind = r.choice_or("margin_type", {"absolute", "fraction_of_premium", "volatility"}, "absolute");
    const std::string margin_path = r.child("margin");
    const double margin = r.number_or("margin", 0.0);
    require_non_negative(margin, margin_path);
    if (kind == "absolute") require_at_most(margin, t.market.spot, margin_path);
    if (kind == "fraction_of_premium") require_at_most(margin, max_fraction, margin_path);
    if (kind == "volatility") {
        require_at_most(margin, max_vol_margin, margin_path);
        if (!(margin < t.market.volatility))
            fail(margin_path, "must be below market.volatility " + format_number(t.market.volatility) +
                                  " (the bid re-prices at volatility - margin), got " + format_number(margin));
        const double highest = highest_volatility(t.final_expiry());  // the lattice's limit for this expiry
        if (t.market.volatility + margin > highest)
            fail(margin_path, "takes the volatility above " + format_number(highest) +
                                  (highest < max_volatility ? ", the most the lattice holds over this expiry" : ""));
    }
    const std::optional<double> tick = r.number_optional("tick");
    if (tick) {
        require_positive(*tick, r.child("tick"));
        require_at_most(*tick, t.market.spot, r.child("tick"));
    }
    std::optional<std::string> client, notes;
    if (r.has("client")) client = plain_text(r, "client", max_client_name_chars, false);
    else r.raw_optional("client");
    if (r.has("notes")) notes = plain_text(r, "notes", max_notes_chars, true);
    else r.raw_optional("notes");
    r.finish();

    const double mid = priced.premium;
    double bid = mid, offer = mid;
    if (kind == "absolute") {
        bid = mid - margin;
        offer = mid + margin;
    } else if (kind == "fraction_of_premium") {
        bid = mid - margin * std::fabs(mid);
        offer = mid + margin * std::fabs(mid);
    } else if (margin > 0) {
        // A structure can be short volatility: the offer is the dearer of the two re-prices.
        const auto at_vol = [&](double vol) {
            trade moved = t;
            moved.market.volatility = vol;
            return price_trade_fast(moved).premium;
        };
        const double up = at_vol(t.market.volatility + margin), down = at_vol(t.market.volatility - margin);
        bid = std::min(up, down);
        offer = std::max(up, down);
    }
    double shown_mid = mid;
    if (tick) {
        bid = tidy(round_down(bid, *tick));
        offer = tidy(round_up(offer, *tick));
        shown_mid = tidy(round_near(mid, *tick));
    }

    const double q = t.quantity;
    const double spot = t.market.spot;
    const bool client_buys = !t.client_sells;
    const double per_unit = client_buys ? offer : bid;
    json out{{"currency", currency.empty() ? json(nullptr) : json(currency)},
             {"margin_type", kind},
             {"margin", margin},
             {"tick", tick ? json(*tick) : json(nullptr)},
             {"mid", price_level(shown_mid, q, spot)},
             {"bid", price_level(bid, q, spot)},
             {"offer", price_level(offer, q, spot)},
             {"client_side", client_buys ? "buys at the offer" : "sells at the bid"},
             {"per_unit", per_unit},
             {"total", per_unit * q},
             {"fraction_of_notional", per_unit / spot},
             {"notional", q * spot},
             {"notional_basis", "quantity x spot"},
             {"desk_margin_total", (client_buys ? per_unit - mid : mid - per_unit) * q},
             {"client", client ? json(*client) : json(nullptr)},
             {"notes", notes ? json(*notes) : json(nullptr)},
             {"caution", client_caution()}};
    return out;
}

}  // namespace hedgeleaf
