// Hedgeleaf commands: the comparison document and the compare command's result (see compare.hpp).
#include "commands/compare.hpp"

#include "commands/cautions.hpp"
#include "commands/price.hpp"
#include "commands/quote.hpp"
#include "commands/table_columns.hpp"
#include "commands/trade_reader.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

// ---- reading ---------------------------------------------------------------

/// An alternative's trade and quote; a refusal names the field inside the comparison.
alternative read_alternative(const json& document, const std::string& path) {
    try {
        alternative a;
        a.t = read_trade(document);
        a.quote = read_quote_terms(document, a.t);
        return a;
    } catch (const work_exhausted&) {
        throw;
    } catch (const input_error& e) {
        const std::string problem = e.field().empty() ? e.what() : std::string(e.what()).substr(e.field().size() + 2);
        throw input_error(e.field().empty() ? path : join_path(path, e.field()), problem, e.bound());
    }
}

/// Positive prices, sorted: the outcome table's spot levels.
std::vector<double> read_spot_list(field_reader& r, const std::string& key) {
    const json* given = r.raw_optional(key);
    if (!given || given->is_null()) return {};
    const std::string path = r.child(key);
    if (!given->is_array() || given->empty() || given->size() > max_outcome_spots)
        fail(path, "must be a list of 1 to " + std::to_string(max_outcome_spots) + " spots, got " + describe(*given));
    std::vector<double> spots;
    for (std::size_t i = 0; i < given->size(); ++i) {
        const double x = as_number((*given)[i], index_path(path, i));
        require_positive(x, index_path(path, i));
        require_at_most(x, max_scenario_level, index_path(path, i));
        spots.push_back(x);
    }
    std::sort(spots.begin(), spots.end());
    return spots;
}

comparison_settings read_settings(field_reader& c) {
    comparison_settings s;
    if (c.has("title"))
        s.title = read_plain_text(c, "title", max_title_chars, false);
    else
        c.raw_optional("title");
    s.spot_low = c.number_optional("spot_low");
    s.spot_high = c.number_optional("spot_high");
    if (s.spot_low) require_positive(*s.spot_low, c.child("spot_low"));
    if (s.spot_high) {
        require_positive(*s.spot_high, c.child("spot_high"));
        require_at_most(*s.spot_high, max_scenario_level, c.child("spot_high"));
    }
    if (s.spot_low && s.spot_high && !(*s.spot_high > *s.spot_low))
        fail(c.child("spot_high"),
             "must be above spot_low " + format_number(*s.spot_low) + ", got " + format_number(*s.spot_high));
    s.points = static_cast<int>(c.integer_or("points", default_profile_points, 2, max_profile_points));
    s.outcome_spots = read_spot_list(c, "outcome_spots");
    return s;
}

/// The alternatives are ways to trade one underlying on one day, with totals in one currency.
void check_alike(const std::vector<alternative>& alternatives, const std::string& list_path) {
    const alternative& first = alternatives.front();
    std::string currency = first.quote ? first.quote->currency : "";
    for (std::size_t i = 1; i < alternatives.size(); ++i) {
        const alternative& a = alternatives[i];
        const std::string at = index_path(list_path, i);
        if (a.t.market.spot != first.t.market.spot)
            fail(join_path(at, "market.spot"),
                 "must be the first alternative's spot " + format_number(first.t.market.spot) +
                     " (alternatives trade one underlying), got " + format_number(a.t.market.spot));
        if (a.t.valuation_date && first.t.valuation_date && !(*a.t.valuation_date == *first.t.valuation_date))
            fail(join_path(at, "valuation_date"), "must be the first alternative's " + to_iso(*first.t.valuation_date) +
                                                      ", got " + to_iso(*a.t.valuation_date));
        const std::string own = a.quote ? a.quote->currency : "";
        if (!own.empty() && !currency.empty() && own != currency)
            fail(join_path(at, "quote.currency"),
                 "must be " + currency + " like the alternatives before it (totals are set side by side), got " + own);
        if (currency.empty()) currency = own;
    }
}

}  // namespace

