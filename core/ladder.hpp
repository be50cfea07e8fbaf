// Hedgeleaf core: scenario ladders (the `ladder` command).
//
// A ladder re-values the whole trade under one change at a time: spot moved by
// a fraction of today's spot, volatility moved by points (0.01 = one point),
// or time moved forward with spot and volatility held; and a grid of spot x
// volatility for P&L. Every scenario is priced on the lattice only, with the
// lattice's own delta and gamma (no re-pricing bumps) and modest steps, so a
// 21 x 11 grid is quick enough to recompute while the user types.
#pragma once

#include "trade.hpp"

namespace hedgeleaf {

/// One scenario: changes applied to today's market.
struct scenario {
    double spot_shift = 0;  ///< fraction of today's spot (-0.1 = spot 10 % lower)
    double vol_shift = 0;   ///< added to market.volatility (0.01 = one volatility point)
    double years_ahead = 0; ///< time moved forward; legs expired by then are paid at their payoff
};

/// Per-unit value and lattice Greeks of the trade in one scenario.
struct scenario_value {
    double value = 0;
    double delta = 0;
    double gamma = 0;
};

/// Default lattice steps of a ladder: modest, for speed.
inline constexpr int default_ladder_steps = 101;

/// Value the trade (per unit, legs' signed quantities applied) in scenario `s`
/// with `steps` lattice steps of the trade's method and Richardson extrapolation.
/// Throws input_error (no field: the caller knows which input set the scenario)
/// when the scenario leaves no valid market.
scenario_value value_scenario(const trade& t, const scenario& s, int steps);

/// The `ladder` command: reads the trade's `ladder` section (optional; a spot
/// ladder -20 % .. +20 % in 2 % steps when absent).
json ladder_json(const trade& t);

}  // namespace hedgeleaf
