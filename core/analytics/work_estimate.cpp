// Hedgeleaf analytics: up-front work estimates (see work_estimate.hpp).
#include "analytics/work_estimate.hpp"

#include "contract/errors.hpp"
#include "numerics/lattice.hpp"
#include "numerics/work_meter.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

struct leg_work {
    int option_legs = 0;
    int early_legs = 0;  // American or Bermudan: re-priced on a lattice at each hedge date
};

leg_work count_legs(const trade& t) {
    leg_work c;
    for (const auto& leg : t.legs) {
        if (leg.type == payoff_kind::stock) continue;
        ++c.option_legs;
        if (leg.exercise != exercise_style::european) ++c.early_legs;
    }
    return c;
}

// One lattice price: a fine and a coarse induction (numerics/lattice_price.hpp); `summed`: a
// European leg whose induction is a binomial sum (numerics/lattice.hpp, sums_directly).
double price_work(lattice_method method, int steps, bool summed = false) {
    const int fine = effective_steps(method, steps > 0 ? steps : default_steps(method));
    const int coarse = effective_steps(method, std::max(1, fine / 2));
    if (summed) return summed_work(fine) + summed_work(coarse);
    return induction_work(fine) + induction_work(coarse);
}

std::string steps_text(const trade& t) {
    const int steps =
        effective_steps(t.lattice.method, t.lattice.steps > 0 ? t.lattice.steps : default_steps(t.lattice.method));
    return std::to_string(steps) + " steps";
}

std::string legs_text(int n) { return std::to_string(n) + (n == 1 ? " option leg" : " option legs"); }

// A command that prices the whole trade `prices` times on its own lattice.
work_estimate repricing_work(const trade& t, int prices, const std::string& how) {
    const leg_work legs = count_legs(t);
    work_estimate w;
    for (const auto& leg : t.legs)
        if (leg.type != payoff_kind::stock)
            w.node_updates +=
                prices * price_work(t.lattice.method, t.lattice.steps, sums_directly(t.market, leg, t.lattice.method));
    w.what = legs_text(legs.option_legs) + " at " + steps_text(t) + ", " + how;
    return w;
}

}  // namespace

work_estimate estimate_price_work(const trade& t) {
    // The price, four re-prices for vega and rho, two for a quote's volatility margin.
    return repricing_work(t, 7, "priced 7 times (premium, vega, rho, quote)");
}

work_estimate estimate_solve_work(const trade& t) {
    // A bracketed root search: about 20 evaluations without sensitivities.
    return repricing_work(t, 20, "priced about 20 times by the search");
}

work_estimate estimate_hedge_work(const trade& t, const hedge_settings& hs) {
    const leg_work legs = count_legs(t);
    work_estimate w;
    if (legs.early_legs == 0) return w;
    // American and Bermudan legs are re-priced on their own lattice at every date.
    const double dates = static_cast<double>(schedule_dates(t, hs.rebalance, "hedge.rebalance").size());
    w.node_updates = dates * legs.early_legs * price_work(t.lattice.method, hs.lattice_steps);
    w.what = std::to_string(legs.early_legs) + " American or Bermudan leg" + (legs.early_legs == 1 ? "" : "s") +
             " re-priced at " + std::to_string(hs.lattice_steps) + " steps on " + format_number(dates) + " dates";
    return w;
}

work_estimate estimate_simulate_work(const trade& t, const simulate_settings& st) {
    // Per path and date, in node-update units (timed with the CLI on x86-64 for 1 and 12 legs
    // over 30 years, docs/performance.md): drawing the step and booking the hedge; each
    // European leg's closed-form delta; each other leg's delta read from its table.
    constexpr double per_step = 600, per_european_leg = 280, per_table_leg = 1200;
    const leg_work legs = count_legs(t);
    double dates = 0;
    for (std::size_t f = 0; f < st.frequencies.size(); ++f)
        dates +=
            static_cast<double>(schedule_dates(t, st.frequencies[f], index_path("simulate.frequencies", f)).size());
    // Refused as the run would refuse it (the first date of each frequency is the start).
    const double rebalancings = dates - static_cast<double>(st.frequencies.size());
    check_simulation_size(static_cast<double>(st.paths) * rebalancings);
    const double per_date =
        per_step + per_european_leg * (legs.option_legs - legs.early_legs) + per_table_leg * legs.early_legs;
    work_estimate w;
    w.budgeted = false;
    w.node_updates = static_cast<double>(st.paths) * dates * per_date +
                     legs.early_legs * induction_work(st.lattice_steps > 0 ? st.lattice_steps : 1000);
    w.what = format_number(static_cast<double>(st.paths)) + " paths x " + format_number(rebalancings) +
             " rebalancings with " + legs_text(legs.option_legs);
    return w;
}

work_estimate estimate_bounded_work(const trade&) { return {}; }

void check_work_budget(const work_estimate& w, double budget) {
    if (!std::isfinite(budget) || !w.budgeted) return;
    if (w.node_updates <= budget) return;
    throw work_exhausted(w.field, w.what + " need about " + in_millions(w.node_updates) +
                                      " lattice node updates, more than the " + in_millions(budget) +
                                      " the page runs at once (a few seconds); use fewer steps, or the hedgeleaf "
                                      "command-line tool, which has no such limit");
}

}  // namespace hedgeleaf