comparison_input read_comparison(const json& document) {
    comparison_input in;
    if (!document.is_object() || !document.contains(comparison_key)) {
        in.alternatives.push_back(read_alternative(document, ""));
        in.settings.outcome_spots.clear();
        return in;
    }
    field_reader top(document, "");
    field_reader c(top.raw(comparison_key), comparison_key);
    top.finish();
    const json& list = c.raw("alternatives");
    const std::string list_path = c.child("alternatives");
    if (!list.is_array() || list.empty() || list.size() > max_alternatives)
        fail(list_path,
             "must be a list of 1 to " + std::to_string(max_alternatives) + " trade documents, got " + describe(list));
    for (std::size_t i = 0; i < list.size(); ++i)
        in.alternatives.push_back(read_alternative(list[i], index_path(list_path, i)));
    in.settings = read_settings(c);
    c.finish();
    check_alike(in.alternatives, list_path);
    return in;
}

work_estimate estimate_comparison_work(const comparison_input& input) {
    work_estimate w;
    for (const auto& a : input.alternatives) w.node_updates += estimate_price_work(a.t).node_updates;
    w.what = std::to_string(input.alternatives.size()) + " alternative" + (input.alternatives.size() == 1 ? "" : "s") +
             ", each priced as the price command prices it,";
    return w;
}

// ---- writing ---------------------------------------------------------------

