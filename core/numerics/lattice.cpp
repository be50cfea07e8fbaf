// Hedgeleaf numerics: the lattice step and the payoffs (see lattice.hpp).
#include "numerics/lattice.hpp"

#include "contract/errors.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

// Peizer-Pratt inversion (method 2) of a normal quantile onto a binomial with n
// steps, as used by Leisen and Reimer (1996), as logarithms of p and of 1 - p.
// Far from the strike (|z| beyond about 6 sqrt(n): deep in or out of the money at
// low volatility) p rounds to 1 or 0 while 1 - p or p is still tiny but exact here,
// so the step stays defined (was "breaks no-arbitrage, down 0, up 0").
struct log_probability {
    double p;      ///< log p
    double not_p;  ///< log (1 - p)
};
log_probability peizer_pratt(double z, int n) {
    const double nn = static_cast<double>(n);
    const double a = z / (nn + 1.0 / 3.0 + 0.1 / (nn + 1.0));
    const double x = a * a * (nn + 1.0 / 6.0);
    const double root = std::sqrt(-std::expm1(-x));                  // sqrt(1 - e^-x)
    const double log_big = std::log1p(root) - std::log(2.0);         // log (1 + root) / 2
    const double log_small = -x - std::log(2.0) - std::log1p(root);  // log (1 - root) / 2
    return z >= 0 ? log_probability{log_big, log_small} : log_probability{log_small, log_big};
}

}  // namespace

bool early_exercise_can_pay(const market_data& m, const option_leg& leg) {
    // Without cash dividends, C >= S e^{-qT} - K e^{-rT} > S - K when q <= 0 <= r, so a call
    // is never exercised early; likewise a put when r <= 0 <= q (Merton, 1973).
    if (!m.dividends.empty()) return true;
    // With term structures the signs must hold at every maturity (every forward rate).
    const double carry_low = m.carry_yield.lowest_forward() + m.borrow.lowest_forward();
    const double carry_high = m.carry_yield.highest_forward() + m.borrow.highest_forward();
    if (leg.type == payoff_kind::call) return !(carry_high <= 0 && m.rate.lowest_forward() >= 0);
    if (leg.type == payoff_kind::put) return !(m.rate.highest_forward() <= 0 && carry_low >= 0);
    return true;
}

int effective_steps(lattice_method method, int steps) {
    if (method == lattice_method::leisen_reimer && steps % 2 == 0) return steps + 1;
    return steps;
}

int default_steps(lattice_method method) { return effective_steps(method, default_lattice_steps); }

double diffusing_spot(const market_data& market, double expiry_years) {
    return market.spot - market.dividend_pv(0, expiry_years);
}

lattice_step make_step(lattice_method method, const market_data& m, double strike, double expiry_years, int steps) {
    lattice_step st;
    const double sigma = m.volatility;
    // Rates averaged over the leg's life (the plain numbers when flat).
    const double r = m.rate.average(0, expiry_years);
    const double b = r - m.carry_average(0, expiry_years);
    st.dt = expiry_years / steps;
    st.growth = std::exp(b * st.dt);
    st.discount = std::exp(-r * st.dt);
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
            const double s = diffusing_spot(m, expiry_years);
            const double vol_t = sigma * std::sqrt(expiry_years);
            const double d1 = (std::log(s / strike) + (b + 0.5 * sigma * sigma) * expiry_years) / vol_t;
            const double d2 = d1 - vol_t;
            // up = growth p'/p and down = (growth - p up) / (1 - p) = growth (1 - p')/(1 - p),
            // taken as ratios of logarithms so neither cancels nor underflows.
            const log_probability p = peizer_pratt(d2, steps);
            const log_probability p_bar = peizer_pratt(d1, steps);
            st.up = st.growth * std::exp(p_bar.p - p.p);
            st.down = st.growth * std::exp(p_bar.not_p - p.not_p);
            break;
        }
    }
    // growth may equal up (or down) when the up (down) probability rounds to 1: the
    // step is then the forward itself, which prices such a far-off strike exactly.
    if (!(st.down > 0 && st.down <= st.growth && st.growth <= st.up && st.down < st.up && std::isfinite(st.up))) {
        fail("market.volatility",
             "the " + to_string(method) + " lattice breaks no-arbitrage (needs 0 < down < growth < up; got down " +
                 format_number(st.down) + ", growth " + format_number(st.growth) + ", up " + format_number(st.up) +
                 ") with market.volatility " + format_number(sigma) + ", market.rate " + format_number(r) +
                 ", market.carry_yield " + format_number(r - b) + " and lattice.steps " + std::to_string(steps) +
                 " over " + format_number(expiry_years) +
                 " years; raise the volatility or lattice.steps, or narrow the rate-carry gap");
    }
    st.p_up = (st.growth - st.down) / (st.up - st.down);
    return st;
}

