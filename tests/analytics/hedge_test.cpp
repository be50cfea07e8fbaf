// Tests for analytics/schedule and analytics/hedge: schedule dates, the hedge schedule's accounting, paths and bad input.
#include "commands/hedge.hpp"
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"

#include "test_support.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <string>

using namespace hedgeleaf;

namespace {

// The hedge schedule of a trade document (its settings come from the document's hedge section).
hedge_schedule schedule_of(const std::string& text) { return run_steps(text, read_hedge_settings, run_hedge); }

std::string message_of(const std::string& command, const std::string& text) {
    try {
        (void)run_command(command, parse_json_text(text));
    } catch (const input_error& e) {
        return e.what();
    }
    return "(no error)";
}

// Orchard Vale Robotics (fictional), a two-month call hedged on three dates and at expiry.
const char* explicit_path_call = R"({
  "valuation_date": "2027-01-04",
  "market": {"spot": 48, "volatility": 0.25, "rate": 0.03},
  "option": {"type": "call", "strike": 50, "expiry_date": "2027-03-01"},
  "quantity": 1000,
  "hedge": {"rebalance": {"dates": ["2027-01-18", "2027-02-01", "2027-02-15"]},
            "path": {"kind": "spots", "spots": [49.5, 47.2, 51.3, 52.4]}COST}
})";

std::string with_cost(const std::string& cost) {
    std::string s = explicit_path_call;
    s.replace(s.find("COST"), 4, cost);
    return s;
}

}  // namespace

TEST_CASE("schedule along an explicit spot path matches an independent re-computation", "[hedge]") {
    // Reference: /usr/bin/python3 with scipy (tests/hedge_test.cpp's numbers were produced by a short
    // script that prices the call with Black-Scholes, norm.cdf for delta, remaining time = days/365,
    // cash grown by exp(r * dt) between dates, cost = |traded| * spot * bp / 1e4; run 2026 during
    // development, figures pasted to 12+ digits).
    const hedge_schedule s = schedule_of(with_cost(""));
    REQUIRE(s.rows.size() == 5);
    const double option_value[] = {1.15277504551085, 1.52095758975702, 0.404425030712595, 1.81210712149355, 2.4};
    const double delta[] = {0.37413908128504, 0.485878906632231, 0.222307856732623, 0.716414405318893};
    const double cash[] = {-16.8059008561711, -22.3563716381448, -9.94155802929463, -35.3006701570037,
                           -35.3413134855738};
    const double interest[] = {0, -0.0193494272877931, -0.0257399464112822, -0.0114461852334787, -0.0406433285700659};
    const double tracking[] = {0, 0.173676650393592, 0.146947777772606, -0.360718285638065, -0.201198646863794};
    for (std::size_t k = 0; k < 5; ++k) {
        INFO("row " << k);
        CHECK(s.rows[k].option_value == Approx(option_value[k]).epsilon(1e-12));
        if (k < 4) CHECK(*s.rows[k].delta == Approx(delta[k]).epsilon(1e-12));
        CHECK(s.rows[k].cash == Approx(cash[k]).epsilon(1e-12));
        CHECK(s.rows[k].interest == Approx(interest[k]).epsilon(1e-10).margin(1e-14));
        CHECK(s.rows[k].tracking_error == Approx(tracking[k]).epsilon(1e-10).margin(1e-12));
    }
    CHECK_FALSE(s.rows[4].delta.has_value());
    CHECK(s.rows[4].shares_traded == 0);
    CHECK(s.rows[4].event == "expiry");
    CHECK(s.totals.payoff == Approx(2.4));
    CHECK(s.totals.premium == Approx(1.15277504551085).epsilon(1e-12));
    CHECK(s.totals.replication_error == Approx(-0.201198646863794).epsilon(1e-10));
    // Desk (sold 1000 calls to the client) holds 1000 x delta shares and keeps 1000 x the error.
    CHECK(s.rows[0].desk_shares == Approx(374.13908128504).epsilon(1e-12));
    CHECK(s.rows[4].desk_pnl == Approx(1000 * -0.201198646863794).epsilon(1e-10));

    // 5 bp costs: the same script with cost_bp = 5.
    const hedge_schedule sc = schedule_of(with_cost(", \"cost_bp\": 5"));
    CHECK(sc.rows[0].tracking_error == Approx(-0.00897933795084072).epsilon(1e-10));
    CHECK(sc.rows[4].tracking_error == Approx(-0.231917567045969).epsilon(1e-10));
    CHECK(sc.rows[4].cash == Approx(-35.372032405756).epsilon(1e-12));
}

