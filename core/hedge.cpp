// Hedgeleaf core: hedge schedules along one spot path (see hedge.hpp).
#include "hedge.hpp"

#include "closed_form.hpp"
#include "lattice.hpp"
#include "replication.hpp"
#include "simulate.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

constexpr double time_tolerance = 1e-9;  // years; far below a second
constexpr double max_spot = 1e9;         // as for market.spot

const std::vector<std::string> unit_names = {"days", "weeks", "months"};

rebalance_unit parse_unit(const std::string& s) {
    if (s == "days") return rebalance_unit::days;
    if (s == "months") return rebalance_unit::months;
    return rebalance_unit::weeks;
}

std::string unit_name(rebalance_unit u) {
    switch (u) {
        case rebalance_unit::days: return "days";
        case rebalance_unit::weeks: return "weeks";
        case rebalance_unit::months: return "months";
    }
    return "weeks";
}

std::string kind_name(path_kind k) {
    switch (k) {
        case path_kind::scenario: return "scenario";
        case path_kind::spots: return "spots";
        case path_kind::lattice: return "lattice";
        case path_kind::stress: return "stress";
    }
    return "scenario";
}

std::string shape_name(stress_shape s) {
    switch (s) {
        case stress_shape::rise: return "rise";
        case stress_shape::fall: return "fall";
        case stress_shape::gap_down: return "gap-down";
    }
    return "fall";
}

// A list of years or dates at `path` (dates need the trade's valuation_date).
std::vector<double> read_times(const json& list, const std::string& path, const trade& t, bool as_dates) {
    if (!list.is_array() || list.empty()) fail(path, "must be a non-empty list, got " + describe(list));
    if (list.size() > max_rebalancing_dates)
        fail(path, "has " + std::to_string(list.size()) + " dates, at most " + std::to_string(max_rebalancing_dates));
    const time_reader times{t.valuation_date};
    const double T = t.final_expiry();
    std::vector<double> out;
    for (std::size_t i = 0; i < list.size(); ++i) {
        const std::string p = index_path(path, i);
        const double x = as_dates ? times.from_date_text(list[i], p) : as_number(list[i], p);
        if (!(x > 0)) fail(p, as_dates ? "must be after valuation_date" : "must be > 0, got " + format_number(x));
        if (x > T + time_tolerance)
            fail(p, as_dates ? "must be on or before the final expiry " + to_iso(add_days(*t.valuation_date, std::lround(T * 365))) +
                                   ", got " + list[i].get<std::string>()
                             : "must be on or before the final expiry " + format_number(T) + " years, got " + format_number(x));
        out.push_back(x);
    }
    return out;
}

