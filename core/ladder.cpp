// Hedgeleaf core: scenario ladders (see ladder.hpp).
#include "ladder.hpp"

#include "lattice.hpp"
#include "quote.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

constexpr int max_points_per_axis = 201;
constexpr long max_grid_cells = 10000;
constexpr int max_ladder_steps = 2001;
// Node updates a ladder may ask for (scenarios x legs x steps^2 / 2 for the
// fine and coarse lattices): about a second natively.
constexpr double max_ladder_work = 2e9;
constexpr double min_volatility = 1e-3;

// Legs this close to expiry at the horizon count as expired (paid at their payoff).
constexpr double expiry_epsilon = 1e-9;

// Axis points are typed in decimals: print -0.15 and 0, not -0.15000000000000002 and 1e-17.
double tidy(double x) { return std::round(x * 1e12) / 1e12 + 0.0; }

// Selling a zero gives -0; show 0.
double unsigned_zero(double x) { return x + 0.0; }

double work_estimate(std::size_t scenarios, std::size_t legs, int steps) {
    return static_cast<double>(scenarios) * static_cast<double>(legs) * 0.625 * steps * static_cast<double>(steps);
}

/// An evenly spaced axis from `from` to `to` (inclusive) in steps of `step`.
struct axis {
    std::vector<double> points;
};

axis read_axis(field_reader& r, const std::string& stem, double from_default, double to_default, double step_default,
               double lowest, double highest, const std::string& why) {
    const std::string from_path = r.child(stem + "_from"), to_path = r.child(stem + "_to"),
                      step_path = r.child(stem + "_step");
    const double from = r.number_or(stem + "_from", from_default);
    const double to = r.number_or(stem + "_to", to_default);
    const double step = r.number_or(stem + "_step", step_default);
    if (!(from >= lowest)) fail(from_path, "must be >= " + format_number(lowest) + why + ", got " + format_number(from));
    if (!(to <= highest)) fail(to_path, "must be <= " + format_number(highest) + why + ", got " + format_number(to));
    if (!(to >= from)) fail(to_path, "must be >= " + stem + "_from " + format_number(from) + ", got " + format_number(to));
    require_positive(step, step_path);
    // A tolerance so that 0.4 / 0.02 counts as 20 steps, not 19.999...
    const double count = std::floor((to - from) / step + 1e-9) + 1;
    if (count > max_points_per_axis)
        fail(step_path, "gives " + format_number(count) + " rows from " + format_number(from) + " to " +
                            format_number(to) + ", at most " + std::to_string(max_points_per_axis) + "; use a larger step");
    axis a;
    for (int i = 0; i < static_cast<int>(count); ++i) {
        a.points.push_back(tidy(from + i * step));
    }
    return a;
}

/// The trade moved `h` years forward: expired legs leave at their payoff,
/// dividends already paid drop out, later times shorten by h.
struct aged_trade {
    market_data market;
    std::vector<option_leg> alive;
    double settled = 0;  // per unit: payoffs of legs expired by the horizon
};

aged_trade age(const trade& t, const market_data& m, double h) {
    aged_trade out;
    out.market = m;
    if (h <= 0) {
        out.alive = t.legs;
        return out;
    }
    out.market.dividends.clear();
    for (dividend d : m.dividends)
        if (d.time > h) {
            d.time -= h;
            out.market.dividends.push_back(d);
        }
    for (option_leg leg : t.legs) {
        if (leg.type != payoff_kind::stock && leg.expiry <= h + expiry_epsilon) {
            out.settled += leg.quantity * exercise_value(leg, m.spot);
            continue;
        }
        if (leg.type != payoff_kind::stock) {
            leg.expiry -= h;
            std::vector<double> times;
            for (double x : leg.exercise_times)
                if (x - h > expiry_epsilon) times.push_back(x - h);
            leg.exercise_times = times;
        }
        out.alive.push_back(leg);
    }
    return out;
}

json value_row(const trade& t, const scenario& s, const scenario_value& v, const scenario_value& base) {
    const double q = t.signed_quantity();
    return json{{"value", v.value},
                {"pnl", v.value - base.value},
                {"delta", v.delta},
                {"gamma", v.gamma},
                {"position_pnl", unsigned_zero(q * (v.value - base.value))},
                {"position_delta", unsigned_zero(q * v.delta)},
                {"position_gamma", unsigned_zero(q * v.gamma)},
                {"spot", tidy(t.market.spot * (1 + s.spot_shift))}};
}

}  // namespace

