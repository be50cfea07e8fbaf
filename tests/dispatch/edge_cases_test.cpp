// Numerical edge cases: one-day and 30-year expiries, tiny and huge volatility within
// range, deep in and out of the money, zero and negative rates, carry above the rate.
// Every command's result must be finite at each edge, and prices must move by small
// steps when an input crosses an edge in small steps (no jump, no sudden refusal).
//
// Negative rates are allowed (market.rate and carry_yield within [-1, 1], continuously
// compounded): discount factors exp(-rate T) above 1 are used as they come.
#include "analytics/pricing.hpp"
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"
#include "numerics/closed_form.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <functional>
#include <string>
#include <vector>

using namespace hedgeleaf;

namespace {

struct edge {
    std::string type = "put";
    std::string exercise = "american";
    double spot = 100, strike = 100, volatility = 0.2, rate = 0.03, carry = 0, years = 1;
    std::string method = "leisen-reimer";
};

json document(const edge& e) {
    return json{
        {"market", {{"spot", e.spot}, {"volatility", e.volatility}, {"rate", e.rate}, {"carry_yield", e.carry}}},
        {"option", {{"type", e.type}, {"strike", e.strike}, {"expiry_years", e.years}, {"exercise", e.exercise}}},
        {"lattice", {{"method", e.method}}}};
}

trade_result price(const edge& e) { return price_trade(read_trade(document(e)), bumped_greeks::on); }

double european_reference(const edge& e) {
    const trade t = read_trade(document(e));
    return closed_form(t.market, t.legs[0]).premium;
}

bool all_finite(const json& node) {
    if (node.is_number()) return std::isfinite(node.get<double>());
    if (node.is_object() || node.is_array())
        return std::all_of(node.begin(), node.end(), [](const json& e) { return all_finite(e); });
    return true;
}

bool finite_greeks(const greeks& g) {
    return std::isfinite(g.delta) && std::isfinite(g.gamma) && std::isfinite(g.theta) && std::isfinite(g.vega) &&
           std::isfinite(g.rho);
}

/// Every command on the edge trade: a finite result, or (solve only) a refusal naming a field.
void every_command_finite(const edge& e) {
    json doc = document(e);
    const double premium = price(e).premium;
    doc["hedge"] = {{"rebalance", {{"every", 1}, {"unit", e.years > 2 ? "months" : "weeks"}}}};
    doc["simulate"] = {{"paths", 200}, {"frequencies", {{{"every", 1}, {"unit", "months"}}}}};
    doc["solve"] = {{"for", "volatility"}, {"target_premium", premium}};
    for (const auto& command : command_names()) {
        INFO("command " << command);
        try {
            const json result = run_command(command, doc);
            CHECK(all_finite(result));
        } catch (const input_error& err) {
            // Solving for a volatility is ill-posed where the premium hardly depends on it.
            CHECK(command == "solve");
            CHECK(std::string(err.what()).rfind("solve.", 0) == 0);
        }
    }
}

/// Walk `x` from `from` to `to` in `count` steps; consecutive premiums may differ by at
/// most 1.5 x slope x step plus the lattice error estimates (a jump or a refusal fails).
void continuous(const std::string& what, edge e, double edge::*field, double from, double to, int count,
                const std::function<double(const trade_result&, const edge&)>& slope) {
    INFO("sweep of " << what << " from " << from << " to " << to);
    const double h = (to - from) / count;
    e.*field = from;
    trade_result before = price(e);
    double bound_before = slope(before, e);
    for (int i = 1; i <= count; ++i) {
        e.*field = from + i * h;
        INFO("at " << e.*field);
        const trade_result now = price(e);
        REQUIRE(std::isfinite(now.premium));
        REQUIRE(finite_greeks(now.sensitivities));
        const double bound_now = slope(now, e);
        const double allowed = 1.5 * std::max(bound_before, bound_now) * std::fabs(h) +
                               2 * (before.error_estimate + now.error_estimate) + 1e-9 * e.spot;
        CHECK(std::fabs(now.premium - before.premium) <= allowed);
        before = now;
        bound_before = bound_now;
    }
}

}  // namespace

TEST_CASE("one-day and 30-year expiries", "[edge_cases]") {
    for (const double years : {1.0 / 365, 30.0}) {
        INFO("expiry " << years << " years");
        for (const char* type : {"call", "put"}) {
            edge e;
            e.type = type;
            e.years = years;
            e.exercise = "european";
            // European: the lattice agrees with the closed form (generalised Black-Scholes-Merton).
            const trade_result eu = price(e);
            CHECK(eu.premium == Approx(european_reference(e)).epsilon(1e-5).margin(1e-8));
            CHECK(finite_greeks(eu.sensitivities));
            // American: worth at least its European twin and its exercise value (common practice).
            e.exercise = "american";
            const trade_result am = price(e);
            CHECK(am.premium >= eu.premium - am.error_estimate - 1e-9);
            CHECK(finite_greeks(am.sensitivities));
            every_command_finite(e);
        }
    }
}

