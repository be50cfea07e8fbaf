// Hedgeleaf analytics: the work a request needs, estimated before it runs.
//
// The page refuses a request whose estimate is above its budget instead of
// starting something that would keep it busy for many seconds; the CLI has no
// budget (each command keeps its own hard limits, contract/limits.hpp:
// lattice.steps <= 50,000, simulate.paths x rebalancings <= 5e7, ladder and
// profile <= 2e9 node updates on the full triangle, tree <= 5,000 steps).
//
// The unit is one lattice node update (numerics/lattice.hpp, induction_work).
// Measured on x86-64 (a price of one American leg at 50,001 steps, estimated
// 9.9e8): natively about 5e9 estimated node updates a second, in the WebAssembly
// module under Node 20 about 1.3e9, so the page's budget of 4e9 is about 3 seconds
// (docs/reliability.md). While the request runs, numerics/work_meter.hpp holds it to
// the same budget.
#pragma once

#include "analytics/hedge.hpp"
#include "analytics/simulate.hpp"

#include <string>

namespace hedgeleaf {

/// A request's estimated work and the input that sets its size.
struct work_estimate {
    double node_updates = 0;
    std::string field;  ///< the input to lower, e.g. "lattice.steps" (the command table names it)
    std::string what;   ///< how the figure arises, for the message
    /// Whether the page's budget holds the request (false: the command keeps its own limits and
    /// the page shows progress and a Stop button; the figure still tells the CLI how long).
    bool budgeted = true;
};

/// Estimated node updates a second natively on one x86-64 laptop core (measured above): the CLI
/// states the time of a request estimated above 2 s before it starts (docs/performance.md).
inline constexpr double native_updates_per_second = 5e9;

// An estimate that needs no section of the document is taken before the section is read.

/// price: the premium, four re-prices for vega and rho, two for a quote's volatility margin.
work_estimate estimate_price_work(const trade& t);
/// solve: a bracketed root search, about 20 evaluations without sensitivities.
work_estimate estimate_solve_work(const trade& t);
/// hedge: American and Bermudan legs re-priced on their own lattice at every date.
work_estimate estimate_hedge_work(const trade& t, const hedge_settings& settings);
/// simulate: every path hedged at every date of every frequency, in node-update units (each
/// leg's delta at a date costs as much as a few hundred node updates), plus the delta tables of
/// American and Bermudan legs. Not held to the page's budget (the page shows progress and Stop).
work_estimate estimate_simulate_work(const trade& t, const simulate_settings& settings);
/// Commands bounded by their own limits to about a second natively (tree, ladder, profile): 0 here.
work_estimate estimate_bounded_work(const trade& t);

/// Throw input_error naming `w.field` when `w` exceeds `budget` node updates.
void check_work_budget(const work_estimate& w, double budget);

}  // namespace hedgeleaf