scenario_value value_scenario(const trade& t, const scenario& s, int steps) {
    market_data m = t.market;
    m.spot = tidy(t.market.spot * (1 + s.spot_shift));  // the spot shown in the row
    m.volatility = t.market.volatility + s.vol_shift;
    if (!(m.spot > 0)) fail("", "spot shift " + format_number(s.spot_shift) + " leaves no positive spot");
    if (!(m.volatility > 0))
        fail("", "volatility shift " + format_number(s.vol_shift) + " leaves no positive volatility");
    const aged_trade aged = age(t, m, s.years_ahead);
    double last = 0;
    for (const auto& leg : aged.alive) last = std::max(last, leg.expiry);
    const double pv = aged.market.dividend_pv(0, last);
    if (!(pv < m.spot))
        fail("", "spot " + format_number(m.spot) + " is not above the present value " + format_number(pv) +
                           " of the dividends before expiry");

    lattice_settings fast = t.lattice;
    fast.steps = steps;
    fast.extrapolate = true;
    scenario_value out;
    out.value = aged.settled;
    for (const auto& leg : aged.alive) {
        const lattice_price p = price_lattice_only(aged.market, leg, fast);
        out.value += leg.quantity * p.premium;
        out.delta += leg.quantity * p.sensitivities.delta;
        out.gamma += leg.quantity * p.sensitivities.gamma;
    }
    return out;
}