namespace {

// The piecewise construction of lattice.hpp: fixed spacing L, each step's probability from its
// variance and its down factor from its forward. p_n (1 - p_n) L^2 = sigma^2 dt_n with
// L^2 = 4 sigma^2 max dt gives p_n = (1 +- sqrt(1 - dt_n / max dt)) / 2, free of sigma.
lattice_geometry piecewise_geometry(const market_data& m, const time_grid& grid) {
    lattice_geometry g;
    g.grid = grid;
    g.constant = false;
    const int n_steps = grid.steps;
    double longest = 0;
    for (int n = 0; n < n_steps; ++n) longest = std::max(longest, grid.time(n + 1) - grid.time(n));
    const double L = 2 * m.volatility * std::sqrt(longest);
    const double e_l = std::expm1(L);
    g.log_ratio = L;
    g.per_step.resize(static_cast<std::size_t>(n_steps));
    g.offsets.resize(static_cast<std::size_t>(n_steps) + 1);
    double offset = 0;
    for (int n = 0; n < n_steps; ++n) {
        lattice_step& st = g.per_step[static_cast<std::size_t>(n)];
        st.dt = grid.time(n + 1) - grid.time(n);
        st.growth = m.forward_growth(grid.time(n), grid.time(n + 1));
        st.discount = m.rate.discount(grid.time(n), grid.time(n + 1));
        // Both roots match the step's variance; their third moments have opposite signs.
        // Taking them in turn cancels the skew of the sum pair by pair: with one root only,
        // steps a little shorter than the longest (p well away from 1/2) would leave an
        // error falling only like 1 / sqrt(N).
        const double root = std::sqrt(std::max(0.0, 1 - st.dt / longest));
        st.p_up = 0.5 * (1 + (n % 2 == 0 ? root : -root));
        const double log_down = std::log(st.growth) - std::log1p(st.p_up * e_l);
        st.down = std::exp(log_down);
        st.up = std::exp(log_down + L);
        g.offsets[static_cast<std::size_t>(n)] = offset;
        offset += log_down;
        if (st.dt == longest) g.step = st;
    }
    g.offsets[static_cast<std::size_t>(n_steps)] = offset;
    return g;
}

// Equal steps under rate curves (DESIGN: per-step growth and discount): the method's step
// for the rates averaged over the life sets the spacing; each step then takes its own growth
// g_n and discount. Cox-Ross-Rubinstein keeps up and down and moves p_n = (g_n - d)/(u - d),
// which must stay inside (0, 1) on every step; the others keep p and move up and down with
// g_n, so their ratio (the spacing) stays.
// `built` steps of it are made (all of them unless a binomial sum needs only the first two).
lattice_geometry curve_geometry(lattice_method method, const market_data& m, const lattice_step& base,
                                const time_grid& grid, int built) {
    lattice_geometry g;
    g.grid = grid;
    g.constant = false;
    g.step = base;
    g.log_ratio = std::log(base.up) - std::log(base.down);
    const int n_steps = built;
    g.per_step.resize(static_cast<std::size_t>(n_steps));
    g.offsets.resize(static_cast<std::size_t>(n_steps) + 1);
    double offset = 0;
    // Each row's time is read off the curves once: a step's log growth and log discount are
    // differences of the curves' integrals (curve.hpp), and log d_n = log(d / g) + log g_n.
    const auto carry_integral = [&m](double t) { return m.carry_yield.integral(t) + m.borrow.integral(t); };
    double rate_before = m.rate.integral(grid.time(0)), carry_before = carry_integral(grid.time(0));
    const double log_down_per_growth = std::log(base.down) - std::log(base.growth);
    const double log_crr_down = std::log(base.down);
    for (int n = 0; n < n_steps; ++n) {
        lattice_step& st = g.per_step[static_cast<std::size_t>(n)];
        const double from = grid.time(n), to = grid.time(n + 1);
        const double rate_after = m.rate.integral(to), carry_after = carry_integral(to);
        const double log_growth = (rate_after - rate_before) - (carry_after - carry_before);
        st.dt = base.dt;
        st.growth = std::exp(log_growth);
        st.discount = std::exp(-(rate_after - rate_before));
        rate_before = rate_after;
        carry_before = carry_after;
        if (method == lattice_method::crr) {
            st.up = base.up;
            st.down = base.down;
            st.p_up = (st.growth - st.down) / (st.up - st.down);
            if (!(st.p_up > 0 && st.p_up < 1))
                fail("market.rate", "the crr lattice breaks no-arbitrage from " + format_number(from) + " to " +
                                        format_number(to) + " years: the forward growth " + format_number(st.growth) +
                                        " over the step lies outside down " + format_number(st.down) + " .. up " +
                                        format_number(st.up) + " (market.rate, market.carry_yield, market.borrow " +
                                        "forwards against market.volatility " + format_number(m.volatility) +
                                        "); raise lattice.steps or use lattice.method leisen-reimer");
        } else {
            st.up = base.up * (st.growth / base.growth);
            st.down = base.down * (st.growth / base.growth);
            st.p_up = base.p_up;
        }
        g.offsets[static_cast<std::size_t>(n)] = offset;
        offset += method == lattice_method::crr ? log_crr_down : log_down_per_growth + log_growth;
    }
    g.offsets[static_cast<std::size_t>(n_steps)] = offset;
    return g;
}

}  // namespace

