// Tests for numerics/lattice and lattice_price: every method against the closed form, published binomial
// examples, early-exercise facts, convergence orders and the no-arbitrage check.
#include "numerics/lattice_price.hpp"
#include "contract/errors.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/lattice.hpp"

#include "../../bench/reference_lattice.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {
lattice_settings plain(lattice_method m, int steps) { return {m, steps, false}; }
const lattice_method all_methods[] = {lattice_method::crr, lattice_method::jarrow_rudd, lattice_method::tian,
                                      lattice_method::leisen_reimer};
}  // namespace

TEST_CASE("every lattice converges to the closed form for European options", "[lattice]") {
    // Binomial prices converge to Black-Scholes as steps grow (Cox, Ross and Rubinstein, 1979).
    const auto m = flat_market(100, 0.25, 0.05, 0.02);
    for (auto method : all_methods)
        for (auto type : {payoff_kind::call, payoff_kind::put})
            for (double strike : {85.0, 100.0, 120.0}) {
                const auto leg = single_leg(type, strike, 1.0);
                const double exact = closed_form(m, leg).premium;
                const double lat = price_leg(m, leg, plain(method, 2001)).premium;
                INFO("method " << to_string(method) << " strike " << strike);
                CHECK(lat == Approx(exact).margin(0.01));
            }
}

TEST_CASE("Leisen-Reimer converges at second order for European options", "[lattice]") {
    // Leisen and Reimer (1996), Applied Mathematical Finance 3: O(1/N^2) for odd N.
    const auto m = flat_market(100, 0.30, 0.05, 0.0);
    const auto leg = single_leg(payoff_kind::call, 110, 1.0);
    const double exact = closed_form(m, leg).premium;
    const double e1 = std::fabs(price_leg(m, leg, plain(lattice_method::leisen_reimer, 51)).premium - exact);
    const double e2 = std::fabs(price_leg(m, leg, plain(lattice_method::leisen_reimer, 153)).premium - exact);
    // Tripling N divides a second-order error by about 9 (first order would give 3).
    CHECK(e1 / e2 > 7.0);
    CHECK(e2 < 1e-4);
    // With the default extrapolation the European error is tiny.
    CHECK(price_leg(m, leg, {lattice_method::leisen_reimer, 0, true}).premium == Approx(exact).margin(1e-7));
}

TEST_CASE("published binomial tree for an American put", "[lattice]") {
    // Hull, Options, Futures, and Other Derivatives, 8th ed., Figure 20.3 (from memory):
    // S=50, K=50, r=10 %, sigma=40 %, T=5 months, 5-step CRR tree: American put 4.49;
    // the text gives 4.263, 4.272 and 4.278 with 30, 50 and 100 steps.
    const auto m = flat_market(50, 0.40, 0.10);
    const auto put = single_leg(payoff_kind::put, 50, 5.0 / 12, exercise_style::american);
    CHECK(price_leg(m, put, plain(lattice_method::crr, 5)).premium == Approx(4.49).margin(0.005));
    CHECK(price_leg(m, put, plain(lattice_method::crr, 30)).premium == Approx(4.263).margin(0.0005));
    CHECK(price_leg(m, put, plain(lattice_method::crr, 50)).premium == Approx(4.272).margin(0.0005));
    CHECK(price_leg(m, put, plain(lattice_method::crr, 100)).premium == Approx(4.278).margin(0.0005));
}

TEST_CASE("default settings price an American option within 1e-4 relative", "[lattice]") {
    // Converged value from an independent lattice: Broadie and Detemple (1996), "American option
    // valuation: new bounds, approximations and a comparison of existing methods", Review of
    // Financial Studies 9: BBSR, a CRR lattice with the Black-Scholes value over its last step and
    // Richardson 2 V(2N) - V(N), written out in bench/reference_lattice.hpp; its levels 2,000 and
    // 4,000 agree to better than 5e-6 relative.
    const auto m = flat_market(100, 0.30, 0.05, 0.02);
    for (double strike : {90.0, 125.0}) {
        const auto put = single_leg(payoff_kind::put, strike, 1.5, exercise_style::american);
        const double converged = bench::bbsr_price(m, put, 4000);
        const double coarser = bench::bbsr_price(m, put, 2000);
        REQUIRE(std::fabs(converged - coarser) / converged < 5e-6);
        const lattice_price p = price_leg(m, put, lattice_settings{}, bumped_greeks::off, error_bound::on);
        CHECK(std::fabs(p.premium - converged) / converged < 1e-4);
        // The error bound covers the error (bench/coverage_bench measures how often it does).
        CHECK(std::fabs(p.premium - converged) <= p.error_estimate);
        CHECK(p.extrapolated);
    }
}

