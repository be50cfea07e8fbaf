// Tests for analytics/ladder: spot, volatility and time ladders and the spot x vol grid.
#include "analytics/ladder.hpp"
#include "commands/trade_reader.hpp"
#include "contract/errors.hpp"
#include "dispatch/dispatch.hpp"
#include "numerics/closed_form.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {

json call_doc() {
    return json{{"valuation_date", "2026-12-02"},
                {"market", {{"spot", 100}, {"volatility", 0.25}, {"rate", 0.04}, {"carry_yield", 0.01}}},
                {"option", {{"type", "call"}, {"strike", 105}, {"expiry_date", "2027-12-02"}}},
                {"quantity", 1000}};
}

valuation reference(const json& doc, double spot, double vol, double years_ahead = 0) {
    trade t = read_trade(doc);
    t.market.spot = spot;
    t.market.volatility = vol;
    option_leg leg = t.legs[0];
    leg.expiry_years -= years_ahead;
    return closed_form(t.market, leg);
}

}  // namespace

TEST_CASE("spot ladder: values, delta and gamma match the closed form at each shifted spot", "[ladder]") {
    json doc = call_doc();
    const json r = run_command("ladder", doc);
    REQUIRE(r["rows"].size() == 21);  // -20 % .. +20 % by 2 %
    const double today = r["today"]["value"];
    for (const auto& row : r["rows"]) {
        const double spot = row["spot"];
        CHECK(spot == Approx(100 * (1 + row["spot_shift"].get<double>())));
        // Closed-form European reference (generalised Black-Scholes-Merton).
        const valuation v = reference(doc, spot, 0.25);
        CHECK(row["value"].get<double>() == Approx(v.premium).margin(1e-4));
        CHECK(row["delta"].get<double>() == Approx(v.sensitivities.delta).margin(1e-3));
        CHECK(row["gamma"].get<double>() == Approx(v.sensitivities.gamma).epsilon(0.02));
        CHECK(row["pnl"].get<double>() == Approx(row["value"].get<double>() - today).margin(1e-12));
        CHECK(row["position_pnl"].get<double>() == Approx(1000 * row["pnl"].get<double>()));
    }
    CHECK(r["rows"][10]["spot_shift"] == 0.0);
    CHECK(r["rows"][10]["pnl"] == 0.0);
    // Selling flips every position figure, not the per-unit ones.
    doc["side"] = "sell";
    const json s = run_command("ladder", doc);
    CHECK(s["rows"][0]["position_pnl"].get<double>() == Approx(-r["rows"][0]["position_pnl"].get<double>()));
    CHECK(s["rows"][0]["pnl"] == r["rows"][0]["pnl"]);
}

TEST_CASE("volatility ladder follows the closed form", "[ladder]") {
    json doc = call_doc();
    doc["ladder"] = {{"kind", "volatility"}, {"vol_from", -0.1}, {"vol_to", 0.1}, {"vol_step", 0.05}};
    const json r = run_command("ladder", doc);
    REQUIRE(r["rows"].size() == 5);
    double previous = -1;
    for (const auto& row : r["rows"]) {
        const double vol = row["volatility"];
        CHECK(vol == Approx(0.25 + row["vol_shift"].get<double>()));
        CHECK(row["value"].get<double>() == Approx(reference(doc, 100, vol).premium).margin(1e-4));
        CHECK(row["value"].get<double>() > previous);  // a call gains with volatility
        previous = row["value"];
    }
}

