// Hedgeleaf analytics: the client's own figures at expiry, at the price the client deals at.
//
// Break-evens, the best and worst outcome, where losses stop as spot falls (the
// protection) and where gains stop as it rises (the cap), and the outcome at a few
// spot levels: for the client's side of the trade, after the client's price (the
// offer when buying, the bid when selling), not the desk's mid. A put bought at
// the offer breaks even lower than one bought at the mid.
//
// Shares the client already holds are added to the trade's payoff for these
// figures (their change in value from today's spot) and never to its price.
// Figures are per unit of the trade and in total (x quantity); the holding per
// unit is the shares held / quantity. Legs expiring after the first expiry are
// valued there as in the profile (analytics/profile.hpp).
#pragma once

#include "analytics/client_price.hpp"
#include "analytics/profile.hpp"

#include <optional>
#include <vector>

namespace hedgeleaf {

/// The client's outcome at one spot level at the first expiry; "total" figures are for the
/// whole quantity, signed for the client (+ the client gains).
struct client_outcome {
    double spot = 0;
    double spot_change = 0;                ///< spot / today's spot - 1
    double payoff = 0;                     ///< what the trade pays the client in total (negative: the client pays)
    double pnl = 0;                        ///< payoff after the client price, in total
    double pnl_per_unit = 0;               ///< the same per unit of the trade
    double holding_pnl = 0;                ///< the holding's change in value: shares x (spot - today's spot)
    double pnl_with_holding = 0;           ///< pnl + holding_pnl
    double pnl_with_holding_per_unit = 0;  ///< the same per unit of the trade
};

/// Where the client's position stops losing as spot falls: below `from`, down to `down_to`
/// (none: all the way down).
struct protection_span {
    double from = 0;
    std::optional<double> down_to;
};

/// The client's figures of one trade at the client price.
struct client_outcomes {
    double horizon_years = 0;     ///< the first expiry
    bool one_expiry = true;       ///< every leg ends at the horizon: the payoff is piecewise linear
    double holding_per_unit = 0;  ///< shares held per unit of the trade
    break_evens alone;            ///< the trade alone, after the client price
    break_evens with_holding;     ///< the trade with the holding (empty without one)
    /// With one expiry, of the trade with the holding (alone without one); none = unbounded.
    std::optional<double> best_per_unit, worst_per_unit;
    std::optional<protection_span> protection;  ///< none where losses never stop
    std::optional<double> cap;                  ///< none where gains never stop
    std::vector<double> kinks;                  ///< the strikes, where the payoff at expiry turns
};

/// The client's figures of `t` dealt at `price` with `holding_shares` held.
client_outcomes outcomes_for_client(const trade& t, const client_price& price, double holding_shares);

/// The client's outcome at each of `spots` (at the first expiry), for `outcomes` of the same trade.
std::vector<client_outcome> outcomes_at(const trade& t, const client_price& price, const client_outcomes& outcomes,
                                        const std::vector<double>& spots);

/// The price command's settings: the `quote` section, if the trade has one.
struct price_settings {
    std::optional<quote_terms> quote;
};

/// The price command's result.
struct price_result {
    trade_result priced;                    ///< with vega and rho by re-pricing
    std::optional<client_price> quote;      ///< with a quote section
    std::optional<client_outcomes> client;  ///< with a quote section: the client's figures at expiry
    std::vector<client_outcome> outcomes;   ///< with a quote section: at spot moved by default_outcome_moves
};

/// Price the trade (bumped Greeks on) and, with a quote section, the client price and the
/// client's figures at expiry at that price.
price_result run_price(const trade& t, const price_settings& settings);

/// Today's spot moved by each of default_outcome_moves: the outcome table's spots when none are given.
std::vector<double> default_outcome_spots(double spot);

}  // namespace hedgeleaf
