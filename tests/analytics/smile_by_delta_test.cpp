// Tests for analytics/smile_by_delta: wing volatilities, the delta-neutral straddle, wing
// strikes solved from their deltas, and the grid in percent of the forward.
#include "analytics/smile_by_delta.hpp"

#include "analytics/currency.hpp"
#include "contract/errors.hpp"

#include "test_support.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {

using namespace treasurer_eurusd;  // spot, forward, discount, years (tests/test_support.hpp)

delta_quote quote(double atm, double rr25, double bf25) {
    delta_quote q;
    q.expiry_years = years;
    q.atm = atm;
    q.rr25 = rr25;
    q.bf25 = bf25;
    return q;
}

double delta_at(const market_data& m, payoff_kind type, const delta_smile_point& p, delta_convention c) {
    option_leg leg = single_leg(type, p.strike, years);
    leg.volatility = p.volatility;
    return leg_delta_in(m, leg, c);
}

constexpr delta_convention all_conventions[] = {delta_convention::spot, delta_convention::forward,
                                                delta_convention::spot_premium_adjusted,
                                                delta_convention::forward_premium_adjusted};

}  // namespace

TEST_CASE("wing volatilities from a risk reversal and a butterfly, by hand", "[smile_by_delta]") {
    // The smile-strangle reading (common practice): call = atm + bf + rr/2, put = atm + bf - rr/2.
    // By hand: 0.075 + 0.0025 - 0.002 = 0.0755 and 0.075 + 0.0025 + 0.002 = 0.0795.
    const wing_volatilities w = wings_of(0.075, -0.004, 0.0025);
    CHECK(w.call == Approx(0.0755).epsilon(1e-15));
    CHECK(w.put == Approx(0.0795).epsilon(1e-15));
    // Their difference is the risk reversal, their mean over atm the butterfly (the definitions).
    CHECK(w.call - w.put == Approx(-0.004).epsilon(1e-12));
    CHECK((w.call + w.put) / 2 - 0.075 == Approx(0.0025).epsilon(1e-12));
}

TEST_CASE("at-the-money is the delta-neutral straddle in each convention", "[smile_by_delta]") {
    const market_data m = treasurer_eurusd::market();
    for (const auto c : all_conventions) {
        const delta_smile_point atm{"atm", atm_strike(forward, 0.08, years, c), 0.08};
        // Reiswich and Wystup 2010 (from memory): a straddle at this strike has no delta.
        CHECK(delta_at(m, payoff_kind::call, atm, c) + delta_at(m, payoff_kind::put, atm, c) ==
              Approx(0).margin(1e-14));
    }
    // Unadjusted: F exp(sigma^2 T / 2) (d1 = 0), by hand: 1.0972472604432726 exp(0.0032 x 274/365).
    CHECK(atm_strike(forward, 0.08, years, delta_convention::spot) == Approx(1.0998862271769188).epsilon(1e-14));
}

TEST_CASE("each wing's strike has its delta in the convention, at its own volatility", "[smile_by_delta]") {
    const market_data m = treasurer_eurusd::market();
    delta_quote q = quote(0.08, -0.006, 0.0025);
    q.rr10 = -0.011;
    q.bf10 = 0.009;
    for (const auto c : all_conventions) {
        const delta_smile_row row = smile_row_of(m, q, c, "market.volatility.quotes_by_delta[0]");
        REQUIRE(row.points.size() == 5);
        const char* names[] = {"put_10", "put_25", "atm", "call_25", "call_10"};
        const double deltas[] = {-0.10, -0.25, 0, 0.25, 0.10};
        for (std::size_t i = 0; i < 5; ++i) {
            CHECK(row.points[i].name == names[i]);
            if (i > 0) CHECK(row.points[i].strike > row.points[i - 1].strike);
            if (i == 2) continue;
            const payoff_kind type = deltas[i] > 0 ? payoff_kind::call : payoff_kind::put;
            CHECK(delta_at(m, type, row.points[i], c) == Approx(deltas[i]).margin(1e-10));
        }
        // The wing volatilities the quotes gave (by hand: 0.08 + 0.009 -+ 0.0055).
        CHECK(row.points[0].volatility == Approx(0.0945).epsilon(1e-14));
        CHECK(row.points[4].volatility == Approx(0.0835).epsilon(1e-14));
    }
    // scipy (norm.ppf) for spot delta, D F/S N(d1) = 0.25: K = F exp(-d1 sigma sqrt T + sigma^2 T / 2).
    const delta_smile_row spot_row = smile_row_of(m, quote(0.08, -0.006, 0.0025), delta_convention::spot, "q");
    CHECK(spot_row.points[0].strike == Approx(1.047332280450766).epsilon(1e-10));
    CHECK(spot_row.points[2].strike == Approx(1.1514467152340528).epsilon(1e-10));
}

TEST_CASE("the grid in percent of the forward holds every expiry's points", "[smile_by_delta]") {
    const market_data m = treasurer_eurusd::market();
    const delta_smile_row row = smile_row_of(m, quote(0.08, -0.006, 0.0025), delta_convention::spot, "q");
    delta_quote later = quote(0.085, -0.007, 0.003);
    later.expiry_years = 2 * years;
    const delta_smile_row row2 = smile_row_of(m, later, delta_convention::spot, "q");
    const smile_grid g = grid_of_rows({row, row2}, spot);
    CHECK(g.basis == strike_basis::percent_of_forward);
    REQUIRE(g.strikes.size() == 6);
    const volatility_smile s(g);
    for (const auto& p : row.points)
        CHECK(s.at(100 * p.strike / row.forward, years).volatility == Approx(p.volatility));
    for (const auto& p : row2.points)
        CHECK(s.at(100 * p.strike / row2.forward, 2 * years).volatility == Approx(p.volatility));
    // A flat quote gives a flat grid: every cell the at-the-money volatility, exactly.
    const delta_smile_row flat = smile_row_of(m, quote(0.08, 0, 0), delta_convention::forward, "q");
    const smile_grid flat_grid = grid_of_rows({flat}, spot);
    for (const auto& v : flat_grid.vols[0]) CHECK(v == 0.08);
}

TEST_CASE("wings on the wrong side of at-the-money name the butterfly", "[smile_by_delta]") {
    delta_quote q = quote(0.08, -0.006, 0.0025);
    q.rr10 = -0.011;
    q.bf10 = -0.045;  // 10-delta wings far below the 25-delta ones: their strikes fall inside
    CHECK_THROWS_WITH(
        smile_row_of(treasurer_eurusd::market(), q, delta_convention::spot, "market.volatility.quotes_by_delta[0]"),
        Catch::StartsWith("market.volatility.quotes_by_delta[0].bf10: puts the 10-delta strikes"));
}
