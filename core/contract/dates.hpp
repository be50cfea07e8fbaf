// Hedgeleaf contract: calendar dates, ACT/365F year fractions and business days.
#pragma once

#include <string>

namespace hedgeleaf {

/// A proleptic Gregorian calendar date.
struct date {
    int year = 1970;
    int month = 1;
    int day = 1;
    friend bool operator==(const date&, const date&) = default;
};

/// Days since 1970-01-01 (negative before).
long days_from_civil(const date& d);
/// Inverse of days_from_civil.
date civil_from_days(long days);
/// Parse "YYYY-MM-DD" strictly; throws input_error naming `field` otherwise.
date parse_iso_date(const std::string& text, const std::string& field);
/// "YYYY-MM-DD".
std::string to_iso(const date& d);
/// ACT/365F year fraction from `from` to `to` (negative if `to` is earlier).
double year_fraction(const date& from, const date& to);
/// Monday..Friday.
bool is_business_day(const date& d);
/// Add whole calendar months, clamping the day to the month's end (Jan 31 + 1M = Feb 28/29).
date add_months(const date& d, int months);
/// Add calendar days.
date add_days(const date& d, long days);
/// The first business day on or after d (Saturday/Sunday roll forward to Monday).
date next_business_day(const date& d);
/// Modified following (weekends only, no holiday calendar): a Saturday or Sunday rolls
/// forward to Monday unless that is in the next month, then back to Friday.
date modified_following(const date& d);

/// A tenor as a desk writes it: a whole number of days, weeks, months or years ("1w", "6m", "18m").
enum class tenor_unit { days, weeks, months, years };
struct tenor {
    int count = 0;
    tenor_unit unit = tenor_unit::months;
};
/// Read "<count><unit>" (count 1..max_tenor_count, unit d, w, m or y in either case); throws
/// input_error naming `field` otherwise.
tenor parse_tenor(const std::string& text, const std::string& field);
/// "6m": the tenor as written by parse_tenor's rule.
std::string to_string(const tenor& t);
/// The date a tenor from `valuation` falls on (common practice): days and weeks added as
/// calendar days, months and years as calendar months with the day clamped to the month's
/// end (Jan 31 + 1m = Feb 28/29), then rolled by modified following.
date tenor_date(const date& valuation, const tenor& t);
/// A tenor in years when the trade has no valuation date: months / 12 (years x 12 months),
/// days / 365 and weeks x 7 / 365 (ACT/365F).
double tenor_years(const tenor& t);

}  // namespace hedgeleaf