TEST_CASE("every row is self-financing: cash moves only by interest, income, trades, costs and payments", "[hedge]") {
    const char* text = R"({
      "valuation_date": "2026-12-02",
      "market": {"spot": 48.2, "volatility": 0.31, "rate": 0.035, "carry_yield": 0.01,
                 "dividends": [{"date": "2027-03-15", "amount": 0.42}]},
      "legs": [{"type": "put", "strike": 46, "expiry_date": "2027-03-19", "quantity": 1},
               {"type": "call", "strike": 52, "expiry_date": "2027-06-18", "quantity": -1, "exercise": "american"}],
      "quantity": 5000, "side": "sell",
      "hedge": {"rebalance": {"every": 3, "unit": "days"}, "path": {"kind": "scenario", "seed": 42, "volatility": 0.4},
                "cost_bp": 3}
    })";
    const hedge_schedule s = schedule_of(text);
    REQUIRE(s.rows.size() > 30);
    double paid_seen = 0;
    for (std::size_t k = 1; k < s.rows.size(); ++k) {
        const hedge_row& a = s.rows[k - 1];
        const hedge_row& b = s.rows[k];
        INFO("row " << k);
        CHECK(b.cash == Approx(a.cash + b.interest + b.dividends + b.trade_cash_flow - b.cost - b.paid).margin(1e-9));
        CHECK(b.interest == Approx(a.cash * (std::exp(0.035 * (b.years - a.years)) - 1)).margin(1e-12));
        CHECK(b.portfolio_value == Approx(b.shares_held * b.spot + b.cash).margin(1e-9));
        CHECK(b.shares_held == Approx(a.shares_held + b.shares_traded).margin(1e-12));
        CHECK(b.trade_cash_flow == Approx(-b.shares_traded * b.spot).margin(1e-12));
        CHECK(b.cost == Approx(std::fabs(b.shares_traded) * b.spot * 3e-4).margin(1e-12));
        paid_seen += std::fabs(b.paid);
    }
    // The put leg ends in March: a "leg expiry" row before the end.
    bool leg_expiry = false;
    for (const auto& r : s.rows) leg_expiry = leg_expiry || r.event == "leg expiry";
    CHECK(leg_expiry);
    // Client sells 5000 units: the desk holds -5000 x the per-unit shares.
    CHECK(s.rows[0].desk_shares == Approx(-5000 * s.rows[0].shares_held));
}

TEST_CASE("a lattice path replicates exactly, including dividends, carry and early exercise", "[hedge]") {
    const char* text = R"({
      "valuation_date": "2026-12-02",
      "market": {"spot": 48.2, "volatility": 0.31, "rate": 0.035, "carry_yield": 0.01,
                 "dividends": [{"date": "2027-01-15", "amount": 0.5}]},
      "option": {"type": "put", "strike": 52, "expiry_date": "2027-03-02", "exercise": "american"},
      "lattice": {"method": "crr"},
      "hedge": {"path": {"kind": "lattice", "moves": "DDUDDDD"}, "cost_bp": 0}
    })";
    const hedge_schedule s = schedule_of(text);
    for (const auto& r : s.rows) CHECK(std::fabs(r.tracking_error) < 1e-12 * std::max(1.0, r.option_value));
    CHECK(s.rows.back().event == "exercise");
    // Exercised at step 5 of a lattice whose steps fall on the ex-date and the day before.
    CHECK(s.rows.size() == 6);
    CHECK(s.totals.payoff == Approx(52 - s.rows.back().spot).epsilon(1e-12));
    CHECK(s.totals.dividends != 0);  // the short shares paid the dividend and carry
}

