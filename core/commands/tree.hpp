// Hedgeleaf commands: the tree command's JSON in and out (its settings live in `hedge`).
#pragma once

#include "analytics/tree.hpp"
#include "commands/json_read.hpp"

namespace hedgeleaf {

/// Read the `hedge` section (all of it is checked) for the tree's window and a lattice path.
tree_settings read_tree_settings(const json& document, const trade& t);
/// Nodes for the page's tree view and, for a lattice hedge path, the highlighted path.
json write_tree_result(const trade& t, const tree_settings& settings, const tree_result& result);

}  // namespace hedgeleaf
