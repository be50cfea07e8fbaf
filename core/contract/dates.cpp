// Hedgeleaf contract: calendar arithmetic (civil-day algorithms after H. Hinnant,
// "chrono-Compatible Low-Level Date Algorithms", public domain).
#include "contract/dates.hpp"

#include "contract/errors.hpp"
#include "contract/limits.hpp"

#include <cstdio>

namespace hedgeleaf {

long days_from_civil(const date& d) {
    const long y = d.year - (d.month <= 2 ? 1 : 0);
    const long era = (y >= 0 ? y : y - 399) / 400;
    const long yoe = y - era * 400;
    const long mp = (d.month + 9) % 12;
    const long doy = (153 * mp + 2) / 5 + d.day - 1;
    const long doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    return era * 146097 + doe - 719468;
}

date civil_from_days(long z) {
    z += 719468;
    const long era = (z >= 0 ? z : z - 146096) / 146097;
    const long doe = z - era * 146097;
    const long yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
    const long doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    const long mp = (5 * doy + 2) / 153;
    const int day = static_cast<int>(doy - (153 * mp + 2) / 5 + 1);
    const int month = static_cast<int>(mp < 10 ? mp + 3 : mp - 9);
    const long year = yoe + era * 400 + (month <= 2 ? 1 : 0);
    return date{static_cast<int>(year), month, day};
}

namespace {
bool is_leap(int y) { return (y % 4 == 0 && y % 100 != 0) || y % 400 == 0; }
int days_in_month(int y, int m) {
    static const int days[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
    return m == 2 && is_leap(y) ? 29 : days[m - 1];
}
}  // namespace

date parse_iso_date(const std::string& text, const std::string& field) {
    const auto bad = [&] {
        std::string shown = text.size() > 40 ? shorten(text, 40) + "..." : text;
        fail(field, "must be a date written YYYY-MM-DD, got \"" + shown + "\"");
    };
    if (text.size() != 10 || text[4] != '-' || text[7] != '-') bad();
    for (int i : {0, 1, 2, 3, 5, 6, 8, 9})
        if (text[i] < '0' || text[i] > '9') bad();
    const auto num = [&](int from, int len) {
        int v = 0;
        for (int i = from; i < from + len; ++i) v = v * 10 + (text[i] - '0');
        return v;
    };
    date d{num(0, 4), num(5, 2), num(8, 2)};
    if (d.year < min_year || d.year > max_year)
        fail(field, "year must be between " + std::to_string(min_year) + " and " + std::to_string(max_year) +
                        ", got \"" + text + "\"");
    if (d.month < 1 || d.month > 12 || d.day < 1 || d.day > days_in_month(d.year, d.month))
        fail(field, "is not a calendar date: \"" + text + "\"");
    return d;
}

std::string to_iso(const date& d) {
    char buf[16];
    std::snprintf(buf, sizeof buf, "%04d-%02d-%02d", d.year, d.month, d.day);
    return buf;
}

double year_fraction(const date& from, const date& to) {
    return static_cast<double>(days_from_civil(to) - days_from_civil(from)) / 365.0;
}

bool is_business_day(const date& d) {
    // 1970-01-01 was a Thursday; 0 = Monday.
    const long z = days_from_civil(d);
    const long weekday = ((z % 7) + 7 + 3) % 7;
    return weekday < 5;
}

date add_months(const date& d, int months) {
    const int index = d.year * 12 + (d.month - 1) + months;
    const int y = index / 12;
    const int m = index % 12 + 1;
    const int day = d.day < days_in_month(y, m) ? d.day : days_in_month(y, m);
    return date{y, m, day};
}

date add_days(const date& d, long days) { return civil_from_days(days_from_civil(d) + days); }

date next_business_day(const date& d) {
    date out = d;
    while (!is_business_day(out)) out = add_days(out, 1);
    return out;
}

date modified_following(const date& d) {
    const date forward = next_business_day(d);
    if (forward.month == d.month) return forward;
    date back = d;
    while (!is_business_day(back)) back = add_days(back, -1);
    return back;
}

tenor parse_tenor(const std::string& text, const std::string& field) {
    const auto bad = [&](const std::string& why) {
        const std::string shown = text.size() > 40 ? shorten(text, 40) + "..." : text;
        fail(field, why + ", got \"" + shown + "\"");
    };
    const std::string units = "dwmy";
    if (text.size() < 2 || text.size() > max_tenor_chars)
        bad("must be a tenor of 2 to " + std::to_string(max_tenor_chars) +
            " characters, a count and d, w, m or y, such as 1w, 3m, 6m, 1y or 18m");
    const char last = static_cast<char>(text.back() | 0x20);  // lower case
    const std::size_t unit = units.find(last);
    if (unit == std::string::npos) bad("must end in d, w, m or y (days, weeks, months, years), as in 6m");
    long count = 0;
    for (std::size_t i = 0; i + 1 < text.size(); ++i) {
        if (text[i] < '0' || text[i] > '9') bad("must be a whole number of d, w, m or y, as in 6m or 18m");
        count = count * 10 + (text[i] - '0');
    }
    if (count < 1 || count > max_tenor_count)
        bad("must count 1 to " + std::to_string(max_tenor_count) + " days, weeks, months or years");
    return tenor{static_cast<int>(count), static_cast<tenor_unit>(unit)};
}

std::string to_string(const tenor& t) { return std::to_string(t.count) + "dwmy"[static_cast<int>(t.unit)]; }

date tenor_date(const date& valuation, const tenor& t) {
    switch (t.unit) {
        case tenor_unit::days: return modified_following(add_days(valuation, t.count));
        case tenor_unit::weeks: return modified_following(add_days(valuation, 7L * t.count));
        case tenor_unit::months: return modified_following(add_months(valuation, t.count));
        case tenor_unit::years: return modified_following(add_months(valuation, 12 * t.count));
    }
    return valuation;
}

double tenor_years(const tenor& t) {
    switch (t.unit) {
        case tenor_unit::days: return t.count / 365.0;
        case tenor_unit::weeks: return 7.0 * t.count / 365.0;
        case tenor_unit::months: return t.count / 12.0;
        case tenor_unit::years: return static_cast<double>(t.count);
    }
    return 0;
}

}  // namespace hedgeleaf
