// Tests for analytics/solve and numerics/root_finder: Brent's root finder and the `solve` command.
#include "analytics/solve.hpp"
#include "commands/trade_reader.hpp"
#include "contract/errors.hpp"
#include "dispatch/dispatch.hpp"
#include "numerics/closed_form.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {

json market(double spot, double vol, double rate, double carry) {
    return json{{"spot", spot}, {"volatility", vol}, {"rate", rate}, {"carry_yield", carry}};
}

json single(const json& m, const std::string& type, double strike, double expiry, const std::string& exercise) {
    return json{{"market", m},
                {"option", {{"type", type}, {"strike", strike}, {"expiry_years", expiry}, {"exercise", exercise}}}};
}

double closed_form_premium(const json& doc) {
    const trade t = read_trade(doc);
    double total = 0;
    for (const auto& leg : t.legs) total += leg.quantity * closed_form(t.market, leg).premium;
    return total;
}

std::string error_field(const json& doc) {
    try {
        run_command("solve", doc);
    } catch (const input_error& e) {
        return e.field();
    }
    return "(no error)";
}

}  // namespace

TEST_CASE("Brent's method finds known roots", "[solver]") {
    // cos x = x: the Dottie number 0.7390851332151607 (common knowledge).
    const root_result dottie = find_root([](double x) { return std::cos(x) - x; }, 0.0, 1.0);
    CHECK(dottie.bracketed);
    CHECK(dottie.converged);
    CHECK(dottie.x == Approx(0.7390851332151607).epsilon(1e-15));
    CHECK(dottie.iterations < 12);
    // x^3 - 2x - 5 = 0, Wallis's classic test equation, root 2.0945514815423265 (from memory).
    const root_result wallis = find_root([](double x) { return x * x * x - 2 * x - 5; }, 2.0, 3.0);
    CHECK(wallis.x == Approx(2.0945514815423265).epsilon(1e-15));
    // A jump is still bracketed and closed down to machine precision (bisection fallback).
    const root_result jump = find_root([](double x) { return x < 0.3 ? -1.0 : 1.0; }, 0.0, 1.0);
    CHECK(jump.converged);
    CHECK(jump.x == Approx(0.3).epsilon(1e-14));
    // A root at an end is returned at once.
    const root_result end = find_root([](double x) { return x - 1; }, 1.0, 2.0);
    CHECK(end.x == 1.0);
    CHECK(end.iterations == 0);
}

TEST_CASE("Brent's method reports an unbracketed root instead of guessing", "[solver]") {
    const root_result r = find_root([](double x) { return x * x + 1; }, -1.0, 2.0);
    CHECK_FALSE(r.bracketed);
    CHECK(r.f_lower == Approx(2.0));
    CHECK(r.f_upper == Approx(5.0));
    CHECK(r.x == -1.0);  // the end nearer a root
}

TEST_CASE("implied volatility round-trips across moneyness and expiries (European, closed form)", "[solver]") {
    // Common practice: price at a known volatility, solve from that premium, get it back.
    const double spot = 100;
    for (const char* type : {"call", "put"})
        for (double strike : {70.0, 90.0, 100.0, 115.0, 140.0})
            for (double expiry : {0.1, 0.5, 2.0, 5.0})
                for (double vol : {0.08, 0.25, 0.6}) {
                    json doc = single(market(spot, vol, 0.03, 0.015), type, strike, expiry, "european");
                    const double target = closed_form_premium(doc);
                    // Premiums with almost no vega cannot pin the volatility down; skip them.
                    const trade t = read_trade(doc);
                    if (closed_form(t.market, t.legs[0]).sensitivities.vega < 1e-3) continue;
                    doc["market"]["volatility"] = 0.4;  // a wrong starting value must not matter
                    doc["solve"] = {{"for", "volatility"}, {"target_premium", target}};
                    const json r = run_command("solve", doc);
                    INFO(type << " K=" << strike << " T=" << expiry << " vol=" << vol);
                    CHECK(r["solution"].get<double>() == Approx(vol).epsilon(1e-7));
                    doc["market"]["volatility"] = r["solution"];
                    // Re-pricing at the solution reproduces the target within 1e-8 of notional (quantity 1).
                    CHECK(std::fabs(closed_form_premium(doc) - target) <= 1e-8 * spot);
                    CHECK(r["pricing"] == "closed-form");
                    CHECK(r["within_tolerance"] == true);
                }
}

