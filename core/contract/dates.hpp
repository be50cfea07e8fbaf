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

}  // namespace hedgeleaf
