// Tests for commands/market_reader, smile_reader and market_table: volatility grids, curves,
// their table text and the as_of time, one clear message per bad field.
#include "commands/market_table.hpp"
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"
#include "test_support.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {
json with_market(const json& market_patch) {
    json doc = json::parse(R"({
      "valuation_date": "2026-12-02",
      "market": {"spot": 100, "volatility": 0.2, "rate": 0.03},
      "option": {"type": "call", "strike": 100, "expiry_years": 1}
    })");
    doc["market"].merge_patch(market_patch);
    return doc;
}
json grid(const json& expiries, const json& strikes, const json& vols) {
    return json{{"volatility", {{"expiries", expiries}, {"strikes", strikes}, {"vols", vols}}}};
}
}  // namespace

TEST_CASE("a grid built from one Black-Scholes-Merton volatility passes every check", "[market]") {
    // One volatility everywhere is free of static arbitrage (a single lognormal model).
    const json flat = {0.24, 0.24, 0.24, 0.24, 0.24, 0.24, 0.24};
    const trade t = read_trade(with_market(
        grid({"1m", "3m", "6m", "1y", "2y"}, {50, 70, 85, 100, 115, 130, 160}, {flat, flat, flat, flat, flat})));
    REQUIRE(t.market.smile);
    CHECK(t.market.smile->grid().expiries[1] == Approx(90.0 / 365.0));  // 2026-12-02 + 3 months = 2027-03-02
    CHECK(t.market.volatility == 0.24);
    // ... also where a far forward makes calls worth some 4e10 times spot's scale (20 years, rate
    // 1, carry yield -1, the limits): rounding in the prices is not arbitrage (it was refused,
    // "short by 0"); the grid prices as its one volatility (common practice: one volatility is
    // one lognormal model, free of static arbitrage; the case came from an outside audit).
    json far = with_market(grid({"20y"}, {1, 2, 5, 10}, {{0.05, 0.05, 0.05, 0.05}}));
    far["market"]["volatility"]["strike_basis"] = "percent_of_forward";
    far["market"]["rate"] = 1.0;
    far["market"]["carry_yield"] = -1.0;
    far["option"]["expiry_years"] = 20;
    const json on_grid = run_command("price", far);
    far["market"]["volatility"] = 0.05;
    CHECK(on_grid["premium"].get<double>() ==
          Approx(run_command("price", far)["premium"].get<double>()).epsilon(1e-12));
}

TEST_CASE("a grid that breaks no-arbitrage is refused at the cell, with both values and a fix", "[market]") {
    const json row = {0.2, 0.2, 0.2};
    SECTION("calendar: total variance falls with maturity") {
        const std::string m = message_of(with_market(grid({0.5, 1}, {90, 100, 110}, {row, {0.2, 0.14, 0.2}})));
        CHECK(m.rfind("market.volatility.vols[1][1]: total variance 0.0196", 0) == 0);
        CHECK(m.find("below 0.02, that of vols[0][1]") != std::string::npos);
        CHECK(m.find("calendar arbitrage); raise this volatility to at least 0.1415") != std::string::npos);
    }
    SECTION("butterfly: a call gains value as its strike rises") {
        const std::string m = message_of(with_market(grid({1}, {90, 100, 110}, {{0.2, 0.2, 1.5}})));
        CHECK(m.rfind("market.volatility.vols[0][2]: the call at strike 110 is worth", 0) == 0);
        CHECK(m.find("must not gain value as its strike rises") != std::string::npos);
    }
    SECTION("butterfly: a call falls faster than the discount factor") {
        const std::string m = message_of(with_market(grid({1}, {90, 100, 110}, {{0.6, 0.2, 0.2}})));
        CHECK(m.rfind("market.volatility.vols[0][1]:", 0) == 0);
        CHECK(m.find("must not fall faster than the discount factor 0.970446") != std::string::npos);
        CHECK(m.find("raise this volatility to at least") != std::string::npos);
    }
    SECTION("butterfly: call prices not convex in the strike") {
        // A bump in the middle: the 100 call is dearer than the chord of its neighbours.
        const std::string m = message_of(with_market(grid({1}, {90, 100, 110}, {{0.2, 0.27, 0.2}})));
        CHECK(m.rfind("market.volatility.vols[0][1]:", 0) == 0);
        CHECK(m.find("call prices must be convex in the strike") != std::string::npos);
        CHECK(m.find("lower this volatility to at most") != std::string::npos);
    }
}

