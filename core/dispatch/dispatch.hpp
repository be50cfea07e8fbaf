// Hedgeleaf dispatch: the commands shared by the CLI and the WebAssembly module.
//
// Each command takes a trade document and returns a JSON result; bad input
// throws input_error. run_command_text wraps that in one envelope for callers
// that cannot catch C++ exceptions (the module):
//   {"ok": true,  "result": {...}}
//   {"ok": false, "error": {"field": "market.volatility", "message": "market.volatility: must be > 0, got -0.2"}}
#pragma once

#include "analytics/work_estimate.hpp"
#include "commands/json_read.hpp"

#include <limits>
#include <string>
#include <vector>

namespace hedgeleaf {

/// Engine version shown on quote sheets and in results (CMake's project version).
const char* engine_version();

/// Names of the commands run_command accepts (dispatch/command_table.hpp), in name order.
std::vector<std::string> command_names();

/// Run `command` ("price", "hedge", ...) on a trade document. Throws input_error,
/// also when the estimated work (analytics/work_estimate.hpp) exceeds `work_budget`
/// node updates.
json run_command(const std::string& command, const json& document,
                 double work_budget = std::numeric_limits<double>::infinity());

/// Text in, envelope text out; never throws. The module passes page_work_budget.
/// `market_text`, when not empty: a market snapshot (commands/market_reader.hpp,
/// with_market_snapshot) the trade is priced in; a result then carries market_as_of.
std::string run_command_text(const std::string& command, const std::string& text,
                             double work_budget = std::numeric_limits<double>::infinity(),
                             const std::string& market_text = "");

/// The up-front estimate of `command` on `document`, naming the field that sets its size.
work_estimate estimate_work(const std::string& command, const json& document);

/// The lists and limits the engine accepts and its commands (commands/vocabulary.hpp), as JSON.
json vocabulary();

}  // namespace hedgeleaf
