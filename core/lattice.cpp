// Hedgeleaf core: binomial lattices (see lattice.hpp).
#include "lattice.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

// Peizer-Pratt inversion (method 2) of a normal quantile onto a binomial with n
// steps, as used by Leisen and Reimer (1996).
double peizer_pratt(double z, int n) {
    const double nn = static_cast<double>(n);
    const double a = z / (nn + 1.0 / 3.0 + 0.1 / (nn + 1.0));
    const double root = std::sqrt(1.0 - std::exp(-a * a * (nn + 1.0 / 6.0)));
    return 0.5 + std::copysign(0.5, z) * root;
}

bool is_vanilla(payoff_kind k) { return k == payoff_kind::call || k == payoff_kind::put; }

// Log-spot beyond which lattice nodes are clamped: far past any probability mass
// the price can feel, and well inside double range.
constexpr double log_clamp = 600.0;

// Full spots of row n: S*_0 u^i d^(n-i) + pv for i = 0..n, computed in log space
// every 64 nodes and by running product in between (bounded rounding drift).
void row_spots(double log_s0, double log_u, double log_d, int n, double pv, double* out) {
    const double log_start = log_s0 + n * log_d;
    const double log_ratio = log_u - log_d;
    for (int i = 0; i <= n;) {
        const double log_s = std::clamp(log_start + i * log_ratio, -log_clamp, log_clamp);
        double s = std::exp(log_s);
        const double ratio = std::exp(log_ratio);
        const int end = std::min(n, i + 63);
        for (; i <= end; ++i) {
            out[i] = s + pv;
            s = std::min(s * ratio, 1e260);
        }
    }
}

struct richardson {
    double weight_fine;  // extrapolated = w * fine + (1 - w) * coarse
};

richardson weights(int fine, int coarse, int order) {
    const double a = std::pow(static_cast<double>(fine), order);
    const double b = std::pow(static_cast<double>(coarse), order);
    return {a / (a - b)};
}

}  // namespace

int effective_steps(lattice_method method, int steps) {
    if (method == lattice_method::leisen_reimer && steps % 2 == 0) return steps + 1;
    return steps;
}

int default_steps(lattice_method method) { return effective_steps(method, default_lattice_steps); }

double diffusing_spot(const market_data& market, double expiry) {
    return market.spot - market.dividend_pv(0, expiry);
}

lattice_step make_step(lattice_method method, const market_data& m, double strike, double expiry, int steps) {
    lattice_step st;
    const double sigma = m.volatility;
    const double b = m.rate - m.carry_yield;
    st.dt = expiry / steps;
    st.growth = std::exp(b * st.dt);
    st.discount = std::exp(-m.rate * st.dt);
    const double sq = sigma * std::sqrt(st.dt);
    switch (method) {
        case lattice_method::crr:
            st.up = std::exp(sq);
            st.down = 1.0 / st.up;
            break;
        case lattice_method::jarrow_rudd: {
            const double drift = (b - 0.5 * sigma * sigma) * st.dt;
            st.up = std::exp(drift + sq);
            st.down = std::exp(drift - sq);
            break;
        }
        case lattice_method::tian: {
            const double v = std::exp(sigma * sigma * st.dt);
            const double root = std::sqrt(std::max(0.0, v * v + 2 * v - 3));
            st.up = 0.5 * st.growth * v * (v + 1 + root);
            st.down = 0.5 * st.growth * v * (v + 1 - root);
            break;
        }
        case lattice_method::leisen_reimer: {
            const double s = diffusing_spot(m, expiry);
            const double vol_t = sigma * std::sqrt(expiry);
            const double d1 = (std::log(s / strike) + (b + 0.5 * sigma * sigma) * expiry) / vol_t;
            const double d2 = d1 - vol_t;
            const double p = peizer_pratt(d2, steps);
            const double p_bar = peizer_pratt(d1, steps);
            if (p > 0 && p < 1) {
                st.up = st.growth * p_bar / p;
                st.down = (st.growth - p * st.up) / (1 - p);
            }
            break;
        }
    }
    if (!(st.down > 0 && st.down < st.growth && st.growth < st.up && std::isfinite(st.up))) {
        fail("market.volatility",
             "the " + to_string(method) + " lattice breaks no-arbitrage (needs 0 < down < growth < up; got down " +
                 format_number(st.down) + ", growth " + format_number(st.growth) + ", up " + format_number(st.up) +
                 ") with market.volatility " + format_number(sigma) + ", market.rate " + format_number(m.rate) +
                 ", market.carry_yield " + format_number(m.carry_yield) + " and lattice.steps " + std::to_string(steps) +
                 " over " + format_number(expiry) + " years; raise the volatility or lattice.steps, or narrow the rate-carry gap");
    }
    st.p_up = (st.growth - st.down) / (st.up - st.down);
    return st;
}

