// Hedgeleaf analytics: the hedge schedule along one spot path (the hedge command).
//
// The schedule is the replicating portfolio run through time: on each
// rebalancing date the trade is re-priced with its remaining time, the hedge is
// moved to the new delta in shares, and the rest sits in cash earning the
// trade's rate. Nothing enters or leaves after the start except what the trade
// itself pays: the portfolio starts as the premium and ends beside the payoff;
// the gap is the replication (tracking) error.
//
// Views: per-unit columns are the portfolio that replicates ONE unit of the
// trade as written (legs with their signed quantities, held long). The desk
// that sold the client the trade owes it and holds signed_quantity times that
// portfolio (columns starting desk_); a client sale (side "sell") flips the sign.
#pragma once

#include "analytics/schedule.hpp"
#include "analytics/tree.hpp"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

// In the order of their words in contract/limits.hpp (path_kinds, stress_shapes).
enum class path_kind { scenario, spots, lattice, stress };
enum class stress_shape { rise, fall, gap_down };

/// Where spot goes.
struct path_spec {
    path_kind kind = path_kind::scenario;
    std::vector<double> spots;  ///< spots: one per rebalancing date after valuation
    std::vector<int> moves;     ///< lattice: 1 = up, 0 = down
    double drift = 0;           ///< scenario: growth rate of spot a year (default market.rate)
    double volatility = 0;      ///< scenario: realised volatility (default market.volatility)
    std::uint64_t seed = 1;     ///< scenario
    stress_shape shape = stress_shape::fall;
    double change = default_stress_change;  ///< stress: total rise/fall by the final date, or the gap size
    double gap_years = 0;                   ///< stress gap-down: when spot gaps, years from valuation
};

/// The `hedge` section, read and checked (commands/hedge.hpp).
struct hedge_settings {
    rebalance_spec rebalance;
    bool rebalance_given = false;
    path_spec path;
    double cost_bp = 0;
    int lattice_steps = default_hedge_lattice_steps;
    tree_spec tree;
};

/// What one share earns over (from_years, to_years]: cash dividends paid in it, grown at
/// the rate to `to_years`, plus the carry yield on the diffusing spot s_diffusing.
double share_income(const market_data& m, double s_diffusing, double from_years, double to_years);

/// The trade's market and one leg as seen `years` later with spot `spot`
/// (dividends and exercise dates before then dropped, times shifted).
market_data market_at(const market_data& m, double spot, double years);
option_leg leg_at(const option_leg& leg, double years);

/// Value and delta of one leg, per unit of the leg: closed form for European
/// legs, the trade's lattice method with `steps` steps otherwise.
struct leg_mark {
    double value = 0;
    double delta = 0;
};
leg_mark mark_leg(const market_data& m, const option_leg& leg, lattice_method method, int steps);

/// One row of the schedule (per unit unless named desk_).
struct hedge_row {
    double years = 0;  ///< from valuation
    std::optional<date> day;
    std::string event;  ///< start, rebalance, exercise, leg expiry (a leg ends before the trade), expiry
    double spot = 0;
    double option_value = 0;      ///< legs still running after today's payments (last row: payoff or exercise value)
    double paid = 0;              ///< paid to the holder today by legs ending before the last row
    std::optional<double> delta;  ///< target shares (none on the last row)
    double shares_held = 0;       ///< after today's trade
    double shares_traded = 0;     ///< + buy, - sell
    double trade_cash_flow = 0;   ///< -shares_traded * spot
    double cash = 0;              ///< cash account after trade, costs and payments
    double interest = 0;          ///< on the cash account since the previous row
    double dividends = 0;         ///< earned by the shares held since the previous row (dividends, carry yield)
    double cost = 0;              ///< transaction cost of today's trade
    double portfolio_value = 0;   ///< shares_held * spot + cash
    double tracking_error = 0;    ///< portfolio_value - option_value
    double desk_shares = 0;       ///< signed_quantity * shares_held
    double desk_pnl = 0;          ///< desk hedge + desk's side of the trade (costs by |quantity|)
};

struct hedge_totals {
    double premium = 0;
    double payoff = 0;  ///< payoff at expiry or the exercise value
    double portfolio_value = 0;
    double replication_error = 0;
    double shares_traded = 0;  ///< sum of |shares traded|
    double costs = 0;
    double interest = 0;
    double dividends = 0;
    double paid = 0;  ///< paid before the last row
    std::string end_event;
};

struct hedge_schedule {
    std::vector<hedge_row> rows;
    hedge_totals totals;
    std::vector<std::string> notes;
    premium_comparison against_price;  ///< the starting value beside the price command's premium
};

/// The schedule of `t` under `settings`.
hedge_schedule run_hedge(const trade& t, const hedge_settings& settings);

}  // namespace hedgeleaf
