// Hedgeleaf numerics: the time grid of a lattice, with a step boundary on every event.
//
// A lattice runs on times t_0 = 0 < t_1 < ... < t_N = T. Without an event strictly
// inside (0, T) the grid is uniform, t_n = n T / N, and every lattice method runs
// exactly as it always has. An event (a Bermudan exercise date; for an American leg a
// cash dividend's ex-date and the day before it; for a trade's shared lattice also an
// earlier leg's expiry) splits the life into segments that end exactly on the events;
// each segment gets whole equal steps in proportion to its length, at least one.
#pragma once

#include "contract/trade.hpp"

#include <vector>

namespace hedgeleaf {

/// The times of a lattice's steps.
struct time_grid {
    double expiry = 0;          ///< T
    int steps = 0;              ///< N
    bool uniform = true;        ///< t_n = n T / N (times is then empty)
    std::vector<double> times;  ///< t_0..t_N when piecewise (segments end on the events)
    int segments = 1;           ///< pieces of equal steps

    /// Years from valuation to step n.
    double time(int n) const { return uniform ? n * (expiry / steps) : times[static_cast<std::size_t>(n)]; }
    /// The step whose time is nearest `years` (clamped to [0, N]).
    int nearest_step(double years) const;
};

/// The events of one leg strictly inside its life, sorted, nearer than time_tolerance_years merged:
/// Bermudan exercise dates; for an American leg each cash dividend's ex-date and the day before
/// (1/365 year earlier: the last moment the share still carries the dividend).
std::vector<double> leg_events(const market_data& market, const option_leg& leg);

/// The grid of `steps` steps to `expiry` with a step boundary on every event strictly inside:
/// uniform without events; otherwise piecewise with max(steps, segments) steps in all, shared
/// among the segments in proportion to their lengths (largest remainder), at least one each.
time_grid make_time_grid(double expiry, int steps, std::vector<double> events);

}  // namespace hedgeleaf