TEST_CASE("tiny and huge volatility within range", "[edge_cases]") {
    edge e;
    e.type = "call";
    e.exercise = "european";
    // As volatility goes to 0 a call is worth its discounted forward intrinsic value:
    // max(S e^-qT - K e^-rT, 0) = 100 - 100 e^-0.03 = 2.955446645... (common practice).
    for (const double vol : {1e-3, 2e-3}) {  // 1e-3: the floor (contract/limits.hpp min_volatility)
        e.volatility = vol;
        INFO("volatility " << vol);
        CHECK(price(e).premium == Approx(100 - 100 * std::exp(-0.03)).epsilon(1e-6));
        CHECK(price(e).premium == Approx(european_reference(e)).epsilon(1e-6));
    }
    // At 500 % a year for 16 years (volatility x sqrt(expiry) = 20, the widest spread the
    // lattice takes) a call is worth the share and a put the discounted strike less almost
    // nothing (S N(d1) -> S, N(-d1) -> 0; common practice).
    e.volatility = 5;
    e.years = 16;
    CHECK(price(e).premium == Approx(100).epsilon(1e-6));
    e.type = "put";
    CHECK(price(e).premium == Approx(european_reference(e)).epsilon(1e-4).margin(1e-9));
    // Past that spread the lattice would clamp the spots that carry a call's value: refused,
    // naming the volatility, instead of a wrong premium.
    e.years = 30;
    CHECK_THROWS_WITH(price(e), Catch::Contains("market.volatility: 5 over 30 years spreads spot too wide") &&
                                    Catch::Contains("at most 3.6514"));
    for (const double vol : {1e-3, 5.0}) {
        edge a;
        a.volatility = vol;
        every_command_finite(a);
    }
}

TEST_CASE("every lattice method holds the widest spread it accepts", "[edge_cases]") {
    // A European call at the limit (volatility x sqrt(expiry) = 20: 2.8284 over 50 years)
    // against the closed form (Black-Scholes-Merton; common practice): the lattice must not
    // clamp away the far spots that carry the value. Before the limit, 500 % over 50 years
    // priced a call worth about 100 at 0.018 (Leisen-Reimer) and -2.8 (CRR).
    for (const char* method : {"crr", "jarrow-rudd", "tian", "leisen-reimer"}) {
        for (const char* type : {"call", "put"}) {
            edge e;
            e.type = type;
            e.exercise = "european";
            e.volatility = 2.8284;
            e.years = 50;
            e.method = method;
            INFO(method << " " << type);
            CHECK(price(e).premium == Approx(european_reference(e)).epsilon(1e-6).margin(1e-7));
        }
    }
}

TEST_CASE("deep in and out of the money", "[edge_cases]") {
    for (const double vol : {0.005, 0.2}) {
        for (const double strike : {0.1, 20.0, 50.0, 200.0, 1000.0, 100000.0}) {
            for (const char* type : {"call", "put"}) {
                edge e;
                e.type = type;
                e.volatility = vol;
                e.strike = strike;
                INFO(type << " strike " << strike << " volatility " << vol);
                e.exercise = "european";
                const trade_result eu = price(e);
                CHECK(eu.premium == Approx(european_reference(e)).epsilon(1e-6).margin(1e-9 * strike));
                e.exercise = "american";
                const trade_result am = price(e);
                const double intrinsic = std::max(0.0, std::string(type) == "call" ? 100 - strike : strike - 100);
                CHECK(am.premium >= std::max(eu.premium, intrinsic) - am.error_estimate - 1e-9 * strike);
                CHECK(finite_greeks(am.sensitivities));
            }
        }
    }
    edge deep;
    deep.volatility = 0.005;
    deep.strike = 50;
    every_command_finite(deep);
}