std::vector<char> exercise_steps(const option_leg& leg, int steps, double dt) {
    std::vector<char> allowed(static_cast<std::size_t>(steps) + 1, 0);
    allowed[static_cast<std::size_t>(steps)] = 1;
    if (leg.exercise == exercise_style::american) {
        std::fill(allowed.begin(), allowed.end(), 1);
    } else if (leg.exercise == exercise_style::bermudan) {
        for (double t : leg.exercise_times) {
            const long n = std::lround(t / dt);
            allowed[static_cast<std::size_t>(std::clamp<long>(n, 1, steps))] = 1;
        }
    }
    return allowed;
}

double exercise_value(const option_leg& leg, double s) {
    switch (leg.type) {
        case payoff_kind::call: return std::max(s - leg.strike, 0.0);
        case payoff_kind::put: return std::max(leg.strike - s, 0.0);
        case payoff_kind::digital_call: return s > leg.strike ? leg.payout : (s == leg.strike ? 0.5 * leg.payout : 0.0);
        case payoff_kind::digital_put: return s < leg.strike ? leg.payout : (s == leg.strike ? 0.5 * leg.payout : 0.0);
        case payoff_kind::stock: return s;
    }
    return 0;
}

induction_result induce(const market_data& market, const option_leg& leg, lattice_method method, int steps) {
    const int n_steps = effective_steps(method, steps);
    const double T = leg.expiry;
    const lattice_step st = make_step(method, market, leg.strike, T, n_steps);
    const double s0 = diffusing_spot(market, T);
    const double log_s0 = std::log(s0), log_u = std::log(st.up), log_d = std::log(st.down);
    const std::vector<char> allowed = exercise_steps(leg, n_steps, st.dt);
    const bool has_dividends = !market.dividends.empty();
    const bool early = leg.exercise != exercise_style::european;

    std::vector<double> v(static_cast<std::size_t>(n_steps) + 1);
    std::vector<double> spots(static_cast<std::size_t>(n_steps) + 1);
    row_spots(log_s0, log_u, log_d, n_steps, 0.0, spots.data());
    for (int i = 0; i <= n_steps; ++i) v[i] = exercise_value(leg, spots[i]);

    const double pu = st.discount * st.p_up;
    const double pd = st.discount * (1 - st.p_up);
    double row1[2] = {0, 0}, row2[3] = {0, 0, 0};
    if (n_steps == 1) { row1[0] = v[0]; row1[1] = v[1]; }
    if (n_steps == 2) { row2[0] = v[0]; row2[1] = v[1]; row2[2] = v[2]; }
    for (int n = n_steps - 1; n >= 0; --n) {
        double* row = v.data();
        for (int i = 0; i <= n; ++i) row[i] = pu * row[i + 1] + pd * row[i];
        if (early && allowed[static_cast<std::size_t>(n)]) {
            const double pv = has_dividends ? market.dividend_pv(n * st.dt, T) : 0.0;
            row_spots(log_s0, log_u, log_d, n, pv, spots.data());
            for (int i = 0; i <= n; ++i) row[i] = std::max(row[i], exercise_value(leg, spots[i]));
        }
        if (n == 2) { row2[0] = row[0]; row2[1] = row[1]; row2[2] = row[2]; }
        if (n == 1) { row1[0] = row[0]; row1[1] = row[1]; }
    }

    induction_result out;
    out.value = v[0];
    const double su = s0 * st.up, sd = s0 * st.down;
    out.delta = (row1[1] - row1[0]) / (su - sd);
    double v_at_s0_later;  // value at today's S* one or two steps later
    double later;
    if (n_steps >= 2) {
        const double suu = su * st.up, sud = su * st.down, sdd = sd * st.down;
        const double delta_up = (row2[2] - row2[1]) / (suu - sud);
        const double delta_down = (row2[1] - row2[0]) / (sud - sdd);
        out.gamma = (delta_up - delta_down) / (0.5 * (suu - sdd));
        // Quadratic through the three step-2 nodes, read at S*_0.
        const double x = s0;
        v_at_s0_later = row2[0] * (x - sud) * (x - suu) / ((sdd - sud) * (sdd - suu)) +
                        row2[1] * (x - sdd) * (x - suu) / ((sud - sdd) * (sud - suu)) +
                        row2[2] * (x - sdd) * (x - sud) / ((suu - sdd) * (suu - sud));
        later = 2 * st.dt;
    } else {
        v_at_s0_later = row1[0] + out.delta * (s0 - sd);
        later = st.dt;
    }
    // Tree theta holds S* fixed; with dividends S* = spot - PV drifts as time passes.
    out.theta = (v_at_s0_later - out.value) / later - out.delta * market.rate * market.dividend_pv(0, T);
    return out;
}

