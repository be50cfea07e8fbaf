// Tests for analytics/client_price_outcomes: the client's figures at expiry at the price the
// client deals at, with and without shares already held.
//
// The expected figures are the payoff arithmetic of the trade's own words (common practice):
// a put bought for P breaks even at K - P, a call sold for C at K + C; shares held with a put
// bought (a protective put) lose at most S0 - K + P and never stop gaining; a collar on shares
// held gains at most Kc - S0 - cost and loses at most S0 - Kp + cost.
#include "analytics/client_price_outcomes.hpp"
#include "commands/quote.hpp"
#include "test_support.hpp"

#include <catch2/catch.hpp>

using namespace hedgeleaf;

namespace {

/// A trade with its quote section, dealt at its client price.
struct dealt {
    trade t;
    quote_terms terms;
    client_price price;
    client_outcomes client;
};

dealt deal(const std::string& text) {
    const json doc = parse_json_text(text);
    dealt d;
    d.t = read_trade(doc);
    d.terms = *read_quote_terms(doc, d.t);
    d.price = price_for_client(d.t, price_trade(d.t, bumped_greeks::off), d.terms);
    d.client = outcomes_for_client(d.t, d.price, d.terms.holding_shares);
    return d;
}

const std::string market = R"("market": {"spot": 36.4, "volatility": 0.27, "rate": 0.032, "carry_yield": 0.018})";

}  // namespace

TEST_CASE("a put bought at the offer breaks even at strike - offer, not strike - mid", "[client_outcomes]") {
    const dealt d = deal("{" + market + R"(, "option": {"type": "put", "strike": 34, "expiry_years": 1},
        "quantity": 1000, "quote": {"margin_type": "fraction_of_premium", "margin": 0.05, "tick": 0.01}})");
    REQUIRE(d.price.client_buys);
    REQUIRE(d.price.per_unit > d.price.mid.per_unit);
    REQUIRE(d.client.alone.points.size() == 1);
    CHECK(d.client.alone.points[0] == Approx(34 - d.price.per_unit).margin(1e-9));
    CHECK(d.client.alone.points[0] < 34 - d.price.mid.per_unit);
    // The most the client loses is what the client paid; gains stop at spot 0.
    CHECK(*d.client.worst_per_unit == Approx(-d.price.per_unit));
    CHECK(*d.client.best_per_unit == Approx(34 - d.price.per_unit));
}

TEST_CASE("a call sold at the bid breaks even at strike + bid", "[client_outcomes]") {
    const dealt d = deal("{" + market + R"(, "option": {"type": "call", "strike": 40, "expiry_years": 1},
        "side": "sell", "quote": {"margin": 0.1}})");
    REQUIRE_FALSE(d.price.client_buys);
    CHECK(d.price.per_unit == Approx(d.price.mid.per_unit - 0.1));
    REQUIRE(d.client.alone.points.size() == 1);
    CHECK(d.client.alone.points[0] == Approx(40 + d.price.per_unit));
    CHECK(*d.client.best_per_unit == Approx(d.price.per_unit));  // the premium received
    CHECK_FALSE(d.client.worst_per_unit);                        // unbounded as spot rises
}

TEST_CASE("shares held change the client's figures, never the price", "[client_outcomes]") {
    const std::string put = "{" + market + R"(, "option": {"type": "put", "strike": 34, "expiry_years": 1},
        "quantity": 150000, "quote": {"margin": 0.05, "tick": 0.01)";
    const dealt bare = deal(put + "}}");
    const dealt held = deal(put + R"(, "holding": {"shares": 150000}}})");
    CHECK(held.price.per_unit == bare.price.per_unit);
    CHECK(held.price.total == bare.price.total);
    // A protective put: loses at most S0 - K + P per share, below K nothing more is lost.
    REQUIRE(held.client.with_holding.points.size() == 1);
    CHECK(held.client.with_holding.points[0] == Approx(36.4 + held.price.per_unit));
    CHECK(*held.client.worst_per_unit == Approx(34 - 36.4 - held.price.per_unit));
    CHECK_FALSE(held.client.best_per_unit);
    REQUIRE(held.client.protection);
    CHECK(held.client.protection->from == 34);
    CHECK_FALSE(held.client.protection->down_to);
    CHECK_FALSE(held.client.cap);
}

TEST_CASE("a collar on shares held: protection at the put, a cap at the call", "[client_outcomes]") {
    const dealt d = deal("{" + market + R"(, "structure": {"shape": "collar", "strikes": [32, 43.7], "expiry_years": 1},
        "quantity": 1000, "quote": {"margin": 0.02, "tick": 0.01, "holding": {"shares": 1000}}})");
    const double cost = d.price.per_unit;
    REQUIRE(d.client.protection);
    CHECK(d.client.protection->from == 32);
    CHECK(*d.client.cap == 43.7);
    CHECK(*d.client.best_per_unit == Approx(43.7 - 36.4 - cost));
    CHECK(*d.client.worst_per_unit == Approx(32 - 36.4 - cost));
}

TEST_CASE("a put spread on shares held protects between its strikes and has no cap", "[client_outcomes]") {
    const dealt d =
        deal("{" + market + R"(, "structure": {"shape": "put-spread", "strikes": [29, 34], "expiry_years": 1},
        "quantity": 1000, "quote": {"holding": {"shares": 1000}}})");
    REQUIRE(d.client.protection);
    CHECK(d.client.protection->from == 34);
    CHECK(*d.client.protection->down_to == 29);
    CHECK_FALSE(d.client.cap);
    // The worst is at spot 0: the shares are lost, the spread pays its width.
    CHECK(*d.client.worst_per_unit == Approx(-36.4 + 5 - d.price.per_unit));
}

TEST_CASE("the outcome table: the trade's P&L after the client price, the holding's beside it", "[client_outcomes]") {
    const dealt d = deal("{" + market + R"(, "option": {"type": "put", "strike": 34, "expiry_years": 1},
        "quantity": 200, "quote": {"margin": 0.05, "holding": {"shares": 100}}})");
    const auto rows = outcomes_at(d.t, d.price, d.client, {30.0, 40.0});
    REQUIRE(rows.size() == 2);
    CHECK(rows[0].payoff == Approx(200 * 4.0));
    CHECK(rows[0].pnl == Approx(200 * (4.0 - d.price.per_unit)));
    CHECK(rows[0].holding_pnl == Approx(100 * (30 - 36.4)));
    CHECK(rows[0].pnl_with_holding == Approx(rows[0].pnl + rows[0].holding_pnl));
    CHECK(rows[1].payoff == 0);
    CHECK(rows[1].pnl_per_unit == Approx(-d.price.per_unit));
    CHECK(rows[1].spot_change == Approx(40 / 36.4 - 1));
}