path_spec read_path(const json& node, const trade& t) {
    field_reader r(node, "hedge.path");
    path_spec p;
    const std::string kind = r.choice("kind", {"scenario", "spots", "lattice", "stress"});
    if (kind == "spots") {
        p.kind = path_kind::spots;
        const json& list = r.raw("spots");
        const std::string path = r.child("spots");
        if (!list.is_array() || list.empty()) fail(path, "must be a non-empty list of spots, got " + describe(list));
        if (list.size() > max_rebalancing_dates)
            fail(path, "has " + std::to_string(list.size()) + " spots, at most " + std::to_string(max_rebalancing_dates));
        for (std::size_t i = 0; i < list.size(); ++i) {
            const double s = as_number(list[i], index_path(path, i));
            require_positive(s, index_path(path, i));
            require_at_most(s, max_spot, index_path(path, i));
            p.spots.push_back(s);
        }
    } else if (kind == "lattice") {
        p.kind = path_kind::lattice;
        const bool has_moves = r.has("moves"), has_nodes = r.has("nodes");
        if (has_moves == has_nodes) {
            r.raw_optional("moves");
            r.raw_optional("nodes");
            fail(r.child("moves"), "give either moves (\"UUDU...\") or nodes ([0, 1, 1, 2, ...]), one of them");
        }
        if (has_moves) {
            p.moves = parse_moves(r.text("moves", max_tree_steps + 2000), r.child("moves"));
        } else {
            const json& list = r.raw("nodes");
            const std::string path = r.child("nodes");
            if (!list.is_array()) fail(path, "must be a list of node indices, got " + describe(list));
            if (list.size() > static_cast<std::size_t>(max_tree_steps) + 1)
                fail(path, "has " + std::to_string(list.size()) + " entries, at most " + std::to_string(max_tree_steps + 1));
            std::vector<int> nodes;
            for (std::size_t i = 0; i < list.size(); ++i) {
                const double x = as_number(list[i], index_path(path, i));
                if (x != std::floor(x) || x < 0 || x > max_tree_steps)
                    fail(index_path(path, i), "must be a whole number from 0 up, got " + format_number(x));
                nodes.push_back(static_cast<int>(x));
            }
            p.moves = moves_from_nodes(nodes, path);
        }
        if (p.moves.size() > static_cast<std::size_t>(max_tree_steps))
            fail(r.child(has_moves ? "moves" : "nodes"), "has " + std::to_string(p.moves.size()) + " moves, at most " +
                                                            std::to_string(max_tree_steps));
    } else if (kind == "scenario") {
        p.kind = path_kind::scenario;
        p.drift = r.number_or("drift", t.market.rate);
        require_at_least(p.drift, -1.0, r.child("drift"));
        require_at_most(p.drift, 1.0, r.child("drift"));
        p.volatility = r.number_or("volatility", t.market.volatility);
        require_non_negative(p.volatility, r.child("volatility"));
        require_at_most(p.volatility, 5.0, r.child("volatility"));
        p.seed = static_cast<std::uint64_t>(r.integer_or("seed", 1, 0, 9007199254740991L));
    } else {
        p.kind = path_kind::stress;
        const std::string shape = r.choice("shape", {"rise", "fall", "gap-down"});
        p.shape = shape == "rise" ? stress_shape::rise : (shape == "fall" ? stress_shape::fall : stress_shape::gap_down);
        p.change = r.number_or("change", 0.2);
        require_positive(p.change, r.child("change"));
        if (p.shape == stress_shape::rise) require_at_most(p.change, 10.0, r.child("change"));
        else if (!(p.change < 1)) fail(r.child("change"), "must be below 1 (a fall of 100 % or more), got " + format_number(p.change));
        if (p.shape == stress_shape::gap_down) {
            const time_reader times{t.valuation_date};
            const bool by_date = r.has("date");
            p.gap_time = times.read_time(r, "years", "date");
            const std::string gp = r.child(by_date ? "date" : "years");
            if (!(p.gap_time > 0)) fail(gp, "must be after the valuation date");
            if (!(p.gap_time < t.final_expiry() - time_tolerance)) fail(gp, "must be before the final expiry");
        }
    }
    r.finish();
    return p;
}

double dividend_pv_after(const market_data& m, double t, double until) {
    return m.dividends.empty() ? 0.0 : m.dividend_pv(t, until);
}

bool may_exercise_at(const option_leg& leg, double t) {
    if (leg.exercise == exercise_style::american) return true;
    if (leg.exercise == exercise_style::bermudan)
        for (double x : leg.exercise_times)
            if (std::fabs(x - t) <= time_tolerance) return true;
    return false;
}

// One date of the schedule before the accounting: spot, the trade's value and delta.
struct mark {
    double time = 0;
    std::optional<date> day;
    double spot = 0;
    double diffusing = 0;  // spot minus the PV of dividends still to come (to the final expiry)
    double value = 0;      // legs running after today's payments; on the last mark, today's payments
    double paid = 0;       // payments today by legs ending before the last mark
    double delta = 0;
    bool last = false;
    std::string event;
};

std::optional<date> day_of(const trade& t, double time) {
    if (!t.valuation_date) return std::nullopt;
    return add_days(*t.valuation_date, std::lround(time * 365.0));
}