lattice_price price_lattice_only(const market_data& market, const option_leg& leg, const lattice_settings& settings) {
    lattice_price out;
    if (leg.type == payoff_kind::stock) {
        out.premium = market.spot;
        out.sensitivities.delta = 1;
        return out;
    }
    const lattice_method method = settings.method;
    const int fine = effective_steps(method, settings.steps > 0 ? settings.steps : default_steps(method));
    int coarse = effective_steps(method, std::max(1, fine / 2));
    if (method == lattice_method::leisen_reimer && coarse >= fine) coarse = fine + 2;  // fine == 1
    if (coarse >= fine && method != lattice_method::leisen_reimer) coarse = fine + 1;
    const bool can_extrapolate = coarse < fine;

    const induction_result f = induce(market, leg, method, fine);
    const induction_result c = induce(market, leg, method, coarse);
    // Leisen-Reimer converges at second order for European vanillas; early
    // exercise and digitals bring first-order terms.
    const int order = (method == lattice_method::leisen_reimer && leg.exercise == exercise_style::european &&
                       is_vanilla(leg.type)) ? 2 : 1;
    out.steps = fine;
    out.coarse_steps = coarse;
    if (settings.extrapolate && can_extrapolate) {
        const double w = weights(fine, coarse, order).weight_fine;
        const auto mix = [w](double a, double b) { return w * a + (1 - w) * b; };
        out.premium = mix(f.value, c.value);
        out.sensitivities.delta = mix(f.delta, c.delta);
        out.sensitivities.gamma = mix(f.gamma, c.gamma);
        out.sensitivities.theta = mix(f.theta, c.theta);
        out.error_estimate = std::fabs(out.premium - f.value);
        out.extrapolated = true;
    } else {
        out.premium = f.value;
        out.sensitivities.delta = f.delta;
        out.sensitivities.gamma = f.gamma;
        out.sensitivities.theta = f.theta;
        if (can_extrapolate) {
            const double w = weights(fine, coarse, order).weight_fine;
            out.error_estimate = std::fabs((w - 1) * (f.value - c.value));
        } else {
            out.error_estimate = std::fabs(f.value - c.value);
        }
    }
    return out;
}

lattice_price price_on_lattice(const market_data& market, const option_leg& leg, const lattice_settings& settings) {
    lattice_price out = price_lattice_only(market, leg, settings);
    if (leg.type == payoff_kind::stock) return out;
    const auto premium_with = [&](double vol, double rate) {
        market_data m = market;
        m.volatility = vol;
        m.rate = rate;
        return price_lattice_only(m, leg, settings).premium;
    };
    const double hv = std::min(vega_bump, 0.5 * market.volatility);
    out.sensitivities.vega =
        (premium_with(market.volatility + hv, market.rate) - premium_with(market.volatility - hv, market.rate)) / (2 * hv);
    out.sensitivities.rho =
        (premium_with(market.volatility, market.rate + rho_bump) - premium_with(market.volatility, market.rate - rho_bump)) /
        (2 * rho_bump);
    return out;
}

}  // namespace hedgeleaf
