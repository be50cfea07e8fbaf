// Hedgeleaf contract: a volatility smile, implied volatilities by expiry and strike.
//
// The grid holds implied volatilities (decimals) at expiries (years from valuation) and
// strikes written in one basis: percent of spot (90 = 90 % of spot, the default), percent of
// the forward to that expiry, or absolute price units. Between grid points (common practice
// on equity desks):
//   - along the strike, a monotone cubic (Fritsch-Carlson, the "PCHIP" of numerical
//     libraries) through the volatilities against the logarithm of the strike coordinate, so
//     the smile never overshoots between two quoted strikes; flat beyond the first and the
//     last strike;
//   - along time, total variance (volatility^2 x years) linear at a fixed strike coordinate
//     (fixed moneyness in the grid's basis), so the forward variance is constant between two
//     expiries; the first expiry's volatility before it and the last's after it.
// A point outside the grid's strikes or expiries is reported as held flat ("extrapolated").
// The reader (commands/market_reader) checks the grid; analytics/smile_checks refuses
// calendar and butterfly arbitrage.
#pragma once

#include <cstddef>
#include <vector>

namespace hedgeleaf {

/// How the grid's strikes are written (contract/limits.hpp: strike_bases, in this order).
enum class strike_basis { percent_of_spot, percent_of_forward, absolute };

/// The grid as given, after validation.
struct smile_grid {
    std::vector<double> expiries;           ///< years from valuation, strictly increasing
    std::vector<double> strikes;            ///< strictly increasing, > 0, in the basis' units
    std::vector<std::vector<double>> vols;  ///< vols[i][j]: expiry i, strike j; decimals
    strike_basis basis = strike_basis::percent_of_spot;
    double spot = 0;  ///< the market's spot when the grid was given (absolute strikes move with it)

    friend bool operator==(const smile_grid&, const smile_grid&) = default;
};

/// A volatility read off the smile and whether it lies beyond the grid.
struct smile_point {
    double volatility = 0;
    bool beyond_strikes = false;   ///< strike outside the grid's strikes: the edge strike's volatility
    bool beyond_expiries = false;  ///< before the first or after the last expiry: that expiry's
    bool extrapolated() const { return beyond_strikes || beyond_expiries; }
};

class volatility_smile {
public:
    /// A smile on a validated grid (at least one expiry and one strike, rows as long as strikes).
    explicit volatility_smile(smile_grid grid);

    const smile_grid& grid() const { return grid_; }
    /// The volatility at strike coordinate `x` (in the basis' units) and `years` from valuation.
    smile_point at(double x, double years) const;
    /// Expiry row `i` read at strike coordinate `x` (monotone cubic in log x, flat beyond).
    double row_at(std::size_t i, double x) const;
    /// The same grid (the rest is derived from it).
    friend bool operator==(const volatility_smile& a, const volatility_smile& b) { return a.grid_ == b.grid_; }

private:
    smile_grid grid_;
    std::vector<double> log_strikes_;
    std::vector<std::vector<double>> slopes_;  // per row: d vol / d log x at each strike
};

}  // namespace hedgeleaf
