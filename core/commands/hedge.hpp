// Hedgeleaf commands: the hedge command's JSON in and out, and the `hedge` section
// shared with the tree command and (its rebalancing objects) with simulate.
#pragma once

#include "analytics/hedge.hpp"
#include "commands/json_read.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// Read and check the trade's `hedge` section (all fields optional).
hedge_settings read_hedge_settings(const json& document, const trade& t);
/// Read a {every, unit} or {dates} / {years} object at `path`.
rebalance_spec read_rebalance(const json& node, const std::string& path, const trade& t);

/// The hedge command's JSON: rows, totals, the desk's view and the notes.
json write_hedge_result(const trade& t, const hedge_settings& settings, const hedge_schedule& schedule);

/// Parse "UUDU..." (case-insensitive U/D). `field` names the input for messages.
std::vector<int> parse_moves(const std::string& moves, const std::string& field);
/// Moves (0 = down, 1 = up) from node indices [0, j1, j2, ...]; each step adds 0 or 1.
std::vector<int> moves_from_nodes(const std::vector<int>& nodes, const std::string& field);
/// "UUDU...": the moves as the trade file writes them.
std::string moves_text(const std::vector<int>& moves);

}  // namespace hedgeleaf
