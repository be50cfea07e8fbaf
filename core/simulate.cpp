// Hedgeleaf core: Monte Carlo of discrete delta hedging (see simulate.hpp).
#include "simulate.hpp"

#include "closed_form.hpp"
#include "lattice.hpp"
#include "replication.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace hedgeleaf {

// ---- random numbers ------------------------------------------------------

namespace {
std::uint64_t splitmix64(std::uint64_t& x) {
    std::uint64_t z = (x += 0x9e3779b97f4a7c15ULL);
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    return z ^ (z >> 31);
}
std::uint64_t rotl(std::uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }
}  // namespace

random_stream::random_stream(std::uint64_t seed) {
    for (auto& s : s_) s = splitmix64(seed);
}

std::uint64_t random_stream::next() {
    const std::uint64_t result = rotl(s_[1] * 5, 7) * 9;
    const std::uint64_t t = s_[1] << 17;
    s_[2] ^= s_[0];
    s_[3] ^= s_[1];
    s_[1] ^= s_[2];
    s_[0] ^= s_[3];
    s_[2] ^= t;
    s_[3] = rotl(s_[3], 45);
    return result;
}

double random_stream::normal() { return normal_quantile(uniform()); }

double normal_quantile(double p) {
    // Wichura, "Algorithm AS 241: The percentage points of the normal distribution",
    // Applied Statistics 37 (1988), PPND16 coefficients.
    const double q = p - 0.5;
    if (std::fabs(q) <= 0.425) {
        const double r = 0.180625 - q * q;
        return q *
               (((((((r * 2509.0809287301226727 + 33430.575583588128105) * r + 67265.770927008700853) * r +
                    45921.953931549871457) * r + 13731.693765509461125) * r + 1971.5909503065514427) * r +
                 133.14166789178437745) * r + 3.387132872796366608) /
               (((((((r * 5226.495278852545925 + 28729.085735721942674) * r + 39307.89580009271061) * r +
                    21213.794301586595867) * r + 5394.1960214247511077) * r + 687.1870074920579083) * r +
                 42.313330701600911252) * r + 1.0);
    }
    double r = q < 0 ? p : 1 - p;
    r = std::sqrt(-std::log(r));
    double value;
    if (r <= 5) {
        r -= 1.6;
        value = (((((((r * 7.7454501427834140764e-4 + 0.0227238449892691845833) * r + 0.24178072517745061177) * r +
                     1.27045825245236838258) * r + 3.64784832476320460504) * r + 5.7694972214606914055) * r +
                  4.6303378461565452959) * r + 1.42343711074968357734) /
                (((((((r * 1.05075007164441684324e-9 + 5.475938084995344946e-4) * r + 0.0151986665636164571966) * r +
                     0.14810397642748007459) * r + 0.68976733498510000455) * r + 1.6763848301838038494) * r +
                  2.05319162663775882187) * r + 1.0);
    } else {
        r -= 5;
        value = (((((((r * 2.01033439929228813265e-7 + 2.71155556874348757815e-5) * r + 0.0012426609473880784386) * r +
                     0.026532189526576123093) * r + 0.29656057182850489123) * r + 1.7848265399172913358) * r +
                  5.4637849111641143699) * r + 6.6579046435011037772) /
                (((((((r * 2.04426310338993978564e-15 + 1.4215117583164458887e-7) * r + 1.8463183175100546818e-5) * r +
                     7.868691311456132591e-4) * r + 0.0148753612908506148525) * r + 0.13692988092273580531) * r +
                  0.59983220655588793769) * r + 1.0);
    }
    return q < 0 ? -value : value;
}

double derman_kamal_sd(double vega, double sigma, int n) {
    return std::sqrt(M_PI / 4.0) * std::fabs(vega) * sigma / std::sqrt(static_cast<double>(n));
}

// ---- settings ------------------------------------------------------------

