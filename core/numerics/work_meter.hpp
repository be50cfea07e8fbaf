// Hedgeleaf numerics: the work meter, a counter of lattice node updates.
//
// The page holds a request to a budget of node updates (contract/limits.hpp,
// page_work_budget); the estimate before a request runs is analytics/work_estimate.hpp.
// While a meter lives, every backward induction charges the nodes it swept; the one
// that takes the total past the budget throws work_exhausted naming the field that
// sets the request's size. This holds searches and schedules whose length is not
// known up front (a solve that needs more evaluations than estimated) to the same
// budget as the estimate.
#pragma once

#include <string>

namespace hedgeleaf {

/// While one lives, lattice inductions charge their node updates to `budget`. Infinite
/// budget (the CLI): nothing is counted. One per thread at a time; not shared between threads.
class work_meter {
public:
    work_meter(double budget, std::string field);
    ~work_meter();
    work_meter(const work_meter&) = delete;
    work_meter& operator=(const work_meter&) = delete;
};

/// Charge node updates to the live work_meter, if any (numerics/lattice_kernel.cpp calls this).
void charge_work(double node_updates);

/// "1234 million": node updates as the budget messages give them.
std::string in_millions(double node_updates);

}  // namespace hedgeleaf
