// Tests for contract/structures: every ready-made shape prices as the sum of its
// legs, and the shapes obey the parity relations between calls, puts and shares.
#include "contract/structures.hpp"
#include "commands/trade_reader.hpp"
#include "contract/errors.hpp"
#include "dispatch/dispatch.hpp"
#include "numerics/closed_form.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {

constexpr double spot = 100, vol = 0.25, rate = 0.04, carry = 0.015, expiry = 0.75;

json market_json() { return json{{"spot", spot}, {"volatility", vol}, {"rate", rate}, {"carry_yield", carry}}; }

json shape_doc(const std::string& shape, const std::vector<double>& strikes, const std::string& exercise = "european") {
    return json{
        {"market", market_json()},
        {"structure", {{"shape", shape}, {"strikes", strikes}, {"expiry_years", expiry}, {"exercise", exercise}}}};
}

json option_doc(const std::string& type, double strike, const std::string& exercise = "european") {
    return json{{"market", market_json()},
                {"option", {{"type", type}, {"strike", strike}, {"expiry_years", expiry}, {"exercise", exercise}}}};
}

/// Closed-form European premium of one option at this market.
double bsm(const std::string& type, double strike) {
    const trade t = read_trade(option_doc(type, strike));
    return closed_form(t.market, t.legs[0]).premium;
}

double lattice_premium(const json& doc) { return run_command("price", doc)["premium"]; }

// Leisen-Reimer with Richardson at the default steps is far inside this for European legs.
constexpr double lattice_margin = 1e-6 * spot;

}  // namespace

TEST_CASE("every shape's net premium is the signed sum of its legs in closed form", "[structures]") {
    struct expected {
        std::string shape;
        std::vector<double> strikes;
        double premium;
    };
    const std::vector<expected> all = {
        {"call-spread", {95, 110}, bsm("call", 95) - bsm("call", 110)},
        {"put-spread", {85, 100}, bsm("put", 100) - bsm("put", 85)},
        {"collar", {90, 112}, bsm("put", 90) - bsm("call", 112)},
        {"risk-reversal", {90, 112}, bsm("call", 112) - bsm("put", 90)},
        {"straddle", {100}, bsm("call", 100) + bsm("put", 100)},
        {"strangle", {90, 110}, bsm("put", 90) + bsm("call", 110)},
        {"seagull", {85, 100, 120}, -bsm("put", 85) + bsm("call", 100) - bsm("call", 120)},
        {"covered-call", {110}, spot - bsm("call", 110)},
    };
    REQUIRE(all.size() == structure_shapes().size());
    for (const auto& e : all) {
        INFO(e.shape);
        const json r = run_command("price", shape_doc(e.shape, e.strikes));
        CHECK(r["premium"].get<double>() == Approx(e.premium).margin(lattice_margin));
        CHECK(r["closed_form"]["premium"].get<double>() == Approx(e.premium).margin(1e-12));
    }
}

TEST_CASE("closed form against a published example: the straddle is the call plus the put", "[structures]") {
    // J. C. Hull, Options, Futures and Other Derivatives, the worked example of the
    // Black-Scholes-Merton chapter: S = 42, K = 40, r = 10 %, sigma = 20 %, T = 0.5 gives
    // call 4.76 and put 0.81 (from memory, to 2 decimals).
    const json doc{{"market", {{"spot", 42}, {"volatility", 0.2}, {"rate", 0.1}}},
                   {"structure", {{"shape", "straddle"}, {"strikes", {40}}, {"expiry_years", 0.5}}}};
    const json r = run_command("price", doc);
    CHECK(r["legs"][0]["premium"].get<double>() == Approx(4.76).margin(0.005));
    CHECK(r["legs"][1]["premium"].get<double>() == Approx(0.81).margin(0.005));
    CHECK(r["premium"].get<double>() == Approx(4.76 + 0.81).margin(0.01));
}

TEST_CASE("straddle = call + put, on the lattice too (American)", "[structures]") {
    for (const char* ex : {"european", "american"}) {
        INFO(ex);
        const double straddle = lattice_premium(shape_doc("straddle", {100}, ex));
        const double call = lattice_premium(option_doc("call", 100, ex));
        const double put = lattice_premium(option_doc("put", 100, ex));
        CHECK(straddle == Approx(call + put).margin(1e-12));
    }
}

