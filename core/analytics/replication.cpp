// Hedgeleaf analytics: the replicating portfolio on one lattice (see replication.hpp).
#include "analytics/replication.hpp"

#include "contract/errors.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

// Strike that centres a Leisen-Reimer lattice shared by several legs: the first
// option leg's (the other methods ignore it).
double centre_strike(const trade& t) {
    for (const auto& leg : t.legs)
        if (leg.type != payoff_kind::stock) return leg.strike;
    return t.market.spot;
}

// One leg's backward induction on the shared lattice, visiting every level from
// the leg's expiry step down to 0 with that level's values and events.
template <class Visit>
void induce_leg(const trade_lattice& lat, std::size_t k, Visit&& visit) {
    const option_leg& leg = lat.source->legs[k];
    const int m = lat.last_step[k];
    std::vector<double> row(static_cast<std::size_t>(m) + 1);
    std::vector<char> event(static_cast<std::size_t>(m) + 1, static_cast<char>(node_event::expiry));
    const bool stock = leg.type == payoff_kind::stock;
    const double pv_m = lat.dividends_after(m);  // once per level: spot = S* + pv
    for (int j = 0; j <= m; ++j)
        row[j] = stock ? lat.diffusing(m, j) + pv_m : exercise_value(leg, lat.diffusing(m, j) + pv_m);
    visit(m, row, event);
    const std::vector<char>& allowed = lat.allowed[k];
    for (int n = m - 1; n >= 0; --n) {
        const double pu = lat.step(n).discount * lat.step(n).p_up;
        const double pd = lat.step(n).discount * (1 - lat.step(n).p_up);
        const bool may_exercise = allowed[static_cast<std::size_t>(n)] != 0;
        const double pv = stock || may_exercise ? lat.dividends_after(n) : 0.0;
        for (int j = 0; j <= n; ++j) {
            event[j] = static_cast<char>(node_event::none);
            if (stock) {
                row[j] = lat.diffusing(n, j) + pv;  // a share is worth its spot; its income goes to its holder
                continue;
            }
            const double wait = pu * row[j + 1] + pd * row[j];
            row[j] = wait;
            if (may_exercise) {
                const double now = exercise_value(leg, lat.diffusing(n, j) + pv);
                if (now > wait) {
                    row[j] = now;
                    event[j] = static_cast<char>(node_event::early_exercise);
                }
            }
        }
        visit(n, row, event);
    }
}

// A leg's replicating shares and cash at (n, j) from its values at the two children.
// A share leg's claim includes the income its holder receives over the step.
void leg_hedge(const trade_lattice& lat, std::size_t k, int n, int j, double v_down, double v_up, double& shares,
               double& cash) {
    const double inc = lat.income(n, j);
    const bool stock = lat.source->legs[k].type == payoff_kind::stock;
    const double x_up = v_up + (stock ? inc : 0.0);
    const double x_down = v_down + (stock ? inc : 0.0);
    const double s_up = lat.spot(n + 1, j + 1), s_down = lat.spot(n + 1, j);
    shares = (x_up - x_down) / (s_up - s_down);
    cash = (x_up - shares * (s_up + inc)) * lat.step(n).discount;
}

// Per leg and level of a path: the value on the path, its event, and the two children of the path node.
struct level_info {
    double here = 0, down = 0, up = 0;
    node_event event = node_event::none;
};

// Every leg's level_info along the path through nodes `index` (index[n] = up moves by step n).
std::vector<std::vector<level_info>> path_levels(const trade_lattice& lat, const std::vector<int>& index) {
    const std::size_t legs = lat.source->legs.size();
    const int length = static_cast<int>(index.size()) - 1;
    std::vector<std::vector<level_info>> info(legs, std::vector<level_info>(lat.steps + 1));
    for (std::size_t k = 0; k < legs; ++k)
        induce_leg(lat, k, [&](int n, const std::vector<double>& row, const std::vector<char>& ev) {
            if (n <= length) {
                info[k][n].here = row[index[n]];
                info[k][n].event = static_cast<node_event>(ev[index[n]]);
            }
            if (n >= 1 && n - 1 <= length) {
                info[k][n - 1].down = row[index[n - 1]];
                info[k][n - 1].up = row[index[n - 1] + 1];
            }
        });
    return info;
}

}  // namespace

std::string to_string(node_event e) {
    static const std::vector<std::string> words = {"none", "early", "expiry"};  // node_event's order
    return word_of(words, e);
}