namespace {

/// One row of the comparison table: an alternative in the client's figures (totals for the
/// whole quantity; with the holding where the client has one).
struct comparison_row {
    std::string label, client_side;
    double quantity = 0, client_price = 0, client_price_total = 0, fraction_of_notional = 0;
    double bid = 0, offer = 0, delta = 0, position_delta = 0, holding_shares = 0;
    std::optional<double> break_even_low, break_even_high, protection_from, protection_down_to, cap;
    std::optional<double> worst_pnl, best_pnl;
};

using row_column = column<comparison_row>;

const std::vector<row_column>& row_columns() {
    static const std::vector<row_column> columns = {
        {"label", [](const comparison_row& r) { return json(r.label); }},
        {"client_side", [](const comparison_row& r) { return json(r.client_side); }},
        {"quantity", &comparison_row::quantity},
        {"client_price", &comparison_row::client_price},
        {"client_price_total", &comparison_row::client_price_total},
        {"fraction_of_notional", &comparison_row::fraction_of_notional},
        {"bid", &comparison_row::bid},
        {"offer", &comparison_row::offer},
        {"holding_shares", &comparison_row::holding_shares},
        {"break_even_low", [](const comparison_row& r) { return number_or_null(r.break_even_low); }},
        {"break_even_high", [](const comparison_row& r) { return number_or_null(r.break_even_high); }},
        {"protection_from", [](const comparison_row& r) { return number_or_null(r.protection_from); }},
        {"protection_down_to", [](const comparison_row& r) { return number_or_null(r.protection_down_to); }},
        {"cap", [](const comparison_row& r) { return number_or_null(r.cap); }},
        {"worst_pnl", [](const comparison_row& r) { return number_or_null(r.worst_pnl); }},
        {"best_pnl", [](const comparison_row& r) { return number_or_null(r.best_pnl); }},
        {"delta", &comparison_row::delta},
        {"position_delta", &comparison_row::position_delta},
    };
    return columns;
}

std::string label_of(const alternative_figures& f, std::size_t i) {
    return f.terms.label ? *f.terms.label : "alternative " + std::to_string(i + 1);
}

/// The break-evens the table shows: with the holding where there is one.
const break_evens& shown_break_evens(const client_outcomes& c) {
    return c.holding_per_unit != 0 ? c.with_holding : c.alone;
}

comparison_row row_of(const trade& t, const alternative_figures& f, std::size_t i) {
    comparison_row r;
    const double q = t.quantity;
    const double side = f.price.client_buys ? 1.0 : -1.0;
    r.label = label_of(f, i);
    r.client_side = f.price.client_buys ? "buys" : "sells";
    r.quantity = q;
    r.client_price = f.price.per_unit;
    r.client_price_total = f.price.total;
    r.fraction_of_notional = f.price.fraction_of_notional;
    r.bid = f.price.bid.per_unit;
    r.offer = f.price.offer.per_unit;
    r.holding_shares = f.terms.holding_shares;
    const break_evens& evens = shown_break_evens(f.client);
    if (!evens.points.empty()) {
        r.break_even_low = evens.points.front();
        r.break_even_high = evens.points.back();
    }
    if (f.client.protection) {
        r.protection_from = f.client.protection->from;
        r.protection_down_to = f.client.protection->down_to;
    }
    r.cap = f.client.cap;
    if (f.client.worst_per_unit) r.worst_pnl = q * *f.client.worst_per_unit + 0.0;
    if (f.client.best_per_unit) r.best_pnl = q * *f.client.best_per_unit + 0.0;
    r.delta = f.priced.priced.sensitivities.delta;
    r.position_delta = side * q * r.delta + f.terms.holding_shares + 0.0;
    return r;
}

/// The legs as the client deals them: side, type, strike (and as a fraction of spot),
/// expiry, exercise, quantity for the whole trade and notional (quantity x spot).
json legs_json(const trade& t, const client_price& price) {
    const double side = price.client_buys ? 1.0 : -1.0;
    json legs = json::array();
    for (const auto& leg : t.legs) {
        const double signed_quantity = side * leg.quantity * t.quantity;
        json out{{"side", signed_quantity > 0 ? "buys" : "sells"},
                 {"type", to_string(leg.type)},
                 {"quantity", std::fabs(signed_quantity)},
                 {"notional", std::fabs(signed_quantity) * t.market.spot}};
        if (leg.type != payoff_kind::stock) {
            out["strike"] = leg.strike;
            out["strike_fraction_of_spot"] = leg.strike / t.market.spot;
            out["expiry_years"] = leg.expiry_years;
            const auto on = date_after_years(t, leg.expiry_years);
            out["expiry_date"] = on ? json(*on) : json(nullptr);
            out["exercise"] = to_string(leg.exercise);
            if (leg.type == payoff_kind::digital_call || leg.type == payoff_kind::digital_put)
                out["payout"] = leg.payout;
        }
        legs.push_back(out);
    }
    return legs;
}

json client_price_json(const alternative_figures& f) {
    return json{{"client_side", f.price.client_buys ? "buys at the offer" : "sells at the bid"},
                {"per_unit", f.price.per_unit},
                {"total", f.price.total},
                {"fraction_of_notional", f.price.fraction_of_notional},
                {"two_way", f.terms.two_way},
                {"bid", price_level_json(f.price.bid)},
                {"offer", price_level_json(f.price.offer)},
                {"spread", f.price.spread},
                {"tick", f.terms.tick ? json(*f.terms.tick) : json(nullptr)}};
}

/// What only the desk sees: the model value, the margin, the Greeks of the position and the lattice.
json desk_json(const trade& t, const alternative_figures& f) {
    const trade_result& r = f.priced.priced;
    const double q = t.signed_quantity();
    return json{{"model_value", price_level_json(f.price.mid)},
                {"unrounded_model_value", r.premium},
                {"margin_type", word_of(margin_types, f.terms.margin_type)},
                {"margin", f.terms.margin},
                {"desk_margin_total", f.price.desk_margin_total},
                {"greeks", greeks_json(r.sensitivities)},
                {"position_greeks", greeks_json(q * r.sensitivities)},
                {"early_exercise_premium", r.has_early_exercise ? json(r.early_exercise_premium) : json(nullptr)},
                {"lattice",
                 {{"method", to_string(r.method)},
                  {"steps", r.steps},
                  {"extrapolated", r.extrapolated},
                  {"error_estimate", r.error_estimate}}}};
}

json alternative_json(const alternative& a, const alternative_figures& f, std::size_t i) {
    const trade& t = a.t;
    json out{{"label", label_of(f, i)},
             {"side", t.client_sells ? "sell" : "buy"},
             {"quantity", t.quantity},
             {"spot", t.market.spot},
             {"notional", f.price.notional},
             {"currency", f.terms.currency.empty() ? json(nullptr) : json(f.terms.currency)},
             {"valuation_date", t.valuation_date ? json(to_iso(*t.valuation_date)) : json(nullptr)},
             {"holding", f.terms.holding_shares > 0 ? json{{"shares", f.terms.holding_shares}} : json(nullptr)},
             {"sheet", sheet_terms_json(f.terms)},
             {"legs", legs_json(t, f.price)},
             {"client_price", client_price_json(f)},
             {"at_expiry", client_figures_json(t, f.client)},
             {"delta", f.priced.priced.sensitivities.delta},
             {"outcomes", client_outcomes_json(f.outcomes)},
             {"curve", client_outcomes_json(f.curve)},
             {"desk", desk_json(t, f)}};
    return out;
}

std::vector<std::string> comparison_notes(const comparison_input& in, const comparison_result& r) {
    std::vector<std::string> notes{
        "client figures are at the client price (the offer when the client buys, the bid when the client sells), "
        "not at the desk's model value",
        "totals are for the whole quantity; a holding of shares is shown with the trade (its change in value from "
        "today's spot) and is not part of the price",
        "break-evens, protection, cap and the best and worst P&L are at each alternative's first expiry, with the "
        "holding where there is one; null means none or unbounded"};
    const bool later_legs = std::any_of(r.alternatives.begin(), r.alternatives.end(),
                                        [](const alternative_figures& f) { return !f.client.one_expiry; });
    if (later_legs)
        notes.push_back(
            "an alternative whose legs expire on different dates is shown at its first expiry, later legs valued there "
            "in closed form; it has no best or worst P&L, protection or cap");
    if (in.alternatives.size() > 1)
        notes.push_back("the chart's spots and the outcome spots are common to every alternative");
    return notes;
}

}  // namespace

