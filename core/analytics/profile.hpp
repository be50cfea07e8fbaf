// Hedgeleaf analytics: payoff at expiry and break-even points (the profile command).
//
// For a grid of spots the profile gives the trade's payoff at expiry, its P&L
// after the premium (after the client price when the trade has a quote section:
// the client's break-evens are the client's), and its value today on a fast lattice. Break-even spots
// are the roots of the P&L at expiry, found exactly: between strikes the
// payoff of options expiring together is linear, so each piece is searched
// with the bracketing root finder and the last piece is solved in closed form.
//
// Legs that expire later than the first expiry are valued at that date in
// closed form (European, same market) with their remaining time: the curve is
// then smooth between strikes and each piece is scanned for sign changes.
#pragma once

#include "analytics/client_price.hpp"

#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace hedgeleaf {

/// Payoff per unit at `horizon_years` when spot is `s` there: legs expiring by
/// then pay their payoff; later legs are valued in closed form.
double horizon_payoff(const trade& t, double s, double horizon_years);

/// The first expiry of the trade's option legs (the final expiry for shares alone).
double first_expiry(const trade& t);
/// Every option leg expires at the first expiry: the payoff there is piecewise linear.
bool one_expiry(const trade& t);
/// The option legs' strikes, ascending, each once.
std::vector<double> sorted_strikes(const trade& t);

/// Where the P&L at the horizon (payoff minus `cost`) is zero.
struct break_evens {
    std::vector<double> points;                     ///< isolated break-even spots, ascending
    std::vector<std::pair<double, double>> ranges;  ///< spans where the P&L is zero throughout
};

/// Break-even spots of payoff(s) - cost at the earliest expiry, over all spots > 0.
break_evens find_break_evens(const trade& t, double cost);

/// The `profile` section, read and checked (commands/profile.hpp).
struct profile_settings {
    double spot_low = 0;   ///< default half of today's spot
    double spot_high = 0;  ///< default 1.5 x today's spot
    int points = default_profile_points;
    int steps = default_ladder_steps;
    bool finance_premium = false;
    std::optional<quote_terms> quote;  ///< the trade's quote section: P&L after the client price
};

struct profile_row {
    double spot = 0, spot_change = 0, payoff = 0, pnl_at_expiry = 0, value_today = 0, pnl_today = 0;
    double position_pnl_at_expiry = 0, position_pnl_today = 0;
};

struct profile_result {
    double premium = 0;                 ///< the price command's premium (without bumps)
    std::optional<client_price> quote;  ///< with a quote section: the P&L is after this price
    double cost_at_expiry = 0;          ///< the price paid (client price or premium), carried when financed
    double horizon_years = 0;           ///< the first expiry
    std::vector<profile_row> rows;
    break_evens zero_pnl;
    bool one_expiry = true;  ///< every leg ends at the horizon: the payoff is piecewise linear
    /// With one expiry: the extremes of the P&L at expiry (none = unbounded), per unit and position.
    std::optional<double> max_pnl, min_pnl, position_max_pnl, position_min_pnl;
    std::vector<std::string> notes;
};

/// Rows, break-evens and extremes; refuses (profile.spot_low) a spot range that starts at
/// or below the dividends' present value, and (profile.steps) more than max_profile_work.
profile_result run_profile(const trade& t, const profile_settings& settings);

}  // namespace hedgeleaf