json ladder_json(const trade& t) {
    static const json empty = json::object();
    const json* section = t.source.is_object() && t.source.contains("ladder") && !t.source.at("ladder").is_null()
                              ? &t.source.at("ladder") : &empty;
    field_reader r(*section, "ladder");
    const std::string kind = r.choice_or("kind", {"spot", "volatility", "time", "grid"}, "spot");
    const int steps = static_cast<int>(r.integer_or("steps", default_ladder_steps, 1, max_ladder_steps));
    const std::string steps_path = r.child("steps");
    const double vol = t.market.volatility;
    const double expiry = t.final_expiry();

    std::vector<scenario> scenarios;
    std::vector<double> spot_points, vol_points;
    std::vector<long> days;
    std::string axis_path;  // the field to change when a scenario cannot be priced
    if (kind == "spot" || kind == "grid") {
        spot_points = read_axis(r, "spot", -0.2, 0.2, 0.02, -0.95, 4.0, " (a fraction of today's spot)").points;
        axis_path = r.child("spot_from");
    }
    if (kind == "volatility" || kind == "grid") {
        const double highest = highest_volatility(expiry);  // the lattice's limit for this expiry
        vol_points = read_axis(r, "vol", -0.05, 0.05, 0.01, min_volatility - vol, highest - vol,
                               " (volatility " + format_number(vol) + " must stay within " +
                                   format_number(min_volatility) + " .. " + format_number(highest) + ")")
                         .points;
        if (kind == "volatility") axis_path = r.child("vol_from");
    }
    if (kind == "time") {
        const long expiry_days = static_cast<long>(std::floor(expiry * 365 + 1e-9));
        const long step = r.integer_or("time_step_days", std::max(1L, (expiry_days + 9) / 10), 1, 36500);
        const long to = r.integer_or("time_to_days", expiry_days, 0, 36500);
        if (static_cast<double>(to) > expiry * 365 + 1e-9)
            fail(r.child("time_to_days"), "must be on or before the last expiry (day " + std::to_string(expiry_days) +
                                              "), got " + std::to_string(to));
        if (to / step + 1 > max_points_per_axis)
            fail(r.child("time_step_days"), "gives " + std::to_string(to / step + 1) + " rows, at most " +
                                                std::to_string(max_points_per_axis) + "; use a larger step");
        for (long d = 0; d <= to; d += step) days.push_back(d);
        if (days.back() != to) days.push_back(to);  // always show the last day asked for
        axis_path = r.child("time_step_days");
    }
    r.finish();

    if (kind == "spot")
        for (double x : spot_points) scenarios.push_back({x, 0, 0});
    else if (kind == "volatility")
        for (double x : vol_points) scenarios.push_back({0, x, 0});
    else if (kind == "time")
        for (long d : days) scenarios.push_back({0, 0, static_cast<double>(d) / 365.0});
    else {
        if (static_cast<long>(spot_points.size() * vol_points.size()) > max_grid_cells)
            fail("ladder.spot_step", "the grid has " + std::to_string(spot_points.size() * vol_points.size()) +
                                         " cells, at most " + std::to_string(max_grid_cells) + "; use larger steps");
        for (double x : spot_points)
            for (double y : vol_points) scenarios.push_back({x, y, 0});
    }
    const double work = work_estimate(scenarios.size() + 1, t.legs.size(), steps);
    if (work > max_ladder_work)
        fail(steps_path, "the ladder would need about " + format_number(std::round(work / 1e6)) +
                             " million lattice node updates, at most " + format_number(max_ladder_work / 1e6) +
                             " million; use fewer steps or fewer rows");

    const auto value_at = [&](const scenario& s) {
        try {
            return value_scenario(t, s, steps);
        } catch (const work_exhausted&) {
            throw;  // the budget, not this trial value
        } catch (const input_error& e) {
            fail(axis_path, "a scenario cannot be priced (spot shift " + format_number(s.spot_shift) +
                                ", volatility shift " + format_number(s.vol_shift) + ", " +
                                format_number(s.years_ahead) + " years ahead): " + e.what());
        }
    };
    const scenario_value base = value_at({});

    json rows = json::array();
    json grid_pnl = json::array(), grid_position = json::array();
    for (std::size_t i = 0; i < scenarios.size(); ++i) {
        const scenario& s = scenarios[i];
        const scenario_value v = value_at(s);
        json row = value_row(t, s, v, base);
        if (kind == "spot" || kind == "grid") row["spot_shift"] = s.spot_shift;
        if (kind == "volatility" || kind == "grid") {
            row["vol_shift"] = s.vol_shift;
            row["volatility"] = tidy(vol + s.vol_shift);
        }
        if (kind == "time") {
            const long d = days[i];
            row["days"] = d;
            row["years"] = s.years_ahead;
            if (t.valuation_date) row["date"] = to_iso(add_days(*t.valuation_date, d));
        }
        if (kind == "grid") {
            const std::size_t col = i % vol_points.size();
            if (col == 0) {
                grid_pnl.push_back(json::array());
                grid_position.push_back(json::array());
            }
            grid_pnl.back().push_back(row["pnl"]);
            grid_position.back().push_back(row["position_pnl"]);
            // A grid row holds P&L only: the matrix below is what the page draws.
            for (const char* key : {"delta", "gamma", "position_delta", "position_gamma"}) row.erase(key);
        }
        rows.push_back(row);
    }

    json out{{"kind", kind},
             {"today", {{"value", base.value}, {"delta", base.delta}, {"gamma", base.gamma},
                        {"spot", t.market.spot}, {"volatility", vol}}},
             {"quantity", t.quantity},
             {"side", t.client_sells ? "sell" : "buy"},
             {"lattice", {{"method", to_string(t.lattice.method)},
                          {"steps", effective_steps(t.lattice.method, steps)}, {"extrapolated", true}}},
             {"rows", rows}};
    // Column order for --table and --csv: the scenario first, then its figures.
    json columns = json::array();
    if (kind == "spot" || kind == "grid") columns.push_back("spot_shift");
    if (kind == "volatility" || kind == "grid") columns.push_back("vol_shift");
    if (kind == "time") {
        columns.push_back("days");
        if (t.valuation_date) columns.push_back("date");
        columns.push_back("years");
    }
    columns.push_back("spot");
    if (kind == "volatility" || kind == "grid") columns.push_back("volatility");
    const bool greeks = kind != "grid";
    for (const char* c : {"value", "pnl"}) columns.push_back(c);
    if (greeks) for (const char* c : {"delta", "gamma"}) columns.push_back(c);
    columns.push_back("position_pnl");
    if (greeks) for (const char* c : {"position_delta", "position_gamma"}) columns.push_back(c);
    out["columns"] = columns;
    if (kind == "grid")
        out["grid"] = {{"spot_shifts", spot_points}, {"vol_shifts", vol_points}, {"pnl", grid_pnl},
                       {"position_pnl", grid_position}};
    json notes = json::array();
    notes.push_back("values per unit; position figures are times the signed quantity; P&L is against today's value "
                    "on the same lattice");
    if (kind == "time")
        notes.push_back("spot and volatility held; legs that have expired are paid at their payoff at today's spot; "
                        "dividends paid by then drop out; premium is not carried");
    out["notes"] = notes;
    out["caution"] = client_caution();
    return out;
}

}  // namespace hedgeleaf
