// Tests for analytics/work_estimate: the up-front work estimate the page uses to refuse a request
// that would run for many seconds.
#include "analytics/work_estimate.hpp"
#include "commands/trade_reader.hpp"
#include "dispatch/command_table.hpp"
#include "dispatch/dispatch.hpp"
#include "numerics/lattice.hpp"

#include <catch2/catch.hpp>

#include <chrono>

using namespace hedgeleaf;

namespace {
json twelve_legs(int steps) {
    json legs = json::array();
    for (int i = 0; i < 12; ++i)
        legs.push_back(
            {{"type", "put"}, {"strike", 80 + 5 * i}, {"expiry_years", 2}, {"exercise", "american"}, {"quantity", 1}});
    return json{{"market", {{"spot", 100}, {"volatility", 0.3}, {"rate", 0.05}}},
                {"legs", legs},
                {"lattice", {{"steps", steps}}}};
}
}  // namespace

TEST_CASE("the estimate bounds the node updates the kernel really does", "[work]") {
    // The kernel counts its own updates (induction_result::node_updates); the estimate
    // must not be below them, nor so far above that the page refuses work it could do.
    const trade t = read_trade(twelve_legs(101));
    for (const int steps : {1, 2, 10, 150, 201, 1001, 5001, 20001}) {
        for (const double vol : {0.05, 0.3, 2.0}) {
            for (const double strike : {20.0, 100.0, 500.0}) {
                market_data m = t.market;
                m.volatility = vol;
                option_leg leg = t.legs[0];
                leg.strike = strike;
                const double done = induce(m, leg, lattice_method::leisen_reimer, steps).node_updates;
                INFO("steps " << steps << " vol " << vol << " strike " << strike << ": " << done << " updates");
                CHECK(done <= induction_work(effective_steps(lattice_method::leisen_reimer, steps)));
                if (steps >= 1001) CHECK(done >= 0.3 * induction_work(steps));
            }
        }
    }
    // Below the crossover every node counts: n (n + 1) / 2.
    CHECK(induction_work(100) == 5050);
}

TEST_CASE("the page refuses up front a price far above its budget, the CLI does not", "[work]") {
    const json big = twelve_legs(50000);
    const work_estimate w = estimate_work("price", big);
    CHECK(w.field == "lattice.steps");
    CHECK(w.node_updates > page_work_budget);
    const auto start = std::chrono::steady_clock::now();
    const json envelope = json::parse(run_command_text("price", big.dump(), page_work_budget));
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    CHECK(envelope["ok"] == false);
    CHECK(envelope["error"]["field"] == "lattice.steps");
    CHECK_THAT(envelope["error"]["message"].get<std::string>(),
               Catch::StartsWith("lattice.steps: 12 option legs at 50001 steps, priced 7 times") &&
                   Catch::Contains("the page runs at once") && Catch::Contains("command-line tool"));
    CHECK(seconds < 0.5);  // refused, not attempted
    // Without a budget (the CLI) only the estimate is computed here; the run itself
    // takes seconds, so it is left to tests/fuzz and the benchmarks.
    CHECK_NOTHROW(check_work_budget(w, std::numeric_limits<double>::infinity()));
    // One leg at the most steps the file allows fits the page's budget.
    json one = big;
    one["legs"] = json::array({big["legs"][0]});
    CHECK(estimate_work("price", one).node_updates < page_work_budget);
    // The default trade is far below it.
    one["lattice"] = json::object();
    CHECK(estimate_work("price", one).node_updates < page_work_budget / 100);
}

TEST_CASE("hedge and solve estimates name their own fields", "[work]") {
    json doc = twelve_legs(2001);
    doc["valuation_date"] = "2027-01-04";
    for (auto& leg : doc["legs"]) {
        leg.erase("expiry_years");
        leg["expiry_date"] = "2034-01-04";
    }
    doc["hedge"] = {{"rebalance", {{"every", 1}, {"unit", "weeks"}}}, {"lattice_steps", 2000}};
    const work_estimate h = estimate_work("hedge", doc);
    CHECK(h.field == "hedge.lattice_steps");
    CHECK(h.node_updates > page_work_budget);  // 12 legs x 2000 steps x 365 weekly dates
    doc["hedge"]["lattice_steps"] = 100;
    CHECK(estimate_work("hedge", doc).node_updates < page_work_budget);
    CHECK(estimate_work("solve", doc).field == "lattice.steps");
    // Commands bounded by their own limits estimate nothing here.
    CHECK(estimate_work("ladder", doc).node_updates == 0);
}

TEST_CASE("a simulation's estimate grows with paths, dates and legs and is never refused by the budget", "[work]") {
    // The page runs a simulation with progress and Stop, so its budget does not refuse one;
    // the CLI states the estimate of a long one before it starts (tests/cli_test.sh).
    json doc = twelve_legs(101);
    doc["simulate"] = {{"paths", 1000}, {"frequencies", {{{"every", 1}, {"unit", "months"}}}}};
    const auto estimate = [](const json& d) { return find_command("simulate").estimate(d); };
    const work_estimate monthly = estimate(doc);
    CHECK_FALSE(monthly.budgeted);
    CHECK(monthly.what == "1000 paths x 24 rebalancings with 12 option legs");
    doc["simulate"]["paths"] = 4000;
    CHECK(estimate(doc).node_updates == Approx(4 * monthly.node_updates).epsilon(0.01));
    doc["simulate"]["frequencies"] = {{{"every", 1}, {"unit", "weeks"}}};
    CHECK(estimate(doc).node_updates > 4 * 4 * monthly.node_updates);
    CHECK_NOTHROW(check_work_budget(estimate(doc), 1));
}

TEST_CASE("a European leg's estimate counts its binomial sum, not a sweep", "[work]") {
    // numerics/lattice.hpp, sums_directly (common practice: the binomial option pricing formula
    // of Cox, Ross and Rubinstein 1979 needs no sweep): twelve European legs at 50,000 steps
    // are cheap, and the estimate still bounds what the kernel counts.
    json doc = twelve_legs(50000);
    for (auto& leg : doc["legs"]) leg["exercise"] = "european";
    const work_estimate w = estimate_work("price", doc);
    CHECK(w.node_updates < page_work_budget / 100);
    const trade t = read_trade(doc);
    const double done = induce(t.market, t.legs[0], lattice_method::leisen_reimer, 50000).node_updates;
    CHECK(done <= summed_work(effective_steps(lattice_method::leisen_reimer, 50000)));
    const json envelope = json::parse(run_command_text("price", doc.dump(), page_work_budget));
    CHECK(envelope["ok"] == true);
}
