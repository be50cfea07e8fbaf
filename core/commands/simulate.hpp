// Hedgeleaf commands: the simulate command's JSON in and out.
#pragma once

#include "analytics/simulate.hpp"
#include "commands/json_read.hpp"

namespace hedgeleaf {

/// Read and check the trade's `simulate` section (all fields optional).
simulate_settings read_simulate_settings(const json& document, const trade& t);
/// Per frequency the P&L summary, a histogram, the Derman-Kamal reference, the notes.
json write_simulate_result(const trade& t, const simulate_settings& settings, const simulation& sim);

}  // namespace hedgeleaf
