// Hedgeleaf core: payoff at expiry and break-even points (the `profile` command).
//
// For a grid of spots the profile gives the trade's payoff at expiry, its P&L
// after the premium, and its value today on a fast lattice. Break-even spots
// are the roots of the P&L at expiry, found exactly: between strikes the
// payoff of options expiring together is linear, so each piece is searched
// with the bracketing root finder and the last piece is solved in closed form.
//
// Legs that expire later than the first expiry are valued at that date in
// closed form (European, same market) with their remaining time: the curve is
// then smooth between strikes and each piece is scanned for sign changes.
#pragma once

#include "trade.hpp"

#include <vector>

namespace hedgeleaf {

/// Payoff per unit at the horizon `horizon` (years) when spot is `s` there:
/// legs expiring by then pay their payoff; later legs are valued in closed form.
double horizon_payoff(const trade& t, double s, double horizon);

/// Where the P&L at the horizon (payoff minus `cost`) is zero.
struct break_evens {
    std::vector<double> points;                          ///< isolated break-even spots, ascending
    std::vector<std::pair<double, double>> ranges;       ///< spans where the P&L is zero throughout
};

/// Break-even spots of payoff(s) - cost at the earliest expiry, over all spots > 0.
break_evens find_break_evens(const trade& t, double cost);

/// The `profile` command: reads the optional `profile` section.
json profile_json(const trade& t);

}  // namespace hedgeleaf
