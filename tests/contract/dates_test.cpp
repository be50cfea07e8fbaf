// Tests for contract/dates: civil-day arithmetic, ACT/365F and business days.
#include "contract/dates.hpp"
#include "contract/errors.hpp"

#include <catch2/catch.hpp>

using namespace hedgeleaf;

TEST_CASE("civil days round-trip and known weekdays", "[dates]") {
    // 2000-03-01 is day 11017 after 1970-01-01 (common practice: Unix day numbers).
    CHECK(days_from_civil({2000, 3, 1}) == 11017);
    CHECK(days_from_civil({1970, 1, 1}) == 0);
    for (long z = -50000; z < 100000; z += 37) CHECK(days_from_civil(civil_from_days(z)) == z);
    // 2026-12-02 is a Wednesday, 2026-12-05 a Saturday (calendar fact).
    CHECK(is_business_day({2026, 12, 2}));
    CHECK_FALSE(is_business_day({2026, 12, 5}));
    CHECK(next_business_day({2026, 12, 5}) == date{2026, 12, 7});
}

TEST_CASE("ACT/365F year fractions", "[dates]") {
    // ACT/365F: actual days over 365, leap years included (ISDA 2006 definitions, 4.16(d)).
    CHECK(year_fraction({2027, 1, 1}, {2028, 1, 1}) == Approx(1.0));
    CHECK(year_fraction({2028, 1, 1}, {2029, 1, 1}) == Approx(366.0 / 365.0));
    CHECK(year_fraction({2026, 12, 2}, {2027, 6, 18}) == Approx(198.0 / 365.0));
}

TEST_CASE("month arithmetic clamps to month end", "[dates]") {
    CHECK(add_months({2027, 1, 31}, 1) == date{2027, 2, 28});
    CHECK(add_months({2028, 1, 31}, 1) == date{2028, 2, 29});
    CHECK(add_months({2026, 11, 15}, 3) == date{2027, 2, 15});
}

TEST_CASE("ISO dates are parsed strictly", "[dates]") {
    CHECK(parse_iso_date("2027-06-18", "x") == date{2027, 6, 18});
    CHECK_THROWS_WITH(parse_iso_date("2027-02-30", "option.expiry_date"),
                      "option.expiry_date: is not a calendar date: \"2027-02-30\"");
    CHECK_THROWS_WITH(parse_iso_date("18/06/2027", "option.expiry_date"),
                      "option.expiry_date: must be a date written YYYY-MM-DD, got \"18/06/2027\"");
}
