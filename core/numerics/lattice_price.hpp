// Hedgeleaf numerics: a leg's price from two lattices (Richardson), with its Greeks.
#pragma once

#include "contract/trade.hpp"
#include "numerics/closed_form.hpp"

namespace hedgeleaf {

/// A lattice price with Greeks and an error estimate.
struct lattice_price {
    double premium = 0;
    greeks sensitivities;       ///< delta, gamma, theta from the lattice; vega, rho by bumps (or 0)
    double error_estimate = 0;  ///< |extrapolated - fine| (or the estimated error of the fine leg)
    int steps = 0;              ///< fine steps
    int coarse_steps = 0;       ///< steps of the second Richardson leg
    bool extrapolated = false;
};

/// Bump sizes for the sensitivities taken by re-pricing (docs/replication.md, sensitivities).
inline constexpr double vega_bump = 0.005;  ///< +-0.5 volatility point (halved below vol 0.01)
inline constexpr double rho_bump = 0.0005;  ///< +-5 basis points

/// Whether vega and rho are measured, by re-pricing at bumped volatility and rate (four
/// more prices), or left 0 (ladders, schedules, searches: the lattice's own Greeks only).
enum class bumped_greeks { off, on };

/// Price one leg: a fine and a coarse lattice, Richardson extrapolation when the settings
/// ask for it, delta, gamma and theta from the lattice, vega and rho by central
/// differences when `bumps` is on.
lattice_price price_leg(const market_data& market, const option_leg& leg, const lattice_settings& settings,
                        bumped_greeks bumps = bumped_greeks::off);

}  // namespace hedgeleaf
