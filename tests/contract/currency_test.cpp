// Tests for contract/currency: currency codes, pips, spot and delivery dates, money-market rates.
#include "contract/currency.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

TEST_CASE("currency codes by shape and pips by pair", "[currency]") {
    // ISO 4217: three capital letters (shape only; the list of codes is not checked).
    CHECK(is_currency_code("EUR"));
    CHECK(is_currency_code("JPY"));
    CHECK_FALSE(is_currency_code("eur"));
    CHECK_FALSE(is_currency_code("EURO"));
    CHECK_FALSE(is_currency_code("E1R"));
    // Pips (common practice): 0.01 for a JPY quote, 0.0001 otherwise.
    CHECK(default_pip_size("JPY") == 0.01);
    CHECK(default_pip_size("USD") == 0.0001);
}

TEST_CASE("spot and delivery dates across weekends and month ends", "[currency]") {
    // Calendar facts (checked with Python's datetime): 2026-12-03 is a Thursday, 2026-12-04 a
    // Friday, 2027-04-29 and 2027-12-30 Thursdays, 2027-09-03 a Friday, 2028-02-28 a Monday.
    // Spot two business days after the trade date, weekends only (common practice, T+2).
    CHECK(add_business_days({2026, 12, 3}, 2) == date{2026, 12, 7});  // Thursday -> Monday
    CHECK(add_business_days({2026, 12, 4}, 2) == date{2026, 12, 8});  // Friday -> Tuesday
    CHECK(add_business_days({2027, 4, 29}, 2) == date{2027, 5, 3});   // across a month end
    CHECK(add_business_days({2027, 12, 30}, 2) == date{2028, 1, 3});  // across a year end
    CHECK(add_business_days({2028, 2, 28}, 2) == date{2028, 3, 1});   // through 29 February 2028
    CHECK(add_business_days({2026, 12, 5}, 1) == date{2026, 12, 7});  // a Saturday: next Monday
    CHECK(add_business_days({2026, 12, 3}, 0) == date{2026, 12, 3});
    const currency_dates d = settle_dates({2026, 12, 3}, {2027, 9, 3}, 2);
    CHECK(d.spot == date{2026, 12, 7});
    CHECK(d.delivery == date{2027, 9, 7});  // Friday expiry -> Tuesday delivery
    CHECK(d.premium == d.spot);             // the premium is paid on the spot date unless given
    // One-day spot lag (common practice for USD/CAD): Friday -> Monday.
    CHECK(settle_dates({2026, 12, 4}, {2027, 3, 5}, 1).spot == date{2026, 12, 7});
}

TEST_CASE("money-market rates convert exactly to continuous ACT/365F", "[currency]") {
    // 3 % ACT/360 simple over 274 days: ln(1 + 0.03 x 274/360) x 365/274 (Python math.log).
    const quoted_rate simple{0.03, day_count::act_360, compounding::simple};
    CHECK(growth_over(simple, 274) == Approx(1 + 0.03 * 274 / 360.0).epsilon(1e-15));
    CHECK(continuous_act365f(simple, 274) == Approx(0.030074606844161605).epsilon(1e-13));
    // 5 % ACT/365 annual over one 365-day year: ln(1.05) (a fact of the logarithm).
    CHECK(continuous_act365f({0.05, day_count::act_365, compounding::annual}, 365) ==
          Approx(std::log(1.05)).epsilon(1e-14));
    // 4 % continuous ACT/360 is 4 % x 365/360 continuous ACT/365F, at any length.
    for (long days : {1L, 90L, 400L})
        CHECK(continuous_act365f({0.04, day_count::act_360, compounding::continuous}, days) ==
              Approx(0.04 * 365 / 360).epsilon(1e-13));
    // Negative rates convert too (simple -0.5 % ACT/360 over 182 days).
    CHECK(continuous_act365f({-0.005, day_count::act_360, compounding::simple}, 182) ==
          Approx(std::log(1 - 0.005 * 182 / 360.0) * 365 / 182).epsilon(1e-13));
}
