// Hedgeleaf commands: the `hedge` section and the hedge command's result (see hedge.hpp).
#include "commands/hedge.hpp"

#include "commands/price.hpp"
#include "commands/table_columns.hpp"
#include "commands/trade_reader.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>

namespace hedgeleaf {

namespace {

// A list of years or dates at `path` (dates need the trade's valuation_date).
std::vector<double> read_times(const json& list, const std::string& path, const trade& t, bool as_dates) {
    if (!list.is_array() || list.empty()) fail(path, "must be a non-empty list, got " + describe(list));
    if (list.size() > max_rebalancing_dates)
        fail(path, "has " + std::to_string(list.size()) + " dates, at most " + std::to_string(max_rebalancing_dates));
    const years_reader times{t.valuation_date};
    const double T = t.final_expiry_years();
    std::vector<double> out;
    for (std::size_t i = 0; i < list.size(); ++i) {
        const std::string p = index_path(path, i);
        const double x = as_dates ? times.years_from_date(list[i], p) : as_number(list[i], p);
        if (!(x > 0)) fail(p, as_dates ? "must be after valuation_date" : "must be > 0, got " + format_number(x));
        if (x > T + time_tolerance_years)
            fail(p, as_dates ? "must be on or before the final expiry " +
                                   to_iso(add_days(*t.valuation_date, std::lround(T * 365))) + ", got " +
                                   list[i].get<std::string>()
                             : "must be on or before the final expiry " + format_number(T) + " years, got " +
                                   format_number(x));
        out.push_back(x);
    }
    return out;
}

std::vector<double> read_spots(field_reader& r) {
    const json& list = r.raw("spots");
    const std::string path = r.child("spots");
    if (!list.is_array() || list.empty()) fail(path, "must be a non-empty list of spots, got " + describe(list));
    if (list.size() > max_rebalancing_dates)
        fail(path, "has " + std::to_string(list.size()) + " spots, at most " + std::to_string(max_rebalancing_dates));
    std::vector<double> spots;
    for (std::size_t i = 0; i < list.size(); ++i) {
        const double s = as_number(list[i], index_path(path, i));
        require_positive(s, index_path(path, i));
        require_at_most(s, max_scenario_level, index_path(path, i));
        spots.push_back(s);
    }
    return spots;
}

std::vector<int> read_lattice_moves(field_reader& r) {
    const bool has_moves = r.has("moves"), has_nodes = r.has("nodes");
    if (has_moves == has_nodes) {
        r.raw_optional("moves");
        r.raw_optional("nodes");
        fail(r.child("moves"), "give either moves (\"UUDU...\") or nodes ([0, 1, 1, 2, ...]), one of them");
    }
    std::vector<int> moves;
    if (has_moves) {
        moves = parse_moves(r.text("moves", max_moves_chars), r.child("moves"));
    } else {
        const json& list = r.raw("nodes");
        const std::string path = r.child("nodes");
        if (!list.is_array()) fail(path, "must be a list of node indices, got " + describe(list));
        if (list.size() > static_cast<std::size_t>(max_tree_steps) + 1)
            fail(path,
                 "has " + std::to_string(list.size()) + " entries, at most " + std::to_string(max_tree_steps + 1));
        std::vector<int> nodes;
        for (std::size_t i = 0; i < list.size(); ++i) {
            const double x = as_number(list[i], index_path(path, i));
            if (x != std::floor(x) || x < 0 || x > max_tree_steps)
                fail(index_path(path, i), "must be a whole number from 0 up, got " + format_number(x));
            nodes.push_back(static_cast<int>(x));
        }
        moves = moves_from_nodes(nodes, path);
    }
    if (moves.size() > static_cast<std::size_t>(max_tree_steps))
        fail(r.child(has_moves ? "moves" : "nodes"),
             "has " + std::to_string(moves.size()) + " moves, at most " + std::to_string(max_tree_steps));
    return moves;
}

void read_scenario(field_reader& r, const trade& t, path_spec& p) {
    p.drift = r.number_or("drift", t.market.rate.average(0, t.final_expiry_years()));
    require_at_least(p.drift, -max_abs_rate, r.child("drift"));
    require_at_most(p.drift, max_abs_rate, r.child("drift"));
    p.volatility = r.number_or("volatility", t.market.volatility);
    require_non_negative(p.volatility, r.child("volatility"));
    require_at_most(p.volatility, max_volatility, r.child("volatility"));
    p.seed = static_cast<std::uint64_t>(r.integer_or("seed", 1, 0, max_seed));
}

void read_stress(field_reader& r, const trade& t, path_spec& p) {
    p.shape = enum_of<stress_shape>(stress_shapes, r.choice("shape", stress_shapes));
    p.change = r.number_or("change", default_stress_change);
    require_positive(p.change, r.child("change"));
    if (p.shape == stress_shape::rise)
        require_at_most(p.change, max_rise, r.child("change"));
    else if (!(p.change < 1))
        fail(r.child("change"), "must be below 1 (a fall of 100 % or more), got " + format_number(p.change));
    if (p.shape == stress_shape::gap_down) {
        const years_reader times{t.valuation_date};
        const bool by_date = r.has("date");
        p.gap_years = times.read_years(r, "years", "date");
        const std::string gp = r.child(by_date ? "date" : "years");
        if (!(p.gap_years > 0)) fail(gp, "must be after the valuation date");
        if (!(p.gap_years < t.final_expiry_years() - time_tolerance_years)) fail(gp, "must be before the final expiry");
    }
}

path_spec read_path(const json& node, const trade& t) {
    field_reader r(node, "hedge.path");
    path_spec p;
    const std::string kind = r.choice("kind", path_kinds);
    if (kind == "spots") {
        p.kind = path_kind::spots;
        p.spots = read_spots(r);
    } else if (kind == "lattice") {
        p.kind = path_kind::lattice;
        p.moves = read_lattice_moves(r);
    } else if (kind == "scenario") {
        p.kind = path_kind::scenario;
        read_scenario(r, t, p);
    } else {
        p.kind = path_kind::stress;
        read_stress(r, t, p);
    }
    r.finish();
    return p;
}

tree_spec read_tree_spec(const json& node) {
    field_reader tr(node, "hedge.tree");
    tree_spec tree;
    tree.steps = static_cast<int>(tr.integer_or("steps", 0, 1, max_tree_steps));
    tree.from_step = static_cast<int>(tr.integer_or("from_step", 0, 0, max_tree_steps));
    tree.to_step = static_cast<int>(tr.integer_or("to_step", -1, 0, max_tree_steps));
    tr.finish();
    return tree;
}

}  // namespace

rebalance_spec read_rebalance(const json& node, const std::string& path, const trade& t) {
    field_reader r(node, path);
    rebalance_spec s;
    const bool has_dates = r.has("dates"), has_years = r.has("years");
    const bool has_every = r.has("every") || r.has("unit");
    if (int(has_dates) + int(has_years) + int(has_every) > 1)
        fail(r.child(has_dates ? "dates" : "years"), "give either every and unit, or dates, or years; not two of them");
    if (has_dates || has_years) {
        const std::string key = has_dates ? "dates" : "years";
        s.years = read_times(r.raw(key), r.child(key), t, has_dates);
        s.explicit_dates = true;
    } else {
        s.every = static_cast<int>(r.integer_or("every", 1, 1, max_rebalance_every));
        s.unit = enum_of<rebalance_unit>(rebalance_units, r.choice_or("unit", rebalance_units, "weeks"));
    }
    r.finish();
    return s;
}

hedge_settings read_hedge_settings(const json& document, const trade& t) {
    hedge_settings hs;
    hs.path.drift = t.market.rate.average(0, t.final_expiry_years());
    hs.path.volatility = t.market.volatility;
    const json* section = section_of(document, "hedge");
    if (!section) return hs;
    field_reader r(*section, "hedge");
    if (const json* node = r.raw_optional("rebalance")) {
        hs.rebalance = read_rebalance(*node, "hedge.rebalance", t);
        hs.rebalance_given = true;
    }
    if (const json* node = r.raw_optional("path")) hs.path = read_path(*node, t);
    hs.cost_bp = r.number_or("cost_bp", 0.0);
    require_non_negative(hs.cost_bp, r.child("cost_bp"));
    require_at_most(hs.cost_bp, max_cost_bp, r.child("cost_bp"));
    hs.lattice_steps = static_cast<int>(
        r.integer_or("lattice_steps", default_hedge_lattice_steps, min_hedge_lattice_steps, max_hedge_lattice_steps));
    if (const json* node = r.raw_optional("tree")) hs.tree = read_tree_spec(*node);
    r.finish();
    return hs;
}

std::vector<int> parse_moves(const std::string& moves, const std::string& field) {
    std::vector<int> out;
    for (std::size_t i = 0; i < moves.size(); ++i) {
        const char c = static_cast<char>(std::toupper(static_cast<unsigned char>(moves[i])));
        if (c == 'U')
            out.push_back(1);
        else if (c == 'D')
            out.push_back(0);
        else if (c == ' ' || c == ',' || c == '-')
            continue;  // readable separators: "UUD DU"
        else
            fail(field, "moves are U (up) or D (down); character " + std::to_string(i + 1) + " is \"" +
                            std::string(1, moves[i]) + "\"");
    }
    if (out.empty()) fail(field, "must hold at least one move (U or D)");
    return out;
}

std::vector<int> moves_from_nodes(const std::vector<int>& nodes, const std::string& field) {
    if (nodes.size() < 2) fail(field, "must list at least two node indices, starting with 0");
    if (nodes[0] != 0) fail(index_path(field, 0), "must be 0 (the valuation node), got " + std::to_string(nodes[0]));
    std::vector<int> out;
    for (std::size_t i = 1; i < nodes.size(); ++i) {
        const int d = nodes[i] - nodes[i - 1];
        if (d != 0 && d != 1)
            fail(index_path(field, i), "must be the previous index (down) or one more (up), got " +
                                           std::to_string(nodes[i]) + " after " + std::to_string(nodes[i - 1]));
        out.push_back(d);
    }
    return out;
}

std::string moves_text(const std::vector<int>& moves) {
    std::string s;
    for (int m : moves) s += m ? 'U' : 'D';
    return s;
}

namespace {

using hedge_column = column<hedge_row>;

// The schedule's columns, in the order --table and --csv follow.
const std::vector<hedge_column>& hedge_columns() {
    static const std::vector<hedge_column> columns = {
        {"date", [](const hedge_row& r) { return r.day ? json(to_iso(*r.day)) : json(nullptr); }},
        {"years", &hedge_row::years},
        {"event", [](const hedge_row& r) { return json(r.event); }},
        {"spot", &hedge_row::spot},
        {"option_value", &hedge_row::option_value},
        {"paid", &hedge_row::paid},
        {"delta", [](const hedge_row& r) { return r.delta ? json(*r.delta) : json(nullptr); }},
        {"shares_held", &hedge_row::shares_held},
        {"shares_traded", &hedge_row::shares_traded},
        {"trade_cash_flow", &hedge_row::trade_cash_flow},
        {"cash", &hedge_row::cash},
        {"interest", &hedge_row::interest},
        {"dividends", &hedge_row::dividends},
        {"cost", &hedge_row::cost},
        {"portfolio_value", &hedge_row::portfolio_value},
        {"tracking_error", &hedge_row::tracking_error},
        {"desk_shares", &hedge_row::desk_shares},
        {"desk_pnl", &hedge_row::desk_pnl},
    };
    return columns;
}

json path_json(const path_spec& p) {
    json path{{"kind", word_of(path_kinds, p.kind)}};
    switch (p.kind) {
        case path_kind::scenario:
            path["drift"] = p.drift;
            path["volatility"] = p.volatility;
            path["seed"] = p.seed;
            break;
        case path_kind::lattice: path["moves"] = moves_text(p.moves); break;
        case path_kind::stress:
            path["shape"] = word_of(stress_shapes, p.shape);
            path["change"] = p.change;
            if (p.shape == stress_shape::gap_down) path["gap_years"] = p.gap_years;
            break;
        case path_kind::spots: break;
    }
    return path;
}

json rebalance_json(const hedge_settings& hs) {
    if (hs.path.kind == path_kind::lattice) return json{{"lattice_steps", hs.path.moves.size()}};
    if (hs.rebalance.explicit_dates) return json{{"dates", hs.rebalance.years.size()}};
    return json{{"every", hs.rebalance.every}, {"unit", word_of(rebalance_units, hs.rebalance.unit)}};
}

std::string pricing_text(const trade& t, const hedge_settings& hs) {
    bool early = false;
    for (const auto& leg : t.legs)
        early = early || (leg.type != payoff_kind::stock && leg.exercise != exercise_style::european);
    if (hs.path.kind == path_kind::lattice)
        return "values and deltas from the " + to_string(t.lattice.method) + " lattice of the path (" +
               std::to_string(hs.path.moves.size()) + " steps): replication is exact on it";
    return std::string("re-priced on each date with the remaining time: closed form for European legs") +
           (early ? ", " + to_string(t.lattice.method) + " lattice with " + std::to_string(hs.lattice_steps) +
                        " steps for American/Bermudan legs"
                  : "");
}

// The table leaves out the columns that say nothing for this trade.
json table_columns_of(const trade& t, const hedge_totals& tot) {
    json table_columns = json::array();
    for (const auto& c : hedge_columns()) {
        const std::string name = c.name;
        if (name == "years" || name == "trade_cash_flow" || name == "desk_shares") continue;
        if ((name == "paid" && tot.paid == 0) || (name == "dividends" && tot.dividends == 0) ||
            (name == "cost" && tot.costs == 0))
            continue;
        if (name == "date" && !t.valuation_date)
            table_columns.push_back("years");
        else
            table_columns.push_back(name);
    }
    return table_columns;
}

json totals_json(const hedge_totals& tot) {
    return {{"premium", tot.premium},
            {"payoff", tot.payoff},
            {"portfolio_value", tot.portfolio_value},
            {"replication_error", tot.replication_error},
            {"total_shares_traded", tot.shares_traded},
            {"total_costs", tot.costs},
            {"total_interest", tot.interest},
            {"total_dividends", tot.dividends},
            {"total_paid_before_end", tot.paid},
            {"end_event", tot.end_event}};
}

json desk_json(const trade& t, const hedge_schedule& s) {
    const double q = t.signed_quantity();
    return {{"signed_quantity", q},
            {"premium", q * s.totals.premium},
            {"shares_at_start", s.rows.front().desk_shares},
            {"shares_at_end", s.rows.back().desk_shares},
            {"pnl", s.rows.back().desk_pnl},
            {"view",
             "The desk is the client's counterparty: it receives signed_quantity x premium, owes the client the "
             "trade, and holds signed_quantity x the per-unit shares and cash (a desk that sold a put holds "
             "the put's negative delta: it is short shares). desk_pnl counts costs on |quantity|."}};
}

}  // namespace

json write_hedge_result(const trade& t, const hedge_settings& hs, const hedge_schedule& s) {
    json out{
        {"rows", row_objects(hedge_columns(), s.rows)},
        {"columns", column_names(hedge_columns())},
        {"table_columns", table_columns_of(t, s.totals)},
        {"totals", totals_json(s.totals)},
        {"desk", desk_json(t, s)},
        {"path", path_json(hs.path)},
        {"rebalance", rebalance_json(hs)},
        {"cost_bp", hs.cost_bp},
        {"rate", t.market.rate.average(0, t.final_expiry_years())},
        {"pricing", pricing_text(t, hs)},
        {"view",
         "Per-unit columns replicate one unit of the trade held long: start with the premium in cash, hold delta "
         "shares, keep the rest in cash at the trade's rate. shares_traded + = buy; trade_cash_flow = -shares_traded "
         "x spot; tracking_error = portfolio_value - option_value. The last row does not trade: its portfolio "
         "is compared with the payoff (or exercise value)."},
        {"notes", s.notes},
        {"caution",
         "Indicative only, not an offer or advice. Model assumptions: lognormal spot, constant volatility and rate, "
         "no gaps between dates; real hedges differ. Follow the firm's and the jurisdiction's sales rules."},
    };
    const bool on_path = hs.path.kind == path_kind::lattice;
    add_price_comparison(out, s.against_price, "The hedge schedule",
                         on_path ? "hedge.path.moves" : "hedge.lattice_steps",
                         on_path ? static_cast<int>(hs.path.moves.size()) : hs.lattice_steps);
    return out;
}

}  // namespace hedgeleaf
