// Hedgeleaf analytics: pricing a whole trade (one option or several legs).
#pragma once

#include "contract/trade.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/lattice_price.hpp"

#include <vector>

namespace hedgeleaf {

struct leg_result {
    option_leg leg;
    lattice_price lattice;  ///< per unit of the leg (quantity not applied)
    valuation reference;    ///< closed-form European value, per unit of the leg
};

/// Shares and cash that replicate the trade today: shares * spot + cash = value.
struct replicating_portfolio {
    double spot = 0;
    double shares = 0;
    double cash = 0;
    double value = 0;
};

struct trade_result {
    double premium = 0;                 ///< net per unit (sum of leg quantity * leg premium)
    greeks sensitivities;               ///< net per unit
    valuation reference;                ///< net closed-form European reference
    double early_exercise_premium = 0;  ///< premium - reference (American/Bermudan legs)
    bool has_early_exercise = false;
    double error_estimate = 0;  ///< sum of |leg quantity| * leg error estimate
    lattice_method method = lattice_method::leisen_reimer;
    int steps = 0;
    int coarse_steps = 0;
    bool extrapolated = false;
    replicating_portfolio replication;  ///< per unit
    std::vector<leg_result> legs;
};

/// Price every leg on its own lattice (each centred on its strike) and sum them; vega and
/// rho by re-pricing when `bumps` is on (the price command), else left 0 (ladders, quotes);
/// the error bound when `estimate` is on (the price command).
trade_result price_trade(const trade& t, bumped_greeks bumps, error_bound estimate = error_bound::off);

/// One trade, one premium: another card's value of the trade today (hedge schedule, ladder,
/// tree: each on its own, often coarser, lattice) beside the price command's premium.
struct premium_comparison {
    double price_premium = 0;  ///< the price command's premium (the trade's lattice settings)
    double card_premium = 0;   ///< the card's own value of the trade today, same spot
    double difference() const { return card_premium - price_premium; }
};
/// Price `t` as the price command does (without bumps or error bound) beside `card_premium`.
premium_comparison compare_with_price(const trade& t, double card_premium);

}  // namespace hedgeleaf