json write_comparison_result(const comparison_input& in, const comparison_result& r) {
    std::vector<comparison_row> rows;
    json alternatives = json::array();
    std::string currency;
    for (std::size_t i = 0; i < in.alternatives.size(); ++i) {
        rows.push_back(row_of(in.alternatives[i].t, r.alternatives[i], i));
        alternatives.push_back(alternative_json(in.alternatives[i], r.alternatives[i], i));
        if (currency.empty()) currency = r.alternatives[i].terms.currency;
    }
    // a currency pair's pip, for per-unit figures to a hundredth of one (null for a share); a
    // pair's amounts are in its quote currency when no quote section names one
    const auto& pair = in.alternatives.front().t.currency;
    if (currency.empty() && pair) currency = pair->pair.quote;
    return json{{"title", in.settings.title.empty() ? json(nullptr) : json(in.settings.title)},
                {"spot", in.alternatives.front().t.market.spot},
                {"currency", currency.empty() ? json(nullptr) : json(currency)},
                {"pip_size", pair ? json(pair->pair.pip_size) : json(nullptr)},
                {"rows", row_objects(row_columns(), rows)},
                {"columns", column_names(row_columns())},
                {"outcome_spots", r.outcome_spots},
                {"chart", {{"spot_low", r.spot_low}, {"spot_high", r.spot_high}, {"spots", r.chart_spots.size()}}},
                {"alternatives", alternatives},
                {"notes", comparison_notes(in, r)},
                {"caution", client_caution()},
                {"table_sections", {"title", "spot", "currency", "rows", "outcome_spots", "notes", "caution"}}};
}

}  // namespace hedgeleaf
