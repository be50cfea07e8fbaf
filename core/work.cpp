// Hedgeleaf core: up-front work estimates (see work.hpp).
#include "work.hpp"

#include "hedge.hpp"
#include "lattice.hpp"

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

// One lattice price: a fine and a coarse induction (price_lattice_only).
double price_work(lattice_method method, int steps) {
    const int fine = effective_steps(method, steps > 0 ? steps : default_steps(method));
    const int coarse = effective_steps(method, std::max(1, fine / 2));
    return induction_work(fine) + induction_work(coarse);
}

std::string steps_text(const trade& t) {
    const int steps = effective_steps(t.lattice.method, t.lattice.steps > 0 ? t.lattice.steps : default_steps(t.lattice.method));
    return std::to_string(steps) + " steps";
}

std::string legs_text(int n) { return std::to_string(n) + (n == 1 ? " option leg" : " option legs"); }

}  // namespace

double induction_work(int steps) {
    // Row k costs min(k + 1, 14 sqrt(k) + 3): the kernel's band of 2 (6 sqrt(k) + 1) + 1
    // nodes about the centre of each of two measures, with room for their spread.
    // Every node below the crossover, the integral of the band above it.
    const double n = steps;
    const double crossover = 200;  // k + 1 = 14 sqrt(k) + 3 near k = 200
    if (n <= crossover) return n * (n + 1) / 2;
    const double below = crossover * (crossover + 1) / 2;
    const double above = 14.0 * (2.0 / 3.0) * (std::pow(n, 1.5) - std::pow(crossover, 1.5)) + 3.0 * (n - crossover);
    return below + above;
}

std::string work_field(const std::string& command) {
    if (command == "hedge") return "hedge.lattice_steps";
    if (command == "ladder") return "ladder.steps";
    if (command == "profile") return "profile.steps";
    if (command == "tree") return "hedge.path";
    return "lattice.steps";
}

work_estimate estimate_work(const std::string& command, const trade& t) {
    work_estimate w;
    const leg_work legs = count_legs(t);
    const double one_price = price_work(t.lattice.method, t.lattice.steps);
    w.field = work_field(command);
    if (command == "price") {
        // The price, four re-prices for vega and rho, two for a quote's volatility margin.
        w.node_updates = 7 * legs.option_legs * one_price;
        w.what = legs_text(legs.option_legs) + " at " + steps_text(t) + ", priced 7 times (premium, vega, rho, quote)";
    } else if (command == "solve") {
        // A bracketed root search: about 20 evaluations without sensitivities.
        w.node_updates = 20 * legs.option_legs * one_price;
        w.what = legs_text(legs.option_legs) + " at " + steps_text(t) + ", priced about 20 times by the search";
    } else if (command == "hedge" && legs.early_legs > 0) {
        // American and Bermudan legs are re-priced on their own lattice at every date.
        const hedge_settings hs = read_hedge_settings(t);
        const double dates = static_cast<double>(schedule_dates(t, hs.rebalance, "hedge.rebalance").size());
        w.node_updates = dates * legs.early_legs * price_work(t.lattice.method, hs.lattice_steps);
        w.what = std::to_string(legs.early_legs) + " American or Bermudan leg" + (legs.early_legs == 1 ? "" : "s") +
                 " re-priced at " + std::to_string(hs.lattice_steps) + " steps on " + format_number(dates) + " dates";
    }
    return w;
}

namespace {
struct meter_state {
    double budget = 0;
    double used = 0;
    std::string field;
    bool live = false;
};
thread_local meter_state meter;

std::string millions(double x) { return format_number(std::round(x / 1e6)) + " million"; }
}  // namespace

work_meter::work_meter(double budget, std::string field) {
    meter = meter_state{budget, 0, std::move(field), std::isfinite(budget)};
}

work_meter::~work_meter() { meter = meter_state{}; }

void charge_work(double node_updates) {
    if (!meter.live) return;
    meter.used += node_updates;
    if (meter.used > meter.budget) {
        throw work_exhausted(meter.field, "the request stopped after about " + millions(meter.used) +
                                              " lattice node updates, more than the " + millions(meter.budget) +
                                              " the page runs at once (a few seconds); use fewer steps, or the "
                                              "hedgeleaf command-line tool, which has no such limit");
    }
}


void check_work_budget(const std::string& command, const trade& t, double budget) {
    if (!std::isfinite(budget)) return;
    const work_estimate w = estimate_work(command, t);
    if (w.node_updates <= budget) return;
    fail(w.field, w.what + " need about " + millions(w.node_updates) + " lattice node updates, more than the " +
                      millions(budget) + " the page runs at once (a few seconds); use fewer steps, or the hedgeleaf "
                      "command-line tool, which has no such limit");
}

}  // namespace hedgeleaf
