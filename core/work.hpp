// Hedgeleaf core: the work a request needs, estimated before it runs.
//
// The page refuses a request whose estimate is above its budget instead of
// starting something that would keep it busy for many seconds; the CLI has no
// budget (each command keeps its own hard limits: lattice.steps <= 50,000,
// simulate.paths x rebalancings <= 5e7, ladder and profile <= 2e9 node updates
// on the full triangle, tree <= 5,000 steps).
//
// The unit is one lattice node update. An induction over n steps sweeps, in row
// k, at most its k + 1 nodes and at most the probable band the kernel keeps
// (about 12 sqrt(k) nodes; core/lattice.cpp). Measured on x86-64 (a price of one
// American leg at 50,001 steps, estimated 9.9e8): natively about 5e9 estimated
// node updates a second, in the WebAssembly module under Node 20 about 1.3e9, so
// the page's budget of 4e9 is about 3 seconds (README, "Reliability").
#pragma once

#include "trade.hpp"

#include <string>

namespace hedgeleaf {

/// Node updates of one backward induction over `steps` steps (probable band).
double induction_work(int steps);

/// A request's estimated work and the input that sets its size.
struct work_estimate {
    double node_updates = 0;
    std::string field;  ///< the input to lower, e.g. "lattice.steps"
    std::string what;   ///< how the figure arises, for the message
};

/// Estimate for `command` on `t`: price, solve and hedge, whose size follows the
/// trade's lattice settings; 0 for commands bounded by their own limits.
work_estimate estimate_work(const std::string& command, const trade& t);

/// Node updates the page allows one request: a few seconds in the module.
inline constexpr double page_work_budget = 4e9;

/// While one lives, lattice inductions charge their node updates to `budget`; the
/// induction that takes the total past it throws input_error naming `field`. This
/// holds searches and schedules whose length is not known up front (a solve that
/// needs more evaluations than estimated) to the same budget as the estimate.
/// Infinite budget (the CLI): nothing is counted. Not shared between threads.
class work_meter {
public:
    work_meter(double budget, std::string field);
    ~work_meter();
    work_meter(const work_meter&) = delete;
    work_meter& operator=(const work_meter&) = delete;
};

/// Charge node updates to the live work_meter, if any (core/lattice calls this).
void charge_work(double node_updates);

/// The input that sets the size of `command`'s lattices, for messages.
std::string work_field(const std::string& command);

/// Throw input_error naming the field when estimate_work(command, t) exceeds `budget`.
void check_work_budget(const std::string& command, const trade& t, double budget);

}  // namespace hedgeleaf