TEST_CASE("American put on a falling path stops at the optimal exercise", "[hedge]") {
    const hedge_schedule s = schedule_of(R"({
      "valuation_date": "2027-01-04",
      "market": {"spot": 48, "volatility": 0.25, "rate": 0.05},
      "option": {"type": "put", "strike": 48, "expiry_date": "2028-01-03", "exercise": "american"},
      "hedge": {"rebalance": {"every": 1, "unit": "weeks"}, "path": {"kind": "stress", "shape": "fall", "change": 0.6}}
    })");
    const hedge_row& last = s.rows.back();
    CHECK(last.event == "exercise");
    CHECK(last.years < 1.0);
    CHECK(last.option_value == Approx(48 - last.spot).epsilon(1e-12));
    CHECK(s.notes.size() == 1);
    // One week earlier the holder still waited: the put was worth more than exercising.
    const hedge_row& before = s.rows[s.rows.size() - 2];
    CHECK(before.option_value > 48 - before.spot);
}

TEST_CASE("rebalancing dates: business days, weeks and months roll to Monday-Friday", "[hedge]") {
    const trade t = trade_of(R"({
      "valuation_date": "2027-01-29",
      "market": {"spot": 48, "volatility": 0.25, "rate": 0.03},
      "option": {"type": "call", "strike": 48, "expiry_date": "2027-06-30"}
    })");
    rebalance_spec monthly;
    monthly.unit = rebalance_unit::months;
    const auto m = schedule_dates(t, monthly, "hedge.rebalance");
    // 2027-02-28 is a Sunday (Jan 29 + 1 month clamps to Feb 28) -> Monday 2027-03-01; 2027-05-29 Saturday -> 05-31.
    REQUIRE(m.size() == 7);
    CHECK(to_iso(*m[1].day) == "2027-03-01");
    CHECK(to_iso(*m[2].day) == "2027-03-29");
    CHECK(to_iso(*m[4].day) == "2027-05-31");
    CHECK(to_iso(*m[6].day) == "2027-06-30");
    CHECK(m[6].years == Approx(152.0 / 365.0));
    rebalance_spec every2;
    every2.unit = rebalance_unit::days;
    every2.every = 2;
    const auto d = schedule_dates(t, every2, "hedge.rebalance");
    // Friday 2027-01-29: two business days on is Tuesday 02-02, then Thursday 02-04, Monday 02-08.
    CHECK(to_iso(*d[1].day) == "2027-02-02");
    CHECK(to_iso(*d[2].day) == "2027-02-04");
    CHECK(to_iso(*d[3].day) == "2027-02-08");
    for (const auto& x : d) CHECK(is_business_day(*x.day));
}

