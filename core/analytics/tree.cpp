// Hedgeleaf analytics: the tree command (see tree.hpp).
#include "analytics/tree.hpp"

#include "contract/errors.hpp"

namespace hedgeleaf {

namespace {

int tree_steps(const tree_settings& s) {
    int steps = s.tree.steps;
    if (steps == 0) steps = s.lattice_path ? static_cast<int>(s.moves.size()) : default_tree_steps;
    if (s.lattice_path && static_cast<int>(s.moves.size()) > steps)
        fail("hedge.path.moves",
             "has " + std::to_string(s.moves.size()) + " moves, more than hedge.tree.steps " + std::to_string(steps));
    return steps;
}

// The window: as asked, or as many whole levels from from_step as the node cap allows.
void choose_window(const tree_spec& tree, int steps, tree_result& out) {
    const int from = tree.from_step;
    if (from > steps)
        fail("hedge.tree.from_step",
             "must be <= the tree's steps " + std::to_string(steps) + ", got " + std::to_string(from));
    const auto nodes_between = [](long a, long b) { return (b + 1) * (b + 2) / 2 - a * (a + 1) / 2; };
    int to = tree.to_step >= 0 ? tree.to_step : steps;
    if (to > steps)
        fail("hedge.tree.to_step",
             "must be <= the tree's steps " + std::to_string(steps) + ", got " + std::to_string(to));
    if (to < from)
        fail("hedge.tree.to_step",
             "must be >= hedge.tree.from_step " + std::to_string(from) + ", got " + std::to_string(to));
    if (nodes_between(from, to) > max_tree_nodes) {
        if (tree.to_step >= 0)
            fail("hedge.tree.to_step", "steps " + std::to_string(from) + " to " + std::to_string(to) + " hold " +
                                           std::to_string(nodes_between(from, to)) + " nodes, at most " +
                                           std::to_string(max_tree_nodes) + " are listed; narrow the window");
        while (nodes_between(from, to) > max_tree_nodes) --to;
        out.notes.push_back("steps " + std::to_string(from) + " to " + std::to_string(to) + " of " +
                            std::to_string(steps) + " listed (at most " + std::to_string(max_tree_nodes) +
                            " nodes); set hedge.tree.from_step and to_step for other levels");
    }
    out.from_step = from;
    out.to_step = to;
}

/// The tree's lattice. Its steps are hedge.tree.steps, not lattice.steps: a lattice that breaks
/// no-arbitrage at so few steps is refused naming the tree's (the price's lattice may be fine).
trade_lattice tree_lattice(const trade& t, int steps) {
    try {
        return trade_lattice(t, steps);
    } catch (const input_error& e) {
        const std::string text = e.what();
        const std::string prefix = e.field() + ": ";
        if (text.find("breaks no-arbitrage") == std::string::npos || text.rfind(prefix, 0) != 0) throw;
        std::string problem = text.substr(prefix.size());
        for (std::size_t at = problem.find("lattice.steps"); at != std::string::npos;
             at = problem.find("lattice.steps", at + 16))
            problem.replace(at, 13, "hedge.tree.steps");
        throw input_error("hedge.tree.steps", problem);
    }
}

}  // namespace

tree_result run_tree(const trade& t, const tree_settings& settings) {
    tree_result out;
    out.steps = tree_steps(settings);
    const trade_lattice lat = tree_lattice(t, out.steps);
    out.geometry = lat.geometry;
    out.notes = lat.notes;
    choose_window(settings.tree, out.steps, out);
    out.nodes = tree_window(lat, out.from_step, out.to_step);
    const double root = out.from_step == 0 ? out.nodes.front().value : tree_window(lat, 0, 0).front().value;
    out.against_price = compare_with_price(t, root);
    if (settings.lattice_path) out.path = walk_path(lat, settings.moves);
    return out;
}

}  // namespace hedgeleaf
