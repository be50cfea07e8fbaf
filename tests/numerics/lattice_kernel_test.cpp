// Tests for the backward-induction kernel in core/numerics/lattice_kernel.cpp: the optimised
// sweep (precomputed powers, exercise only where it can pay, vectorised rows)
// must give the same numbers, up to rounding, as the loop written the plain way.
#include "numerics/closed_form.hpp"
#include "numerics/lattice.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <vector>

using namespace hedgeleaf;

namespace {

// The straightforward induction: every node's spot from its own exp, the
// exercise value from exercise_value, Greeks from rows 1 and 2 with the same
// formulas as lattice.hpp documents. Deliberately slow and obvious.
induction_result reference_induce(const market_data& market, const option_leg& leg, lattice_method method, int steps) {
    const double T = leg.expiry_years;
    const time_grid grid = make_time_grid(T, effective_steps(method, steps), leg_events(market, leg));
    const lattice_geometry geo = make_geometry(method, market, leg.strike, grid);
    const int n_steps = geo.steps();
    const double s0 = diffusing_spot(market, T);
    const std::vector<char> allowed = exercise_steps(leg, grid);
    const auto spot = [&](int n, int i) {
        return std::exp(std::log(s0) + geo.offset(n) + i * geo.log_ratio) + market.dividend_pv(geo.time(n), T);
    };
    std::vector<std::vector<double>> rows(static_cast<std::size_t>(n_steps) + 1);
    rows[n_steps].resize(static_cast<std::size_t>(n_steps) + 1);
    for (int i = 0; i <= n_steps; ++i) rows[n_steps][i] = exercise_value(leg, spot(n_steps, i));
    for (int n = n_steps - 1; n >= 0; --n) {
        const lattice_step& st = geo.at(n);
        const double pu = st.discount * st.p_up, pd = st.discount * (1 - st.p_up);
        rows[n].resize(static_cast<std::size_t>(n) + 1);
        for (int i = 0; i <= n; ++i) {
            double value = pu * rows[n + 1][i + 1] + pd * rows[n + 1][i];
            if (leg.exercise != exercise_style::european && allowed[n])
                value = std::max(value, exercise_value(leg, spot(n, i)));
            rows[n][i] = value;
        }
    }
    induction_result out;
    out.value = rows[0][0];
    const double su = s0 * geo.at(0).up, sd = s0 * geo.at(0).down;
    out.delta = (rows[1][1] - rows[1][0]) / (su - sd);
    if (n_steps >= 2) {
        const double suu = su * geo.at(1).up, sud = su * geo.at(1).down, sdd = sd * geo.at(1).down;
        const std::vector<double>& r2 = rows[2];
        out.gamma = ((r2[2] - r2[1]) / (suu - sud) - (r2[1] - r2[0]) / (sud - sdd)) / (0.5 * (suu - sdd));
    }
    return out;
}

market_data market(double spot, double vol, double rate, double carry, bool dividends) {
    market_data m;
    m.spot = spot;
    m.volatility = vol;
    m.rate = curve::flat(rate);
    m.carry_yield = curve::flat(carry);
    if (dividends) m.dividends = {{0.3, 1.5}, {0.8, 2.0}};
    return m;
}

option_leg make_leg(payoff_kind type, exercise_style style, double strike, double expiry) {
    option_leg leg;
    leg.type = type;
    leg.strike = strike;
    leg.expiry_years = expiry;
    leg.exercise = style;
    leg.payout = 10;
    if (style == exercise_style::bermudan) leg.exercise_years = {0.25, 0.5, 0.75};
    return leg;
}

void check_same(const induction_result& fast, const induction_result& slow, double scale) {
    CHECK(fast.value == Approx(slow.value).epsilon(1e-11).margin(1e-12 * scale));
    CHECK(fast.delta == Approx(slow.delta).epsilon(1e-9).margin(1e-10));
    CHECK(fast.gamma == Approx(slow.gamma).epsilon(1e-7).margin(1e-9));
}

}  // namespace

TEST_CASE("the optimised kernel matches the plain induction at several step counts", "[lattice_kernel]") {
    const lattice_method methods[] = {lattice_method::crr, lattice_method::jarrow_rudd, lattice_method::tian,
                                      lattice_method::leisen_reimer};
    const payoff_kind types[] = {payoff_kind::put, payoff_kind::call, payoff_kind::digital_call,
                                 payoff_kind::digital_put};
    const exercise_style styles[] = {exercise_style::european, exercise_style::american, exercise_style::bermudan};
    // Spot 97 against strike 100 keeps the digitals' strike off the nodes, where
    // the half-payout rule would turn a rounding difference into a jump.
    for (const bool dividends : {false, true})
        for (const lattice_method method : methods)
            for (const payoff_kind type : types)
                for (const exercise_style style : styles)
                    for (const int steps : {1, 2, 3, 64, 301}) {
                        const market_data m = market(97, 0.3, 0.05, 0.02, dividends);
                        const option_leg leg = make_leg(type, style, 100, 1.0);
                        INFO("method " << to_string(method) << ", " << to_string(type) << ", " << to_string(style)
                                       << ", steps " << steps << ", dividends " << dividends);
                        check_same(induce(m, leg, method, steps), reference_induce(m, leg, method, steps), 100);
                    }
}

