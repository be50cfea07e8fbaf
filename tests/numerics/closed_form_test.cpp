// Tests for numerics/closed_form: generalised Black-Scholes-Merton against published
// worked examples, Boost.Math's normal distribution, parity and finite differences.
#include "numerics/closed_form.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#ifdef HEDGELEAF_HAVE_BOOST_MATH
#include <boost/math/distributions/normal.hpp>
#endif

using namespace hedgeleaf;

namespace {
option_leg european(payoff_kind type, double strike, double expiry, double payout = 1) {
    return single_leg(type, strike, expiry, exercise_style::european, payout);
}
}  // namespace

TEST_CASE("normal distribution agrees with Boost.Math", "[closed_form]") {
#ifdef HEDGELEAF_HAVE_BOOST_MATH
    // Independent reference: Boost.Math boost::math::normal_distribution (cdf, pdf).
    const boost::math::normal_distribution<double> n01;
    for (double x = -8.0; x <= 8.0; x += 0.125) {
        CHECK(normal_cdf(x) == Approx(boost::math::cdf(n01, x)).epsilon(1e-13).margin(1e-300));
        CHECK(normal_pdf(x) == Approx(boost::math::pdf(n01, x)).epsilon(1e-13).margin(1e-300));
    }
#else
    WARN("Boost.Math not found; install libboost-dev for this check");
    CHECK(normal_cdf(0) == 0.5);
#endif
}

TEST_CASE("Black-Scholes worked examples", "[closed_form]") {
    // J. C. Hull, Options, Futures, and Other Derivatives, 8th ed., Example 15.6 (from memory):
    // S=42, K=40, r=10 %, sigma=20 %, T=0.5: call 4.76, put 0.81.
    const auto m = flat_market(42, 0.20, 0.10);
    CHECK(closed_form(m, european(payoff_kind::call, 40, 0.5)).premium == Approx(4.76).margin(0.005));
    CHECK(closed_form(m, european(payoff_kind::put, 40, 0.5)).premium == Approx(0.81).margin(0.005));

    // E. G. Haug, The Complete Guide to Option Pricing Formulas, 2nd ed., section 1.1.1 (from memory):
    // S=60, K=65, T=0.25, r=8 %, b=8 % (no carry yield), sigma=30 %: call 2.1334.
    CHECK(closed_form(flat_market(60, 0.30, 0.08), european(payoff_kind::call, 65, 0.25)).premium ==
          Approx(2.1334).margin(5e-5));

    // Haug, 2nd ed., cash-or-nothing example (from memory): S=100, K=80, cash 10, T=0.75,
    // r=6 %, b=0 (carry yield = rate), sigma=35 %: put 2.6710.
    CHECK(closed_form(flat_market(100, 0.35, 0.06, 0.06), european(payoff_kind::digital_put, 80, 0.75, 10)).premium ==
          Approx(2.6710).margin(5e-5));
}

TEST_CASE("escrowed cash dividends", "[closed_form]") {
    // Hull, 8th ed., European call on a dividend-paying stock (from memory): S=40, K=40,
    // sigma=30 %, r=9 %, T=0.5, dividends 0.50 at 2 and 5 months: call 3.67.
    auto m = flat_market(40, 0.30, 0.09);
    m.dividends = {{2.0 / 12, 0.5}, {5.0 / 12, 0.5}};
    CHECK(closed_form(m, european(payoff_kind::call, 40, 0.5)).premium == Approx(3.67).margin(0.005));
    // A dividend after expiry changes nothing (common practice).
    auto later = flat_market(40, 0.30, 0.09);
    later.dividends = {{0.75, 0.5}};
    CHECK(closed_form(later, european(payoff_kind::call, 40, 0.5)).premium ==
          Approx(closed_form(flat_market(40, 0.30, 0.09), european(payoff_kind::call, 40, 0.5)).premium));
}

TEST_CASE("put-call parity with carry and digitals", "[closed_form]") {
    // Parity: C - P = S e^{-qT} - K e^{-rT}; cash-or-nothing call + put = payout e^{-rT} (common practice).
    for (double carry : {0.0, 0.03, -0.01})
        for (double strike : {70.0, 100.0, 140.0}) {
            const auto m = flat_market(100, 0.25, 0.04, carry);
            const double T = 1.3;
            const double c = closed_form(m, european(payoff_kind::call, strike, T)).premium;
            const double p = closed_form(m, european(payoff_kind::put, strike, T)).premium;
            CHECK(c - p == Approx(100 * std::exp(-carry * T) - strike * std::exp(-0.04 * T)).epsilon(1e-12));
            const double dc = closed_form(m, european(payoff_kind::digital_call, strike, T, 5)).premium;
            const double dp = closed_form(m, european(payoff_kind::digital_put, strike, T, 5)).premium;
            CHECK(dc + dp == Approx(5 * std::exp(-0.04 * T)).epsilon(1e-12));
        }
}