TEST_CASE("zero and negative rates", "[edge_cases]") {
    for (const double rate : {0.0, -0.005, -0.02, -0.5}) {
        INFO("rate " << rate);
        edge e;
        e.rate = rate;
        // Bounds P >= K e^-rT - S e^-qT and C >= S e^-qT - K e^-rT (Merton 1973, "Theory of
        // rational option pricing"; from memory): with rate <= 0 <= carry the European put
        // is worth at least its exercise value, so an American put is never exercised early
        // and equals the closed-form European value to within the lattice error; a call is
        // never exercised early only when carry <= 0 <= rate, so below zero it is dearer.
        const trade_result put = price(e);
        CHECK(std::fabs(put.premium - european_reference(e)) <= put.error_estimate + 1e-7);
        e.type = "call";
        const trade_result call = price(e);
        if (rate == 0)
            CHECK(std::fabs(call.premium - european_reference(e)) <= call.error_estimate + 1e-7);
        else
            CHECK(call.premium > european_reference(e) + call.error_estimate);
        CHECK(call.premium >= 0.0 - call.error_estimate);  // at the money: exercise value 0
        // Put-call parity for the European pair: C - P = S e^-qT - K e^-rT (Hull, "Options,
        // Futures, and Other Derivatives", 10th ed., eq. 11.6 / 17.3).
        e.exercise = "european";
        const double c = price(e).premium;
        e.type = "put";
        const double p = price(e).premium;
        CHECK(c - p == Approx(100 - 100 * std::exp(-rate)).margin(1e-6));
        every_command_finite(e);
    }
}

TEST_CASE("negative rate and negative carry yield: an American put may be exercised early", "[edge_cases]") {
    // Merton (1973) bounds (from memory): with rate <= 0 <= carry_yield the European put is worth at
    // least K - S and early exercise never pays; with both negative and the carry yield the lower,
    // the share grows faster than the strike and deep in the money the European put falls below
    // its exercise value, so the American put is dearer (docs/replication.md).
    edge e;
    e.rate = -0.01;
    e.carry = -0.05;
    e.strike = 140;
    e.years = 2;
    const double european = european_reference(e);
    CHECK(european < e.strike - e.spot);  // below the exercise value: early exercise pays
    const trade_result am = price(e);
    CHECK(am.premium >= e.strike - e.spot);
    CHECK(am.premium > european + 0.1);
    // rate <= 0 <= carry_yield: the same put is European in value.
    e.carry = 0.01;
    CHECK(price(e).premium == Approx(european_reference(e)).epsilon(1e-6));
}

TEST_CASE("carry yield above the rate", "[edge_cases]") {
    edge e;
    e.type = "call";
    e.rate = 0.02;
    e.carry = 0.08;
    // A call on a share yielding more than the rate is worth exercising early deep in the
    // money: the American call is dearer than the European one (common practice).
    const trade_result am = price(e);
    e.exercise = "european";
    const trade_result eu = price(e);
    CHECK(am.premium > eu.premium + 10 * am.error_estimate);
    CHECK(eu.premium == Approx(european_reference(e)).epsilon(1e-6));
    e.exercise = "american";
    e.carry = 1.0;  // the largest carry the file accepts
    e.rate = -1.0;  // with the smallest rate: growth exp(-2) a year
    CHECK(std::isfinite(price(e).premium));
    every_command_finite(e);
}

TEST_CASE("prices move by small steps as inputs cross the edges", "[edge_cases]") {
    const auto by_delta = [](const trade_result& r, const edge&) { return std::fabs(r.sensitivities.delta); };
    const auto by_vega = [](const trade_result& r, const edge&) { return std::fabs(r.sensitivities.vega); };
    const auto by_rho = [](const trade_result& r, const edge&) { return std::fabs(r.sensitivities.rho); };
    const auto by_theta = [](const trade_result& r, const edge&) { return std::fabs(r.sensitivities.theta); };
    // dP/dK is at most 1 for a put (common practice); dP/dq at most T S e^{-qT} for a call.
    const auto by_strike = [](const trade_result&, const edge&) { return 1.0; };
    const auto by_carry = [](const trade_result&, const edge& e) {
        return e.years * e.spot * std::exp(-e.carry * e.years);
    };

    edge e;  // American put, spot 100, strike 100, 1 year, vol 0.2, rate 0.03
    continuous("the rate across zero", e, &edge::rate, -0.01, 0.01, 20, by_rho);
    continuous(
        "spot across the strike at one day",
        [] {
            edge a;
            a.years = 1.0 / 365;
            return a;
        }(),
        &edge::spot, 98, 102, 40, by_delta);
    continuous("expiry from three days down to one", e, &edge::years, 3.0 / 365, 1.0 / 365, 16, by_theta);
    continuous("volatility from 2 % down to 0.1 % (the floor)", e, &edge::volatility, 0.02, 0.001, 38, by_vega);
    // Deep in the money at low volatility the Leisen-Reimer probability rounds to 1 near
    // strike 51 (|d2| about 6 sqrt(steps)); the price must not notice.
    continuous(
        "strike through the far in-the-money zone",
        [] {
            edge a;
            a.volatility = 0.005;
            return a;
        }(),
        &edge::strike, 40, 60, 40, by_strike);
    edge call;
    call.type = "call";
    call.rate = 0.03;
    continuous("carry yield across the rate", call, &edge::carry, 0.02, 0.04, 20, by_carry);
    continuous("volatility up to 500 %", call, &edge::volatility, 4.8, 5.0, 10, by_vega);
}

