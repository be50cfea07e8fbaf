// Hedgeleaf analytics: hedge schedules along one spot path (see hedge.hpp).
//
// Two steps: the marks (on each date, spot and the trade's value and delta; from
// re-pricing on a scenario, stress or given path, or from the lattice along a
// lattice path), then the accounting of the hedge portfolio from mark to mark.
#include "analytics/hedge.hpp"

#include "contract/errors.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/lattice.hpp"
#include "numerics/lattice_price.hpp"
#include "numerics/random.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

double dividend_pv_after(const market_data& m, double years, double until_years) {
    return m.dividends.empty() ? 0.0 : m.dividend_pv(years, until_years);
}

bool may_exercise_at(const option_leg& leg, double years) {
    if (leg.exercise == exercise_style::american) return true;
    if (leg.exercise == exercise_style::bermudan)
        for (double x : leg.exercise_years)
            if (std::fabs(x - years) <= time_tolerance_years) return true;
    return false;
}

// One date of the schedule before the accounting: spot, the trade's value and delta.
struct mark {
    double years = 0;
    std::optional<date> day;
    double spot = 0;
    double diffusing = 0;  // spot minus the PV of dividends still to come (to the final expiry)
    double value = 0;      // legs running after today's payments; on the last mark, today's payments
    double paid = 0;       // payments today by legs ending before the last mark
    double delta = 0;
    bool last = false;
    std::string event;
};

// The spot on each date for scenario and stress paths (acting on the diffusing spot).
std::vector<double> model_spots(const trade& t, const path_spec& p, const std::vector<schedule_date>& dates) {
    const double T = t.final_expiry_years();
    const double s0 = diffusing_spot(t.market, T);
    std::vector<double> out;
    random_stream rng(p.seed);
    double s = s0;
    for (std::size_t k = 0; k < dates.size(); ++k) {
        const double tk = dates[k].years;
        if (k > 0) {
            if (p.kind == path_kind::scenario) {
                const double dt = tk - dates[k - 1].years;
                const double z = rng.normal();
                s *= std::exp((p.drift - 0.5 * p.volatility * p.volatility) * dt + p.volatility * std::sqrt(dt) * z);
            } else if (p.shape == stress_shape::rise) {
                s = s0 * std::pow(1 + p.change, tk / T);
            } else if (p.shape == stress_shape::fall) {
                s = s0 * std::pow(1 - p.change, tk / T);
            } else {
                s = tk >= p.gap_years - time_tolerance_years ? s0 * (1 - p.change) : s0;
            }
        }
        out.push_back(s + dividend_pv_after(t.market, tk, T));
    }
    return out;
}

std::string join_dates(const std::vector<schedule_date>& dates, std::size_t from, std::size_t count) {
    std::string s;
    for (std::size_t k = from; k < dates.size() && k < from + count; ++k) {
        s += (s.empty() ? "" : ", ") + (dates[k].day ? to_iso(*dates[k].day) : format_number(dates[k].years) + "y");
    }
    if (dates.size() > from + count) s += ", ...";
    return s;
}

// The rebalancing dates, with a stress path's gap date added.
std::vector<schedule_date> hedge_dates(const trade& t, const hedge_settings& hs, std::vector<std::string>& notes) {
    std::vector<schedule_date> dates = schedule_dates(t, hs.rebalance, "hedge.rebalance");
    if (hs.path.kind == path_kind::stress && hs.path.shape == stress_shape::gap_down) {
        const bool present = std::any_of(dates.begin(), dates.end(), [&](const schedule_date& d) {
            return std::fabs(d.years - hs.path.gap_years) <= time_tolerance_years;
        });
        if (!present) {
            schedule_date gap{hs.path.gap_years, day_of(t, hs.path.gap_years)};
            dates.insert(
                std::upper_bound(dates.begin(), dates.end(), gap,
                                 [](const schedule_date& a, const schedule_date& b) { return a.years < b.years; }),
                gap);
            notes.push_back("the gap date is added to the rebalancing dates");
        }
    }
    return dates;
}

// Spot on each date: as given (a spots path), else from the scenario or stress model.
std::vector<double> path_spots(const trade& t, const path_spec& path, const std::vector<schedule_date>& dates) {
    if (path.kind != path_kind::spots) return model_spots(t, path, dates);
    if (path.spots.size() != dates.size() - 1)
        fail("hedge.path.spots", "has " + std::to_string(path.spots.size()) + " spots; the schedule has " +
                                     std::to_string(dates.size() - 1) + " dates after valuation (" +
                                     join_dates(dates, 1, 6) + ")");
    std::vector<double> spots{t.market.spot};
    spots.insert(spots.end(), path.spots.begin(), path.spots.end());
    return spots;
}