TEST_CASE("implied volatility round-trips for American options on the lattice", "[solver]") {
    for (double strike : {85.0, 100.0, 120.0})
        for (double expiry : {0.25, 1.0}) {
            json doc = single(market(100, 0.3, 0.05, 0.0), "put", strike, expiry, "american");
            doc["quantity"] = 5000;
            const json priced = run_command("price", doc);
            const double target = priced["premium"];
            doc["market"]["volatility"] = 0.2;
            doc["solve"] = {{"for", "volatility"}, {"target_premium", target}};
            const json r = run_command("solve", doc);
            INFO("K=" << strike << " T=" << expiry);
            CHECK(r["solution"].get<double>() == Approx(0.3).epsilon(1e-7));
            CHECK(r["pricing"] == "lattice");
            // Re-price through the price command (same lattice): within 1e-8 of notional.
            doc["market"]["volatility"] = r["solution"];
            const double repriced = run_command("price", doc)["premium"];
            CHECK(std::fabs(5000 * (repriced - target)) <= 1e-8 * 5000 * 100);
        }
}

TEST_CASE("implied volatility outside the no-arbitrage range names the bound", "[solver]") {
    json doc = single(market(100, 0.3, 0.05, 0.01), "put", 110, 0.5, "american");
    doc["solve"] = {{"for", "volatility"}, {"target_premium", 9.0}};
    CHECK_THROWS_WITH(run_command("solve", doc),
                      "solve.target_premium: 9 is at or below the lowest premium any volatility gives the american "
                      "put, 10 (intrinsic value max(strike - spot, 0))");
    doc["solve"]["target_premium"] = 111.0;
    CHECK_THROWS_WITH(run_command("solve", doc),
                      "solve.target_premium: 111 is at or above the no-arbitrage upper bound of the american put, 110 "
                      "(strike: a put is never worth more than its strike)");
    // European call: above S e^{-qT} is impossible (Hull, Options, Futures and Other Derivatives, ch. 11 bounds).
    json call = single(market(100, 0.3, 0.05, 0.0), "call", 100, 1.0, "european");
    call["solve"] = {{"for", "volatility"}, {"target_premium", 100.0}};
    CHECK(error_field(call) == "solve.target_premium");
    // Inside the no-arbitrage range but beyond the search range: the bound hit is named.
    call["solve"] = {{"for", "volatility"}, {"target_premium", 30.0}, {"upper", 0.5}};
    CHECK(error_field(call) == "solve.upper");
    call["solve"] = {{"for", "volatility"}, {"target_premium", 5.2}, {"lower", 0.2}};
    CHECK(error_field(call) == "solve.lower");
    call["solve"] = {{"for", "volatility"}, {"target_premium", 10.0}, {"lower", 0.4}, {"upper", 0.3}};
    CHECK_THROWS_WITH(run_command("solve", call), "solve.upper: must be above solve.lower 0.4, got 0.3");
}

TEST_CASE("the volatility behind a competitor's straddle quote", "[solver]") {
    // A straddle's premium rises with volatility, so its quote fixes one volatility.
    json doc{{"market", market(50, 0.22, 0.03, 0.0)},
             {"structure", {{"shape", "straddle"}, {"strikes", {50}}, {"expiry_years", 0.75}}}};
    doc["market"]["volatility"] = 0.31;
    const double quote = closed_form_premium(doc);
    doc["market"]["volatility"] = 0.22;
    doc["solve"] = {{"for", "volatility"}, {"target_premium", quote}};
    const json r = run_command("solve", doc);
    CHECK(r["solution"].get<double>() == Approx(0.31).epsilon(1e-8));
}