lattice_geometry make_geometry(lattice_method method, const market_data& m, double strike, const time_grid& grid) {
    if (!grid.uniform) return piecewise_geometry(m, grid);
    const lattice_step base = make_step(method, m, strike, grid.expiry, grid.steps);
    if (!m.flat_rates()) return curve_geometry(method, m, base, grid, grid.steps);
    lattice_geometry g;
    g.grid = grid;
    g.step = base;
    g.log_ratio = std::log(g.step.up) - std::log(g.step.down);
    return g;
}

summed_lattice make_summed_lattice(lattice_method method, const market_data& m, double strike, const time_grid& grid) {
    summed_lattice out;
    const int n_steps = grid.steps, top = std::min(2, n_steps);
    const lattice_step base = make_step(method, m, strike, grid.expiry, n_steps);
    if (m.flat_rates()) {
        out.head.grid = grid;
        out.head.step = base;
        out.head.log_ratio = std::log(base.up) - std::log(base.down);
        out.last_offset = n_steps * std::log(base.down);
        out.discount_to_expiry = std::pow(base.discount, n_steps - top);
        return out;
    }
    // Under curves (not Cox-Ross-Rubinstein: sums_directly) log d_n = log(d / g) + log g_n, so the
    // last row's offset is N log(d / g) plus the log growth over the life.
    out.head = curve_geometry(method, m, base, grid, top);
    const auto log_growth = [&m](double t) {
        return m.rate.integral(t) - m.carry_yield.integral(t) - m.borrow.integral(t);
    };
    const double T = grid.time(n_steps);
    out.last_offset =
        n_steps * (std::log(base.down) - std::log(base.growth)) + log_growth(T) - log_growth(grid.time(0));
    out.discount_to_expiry = std::exp(m.rate.integral(grid.time(top)) - m.rate.integral(T));
    return out;
}

bool sums_directly(const market_data& market, const option_leg& leg, lattice_method method) {
    if (leg.exercise != exercise_style::european || leg.type == payoff_kind::stock) return false;
    if (!leg_events(market, leg).empty()) return false;  // steps of different lengths: p moves
    return method != lattice_method::crr || market.flat_rates();
}

std::vector<char> exercise_steps(const option_leg& leg, const time_grid& grid) {
    const int steps = grid.steps;
    std::vector<char> allowed(static_cast<std::size_t>(steps) + 1, 0);
    allowed[static_cast<std::size_t>(steps)] = 1;
    if (leg.exercise == exercise_style::american) {
        std::fill(allowed.begin(), allowed.end(), 1);
    } else if (leg.exercise == exercise_style::bermudan) {
        for (double t : leg.exercise_years)
            allowed[static_cast<std::size_t>(std::clamp(grid.nearest_step(t), 1, steps))] = 1;
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

double exercise_slope(const option_leg& leg, double s) {
    switch (leg.type) {
        case payoff_kind::call: return s > leg.strike ? 1.0 : (s == leg.strike ? 0.5 : 0.0);
        case payoff_kind::put: return s < leg.strike ? -1.0 : (s == leg.strike ? -0.5 : 0.0);
        case payoff_kind::digital_call:
        case payoff_kind::digital_put: return 0.0;
        case payoff_kind::stock: return 1.0;
    }
    return 0;
}

}  // namespace hedgeleaf
