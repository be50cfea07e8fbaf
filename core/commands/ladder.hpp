// Hedgeleaf commands: the ladder command's JSON in and out.
#pragma once

#include "analytics/ladder.hpp"
#include "commands/json_read.hpp"

namespace hedgeleaf {

/// Read and check the trade's `ladder` section (optional; a spot ladder -20 % .. +20 %
/// in 2 % steps when absent).
ladder_settings read_ladder_settings(const json& document, const trade& t);
/// Today's value, one row per scenario, the columns, a grid's matrix, the notes.
json write_ladder_result(const trade& t, const ladder_settings& settings, const ladder_result& result);

}  // namespace hedgeleaf
