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

TEST_CASE("tenors are read as a count and a unit", "[dates][tenor]") {
    CHECK(to_string(parse_tenor("6m", "x")) == "6m");
    CHECK(to_string(parse_tenor("18M", "x")) == "18m");
    CHECK(to_string(parse_tenor("1w", "x")) == "1w");
    CHECK(to_string(parse_tenor("2y", "x")) == "2y");
    CHECK_THROWS_WITH(parse_tenor("6", "option.expiry_tenor"),
                      "option.expiry_tenor: must be a tenor of 2 to 6 characters, a count and d, w, m or y, such as "
                      "1w, 3m, 6m, 1y or 18m, got \"6\"");
    CHECK_THROWS_WITH(
        parse_tenor("6x", "option.expiry_tenor"),
        "option.expiry_tenor: must end in d, w, m or y (days, weeks, months, years), as in 6m, got \"6x\"");
    CHECK_THROWS_WITH(parse_tenor("m6m", "f"),
                      "f: must be a whole number of d, w, m or y, as in 6m or 18m, got \"m6m\"");
    CHECK_THROWS_WITH(parse_tenor("0m", "f"), "f: must count 1 to 18250 days, weeks, months or years, got \"0m\"");
}

TEST_CASE("a tenor's date: months added, end of month clamped, modified following", "[dates][tenor]") {
    // Common practice for expiry tenors (months added to the trade date with the day clamped to
    // the month's end, then the modified-following roll; weekends only, no holiday calendar).
    // Weekdays are calendar facts (checked with Python's datetime).
    const auto on = [](date from, const char* t) { return tenor_date(from, parse_tenor(t, "x")); };
    CHECK(on({2026, 12, 2}, "6m") == date{2027, 6, 2});    // Wednesday to Wednesday
    CHECK(on({2026, 12, 2}, "18m") == date{2028, 6, 2});   // a Friday
    CHECK(on({2026, 12, 2}, "1w") == date{2026, 12, 9});   // seven days
    CHECK(on({2027, 3, 3}, "1m") == date{2027, 4, 5});     // Saturday 3 April rolls forward to Monday
    CHECK(on({2026, 12, 31}, "2m") == date{2027, 2, 26});  // clamped to Sunday 28 Feb, rolled back to Friday
    CHECK(on({2027, 9, 30}, "1m") == date{2027, 10, 29});  // Saturday 30 Oct: Monday is November, so Friday
    CHECK(on({2028, 1, 31}, "1m") == date{2028, 2, 29});   // leap year, a Tuesday
    CHECK(on({2028, 2, 29}, "1y") == date{2029, 2, 28});   // clamped, a Wednesday
    CHECK(on({2027, 7, 30}, "1d") == date{2027, 7, 30});   // Saturday 31 July rolls back onto the start
    // Without a valuation date: months / 12 years, days / 365 (ACT/365F).
    CHECK(tenor_years(parse_tenor("18m", "x")) == 1.5);
    CHECK(tenor_years(parse_tenor("1w", "x")) == 7.0 / 365.0);
    CHECK(tenor_years(parse_tenor("2y", "x")) == 2.0);
}
