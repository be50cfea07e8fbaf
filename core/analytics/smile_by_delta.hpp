// Hedgeleaf analytics: a currency smile quoted by delta, turned into a strike grid.
//
// Currency desks exchange a smile per expiry as the at-the-money volatility and, at 25 and
// (optionally) 10 delta, a risk reversal RR (call volatility minus put volatility) and a
// butterfly BF (the wings' average over at-the-money). Read here the simple way, the "smile
// strangle" (common practice; Reiswich and Wystup, "A Guide to FX Options Quoting
// Conventions", Journal of Derivatives 18(2), 2010, from memory):
//   call wing  sigma_C = ATM + BF + RR / 2,    put wing  sigma_P = ATM + BF - RR / 2.
// (Brokers' "market strangle" butterflies, which need a second solve, are not read.)
// At-the-money is the delta-neutral straddle in the trade's delta convention: call delta +
// put delta = 0, so K = F exp(+sigma^2 T / 2) for the spot and forward deltas and
// K = F exp(-sigma^2 T / 2) for the premium-adjusted ones (same source). Each wing's strike
// is the one whose delta in the trade's convention is +-0.25 (or +-0.10) at that wing's own
// volatility (analytics/currency.hpp). The points of every expiry go into one grid written in
// percent of the forward: each expiry's row is read along the strike by the smile's own
// interpolation (monotone cubic in log moneyness, flat beyond its outer points) at the union
// of all expiries' moneyness columns.
#pragma once

#include "contract/smile.hpp"
#include "contract/trade.hpp"

#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

/// One expiry's quotes, decimals (0.075 = 7.5 %).
struct delta_quote {
    double expiry_years = 0;
    double atm = 0;
    double rr25 = 0, bf25 = 0;
    std::optional<double> rr10, bf10;  ///< both or neither
};

/// The two wing volatilities a risk reversal and a butterfly give around `atm`.
struct wing_volatilities {
    double call = 0;  ///< atm + bf + rr / 2
    double put = 0;   ///< atm + bf - rr / 2
};
wing_volatilities wings_of(double atm, double rr, double bf);

/// The delta-neutral straddle's strike in `convention` for forward `forward`, volatility
/// `volatility` and `years` to expiry.
double atm_strike(double forward, double volatility, double years, delta_convention convention);

/// The points of one expiry's quotes, in increasing strike. `expiry_market` is the lattice
/// market of that expiry (analytics/currency.hpp settle_currency_market; its smile is
/// ignored). `path` is the quote's JSON path: a wing with no strike, or wings out of order,
/// fail naming its rr/bf field.
delta_smile_row smile_row_of(const market_data& expiry_market, const delta_quote& quote, delta_convention convention,
                             const std::string& path);

/// The grid in percent of the forward holding every row's points (see the file header).
smile_grid grid_of_rows(const std::vector<delta_smile_row>& rows, double spot);

}  // namespace hedgeleaf