TEST_CASE("ex-dividend: exercising the day before the ex-date captures the dividend, on it does not", "[edge_cases]") {
    // The date in the file is the ex-date: on it the share trades without the dividend, so a call
    // exercised the (business) day before receives the share with the dividend still to come, and
    // one exercised on the ex-date does not (common practice; docs/trade-file.md). Deep in the
    // money at a zero rate the values are exact by hand: spot - strike = 50 exercised before,
    // spot - dividend - strike = 45 after (the European value under the escrowed model).
    json doc = json::parse(R"({
      "valuation_date": "2026-12-02",
      "market": {"spot": 100, "volatility": 0.1, "rate": 0,
                 "dividends": [{"date": "2027-03-15", "amount": 5}]},
      "option": {"type": "call", "strike": 50, "expiry_date": "2027-06-18", "exercise": "bermudan"}
    })");
    doc["option"]["exercise_dates"] = {"2027-03-12"};  // Friday before Monday's ex-date
    const double day_before = run_command("price", doc)["premium"].get<double>();
    doc["option"]["exercise_dates"] = {"2027-03-15"};  // the ex-date itself
    const double on_ex_date = run_command("price", doc)["premium"].get<double>();
    CHECK(day_before == Approx(50).margin(1e-6));
    CHECK(on_ex_date == Approx(45).margin(1e-6));
    // An American call may exercise on the day before: it captures the dividend too.
    doc["option"].erase("exercise_dates");
    doc["option"]["exercise"] = "american";
    CHECK(run_command("price", doc)["premium"].get<double>() == Approx(50).margin(1e-6));
}

TEST_CASE("every figure scales with the price level from 1e-6 to 1e9", "[edge_cases]") {
    // An option's price is homogeneous of degree one in spot and strike (Merton 1973, Theory of
    // Rational Option Pricing, from memory): with both scaled by k the premium, theta and the
    // client price scale by k, delta stays, gamma scales by 1/k. The lattice, the Greeks' bumps
    // and the rounding work in relative terms, so every level the file accepts prices alike.
    const auto at_level = [](double k) {
        return json{{"market", {{"spot", 100 * k}, {"volatility", 0.25}, {"rate", 0.03}, {"carry_yield", 0.01}}},
                    {"option", {{"type", "put"}, {"strike", 95 * k}, {"expiry_years", 0.75}, {"exercise", "american"}}},
                    {"quote", {{"currency", "EUR"}, {"margin", 0.05 * k}, {"tick", 0.01 * k}}}};
    };
    const json one = run_command("price", at_level(1));
    for (const double k : {2e-8, 1e-5, 1e3, 1e7}) {
        INFO("spot " << 100 * k);
        const json doc = at_level(k);
        const json r = run_command("price", doc);
        CHECK(r["premium"].get<double>() / k == Approx(one["premium"].get<double>()).epsilon(1e-12));
        CHECK(r["greeks"]["delta"].get<double>() == Approx(one["greeks"]["delta"].get<double>()).epsilon(1e-9));
        CHECK(r["greeks"]["gamma"].get<double>() * k == Approx(one["greeks"]["gamma"].get<double>()).epsilon(1e-9));
        CHECK(r["greeks"]["theta"].get<double>() / k == Approx(one["greeks"]["theta"].get<double>()).epsilon(1e-9));
        CHECK(r["client_price"]["per_unit"].get<double>() / k ==
              Approx(one["client_price"]["per_unit"].get<double>()).epsilon(1e-12));
        // Every command answers at every level with finite figures (the profile's default
        // range at spot 1e9 reaches 1.5e9, a scenario level: accepted).
        for (const auto& command : {"ladder", "profile", "hedge", "tree"}) {
            INFO("command " << command);
            CHECK(all_finite(run_command(command, doc)));
        }
    }
    // Below and above the range: refused up front, naming market.spot and the range.
    for (const double spot : {1e-7, 1e-306, 2e9}) {
        json doc = at_level(1);
        doc["market"]["spot"] = spot;
        CHECK_THROWS_WITH(run_command("price", doc), Catch::StartsWith("market.spot: must be"));
    }
    json tiny = at_level(1);
    tiny["market"]["spot"] = 1e-7;
    CHECK_THROWS_WITH(run_command("ladder", tiny), Catch::Contains("between 1e-06 and 1e+09"));
}
