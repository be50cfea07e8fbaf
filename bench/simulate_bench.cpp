// Hedgeleaf benchmark: speed of the hedging simulation and of hedge schedules, natively.
//
// Prints CPU seconds (this thread) for
//   - simulate: 10,000 paths x 52 weekly rebalancings of a one-year at-the-money
//     European call (closed-form delta) and of an American put (lattice delta table);
//   - hedge: one 52-date weekly schedule (what the page recomputes as the user
//     types), European and American;
//   - tree: a 7-step tree with a path walk.
// Each figure is the best of several runs.
#include "bench_common.hpp"
#include "commands/hedge.hpp"
#include "commands/simulate.hpp"
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"

#include <algorithm>
#include <cstdio>
#include <string>

using namespace hedgeleaf;
using namespace hedgeleaf::bench;

namespace {

// A fictional share (Orchard Vale Robotics) around 48; weekly dates over one year.
std::string trade_text(const std::string& type, const std::string& exercise) {
    return R"({"valuation_date": "2027-01-04",
      "market": {"spot": 48, "volatility": 0.3, "rate": 0.03},
      "option": {"type": ")" +
           type + R"(", "strike": 48, "expiry_date": "2028-01-03", "exercise": ")" + exercise + R"("},
      "hedge": {"rebalance": {"every": 1, "unit": "weeks"}, "path": {"kind": "scenario", "seed": 3}},
      "simulate": {"paths": 10000, "seed": 5, "frequencies": [{"every": 1, "unit": "weeks"}]}})";
}

template <class F>
double best_cpu_seconds(F&& run, int repeats) {
    double best = 1e300;
    for (int i = 0; i < repeats; ++i) {
        const double start = cpu_seconds();
        run();
        best = std::min(best, cpu_seconds() - start);
    }
    return best;
}

}  // namespace

int main() {
    std::printf("simulate_bench (%s)\n", cpu_name().c_str());
    for (const auto& [type, exercise] :
         {std::pair<std::string, std::string>{"call", "european"}, {"put", "american"}}) {
        const json doc = parse_json_text(trade_text(type, exercise));
        const trade t = read_trade(doc);
        const simulate_settings st = read_simulate_settings(doc, t);
        simulation sim;
        const double sim_s = best_cpu_seconds([&] { sim = run_simulation(t, st); }, 3);
        std::printf("simulate %-8s %-4s: %ld paths x %d rebalancings in %.3f s (sd of P&L %.4f, %s)\n",
                    exercise.c_str(), type.c_str(), st.paths, sim.frequencies[0].rebalancings, sim_s,
                    sim.frequencies[0].sd, sim.closed_form_delta ? "closed-form delta" : "lattice delta table");

        const hedge_settings hs = read_hedge_settings(doc, t);
        hedge_schedule sched;
        const double hedge_s = best_cpu_seconds([&] { sched = run_hedge(t, hs); }, 20);
        std::printf("hedge    %-8s %-4s: %zu-row schedule in %.3f ms\n", exercise.c_str(), type.c_str(),
                    sched.rows.size(), hedge_s * 1e3);
        const double cmd_s = best_cpu_seconds([&] { (void)run_command("hedge", doc); }, 20);
        std::printf("hedge    %-8s %-4s: whole command (parse, schedule, JSON) in %.3f ms\n", exercise.c_str(),
                    type.c_str(), cmd_s * 1e3);
    }
    json doc = parse_json_text(trade_text("put", "american"));
    doc["hedge"] = json{{"path", {{"kind", "lattice"}, {"moves", "UDDUDUD"}}}};
    const double tree_s = best_cpu_seconds([&] { (void)run_command("tree", doc); }, 50);
    std::printf("tree     american put: 7 steps with a path in %.3f ms\n", tree_s * 1e3);
    return 0;
}
