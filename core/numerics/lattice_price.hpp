// Hedgeleaf numerics: a leg's price from lattices of three sizes, with its Greeks, an error
// bound and the no-arbitrage bounds every premium keeps.
//
// A price is the fine lattice of N steps, or, where it is known to help, the Richardson
// extrapolation of N and about N/2 steps: Leisen-Reimer lattices of calls, puts and digitals
// on a uniform grid, whose errors fall smoothly (second order for European payoffs, first
// order, less evenly, with an exercise boundary). Cox-Ross-Rubinstein, Jarrow-Rudd and Tian errors oscillate
// with N, and so do lattices whose steps differ (numerics/time_grid.hpp): extrapolating
// them makes the error larger, so they report the fine lattice and say so.
//
// The error bound compares the price with lattices of about N/2 and N/4 steps (N x 2 and
// N x 4 below 8 steps, or where a smaller lattice cannot be built): for an error falling
// like c / n^k each pair of levels gives an estimate of the price's own error; the bound
// is error_safety times the largest of them, and for an extrapolated price with an exercise
// boundary at least the step the extrapolation took (bench/coverage_bench.cpp measures that it
// covers the true error in at least 19 cases of 20 for every method and option type).
#pragma once

#include "contract/trade.hpp"
#include "numerics/closed_form.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// The range no premium of a leg may leave (per unit; Merton 1973, common practice):
/// a call in [max(0, S* e^-qT - K e^-rT), S* e^-qT] (American: at least S - K, at most
/// spot), a put in [max(0, K e^-rT - S* e^-qT), K e^-rT] (American: at least K - S, at
/// most K or K e^-rT whichever is larger), a digital in [0, payout e^-rT]; S* is spot less
/// the present value of the cash dividends before expiry.
struct premium_bounds {
    double lower = 0;
    double upper = 0;
};
premium_bounds no_arbitrage_bounds(const market_data& market, const option_leg& leg);

/// A lattice price with Greeks and an error bound.
struct lattice_price {
    double premium = 0;
    greeks sensitivities;             ///< delta, gamma, theta from the lattice; vega, rho by bumps (or 0)
    double error_estimate = 0;        ///< bound on |premium - exact| (0 when not asked for)
    int steps = 0;                    ///< steps of the fine lattice (of its grid, when the steps differ)
    int coarse_steps = 0;             ///< steps of the second Richardson level (0 when not extrapolated)
    std::vector<int> estimate_steps;  ///< the lattices the error bound compares the price with
    bool extrapolated = false;
    int segments = 1;                ///< pieces of equal steps of the time grid (1 = uniform)
    std::vector<std::string> notes;  ///< why not extrapolated, a fallback, rough Greeks
};

/// Bump sizes for the sensitivities taken by re-pricing (docs/replication.md, sensitivities).
inline constexpr double vega_bump = 0.005;  ///< +-0.5 volatility point (at most half the volatility)
/// A digital's value turns on the scale of its volatility itself: its vega bump is at
/// most this fraction of the volatility (2 % of 10 % = 0.002).
inline constexpr double digital_vega_bump_fraction = 0.02;
inline constexpr double rho_bump = 0.0005;  ///< +-5 basis points
/// The error bound is this many times the largest estimate of the error from the three lattices.
inline constexpr double error_safety = 3.0;
/// Below this many steps the Greeks of a lattice are rough; the price says so (lattice.steps).
inline constexpr int min_steps_for_greeks = 3;

/// Whether vega and rho are measured, by re-pricing at bumped volatility and rate (four
/// more prices), or left 0 (ladders, schedules, searches: the lattice's own Greeks only).
enum class bumped_greeks { off, on };
/// Whether the error bound is measured (one more, smaller lattice) or left 0.
enum class error_bound { off, on };

/// Whether Richardson extrapolation helps `leg` priced by `method` (see above).
bool extrapolation_helps(lattice_method method, const market_data& market, const option_leg& leg);

/// Price one leg (see above): the fine lattice or its extrapolation with a coarser one,
/// never outside no_arbitrage_bounds (an extrapolation that would be is replaced by the fine
/// lattice, with a note); delta, gamma and theta from the lattice, vega and rho by central
/// differences when `bumps` is on, the error bound when `bound` is on.
lattice_price price_leg(const market_data& market, const option_leg& leg, const lattice_settings& settings,
                        bumped_greeks bumps = bumped_greeks::off, error_bound bound = error_bound::off);

}  // namespace hedgeleaf
