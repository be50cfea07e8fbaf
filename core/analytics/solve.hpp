// Hedgeleaf analytics: one unknown of the trade for a target (the solve command).
//
//   volatility  market.volatility giving a target net premium per unit
//               (implied volatility; also the volatility behind a competitor's quote);
//               with a smile, the parallel move of the whole smile; with solve.leg, that
//               leg's own volatility while the other legs keep theirs
//   strike      the strike of one leg giving a target net premium (0 = zero cost)
//   quantity    the number of units a premium budget buys
// Volatility and strike are searched with Brent's method (numerics/root_finder.hpp);
// the quantity is the budget over the net premium.
#pragma once

#include "contract/trade.hpp"
#include "numerics/root_finder.hpp"

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

enum class solve_unknown { volatility, strike, quantity };  // the order of contract/limits.hpp's solve_unknowns

/// The `solve` section, read and checked (commands/solve.hpp).
struct solve_settings {
    solve_unknown unknown = solve_unknown::volatility;
    double target_premium = 0;    ///< net premium per unit (volatility, strike)
    double lower = 0, upper = 0;  ///< the search range (volatility, strike)
    std::string lower_path = "solve.lower", upper_path = "solve.upper";
    std::size_t leg = 0;             ///< strike: which leg
    bool one_leg = false;            ///< volatility: solve.leg given, that leg's volatility alone
    double budget = 0;               ///< quantity
    std::optional<double> lot_size;  ///< quantity
};

/// Net premium per unit of `legs` (sum of quantity * leg premium) as the
/// solver prices it: European legs in closed form, American and Bermudan legs
/// on the lattice with `settings`, a stock leg at spot.
double solver_net_premium(const market_data& market, const std::vector<option_leg>& legs,
                          const lattice_settings& settings);

/// The search range of an implied volatility when the section gives none: from
/// 0.0001 (closed-form legs only) or 0.01 (any lattice leg) to the lattice's limit. With a
/// smile the range of the parallel move that keeps every leg's volatility in that range
/// (it may start below 0); for one leg (`leg`), that leg's volatility.
struct volatility_range {
    double lower = 0, upper = 0;
};
volatility_range default_volatility_range(const trade& t, std::optional<std::size_t> leg = std::nullopt);

/// One leg at the solution, priced as the solver prices it.
struct solved_leg {
    option_leg leg;
    double premium = 0;
    double volatility = 0;  ///< the volatility it is priced at
};

/// The solved strike rounded to the trade's strike_tick, and what the trade costs there.
struct rounded_strike {
    double strike = 0;
    double premium = 0;   ///< net premium per unit at the rounded strike
    double residual = 0;  ///< premium - target: what rounding leaves of a "zero-cost" trade
    std::vector<solved_leg> legs;
};

struct solve_result {
    double solution = 0;
    root_result root;              ///< the search (a quantity: x, fx, no iterations)
    std::vector<solved_leg> legs;  ///< every leg at the solution
    double residual = 0;           ///< premium at the solution - target, per unit
    double residual_position = 0;
    int evaluations = 0;        ///< prices of the whole trade
    double target_premium = 0;  ///< the quantity solve: budget / quantity
    double premium_at_solution = 0;
    double quantity = 0;            ///< units of the position at the solution
    double notional = 0;            ///< quantity x spot
    double position_premium = 0;    ///< signed by side
    bool within_tolerance = false;  ///< |residual x quantity| <= 1e-8 of notional
    std::string pricing;            ///< closed-form, lattice, or both
    /// The quantity solve with a lot size: whole lots and what is left of the budget.
    double quantity_in_lots = 0, premium_in_lots = 0, budget_left = 0;
    std::optional<rounded_strike> rounded;  ///< the strike solve with a strike_tick
    std::string solved_for;                 ///< "volatility", "parallel move of the smile", "legs[1] volatility", ...
    std::vector<std::string> notes;
};

/// Solve for the unknown. Throws input_error naming the field (for no solution: the
/// bound that was hit; for a target outside the no-arbitrage range: solve.target_premium).
solve_result run_solve(const trade& t, const solve_settings& settings);

}  // namespace hedgeleaf