simulate_settings read_simulate_settings(const trade& t) {
    simulate_settings s;
    s.drift = t.market.rate;
    s.volatility = t.market.volatility;
    const auto every = [](int n, rebalance_unit u) {
        rebalance_spec r;
        r.every = n;
        r.unit = u;
        return r;
    };
    s.frequencies = {every(1, rebalance_unit::days), every(1, rebalance_unit::weeks), every(1, rebalance_unit::months)};
    if (!t.source.is_object() || !t.source.contains("simulate") || t.source["simulate"].is_null()) return s;
    field_reader r(t.source["simulate"], "simulate");
    s.paths = r.integer_or("paths", s.paths, 1, max_paths);
    s.seed = static_cast<std::uint64_t>(r.integer_or("seed", 1, 0, 9007199254740991L));
    s.drift = r.number_or("drift", s.drift);
    require_at_least(s.drift, -1.0, r.child("drift"));
    require_at_most(s.drift, 1.0, r.child("drift"));
    s.volatility = r.number_or("volatility", s.volatility);
    require_non_negative(s.volatility, r.child("volatility"));
    require_at_most(s.volatility, max_volatility, r.child("volatility"));
    s.cost_bp = r.number_or("cost_bp", 0.0);
    require_non_negative(s.cost_bp, r.child("cost_bp"));
    require_at_most(s.cost_bp, max_cost_bp, r.child("cost_bp"));
    s.bins = static_cast<int>(r.integer_or("bins", s.bins, 5, 200));
    if (const json* list = r.raw_optional("frequencies")) {
        const std::string path = r.child("frequencies");
        if (!list->is_array() || list->empty() || list->size() > 6)
            fail(path, "must be a list of 1 to 6 {every, unit} objects, got " + describe(*list));
        s.frequencies.clear();
        for (std::size_t i = 0; i < list->size(); ++i)
            s.frequencies.push_back(read_rebalance((*list)[i], index_path(path, i), t));
    }
    s.lattice_steps = static_cast<int>(r.integer_or("lattice_steps", 0, 20, 1000));
    r.finish();
    return s;
}

// ---- the simulation ------------------------------------------------------

namespace {

constexpr double time_tolerance = 1e-9;

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
};

struct leg_date {
    bool expires = false;      // the leg pays on this date
    bool may_exercise = false;
    euro_delta euro;           // European legs
    double pv = 0;             // PV of dividends in (t, leg expiry]: s_leg = S - pv
    int table = -1;            // index into the leg's table levels (others)
};

struct frequency_plan {
    std::vector<int> grid;          // union-grid index of each date
    std::vector<double> growth;     // e^(r dt) into each date
    std::vector<double> carry;      // e^(r dt) - e^((r-q) dt): carry income per unit of S*
    std::vector<double> dividends;  // cash dividends in the interval, grown to its end
    std::vector<std::vector<leg_date>> legs;  // [date][leg]
    std::vector<std::vector<table_level>> levels;  // [leg][k]: levels used by this frequency
};

double quantile(const std::vector<double>& sorted, double p) {
    const double h = p * static_cast<double>(sorted.size() - 1);
    const std::size_t i = static_cast<std::size_t>(std::floor(h));
    if (i + 1 >= sorted.size()) return sorted.back();
    return sorted[i] + (h - static_cast<double>(i)) * (sorted[i + 1] - sorted[i]);
}

}  // namespace

