// Hedgeleaf commands: the `simulate` section and the simulate command's result (see simulate.hpp).
#include "commands/simulate.hpp"

#include "commands/hedge.hpp"
#include "commands/table_columns.hpp"
#include "commands/trade_reader.hpp"

namespace hedgeleaf {

simulate_settings read_simulate_settings(const json& document, const trade& t) {
    simulate_settings s;
    s.drift = t.market.rate.average(0, t.final_expiry_years());
    s.volatility = t.market.volatility;
    const auto every = [](int n, rebalance_unit u) {
        rebalance_spec r;
        r.every = n;
        r.unit = u;
        return r;
    };
    s.frequencies = {every(1, rebalance_unit::days), every(1, rebalance_unit::weeks), every(1, rebalance_unit::months)};
    const json* section = section_of(document, "simulate");
    if (!section) return s;
    field_reader r(*section, "simulate");
    s.paths = r.integer_or("paths", s.paths, 1, max_paths);
    s.seed = static_cast<std::uint64_t>(r.integer_or("seed", 1, 0, max_seed));
    s.drift = r.number_or("drift", s.drift);
    require_at_least(s.drift, -max_abs_rate, r.child("drift"));
    require_at_most(s.drift, max_abs_rate, r.child("drift"));
    s.volatility = r.number_or("volatility", s.volatility);
    require_non_negative(s.volatility, r.child("volatility"));
    require_at_most(s.volatility, max_volatility, r.child("volatility"));
    s.cost_bp = r.number_or("cost_bp", 0.0);
    require_non_negative(s.cost_bp, r.child("cost_bp"));
    require_at_most(s.cost_bp, max_cost_bp, r.child("cost_bp"));
    s.bins = static_cast<int>(r.integer_or("bins", s.bins, min_bins, max_bins));
    if (const json* list = r.raw_optional("frequencies")) {
        const std::string path = r.child("frequencies");
        if (!list->is_array() || list->empty() || list->size() > max_frequencies)
            fail(path, "must be a list of 1 to " + std::to_string(max_frequencies) + " {every, unit} objects, got " +
                           describe(*list));
        s.frequencies.clear();
        for (std::size_t i = 0; i < list->size(); ++i)
            s.frequencies.push_back(read_rebalance((*list)[i], index_path(path, i), t));
    }
    s.lattice_steps =
        static_cast<int>(r.integer_or("lattice_steps", 0, min_simulate_lattice_steps, max_simulate_lattice_steps));
    r.finish();
    return s;
}

namespace {

std::string frequency_label(const rebalance_spec& f) {
    if (f.explicit_dates) return "listed dates";
    return "every " + std::to_string(f.every) + " " +
           (f.unit == rebalance_unit::days    ? "business days"
            : f.unit == rebalance_unit::weeks ? "weeks"
                                              : "months");
}

using summary_column = column<pnl_summary>;

// One row per rebalancing frequency, in the order --table and --csv follow.
const std::vector<summary_column>& summary_columns() {
    static const std::vector<summary_column> columns = {
        {"frequency", [](const pnl_summary& s) { return json(frequency_label(s.frequency)); }},
        {"rebalancings", [](const pnl_summary& s) { return json(s.rebalancings); }},
        {"mean", &pnl_summary::mean},
        {"sd", &pnl_summary::sd},
        {"sd_standard_error", &pnl_summary::sd_standard_error},
        {"p01", &pnl_summary::p01},
        {"p05", &pnl_summary::p05},
        {"p50", &pnl_summary::p50},
        {"p95", &pnl_summary::p95},
        {"p99", &pnl_summary::p99},
        {"min", &pnl_summary::min},
        {"max", &pnl_summary::max},
        {"mean_costs", &pnl_summary::mean_costs},
        {"derman_kamal_sd",
         [](const pnl_summary& s) { return s.derman_kamal_sd ? json(*s.derman_kamal_sd) : json(nullptr); }},
        {"desk_mean", &pnl_summary::desk_mean},
        {"desk_sd", &pnl_summary::desk_sd},
    };
    return columns;
}

std::string delta_method(const trade& t, const simulation& sim) {
    if (sim.closed_form_delta) return "closed-form delta (every leg is European)";
    return "closed-form delta for European legs; for the others, delta and exercise from a " +
           to_string(t.lattice.method) + " lattice of " + std::to_string(sim.lattice_steps) +
           " steps, interpolated between its nodes at the nearest step";
}

json table_columns_of(const simulate_settings& st, const simulation& sim) {
    json table_columns = {"frequency", "rebalancings", "mean", "sd", "p01", "p05", "p50", "p95", "p99"};
    if (sim.derman_kamal) table_columns.push_back("derman_kamal_sd");
    if (st.cost_bp > 0) table_columns.push_back("mean_costs");
    table_columns.push_back("desk_mean");
    return table_columns;
}

}  // namespace

json write_simulate_result(const trade& t, const simulate_settings& st, const simulation& sim) {
    json series = json::array();
    for (const auto& s : sim.frequencies)
        series.push_back(json{
            {"frequency", frequency_label(s.frequency)}, {"counts", s.counts}, {"below", s.below}, {"above", s.above}});
    return json{
        {"rows", row_objects(summary_columns(), sim.frequencies)},
        {"columns", column_names(summary_columns())},
        {"table_columns", table_columns_of(st, sim)},
        {"histogram", {{"edges", sim.edges}, {"series", series}}},
        {"premium", sim.premium},
        {"paths", st.paths},
        {"seed", st.seed},
        {"drift", st.drift},
        {"volatility", st.volatility},
        {"pricing_volatility", t.market.volatility},
        {"cost_bp", st.cost_bp},
        {"delta_method", delta_method(t, sim)},
        {"signed_quantity", t.signed_quantity()},
        {"view",
         "P&L per unit = hedge portfolio - payoff at the end (or the exercise value), for one unit of the trade held "
         "long and replicated from its premium; the desk that sold the client the trade and hedged it keeps this. "
         "desk_mean and desk_sd are per position (signed_quantity; costs count on |quantity|, so with costs the desk "
         "mean of a client sale is not the per-unit mean times the quantity)."},
        {"derman_kamal",
         sim.derman_kamal
             ? json("derman_kamal_sd = sqrt(pi/4) x vega x volatility / sqrt(N), N = hedge intervals: the sd of the "
                    "hedging "
                    "error of an at-the-money European option (Derman and Kamal (1999), from memory); close to sd when "
                    "realised and pricing volatility agree, the option is near the money and there are no costs")
             : json(nullptr)},
        {"monte_carlo_error", "mean +- 2 x sd / sqrt(paths); sd +- 2 x sd_standard_error (from the sample kurtosis)"},
        {"notes", sim.notes},
        {"caution",
         "Indicative only, not an offer or advice: simulated lognormal paths with constant volatility and rate; "
         "real markets gap and volatility moves. Follow the firm's and the jurisdiction's sales rules."},
    };
}

}  // namespace hedgeleaf