// The spot on each date for scenario and stress paths (acting on the diffusing spot).
std::vector<double> model_spots(const trade& t, const path_spec& p, const std::vector<schedule_date>& dates) {
    const double T = t.final_expiry();
    const double s0 = diffusing_spot(t.market, T);
    std::vector<double> out;
    random_stream rng(p.seed);
    double s = s0;
    for (std::size_t k = 0; k < dates.size(); ++k) {
        const double tk = dates[k].time;
        if (k > 0) {
            if (p.kind == path_kind::scenario) {
                const double dt = tk - dates[k - 1].time;
                const double z = rng.normal();
                s *= std::exp((p.drift - 0.5 * p.volatility * p.volatility) * dt + p.volatility * std::sqrt(dt) * z);
            } else if (p.shape == stress_shape::rise) {
                s = s0 * std::pow(1 + p.change, tk / T);
            } else if (p.shape == stress_shape::fall) {
                s = s0 * std::pow(1 - p.change, tk / T);
            } else {
                s = tk >= p.gap_time - time_tolerance ? s0 * (1 - p.change) : s0;
            }
        }
        out.push_back(s + dividend_pv_after(t.market, tk, T));
    }
    return out;
}

std::string join_dates(const std::vector<schedule_date>& dates, std::size_t from, std::size_t count) {
    std::string s;
    for (std::size_t k = from; k < dates.size() && k < from + count; ++k) {
        s += (s.empty() ? "" : ", ") + (dates[k].day ? to_iso(*dates[k].day) : format_number(dates[k].time) + "y");
    }
    if (dates.size() > from + count) s += ", ...";
    return s;
}

std::vector<mark> price_marks(const trade& t, const hedge_settings& hs, std::vector<std::string>& notes) {
    std::vector<schedule_date> dates = schedule_dates(t, hs.rebalance, "hedge.rebalance");
    const double T = t.final_expiry();
    if (hs.path.kind == path_kind::stress && hs.path.shape == stress_shape::gap_down) {
        const bool present = std::any_of(dates.begin(), dates.end(), [&](const schedule_date& d) {
            return std::fabs(d.time - hs.path.gap_time) <= time_tolerance;
        });
        if (!present) {
            schedule_date gap{hs.path.gap_time, day_of(t, hs.path.gap_time)};
            dates.insert(std::upper_bound(dates.begin(), dates.end(), gap,
                                          [](const schedule_date& a, const schedule_date& b) { return a.time < b.time; }),
                         gap);
            notes.push_back("the gap date is added to the rebalancing dates");
        }
    }
    std::vector<double> spots;
    if (hs.path.kind == path_kind::spots) {
        if (hs.path.spots.size() != dates.size() - 1)
            fail("hedge.path.spots", "has " + std::to_string(hs.path.spots.size()) + " spots; the schedule has " +
                                         std::to_string(dates.size() - 1) + " dates after valuation (" +
                                         join_dates(dates, 1, 6) + ")");
        spots.push_back(t.market.spot);
        spots.insert(spots.end(), hs.path.spots.begin(), hs.path.spots.end());
    } else {
        spots = model_spots(t, hs.path, dates);
    }

    std::vector<char> alive(t.legs.size(), 1);
    std::vector<mark> marks;
    for (std::size_t k = 0; k < dates.size(); ++k) {
        mark mk;
        mk.time = dates[k].time;
        mk.day = dates[k].day;
        mk.spot = spots[k];
        mk.diffusing = mk.spot - dividend_pv_after(t.market, mk.time, T);
        const bool final_date = k + 1 == dates.size();
        const market_data m = market_at(t.market, mk.spot, mk.time);
        bool exercised = false, expired = false, any_alive = false;
        for (std::size_t i = 0; i < t.legs.size(); ++i) {
            if (!alive[i]) continue;
            const option_leg& leg = t.legs[i];
            const double q = leg.quantity;
            if (leg.type == payoff_kind::stock) {
                if (k > 0)  // the share leg's dividends and carry since the last date go to its holder
                    mk.paid += q * share_income(t.market, marks.back().diffusing, marks.back().time, mk.time);
                if (final_date) {
                    mk.paid += q * mk.spot;  // the share is delivered with the trade's end
                    alive[i] = 0;
                } else {
                    mk.value += q * mk.spot;
                    mk.delta += q;
                    any_alive = true;
                }
                continue;
            }
            if (leg.expiry <= mk.time + time_tolerance) {
                mk.paid += q * exercise_value(leg, mk.spot);
                alive[i] = 0;
                expired = true;
                continue;
            }
            const leg_mark lm = mark_leg(m, leg_at(leg, mk.time), t.lattice.method, hs.lattice_steps);
            if (may_exercise_at(leg, mk.time)) {
                const double now = exercise_value(leg, mk.spot);
                // The lattice value includes exercising now, so "now >= value" means exercise is optimal.
                if (now > 0 && now >= lm.value - 1e-9 * std::max(1.0, now)) {
                    mk.paid += q * now;
                    alive[i] = 0;
                    exercised = true;
                    continue;
                }
            }
            mk.value += q * lm.value;
            mk.delta += q * lm.delta;
            any_alive = true;
        }
        mk.last = !any_alive;
        if (mk.last) {
            mk.value += mk.paid;
            mk.paid = 0;
            mk.delta = 0;
        }
        mk.event = exercised ? "exercise" : mk.last ? "expiry" : expired ? "leg expiry" : k == 0 ? "start" : "rebalance";
        marks.push_back(mk);
        if (mk.last) break;
    }
    if (marks.back().event == "exercise" && marks.size() < dates.size())
        notes.push_back("the holder exercises on " + join_dates(dates, marks.size() - 1, 1) +
                        "; the schedule ends there");
    return marks;
}

