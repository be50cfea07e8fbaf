// Hedgeleaf numerics: Brent's root finder (see root_finder.hpp).
#include "numerics/root_finder.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace hedgeleaf {

root_result find_root(const std::function<double(double)>& f, double lower, double upper, const root_options& options) {
    root_result out;
    double a = lower, b = upper;
    double fa = f(a), fb = f(b);
    out.f_lower = fa;
    out.f_upper = fb;
    const auto at = [&](double x, double fx, bool bracketed, bool converged) {
        out.x = x;
        out.fx = fx;
        out.bracketed = bracketed;
        out.converged = converged;
        return out;
    };
    if (!std::isfinite(fa) || !std::isfinite(fb)) return at(b, fb, false, false);
    if (fa == 0) return at(a, fa, true, true);
    if (fb == 0) return at(b, fb, true, true);
    if ((fa > 0) == (fb > 0)) return std::fabs(fa) < std::fabs(fb) ? at(a, fa, false, false) : at(b, fb, false, false);

    // b is the best estimate, c the other end of the bracket, a the previous b.
    double c = a, fc = fa;
    double d = b - a, e = d;
    const double eps = std::numeric_limits<double>::epsilon();
    int iterations = 0;
    bool converged = false;
    for (;;) {
        if ((fb > 0) == (fc > 0)) {
            c = a;
            fc = fa;
            d = e = b - a;
        }
        if (std::fabs(fc) < std::fabs(fb)) {
            a = b;
            b = c;
            c = a;
            fa = fb;
            fb = fc;
            fc = fa;
        }
        const double tol = 2 * eps * std::fabs(b) + 0.5 * options.x_tolerance;
        const double m = 0.5 * (c - b);
        if (std::fabs(m) <= tol || fb == 0 || std::fabs(fb) <= options.f_tolerance) {
            converged = true;
            break;
        }
        if (iterations >= options.max_iterations) break;
        if (std::fabs(e) >= tol && std::fabs(fa) > std::fabs(fb)) {
            // Interpolate: secant when only two points differ, inverse quadratic otherwise.
            double p, q;
            const double s = fb / fa;
            if (a == c) {
                p = 2 * m * s;
                q = 1 - s;
            } else {
                const double qa = fa / fc, r = fb / fc;
                p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
                q = (qa - 1) * (r - 1) * (s - 1);
            }
            if (p > 0)
                q = -q;
            else
                p = -p;
            // Accept the step only if it stays well inside the bracket and shrinks fast enough.
            if (2 * p < std::min(3 * m * q - std::fabs(tol * q), std::fabs(e * q))) {
                e = d;
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        } else {
            d = m;
            e = m;
        }
        a = b;
        fa = fb;
        b += std::fabs(d) > tol ? d : std::copysign(tol, m);
        fb = f(b);
        ++iterations;
        if (!std::isfinite(fb)) break;
    }
    out.iterations = iterations;
    return at(b, fb, true, converged);
}

}  // namespace hedgeleaf
