// Hedgeleaf core: the `hedge` section and the hedge schedule along one spot path.
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

#include "dates.hpp"
#include "trade.hpp"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

/// Most rebalancing dates in one schedule (about eight years of business days).
inline constexpr std::size_t max_rebalancing_dates = 2000;
/// Transaction costs above this (basis points of traded notional) are a typo.
inline constexpr double max_cost_bp = 1000;
/// Lattice steps for re-pricing American and Bermudan legs on each date, by default.
inline constexpr int default_hedge_lattice_steps = 151;

enum class rebalance_unit { days, weeks, months };

/// When the hedge is rebalanced.
struct rebalance_spec {
    int every = 1;                               ///< every N units
    rebalance_unit unit = rebalance_unit::weeks;  ///< days = business days; weeks, months roll to Mon-Fri
    std::vector<double> times;                    ///< explicit dates (years from valuation), if given
    bool explicit_times = false;
};

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
    double change = 0.2;        ///< stress: total rise/fall by the final date, or the gap size
    double gap_time = 0;        ///< stress gap-down: years from valuation
};

/// The tree view's size and window (read here because the page keeps it in `hedge`).
struct tree_spec {
    int steps = 0;      ///< 0 = the lattice path's move count, else default_tree_steps
    int from_step = 0;
    int to_step = -1;   ///< -1 = as far as the node cap allows
};

struct hedge_settings {
    rebalance_spec rebalance;
    bool rebalance_given = false;
    path_spec path;
    double cost_bp = 0;
    int lattice_steps = default_hedge_lattice_steps;
    tree_spec tree;
};

/// Read and validate the trade's `hedge` section (all fields optional).
hedge_settings read_hedge_settings(const trade& t);
/// Read a {every, unit} or {dates} / {years} object at `path`.
rebalance_spec read_rebalance(const json& node, const std::string& path, const trade& t);

/// One schedule date.
struct schedule_date {
    double time = 0;            ///< years from valuation
    std::optional<date> day;    ///< calendar date when the trade has a valuation_date
};

/// Valuation, the rebalancing dates strictly before the final expiry, every leg
/// expiry and Bermudan exercise date, and the final expiry; sorted, no repeats.
/// Without a valuation_date: a business day counts 7/5 calendar days, a month 1/12 year.
std::vector<schedule_date> schedule_dates(const trade& t, const rebalance_spec& spec, const std::string& path);

/// What one share earns over (from, to]: cash dividends paid in it, grown at the
/// rate to `to`, plus the carry yield on the diffusing spot s_diffusing.
double share_income(const market_data& m, double s_diffusing, double from, double to);

/// The trade's market and one leg as seen `t` years later with spot `spot`
/// (dividends and exercise dates before t dropped, times shifted).
market_data market_at(const market_data& m, double spot, double t);
option_leg leg_at(const option_leg& leg, double t);

/// Value and delta of one leg, per unit of the leg: closed form for European
/// legs, the trade's lattice method with `steps` steps otherwise.
struct leg_mark {
    double value = 0;
    double delta = 0;
};
leg_mark mark_leg(const market_data& m, const option_leg& leg, lattice_method method, int steps);

/// One row of the schedule (per unit unless named desk_).
struct hedge_row {
    double time = 0;
    std::optional<date> day;
    std::string event;          ///< start, rebalance, exercise, leg expiry (a leg ends before the trade), expiry
    double spot = 0;
    double option_value = 0;    ///< legs still running after today's payments (last row: payoff or exercise value)
    double paid = 0;            ///< paid to the holder today by legs ending before the last row
    std::optional<double> delta;  ///< target shares (none on the last row)
    double shares_held = 0;     ///< after today's trade
    double shares_traded = 0;   ///< + buy, - sell
    double trade_cash_flow = 0; ///< -shares_traded * spot
    double cash = 0;            ///< cash account after trade, costs and payments
    double interest = 0;        ///< on the cash account since the previous row
    double dividends = 0;       ///< earned by the shares held since the previous row (dividends, carry yield)
    double cost = 0;            ///< transaction cost of today's trade
    double portfolio_value = 0; ///< shares_held * spot + cash
    double tracking_error = 0;  ///< portfolio_value - option_value
    double desk_shares = 0;     ///< signed_quantity * shares_held
    double desk_pnl = 0;        ///< desk hedge + desk's side of the trade (costs by |quantity|)
};

struct hedge_totals {
    double premium = 0;
    double payoff = 0;            ///< payoff at expiry or the exercise value
    double portfolio_value = 0;
    double replication_error = 0;
    double shares_traded = 0;     ///< sum of |shares traded|
    double costs = 0;
    double interest = 0;
    double dividends = 0;
    double paid = 0;              ///< paid before the last row
    std::string end_event;
};

struct hedge_schedule {
    std::vector<hedge_row> rows;
    hedge_totals totals;
    std::vector<std::string> notes;
};

/// Build the schedule of `t` under `settings`.
hedge_schedule build_hedge(const trade& t, const hedge_settings& settings);
/// The `hedge` command's JSON: rows, totals, the desk's view and the notes.
json hedge_result_json(const trade& t, const hedge_settings& settings, const hedge_schedule& schedule);
json hedge_command(const trade& t);

}  // namespace hedgeleaf
