// Hedgeleaf analytics: Monte Carlo of discrete delta hedging (see simulate.hpp).
//
// The steps: the dates of every frequency and their union (the grid the paths are
// drawn on, so every frequency hedges the same paths); per frequency a plan of what
// each leg needs on each date (closed-form delta constants, or a level of a lattice
// delta table for American and Bermudan legs); the paths, each hedged at every
// frequency; then the summaries and a histogram on shared edges.
#include "analytics/simulate.hpp"

#include "analytics/leg_market.hpp"
#include "analytics/pnl_statistics.hpp"
#include "analytics/replication.hpp"
#include "contract/errors.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/lattice.hpp"
#include "numerics/random.hpp"

#include <algorithm>
#include <cmath>
#include <optional>

namespace hedgeleaf {

namespace {

// European value-free delta of one leg on the diffusing spot for the leg, with
// the per-date constants precomputed (closed_form's formulas, delta only).
struct euro_delta {
    double strike = 0, drift_term = 0, inv_vol = 0, df_q = 0, scale = 0, w = 1;
    bool digital = false;
    double operator()(double s_leg) const {
        const double d1 = (std::log(s_leg / strike) + drift_term) * inv_vol;
        if (!digital) return w * df_q * normal_cdf(w * d1);
        const double d2 = d1 - 1.0 / inv_vol;
        return w * scale * normal_pdf(d2) * inv_vol / s_leg;
    }
};

// A lattice level of one non-European leg: node deltas and values against log S*.
struct table_level {
    std::vector<double> value, delta;
    int n = 0;
    double offset = 0;  // log(S*(n, 0) / S*_0) on a lattice whose steps differ
};

struct leg_date {
    bool expires = false;  // the leg pays on this date
    bool may_exercise = false;
    euro_delta euro;  // European legs
    double pv = 0;    // PV of dividends in (t, leg expiry]: s_leg = S - pv
    int table = -1;   // index into the leg's table levels (others)
};

struct frequency_plan {
    std::vector<int> grid;                         // union-grid index of each date
    std::vector<double> growth;                    // e^(r dt) into each date
    std::vector<double> carry;                     // e^(r dt) - e^((r-q) dt): carry income per unit of S*
    std::vector<double> dividends;                 // cash dividends in the interval, grown to its end
    std::vector<std::vector<leg_date>> legs;       // [date][leg]
    std::vector<std::vector<table_level>> levels;  // [leg][k]: levels used by this frequency
};

// Dates per frequency and their union, the grid the paths are drawn on.
struct date_grid {
    std::vector<std::vector<schedule_date>> dates;  // per frequency
    std::vector<double> grid;                       // sorted, no repeats
    int index(double x) const {
        const auto it = std::lower_bound(grid.begin(), grid.end(), x - time_tolerance_years);
        return static_cast<int>(it - grid.begin());
    }
};

}  // namespace

void check_simulation_size(double path_rebalancings) {
    if (path_rebalancings > max_path_rebalancings)
        fail("simulate.paths", "paths x rebalancings over all frequencies is " +
                                   std::to_string(static_cast<long long>(path_rebalancings)) + ", at most " +
                                   std::to_string(static_cast<long long>(max_path_rebalancings)) +
                                   "; use fewer paths or rebalance less often");
}

namespace {

date_grid simulation_dates(const trade& t, const simulate_settings& st) {
    date_grid out;
    double work = 0;
    for (std::size_t f = 0; f < st.frequencies.size(); ++f) {
        out.dates.push_back(schedule_dates(t, st.frequencies[f], index_path("simulate.frequencies", f)));
        for (const auto& d : out.dates.back()) out.grid.push_back(d.years);
        work += static_cast<double>(st.paths) * static_cast<double>(out.dates.back().size() - 1);
    }
    check_simulation_size(work);
    std::sort(out.grid.begin(), out.grid.end());
    out.grid.erase(std::unique(out.grid.begin(), out.grid.end(),
                               [](double a, double b) { return std::fabs(a - b) <= time_tolerance_years; }),
                   out.grid.end());
    return out;
}

bool every_leg_european(const trade& t) {
    bool all_european = true;
    for (const auto& leg : t.legs)
        if (leg.type != payoff_kind::stock && leg.exercise != exercise_style::european) all_european = false;
    return all_european;
}

// Steps of the delta tables: as asked, else 4 per date of the longest schedule, 200 to 1000.
int delta_table_steps(const simulate_settings& st, const date_grid& dates) {
    std::size_t most_dates = 0;
    for (const auto& d : dates.dates) most_dates = std::max(most_dates, d.size());
    return st.lattice_steps > 0 ? st.lattice_steps : std::clamp(static_cast<int>(4 * most_dates), 200, 1000);
}

// The leg's delta `from_years` on, `tau` years before its expiry, with the rate and the
// carry averaged over that remaining life (the plain numbers when they are flat).
euro_delta euro_delta_for(const market_data& market, const option_leg& leg, double from_years, double tau) {
    const market_data m = leg_market(market, leg);  // the leg's own volatility
    const double vol_t = m.volatility * std::sqrt(tau);
    const double r = m.rate.average(from_years, leg.expiry_years);
    const double q = m.carry_average(from_years, leg.expiry_years);
    euro_delta e;
    e.strike = leg.strike;
    e.drift_term = (r - q + 0.5 * m.volatility * m.volatility) * tau;
    e.inv_vol = 1.0 / vol_t;
    e.df_q = std::exp(-q * tau);
    e.digital = leg.type == payoff_kind::digital_call || leg.type == payoff_kind::digital_put;
    e.w = (leg.type == payoff_kind::call || leg.type == payoff_kind::digital_call) ? 1.0 : -1.0;
    e.scale = leg.payout * std::exp(-r * tau);
    return e;
}

// What one frequency needs on each of its dates; table levels are sized, not yet filled.
frequency_plan plan_frequency(const trade& t, const std::vector<schedule_date>& ds, const date_grid& dates,
                              const trade_lattice* lat) {
    const market_data& m = t.market;
    const std::size_t n_legs = t.legs.size();
    frequency_plan plan;
    plan.levels.resize(n_legs);
    for (std::size_t k = 0; k < ds.size(); ++k) {
        plan.grid.push_back(dates.index(ds[k].years));
        const double from = k == 0 ? ds[k].years : ds[k - 1].years, to = ds[k].years;
        const double growth_r = m.rate.growth(from, to);
        plan.growth.push_back(growth_r);
        plan.carry.push_back(growth_r - m.forward_growth(from, to));
        plan.dividends.push_back(k == 0 || m.dividends.empty() ? 0.0 : m.dividend_pv(from, to) * growth_r);
        std::vector<leg_date> lds(n_legs);
        for (std::size_t i = 0; i < n_legs; ++i) {
            const option_leg& leg = t.legs[i];
            leg_date& ld = lds[i];
            if (leg.type == payoff_kind::stock) continue;
            const double tau = leg.expiry_years - ds[k].years;
            ld.expires = tau <= time_tolerance_years;
            if (ld.expires) continue;
            ld.pv = m.dividends.empty() ? 0.0 : m.dividend_pv(ds[k].years, leg.expiry_years);
            if (leg.exercise == exercise_style::european) {
                ld.euro = euro_delta_for(m, leg, ds[k].years, tau);
            } else {
                ld.may_exercise = leg.exercise == exercise_style::american ||
                                  std::any_of(leg.exercise_years.begin(), leg.exercise_years.end(), [&](double x) {
                                      return std::fabs(x - ds[k].years) <= time_tolerance_years;
                                  });
                ld.table = static_cast<int>(plan.levels[i].size());
                plan.levels[i].push_back(table_level{});
                plan.levels[i].back().n = std::min(lat->geometry.grid.nearest_step(ds[k].years), lat->last_step[i] - 1);
            }
        }
        plan.legs.push_back(std::move(lds));
    }
    return plan;
}

// Fill the lattice levels each frequency needs, one leg table at a time.
void fill_levels(const trade& t, const trade_lattice& lat, std::vector<frequency_plan>& plans) {
    for (std::size_t i = 0; i < t.legs.size(); ++i) {
        const option_leg& leg = t.legs[i];
        if (leg.type == payoff_kind::stock || leg.exercise == exercise_style::european) continue;
        const leg_value_table table = leg_values(lat, i);
        for (auto& plan : plans)
            for (auto& level : plan.levels[i]) {
                const int n = level.n;
                level.offset = lat.geometry.offset(n);
                level.value = table.value[n];
                level.delta.resize(static_cast<std::size_t>(n) + 1);
                for (int j = 0; j <= n; ++j)
                    level.delta[j] = (table.value[n + 1][j + 1] - table.value[n + 1][j]) /
                                     (lat.spot(n + 1, j + 1) - lat.spot(n + 1, j));
            }
    }
}

// Premium and first hedge: the same on every path. A table leg that expires at the first date
// (within the time tolerance of it) has no level there: its value today is read off the lattice.
double opening_premium(const trade& t, const frequency_plan& first, const trade_lattice* lat) {
    const market_data& m = t.market;
    double premium = 0;
    for (std::size_t i = 0; i < t.legs.size(); ++i) {
        const option_leg& leg = t.legs[i];
        if (leg.type == payoff_kind::stock)
            premium += leg.quantity * m.spot;
        else if (leg.exercise == exercise_style::european)
            premium += leg.quantity * closed_form(leg_market(m, leg), leg).premium;
        else if (!first.levels[i].empty())
            premium += leg.quantity * first.levels[i][0].value[0];
        else
            premium += leg.quantity * leg_values(*lat, i).value[0][0];
    }
    return premium;
}

// Value and delta of a table leg at diffusing spot s_star, linear in node position.
struct table_reader {
    double log_s0 = 0, log_u = 0, log_d = 0;  // log_u - log_d: the lattice's spacing L
    bool varying = false;                     // steps differ: each level carries its offset
    double operator()(const table_level& level, double log_s_star, bool want_value, double& value) const {
        const int n = level.n;
        if (n == 0) {
            value = level.value[0];
            return level.delta[0];
        }
        double x = varying ? (log_s_star - log_s0 - level.offset) / (log_u - log_d)
                           : (log_s_star - log_s0 - n * log_d) / (log_u - log_d);
        x = std::clamp(x, 0.0, static_cast<double>(n));
        const int j = std::min(static_cast<int>(x), n - 1);
        const double w = x - j;
        if (want_value) value = level.value[j] + w * (level.value[j + 1] - level.value[j]);
        return level.delta[j] + w * (level.delta[j + 1] - level.delta[j]);
    }
};

// One drawn path (on the grid) and what is fixed across paths.
struct path_view {
    const std::vector<double>& s_star;    // diffusing spot on each grid date
    const std::vector<double>& log_star;  // its logarithm
    const std::vector<double>& pv_after;  // PV of the dividends still to come, per grid date
};

struct path_outcome {
    double pnl_before_costs = 0;
    double costs = 0;      // grown at the rate to the end
    double cost_paid = 0;  // as paid
};

// Hedge one path at one frequency until the trade has ended.
path_outcome hedge_path(const trade& t, const frequency_plan& plan, const path_view& path,
                        const table_reader& from_table, double premium, double cost_rate, std::vector<char>& alive) {
    const std::size_t n_legs = t.legs.size();
    std::fill(alive.begin(), alive.end(), 1);
    double shares = 0, cash = premium, costs = 0, cost_paid = 0, pnl_before_costs = 0;
    const std::size_t K = plan.grid.size();
    for (std::size_t k = 0; k < K; ++k) {
        const int g = plan.grid[k];
        const double spot = path.s_star[g] + path.pv_after[g];
        if (k > 0) {
            const int g_prev = plan.grid[k - 1];
            cash = cash * plan.growth[k] + shares * (plan.carry[k] * path.s_star[g_prev] + plan.dividends[k]);
            costs *= plan.growth[k];
        }
        double delta = 0, paid = 0;
        bool any_alive = false;
        for (std::size_t i = 0; i < n_legs; ++i) {
            if (!alive[i]) continue;
            const option_leg& leg = t.legs[i];
            const double q = leg.quantity;
            if (leg.type == payoff_kind::stock) {
                if (k > 0)  // its dividends and carry go to the holder
                    paid += q * (plan.carry[k] * path.s_star[plan.grid[k - 1]] + plan.dividends[k]);
                if (k + 1 == K) {
                    paid += q * spot;
                    alive[i] = 0;
                } else {
                    delta += q;
                    any_alive = true;
                }
                continue;
            }
            const leg_date& ld = plan.legs[k][i];
            if (ld.expires) {
                paid += q * exercise_value(leg, spot);
                alive[i] = 0;
                continue;
            }
            if (ld.table < 0) {
                delta += q * ld.euro(spot - ld.pv);
                any_alive = true;
                continue;
            }
            double value = 0;
            const double d = from_table(plan.levels[i][ld.table], path.log_star[g], ld.may_exercise, value);
            if (ld.may_exercise) {
                const double now = exercise_value(leg, spot);
                if (now > 0 && now >= value - 1e-9 * std::max(1.0, now)) {
                    paid += q * now;
                    alive[i] = 0;
                    continue;
                }
            }
            delta += q * d;
            any_alive = true;
        }
        if (!any_alive) {  // the trade has ended: compare the hedge with what it pays
            pnl_before_costs = shares * spot + cash - paid;
            break;
        }
        cash -= paid + (delta - shares) * spot;
        const double cost = std::fabs(delta - shares) * spot * cost_rate;
        costs += cost;
        cost_paid += cost;
        shares = delta;
    }
    return {pnl_before_costs, costs, cost_paid};
}

// Draw every path on the grid and hedge it at every frequency: per-unit P&L into
// out.frequencies[f].pnl, the desk's into desk_pnl[f], costs paid into cost_sum[f].
void simulate_paths(const trade& t, const simulate_settings& st, const date_grid& dates,
                    const std::vector<frequency_plan>& plans, const table_reader& from_table, double premium,
                    simulation& out, std::vector<std::vector<double>>& desk_pnl, std::vector<double>& cost_sum) {
    const market_data& m = t.market;
    const double T = t.final_expiry_years();
    const std::vector<double>& grid = dates.grid;
    std::vector<double> pv_after(grid.size());
    for (std::size_t g = 0; g < grid.size(); ++g) pv_after[g] = m.dividends.empty() ? 0.0 : m.dividend_pv(grid[g], T);
    const double s0 = diffusing_spot(m, T);
    const double log_s0 = std::log(s0);
    const double q_pos = t.signed_quantity();
    const double cost_rate = st.cost_bp * 1e-4;
    const double drift_dt = st.drift - 0.5 * st.volatility * st.volatility;
    std::vector<double> step_drift(grid.size()), step_vol(grid.size());
    for (std::size_t g = 1; g < grid.size(); ++g) {
        const double dt = grid[g] - grid[g - 1];
        step_drift[g] = drift_dt * dt;
        step_vol[g] = st.volatility * std::sqrt(dt);
    }

    random_stream rng(st.seed);
    std::vector<double> s_star(grid.size()), log_star(grid.size());
    std::vector<char> alive(t.legs.size());
    const path_view path{s_star, log_star, pv_after};
    for (long p = 0; p < st.paths; ++p) {
        s_star[0] = s0;
        log_star[0] = log_s0;
        for (std::size_t g = 1; g < grid.size(); ++g) {
            log_star[g] = log_star[g - 1] + step_drift[g] + step_vol[g] * rng.normal();
            s_star[g] = std::exp(log_star[g]);
        }
        for (std::size_t f = 0; f < plans.size(); ++f) {
            const path_outcome o = hedge_path(t, plans[f], path, from_table, premium, cost_rate, alive);
            out.frequencies[f].pnl[p] = o.pnl_before_costs - o.costs;
            desk_pnl[f][p] = q_pos * o.pnl_before_costs - std::fabs(q_pos) * o.costs;
            cost_sum[f] += o.cost_paid;
        }
    }
}

// One European call or put: the hedging error's sd has a closed-form reference.
void derman_kamal_reference(const trade& t, const simulate_settings& st, simulation& out) {
    out.derman_kamal = t.legs.size() == 1 &&
                       (t.legs[0].type == payoff_kind::call || t.legs[0].type == payoff_kind::put) &&
                       t.legs[0].exercise == exercise_style::european;
    if (!out.derman_kamal) return;
    const double vega =
        std::fabs(t.legs[0].quantity) * closed_form(leg_market(t.market, t.legs[0]), t.legs[0]).sensitivities.vega;
    for (auto& s : out.frequencies) s.derman_kamal_sd = derman_kamal_sd(vega, st.volatility, s.rebalancings);
}

}  // namespace

double derman_kamal_sd(double vega, double sigma, int n) {
    return std::sqrt(M_PI / 4.0) * std::fabs(vega) * sigma / std::sqrt(static_cast<double>(n));
}

simulation run_simulation(const trade& given, const simulate_settings& st) {
    simulation out;
    const trade t = with_fixed_volatilities(given);  // each leg held at today's smile volatility
    const date_grid dates = simulation_dates(t, st);

    // Delta method per leg: closed form if European, a lattice table otherwise.
    out.closed_form_delta = every_leg_european(t);
    const int lattice_steps = delta_table_steps(st, dates);
    std::optional<trade_lattice> lat;
    if (!out.closed_form_delta) {
        lat.emplace(t, lattice_steps);
        out.lattice_steps = lattice_steps;
    }
    std::vector<frequency_plan> plans;
    for (const auto& ds : dates.dates) plans.push_back(plan_frequency(t, ds, dates, lat ? &*lat : nullptr));
    if (lat) fill_levels(t, *lat, plans);
    const double premium = opening_premium(t, plans[0], lat ? &*lat : nullptr);
    out.premium = premium;

    table_reader from_table;
    from_table.log_s0 = std::log(diffusing_spot(t.market, t.final_expiry_years()));
    if (lat && lat->geometry.constant) {
        from_table.log_u = std::log(lat->geometry.step.up);
        from_table.log_d = std::log(lat->geometry.step.down);
    } else if (lat) {
        from_table.varying = true;
        from_table.log_u = lat->geometry.log_ratio;
    }

    out.frequencies.resize(plans.size());
    std::vector<std::vector<double>> desk_pnl(plans.size());
    std::vector<double> cost_sum(plans.size(), 0.0);
    for (std::size_t f = 0; f < plans.size(); ++f) {
        out.frequencies[f].frequency = st.frequencies[f];
        out.frequencies[f].rebalancings = static_cast<int>(dates.dates[f].size()) - 1;
        out.frequencies[f].pnl.resize(static_cast<std::size_t>(st.paths));
        desk_pnl[f].resize(static_cast<std::size_t>(st.paths));
    }
    simulate_paths(t, st, dates, plans, from_table, premium, out, desk_pnl, cost_sum);
    const histogram_range range = summarise_pnl(st, cost_sum, out);
    fill_histograms(st, range, out);
    desk_figures(st, desk_pnl, out);
    derman_kamal_reference(t, st, out);
    if (given.market.smile) {
        out.notes.push_back(delta_volatility_note(given));
        if (!out.closed_form_delta)
            out.notes.push_back("American and Bermudan legs take value and delta from tables on one lattice; " +
                                shared_lattice_note(given));
    }
    return out;
}

}  // namespace hedgeleaf
