// Hedgeleaf contract: calendar dates, ACT/365F year fractions and business days.
#pragma once

#include <optional>
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

/// A tenor as desks write it: a whole number of days, weeks, months or years ("3m", "10d", "2y").
struct tenor {
    int count = 0;
    char unit = 'm';  ///< 'd', 'w', 'm' or 'y'
};
/// "3m", "2W", "10d", "1y": a whole number from 1 to 1200 and a unit letter (any case); none otherwise.
std::optional<tenor> parse_tenor(const std::string& text);
/// Years to the end of a tenor, ACT/365F: with a valuation date, from the calendar date it
/// reaches (months and years by add_months); without one, months as twelfths and years as
/// years, days and weeks over 365.
double tenor_years(const tenor& t, const std::optional<date>& valuation_date);

}  // namespace hedgeleaf