TEST_CASE("early exercise facts", "[lattice]") {
    const lattice_settings s{lattice_method::leisen_reimer, 401, true};
    // An American call on a stock paying nothing is never exercised early: equals the European
    // (Merton, 1973; Hull 8th ed. section 11.5, from memory).
    const auto m = flat_market(100, 0.3, 0.06);
    const auto eu = single_leg(payoff_kind::call, 95, 1.0);
    auto am = eu;
    am.exercise = exercise_style::american;
    CHECK(price_leg(m, am, s).premium == Approx(price_leg(m, eu, s).premium).epsilon(1e-10));
    // American >= Bermudan >= European, for a put (common practice).
    const auto put_eu = single_leg(payoff_kind::put, 110, 1.0);
    auto put_am = put_eu;
    put_am.exercise = exercise_style::american;
    auto put_berm = put_eu;
    put_berm.exercise = exercise_style::bermudan;
    put_berm.exercise_years = {0.25, 0.5, 0.75};
    const double v_eu = price_leg(m, put_eu, s).premium;
    const double v_berm = price_leg(m, put_berm, s).premium;
    const double v_am = price_leg(m, put_am, s).premium;
    CHECK(v_am > v_berm);
    CHECK(v_berm > v_eu);
    CHECK(v_am >= 110 - 100);  // never below intrinsic
    // With a large cash dividend an American call is worth more than the European.
    auto div = m;
    div.dividends = {{0.5, 6.0}};
    CHECK(price_leg(div, am, s).premium > price_leg(div, eu, s).premium + 0.05);
}

TEST_CASE("lattice Greeks agree with the closed form for European options", "[lattice]") {
    // Delta, gamma and theta read off the tree; vega and rho by central differences (common practice).
    auto m = flat_market(100, 0.25, 0.04, 0.01);
    for (bool dividend : {false, true}) {
        if (dividend) m.dividends = {{0.3, 2.0}};
        for (auto type : {payoff_kind::call, payoff_kind::put}) {
            const auto leg = single_leg(type, 105, 0.75);
            const greeks exact = closed_form(m, leg).sensitivities;
            const greeks lat = price_leg(m, leg, lattice_settings{}, bumped_greeks::on).sensitivities;
            CHECK(lat.delta == Approx(exact.delta).margin(2e-4));
            CHECK(lat.gamma == Approx(exact.gamma).margin(2e-5));
            CHECK(lat.theta == Approx(exact.theta).margin(2e-3));
            CHECK(lat.vega == Approx(exact.vega).margin(2e-3));
            CHECK(lat.rho == Approx(exact.rho).margin(2e-3));
        }
    }
}

TEST_CASE("digital options on the lattice approach the closed form", "[lattice]") {
    const auto m = flat_market(100, 0.2, 0.03);
    option_leg digital = single_leg(payoff_kind::digital_call, 100, 1.0);
    digital.payout = 10;
    const double exact = closed_form(m, digital).premium;
    CHECK(price_leg(m, digital, lattice_settings{}).premium == Approx(exact).margin(2e-3));
}

TEST_CASE("the no-arbitrage condition is checked and named", "[lattice]") {
    // CRR needs |r - q| sqrt(dt) < sigma; a 1 % vol with a 50 % rate gap over one step breaks it.
    const auto m = flat_market(100, 0.01, 0.5);
    const auto leg = single_leg(payoff_kind::call, 100, 1.0);
    try {
        (void)price_leg(m, leg, plain(lattice_method::crr, 1));
        FAIL("no error");
    } catch (const input_error& e) {
        CHECK(e.field() == "market.volatility");
        const std::string msg = e.what();
        CHECK(msg.find("0 < down < growth < up") != std::string::npos);
        CHECK(msg.find("market.rate 0.5") != std::string::npos);
        CHECK(msg.find("lattice.steps 1") != std::string::npos);
    }
    // Every method's step satisfies it in a normal market, with p from the growth factor.
    for (auto method : all_methods) {
        const lattice_step st = make_step(method, flat_market(100, 0.3, 0.05, 0.01), 100, 1.0, 50);
        CHECK(st.down < st.growth);
        CHECK(st.growth < st.up);
        CHECK(st.p_up == Approx((st.growth - st.down) / (st.up - st.down)));
    }
}

