// Tests for analytics/pricing: a leg priced once per engine for the same inputs. Remembering a
// result (memoisation) must be invisible: every input a leg's price depends on tells two trades
// apart, and a remembered price is the fresh one to the last bit (common practice for a cache).
#include "analytics/pricing.hpp"
#include "analytics/leg_market.hpp"

#include "../test_support.hpp"

#include <catch2/catch.hpp>

#include <functional>
#include <string>
#include <utility>
#include <vector>

using namespace hedgeleaf;

namespace {

// The three-style structure on the downside skew (tests/test_support.hpp) with rate, yield and
// borrow curves: every part of the market a leg's lattice reads.
json base_document() {
    json d = three_styles(json::parse(downside_skew));
    d["market"]["rate"] = json::parse(R"({"points": [{"years": 0.5, "rate": 0.03}, {"years": 2, "rate": 0.035}]})");
    d["market"]["carry_yield"] = json::parse(R"({"points": [{"years": 1, "rate": 0.01}]})");
    d["market"]["borrow"] = 0.004;
    d["lattice"]["steps"] = 201;
    return d;
}

/// The trade's premium with every leg priced afresh (numerics, no memory).
double fresh_premium(const trade& t) {
    double sum = 0;
    for (const option_leg& leg : t.legs)
        sum += leg.quantity * price_leg(leg_market(t.market, leg), leg, t.lattice).premium;
    return sum;
}

}  // namespace

TEST_CASE("a leg priced once: every input tells two trades apart, and a remembered price is the fresh one",
          "[analytics][pricing]") {
    const std::vector<std::pair<std::string, std::function<void(json&)>>> changes = {
        {"spot", [](json& d) { d["market"]["spot"] = 101; }},
        {"a smile cell", [](json& d) { d["market"]["volatility"]["vols"][0][1] = 0.28; }},
        {"the smile's strike basis", [](json& d) { d["market"]["volatility"]["strike_basis"] = "percent_of_forward"; }},
        {"a rate curve point", [](json& d) { d["market"]["rate"]["points"][1]["rate"] = 0.036; }},
        {"the yield curve",
         [](json& d) {
             d["market"]["carry_yield"]["points"].push_back({{"years", 2}, {"rate", 0.015}});
         }},
        {"borrow", [](json& d) { d["market"]["borrow"] = 0.005; }},
        {"a dividend's amount", [](json& d) { d["market"]["dividends"][0]["amount"] = 1.3; }},
        {"a dividend's date", [](json& d) { d["market"]["dividends"][0]["time_years"] = 0.45; }},
        {"a strike", [](json& d) { d["legs"][0]["strike"] = 91; }},
        {"an expiry", [](json& d) { d["legs"][1]["expiry_years"] = 1.1; }},
        {"an exercise style", [](json& d) { d["legs"][1]["exercise"] = "american"; }},
        {"a Bermudan date", [](json& d) { d["legs"][2]["exercise_years"][0] = 0.8; }},
        {"a leg's type", [](json& d) { d["legs"][0]["type"] = "call"; }},
        {"lattice steps", [](json& d) { d["lattice"]["steps"] = 203; }},
        {"lattice method", [](json& d) { d["lattice"]["method"] = "crr"; }},
        {"extrapolation", [](json& d) { d["lattice"]["extrapolate"] = false; }},
        {"a quantity (the premium scales, the leg's price does not move)",
         [](json& d) { d["legs"][0]["quantity"] = 2; }},
    };
    const trade base = trade_of(base_document().dump());
    const double base_premium = price_trade(base, bumped_greeks::off).premium;
    CHECK(base_premium == fresh_premium(base));
    for (const auto& [name, change] : changes) {
        INFO("changed: " << name);
        json d = base_document();
        change(d);
        const trade changed = trade_of(d.dump());
        price_trade(base, bumped_greeks::off);  // the base is the freshest memory
        const double premium = price_trade(changed, bumped_greeks::off).premium;
        CHECK(premium == fresh_premium(changed));
        CHECK(premium != base_premium);
        // asked again (now remembered): the same to the last bit
        CHECK(price_trade(changed, bumped_greeks::off).premium == premium);
    }
}

TEST_CASE("a leg priced once: the price command's Greeks and bound are not taken for a plain price, nor back",
          "[analytics][pricing]") {
    const trade t = trade_of(base_document().dump());
    const trade_result plain = price_trade(t, bumped_greeks::off);
    const trade_result full = price_trade(t, bumped_greeks::on, error_bound::on);
    CHECK(plain.sensitivities.vega == 0);
    CHECK(full.sensitivities.vega != 0);
    CHECK(full.error_estimate > 0);
    const trade_result again = price_trade(t, bumped_greeks::off);
    CHECK(again.sensitivities.vega == 0);
    CHECK(again.error_estimate == 0);
    CHECK(again.premium == plain.premium);
}