TEST_CASE("the optimised kernel matches the plain induction on larger American lattices", "[lattice_kernel]") {
    // Rate below and above carry (put and call both exercised early), deep and
    // far out of the money, a long expiry with high volatility.
    struct scenario {
        double spot, vol, rate, carry, expiry;
    };
    const scenario cases[] = {{100, 0.2, 0.08, 0.0, 1.0},
                              {70, 0.45, 0.02, 0.09, 2.5},
                              {130, 0.1, 0.1, 0.05, 0.1},
                              {100, 0.9, 0.03, 0.03, 10.0}};
    for (const scenario& s : cases)
        for (const payoff_kind type : {payoff_kind::put, payoff_kind::call})
            for (const int steps : {1000, 2001}) {
                const market_data m = market(s.spot, s.vol, s.rate, s.carry, false);
                const option_leg leg = make_leg(type, exercise_style::american, 100, s.expiry);
                INFO(to_string(type) << " spot " << s.spot << " vol " << s.vol << " expiry " << s.expiry << " steps "
                                     << steps);
                check_same(induce(m, leg, lattice_method::leisen_reimer, steps),
                           reference_induce(m, leg, lattice_method::leisen_reimer, steps), 100);
            }
}

TEST_CASE("extreme lattices stay finite and agree with the closed form", "[lattice_kernel]") {
    // 500 % volatility over 50 years on 5,000 steps puts the outer nodes some
    // e^1700 away from spot; the clamped powers keep every value finite. With
    // no carry yield an American call is worth its European value
    // (Merton 1973, "Theory of rational option pricing", theorem 1).
    const market_data m = market(100, 5.0, 0.05, 0.0, false);
    option_leg call = make_leg(payoff_kind::call, exercise_style::american, 100, 50.0);
    const induction_result r = induce(m, call, lattice_method::crr, 5000);
    REQUIRE(std::isfinite(r.value));
    CHECK(r.value == Approx(closed_form(m, call).premium).epsilon(1e-3));
    option_leg put = make_leg(payoff_kind::put, exercise_style::american, 100, 50.0);
    const induction_result p = induce(m, put, lattice_method::crr, 5000);
    REQUIRE(std::isfinite(p.value));
    CHECK(p.value >= closed_form(m, put).premium);
    CHECK(p.value <= 100.0);
}

TEST_CASE("sweeping only the probable band leaves premium and Greeks unchanged", "[lattice_kernel]") {
    // Hoeffding's inequality bounds what the skipped nodes can carry by 1e-26 of
    // the premium (core/numerics/lattice_kernel.cpp, row_band): far below rounding, so the two
    // extents must agree to the last few bits while the band does far less work.
    struct scenario {
        payoff_kind type;
        exercise_style style;
        double spot, vol, rate, carry, expiry;
    };
    const scenario cases[] = {{payoff_kind::put, exercise_style::american, 100, 0.25, 0.05, 0.01, 1.0},
                              {payoff_kind::call, exercise_style::american, 120, 0.6, 0.02, 0.08, 3.0},
                              {payoff_kind::digital_call, exercise_style::american, 90, 0.3, 0.04, 0.0, 2.0}};
    for (const scenario& s : cases) {
        const market_data m = market(s.spot, s.vol, s.rate, s.carry, true);
        const option_leg leg = make_leg(s.type, s.style, 100, s.expiry);
        const induction_result band = induce(m, leg, lattice_method::leisen_reimer, 20001);
        const induction_result full = induce(m, leg, lattice_method::leisen_reimer, 20001, lattice_extent::full);
        INFO(to_string(s.type) << " " << to_string(s.style));
        CHECK(band.value == Approx(full.value).epsilon(1e-14));
        CHECK(band.delta == Approx(full.delta).epsilon(1e-12));
        CHECK(band.gamma == Approx(full.gamma).epsilon(1e-10));
        CHECK(full.node_updates == Approx(20001.0 * 20002.0 / 2));
        CHECK(band.node_updates < 0.2 * full.node_updates);
    }
}