// The mark of one date: what each leg still running is worth and pays. `previous` is
// the mark before (none on the first date); `alive` tracks the legs across dates.
mark mark_date(const trade& t, const hedge_settings& hs, const schedule_date& date, double spot, bool final_date,
               const mark* previous, std::vector<char>& alive) {
    const double T = t.final_expiry_years();
    mark mk;
    mk.years = date.years;
    mk.day = date.day;
    mk.spot = spot;
    mk.diffusing = mk.spot - dividend_pv_after(t.market, mk.years, T);
    const market_data m = market_at(t.market, mk.spot, mk.years);
    bool exercised = false, expired = false, any_alive = false;
    for (std::size_t i = 0; i < t.legs.size(); ++i) {
        if (!alive[i]) continue;
        const option_leg& leg = t.legs[i];
        const double q = leg.quantity;
        if (leg.type == payoff_kind::stock) {
            if (previous)  // the share leg's dividends and carry since the last date go to its holder
                mk.paid += q * share_income(t.market, previous->diffusing, previous->years, mk.years);
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
        if (leg.expiry_years <= mk.years + time_tolerance_years) {
            mk.paid += q * exercise_value(leg, mk.spot);
            alive[i] = 0;
            expired = true;
            continue;
        }
        const leg_mark lm = mark_leg(m, leg_at(leg, mk.years), t.lattice.method, hs.lattice_steps);
        if (may_exercise_at(leg, mk.years)) {
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
    mk.event = exercised ? "exercise" : mk.last ? "expiry" : expired ? "leg expiry" : !previous ? "start" : "rebalance";
    return mk;
}

// Marks by re-pricing on each date (scenario, stress and spots paths).
std::vector<mark> price_marks(const trade& t, const hedge_settings& hs, std::vector<std::string>& notes) {
    const std::vector<schedule_date> dates = hedge_dates(t, hs, notes);
    const std::vector<double> spots = path_spots(t, hs.path, dates);
    std::vector<char> alive(t.legs.size(), 1);
    std::vector<mark> marks;
    for (std::size_t k = 0; k < dates.size(); ++k) {
        const mark* previous = marks.empty() ? nullptr : &marks.back();
        marks.push_back(mark_date(t, hs, dates[k], spots[k], k + 1 == dates.size(), previous, alive));
        if (marks.back().last) break;
    }
    if (marks.back().event == "exercise" && marks.size() < dates.size())
        notes.push_back("the holder exercises on " + join_dates(dates, marks.size() - 1, 1) +
                        "; the schedule ends there");
    return marks;
}

// Marks from the trade's lattice along a lattice path: replication is exact there.
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
        mk.years = lat.years_at(node.step);
        mk.day = day_of(t, mk.years);
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
                       : node.event == node_event::expiry       ? "leg expiry"
                       : k == 0                                 ? "start"
                                                                : "rebalance";
        }
        marks.push_back(mk);
    }
    if (walk.back().node.step < lat.steps)
        notes.push_back("the holder exercises at step " + std::to_string(walk.back().node.step) +
                        "; the remaining moves are not used");
    return marks;
}

// The hedge portfolio from mark to mark. Cash is kept as (cash before costs) - (costs
// grown at the rate), so the desk's view can charge costs by |quantity| whichever side
// it is on.
void book_marks(const trade& t, const hedge_settings& hs, const std::vector<mark>& marks, hedge_schedule& out) {
    const market_data& m = t.market;
    const double q = t.signed_quantity();
    const double cost_rate = hs.cost_bp * 1e-4;
    double cash_before_costs = 0, cost_account = 0, shares = 0;
    hedge_totals& tot = out.totals;
    tot.premium = marks.front().value + marks.front().paid;
    for (std::size_t k = 0; k < marks.size(); ++k) {
        const mark& mk = marks[k];
        hedge_row row;
        row.years = mk.years;
        row.day = mk.day;
        row.event = mk.event;
        row.spot = mk.spot;
        row.option_value = mk.value;
        row.paid = mk.paid;
        if (k == 0) {
            cash_before_costs = tot.premium;
        } else {
            const mark& prev = marks[k - 1];
            const double growth = m.rate.growth(prev.years, mk.years);
            row.interest = (cash_before_costs - cost_account) * (growth - 1);
            cash_before_costs *= growth;
            cost_account *= growth;
            const double income = share_income(m, prev.diffusing, prev.years, mk.years);
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
}

}  // namespace

double share_income(const market_data& m, double s_diffusing, double from_years, double to_years) {
    const double growth_r = m.rate.growth(from_years, to_years);
    double inc = s_diffusing * (growth_r - m.forward_growth(from_years, to_years));
    if (!m.dividends.empty()) inc += m.dividend_pv(from_years, to_years) * growth_r;
    return inc;
}

market_data market_at(const market_data& m, double spot, double years) {
    market_data out = m.seen_at(years);
    out.spot = spot;
    return out;
}

option_leg leg_at(const option_leg& leg, double years) {
    option_leg out = leg;
    out.expiry_years = leg.expiry_years - years;
    out.exercise_years.clear();
    for (double x : leg.exercise_years)
        if (x > years + time_tolerance_years) out.exercise_years.push_back(x - years);
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
    const lattice_price p = price_leg(m, leg, s);
    return {p.premium, p.sensitivities.delta};
}

hedge_schedule run_hedge(const trade& t, const hedge_settings& hs) {
    hedge_schedule out;
    const std::vector<mark> marks =
        hs.path.kind == path_kind::lattice ? lattice_marks(t, hs, out.notes) : price_marks(t, hs, out.notes);
    book_marks(t, hs, marks, out);
    out.against_price = compare_with_price(t, out.totals.premium);
    return out;
}

}  // namespace hedgeleaf