TEST_CASE("stress and scenario paths", "[hedge]") {
    const std::string base = R"({
      "valuation_date": "2027-01-04",
      "market": {"spot": 48, "volatility": 0.25, "rate": 0.03},
      "option": {"type": "call", "strike": 48, "expiry_date": "2027-07-05"},
      "hedge": {"path": PATH}
    })";
    const auto run = [&](const std::string& path) {
        std::string s = base;
        s.replace(s.find("PATH"), 4, path);
        return schedule_of(s);
    };
    const auto rise = run(R"({"kind": "stress", "shape": "rise", "change": 0.25})");
    CHECK(rise.rows.back().spot == Approx(60.0).epsilon(1e-12));
    const auto gap = run(R"({"kind": "stress", "shape": "gap-down", "change": 0.15, "date": "2027-03-10"})");
    bool seen = false;
    for (const auto& r : gap.rows) {
        if (r.day && to_iso(*r.day) == "2027-03-10") seen = true;
        CHECK(r.spot == Approx(seen ? 40.8 : 48.0));
    }
    CHECK(seen);
    const auto a = run(R"({"kind": "scenario", "seed": 9, "volatility": 0.4, "drift": 0.1})");
    const auto b = run(R"({"kind": "scenario", "seed": 9, "volatility": 0.4, "drift": 0.1})");
    const auto c = run(R"({"kind": "scenario", "seed": 10, "volatility": 0.4, "drift": 0.1})");
    REQUIRE(a.rows.size() == b.rows.size());
    for (std::size_t k = 0; k < a.rows.size(); ++k) CHECK(a.rows[k].spot == b.rows[k].spot);
    CHECK(a.rows.back().spot != c.rows.back().spot);
}

TEST_CASE("hedge result JSON has flat rows and totals", "[hedge]") {
    const json r = run_command("hedge", parse_json_text(with_cost("")));
    REQUIRE(r["rows"].is_array());
    for (const auto& row : r["rows"])
        for (const auto& [key, v] : row.items()) CHECK_FALSE((v.is_object() || v.is_array()));
    CHECK(r["rows"][0]["date"] == "2027-01-04");
    CHECK(r["totals"]["payoff"].get<double>() == Approx(2.4));
    CHECK(r["totals"].contains("total_shares_traded"));
    CHECK(r["desk"]["signed_quantity"].get<double>() == 1000);
}

TEST_CASE("bad hedge input names the field", "[hedge]") {
    const std::string head =
        R"({"valuation_date": "2027-01-04", "market": {"spot": 48, "volatility": 0.25, "rate": 0.03},
      "option": {"type": "call", "strike": 48, "expiry_date": "2027-07-05"}, "hedge": )";
    CHECK(message_of("hedge", head + R"({"rebalance": {"every": 0}}})") ==
          "hedge.rebalance.every: must be between 1 and 1000, got 0");
    CHECK(message_of("hedge", head + R"({"cost_pb": 4}})") ==
          "hedge.cost_pb: unknown field (did you mean \"cost_bp\"?)");
    CHECK(message_of("hedge", head + R"({"cost_bp": -1}})") == "hedge.cost_bp: must be >= 0, got -1");
    CHECK(message_of("hedge",
                     head + R"({"rebalance": {"dates": ["2027-02-01"]}, "path": {"kind": "spots", "spots": [50]}}})") ==
          "hedge.path.spots: has 1 spots; the schedule has 2 dates after valuation (2027-02-01, 2027-07-05)");
    CHECK(message_of("hedge", head + R"({"path": {"kind": "lattice", "moves": "UUXD"}}})") ==
          "hedge.path.moves: moves are U (up) or D (down); character 3 is \"X\"");
    CHECK(message_of("hedge", head + R"({"path": {"kind": "lattice", "nodes": [0, 1, 3]}}})") ==
          "hedge.path.nodes[2]: must be the previous index (down) or one more (up), got 3 after 1");
    CHECK(message_of(
              "hedge",
              head + R"({"path": {"kind": "stress", "shape": "gap-down", "change": 1.5, "date": "2027-02-01"}}})") ==
          "hedge.path.change: must be below 1 (a fall of 100 % or more), got 1.5");
    CHECK(message_of("hedge", head + R"({"rebalance": {"dates": ["2027-09-01"]}}})") ==
          "hedge.rebalance.dates[0]: must be on or before the final expiry 2027-07-05, got 2027-09-01");
    CHECK(message_of("hedge", head + R"({"path": {"kind": "walk"}}})") ==
          "hedge.path.kind: must be one of scenario, spots, lattice, stress, got string \"walk\"");
}