TEST_CASE("risk reversal at one strike is a synthetic forward (put-call parity)", "[structures]") {
    // C(K) - P(K) = S e^{-qT} - K e^{-rT} for European options (Hull, ch. 11, put-call parity).
    for (double k : {80.0, 100.0, 125.0}) {
        const json doc{{"market", market_json()},
                       {"legs",
                        {{{"type", "call"}, {"strike", k}, {"expiry_years", expiry}, {"quantity", 1}},
                         {{"type", "put"}, {"strike", k}, {"expiry_years", expiry}, {"quantity", -1}}}}};
        const json r = run_command("price", doc);
        const double forward_value = spot * std::exp(-carry * expiry) - k * std::exp(-rate * expiry);
        CHECK(r["premium"].get<double>() == Approx(forward_value).margin(lattice_margin));
        CHECK(r["closed_form"]["premium"].get<double>() == Approx(forward_value).margin(1e-12));
        // A forward's delta is e^{-qT} and its gamma zero (lattice deltas: a few 1e-5).
        CHECK(r["greeks"]["delta"].get<double>() == Approx(std::exp(-carry * expiry)).margin(1e-4));
        CHECK(r["greeks"]["gamma"].get<double>() == Approx(0).margin(1e-6));
    }
}

TEST_CASE("covered call = share - call, and a collar on a holding caps both ways", "[structures]") {
    const json cc = run_command("price", shape_doc("covered-call", {110}));
    CHECK(cc["premium"].get<double>() == Approx(spot - bsm("call", 110)).margin(lattice_margin));
    CHECK(cc["greeks"]["delta"].get<double>() ==
          Approx(1 - cc["legs"][1]["greeks"]["delta"].get<double>()).margin(1e-12));
    // Share + collar(K1, K2) is worth between K1 e^{-rT} and K2 e^{-rT} (no-arbitrage bounds).
    const double collar = lattice_premium(shape_doc("collar", {90, 112}));
    CHECK(spot + collar > 90 * std::exp(-rate * expiry));
    CHECK(spot + collar < 112 * std::exp(-rate * expiry));
}

TEST_CASE("spreads are bounded by their discounted width", "[structures]") {
    const double width = 15 * std::exp(-rate * expiry);
    const double call_spread = lattice_premium(shape_doc("call-spread", {95, 110}));
    const double put_spread = lattice_premium(shape_doc("put-spread", {95, 110}));
    CHECK(call_spread > 0);
    CHECK(call_spread < width);
    CHECK(put_spread > 0);
    CHECK(put_spread < width);
    // Box: call spread + put spread on the same strikes = the discounted width (parity).
    CHECK(call_spread + put_spread == Approx(width).margin(2 * lattice_margin));
}

TEST_CASE("a strangle costs less than the straddle between its strikes", "[structures]") {
    CHECK(lattice_premium(shape_doc("strangle", {90, 110})) < lattice_premium(shape_doc("straddle", {100})));
    CHECK(lattice_premium(shape_doc("strangle", {90, 110})) ==
          Approx(bsm("put", 90) + bsm("call", 110)).margin(lattice_margin));
}

TEST_CASE("net Greeks are the signed sum of leg Greeks", "[structures]") {
    const json r = run_command("price", shape_doc("seagull", {85, 100, 120}, "american"));
    double delta = 0, gamma = 0, vega = 0;
    for (const auto& leg : r["legs"]) {
        delta += leg["quantity"].get<double>() * leg["greeks"]["delta"].get<double>();
        gamma += leg["quantity"].get<double>() * leg["greeks"]["gamma"].get<double>();
        vega += leg["quantity"].get<double>() * leg["greeks"]["vega"].get<double>();
    }
    CHECK(r["greeks"]["delta"].get<double>() == Approx(delta).margin(1e-12));
    CHECK(r["greeks"]["gamma"].get<double>() == Approx(gamma).margin(1e-12));
    CHECK(r["greeks"]["vega"].get<double>() == Approx(vega).margin(1e-12));
}

TEST_CASE("structure input errors name the field", "[structures]") {
    json doc = shape_doc("collar", {110, 90});
    CHECK_THROWS_WITH(run_command("price", doc),
                      "structure.strikes[1]: strikes must be in ascending order, got 90 after 110");
    doc = shape_doc("seagull", {90, 110});
    CHECK_THROWS_WITH(run_command("price", doc), "structure.strikes: a seagull takes 3 strikes, got 2");
    doc = shape_doc("butterfly", {90, 100, 110});
    CHECK_THROWS_WITH(run_command("price", doc), Catch::StartsWith("structure.shape: must be one of call-spread"));
}