TEST_CASE("a badly shaped grid gets its own message for each fault", "[market]") {
    const json row = {0.2, 0.2, 0.2};
    struct bad_case {
        json market;
        const char* message;
    };
    const bad_case cases[] = {
        {grid({1, 0.5}, {90, 100, 110}, {row, row}),
         "market.volatility.expiries[1]: 0.5 years comes after 1 years; list the expiries in increasing order"},
        {grid({1, 1}, {90, 100, 110}, {row, row}),
         "market.volatility.expiries[1]: repeats the expiry before it (1 years); give each expiry once"},
        {grid({1}, {90, 90, 110}, {row}),
         "market.volatility.strikes[1]: repeats the strike before it (90); give each strike once"},
        {grid({1}, {90, 100, 110}, {{0.2, -0.2, 0.2}}), "market.volatility.vols[0][1]: must be > 0, got -0.2"},
        {grid({1}, {90, 100, 110}, {{0.2, 20, 0.2}}),
         "market.volatility.vols[0][1]: must be <= 5, got 20 (volatilities are decimals: 0.25 = 25 %)"},
        {grid({1}, {90, 100, 110}, {{0.2, 0.2}}),
         "market.volatility.vols[0]: has 2 volatilities; the grid has 3 strikes (a ragged grid: every row needs one "
         "per strike)"},
        {grid(json::array(), {90, 100, 110}, json::array()),
         "market.volatility.expiries: must hold at least one expiry; the grid is empty"},
        {grid({1, 2}, {90, 100, 110}, json::array({row})),
         "market.volatility.vols: has 1 rows; the grid has 2 expiries (one row of volatilities per expiry)"},
        {grid({"3x"}, {100}, {{0.2}}),
         "market.volatility.expiries[0]: must be years (a number), a date YYYY-MM-DD or a tenor such as 3m, 6m, 1y, "
         "2w, 10d, got string \"3x\""},
    };
    for (const auto& c : cases) {
        INFO(c.market.dump());
        CHECK(message_of(with_market(c.market)) == c.message);
    }
}

TEST_CASE("a grid pasted as table text reads like the same grid written out", "[market]") {
    // Tab-separated with decimal commas (a spreadsheet set to a comma locale).
    const json pasted = {
        {"volatility", {{"table", "expiry\t90\t100\t110\n3m\t0,26\t0,22\t0,2\n1y\t25%\t22%\t20,5%\n"}}}};
    const json written = grid({"3m", "1y"}, {90, 100, 110}, {{0.26, 0.22, 0.2}, {0.25, 0.22, 0.205}});
    const smile_grid a = read_trade(with_market(pasted)).market.smile->grid();
    const smile_grid b = read_trade(with_market(written)).market.smile->grid();
    CHECK(a.expiries == b.expiries);
    CHECK(a.strikes == b.strikes);
    CHECK(a.vols == b.vols);
    const json ragged = {{"volatility", {{"table", "expiry\t90\t100\n3m\t0.2\t0.3\n1y\t0.2\n"}}}};
    CHECK(message_of(with_market(ragged)) ==
          "market.volatility.table: line 3, column 1: the line holds 1 volatilities after its expiry; the first line "
          "has 2 strikes");
}

TEST_CASE("curves are read from points or table text, nearest first, with clear messages", "[market]") {
    const json points = {{"rate",
                          {{"points",
                            {{{"tenor", "6m"}, {"rate", 0.03}},
                             {{"date", "2027-12-02"}, {"rate", 0.032}},
                             {{"years", 2}, {"rate", 0.035}}}}}}};
    const trade t = read_trade(with_market(points));
    REQUIRE_FALSE(t.market.rate.is_flat());
    CHECK(t.market.rate.years()[0] == Approx(182.0 / 365.0));  // 2027-06-02, ACT/365F
    CHECK(t.market.rate.zero(1.0) == Approx(0.032));
    const json table = {{"rate", {{"table", "tenor;rate\n6m;3%\n2027-12-02;0,032\n2;0.035\n"}}}};
    const trade u = read_trade(with_market(table));
    CHECK(u.market.rate.years() == t.market.rate.years());
    CHECK(u.market.rate.zero_rates() == t.market.rate.zero_rates());

    CHECK(message_of(with_market(
              {{"rate", {{"points", {{{"tenor", "1y"}, {"rate", 0.03}}, {{"tenor", "6m"}, {"rate", 0.03}}}}}}})) ==
          "market.rate.points[1]: at 0.498630136986 years comes after a point at 1 years; list the points from the "
          "nearest");
    CHECK(message_of(with_market({{"borrow", -0.01}})) == "market.borrow: must be >= 0, got -0.01");
    CHECK(message_of(with_market({{"rate", {{"points", {{{"rate", 0.03}}}}}}})) ==
          "market.rate.points[0].tenor: give the point's time as exactly one of tenor (\"3m\"), date (YYYY-MM-DD) or "
          "years");
    CHECK(message_of(with_market(
              {{"carry_yield", {{"points", {{{"years", 1}, {"rate", 0.03}}, {{"years", 1.01}, {"rate", 0.2}}}}}}})) ==
          "market.carry_yield.points[1]: the forward rate from the point before (1 years) to this one is 17.2 a "
          "year, outside -1 .. 1; check the rates and the times");
}

