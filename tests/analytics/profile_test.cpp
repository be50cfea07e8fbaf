// Tests for analytics/profile: payoff at expiry, break-even points and the profile command.
#include "analytics/profile.hpp"
#include "commands/trade_reader.hpp"
#include "contract/errors.hpp"
#include "dispatch/dispatch.hpp"
#include "numerics/closed_form.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <functional>

using namespace hedgeleaf;

namespace {

json shape_doc(const std::string& shape, const std::vector<double>& strikes) {
    return json{{"market", {{"spot", 100}, {"volatility", 0.25}, {"rate", 0.03}, {"carry_yield", 0.01}}},
                {"structure", {{"shape", shape}, {"strikes", strikes}, {"expiry_years", 1.0}}},
                {"profile", {{"points", 5}}}};
}

std::vector<double> break_even(const json& r) { return r["break_even"].get<std::vector<double>>(); }

}  // namespace

TEST_CASE("break-even points of every shape match the textbook formulas", "[profile]") {
    // Common practice (payoff diagrams): p = net premium per unit.
    struct expected {
        std::string shape;
        std::vector<double> strikes;
        std::function<std::vector<double>(double)> formula;
    };
    const std::vector<expected> all = {
        {"call-spread", {95, 110}, [](double p) { return std::vector<double>{95 + p}; }},
        {"put-spread", {90, 105}, [](double p) { return std::vector<double>{105 - p}; }},
        {"straddle",
         {100},
         [](double p) {
             return std::vector<double>{100 - p, 100 + p};
         }},
        {"strangle",
         {90, 110},
         [](double p) {
             return std::vector<double>{90 - p, 110 + p};
         }},
        {"risk-reversal", {90, 110}, [](double p) { return std::vector<double>{110 + p}; }},  // p > 0 here
        {"seagull", {85, 100, 120}, [](double p) { return std::vector<double>{100 + p}; }},   // 0 < p < 20
        {"covered-call", {110}, [](double p) { return std::vector<double>{p}; }},             // share cost less call
        {"collar", {90, 112}, [](double p) { return std::vector<double>{112 - p}; }},         // p < 0: a credit
    };
    for (const auto& e : all) {
        INFO(e.shape);
        const json r = run_command("profile", shape_doc(e.shape, e.strikes));
        const double p = r["premium"];
        const std::vector<double> want = e.formula(p);
        const std::vector<double> got = break_even(r);
        REQUIRE(got.size() == want.size());
        for (std::size_t i = 0; i < want.size(); ++i) CHECK(got[i] == Approx(want[i]).epsilon(1e-12));
        CHECK(r["break_even_ranges"].empty());
    }
}

TEST_CASE("max and min P&L at expiry, unbounded as null", "[profile]") {
    const json spread = run_command("profile", shape_doc("call-spread", {95, 110}));
    const double p = spread["premium"];
    CHECK(spread["max_pnl_at_expiry"].get<double>() == Approx(15 - p));
    CHECK(spread["min_pnl_at_expiry"].get<double>() == Approx(-p));
    const json straddle = run_command("profile", shape_doc("straddle", {100}));
    CHECK(straddle["max_pnl_at_expiry"].is_null());
    CHECK(straddle["min_pnl_at_expiry"].get<double>() == Approx(-straddle["premium"].get<double>()));
    // Selling the straddle: the position's worst case is unbounded, its best the premium.
    json sold = shape_doc("straddle", {100});
    sold["side"] = "sell";
    sold["quantity"] = 10;
    const json s = run_command("profile", sold);
    CHECK(s["position_min_pnl_at_expiry"].is_null());
    CHECK(s["position_max_pnl_at_expiry"].get<double>() == Approx(10 * s["premium"].get<double>()));
}

TEST_CASE("a zero-cost collar breaks even all the way between its strikes", "[profile]") {
    json doc = shape_doc("collar", {90, 110});
    doc["solve"] = {{"for", "strike"}, {"leg", 1}};
    const double k2 = run_command("solve", doc)["solution"];
    doc["structure"]["strikes"][1] = k2;
    const json r = run_command("profile", doc);
    REQUIRE(r["break_even_ranges"].size() == 1);
    CHECK(r["break_even_ranges"][0][0].get<double>() == Approx(90));
    CHECK(r["break_even_ranges"][0][1].get<double>() == Approx(k2));
}

