// Hedgeleaf dispatch: the table of commands (see command_table.hpp).
#include "dispatch/command_table.hpp"

#include "commands/compare.hpp"
#include "commands/currency.hpp"
#include "commands/hedge.hpp"
#include "commands/ladder.hpp"
#include "commands/price.hpp"
#include "commands/profile.hpp"
#include "commands/simulate.hpp"
#include "commands/solve.hpp"
#include "commands/trade_reader.hpp"
#include "commands/tree.hpp"
#include "numerics/work_meter.hpp"

#include <cmath>
#include <type_traits>

namespace hedgeleaf {

namespace {

void check_budget(const command_descriptor& self, work_estimate w, double budget) {
    w.field = self.work_field;
    check_work_budget(w, budget);
}

/// The one trade of a document; a comparison (several trades) is refused by name.
trade trade_of_document(const json& document) {
    if (document.is_object() && document.contains(comparison_key))
        fail(comparison_key,
             "a comparison of several trades is read by the compare command; this command takes one "
             "trade document");
    return read_trade(document);
}

/// The two type-erased entries of a descriptor, from a command's typed steps on one trade:
///   Settings read(const json& document, const trade&);
///   work_estimate estimate(const trade&) or estimate(const trade&, const Settings&);
///   Result run(const trade&, const Settings&);
///   json write(const trade&, const Settings&, const Result&);
/// A request is refused up front when its estimate is above the budget (before its
/// section is read, when the estimate needs none of it), and the run itself is held
/// to the budget by the work meter. Without a budget (the CLI) nothing is estimated.
template <auto read, auto estimate, auto run, auto write>
struct steps {
    static constexpr bool needs_settings = !std::is_invocable_v<decltype(estimate), const trade&>;

    static work_estimate estimate_of(const json& document) {
        const trade t = trade_of_document(document);
        if constexpr (needs_settings)
            return estimate(t, read(document, t));
        else
            return estimate(t);
    }

    static json execute(const command_descriptor& self, const json& document, double budget) {
        const trade t = trade_of_document(document);
        const bool budgeted = std::isfinite(budget);
        if constexpr (!needs_settings)
            if (budgeted) check_budget(self, estimate(t), budget);
        const auto settings = read(document, t);
        if constexpr (needs_settings)
            if (budgeted) check_budget(self, estimate(t, settings), budget);
        const work_meter meter(budget, self.work_field);
        json out = write(t, settings, run(t, settings));
        if (!t.market.as_of.empty()) out["market_as_of"] = t.market.as_of;  // a market snapshot's time
        if (t.currency) use_currency_words(out);
        return out;
    }
};

/// The same for a command that reads the whole document (several trades), not one trade:
///   Input read(const json& document); work_estimate estimate(const Input&);
///   Result run(const Input&); json write(const Input&, const Result&).
template <auto read, auto estimate, auto run, auto write>
struct document_steps {
    static work_estimate estimate_of(const json& document) { return estimate(read(document)); }

    static json execute(const command_descriptor& self, const json& document, double budget) {
        const auto input = read(document);
        if (std::isfinite(budget)) check_budget(self, estimate(input), budget);
        const work_meter meter(budget, self.work_field);
        return write(input, run(input));
    }
};

comparison_result run_comparison_of(const comparison_input& in) { return run_comparison(in.alternatives, in.settings); }

template <class Steps>
command_descriptor describe(std::string name, std::string help, std::string work_field) {
    return {std::move(name), std::move(help), std::move(work_field), &Steps::estimate_of, &Steps::execute};
}

}  // namespace

const std::vector<command_descriptor>& command_table() {
    static const std::vector<command_descriptor> table = {
        describe<document_steps<read_comparison, estimate_comparison_work, run_comparison_of, write_comparison_result>>(
            "compare", "up to four alternatives side by side in the client's figures (a comparison or trade files)",
            "lattice.steps"),
        describe<steps<read_hedge_settings, estimate_hedge_work, run_hedge, write_hedge_result>>(
            "hedge", "the hedge schedule along one spot path (the trade's hedge section)", "hedge.lattice_steps"),
        describe<steps<read_ladder_settings, estimate_bounded_work, run_ladder, write_ladder_result>>(
            "ladder", "values and P&L under moved spot, volatility or time (ladder section)", "ladder.steps"),
        describe<steps<read_price_settings, estimate_price_work, run_price, write_price_result>>(
            "price", "premium, Greeks and replicating portfolio; the client price with a quote section",
            "lattice.steps"),
        describe<steps<read_profile_settings, estimate_bounded_work, run_profile, write_profile_result>>(
            "profile", "payoff and P&L at expiry, value today, break-even spots (profile section)", "profile.steps"),
        describe<steps<read_simulate_settings, estimate_simulate_work, run_simulation, write_simulate_result>>(
            "simulate", "P&L of discrete delta hedging over many simulated paths (simulate section)", "lattice.steps"),
        describe<steps<read_solve_settings, estimate_solve_work, run_solve, write_solve_result>>(
            "solve", "the volatility, a strike or the quantity for a target (solve section)", "lattice.steps"),
        describe<steps<read_tree_settings, estimate_bounded_work, run_tree, write_tree_result>>(
            "tree", "the lattice node by node with the replicating shares and cash (hedge.tree)", "hedge.path"),
    };
    return table;
}

const command_descriptor& find_command(const std::string& name) {
    std::vector<std::string> names;
    for (const auto& d : command_table()) {
        if (d.name == name) return d;
        names.push_back(d.name);
    }
    std::string list;
    for (const auto& n : names) list += (list.empty() ? "" : ", ") + n;
    const std::string hint = nearest(name, names);
    fail("", "unknown command \"" + shorten(name, 40) + "\" (one of " + list + ")" +
                 (hint.empty() ? std::string() : "; did you mean \"" + hint + "\"?"));
}

}  // namespace hedgeleaf
