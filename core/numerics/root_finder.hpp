// Hedgeleaf numerics: a bracketing root finder.
//
// find_root is Brent's method (R. P. Brent, "Algorithms for Minimization
// without Derivatives", 1973, chapter 4): inverse quadratic interpolation and
// secant steps kept inside a shrinking bracket, falling back to bisection, so
// it always converges once the ends of the bracket have opposite signs. It is
// written here rather than taken from Boost so the core needs no host headers
// under Emscripten.
#pragma once

#include <functional>

namespace hedgeleaf {

/// Stopping rules for find_root.
struct root_options {
    double x_tolerance = 0;    ///< absolute width at which the bracket counts as closed (0 = machine precision)
    double f_tolerance = 0;    ///< stop as soon as |f(x)| <= this
    int max_iterations = 200;  ///< evaluations after the two ends
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

}  // namespace hedgeleaf
