// Tests for analytics/currency: Garman-Kohlhagen prices, premium and delta conventions,
// strikes by delta in each convention.
#include "analytics/currency.hpp"

#include "analytics/pricing.hpp"
#include "contract/errors.hpp"
#include "numerics/closed_form.hpp"

#include "test_support.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {

using namespace treasurer_eurusd;  // spot, forward, discount, years (tests/test_support.hpp)

option_leg european(payoff_kind type, double strike) { return single_leg(type, strike, years); }

}  // namespace

TEST_CASE("Garman-Kohlhagen: a handbook example and scipy", "[currency]") {
    // Haug, The Complete Guide to Option Pricing Formulas, 2nd ed. (2007), the currency option
    // example of chapter 1 (from memory): S 1.56, K 1.60, T 0.5, r 6 %, foreign 8 %, vol 12 %:
    // call 0.0291. scipy.stats.norm gives 0.02909925314943973.
    const market_data m = flat_market(1.56, 0.12, 0.06, 0.08);
    const option_leg call = single_leg(payoff_kind::call, 1.60, 0.5);
    CHECK(closed_form(m, call).premium == Approx(0.02909925314943973).epsilon(1e-12));
    CHECK(std::round(closed_form(m, call).premium * 1e4) / 1e4 == Approx(0.0291));
    trade t;
    t.market = m;
    t.legs = {call};
    CHECK(price_trade(t, bumped_greeks::off).premium == Approx(0.02909925314943973).margin(2e-7));
}

TEST_CASE("the lattice market reproduces D x Black(F, K) and put-call parity with forward points", "[currency]") {
    const market_data m = treasurer_eurusd::market();
    const forward_view f = forward_view_of(m, years);
    CHECK(f.forward == Approx(forward).epsilon(1e-14));
    CHECK(f.discount == Approx(discount).epsilon(1e-14));
    // D x Black with scipy.stats.norm at K 1.06: put 0.014490687623303385, call 0.05090645471791577.
    const double put = closed_form(m, european(payoff_kind::put, 1.06)).premium;
    const double call = closed_form(m, european(payoff_kind::call, 1.06)).premium;
    CHECK(put == Approx(0.014490687623303385).epsilon(1e-12));
    CHECK(call == Approx(0.05090645471791577).epsilon(1e-12));
    // Put-call parity on the forward (a fact of the trade): C - P = D (S + points x pip - K);
    // forward points (F - S) / 0.0001 = 122.4726 pips.
    const double points = (forward - spot) / 0.0001;
    CHECK(points == Approx(122.47260443272623).epsilon(1e-10));
    CHECK(call - put == Approx(discount * (spot + points * 0.0001 - 1.06)).epsilon(1e-12));
    trade t;
    t.market = m;
    t.legs = {european(payoff_kind::put, 1.06)};
    CHECK(price_trade(t, bumped_greeks::off).premium == Approx(0.014490687623303385).margin(2e-7));
}

TEST_CASE("premium conventions: a worked example and round trips", "[currency]") {
    // The put above, 0.014490687623303385 USD per EUR (Python, by the definitions of Reiswich
    // and Wystup 2010, from memory): 144.9069 USD pips, 1.33555 % of the EUR notional,
    // 1.36705 % of the USD notional at the strike, 125.995 EUR pips.
    const double v = 0.014490687623303385, k = 1.06, pip = 0.0001;
    CHECK(premium_in(premium_convention::domestic_per_foreign, v, spot, k, pip) == v);
    CHECK(premium_in(premium_convention::domestic_pips, v, spot, k, pip) == Approx(144.90687623303384));
    CHECK(premium_in(premium_convention::percent_of_foreign, v, spot, k, pip) == Approx(1.3355472463874087));
    CHECK(premium_in(premium_convention::percent_of_domestic, v, spot, k, pip) == Approx(1.3670460021984323));
    CHECK(premium_in(premium_convention::foreign_pips, v, spot, k, pip) == Approx(125.99502324409515));
    for (auto c : {premium_convention::domestic_per_foreign, premium_convention::domestic_pips,
                   premium_convention::percent_of_foreign, premium_convention::percent_of_domestic,
                   premium_convention::foreign_pips})
        CHECK(premium_from(c, premium_in(c, v, 150.2, 148, 0.01), 150.2, 148, 0.01) == Approx(v).epsilon(1e-15));
}

