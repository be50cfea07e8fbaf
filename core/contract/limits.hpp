// Hedgeleaf contract: every limit and every word list the engine accepts, in one place.
//
// The readers (core/commands) check inputs against these, the analytics hold their
// loops to them, and core/commands/vocabulary.cpp hands them to the page, the module
// and the tests (tests/vocabulary_check.py holds schema/trade.schema.json and
// wasm/hedgeleaf.d.ts to them). Units as in the trade file: prices per share,
// volatility and rates as decimals a year, times in years.
#pragma once

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

namespace hedgeleaf {

// ---- words ---------------------------------------------------------------

/// `option.type`: what a single option (or a structure's leg) pays.
inline const std::vector<std::string> option_types = {"call", "put", "digital-call", "digital-put"};
/// `legs[i].type`: the option types and a share held.
inline const std::vector<std::string> leg_types = {"call", "put", "digital-call", "digital-put", "stock"};
/// `exercise` of an option or a leg.
inline const std::vector<std::string> exercise_styles = {"european", "american", "bermudan"};
/// `structure.exercise`: Bermudan options are given as legs.
inline const std::vector<std::string> structure_exercise_styles = {"european", "american"};
/// `lattice.method`.
inline const std::vector<std::string> lattice_methods = {"crr", "jarrow-rudd", "tian", "leisen-reimer"};
/// `side`: the client's side.
inline const std::vector<std::string> sides = {"buy", "sell"};
/// `quote.margin_type`.
inline const std::vector<std::string> margin_types = {"absolute", "fraction_of_premium", "volatility"};
/// `solve.for`.
inline const std::vector<std::string> solve_unknowns = {"volatility", "strike", "quantity"};
/// `ladder.kind`.
inline const std::vector<std::string> ladder_kinds = {"spot", "volatility", "time", "grid"};
/// `hedge.path.kind`.
inline const std::vector<std::string> path_kinds = {"scenario", "spots", "lattice", "stress"};
/// `hedge.path.shape` of a stress path.
inline const std::vector<std::string> stress_shapes = {"rise", "fall", "gap-down"};
/// `unit` of a rebalancing frequency.
inline const std::vector<std::string> rebalance_units = {"days", "weeks", "months"};
/// `market.volatility.strike_basis`: how a smile's strikes are written.
inline const std::vector<std::string> strike_bases = {"percent_of_spot", "percent_of_forward", "absolute"};
/// The keys of a strike written as an object: {"percent_of_spot": 95}, {"delta": -0.25}, ...
inline const std::vector<std::string> strike_forms = {"percent_of_spot", "percent_of_forward", "delta"};
/// `ladder.smile`: how the smile moves when spot moves.
inline const std::vector<std::string> smile_moves = {"sticky-strike", "sticky-moneyness"};
/// Sections of the trade document each read by its own command.
inline const std::vector<std::string> command_sections = {"quote", "hedge", "simulate", "solve", "ladder", "profile"};
/// `underlying.kind`: what the trade is written on (equity: a share or an index, the default).
inline const std::vector<std::string> underlying_kinds = {"equity", "currency_pair"};
/// `conventions.premium` of a currency pair (docs/currency.md), in the order of premium_convention.
inline const std::vector<std::string> premium_conventions = {
    "domestic_per_foreign", "domestic_pips", "percent_of_foreign", "percent_of_domestic", "foreign_pips"};
/// `conventions.delta` of a currency pair, in the order of delta_convention.
inline const std::vector<std::string> delta_conventions = {"spot", "forward", "spot_premium_adjusted",
                                                           "forward_premium_adjusted"};
/// Day counts and compoundings of a money-market rate (`market.domestic_rate.day_count`, ...).
inline const std::vector<std::string> day_counts = {"ACT/360", "ACT/365"};
inline const std::vector<std::string> compoundings = {"simple", "annual", "continuous"};
/// The top-level key of a comparison document (several trades side by side, read by `compare`).
inline const std::string comparison_key = "comparison";
// The structure shapes live in their table (contract/structures.hpp); the commands in
// theirs (dispatch/command_table.hpp).

/// The word for a value of an enum whose values follow `words` in order.
template <class Enum>
const std::string& word_of(const std::vector<std::string>& words, Enum value) {
    return words[static_cast<std::size_t>(value)];
}
/// The enum value for `word`, which must be one of `words` (readers check it first).
template <class Enum>
Enum enum_of(const std::vector<std::string>& words, const std::string& word) {
    std::size_t i = 0;
    while (i + 1 < words.size() && words[i] != word) ++i;
    return static_cast<Enum>(i);
}

// ---- the document --------------------------------------------------------

inline constexpr std::size_t max_document_bytes = 1 << 20;  ///< 1 MiB of trade document text
inline constexpr int max_document_depth = 64;               ///< nesting of objects and lists
inline constexpr std::size_t max_date_chars = 40;           ///< valuation_date text, before it is parsed
inline constexpr int min_year = 1900;                       ///< dates are years 1900..2200
inline constexpr int max_year = 2200;
inline constexpr int max_tenor_count = 18250;      ///< "18250d": fifty years of days
inline constexpr std::size_t max_tenor_chars = 6;  ///< "18250d"

// ---- market and trade ----------------------------------------------------

/// Spot, a typed strike, a payout, a path's spots: outside [min, max] a price level is a typo, not a
/// trade. Inside it every figure scales with the price level (the lattice, the Greeks and the
/// rounding work in relative terms), so a spot of 1e-6 prices like one of 1 with the strike scaled.
inline constexpr double min_price_level = 1e-6;
inline constexpr double max_price_level = 1e9;
/// Spots a scenario may reach (ladders, profiles, hedge paths): today's highest spot moved up
/// by the largest spot shift.
inline constexpr double max_scenario_level = 5e9;
/// A tick (quote.tick, strike_tick) smaller than this fraction of spot is below any market's
/// resolution and would overflow the rounding (price / tick).
inline constexpr double min_tick_fraction = 1e-9;
/// A lot (solve.lot_size) smaller than this many units is a typo.
inline constexpr double min_lot_size = 1e-6;
/// 0.1 % a year: below it a lattice's up and down moves differ by less than rounding.
inline constexpr double min_volatility = 1e-3;
inline constexpr double max_abs_rate = 1.0;    ///< rate, carry yield, drift: +-100 % a year, negative allowed
inline constexpr double max_volatility = 5.0;  ///< 500 % a year
/// The widest spread of log-spot a lattice holds: volatility x sqrt(years to the
/// last expiry). Beyond about 26 the spots that carry a call's value lie past
/// e^500 from spot, where a double-precision lattice clamps them; 20 keeps a
/// margin (it is 283 % a year over 5 years, or 63 % over 100).
inline constexpr double max_spread = 20.0;
inline constexpr double max_expiry_years = 50.0;
/// Times closer than this (years; far below a second) are the same date: schedule dates,
/// exercise and dividend dates on a lattice's time grid.
inline constexpr double time_tolerance_years = 1e-9;
inline constexpr double max_quantity = 1e12;  ///< units of a trade, of a leg, of a lot
inline constexpr std::size_t max_dividends = 200;
inline constexpr std::size_t max_exercise_dates = 2000;
inline constexpr std::size_t max_legs = 12;
inline constexpr int max_lattice_steps = 50000;

// ---- smile, curves, strikes and the market snapshot -----------------------

inline constexpr std::size_t max_smile_expiries = 30;  ///< rows of a volatility grid
inline constexpr std::size_t max_smile_strikes = 41;   ///< columns of a volatility grid
inline constexpr std::size_t max_curve_points = 100;   ///< points of a rate, yield or borrow curve
inline constexpr double max_strike_percent = 1000;     ///< a strike of ten times spot or forward
inline constexpr std::size_t max_table_cells = 5000;   ///< cells of a pasted table (CSV or tab-separated)
inline constexpr std::size_t max_underlying_chars = 80;
inline constexpr std::size_t max_as_of_chars = 40;
inline constexpr int default_spot_lag_days = 2;  ///< business days from trade to spot (common practice)
inline constexpr int max_spot_lag_days = 5;
inline constexpr double max_pip_size = 1.0;         ///< a pip of a whole unit of the quote currency
inline constexpr int default_lattice_steps = 1601;  // chosen from bench/accuracy_bench (docs/performance.md)

// ---- quote ---------------------------------------------------------------

inline constexpr double max_margin_fraction = 1.0;        ///< a margin of the whole premium on each side
inline constexpr double max_volatility_margin = 0.5;      ///< fifty volatility points
inline constexpr std::size_t max_client_name_chars = 80;  ///< printed on the sheet
inline constexpr std::size_t max_notes_chars = 500;
inline constexpr std::size_t max_label_chars = 60;     ///< a trade's short name on sheets and in comparisons
inline constexpr std::size_t max_preparer_chars = 80;  ///< the preparer's name on the sheet
inline constexpr std::size_t max_contact_chars = 120;  ///< the desk's telephone or e-mail on the sheet
inline constexpr std::size_t max_datetime_chars = 40;  ///< quote.indicative_until text, before it is parsed

// ---- comparison ----------------------------------------------------------

inline constexpr std::size_t max_alternatives = 4;    ///< trades side by side in one comparison
inline constexpr std::size_t max_title_chars = 120;   ///< a comparison's title
inline constexpr std::size_t max_outcome_spots = 12;  ///< spot levels of the client's outcome table
/// The outcome table's spot levels when none are given: moves of spot from today.
inline const std::vector<double> default_outcome_moves = {-0.3, -0.2, -0.1, 0.0, 0.1, 0.2, 0.3};

// ---- hedge and tree ------------------------------------------------------

inline constexpr std::size_t max_rebalancing_dates = 2000;  ///< about eight years of business days
inline constexpr int max_rebalance_every = 1000;            ///< `every` N units
inline constexpr double max_cost_bp = 1000;                 ///< basis points of traded notional
inline constexpr int default_hedge_lattice_steps = 151;     ///< re-pricing American and Bermudan legs per date
inline constexpr int min_hedge_lattice_steps = 10;
inline constexpr int max_hedge_lattice_steps = 2000;
inline constexpr std::int64_t max_seed = 9007199254740991;  ///< 2^53 - 1: exact in a JavaScript number
inline constexpr double max_rise = 10.0;                    ///< a stress rise of 1,000 % (a fall stays below 1)
inline constexpr double default_stress_change = 0.2;
inline constexpr int max_tree_steps = 5000;   ///< the tree and the path walk (work grows like steps^2 per leg)
inline constexpr int max_tree_nodes = 2000;   ///< nodes listed in one tree result
inline constexpr int default_tree_steps = 7;  ///< the tree view when the trade names none
inline constexpr std::size_t max_moves_chars = max_tree_steps + 2000;  ///< moves text, separators included

// ---- simulate ------------------------------------------------------------

inline constexpr long default_paths = 10000;
inline constexpr long max_paths = 200000;
/// Most paths times rebalancings over all frequencies (keeps a run to a few seconds).
inline constexpr double max_path_rebalancings = 5e7;
inline constexpr int default_bins = 40;
inline constexpr int min_bins = 5;
inline constexpr int max_bins = 200;
inline constexpr std::size_t max_frequencies = 6;
inline constexpr int min_simulate_lattice_steps = 20;  ///< delta tables of American and Bermudan legs
inline constexpr int max_simulate_lattice_steps = 1000;

// ---- ladder and profile --------------------------------------------------

inline constexpr int max_points_per_axis = 201;
inline constexpr long max_grid_cells = 10000;
inline constexpr int default_ladder_steps = 101;  ///< modest, for speed
inline constexpr int max_ladder_steps = 2001;
/// Node updates a ladder or a profile may ask for (scenarios x legs x steps^2 / 2 for the
/// fine and coarse lattices): about a second natively.
inline constexpr double max_ladder_work = 2e9;
inline constexpr double min_ladder_volatility = min_volatility;
inline constexpr double min_spot_shift = -0.95;  ///< spot 95 % lower
inline constexpr double max_spot_shift = 4.0;    ///< spot five times today's
static_assert(max_scenario_level == max_price_level * (1 + max_spot_shift),
              "a scenario reaches the highest spot moved up");
/// A ladder axis when the section gives none: from, to, step.
struct axis_defaults {
    double from, to, step;
};
inline constexpr axis_defaults spot_axis{-0.2, 0.2, 0.02};   ///< fractions of today's spot
inline constexpr axis_defaults vol_axis{-0.05, 0.05, 0.01};  ///< volatility points as decimals
inline constexpr long max_ladder_days = 36500;
inline constexpr int default_profile_points = 41;
inline constexpr int max_profile_points = 501;
inline constexpr int max_profile_steps = 2001;
inline constexpr double max_profile_work = 2e9;  ///< lattice node updates, as for ladders
/// A profile's lowest spot, as a fraction of today's: each spot is priced as a move of today's,
/// and one within a billionth of zero is no move a double can price.
inline constexpr double min_profile_spot_fraction = 1e-9;

// ---- solve ---------------------------------------------------------------

inline constexpr double max_budget = 1e15;

// ---- the page's work budget ----------------------------------------------

/// Node updates the page allows one request: a few seconds in the module (analytics/work_estimate.hpp).
inline constexpr double page_work_budget = 4e9;

}  // namespace hedgeleaf
