// Tests for commands/compare and analytics/comparison: alternatives side by side, each priced
// as the price command prices it and described at its own client price.
#include "commands/compare.hpp"
#include "contract/errors.hpp"
#include "dispatch/dispatch.hpp"

#include <catch2/catch.hpp>

#include <algorithm>

using namespace hedgeleaf;

namespace {

json trade_doc(const json& contract, const json& quote) {
    json doc{{"valuation_date", "2026-12-02"},
             {"market", {{"spot", 36.4}, {"volatility", 0.27}, {"rate", 0.032}, {"carry_yield", 0.018}}},
             {"quantity", 150000}};
    for (const auto& [key, value] : contract.items()) doc[key] = value;
    if (!quote.is_null()) doc["quote"] = quote;
    return doc;
}

json put_doc() {
    return trade_doc({{"option", {{"type", "put"}, {"strike", 34}, {"expiry_date", "2027-12-02"}}}},
                     {{"label", "Put"}, {"margin", 0.05}, {"tick", 0.01}, {"holding", {{"shares", 150000}}}});
}

json collar_doc() {
    return trade_doc(
        {{"structure", {{"shape", "collar"}, {"strikes", {32, 43.7}}, {"expiry_date", "2027-12-02"}}}},
        {{"label", "Collar"}, {"margin", 0.02}, {"tick", 0.01}, {"two_way", true}, {"holding", {{"shares", 150000}}}});
}

json comparison_of(const std::vector<json>& alternatives) {
    return json{{"comparison", {{"alternatives", alternatives}}}};
}

}  // namespace

TEST_CASE("each alternative's client figures are the price command's", "[compare]") {
    const json r = run_command("compare", comparison_of({put_doc(), collar_doc()}));
    REQUIRE(r["rows"].size() == 2);
    for (std::size_t i = 0; i < 2; ++i) {
        const json priced = run_command("price", i == 0 ? put_doc() : collar_doc());
        const json& row = r["rows"][i];
        CHECK(row["client_price"] == priced["client_price"]["per_unit"]);
        CHECK(row["client_price_total"] == priced["client_price"]["total"]);
        CHECK(row["delta"] == priced["greeks"]["delta"]);
        CHECK(r["alternatives"][i]["at_expiry"] == priced["client_price"]["at_expiry"]);
        CHECK(r["alternatives"][i]["desk"]["model_value"] == priced["client_price"]["mid"]);
    }
    CHECK(r["rows"][0]["label"] == "Put");
    CHECK(r["rows"][0]["protection_from"] == 34);
    CHECK(r["rows"][1]["cap"] == 43.7);
    // The position delta of the put row counts the shares held.
    CHECK(r["rows"][0]["position_delta"].get<double>() == Approx(150000 * (1 + r["rows"][0]["delta"].get<double>())));
    CHECK(r["columns"].size() == r["rows"][0].size());
}

TEST_CASE("the legs as the client deals them, with strikes as a fraction of spot and expiry dates", "[compare]") {
    const json r = run_command("compare", comparison_of({collar_doc()}));
    const json& legs = r["alternatives"][0]["legs"];
    REQUIRE(legs.size() == 2);
    CHECK(legs[0]["side"] == "buys");
    CHECK(legs[0]["type"] == "put");
    CHECK(legs[0]["strike_fraction_of_spot"].get<double>() == Approx(32 / 36.4));
    CHECK(legs[0]["expiry_date"] == "2027-12-02");
    CHECK(legs[1]["side"] == "sells");
    CHECK(legs[1]["notional"].get<double>() == Approx(150000 * 36.4));
}

TEST_CASE("the chart's spots are common and hold every strike and break-even in range", "[compare]") {
    const json r = run_command("compare", comparison_of({put_doc(), collar_doc()}));
    const std::size_t n = r["chart"]["spots"];
    std::vector<double> spots;
    for (const auto& row : r["alternatives"][1]["curve"]) spots.push_back(row["spot"]);
    CHECK(spots.size() == n);
    CHECK(r["alternatives"][0]["curve"].size() == n);
    CHECK(std::is_sorted(spots.begin(), spots.end()));
    for (double k : {32.0, 34.0, 43.7}) CHECK(std::find(spots.begin(), spots.end(), k) != spots.end());
    CHECK(r["outcome_spots"].size() == default_outcome_moves.size());
}

TEST_CASE("a trade document is a comparison of one", "[compare]") {
    const json one = run_command("compare", put_doc());
    const json listed = run_command("compare", comparison_of({put_doc()}));
    CHECK(one["rows"] == listed["rows"]);
}

TEST_CASE("a comparison is checked and its refusals name the field inside it", "[compare]") {
    json other = collar_doc();
    other["market"]["spot"] = 36.5;
    CHECK_THROWS_WITH(
        run_command("compare", comparison_of({put_doc(), other})),
        Catch::StartsWith("comparison.alternatives[1].market.spot: must be the first alternative's spot"));
    json broken = collar_doc();
    broken["quote"]["margin"] = -1;
    CHECK_THROWS_WITH(run_command("compare", comparison_of({put_doc(), broken})),
                      "comparison.alternatives[1].quote.margin: must be >= 0, got -1");
    json dollars = collar_doc();
    dollars["quote"]["currency"] = "USD";
    json euros = put_doc();
    euros["quote"]["currency"] = "EUR";
    CHECK_THROWS_WITH(run_command("compare", comparison_of({euros, dollars})),
                      Catch::StartsWith("comparison.alternatives[1].quote.currency: must be EUR"));
    CHECK_THROWS_WITH(run_command("compare", comparison_of({})),
                      Catch::StartsWith("comparison.alternatives: must be a list of 1 to 4 trade documents"));
    CHECK_THROWS_WITH(run_command("compare", comparison_of({put_doc(), put_doc(), put_doc(), put_doc(), put_doc()})),
                      Catch::StartsWith("comparison.alternatives: must be a list of 1 to 4"));
    json stray = comparison_of({put_doc()});
    stray["comparison"]["colour"] = "red";
    CHECK_THROWS_WITH(run_command("compare", stray), Catch::StartsWith("comparison.colour: unknown field"));
    json low = comparison_of({put_doc()});
    low["comparison"]["spot_low"] = 50;
    low["comparison"]["spot_high"] = 40;
    CHECK_THROWS_WITH(run_command("compare", low), "comparison.spot_high: must be above spot_low 50, got 40");
    CHECK_THROWS_WITH(run_command("price", comparison_of({put_doc()})),
                      Catch::StartsWith("comparison: a comparison of several trades is read by the compare command"));
}