TEST_CASE("a European leg's binomial sum is the lattice's backward induction", "[lattice_kernel]") {
    // Cox, Ross and Rubinstein (1979), "Option pricing: a simplified approach", Journal of
    // Financial Economics 7: with one up probability p on every step, backward induction of a
    // European payoff is the binomial sum D sum_j C(N, j) p^j (1 - p)^(N - j) V(N, j) (their
    // binomial option pricing formula). The sum must agree with the sweep of every node (and
    // with the plain induction above) to rounding: the sweep multiplies by the rounded pu and pd
    // of each step, whose sum may miss the step's discount by an ulp, and that compounds over
    // N steps (20,000 x 2.2e-16 = 4.4e-12 at the most), which is the tolerance here.
    struct scenario {
        payoff_kind type;
        double spot, vol, rate, carry, expiry;
        int steps;
    };
    const scenario cases[] = {{payoff_kind::put, 100, 0.25, 0.05, 0.01, 1.0, 1601},
                              {payoff_kind::call, 120, 0.6, 0.02, 0.08, 3.0, 20001},
                              {payoff_kind::digital_call, 90, 0.3, 0.04, 0.0, 2.0, 20001},
                              {payoff_kind::digital_put, 100, 0.15, -0.01, 0.02, 0.25, 4001},
                              {payoff_kind::call, 100, 0.05, 0.1, 0.0, 5.0, 301}};
    for (const lattice_method method : {lattice_method::leisen_reimer, lattice_method::crr, lattice_method::tian})
        for (const scenario& s : cases) {
            const market_data m = market(s.spot, s.vol, s.rate, s.carry, false);
            const option_leg leg = make_leg(s.type, exercise_style::european, 100, s.expiry);
            INFO(to_string(method) << " " << to_string(s.type) << " steps " << s.steps);
            REQUIRE(sums_directly(m, leg, method));
            const induction_result sum = induce(m, leg, method, s.steps);
            const induction_result swept = induce(m, leg, method, s.steps, lattice_extent::full);
            CHECK(sum.value == Approx(swept.value).epsilon(5e-12).margin(1e-13 * s.spot));
            CHECK(sum.delta == Approx(swept.delta).epsilon(1e-10).margin(1e-12));
            CHECK(sum.gamma == Approx(swept.gamma).epsilon(1e-8).margin(1e-11));
            CHECK(sum.theta == Approx(swept.theta).epsilon(1e-8).margin(1e-10 * s.spot));
            CHECK(sum.node_updates == summed_work(sum.steps));  // O(steps), not the band's O(steps^1.5)
        }
}

TEST_CASE("under rate curves a European leg sums directly except on Cox-Ross-Rubinstein", "[lattice_kernel]") {
    // Leisen-Reimer and the other methods keep p and move up and down with each step's forward
    // (lattice.cpp, curve_geometry): the sum holds with the discounts multiplied along the steps.
    // Cox-Ross-Rubinstein moves p instead, and Bermudan dates (or an American leg's dividend
    // dates) make steps of different lengths: those are swept (the binomial formula needs one p).
    market_data m = market(100, 0.3, 0.03, 0.01, false);
    m.rate = curve::from_points({0.25, 1.0, 2.0}, {0.02, 0.035, 0.04});
    m.carry_yield = curve::from_points({0.5, 2.0}, {0.01, 0.015});
    const option_leg call = make_leg(payoff_kind::call, exercise_style::european, 105, 1.5);
    CHECK(sums_directly(m, call, lattice_method::leisen_reimer));
    CHECK_FALSE(sums_directly(m, call, lattice_method::crr));
    for (const int steps : {3, 64, 1601}) {
        INFO("steps " << steps);
        const induction_result sum = induce(m, call, lattice_method::leisen_reimer, steps);
        check_same(sum, reference_induce(m, call, lattice_method::leisen_reimer, steps), 100);
        const induction_result swept = induce(m, call, lattice_method::leisen_reimer, steps, lattice_extent::full);
        CHECK(sum.theta == Approx(swept.theta).epsilon(1e-9));
    }
    // A cash dividend moves S* = spot - PV(dividends), not the grid of a European leg: it sums.
    market_data with_dividend = m;
    with_dividend.dividends = {{0.5, 1.0}};
    CHECK(sums_directly(with_dividend, call, lattice_method::leisen_reimer));
    check_same(induce(with_dividend, call, lattice_method::leisen_reimer, 301),
               reference_induce(with_dividend, call, lattice_method::leisen_reimer, 301), 100);
    CHECK_FALSE(sums_directly(m, make_leg(payoff_kind::call, exercise_style::american, 105, 1.5),
                              lattice_method::leisen_reimer));
    CHECK_FALSE(sums_directly(m, make_leg(payoff_kind::call, exercise_style::bermudan, 105, 1.5),
                              lattice_method::leisen_reimer));
}