std::vector<mark> lattice_marks(const trade& t, const hedge_settings& hs, std::vector<std::string>& notes) {
    const trade_lattice lat(t, static_cast<int>(hs.path.moves.size()));
    notes.insert(notes.end(), lat.notes.begin(), lat.notes.end());
    if (hs.rebalance_given)
        notes.push_back("hedge.rebalance is not used by a lattice path: it rebalances at each of its " +
                        std::to_string(lat.steps) + " steps");
    std::vector<mark> marks;
    const auto walk = walk_path(lat, hs.path.moves);
    for (std::size_t k = 0; k < walk.size(); ++k) {
        const tree_node& node = walk[k].node;
        mark mk;
        mk.time = lat.time(node.step);
        mk.day = day_of(t, mk.time);
        mk.spot = node.spot;
        mk.diffusing = lat.diffusing(node.step, node.index);
        mk.last = k + 1 == walk.size();
        if (mk.last) {
            mk.value = node.value;
            mk.event = node.event == node_event::early_exercise ? "exercise" : "expiry";
        } else {
            mk.value = node.value - node.paid;
            mk.paid = node.paid;
            mk.delta = node.shares;
            mk.event = node.event == node_event::early_exercise ? "exercise"
                       : node.event == node_event::expiry        ? "leg expiry"
                       : k == 0                                  ? "start"
                                                                 : "rebalance";
        }
        marks.push_back(mk);
    }
    if (walk.back().node.step < lat.steps)
        notes.push_back("the holder exercises at step " + std::to_string(walk.back().node.step) +
                        "; the remaining moves are not used");
    return marks;
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
        s.times = read_times(r.raw(key), r.child(key), t, has_dates);
        s.explicit_times = true;
    } else {
        s.every = static_cast<int>(r.integer_or("every", 1, 1, 1000));
        s.unit = parse_unit(r.choice_or("unit", unit_names, "weeks"));
    }
    r.finish();
    return s;
}

hedge_settings read_hedge_settings(const trade& t) {
    hedge_settings hs;
    hs.path.drift = t.market.rate;
    hs.path.volatility = t.market.volatility;
    if (!t.source.is_object() || !t.source.contains("hedge") || t.source["hedge"].is_null()) return hs;
    field_reader r(t.source["hedge"], "hedge");
    if (const json* node = r.raw_optional("rebalance")) {
        hs.rebalance = read_rebalance(*node, "hedge.rebalance", t);
        hs.rebalance_given = true;
    }
    if (const json* node = r.raw_optional("path")) hs.path = read_path(*node, t);
    hs.cost_bp = r.number_or("cost_bp", 0.0);
    require_non_negative(hs.cost_bp, r.child("cost_bp"));
    require_at_most(hs.cost_bp, max_cost_bp, r.child("cost_bp"));
    hs.lattice_steps = static_cast<int>(r.integer_or("lattice_steps", default_hedge_lattice_steps, 10, 2000));
    if (const json* node = r.raw_optional("tree")) {
        field_reader tr(*node, "hedge.tree");
        hs.tree.steps = static_cast<int>(tr.integer_or("steps", 0, 1, max_tree_steps));
        hs.tree.from_step = static_cast<int>(tr.integer_or("from_step", 0, 0, max_tree_steps));
        hs.tree.to_step = static_cast<int>(tr.integer_or("to_step", -1, 0, max_tree_steps));
        tr.finish();
    }
    r.finish();
    return hs;
}

