// Hedgeleaf analytics: scenario ladders (the ladder command).
//
// A ladder re-values the whole trade under one change at a time: spot moved by
// a fraction of today's spot, volatility moved by points (0.01 = one point),
// or time moved forward with spot and volatility held; and a grid of spot x
// volatility for P&L. Every scenario is priced on the lattice only, with the
// lattice's own delta and gamma (no re-pricing bumps) and modest steps, so a
// 21 x 11 grid is quick enough to recompute while the user types.
#pragma once

#include "analytics/pricing.hpp"
#include "contract/trade.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// One scenario: changes applied to today's market.
struct scenario {
    double spot_shift = 0;   ///< fraction of today's spot (-0.1 = spot 10 % lower)
    double vol_shift = 0;    ///< added to market.volatility (0.01 = one volatility point)
    double years_ahead = 0;  ///< time moved forward; legs expired by then are paid at their payoff
};

/// How a smile moves when spot moves (contract/limits.hpp: smile_moves, in this order).
///   sticky_strike     each strike keeps its volatility: the smile stays where it is in price
///                     (the default; common desk practice for short-dated equity scenarios);
///   sticky_moneyness  the smile moves with spot: the volatility at strike K with spot S' is
///                     today's volatility at strike K S / S'.
/// A volatility shift moves the whole smile in parallel. Without a smile neither matters.
enum class smile_move { sticky_strike, sticky_moneyness };

/// Per-unit value and lattice Greeks of the trade in one scenario.
struct scenario_value {
    double value = 0;
    double delta = 0;
    double gamma = 0;
    bool extrapolated = true;  ///< every option leg's price was extrapolated (where it helps only)
};

/// Value the trade (per unit, legs' signed quantities applied) in scenario `s`
/// with `steps` lattice steps of the trade's method and Richardson extrapolation.
/// Throws input_error (no field: the caller knows which input set the scenario)
/// when the scenario leaves no valid market.
/// Each leg is priced at its own volatility (analytics/leg_market.hpp); a scenario that moves
/// time holds every leg at today's volatility.
scenario_value value_scenario(const trade& t, const scenario& s, int steps,
                              smile_move move = smile_move::sticky_strike);

/// Node updates of pricing `scenarios` scenarios of `legs` legs at `steps` steps (the
/// fine and coarse lattices of the full triangle), held to max_ladder_work.
double scenario_work(std::size_t scenarios, std::size_t legs, int steps);

/// Axis points are typed in decimals: -0.15 and 0, not -0.15000000000000002 and 1e-17.
double tidy_decimal(double x);

enum class ladder_kind { spot, volatility, time, grid };  // the order of contract/limits.hpp's ladder_kinds

/// The `ladder` section, read and checked (commands/ladder.hpp).
struct ladder_settings {
    ladder_kind kind = ladder_kind::spot;
    int steps = default_ladder_steps;
    std::vector<double> spot_shifts;  ///< spot and grid
    std::vector<double> vol_shifts;   ///< volatility and grid
    std::vector<long> days;           ///< time: calendar days ahead
    std::string axis_path;            ///< the field to change when a scenario cannot be priced
    smile_move smile = smile_move::sticky_strike;
};

/// One row: the scenario and the trade's value there, per unit and for the position.
struct ladder_row {
    scenario moved;
    scenario_value at;
    long days = 0;                                                    ///< time ladders
    double spot = 0;                                                  ///< the scenario's spot
    double volatility = 0;                                            ///< the scenario's volatility
    double pnl = 0;                                                   ///< value - today's value
    double position_pnl = 0, position_delta = 0, position_gamma = 0;  ///< x signed quantity
};

struct ladder_result {
    scenario_value today;
    premium_comparison against_price;  ///< today's value beside the price command's premium
    std::vector<ladder_row> rows;      ///< a grid: spot shift by spot shift, volatility shifts within
};

/// Value every scenario of the ladder; refuses a grid of more than max_grid_cells cells
/// and more than max_ladder_work node updates.
ladder_result run_ladder(const trade& t, const ladder_settings& settings);

}  // namespace hedgeleaf