TEST_CASE("financing the premium moves the break-even by the carry", "[profile]") {
    json doc = shape_doc("call-spread", {95, 110});
    doc["profile"]["finance_premium"] = true;
    const json r = run_command("profile", doc);
    const double p = r["premium"];
    CHECK(r["cost_at_expiry"].get<double>() == Approx(p * std::exp(0.03)));
    CHECK(break_even(r)[0] == Approx(95 + p * std::exp(0.03)).epsilon(1e-12));
}

TEST_CASE("profile rows: payoff, P&L and value today", "[profile]") {
    json doc = shape_doc("straddle", {100});
    doc["profile"] = {{"spot_low", 80}, {"spot_high", 120}, {"points", 5}};
    doc["quantity"] = 1000;
    const json r = run_command("profile", doc);
    const double p = r["premium"];
    REQUIRE(r["rows"].size() == 5);
    const double spots[] = {80, 90, 100, 110, 120};
    for (std::size_t i = 0; i < 5; ++i) {
        const json& row = r["rows"][i];
        CHECK(row["spot"].get<double>() == Approx(spots[i]));
        CHECK(row["payoff"].get<double>() == Approx(std::fabs(spots[i] - 100)));
        CHECK(row["pnl_at_expiry"].get<double>() == Approx(std::fabs(spots[i] - 100) - p));
        CHECK(row["position_pnl_at_expiry"].get<double>() == Approx(1000 * (std::fabs(spots[i] - 100) - p)));
    }
    // At today's spot the fast lattice agrees with the price and shows no P&L.
    CHECK(r["rows"][2]["value_today"].get<double>() == Approx(p).margin(1e-4));
    CHECK(r["rows"][2]["pnl_today"].get<double>() == 0.0);
    // A straddle today is worth more away from the strike.
    CHECK(r["rows"][0]["pnl_today"].get<double>() > 0);
}

TEST_CASE("legs with different expiries: profile at the first expiry, later legs in closed form", "[profile]") {
    json doc{{"market", {{"spot", 100}, {"volatility", 0.25}, {"rate", 0.03}}},
             {"legs",
              {{{"type", "put"}, {"strike", 95}, {"expiry_years", 0.5}, {"quantity", -1}},
               {{"type", "call"}, {"strike", 105}, {"expiry_years", 1.0}, {"quantity", 1}}}}};
    const json r = run_command("profile", doc);
    CHECK(r["horizon_years"] == 0.5);
    CHECK_FALSE(r.contains("max_pnl_at_expiry"));
    const trade t = read_trade(doc);
    const double cost = r["premium"];
    REQUIRE_FALSE(r["break_even"].empty());
    for (double s : break_even(r)) CHECK(horizon_payoff(t, s, 0.5) - cost == Approx(0).margin(1e-9));
    // The payoff at the first expiry: the put pays, the call is worth its closed form for half a year.
    option_leg call = t.legs[1];
    call.expiry_years = 0.5;
    market_data m = t.market;
    m.spot = 90;
    CHECK(horizon_payoff(t, 90, 0.5) == Approx(-5 + closed_form(m, call).premium).epsilon(1e-12));
}

TEST_CASE("the profile section is read strictly", "[profile]") {
    json doc = shape_doc("straddle", {100});
    doc["profile"] = {{"points", 1}};
    CHECK_THROWS_WITH(run_command("profile", doc), "profile.points: must be between 2 and 501, got 1");
    doc["profile"] = {{"spot_low", 120}, {"spot_high", 80}};
    CHECK_THROWS_WITH(run_command("profile", doc), "profile.spot_high: must be above spot_low 120, got 80");
    doc["profile"] = {{"spot_lo", 80}};
    CHECK_THROWS_WITH(run_command("profile", doc), "profile.spot_lo: unknown field (did you mean \"spot_low\"?)");
}