std::vector<schedule_date> schedule_dates(const trade& t, const rebalance_spec& spec, const std::string& path) {
    const double T = t.final_expiry();
    std::vector<schedule_date> out{{0.0, t.valuation_date}};
    const auto add = [&](double time, std::optional<date> day) {
        if (out.size() > max_rebalancing_dates)
            fail(join_path(path, spec.explicit_times ? "dates" : "every"),
                 "gives more than " + std::to_string(max_rebalancing_dates) +
                     " rebalancing dates before the final expiry; rebalance less often");
        out.push_back({time, day});
    };
    if (spec.explicit_times) {
        for (double x : spec.times)
            if (x < T - time_tolerance) add(x, day_of(t, x));
    } else if (t.valuation_date) {
        const date start = *t.valuation_date;
        for (long k = 1;; ++k) {
            date d;
            if (spec.unit == rebalance_unit::days) {
                // every N business days: walk forward N Monday-Friday days from the previous date
                d = out.back().day ? *out.back().day : start;
                for (int n = 0; n < spec.every;) {
                    d = add_days(d, 1);
                    if (is_business_day(d)) ++n;
                }
            } else if (spec.unit == rebalance_unit::weeks) {
                d = next_business_day(add_days(start, 7L * spec.every * k));
            } else {
                d = next_business_day(add_months(start, static_cast<int>(spec.every * k)));
            }
            const double x = year_fraction(start, d);
            if (x >= T - time_tolerance) break;
            if (x > out.back().time + time_tolerance) add(x, d);
        }
    } else {
        const double step = spec.unit == rebalance_unit::days    ? spec.every * (7.0 / 5.0) / 365.0
                            : spec.unit == rebalance_unit::weeks ? spec.every * 7.0 / 365.0
                                                                 : spec.every / 12.0;
        for (long k = 1; k * step < T - time_tolerance; ++k) add(k * step, std::nullopt);
    }
    // Every leg's expiry and Bermudan exercise date, and the final expiry.
    for (const auto& leg : t.legs) {
        if (leg.type == payoff_kind::stock) continue;
        add(leg.expiry, day_of(t, leg.expiry));
        for (double x : leg.exercise_times) add(x, day_of(t, x));
    }
    std::stable_sort(out.begin(), out.end(), [](const schedule_date& a, const schedule_date& b) { return a.time < b.time; });
    std::vector<schedule_date> unique;
    for (const auto& d : out)
        if (unique.empty() || d.time > unique.back().time + time_tolerance) unique.push_back(d);
    // The final expiry itself, exactly (a date within the tolerance before it is replaced).
    if (unique.back().time < T) unique.back() = {T, day_of(t, T)};
    return unique;
}

double share_income(const market_data& m, double s_diffusing, double from, double to) {
    const double dt = to - from;
    const double growth_r = std::exp(m.rate * dt);
    double inc = s_diffusing * (growth_r - std::exp((m.rate - m.carry_yield) * dt));
    if (!m.dividends.empty()) inc += m.dividend_pv(from, to) * growth_r;
    return inc;
}

market_data market_at(const market_data& m, double spot, double t) {
    market_data out = m;
    out.spot = spot;
    out.dividends.clear();
    for (const auto& d : m.dividends)
        if (d.time > t) out.dividends.push_back({d.time - t, d.amount});
    return out;
}

option_leg leg_at(const option_leg& leg, double t) {
    option_leg out = leg;
    out.expiry = leg.expiry - t;
    out.exercise_times.clear();
    for (double x : leg.exercise_times)
        if (x > t + time_tolerance) out.exercise_times.push_back(x - t);
    return out;
}

