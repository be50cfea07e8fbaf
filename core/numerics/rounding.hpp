// Hedgeleaf numerics: rounding a figure for display without losing its scale.
#pragma once

#include <cmath>

namespace hedgeleaf {

/// `x` rounded to `digits` significant digits: 1.1000000000000001 -> 1.1, and the same for
/// 1.1e-6 or 1.1e9 (a fixed number of decimals would wipe out small price levels). Zero,
/// infinities and NaN come back unchanged, as does a figure too small to scale.
inline double round_significant(double x, int digits = 12) {
    if (x == 0 || !std::isfinite(x)) return x;
    const double scale = std::pow(10.0, digits - 1 - std::floor(std::log10(std::fabs(x))));
    if (!std::isfinite(scale) || !std::isfinite(x * scale)) return x;
    return std::round(x * scale) / scale + 0.0;
}

}  // namespace hedgeleaf