TEST_CASE("time ladder: value at future dates, paid at payoff on expiry", "[ladder]") {
    json doc = call_doc();
    doc["market"]["spot"] = 110;  // in the money, so the expiry row pays 5
    doc["ladder"] = {{"kind", "time"}, {"time_step_days", 73}};
    const json r = run_command("ladder", doc);
    const auto& rows = r["rows"];
    REQUIRE(rows.size() == 6);  // days 0, 73, ..., 365
    CHECK(rows[1]["date"] == "2027-02-13");
    CHECK(rows.back()["days"] == 365);
    CHECK(rows.back()["value"].get<double>() == Approx(5.0).margin(1e-12));
    // On expiry the delta is the payoff's slope: the share an in-the-money call delivers (it was
    // printed 0); the limit of the closed-form delta as the time left goes to 0 (Hull, Options,
    // Futures, and Other Derivatives, the delta of a call, from memory).
    CHECK(rows.back()["delta"] == 1.0);
    CHECK(rows.back()["position_delta"] == 1000.0);
    CHECK(rows.back()["gamma"] == 0.0);
    for (std::size_t i = 0; i + 1 < rows.size(); ++i) {
        const double ahead = rows[i]["years"];
        CHECK(rows[i]["value"].get<double>() == Approx(reference(doc, 110, 0.25, ahead).premium).margin(2e-4));
    }
    doc["ladder"] = {{"kind", "time"}, {"time_to_days", 400}};
    CHECK_THROWS_WITH(run_command("ladder", doc),
                      "ladder.time_to_days: must be on or before the last expiry (day 365), got 400");
}

TEST_CASE("time ladder with legs of different expiries settles the short leg first", "[ladder]") {
    json doc{{"market", {{"spot", 100}, {"volatility", 0.3}, {"rate", 0.02}}},
             {"legs",
              {{{"type", "put"}, {"strike", 110}, {"expiry_years", 0.5}, {"quantity", 1}},
               {{"type", "call"}, {"strike", 100}, {"expiry_years", 1.0}, {"quantity", -1}}}},
             {"ladder", {{"kind", "time"}, {"time_step_days", 200}, {"time_to_days", 200}}}};
    const json r = run_command("ladder", doc);
    const json& later = r["rows"][1];
    // Day 200: the put (expired at day 182.5) pays 10 at today's spot; the call has 165 days left.
    trade t = read_trade(doc);
    option_leg call = t.legs[1];
    call.expiry_years -= 200.0 / 365.0;
    CHECK(later["value"].get<double>() == Approx(10.0 - closed_form(t.market, call).premium).margin(2e-4));
    // The expired put, in the money, counts -1 share (its payoff's slope), the short call its delta.
    CHECK(later["delta"].get<double>() == Approx(-1.0 - closed_form(t.market, call).sensitivities.delta).margin(2e-3));
    // At the strike the slope is 1/2 (the limit of N(d1) as the time left goes to 0, from memory).
    doc["market"]["spot"] = 110;
    const json at_strike = run_command("ladder", doc);
    t.market.spot = 110;
    CHECK(at_strike["rows"][1]["delta"].get<double>() ==
          Approx(-0.5 - closed_form(t.market, call).sensitivities.delta).margin(2e-3));
}

TEST_CASE("spot x vol grid: 21 x 11 by default, matrix matches rows", "[ladder]") {
    json doc{{"market", {{"spot", 50}, {"volatility", 0.3}, {"rate", 0.03}}},
             {"structure", {{"shape", "straddle"}, {"strikes", {50}}, {"expiry_years", 0.5}, {"exercise", "american"}}},
             {"ladder", {{"kind", "grid"}}}};
    const json r = run_command("ladder", doc);
    const json& grid = r["grid"];
    REQUIRE(grid["spot_shifts"].size() == 21);
    REQUIRE(grid["vol_shifts"].size() == 11);
    REQUIRE(r["rows"].size() == 231);
    CHECK(grid["pnl"][10][5] == 0.0);  // no change, no P&L
    for (std::size_t i = 0; i < 21; ++i)
        for (std::size_t j = 0; j < 11; ++j) {
            const json& row = r["rows"][i * 11 + j];
            CHECK(row["pnl"] == grid["pnl"][i][j]);
            CHECK(row["spot_shift"] == grid["spot_shifts"][i]);
            CHECK(row["vol_shift"] == grid["vol_shifts"][j]);
            if (j > 0) CHECK(grid["pnl"][i][j].get<double>() > grid["pnl"][i][j - 1].get<double>());  // long vega
        }
    // A long straddle gains from a move either way (long gamma).
    CHECK(grid["pnl"][0][5].get<double>() > 0);
    CHECK(grid["pnl"][20][5].get<double>() > 0);
}

