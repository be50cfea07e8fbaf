// Hedgeleaf analytics: currency options as currency desks quote them (docs/currency.md).
//
// The lattice prices a currency option unchanged (Garman and Kohlhagen 1983: the foreign rate
// plays the part of a dividend yield). Its time is the volatility time, trade date to expiry
// (ACT/365F); its flat effective rate r and carry q are chosen so that exp(-r T) is the domestic
// discount factor from the delivery date back to the premium date and S exp((r - q) T) is the
// outright forward for the delivery date (spot date to delivery date on both curves). A European
// lattice price then converges to D x Black(F, K, sigma sqrt T): the convention of Clark,
// Foreign Exchange Option Pricing: A Practitioner's Guide (Wiley 2011), chapter 1, and of
// Reiswich and Wystup, "A Guide to FX Options Quoting Conventions", Journal of Derivatives
// 18(2), 2010 (both from memory).
#pragma once

#include "contract/trade.hpp"

#include <string>

namespace hedgeleaf {

/// Fill `terms.forward`, `terms.discount` and `terms.volatility_years` from its dates and
/// curves, and return `quoted` (spot, volatility, smile) with the lattice's flat effective
/// rate and carry in place of its curves (no borrow, no dividends).
market_data settle_currency_market(const market_data& quoted, currency_terms& terms);

/// Forward points in pips: (forward - spot) / pip.
double forward_points(const currency_terms& terms, double spot);

/// The pieces of a currency premium: spot, the forward and the domestic discount factor.
struct forward_view {
    double spot = 0;
    double forward = 0;
    double discount = 1;
};
/// The view of a lattice market to `years` (its forward and its discount factor).
forward_view forward_view_of(const market_data& lattice_market, double years);

/// A delta in `convention` from a value V (domestic per unit of foreign) and its spot delta
/// dV/dS: forward dV/dS x S / (D F); spot premium-adjusted dV/dS - V / S; forward
/// premium-adjusted the forward delta - V / (D F) (Reiswich and Wystup 2010, from memory).
double delta_in(delta_convention convention, double value, double spot_delta, const forward_view& f);

/// A premium V (domestic per unit of foreign) written in `convention` (contract/currency.hpp);
/// `strike` is needed by percent_of_domestic and foreign_pips only.
double premium_in(premium_convention convention, double value, double spot, double strike, double pip);
/// The inverse of premium_in: domestic per unit of foreign from a premium written in `convention`.
double premium_from(premium_convention convention, double written, double spot, double strike, double pip);

/// The delta of `leg` (a call or a put, as a European option at its own volatility on the
/// smile) in `convention`.
double leg_delta_in(const market_data& lattice_market, const option_leg& leg, delta_convention convention);

/// The strike at which `leg` (a call or a put) has `delta` in `convention`. A premium-adjusted
/// call's delta rises and then falls with the strike: the strike is taken on the falling
/// branch, above the strike of the highest delta (Reiswich and Wystup 2010, from memory).
/// Throws input_error naming `path` when no strike has that delta.
double strike_for_currency_delta(const market_data& lattice_market, option_leg leg, delta_convention convention,
                                 double delta, const std::string& path);

}  // namespace hedgeleaf
