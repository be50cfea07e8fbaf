// Tests for the refusal envelope of dispatch/dispatch: the structured kind and the broken bound.
#include "dispatch/dispatch.hpp"

#include <catch2/catch.hpp>

using namespace hedgeleaf;

namespace {
json refused(const std::string& command, const std::string& text, double budget = 1e300) {
    const json envelope = json::parse(run_command_text(command, text, budget));
    REQUIRE(envelope["ok"] == false);
    return envelope["error"];
}
const std::string put =
    R"({"market": {"spot": 100, "volatility": VOL, "rate": 0.03}, "option": {"type": "put", "strike": 100, "expiry_years": 1}})";
std::string with_vol(const std::string& vol) { return std::string(put).replace(put.find("VOL"), 3, vol); }
}  // namespace

TEST_CASE("a range refusal carries the value and the bound in the file's units", "[envelope]") {
    const json e = refused("price", with_vol("-0.2"));
    CHECK(e["kind"] == "input");
    CHECK(e["field"] == "market.volatility");
    CHECK(e["message"] == "market.volatility: must be > 0, got -0.2");
    CHECK(e["detail"]["value"] == -0.2);
    CHECK(e["detail"]["limit"] == 0);
    CHECK(e["detail"]["relation"] == ">");
    const json high = refused("price", with_vol("6"));
    CHECK(high["detail"]["relation"] == "<=");
    CHECK(high["detail"]["limit"] == 5);
}

TEST_CASE("a refusal that is not a range check has no detail", "[envelope]") {
    const json e = refused("price", with_vol("\"x\""));
    CHECK(e["kind"] == "input");
    CHECK_FALSE(e.contains("detail"));
}

TEST_CASE("the kind says input, budget or internal without reading the text", "[envelope]") {
    // Regression (fuzzing with a random seed): a field named "internal errorside" once read as an
    // internal error because the message starts with the field; the kind is what tells.
    const std::string odd =
        R"({"market": {"spot": 100, "volatility": 0.2, "rate": 0.03}, "internal errorside": 1, "option": {"type": "put", "strike": 100, "expiry_years": 1}})";
    const json e = refused("price", odd);
    CHECK(e["kind"] == "input");
    CHECK(e["message"].get<std::string>().rfind("internal errorside: unknown field", 0) == 0);
    // Over the page's budget: "budget", naming the field that sets the size. (An American put: a
    // European leg's lattice is a binomial sum, numerics/lattice.hpp, and 50,000 steps fit.)
    std::string american = with_vol("0.2");
    american.replace(american.find(R"("expiry_years")"), 0, R"("exercise": "american", )");
    const json b = refused("price", american.replace(american.rfind('}'), 1, R"(, "lattice": {"steps": 50000}})"), 1e6);
    CHECK(b["kind"] == "budget");
    CHECK(b["field"] == "lattice.steps");
}