TEST_CASE("delta conventions: closed forms and their relations", "[currency]") {
    const market_data m = treasurer_eurusd::market();
    const option_leg put = european(payoff_kind::put, 1.06);
    // scipy.stats.norm: forward delta -N(-d1) = -0.29704847281389646; spot delta D F / S times
    // it; premium-adjusted forward -(K/F) N(-d2) = -0.31055642025506647 (Reiswich and Wystup
    // 2010, from memory); premium-adjusted spot = spot delta - P / S = -0.307050922226316.
    CHECK(leg_delta_in(m, put, delta_convention::forward) == Approx(-0.29704847281389646).epsilon(1e-12));
    CHECK(leg_delta_in(m, put, delta_convention::spot) == Approx(-0.29369544976244194).epsilon(1e-12));
    CHECK(leg_delta_in(m, put, delta_convention::forward_premium_adjusted) ==
          Approx(-0.31055642025506647).epsilon(1e-12));
    CHECK(leg_delta_in(m, put, delta_convention::spot_premium_adjusted) == Approx(-0.307050922226316).epsilon(1e-12));
}

TEST_CASE("strikes by delta in each convention", "[currency]") {
    const market_data m = treasurer_eurusd::market();
    // scipy: unadjusted strikes in closed form, F exp(-phi N^-1(phi Delta_f) sigma sqrt T +
    // sigma^2 T / 2); adjusted ones by brentq (the call's on the branch above its highest delta).
    const struct {
        payoff_kind type;
        delta_convention convention;
        double delta, strike;
    } cases[] = {
        {payoff_kind::call, delta_convention::forward, 0.25, 1.152528354646781},
        {payoff_kind::put, delta_convention::spot, -0.25, 1.0503002482339214},
        {payoff_kind::call, delta_convention::forward_premium_adjusted, 0.25, 1.1499085173813657},
        {payoff_kind::put, delta_convention::spot_premium_adjusted, -0.25, 1.0479340503527794},
    };
    for (const auto& c : cases) {
        const double k = strike_for_currency_delta(m, european(c.type, 1), c.convention, c.delta, "option.strike");
        CHECK(k == Approx(c.strike).epsilon(1e-10));
        CHECK(leg_delta_in(m, european(c.type, k), c.convention) == Approx(c.delta).epsilon(1e-10));
    }
    // Round trips in all four conventions, calls and puts at 10 and 25 delta.
    for (auto convention : {delta_convention::spot, delta_convention::forward, delta_convention::spot_premium_adjusted,
                            delta_convention::forward_premium_adjusted})
        for (double delta : {0.1, 0.25, -0.1, -0.25}) {
            const payoff_kind type = delta > 0 ? payoff_kind::call : payoff_kind::put;
            const double k = strike_for_currency_delta(m, european(type, 1), convention, delta, "option.strike");
            CHECK(leg_delta_in(m, european(type, k), convention) == Approx(delta).margin(1e-10));
        }
    // A premium-adjusted call's delta has a highest value (about 0.849 here, scipy): above it none.
    CHECK_THROWS_WITH(strike_for_currency_delta(m, european(payoff_kind::call, 1),
                                                delta_convention::forward_premium_adjusted, 0.9, "option.strike"),
                      Catch::StartsWith("option.strike: a premium-adjusted call delta of 0.9 is out of reach"));
    // The highest is found between grid points too: a delta a hair under the highest of a fine
    // brute-force scan (common practice) is solved, not refused (a 2,000-point grid alone put the
    // highest some 1e-6 low; an outside audit).
    for (auto convention : {delta_convention::spot_premium_adjusted, delta_convention::forward_premium_adjusted}) {
        double highest = -1;
        const double forward = m.forward(1);
        for (int i = 0; i <= 200000; ++i) {
            const double k = forward * std::exp(-1.5 + 2.0 * i / 200000);
            highest = std::max(highest, leg_delta_in(m, european(payoff_kind::call, k), convention));
        }
        const double k =
            strike_for_currency_delta(m, european(payoff_kind::call, 1), convention, highest - 1e-9, "option.strike");
        CHECK(leg_delta_in(m, european(payoff_kind::call, k), convention) == Approx(highest - 1e-9).margin(1e-10));
    }
}