TEST_CASE("analytic Greeks match finite differences of the price", "[closed_form]") {
    // Central differences of the closed-form price itself (common practice).
    for (auto type : {payoff_kind::call, payoff_kind::put, payoff_kind::digital_call, payoff_kind::digital_put})
        for (bool with_dividend : {false, true}) {
            auto m = flat_market(95, 0.28, 0.05, 0.02);
            if (with_dividend) m.dividends = {{0.4, 1.5}};
            const auto leg = european(type, 100, 0.9, 3);
            const greeks g = closed_form(m, leg).sensitivities;
            const auto price = [&](market_data mm, double expiry) {
                auto l = leg;
                l.expiry_years = expiry;
                return closed_form(mm, l).premium;
            };
            const double h = 1e-3;
            auto up = m, dn = m;
            up.spot += h;
            dn.spot -= h;
            CHECK(g.delta == Approx((price(up, 0.9) - price(dn, 0.9)) / (2 * h)).epsilon(1e-6).margin(1e-9));
            CHECK(g.gamma ==
                  Approx((price(up, 0.9) - 2 * price(m, 0.9) + price(dn, 0.9)) / (h * h)).epsilon(1e-4).margin(1e-7));
            up = m, dn = m;
            const double hv = 1e-4;  // digital vega has a large third derivative
            up.volatility += hv;
            dn.volatility -= hv;
            CHECK(g.vega == Approx((price(up, 0.9) - price(dn, 0.9)) / (2 * hv)).epsilon(1e-5).margin(1e-8));
            up = m, dn = m;
            up.rate = m.rate.shifted(h);
            dn.rate = m.rate.shifted(-h);
            CHECK(g.rho == Approx((price(up, 0.9) - price(dn, 0.9)) / (2 * h)).epsilon(1e-5).margin(1e-8));
            // Theta: calendar time passes, so expiry and dividend dates come closer together.
            auto later = m;
            for (auto& d : later.dividends) d.years -= h;
            auto earlier = m;
            for (auto& d : earlier.dividends) d.years += h;
            CHECK(g.theta ==
                  Approx((price(later, 0.9 - h) - price(earlier, 0.9 + h)) / (2 * h)).epsilon(1e-5).margin(1e-8));
        }
}

TEST_CASE("theta under curves is the value's change as calendar time passes", "[closed_form]") {
    // Under deterministic rates a European option is worth the Black-Scholes-Merton value at the
    // rate and carry averaged over its remaining life (a textbook fact: Hull, Options, Futures,
    // and Other Derivatives, from memory). Theta, dV/dt with spot held (docs/replication.md),
    // must then follow the averages as they change with time: the value a day on is the closed
    // form on the market seen from then (market_data::seen_at), its curves fixed in calendar time.
    // A forward difference with one Richardson step (common practice) checks it; the curves'
    // first points lie beyond the few hours the differences step over.
    for (auto type : {payoff_kind::call, payoff_kind::put, payoff_kind::digital_call, payoff_kind::digital_put})
        for (bool with_dividend : {false, true}) {
            auto m = flat_market(100, 0.3, 0.0);
            m.rate = curve::from_points({0.5, 2.0}, {0.02, 0.05});
            m.carry_yield = curve::from_points({0.25, 1.5}, {0.01, 0.03});
            m.borrow = curve::from_points({1.0}, {0.004});
            if (with_dividend) m.dividends = {{0.4, 1.5}};
            const auto leg = european(type, 100, 1.0, 3);
            const double theta = closed_form(m, leg).sensitivities.theta;
            const double now = closed_form(m, leg).premium;
            const auto moved = [&](double h) {  // (V(t + h) - V(t)) / h
                auto l = leg;
                l.expiry_years -= h;
                return (closed_form(m.seen_at(h), l).premium - now) / h;
            };
            const double h = 1e-3;
            CHECK(theta == Approx(2 * moved(h / 2) - moved(h)).epsilon(1e-5).margin(1e-7));
        }
}

TEST_CASE("a stock leg is worth spot with delta one", "[closed_form]") {
    option_leg stock;
    stock.type = payoff_kind::stock;
    const auto v = closed_form(flat_market(48.2, 0.3, 0.03), stock);
    CHECK(v.premium == 48.2);
    CHECK(v.sensitivities.delta == 1);
}