TEST_CASE("zero-cost collar: the call strike that pays for the put", "[solver]") {
    // Common practice: long put K1, short call K2 with K2 chosen so the net premium is zero.
    json doc{{"market", market(36.4, 0.27, 0.032, 0.018)},
             {"structure", {{"shape", "collar"}, {"strikes", {32, 42}}, {"expiry_years", 1.0}}},
             {"quantity", 150000},
             {"solve", {{"for", "strike"}, {"leg", 1}}}};
    const json r = run_command("solve", doc);
    const double k2 = r["solution"];
    CHECK(k2 > 36.4);
    // Independent re-pricing of the two legs in closed form.
    json legs{{"market", doc["market"]},
              {"legs",
               {{{"type", "put"}, {"strike", 32}, {"expiry_years", 1.0}, {"quantity", 1}},
                {{"type", "call"}, {"strike", k2}, {"expiry_years", 1.0}, {"quantity", -1}}}}};
    CHECK(std::fabs(150000 * closed_form_premium(legs)) <= 1e-8 * 150000 * 36.4);
    CHECK(r["iterations"].get<int>() < 20);
    CHECK(r["rows"].size() == 2);
    CHECK(r["notes"].empty());
}

TEST_CASE("zero-cost risk reversal struck at the forward is symmetric (put-call parity)", "[solver]") {
    // C(K) - P(K) = S e^{-qT} - K e^{-rT} (put-call parity, Hull, Options, Futures and Other
    // Derivatives, ch. 11), which is zero at K = F = S e^{(r-q)T}: given the put at F the zero-cost
    // call strike is F itself.
    const double spot = 80, r = 0.04, q = 0.01, T = 0.6;
    const double forward = spot * std::exp((r - q) * T);
    json doc{{"market", market(spot, 0.35, r, q)},
             {"structure", {{"shape", "risk-reversal"}, {"strikes", {forward, forward * 1.1}}, {"expiry_years", T}}},
             {"solve", {{"for", "strike"}, {"leg", 0}, {"target_premium", 0}}}};
    const json res = run_command("solve", doc);
    CHECK(res["solution"].get<double>() == Approx(forward).epsilon(1e-9));
}

TEST_CASE("zero-cost seagull and a target premium for a put spread", "[solver]") {
    json doc{{"market", market(120, 0.3, 0.03, 0.0)},
             {"structure",
              {{"shape", "seagull"}, {"strikes", {95, 125, 150}}, {"expiry_years", 1.0}, {"exercise", "american"}}},
             {"solve", {{"for", "strike"}, {"leg", 0}, {"target_premium", 0}}}};
    const json r = run_command("solve", doc);
    CHECK(r["pricing"] == "lattice");
    CHECK(std::fabs(r["residual"].get<double>()) <= 1e-8 * 120);
    // Re-price the solved seagull through the price command (same lattice).
    doc["structure"]["strikes"][0] = r["solution"];
    doc.erase("solve");
    CHECK(std::fabs(run_command("price", doc)["premium"].get<double>()) <= 1e-8 * 120);

    json spread{{"market", market(100, 0.2, 0.02, 0.0)},
                {"structure", {{"shape", "put-spread"}, {"strikes", {80, 100}}, {"expiry_years", 0.5}}},
                {"solve", {{"for", "strike"}, {"leg", 1}, {"target_premium", 3.0}}}};
    const json s = run_command("solve", spread);
    CHECK(s["premium_at_solution"].get<double>() == Approx(3.0).epsilon(1e-9));
}

