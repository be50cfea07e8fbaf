// Hedgeleaf analytics: rebalancing dates, for a hedge schedule and for the simulation.
#pragma once

#include "contract/dates.hpp"
#include "contract/trade.hpp"

#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

enum class rebalance_unit { days, weeks, months };  // the order of contract/limits.hpp's rebalance_units

/// When the hedge is rebalanced.
struct rebalance_spec {
    int every = 1;                                ///< every N units
    rebalance_unit unit = rebalance_unit::weeks;  ///< days = business days; weeks, months roll to Mon-Fri
    std::vector<double> years;                    ///< explicit dates, in years from valuation, if given
    bool explicit_dates = false;
};

/// One schedule date.
struct schedule_date {
    double years = 0;         ///< from valuation
    std::optional<date> day;  ///< calendar date when the trade has a valuation_date
};

/// The calendar day `years` after the valuation date (ACT/365F, rounded to a day), if the trade has one.
std::optional<date> day_of(const trade& t, double years);

/// Valuation, the rebalancing dates strictly before the final expiry, every leg
/// expiry and Bermudan exercise date, and the final expiry; sorted, no repeats.
/// Without a valuation_date: a business day counts 7/5 calendar days, a month 1/12 year.
/// Refuses (naming `path`'s every or dates) more than max_rebalancing_dates dates.
std::vector<schedule_date> schedule_dates(const trade& t, const rebalance_spec& spec, const std::string& path);

}  // namespace hedgeleaf