TEST_CASE("a low volatility's default ladder stops where the volatility must", "[ladder]") {
    // Currency pairs trade at volatilities of a few points (common practice): a 4 % trade's
    // default axis, -5 .. +5 points, would take it below zero. Not given, the lower end stops at
    // the lowest whole step that keeps it priceable (0.001); given, it is refused as before.
    json doc = call_doc();
    doc["market"]["volatility"] = 0.04;
    doc["ladder"] = {{"kind", "volatility"}};
    const json r = run_command("ladder", doc);
    REQUIRE(r["rows"].size() == 9);
    CHECK(r["rows"][0]["vol_shift"].get<double>() == -0.03);
    CHECK(r["rows"][0]["volatility"].get<double>() == Approx(0.01));
    CHECK(r["rows"][8]["vol_shift"].get<double>() == 0.05);
    doc["ladder"] = {{"kind", "grid"}, {"vol_step", 0.02}};
    CHECK(run_command("ladder", doc)["rows"][0]["vol_shift"].get<double>() == -0.02);
    doc["ladder"] = {{"kind", "volatility"}, {"vol_from", -0.05}};
    CHECK_THROWS_WITH(run_command("ladder", doc),
                      "ladder.vol_from: must be >= -0.039 (volatility 0.04 must stay within 0.001 .. 5), got -0.05");
    doc["market"]["volatility"] = 0.25;  // well above: the default as it always was
    doc["ladder"] = {{"kind", "volatility"}};
    CHECK(run_command("ladder", doc)["rows"][0]["vol_shift"].get<double>() == -0.05);
}

TEST_CASE("the ladder section is read strictly and its limits named", "[ladder]") {
    json doc = call_doc();
    doc["ladder"] = {{"kind", "spots"}};
    CHECK_THROWS_WITH(
        run_command("ladder", doc),
        "ladder.kind: must be one of spot, volatility, time, grid, got string \"spots\" (did you mean \"spot\"?)");
    doc["ladder"] = {{"spot_form", -0.1}};
    CHECK_THROWS_WITH(run_command("ladder", doc), "ladder.spot_form: unknown field (did you mean \"spot_from\"?)");
    doc["ladder"] = {{"spot_from", -1.5}};
    CHECK_THROWS_WITH(run_command("ladder", doc),
                      "ladder.spot_from: must be >= -0.95 (a fraction of today's spot), got -1.5");
    doc["ladder"] = {{"kind", "volatility"}, {"vol_from", -0.3}};
    CHECK_THROWS_WITH(run_command("ladder", doc),
                      "ladder.vol_from: must be >= -0.249 (volatility 0.25 must stay within 0.001 .. 5), got -0.3");
    doc["ladder"] = {{"spot_step", 0.0001}};
    CHECK_THROWS_WITH(run_command("ladder", doc), Catch::StartsWith("ladder.spot_step: gives 4001 rows"));
    doc["ladder"] = {{"kind", "grid"}, {"steps", 2001}, {"spot_step", 0.004}};
    CHECK_THROWS_WITH(run_command("ladder", doc), Catch::StartsWith("ladder.steps: the ladder would need about"));
    // A spot move that leaves spot below the dividends' present value names the axis to change.
    json divs = call_doc();
    divs["market"]["dividends"] = {{{"time_years", 0.5}, {"amount", 20}}};
    divs["ladder"] = {{"spot_from", -0.9}};
    CHECK_THROWS_WITH(run_command("ladder", divs),
                      Catch::StartsWith("ladder.spot_from: a scenario cannot be priced (spot shift -0.9, volatility "
                                        "shift 0, 0 years ahead): spot 10 is not above the present value 19.6"));
    doc["ladder"] = {{"spot_from", 0.2}, {"spot_to", 0.1}};
    CHECK_THROWS_WITH(run_command("ladder", doc), "ladder.spot_to: must be >= spot_from 0.2, got 0.1");
}