TEST_CASE("a strike solve with no solution names the bound that was hit", "[solver]") {
    json doc{{"market", market(36.4, 0.27, 0.032, 0.018)},
             {"structure", {{"shape", "collar"}, {"strikes", {32, 42}}, {"expiry_years", 1.0}}},
             {"solve", {{"for", "strike"}, {"leg", 1}, {"target_premium", 5.0}}}};
    // The collar's net premium is at most the put's premium (about 1.69): the upper bound is hit.
    try {
        run_command("solve", doc);
        FAIL("expected an error");
    } catch (const input_error& e) {
        CHECK(e.field() == "solve.upper");
        CHECK(std::string(e.what()).find("no solution: the highest net premium in the search range is") !=
              std::string::npos);
        CHECK(std::string(e.what()).find("below the target 5") != std::string::npos);
    }
    doc["solve"].erase("leg");
    CHECK_THROWS_WITH(run_command("solve", doc),
                      Catch::StartsWith("solve.leg: is required: which leg's strike to solve (0 to 1"));
    doc["solve"]["leg"] = 2;
    CHECK_THROWS_WITH(run_command("solve", doc), "solve.leg: must be between 0 and 1, got 2");
    json covered{{"market", market(36.4, 0.27, 0.032, 0.018)},
                 {"structure", {{"shape", "covered-call"}, {"strikes", {40}}, {"expiry_years", 1.0}}},
                 {"solve", {{"for", "strike"}, {"leg", 0}}}};
    CHECK_THROWS_WITH(run_command("solve", covered), "solve.leg: leg 0 is the stock; it has no strike to solve");
}

TEST_CASE("a solved strike that crosses another leg is flagged", "[solver]") {
    // With a high carry yield the forward sits far below spot: the zero-cost call
    // for a put struck just under spot ends up below the put strike.
    json doc{{"market", market(100, 0.2, 0.0, 0.3)},
             {"structure", {{"shape", "collar"}, {"strikes", {95, 110}}, {"expiry_years", 1.0}}},
             {"solve", {{"for", "strike"}, {"leg", 1}}}};
    const json r = run_command("solve", doc);
    CHECK(r["solution"].get<double>() < 95);
    REQUIRE(r["notes"].size() == 1);
    CHECK(r["notes"][0].get<std::string>().find("no longer make the same shape") != std::string::npos);
}

TEST_CASE("quantity for a premium budget", "[solver]") {
    json doc = single(market(100, 0.25, 0.03, 0.0), "call", 105, 1.0, "european");
    doc["solve"] = {{"for", "quantity"}, {"budget", 250000}, {"lot_size", 100}};
    const json r = run_command("solve", doc);
    const double premium = closed_form_premium(doc);
    CHECK(r["solution"].get<double>() == Approx(250000 / premium).epsilon(1e-12));
    CHECK(std::fabs(r["solution"].get<double>() * premium - 250000) <= 1e-8 * r["notional"].get<double>());
    const double lots = r["quantity_in_lots"];
    CHECK(std::fmod(lots, 100.0) == 0);
    CHECK(lots <= r["solution"].get<double>());
    CHECK(lots + 100 > r["solution"].get<double>());
    CHECK(r["budget_left"].get<double>() >= 0);

    json collar{{"market", market(100, 0.25, 0.03, 0.0)},
                {"structure", {{"shape", "collar"}, {"strikes", {90, 103}}, {"expiry_years", 1.0}}},
                {"solve", {{"for", "quantity"}, {"budget", 1000}}}};
    CHECK_THROWS_WITH(run_command("solve", collar), Catch::StartsWith("solve.budget: the net premium per unit is -"));
}

TEST_CASE("the solve section is read strictly", "[solver]") {
    json doc = single(market(100, 0.25, 0.03, 0.0), "call", 105, 1.0, "european");
    CHECK_THROWS_WITH(run_command("solve", doc), Catch::StartsWith("solve: is required for the solve command"));
    doc["solve"] = {{"for", "vol"}};
    CHECK_THROWS_WITH(run_command("solve", doc),
                      "solve.for: must be one of volatility, strike, quantity, got string \"vol\"");
    doc["solve"] = {{"for", "volatility"}, {"target_premium", 10}, {"uper", 2}};
    CHECK_THROWS_WITH(run_command("solve", doc), "solve.uper: unknown field (did you mean \"upper\"?)");
    doc["solve"] = {{"for", "volatility"}};
    CHECK_THROWS_WITH(run_command("solve", doc), "solve.target_premium: is required but missing");
}