leg_mark mark_leg(const market_data& m, const option_leg& leg, lattice_method method, int steps) {
    if (leg.type == payoff_kind::stock) return {m.spot, 1.0};
    if (leg.exercise == exercise_style::european) {
        const valuation v = closed_form(m, leg);
        return {v.premium, v.sensitivities.delta};
    }
    lattice_settings s;
    s.method = method;
    s.steps = steps;
    s.extrapolate = true;
    const lattice_price p = price_lattice_only(m, leg, s);
    return {p.premium, p.sensitivities.delta};
}

hedge_schedule build_hedge(const trade& t, const hedge_settings& hs) {
    hedge_schedule out;
    const std::vector<mark> marks =
        hs.path.kind == path_kind::lattice ? lattice_marks(t, hs, out.notes) : price_marks(t, hs, out.notes);
    const market_data& m = t.market;
    const double q = t.signed_quantity();
    const double cost_rate = hs.cost_bp * 1e-4;

    // Cash is kept as (cash before costs) - (costs grown at the rate), so the
    // desk's view can charge costs by |quantity| whichever side it is on.
    double cash_before_costs = 0, cost_account = 0, shares = 0;
    hedge_totals& tot = out.totals;
    tot.premium = marks.front().value + marks.front().paid;
    for (std::size_t k = 0; k < marks.size(); ++k) {
        const mark& mk = marks[k];
        hedge_row row;
        row.time = mk.time;
        row.day = mk.day;
        row.event = mk.event;
        row.spot = mk.spot;
        row.option_value = mk.value;
        row.paid = mk.paid;
        if (k == 0) {
            cash_before_costs = tot.premium;
        } else {
            const mark& prev = marks[k - 1];
            const double growth = std::exp(m.rate * (mk.time - prev.time));
            row.interest = (cash_before_costs - cost_account) * (growth - 1);
            cash_before_costs *= growth;
            cost_account *= growth;
            const double income = share_income(m, prev.diffusing, prev.time, mk.time);
            if (income != 0 && shares != 0) row.dividends = shares * income;  // (no -0 in the table)
            cash_before_costs += row.dividends;
        }
        if (!mk.last) {
            cash_before_costs -= mk.paid;
            row.delta = mk.delta;
            row.shares_traded = mk.delta - shares;
            row.trade_cash_flow = -row.shares_traded * mk.spot;
            cash_before_costs += row.trade_cash_flow;
            row.cost = std::fabs(row.shares_traded) * mk.spot * cost_rate;
            cost_account += row.cost;
            shares = mk.delta;
        }
        row.shares_held = shares;
        row.cash = cash_before_costs - cost_account;
        row.portfolio_value = shares * mk.spot + row.cash;
        row.tracking_error = row.portfolio_value - row.option_value;
        row.desk_shares = q * shares;
        row.desk_pnl = q * (row.tracking_error + cost_account) - std::fabs(q) * cost_account;

        tot.shares_traded += std::fabs(row.shares_traded);
        tot.costs += row.cost;
        tot.interest += row.interest;
        tot.dividends += row.dividends;
        tot.paid += row.paid;
        out.rows.push_back(row);
    }
    const hedge_row& last = out.rows.back();
    tot.payoff = last.option_value;
    tot.portfolio_value = last.portfolio_value;
    tot.replication_error = last.tracking_error;
    tot.end_event = last.event;
    return out;
}

