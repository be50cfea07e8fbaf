// Hedgeleaf core: a bracketing root finder and the `solve` command.
//
// find_root is Brent's method (R. P. Brent, "Algorithms for Minimization
// without Derivatives", 1973, chapter 4): inverse quadratic interpolation and
// secant steps kept inside a shrinking bracket, falling back to bisection, so
// it always converges once the ends of the bracket have opposite signs. It is
// written here rather than taken from Boost so the core needs no host headers
// under Emscripten.
//
// The `solve` section asks for one unknown of the trade:
//   "volatility"  market.volatility giving a target net premium per unit
//                 (implied volatility; also the volatility behind a competitor's quote)
//   "strike"      the strike of one leg giving a target net premium (0 = zero cost)
//   "quantity"    the number of units a premium budget buys
#pragma once

#include "trade.hpp"

#include <functional>

namespace hedgeleaf {

/// Stopping rules for find_root.
struct root_options {
    double x_tolerance = 0;     ///< absolute width at which the bracket counts as closed (0 = machine precision)
    double f_tolerance = 0;     ///< stop as soon as |f(x)| <= this
    int max_iterations = 200;   ///< evaluations after the two ends
};

/// Outcome of find_root.
struct root_result {
    bool bracketed = false;  ///< f(lower) and f(upper) had opposite signs (or one was 0)
    bool converged = false;  ///< stopped by a tolerance, not by max_iterations
    double x = 0;            ///< best estimate of the root
    double fx = 0;           ///< f(x)
    int iterations = 0;      ///< evaluations of f after the two ends
    double f_lower = 0;      ///< f(lower)
    double f_upper = 0;      ///< f(upper)
};

/// Brent's method on [lower, upper]. Never throws for an unbracketed root:
/// it returns bracketed = false with f at both ends so the caller can say
/// which bound was hit. Exceptions thrown by f pass through.
root_result find_root(const std::function<double(double)>& f, double lower, double upper,
                      const root_options& options = {});

/// Net premium per unit of `legs` (sum of quantity * leg premium) as the
/// solver prices it: European legs in closed form, American and Bermudan legs
/// on the lattice with `settings`, a stock leg at spot.
double solver_net_premium(const market_data& market, const std::vector<option_leg>& legs,
                          const lattice_settings& settings);

/// The `solve` command: reads the trade's `solve` section and returns the
/// solution, the residual and the iteration count. Throws input_error naming
/// the field (for no solution: the bound that was hit).
json solve_json(const trade& t);

}  // namespace hedgeleaf