simulation run_simulation(const trade& t, const simulate_settings& st) {
    simulation out;
    const market_data& m = t.market;
    const double T = t.final_expiry();
    const std::size_t n_legs = t.legs.size();

    // Dates per frequency and their union (paths are drawn once on the union, so
    // every frequency hedges the same paths).
    std::vector<std::vector<schedule_date>> dates;
    std::vector<double> grid;
    double work = 0;
    for (std::size_t f = 0; f < st.frequencies.size(); ++f) {
        dates.push_back(schedule_dates(t, st.frequencies[f], index_path("simulate.frequencies", f)));
        for (const auto& d : dates.back()) grid.push_back(d.time);
        work += static_cast<double>(st.paths) * static_cast<double>(dates.back().size() - 1);
    }
    if (work > max_path_rebalancings)
        fail("simulate.paths", "paths x rebalancings over all frequencies is " + std::to_string(static_cast<long long>(work)) +
                                   ", at most " + std::to_string(static_cast<long long>(max_path_rebalancings)) +
                                   "; use fewer paths or rebalance less often");
    std::sort(grid.begin(), grid.end());
    grid.erase(std::unique(grid.begin(), grid.end(), [](double a, double b) { return std::fabs(a - b) <= time_tolerance; }),
               grid.end());
    const auto grid_index = [&](double x) {
        const auto it = std::lower_bound(grid.begin(), grid.end(), x - time_tolerance);
        return static_cast<int>(it - grid.begin());
    };
    std::vector<double> pv_after(grid.size());
    for (std::size_t g = 0; g < grid.size(); ++g) pv_after[g] = m.dividends.empty() ? 0.0 : m.dividend_pv(grid[g], T);

    // Delta method per leg: closed form if European, a lattice table otherwise.
    bool all_european = true;
    for (const auto& leg : t.legs)
        if (leg.type != payoff_kind::stock && leg.exercise != exercise_style::european) all_european = false;
    out.closed_form_delta = all_european;
    std::size_t most_dates = 0;
    for (const auto& d : dates) most_dates = std::max(most_dates, d.size());
    const int lattice_steps =
        st.lattice_steps > 0 ? st.lattice_steps : std::clamp(static_cast<int>(4 * most_dates), 200, 1000);
    std::optional<trade_lattice> lat;
    if (!all_european) {
        lat.emplace(t, lattice_steps);
        out.lattice_steps = lattice_steps;
    }

    std::vector<frequency_plan> plans(st.frequencies.size());
    for (std::size_t f = 0; f < plans.size(); ++f) {
        frequency_plan& plan = plans[f];
        const auto& ds = dates[f];
        plan.levels.resize(n_legs);
        for (std::size_t k = 0; k < ds.size(); ++k) {
            plan.grid.push_back(grid_index(ds[k].time));
            const double dt = k == 0 ? 0.0 : ds[k].time - ds[k - 1].time;
            plan.growth.push_back(std::exp(m.rate * dt));
            plan.carry.push_back(std::exp(m.rate * dt) - std::exp((m.rate - m.carry_yield) * dt));
            plan.dividends.push_back(k == 0 || m.dividends.empty() ? 0.0
                                                                   : m.dividend_pv(ds[k - 1].time, ds[k].time) * std::exp(m.rate * dt));
            std::vector<leg_date> lds(n_legs);
            for (std::size_t i = 0; i < n_legs; ++i) {
                const option_leg& leg = t.legs[i];
                leg_date& ld = lds[i];
                if (leg.type == payoff_kind::stock) continue;
                const double tau = leg.expiry - ds[k].time;
                ld.expires = tau <= time_tolerance;
                if (ld.expires) continue;
                ld.pv = m.dividends.empty() ? 0.0 : m.dividend_pv(ds[k].time, leg.expiry);
                if (leg.exercise == exercise_style::european) {
                    const double vol_t = m.volatility * std::sqrt(tau);
                    euro_delta& e = ld.euro;
                    e.strike = leg.strike;
                    e.drift_term = (m.rate - m.carry_yield + 0.5 * m.volatility * m.volatility) * tau;
                    e.inv_vol = 1.0 / vol_t;
                    e.df_q = std::exp(-m.carry_yield * tau);
                    e.digital = leg.type == payoff_kind::digital_call || leg.type == payoff_kind::digital_put;
                    e.w = (leg.type == payoff_kind::call || leg.type == payoff_kind::digital_call) ? 1.0 : -1.0;
                    e.scale = leg.payout * std::exp(-m.rate * tau);
                } else {
                    ld.may_exercise = leg.exercise == exercise_style::american ||
                                      std::any_of(leg.exercise_times.begin(), leg.exercise_times.end(),
                                                  [&](double x) { return std::fabs(x - ds[k].time) <= time_tolerance; });
                    ld.table = static_cast<int>(plan.levels[i].size());
                    plan.levels[i].push_back(table_level{});
                    plan.levels[i].back().n = std::min(static_cast<int>(std::lround(ds[k].time / lat->step.dt)),
                                                       lat->last_step[i] - 1);
                }
            }
            plan.legs.push_back(std::move(lds));
        }
    }
    // Fill the lattice levels each frequency needs, one leg table at a time.
    if (lat) {
        for (std::size_t i = 0; i < n_legs; ++i) {
            const option_leg& leg = t.legs[i];
            if (leg.type == payoff_kind::stock || leg.exercise == exercise_style::european) continue;
            const leg_value_table table = leg_values(*lat, i);
            for (auto& plan : plans)
                for (auto& level : plan.levels[i]) {
                    const int n = level.n;
                    level.value = table.value[n];
                    level.delta.resize(static_cast<std::size_t>(n) + 1);
                    for (int j = 0; j <= n; ++j)
                        level.delta[j] = (table.value[n + 1][j + 1] - table.value[n + 1][j]) /
                                         (lat->spot(n + 1, j + 1) - lat->spot(n + 1, j));
                }
        }
    }

    // Premium and first hedge: the same on every path.
    const double s0 = diffusing_spot(m, T);
    double premium = 0;
    for (std::size_t i = 0; i < n_legs; ++i) {
        const option_leg& leg = t.legs[i];
        if (leg.type == payoff_kind::stock) premium += leg.quantity * m.spot;
        else if (leg.exercise == exercise_style::european) premium += leg.quantity * closed_form(m, leg).premium;
        else premium += leg.quantity * plans[0].levels[i][0].value[0];
    }
    out.premium = premium;

    const double log_s0 = std::log(s0);
    const double log_u = lat ? std::log(lat->step.up) : 0.0, log_d = lat ? std::log(lat->step.down) : 0.0;
    // Value and delta of a table leg at diffusing spot s_star, linear in node position.
    const auto from_table = [&](const table_level& level, double log_s_star, bool want_value, double& value) {
        const int n = level.n;
        if (n == 0) {
            value = level.value[0];
            return level.delta[0];
        }
        double x = (log_s_star - log_s0 - n * log_d) / (log_u - log_d);
        x = std::clamp(x, 0.0, static_cast<double>(n));
        const int j = std::min(static_cast<int>(x), n - 1);
        const double w = x - j;
        if (want_value) value = level.value[j] + w * (level.value[j + 1] - level.value[j]);
        return level.delta[j] + w * (level.delta[j + 1] - level.delta[j]);
    };

    const double q_pos = t.signed_quantity();
    const double cost_rate = st.cost_bp * 1e-4;
    const double drift_dt = st.drift - 0.5 * st.volatility * st.volatility;
    std::vector<double> step_drift(grid.size()), step_vol(grid.size());
    for (std::size_t g = 1; g < grid.size(); ++g) {
        const double dt = grid[g] - grid[g - 1];
        step_drift[g] = drift_dt * dt;
        step_vol[g] = st.volatility * std::sqrt(dt);
    }

    out.frequencies.resize(plans.size());
    std::vector<std::vector<double>> desk_pnl(plans.size());
    std::vector<double> cost_sum(plans.size(), 0.0);
    for (std::size_t f = 0; f < plans.size(); ++f) {
        out.frequencies[f].frequency = st.frequencies[f];
        out.frequencies[f].rebalancings = static_cast<int>(dates[f].size()) - 1;
        out.frequencies[f].pnl.resize(static_cast<std::size_t>(st.paths));
        desk_pnl[f].resize(static_cast<std::size_t>(st.paths));
    }

    random_stream rng(st.seed);
    std::vector<double> s_star(grid.size()), log_star(grid.size());
    std::vector<char> alive(n_legs);
    for (long path = 0; path < st.paths; ++path) {
        s_star[0] = s0;
        log_star[0] = log_s0;
        for (std::size_t g = 1; g < grid.size(); ++g) {
            log_star[g] = log_star[g - 1] + step_drift[g] + step_vol[g] * rng.normal();
            s_star[g] = std::exp(log_star[g]);
        }
        for (std::size_t f = 0; f < plans.size(); ++f) {
            const frequency_plan& plan = plans[f];
            std::fill(alive.begin(), alive.end(), 1);
            double shares = 0, cash = premium, costs = 0, cost_paid = 0, pnl_before_costs = 0;
            const std::size_t K = plan.grid.size();
            for (std::size_t k = 0; k < K; ++k) {
                const int g = plan.grid[k];
                const double spot = s_star[g] + pv_after[g];
                if (k > 0) {
                    const int g_prev = plan.grid[k - 1];
                    cash = cash * plan.growth[k] + shares * (plan.carry[k] * s_star[g_prev] + plan.dividends[k]);
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
                            paid += q * (plan.carry[k] * s_star[plan.grid[k - 1]] + plan.dividends[k]);
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
                    const double d = from_table(plan.levels[i][ld.table], log_star[g], ld.may_exercise, value);
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
            out.frequencies[f].pnl[path] = pnl_before_costs - costs;
            desk_pnl[f][path] = q_pos * pnl_before_costs - std::fabs(q_pos) * costs;
            cost_sum[f] += cost_paid;
        }
    }

    // Summaries and a histogram on edges shared by every frequency.
    std::vector<std::vector<double>> sorted(plans.size());
    double lo = INFINITY, hi = -INFINITY;
    for (std::size_t f = 0; f < plans.size(); ++f) {
        pnl_summary& s = out.frequencies[f];
        sorted[f] = s.pnl;
        std::sort(sorted[f].begin(), sorted[f].end());
        const double n = static_cast<double>(st.paths);
        s.mean = std::accumulate(s.pnl.begin(), s.pnl.end(), 0.0) / n;
        double m2 = 0, m4 = 0;
        for (double x : s.pnl) {
            const double d2 = (x - s.mean) * (x - s.mean);
            m2 += d2;
            m4 += d2 * d2;
        }
        s.sd = st.paths > 1 ? std::sqrt(m2 / (n - 1)) : 0.0;
        s.mean_standard_error = s.sd / std::sqrt(n);
        const double var = m2 / n;
        const double kurtosis = var > 0 ? (m4 / n) / (var * var) : 3.0;
        s.sd_standard_error = 0.5 * s.sd * std::sqrt(std::max(0.0, kurtosis - 1) / n);
        s.p01 = quantile(sorted[f], 0.01);
        s.p05 = quantile(sorted[f], 0.05);
        s.p50 = quantile(sorted[f], 0.50);
        s.p95 = quantile(sorted[f], 0.95);
        s.p99 = quantile(sorted[f], 0.99);
        s.min = sorted[f].front();
        s.max = sorted[f].back();
        s.mean_costs = cost_sum[f] / n;
        lo = std::min(lo, quantile(sorted[f], 0.001));
        hi = std::max(hi, quantile(sorted[f], 0.999));
    }
    if (!(hi > lo)) {
        const double pad = 1e-6 * std::max(1.0, std::fabs(lo));
        lo -= pad;
        hi += pad;
    }
    for (int b = 0; b <= st.bins; ++b) out.edges.push_back(lo + (hi - lo) * b / st.bins);
    for (std::size_t f = 0; f < plans.size(); ++f) {
        pnl_summary& s = out.frequencies[f];
        s.counts.assign(static_cast<std::size_t>(st.bins), 0);
        for (double x : s.pnl) {
            if (x < lo) ++s.below;
            else if (x > hi) ++s.above;
            else s.counts[std::min(st.bins - 1, static_cast<int>((x - lo) / (hi - lo) * st.bins))]++;
        }
    }
    for (std::size_t f = 0; f < plans.size(); ++f) {
        pnl_summary& s = out.frequencies[f];
        const double n = static_cast<double>(st.paths);
        s.desk_mean = std::accumulate(desk_pnl[f].begin(), desk_pnl[f].end(), 0.0) / n;
        double m2 = 0;
        for (double x : desk_pnl[f]) m2 += (x - s.desk_mean) * (x - s.desk_mean);
        s.desk_sd = st.paths > 1 ? std::sqrt(m2 / (n - 1)) : 0.0;
    }
    return out;
}

json simulate_result_json(const trade& t, const simulate_settings& st, const simulation& sim) {
    const double q = t.signed_quantity();
    bool single_vanilla = t.legs.size() == 1 && (t.legs[0].type == payoff_kind::call || t.legs[0].type == payoff_kind::put) &&
                          t.legs[0].exercise == exercise_style::european;
    const double vega = single_vanilla ? std::fabs(t.legs[0].quantity) * closed_form(t.market, t.legs[0]).sensitivities.vega : 0.0;
    json rows = json::array();
    json series = json::array();
    for (const auto& s : sim.frequencies) {
        const std::string label = s.frequency.explicit_times ? "listed dates"
                                                             : "every " + std::to_string(s.frequency.every) + " " +
                                                                   (s.frequency.unit == rebalance_unit::days    ? "business days"
                                                                    : s.frequency.unit == rebalance_unit::weeks ? "weeks"
                                                                                                                : "months");
        rows.push_back(json{
            {"frequency", label},
            {"rebalancings", s.rebalancings},
            {"mean", s.mean},
            {"sd", s.sd},
            {"sd_standard_error", s.sd_standard_error},
            {"p01", s.p01},
            {"p05", s.p05},
            {"p50", s.p50},
            {"p95", s.p95},
            {"p99", s.p99},
            {"min", s.min},
            {"max", s.max},
            {"mean_costs", s.mean_costs},
            {"derman_kamal_sd", single_vanilla ? json(derman_kamal_sd(vega, st.volatility, s.rebalancings)) : json(nullptr)},
            {"desk_mean", s.desk_mean},
            {"desk_sd", s.desk_sd},
        });
        series.push_back(json{{"frequency", label}, {"counts", s.counts}, {"below", s.below}, {"above", s.above}});
    }
    std::string delta_method =
        sim.closed_form_delta
            ? "closed-form delta (every leg is European)"
            : "closed-form delta for European legs; for the others, delta and exercise from a " +
                  to_string(t.lattice.method) + " lattice of " + std::to_string(sim.lattice_steps) +
                  " steps, interpolated between its nodes at the nearest step";
    const json columns = {"frequency", "rebalancings", "mean", "sd", "sd_standard_error", "p01", "p05", "p50", "p95", "p99",
                          "min", "max", "mean_costs", "derman_kamal_sd", "desk_mean", "desk_sd"};
    json table_columns = {"frequency", "rebalancings", "mean", "sd", "p01", "p05", "p50", "p95", "p99"};
    if (single_vanilla) table_columns.push_back("derman_kamal_sd");
    if (st.cost_bp > 0) table_columns.push_back("mean_costs");
    table_columns.push_back("desk_mean");
    return json{
        {"rows", rows},
        {"columns", columns},
        {"table_columns", table_columns},
        {"histogram", {{"edges", sim.edges}, {"series", series}}},
        {"premium", sim.premium},
        {"paths", st.paths},
        {"seed", st.seed},
        {"drift", st.drift},
        {"volatility", st.volatility},
        {"pricing_volatility", t.market.volatility},
        {"cost_bp", st.cost_bp},
        {"delta_method", delta_method},
        {"signed_quantity", q},
        {"view",
         "P&L per unit = hedge portfolio - payoff at the end (or the exercise value), for one unit of the trade held "
         "long and replicated from its premium; the desk that sold the client the trade and hedged it keeps this. "
         "desk_mean and desk_sd are per position (signed_quantity; costs count on |quantity|, so with costs the desk "
         "mean of a client sale is not the per-unit mean times the quantity)."},
        {"derman_kamal",
         single_vanilla
             ? json("derman_kamal_sd = sqrt(pi/4) x vega x volatility / sqrt(N), N = hedge intervals: the sd of the hedging "
                    "error of an at-the-money European option (Derman and Kamal (1999), from memory); close to sd when "
                    "realised and pricing volatility agree, the option is near the money and there are no costs")
             : json(nullptr)},
        {"monte_carlo_error", "mean +- 2 x sd / sqrt(paths); sd +- 2 x sd_standard_error (from the sample kurtosis)"},
        {"notes", sim.notes},
        {"caution",
         "Indicative only, not an offer or advice: simulated lognormal paths with constant volatility and rate; "
         "real markets gap and volatility moves. Follow the firm's and the jurisdiction's sales rules."},
    };
}

json simulate_command(const trade& t) {
    const simulate_settings st = read_simulate_settings(t);
    return simulate_result_json(t, st, run_simulation(t, st));
}

}  // namespace hedgeleaf
