// Hedgeleaf analytics: rebalancing dates (see schedule.hpp).
#include "analytics/schedule.hpp"

#include "contract/errors.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

std::optional<date> day_of(const trade& t, double years) {
    if (!t.valuation_date) return std::nullopt;
    return add_days(*t.valuation_date, std::lround(years * 365.0));
}

std::vector<schedule_date> schedule_dates(const trade& t, const rebalance_spec& spec, const std::string& path) {
    const double T = t.final_expiry_years();
    std::vector<schedule_date> out{{0.0, t.valuation_date}};
    const auto add = [&](double years, std::optional<date> day) {
        if (out.size() > max_rebalancing_dates)
            fail(join_path(path, spec.explicit_dates ? "dates" : "every"),
                 "gives more than " + std::to_string(max_rebalancing_dates) +
                     " rebalancing dates before the final expiry; rebalance less often");
        out.push_back({years, day});
    };
    if (spec.explicit_dates) {
        for (double x : spec.years)
            if (x < T - time_tolerance_years) add(x, day_of(t, x));
    } else if (t.valuation_date) {
        const date start = *t.valuation_date;
        for (long k = 1;; ++k) {
            date d;
            if (spec.unit == rebalance_unit::days) {
                // every N business days: walk forward N Monday-Friday days from the previous date
                d = out.back().day ? *out.back().day : start;
                for (int n = 0; n < spec.every;) {
                    d = add_days(d, 1);
                    if (is_business_day(d)) ++n;
                }
            } else if (spec.unit == rebalance_unit::weeks) {
                d = next_business_day(add_days(start, 7L * spec.every * k));
            } else {
                d = next_business_day(add_months(start, static_cast<int>(spec.every * k)));
            }
            const double x = year_fraction(start, d);
            if (x >= T - time_tolerance_years) break;
            if (x > out.back().years + time_tolerance_years) add(x, d);
        }
    } else {
        const double step = spec.unit == rebalance_unit::days    ? spec.every * (7.0 / 5.0) / 365.0
                            : spec.unit == rebalance_unit::weeks ? spec.every * 7.0 / 365.0
                                                                 : spec.every / 12.0;
        for (long k = 1; k * step < T - time_tolerance_years; ++k) add(k * step, std::nullopt);
    }
    // Every leg's expiry and Bermudan exercise date, and the final expiry.
    for (const auto& leg : t.legs) {
        if (leg.type == payoff_kind::stock) continue;
        add(leg.expiry_years, day_of(t, leg.expiry_years));
        for (double x : leg.exercise_years) add(x, day_of(t, x));
    }
    std::stable_sort(out.begin(), out.end(),
                     [](const schedule_date& a, const schedule_date& b) { return a.years < b.years; });
    std::vector<schedule_date> unique;
    for (const auto& d : out)
        if (unique.empty() || d.years > unique.back().years + time_tolerance_years) unique.push_back(d);
    // The final expiry itself, exactly (a date within the tolerance before it is replaced).
    if (unique.back().years < T) unique.back() = {T, day_of(t, T)};
    return unique;
}

}  // namespace hedgeleaf
