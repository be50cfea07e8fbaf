// Hedgeleaf commands: the `ladder` section and the ladder command's result (see ladder.hpp).
#include "commands/ladder.hpp"

#include "analytics/leg_market.hpp"
#include "commands/cautions.hpp"
#include "commands/price.hpp"
#include "commands/trade_reader.hpp"
#include "numerics/lattice.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

/// An evenly spaced axis from `<stem>_from` to `<stem>_to` (inclusive) in steps of `<stem>_step`.
std::vector<double> read_axis(field_reader& r, const std::string& stem, const axis_defaults& defaults, double lowest,
                              double highest, const std::string& why) {
    const std::string from_path = r.child(stem + "_from"), to_path = r.child(stem + "_to"),
                      step_path = r.child(stem + "_step");
    const double step = r.number_or(stem + "_step", defaults.step);
    // An end not given stops where the axis must (a volatility of 4 % goes down 3 points, not
    // the default 5), on the step's grid; an end given outside the limits is refused below.
    double from_default = defaults.from, to_default = defaults.to;
    if (step > 0 && std::isfinite(step)) {
        double lowest_on_grid = tidy_decimal(std::ceil(lowest / step) * step);
        if (lowest_on_grid < lowest) lowest_on_grid = tidy_decimal(lowest_on_grid + step);
        double highest_on_grid = tidy_decimal(std::floor(highest / step) * step);
        if (highest_on_grid > highest) highest_on_grid = tidy_decimal(highest_on_grid - step);
        from_default = std::min(0.0, std::max(from_default, lowest_on_grid));
        to_default = std::max(0.0, std::min(to_default, highest_on_grid));
    }
    const double from = r.number_or(stem + "_from", from_default);
    const double to = r.number_or(stem + "_to", to_default);
    if (!(from >= lowest))
        fail(from_path, "must be >= " + format_number(lowest) + why + ", got " + format_number(from));
    if (!(to <= highest)) fail(to_path, "must be <= " + format_number(highest) + why + ", got " + format_number(to));
    if (!(to >= from))
        fail(to_path, "must be >= " + stem + "_from " + format_number(from) + ", got " + format_number(to));
    require_positive(step, step_path);
    // A tolerance so that 0.4 / 0.02 counts as 20 steps, not 19.999...
    const double count = std::floor((to - from) / step + 1e-9) + 1;
    if (!(count <= max_points_per_axis))  // (a step so small that the count overflows: "too many")
        fail(step_path, "gives " + (std::isfinite(count) ? format_number(count) : std::string("too many")) +
                            " rows from " + format_number(from) + " to " + format_number(to) + ", at most " +
                            std::to_string(max_points_per_axis) + "; use a larger step");
    std::vector<double> points;
    for (int i = 0; i < static_cast<int>(count); ++i) {
        points.push_back(tidy_decimal(from + i * step));
    }
    return points;
}

std::vector<long> read_days(field_reader& r, double expiry_years) {
    const long expiry_days = static_cast<long>(std::floor(expiry_years * 365 + 1e-9));
    const long step = r.integer_or("time_step_days", std::max(1L, (expiry_days + 9) / 10), 1, max_ladder_days);
    const long to = r.integer_or("time_to_days", expiry_days, 0, max_ladder_days);
    if (static_cast<double>(to) > expiry_years * 365 + 1e-9)
        fail(r.child("time_to_days"), "must be on or before the last expiry (day " + std::to_string(expiry_days) +
                                          "), got " + std::to_string(to));
    if (to / step + 1 > max_points_per_axis)
        fail(r.child("time_step_days"), "gives " + std::to_string(to / step + 1) + " rows, at most " +
                                            std::to_string(max_points_per_axis) + "; use a larger step");
    std::vector<long> days;
    for (long d = 0; d <= to; d += step) days.push_back(d);
    if (days.back() != to) days.push_back(to);  // always show the last day asked for
    return days;
}

bool moves_spot(ladder_kind k) { return k == ladder_kind::spot || k == ladder_kind::grid; }
bool moves_volatility(ladder_kind k) { return k == ladder_kind::volatility || k == ladder_kind::grid; }

json ladder_columns(const trade& t, ladder_kind kind) {
    // Column order for --table and --csv: the scenario first, then its figures.
    json columns = json::array();
    if (moves_spot(kind)) columns.push_back("spot_shift");
    if (moves_volatility(kind)) columns.push_back("vol_shift");
    if (kind == ladder_kind::time) {
        columns.push_back("days");
        if (t.valuation_date) columns.push_back("date");
        columns.push_back("years");
    }
    columns.push_back("spot");
    if (moves_volatility(kind)) columns.push_back("volatility");
    const bool greeks = kind != ladder_kind::grid;
    for (const char* c : {"value", "pnl"}) columns.push_back(c);
    if (greeks)
        for (const char* c : {"delta", "gamma"}) columns.push_back(c);
    columns.push_back("position_pnl");
    if (greeks)
        for (const char* c : {"position_delta", "position_gamma"}) columns.push_back(c);
    return columns;
}

