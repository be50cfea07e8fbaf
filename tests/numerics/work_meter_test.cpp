// Tests for numerics/work_meter: the run of a request is held to the page's budget.
#include "numerics/work_meter.hpp"
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"
#include "numerics/lattice.hpp"
#include "numerics/lattice_price.hpp"

#include <catch2/catch.hpp>

using namespace hedgeleaf;

namespace {
// One American put on a fictional share (the first leg of analytics/work_estimate_test's trade).
json american_put(int steps) {
    const json put = {{"type", "put"}, {"strike", 80}, {"expiry_years", 2}, {"exercise", "american"}, {"quantity", 1}};
    return json{{"market", {{"spot", 100}, {"volatility", 0.3}, {"rate", 0.05}}},
                {"legs", json::array({put})},
                {"lattice", {{"steps", steps}}}};
}
}  // namespace

TEST_CASE("the run itself is held to the budget, whatever the estimate said", "[work]") {
    const trade t = read_trade(american_put(2001));
    const option_leg& leg = t.legs[0];
    const double one = induce(t.market, leg, lattice_method::leisen_reimer, 2001).node_updates;
    SECTION("an induction past the budget stops the request") {
        const work_meter meter(0.5 * one, "lattice.steps");
        CHECK_THROWS_AS(induce(t.market, leg, lattice_method::leisen_reimer, 2001), work_exhausted);
    }
    SECTION("the vega and rho bumps do not swallow it as a failed bump") {
        // room for the price (a fine and a coarse lattice) but not its four bumps
        const work_meter meter(2 * one, "lattice.steps");
        CHECK_THROWS_AS(price_leg(t.market, leg, t.lattice, bumped_greeks::on), work_exhausted);
    }
    SECTION("no meter (the CLI) counts nothing") {
        CHECK_NOTHROW(price_leg(t.market, leg, t.lattice, bumped_greeks::on));
    }
    SECTION("a command without an up-front estimate names its own field") {
        json doc = american_put(101);
        doc["ladder"] = {{"kind", "grid"}};
        CHECK(estimate_work("ladder", doc).node_updates == 0);
        const json envelope = json::parse(run_command_text("ladder", doc.dump(), 1e5));
        CHECK(envelope["ok"] == false);
        CHECK(envelope["error"]["field"] == "ladder.steps");
        CHECK_THAT(
            envelope["error"]["message"].get<std::string>(),
            Catch::StartsWith("ladder.steps: the request stopped after about") && Catch::Contains("command-line tool"));
        CHECK(json::parse(run_command_text("ladder", doc.dump(), page_work_budget))["ok"] == true);
    }
}