json hedge_result_json(const trade& t, const hedge_settings& hs, const hedge_schedule& s) {
    const double q = t.signed_quantity();
    json rows = json::array();
    for (const auto& r : s.rows) {
        rows.push_back(json{
            {"date", r.day ? json(to_iso(*r.day)) : json(nullptr)},
            {"years", r.time},
            {"event", r.event},
            {"spot", r.spot},
            {"option_value", r.option_value},
            {"paid", r.paid},
            {"delta", r.delta ? json(*r.delta) : json(nullptr)},
            {"shares_held", r.shares_held},
            {"shares_traded", r.shares_traded},
            {"trade_cash_flow", r.trade_cash_flow},
            {"cash", r.cash},
            {"interest", r.interest},
            {"dividends", r.dividends},
            {"cost", r.cost},
            {"portfolio_value", r.portfolio_value},
            {"tracking_error", r.tracking_error},
            {"desk_shares", r.desk_shares},
            {"desk_pnl", r.desk_pnl},
        });
    }
    const hedge_totals& tot = s.totals;
    json path{{"kind", kind_name(hs.path.kind)}};
    switch (hs.path.kind) {
        case path_kind::scenario:
            path["drift"] = hs.path.drift;
            path["volatility"] = hs.path.volatility;
            path["seed"] = hs.path.seed;
            break;
        case path_kind::lattice: path["moves"] = moves_text(hs.path.moves); break;
        case path_kind::stress:
            path["shape"] = shape_name(hs.path.shape);
            path["change"] = hs.path.change;
            if (hs.path.shape == stress_shape::gap_down) path["gap_years"] = hs.path.gap_time;
            break;
        case path_kind::spots: break;
    }
    json rebalance = hs.path.kind == path_kind::lattice
                         ? json{{"lattice_steps", hs.path.moves.size()}}
                         : (hs.rebalance.explicit_times ? json{{"dates", hs.rebalance.times.size()}}
                                                        : json{{"every", hs.rebalance.every}, {"unit", unit_name(hs.rebalance.unit)}});
    bool early = false;
    for (const auto& leg : t.legs) early = early || (leg.type != payoff_kind::stock && leg.exercise != exercise_style::european);
    std::string pricing = hs.path.kind == path_kind::lattice
                              ? "values and deltas from the " + to_string(t.lattice.method) + " lattice of the path (" +
                                    std::to_string(hs.path.moves.size()) + " steps): replication is exact on it"
                              : std::string("re-priced on each date with the remaining time: closed form for European legs") +
                                    (early ? ", " + to_string(t.lattice.method) + " lattice with " +
                                                 std::to_string(hs.lattice_steps) + " steps for American/Bermudan legs"
                                           : "");
    // Column order for CSV and tables; the table leaves out the columns that say nothing for this trade.
    const json columns = {"date", "years", "event", "spot", "option_value", "paid", "delta", "shares_held",
                          "shares_traded", "trade_cash_flow", "cash", "interest", "dividends", "cost",
                          "portfolio_value", "tracking_error", "desk_shares", "desk_pnl"};
    json table_columns = json::array();
    for (const auto& c : columns) {
        const std::string name = c.get<std::string>();
        if (name == "years" || name == "trade_cash_flow" || name == "desk_shares") continue;
        if ((name == "paid" && tot.paid == 0) || (name == "dividends" && tot.dividends == 0) || (name == "cost" && tot.costs == 0))
            continue;
        if (name == "date" && !t.valuation_date) table_columns.push_back("years");
        else table_columns.push_back(name);
    }
    return json{
        {"rows", rows},
        {"columns", columns},
        {"table_columns", table_columns},
        {"totals",
         {{"premium", tot.premium},
          {"payoff", tot.payoff},
          {"portfolio_value", tot.portfolio_value},
          {"replication_error", tot.replication_error},
          {"total_shares_traded", tot.shares_traded},
          {"total_costs", tot.costs},
          {"total_interest", tot.interest},
          {"total_dividends", tot.dividends},
          {"total_paid_before_end", tot.paid},
          {"end_event", tot.end_event}}},
        {"desk",
         {{"signed_quantity", q},
          {"premium", q * tot.premium},
          {"shares_at_start", s.rows.front().desk_shares},
          {"shares_at_end", s.rows.back().desk_shares},
          {"pnl", s.rows.back().desk_pnl},
          {"view", "The desk is the client's counterparty: it receives signed_quantity x premium, owes the client the "
                   "trade, and holds signed_quantity x the per-unit shares and cash (a desk that sold a put holds "
                   "the put's negative delta: it is short shares). desk_pnl counts costs on |quantity|."}}},
        {"path", path},
        {"rebalance", rebalance},
        {"cost_bp", hs.cost_bp},
        {"rate", t.market.rate},
        {"pricing", pricing},
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
}

json hedge_command(const trade& t) {
    const hedge_settings hs = read_hedge_settings(t);
    return hedge_result_json(t, hs, build_hedge(t, hs));
}

}  // namespace hedgeleaf
