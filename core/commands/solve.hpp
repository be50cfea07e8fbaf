// Hedgeleaf commands: the solve command's JSON in and out.
#pragma once

#include "analytics/solve.hpp"
#include "commands/json_read.hpp"

namespace hedgeleaf {

/// Read and check the trade's `solve` section (required for the command).
solve_settings read_solve_settings(const json& document, const trade& t);
/// The solution, the residual, the iterations and the legs at the solution.
json write_solve_result(const trade& t, const solve_settings& settings, const solve_result& result);

}  // namespace hedgeleaf