TEST_CASE("the market's as_of is an ISO 8601 date-time and cannot follow the valuation date", "[market]") {
    CHECK(read_trade(with_market({{"as_of", "2026-12-02T16:30:00Z"}})).market.as_of == "2026-12-02T16:30:00Z");
    CHECK(read_trade(with_market({{"as_of", "2026-12-01T17:30+01:00"}})).market.as_of == "2026-12-01T17:30+01:00");
    CHECK(message_of(with_market({{"as_of", "2026-12-02"}})) ==
          "market.as_of: must be an ISO 8601 date and time such as 2026-12-03T16:30:00Z (the zone optional), got "
          "\"2026-12-02\"");
    CHECK(message_of(with_market({{"as_of", "2026-12-03T09:00Z"}})) ==
          "market.as_of: is 2026-12-03, after valuation_date 2026-12-02; a market cannot be taken after the day it "
          "prices");
    // Without a valuation date, the as_of's date is the valuation date: dates resolve against it.
    json doc = with_market({{"as_of", "2026-12-02T16:30:00Z"}});
    doc.erase("valuation_date");
    doc["option"].erase("expiry_years");
    doc["option"]["expiry_date"] = "2027-12-02";
    CHECK(read_trade(doc).legs[0].expiry_years == 1.0);
}

TEST_CASE("a trade without a market is priced in a snapshot; giving both is an error", "[market]") {
    // The module's path (run_command_text with market text) and the CLI's (--market) share
    // with_market_snapshot.
    const std::string trade = R"({"option": {"type": "call", "strike": 100, "expiry_date": "2027-12-02"}})";
    const std::string snapshot =
        R"({"as_of": "2026-12-02T16:30:00Z", "underlying": "Fictional Ferries", "spot": 100, "volatility": 0.2,
            "rate": 0.03})";
    const json ok = json::parse(run_command_text("price", trade, 1e18, snapshot));
    REQUIRE(ok["ok"] == true);
    CHECK(ok["result"]["market_as_of"] == "2026-12-02T16:30:00Z");
    CHECK(ok["result"]["market"]["underlying"] == "Fictional Ferries");
    // The same figures as the market written into the trade (the as_of's date is the valuation date).
    json inline_doc = json::parse(trade);
    inline_doc["market"] = json::parse(snapshot);
    CHECK(run_command("price", inline_doc)["premium"] == ok["result"]["premium"]);

    const json both = json::parse(run_command_text("price", inline_doc.dump(), 1e18, snapshot));
    CHECK(both["error"]["field"] == "market");
    const json undated =
        json::parse(run_command_text("price", trade, 1e18, R"({"spot": 100, "volatility": 0.2, "rate": 0.03})"));
    CHECK(undated["error"]["field"] == "market.as_of");
    const json bad_cell = json::parse(run_command_text("price", trade, 1e18,
                                                       R"({"as_of": "2026-12-02T16:30:00Z", "spot": 100, "rate": 0.03,
            "volatility": {"expiries": [1], "strikes": [90, 110], "vols": [[0.2, -1]]}})"));
    CHECK(bad_cell["error"]["field"] == "market.volatility.vols[0][1]");
}

TEST_CASE("a snapshot that is not good JSON is named as the snapshot, not as the trade", "[market]") {
    // The text checks are the trade document's (RFC 8259; a name given twice, RFC 7493 section 2.3);
    // the message names the snapshot's field as market.<field>, or the market for the whole text.
    const std::string trade = R"({"option": {"type": "call", "strike": 100, "expiry_years": 1}})";
    const auto error_of = [&](const std::string& snapshot) {
        return json::parse(run_command_text("price", trade, 1e18, snapshot))["error"];
    };
    const json twice = error_of(R"({"as_of": "2026-12-02T16:30:00Z", "spot": 1, "spot": 2})");
    CHECK(twice["field"] == "market.spot");
    CHECK(twice["message"].get<std::string>().rfind("market.spot: is given twice", 0) == 0);
    const json broken = error_of(R"({"as_of": "2026-12-02T16:30:00Z", "spot": 1,, })");
    CHECK(broken["field"] == "market");
    CHECK(broken["message"].get<std::string>().rfind("market: not a valid JSON market snapshot (near character", 0) ==
          0);
    CHECK(error_of(std::string(70, '[') + std::string(70, ']'))["message"].get<std::string>().find(
              "not a valid market snapshot (nested more than 64 levels deep; a snapshot needs") != std::string::npos);
}