TEST_CASE("memory stays linear at the largest step count", "[lattice]") {
    // 50,000 steps with O(N) memory: a quadratic tree would need 10 GB and fail.
    const auto m = flat_market(100, 0.3, 0.05);
    const auto put = single_leg(payoff_kind::put, 100, 1.0, exercise_style::american);
    const auto p = price_leg(m, put, {lattice_method::crr, 50000, false});
    CHECK(std::isfinite(p.premium));
    CHECK(p.premium > closed_form(m, put).premium);
}

TEST_CASE("a Bermudan with a date on nearly every step still gets an error estimate that covers it", "[lattice]") {
    // 99 exercise dates (one every 0.01 years) on a 100-step lattice: the half- and quarter-size
    // lattices the estimate compares with cannot hold the dates and came back as large as the
    // fine one, and the estimate was 0/0 (null in the result). The error against the same
    // lattice at 40 times the steps (common practice) must stay within the estimate.
    const auto m = flat_market(100, 0.25, 0.04);
    auto put = single_leg(payoff_kind::put, 105, 1.0);
    put.exercise = exercise_style::bermudan;
    for (int i = 1; i <= 99; ++i) put.exercise_years.push_back(i / 100.0);
    for (auto method : {lattice_method::crr, lattice_method::leisen_reimer}) {
        const lattice_price p = price_leg(m, put, plain(method, 100), bumped_greeks::off, error_bound::on);
        const double reference = price_leg(m, put, plain(lattice_method::leisen_reimer, 4001)).premium;
        INFO(to_string(method));
        REQUIRE(std::isfinite(p.error_estimate));
        CHECK(p.error_estimate > 0);
        CHECK(std::fabs(p.premium - reference) <= p.error_estimate);
    }
}

TEST_CASE("a digital's bumped Greeks off the default lattice come with a warning", "[lattice]") {
    // Digital call 120 on 100, one year, 30 %, 3 %: on a 1,601-step Cox-Ross-Rubinstein lattice the
    // vega bump moves nodes across the strike and the difference has the wrong sign (the closed
    // form's vega is +0.372; the case an outside audit found). The price says so; Leisen-Reimer,
    // which centres the strike, gives the closed form's sign and no such note.
    const auto m = flat_market(100, 0.3, 0.03);
    const auto leg = single_leg(payoff_kind::digital_call, 120, 1.0);
    const double vega = closed_form(m, leg).sensitivities.vega;
    const auto warned = [](const lattice_price& p) {
        for (const auto& note : p.notes)
            if (note.find("wrong sign") != std::string::npos) return true;
        return false;
    };
    const lattice_price crr = price_leg(m, leg, plain(lattice_method::crr, 1601), bumped_greeks::on);
    CHECK(warned(crr));
    const lattice_price lr = price_leg(m, leg, plain(lattice_method::leisen_reimer, 1601), bumped_greeks::on);
    CHECK_FALSE(warned(lr));
    CHECK(lr.sensitivities.vega == Approx(vega).epsilon(0.01));
}

TEST_CASE("Greeks from one or two steps come with a warning naming lattice.steps", "[lattice]") {
    // Decision: priced, not refused (a one-step tree is a teaching case), but said to be rough.
    const auto m = flat_market(100, 0.2, 0.03);
    const auto leg = single_leg(payoff_kind::call, 100, 1.0);
    for (int steps : {1, 2, 3}) {
        const lattice_price p = price_leg(m, leg, plain(lattice_method::crr, steps));
        bool warned = false;
        for (const auto& note : p.notes) warned = warned || note.find("lattice.steps") != std::string::npos;
        INFO(steps << " steps");
        CHECK(warned == (steps < 3));
    }
}

TEST_CASE("a digital's vega at low volatility agrees with the closed form", "[lattice]") {
    // Cash-or-nothing call vega -e^-rT n(d2) d1 / sigma (Haug, The Complete Guide to Option Pricing
    // Formulas, 2nd ed., cash-or-nothing; differentiated by hand), evaluated with scipy.stats.norm:
    // S 100, K 101, r 3 %, T 0.25. The bump scales with the volatility (at most 2 % of it): a fixed
    // 0.005 bump would straddle the digital's whole value at 2 % volatility.
    const auto leg = single_leg(payoff_kind::digital_call, 101, 0.25);
    const struct { double volatility, vega; } cases[] = {{0.02, 4.60594421842513}, {0.05, 0.6730760346652644}};
    for (const auto& c : cases) {
        const auto m = flat_market(100, c.volatility, 0.03);
        const lattice_price p = price_leg(m, leg, lattice_settings{}, bumped_greeks::on);
        INFO("volatility " << c.volatility);
        CHECK(p.sensitivities.vega == Approx(c.vega).epsilon(2e-3));
    }
}