namespace {

// The grid of the trade's lattice: a step boundary on every event when `n_steps` allows it.
time_grid trade_grid(const trade& t, int n_steps, std::vector<std::string>& notes) {
    const double T = t.final_expiry_years();
    std::vector<double> events;
    for (const auto& leg : t.legs) {
        if (leg.type == payoff_kind::stock) continue;
        events.push_back(leg.expiry_years);
        const std::vector<double> own = leg_events(t.market, leg);
        events.insert(events.end(), own.begin(), own.end());
    }
    time_grid grid = make_time_grid(T, n_steps, events);
    if (grid.steps == n_steps) return grid;
    notes.push_back("the trade's expiries, exercise and dividend dates need " + std::to_string(grid.segments) +
                    " pieces of the lattice, more than its " + std::to_string(n_steps) +
                    " steps: the steps are equal and such dates fall on the nearest step (give at least " +
                    std::to_string(grid.segments) + " steps to put each on its own step)");
    return make_time_grid(T, n_steps, {});
}

}  // namespace

trade_lattice::trade_lattice(const trade& t, int n_steps) : source(&t), steps(n_steps) {
    const double T = t.final_expiry_years();
    const time_grid grid = trade_grid(t, n_steps, notes);
    geometry = make_geometry(t.lattice.method, t.market, centre_strike(t), grid);
    s0 = diffusing_spot(t.market, T);
    if (grid.uniform && t.lattice.method == lattice_method::leisen_reimer && steps % 2 == 0)
        notes.push_back("a leisen-reimer lattice is centred for an odd number of steps; with " + std::to_string(steps) +
                        " its values are rougher (use " + std::to_string(steps + 1) + " steps or lattice.method crr)");
    if (!grid.uniform)
        notes.push_back(
            "the steps differ in length so that every expiry, exercise and dividend date falls on a step: " +
            std::to_string(grid.segments) + " pieces of equal steps, the same spacing of log spot for " +
            "every method (up and down vary by step)");
    for (std::size_t k = 0; k < t.legs.size(); ++k) {
        const option_leg& leg = t.legs[k];
        int m = steps;
        if (leg.type != payoff_kind::stock) {
            m = std::clamp(grid.nearest_step(leg.expiry_years), 1, steps);
            if (std::fabs(years_at(m) - leg.expiry_years) > 1e-9 * T)
                notes.push_back("legs[" + std::to_string(k) + "] expires at " + format_number(leg.expiry_years) +
                                " years, between lattice steps; it pays at step " + std::to_string(m) + " (" +
                                format_number(years_at(m)) + " years)");
        }
        last_step.push_back(m);
        std::vector<char> rows = exercise_steps(leg, grid);
        rows.resize(static_cast<std::size_t>(m) + 1);
        rows[static_cast<std::size_t>(m)] = 1;
        allowed.push_back(rows);
    }
}

double trade_lattice::diffusing(int n, int j) const {
    if (!geometry.constant) return s0 * std::exp(geometry.offset(n) + j * geometry.log_ratio);
    return s0 * std::exp(j * std::log(geometry.step.up) + (n - j) * std::log(geometry.step.down));
}

double trade_lattice::dividends_after(int n) const {
    return source->market.dividends.empty() ? 0.0 : source->market.dividend_pv(years_at(n), years_at(steps));
}

double trade_lattice::income(int n, int j) const {
    const market_data& m = source->market;
    // A lattice of one step repeated uses the rate averaged to the final expiry
    // (numerics/lattice.cpp); one whose steps differ, each step's own.
    const double growth_r = geometry.constant ? std::exp(m.rate.average(0, years_at(steps)) * step(n).dt)
                                              : m.rate.growth(years_at(n), years_at(n + 1));
    double inc = diffusing(n, j) * (growth_r - step(n).growth);  // carry yield earned on S*
    if (!m.dividends.empty()) inc += m.dividend_pv(years_at(n), years_at(n + 1)) * growth_r;
    return inc;
}

