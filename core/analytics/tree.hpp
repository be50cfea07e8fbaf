// Hedgeleaf analytics: the tree command, the trade's lattice node by node and, for a
// lattice hedge path, the replication along that path.
#pragma once

#include "analytics/pricing.hpp"
#include "analytics/replication.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// The tree view's size and window (kept in the trade's `hedge` section, as the page does).
struct tree_spec {
    int steps = 0;  ///< 0 = the lattice path's move count, else default_tree_steps
    int from_step = 0;
    int to_step = -1;  ///< -1 = as far as the node cap allows
};

/// The tree command's settings: the window, and the moves of a lattice hedge path if any.
struct tree_settings {
    tree_spec tree;
    bool lattice_path = false;
    std::vector<int> moves;  ///< 1 = up, 0 = down
};

struct tree_result {
    int steps = 0;
    lattice_geometry geometry;       ///< the trade's lattice (step: the one step, or the longest of steps that differ)
    int from_step = 0, to_step = 0;  ///< the levels listed
    std::vector<tree_node> nodes;    ///< levels from_step..to_step, j ascending
    std::vector<path_step> path;     ///< the walk along the moves (lattice path only)
    std::vector<std::string> notes;
    premium_comparison against_price;  ///< the root's value beside the price command's premium
};

/// Build the lattice, pick the window (at most max_tree_nodes nodes) and walk the path.
tree_result run_tree(const trade& t, const tree_settings& settings);

}  // namespace hedgeleaf
