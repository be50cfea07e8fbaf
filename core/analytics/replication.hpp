// Hedgeleaf analytics: the replicating portfolio on one lattice for a whole trade.
//
// Every leg is valued on the same recombining lattice, which runs from the
// valuation date to the trade's final expiry (numerics/lattice.hpp's make_geometry, on the
// diffusing spot S* = spot - PV of cash dividends up to the final expiry). Its time grid
// puts a step boundary on every earlier leg expiry, Bermudan exercise date and, with an
// American leg, every dividend's ex-date and the day before (numerics/time_grid.hpp),
// when the steps asked for are at least the pieces this needs; with fewer steps the grid
// is uniform and such a date falls on the nearest step (a note says so). A leg that
// expires earlier pays its payoff at its expiry step and is gone afterwards; an American
// or Bermudan leg pays its exercise value at a node where the holder does better
// exercising than waiting.
//
// At node (n, j) (step n, j up moves) the portfolio of `shares` Δ and `cash` B
//   Δ = (X_up - X_down) / (S_up - S_down),   B = (X_up - Δ (S_up + income)) e^(-r dt)
// replicates the legs still running: Δ S + B = value - paid, and one step later
//   Δ (S_next + income) + B e^(r dt) = X_next   on both branches,
// where X_next is the value of those legs at the child node and `income` is what
// one share earns over the step (cash dividends paid in it, grown to the step's
// end, plus the carry yield on S*). With no dividends and no carry yield,
// income = 0 and this is the textbook Δ S_next + B e^(r dt) = V_next.
#pragma once

#include "contract/trade.hpp"
#include "numerics/lattice.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// What happens to the trade at a node.
enum class node_event { none, early_exercise, expiry };

/// One node of the trade's lattice, per unit of the trade (legs with their signed quantities).
struct tree_node {
    int step = 0;       ///< level n (0 = valuation)
    int index = 0;      ///< up moves j (0 = lowest spot)
    double spot = 0;    ///< full spot: S* u^j d^(n-j) + PV of the dividends still to come
    double value = 0;   ///< value of the legs running at this node, including what they pay here
    double paid = 0;    ///< payoffs and exercise values paid at this node
    double shares = 0;  ///< Δ held from this node to the next step
    double cash = 0;    ///< B held from this node to the next step
    double income = 0;  ///< what one share earns over the next step (dividends, carry yield)
    node_event event = node_event::none;
    /// Δ S + B - (value - paid): zero to rounding.
    double check() const { return shares * spot + cash - (value - paid); }
};

/// The shared lattice of a trade: geometry and per-leg timing.
struct trade_lattice {
    const trade* source = nullptr;
    lattice_geometry geometry;
    int steps = 0;
    double s0 = 0;                           ///< diffusing spot S* at valuation
    std::vector<int> last_step;              ///< per leg: its expiry step (stock legs: steps)
    std::vector<std::vector<char>> allowed;  ///< per leg: early exercise allowed at step n
    std::vector<std::string> notes;          ///< e.g. a leg expiry moved to the nearest step

    /// Build the lattice of `t` with `steps` steps (exactly; no odd-count bump).
    trade_lattice(const trade& t, int steps);
    /// Years from valuation to step n.
    double years_at(int n) const { return geometry.time(n); }
    /// Step n (from level n to n + 1).
    const lattice_step& step(int n) const { return geometry.at(n); }
    double diffusing(int n, int j) const;
    /// PV at step n of the cash dividends still to come (to the final expiry).
    double dividends_after(int n) const;
    double spot(int n, int j) const { return diffusing(n, j) + dividends_after(n); }
    /// What one share earns over step n -> n+1 from node (n, j).
    double income(int n, int j) const;
};

/// Nodes of steps [from_step, to_step] (inclusive), level by level, j ascending.
std::vector<tree_node> tree_window(const trade_lattice& lattice, int from_step, int to_step);

/// One step of a walk along a lattice path.
struct path_step {
    tree_node node;      ///< value, paid, shares and cash as seen on this path
    double carried = 0;  ///< value now of the portfolio set up one step earlier (step 0: the premium)
};

/// Walk `moves` (0 = down, 1 = up) from the root. Stops when every leg has paid
/// (expiry or exercise) or when the moves run out. Legs exercised earlier on the
/// path stay dead, so a path's values can differ from the node values of a
/// multi-leg trade with early exercise.
std::vector<path_step> walk_path(const trade_lattice& lattice, const std::vector<int>& moves);

/// Every level of one leg's values (size steps+1, level n has n+1 values) and
/// early-exercise flags; for the simulation's delta tables. Memory ~ steps^2 / 2.
struct leg_value_table {
    std::vector<std::vector<double>> value;
    std::vector<std::vector<char>> exercised;
};
leg_value_table leg_values(const trade_lattice& lattice, std::size_t leg);

/// "none", "early", "expiry": the word the tree result gives a node.
std::string to_string(node_event e);

}  // namespace hedgeleaf