std::vector<tree_node> tree_window(const trade_lattice& lat, int from_step, int to_step) {
    const trade& t = *lat.source;
    const int last_needed = std::min(to_step + 1, lat.steps);
    const int levels = last_needed - from_step + 1;
    // Per leg, per level in [from_step, last_needed]: values and events.
    std::vector<std::vector<std::vector<double>>> values(t.legs.size(), std::vector<std::vector<double>>(levels));
    std::vector<std::vector<std::vector<char>>> events(t.legs.size(), std::vector<std::vector<char>>(levels));
    for (std::size_t k = 0; k < t.legs.size(); ++k)
        induce_leg(lat, k, [&](int n, const std::vector<double>& row, const std::vector<char>& ev) {
            if (n < from_step || n > last_needed) return;
            values[k][n - from_step].assign(row.begin(), row.begin() + n + 1);
            events[k][n - from_step].assign(ev.begin(), ev.begin() + n + 1);
        });

    std::vector<tree_node> out;
    for (int n = from_step; n <= to_step; ++n) {
        for (int j = 0; j <= n; ++j) {
            tree_node node;
            node.step = n;
            node.index = j;
            node.spot = lat.spot(n, j);
            node.income = n < lat.steps ? lat.income(n, j) : 0.0;
            bool early = false, expiry = false;
            for (std::size_t k = 0; k < t.legs.size(); ++k) {
                if (n > lat.last_step[k]) continue;  // paid out earlier
                const double q = t.legs[k].quantity;
                const double v = values[k][n - from_step][j];
                const auto ev = static_cast<node_event>(events[k][n - from_step][j]);
                node.value += q * v;
                if (ev != node_event::none) {
                    node.paid += q * v;
                    early = early || ev == node_event::early_exercise;
                    expiry = expiry || ev == node_event::expiry;
                    continue;
                }
                double shares, cash;
                const auto& next = values[k][n + 1 - from_step];
                leg_hedge(lat, k, n, j, next[j], next[j + 1], shares, cash);
                node.shares += q * shares;
                node.cash += q * cash;
            }
            node.event = early ? node_event::early_exercise : (expiry ? node_event::expiry : node_event::none);
            out.push_back(node);
        }
    }
    return out;
}

std::vector<path_step> walk_path(const trade_lattice& lat, const std::vector<int>& moves) {
    const trade& t = *lat.source;
    const int length = static_cast<int>(moves.size());
    if (length > lat.steps)
        fail("hedge.path.moves",
             "has " + std::to_string(length) + " moves, the lattice has " + std::to_string(lat.steps) + " steps");
    std::vector<int> index(static_cast<std::size_t>(length) + 1, 0);
    for (int n = 0; n < length; ++n) index[n + 1] = index[n] + moves[n];

    const auto info = path_levels(lat, index);

    std::vector<char> alive(t.legs.size(), 1);
    std::vector<path_step> out;
    double carried = 0, income_before = 0;
    for (int n = 0; n <= length; ++n) {
        path_step ps;
        tree_node& node = ps.node;
        node.step = n;
        node.index = index[n];
        node.spot = lat.spot(n, index[n]);
        node.income = n < lat.steps ? lat.income(n, index[n]) : 0.0;
        bool early = false, expiry = false, any_alive = false;
        for (std::size_t k = 0; k < t.legs.size(); ++k) {
            if (!alive[k]) continue;
            const double q = t.legs[k].quantity;
            const level_info& li = info[k][n];
            if (t.legs[k].type == payoff_kind::stock && n > 0) {
                // A share leg's dividends and carry over the last step are paid to its holder.
                node.value += q * income_before;
                node.paid += q * income_before;
            }
            node.value += q * li.here;
            if (li.event != node_event::none) {
                node.paid += q * li.here;
                early = early || li.event == node_event::early_exercise;
                expiry = expiry || li.event == node_event::expiry;
                alive[k] = 0;
                continue;
            }
            any_alive = true;
            double shares, cash;
            leg_hedge(lat, k, n, index[n], li.down, li.up, shares, cash);
            node.shares += q * shares;
            node.cash += q * cash;
        }
        node.event = early ? node_event::early_exercise : (expiry ? node_event::expiry : node_event::none);
        ps.carried = n == 0 ? node.value : carried;
        out.push_back(ps);
        if (!any_alive || n == length) break;
        const int j_next = index[n + 1];
        income_before = node.income;
        carried = node.shares * (lat.spot(n + 1, j_next) + node.income) + node.cash / lat.step(n).discount;
    }
    return out;
}

leg_value_table leg_values(const trade_lattice& lat, std::size_t leg) {
    leg_value_table table;
    table.value.resize(static_cast<std::size_t>(lat.steps) + 1);
    table.exercised.resize(static_cast<std::size_t>(lat.steps) + 1);
    induce_leg(lat, leg, [&](int n, const std::vector<double>& row, const std::vector<char>& ev) {
        table.value[n].assign(row.begin(), row.begin() + n + 1);
        table.exercised[n].resize(static_cast<std::size_t>(n) + 1);
        for (int j = 0; j <= n; ++j)
            table.exercised[n][j] = static_cast<node_event>(ev[j]) == node_event::early_exercise;
    });
    return table;
}

}  // namespace hedgeleaf