json row_json(const trade& t, ladder_kind kind, const ladder_row& r) {
    json row{{"value", r.at.value},
             {"pnl", r.pnl},
             {"delta", r.at.delta},
             {"gamma", r.at.gamma},
             {"position_pnl", r.position_pnl},
             {"position_delta", r.position_delta},
             {"position_gamma", r.position_gamma},
             {"spot", r.spot}};
    if (moves_spot(kind)) row["spot_shift"] = r.moved.spot_shift;
    if (moves_volatility(kind)) {
        row["vol_shift"] = r.moved.vol_shift;
        row["volatility"] = r.volatility;
    }
    if (kind == ladder_kind::time) {
        row["days"] = r.days;
        row["years"] = r.moved.years_ahead;
        if (t.valuation_date) row["date"] = to_iso(add_days(*t.valuation_date, r.days));
    }
    // A grid row holds P&L only: the matrix of the result is what the page draws.
    if (kind == ladder_kind::grid)
        for (const char* key : {"delta", "gamma", "position_delta", "position_gamma"}) row.erase(key);
    return row;
}

}  // namespace

ladder_settings read_ladder_settings(const json& document, const trade& t) {
    field_reader r(section_or_empty(document, "ladder"), "ladder");
    ladder_settings s;
    s.kind = enum_of<ladder_kind>(ladder_kinds, r.choice_or("kind", ladder_kinds, "spot"));
    s.steps = static_cast<int>(r.integer_or("steps", default_ladder_steps, 1, max_ladder_steps));
    s.smile = enum_of<smile_move>(smile_moves, r.choice_or("smile", smile_moves, "sticky-strike"));
    const double vol = t.market.volatility;
    // Every leg's volatility must stay priceable: with a smile, the lowest and the highest leg.
    const volatility_span span = leg_volatility_span(t.market, t.legs);
    const double expiry_years = t.final_expiry_years();
    if (moves_spot(s.kind)) {
        s.spot_shifts =
            read_axis(r, "spot", spot_axis, min_spot_shift, max_spot_shift, " (a fraction of today's spot)");
        s.axis_path = r.child("spot_from");
    }
    if (moves_volatility(s.kind)) {
        const double highest = highest_volatility(expiry_years);  // the lattice's limit for this expiry
        const std::string vols =
            t.market.smile ? "leg volatilities " + format_number(span.lowest) + " .. " + format_number(span.highest)
                           : "volatility " + format_number(vol);
        s.vol_shifts = read_axis(r, "vol", vol_axis, min_ladder_volatility - span.lowest, highest - span.highest,
                                 " (" + vols + " must stay within " + format_number(min_ladder_volatility) + " .. " +
                                     format_number(highest) + ")");
        if (s.kind == ladder_kind::volatility) s.axis_path = r.child("vol_from");
    }
    if (s.kind == ladder_kind::time) {
        s.days = read_days(r, expiry_years);
        s.axis_path = r.child("time_step_days");
    }
    r.finish();
    return s;
}

json write_ladder_result(const trade& t, const ladder_settings& s, const ladder_result& result) {
    json rows = json::array();
    json grid_pnl = json::array(), grid_position = json::array();
    for (std::size_t i = 0; i < result.rows.size(); ++i) {
        const ladder_row& r = result.rows[i];
        if (s.kind == ladder_kind::grid) {
            if (i % s.vol_shifts.size() == 0) {
                grid_pnl.push_back(json::array());
                grid_position.push_back(json::array());
            }
            grid_pnl.back().push_back(r.pnl);
            grid_position.back().push_back(r.position_pnl);
        }
        rows.push_back(row_json(t, s.kind, r));
    }
    const scenario_value& today = result.today;
    json out{{"kind", word_of(ladder_kinds, s.kind)},
             {"today",
              {{"value", today.value},
               {"delta", today.delta},
               {"gamma", today.gamma},
               {"spot", t.market.spot},
               {"volatility", t.market.volatility}}},
             {"quantity", t.quantity},
             {"side", t.client_sells ? "sell" : "buy"},
             {"lattice",
              {{"method", to_string(t.lattice.method)},
               {"steps", effective_steps(t.lattice.method, s.steps)},
               {"extrapolated", today.extrapolated}}},
             {"rows", rows}};
    out["columns"] = ladder_columns(t, s.kind);
    if (s.kind == ladder_kind::grid)
        out["grid"] = {{"spot_shifts", s.spot_shifts},
                       {"vol_shifts", s.vol_shifts},
                       {"pnl", grid_pnl},
                       {"position_pnl", grid_position}};
    json notes = json::array();
    notes.push_back(
        "values per unit; position figures are times the signed quantity; P&L is against today's value "
        "on the same lattice");
    if (s.kind == ladder_kind::time)
        notes.push_back(
            "spot and volatility held; legs that have expired are paid at their payoff at today's spot; "
            "dividends paid by then drop out; premium is not carried");
    if (t.market.smile) {
        out["smile"] = {{"moves", word_of(smile_moves, s.smile)}, {"volatility_shift", "parallel"}};
        notes.push_back(
            s.kind == ladder_kind::time
                ? "each leg is held at today's smile volatility for its strike and expiry as time passes"
                : std::string("each leg is priced at the smile's volatility for its strike and expiry; ") +
                      (s.smile == smile_move::sticky_strike
                           ? "sticky strike: when spot moves each strike keeps its volatility"
                           : "sticky moneyness: the smile moves with spot (strike K at spot S' takes today's "
                             "volatility at K x spot / S')") +
                      "; a volatility shift moves the whole smile in parallel");
    }
    out["notes"] = notes;
    add_price_comparison(out, result.against_price, "The ladder", "ladder.steps",
                         effective_steps(t.lattice.method, s.steps));
    out["caution"] = client_caution(!t.market.is_plain());
    return out;
}

}  // namespace hedgeleaf
