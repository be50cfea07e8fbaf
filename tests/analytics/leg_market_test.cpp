// Tests for analytics/leg_market and analytics/strikes with the commands that use them: each
// leg priced at its own smile volatility, curves, strikes by percent and delta, strike_tick,
// the smile's moves in ladders and the volatility solve on a smile.
#include "analytics/leg_market.hpp"
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"

#include "../test_support.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {
json doc_of(const char* text) { return json::parse(text); }

}  // namespace

TEST_CASE("a flat grid prices exactly as the same volatility given as one number", "[leg_market]") {
    const json flat_grid = json::parse(R"({"expiries": [0.25, 1, 2], "strikes": [60, 100, 140],
        "vols": [[0.23, 0.23, 0.23], [0.23, 0.23, 0.23], [0.23, 0.23, 0.23]]})");
    for (const char* command : {"price", "tree", "hedge"}) {
        INFO(command);
        const json a = run_command(command, three_styles(0.23));
        const json b = run_command(command, three_styles(flat_grid));
        if (std::string(command) == "price") {
            CHECK(a["premium"].get<double>() == b["premium"].get<double>());
            for (std::size_t i = 0; i < 3; ++i)
                CHECK(a["legs"][i]["premium"].get<double>() == b["legs"][i]["premium"].get<double>());
        } else if (std::string(command) == "tree") {
            CHECK(a["nodes"] == b["nodes"]);
        } else {
            CHECK(a["rows"] == b["rows"]);
        }
    }
}

TEST_CASE("each leg is priced at the smile's volatility for its own strike and expiry", "[leg_market]") {
    const json out = run_command("price", three_styles(json::parse(downside_skew)));
    const trade t = read_trade(three_styles(json::parse(downside_skew)));
    for (std::size_t i = 0; i < 3; ++i) {
        const double want = t.market.volatility_at(t.legs[i].strike, t.legs[i].expiry_years).volatility;
        CHECK(out["legs"][i]["market"]["volatility"].get<double>() == want);
        CHECK(out["legs"][i]["market"]["rate"].get<double>() == 0.03);
        CHECK(out["legs"][i]["market"]["carry_yield"].get<double>() == 0.01);
    }
    // The 90 put sits on the steep side of the skew, the 115 call on the flat side.
    CHECK(out["legs"][0]["market"]["volatility"].get<double>() > out["legs"][1]["market"]["volatility"].get<double>());
}

TEST_CASE("a European option under time-varying rates is BSM at the average rate over its life", "[leg_market]") {
    // Merton (1973), "Theory of Rational Option Pricing", Bell J. Econ. 4: with deterministic
    // rates the Black-Scholes formula holds with the average rate over the option's life (also
    // Hull, Options, Futures, and Other Derivatives, from memory). Curve 0.02 at 0.5 y, 0.04 at
    // 2 y: r t linear between them, so the 1 y integral is 0.01 + 0.07 x 0.5/1.5 = 1/30.
    // References by scipy.stats.norm via /usr/bin/python3, S 100, K 105, q 0.01, vol 0.25.
    json d = doc_of(R"({
      "market": {"spot": 100, "volatility": 0.25, "carry_yield": 0.01,
                 "rate": {"points": [{"years": 0.5, "rate": 0.02}, {"years": 2, "rate": 0.04}]}},
      "option": {"type": "call", "strike": 105, "expiry_years": 1}
    })");
    const json call = run_command("price", d);
    CHECK(call["legs"][0]["market"]["rate"].get<double>() == Approx(1.0 / 30).epsilon(1e-12));
    CHECK(call["premium"].get<double>() == Approx(8.75067878162477).margin(2e-5));
    CHECK(call["closed_form"]["premium"].get<double>() == Approx(8.75067878162477).epsilon(1e-12));
    d["option"]["type"] = "put";
    const json put = run_command("price", d);
    CHECK(put["premium"].get<double>() == Approx(11.303385957318575).margin(2e-5));
}

TEST_CASE("between smile expiries a European option is BSM at the average variance", "[leg_market]") {
    // Merton (1973): with a deterministic volatility the option is worth BSM at the root mean
    // square volatility over its life. Total variance linear in time between 0.2 at 1 y and
    // 0.3 at 2 y gives at 1.5 y the variance (0.04 + 0.07) / 1.5. Reference: scipy.stats.norm,
    // S = K = 100, r 0.03, vol sqrt(0.11 / 1.5) = 0.270801280154532.
    const json d = doc_of(R"({
      "market": {"spot": 100, "rate": 0.03,
                 "volatility": {"expiries": [1, 2], "strikes": [100], "vols": [[0.2], [0.3]]}},
      "option": {"type": "call", "strike": 100, "expiry_years": 1.5}
    })");
    const json out = run_command("price", d);
    CHECK(out["legs"][0]["market"]["volatility"].get<double>() == Approx(0.270801280154532).epsilon(1e-13));
    CHECK(out["premium"].get<double>() == Approx(15.198649203458281).margin(2e-5));
}

TEST_CASE("put-call parity holds with rate and yield curves, borrow and a cash dividend", "[leg_market]") {
    // C - P = (S - PV(dividend)) exp(-int (q + b)) - K exp(-int r) (common practice; Hull, from
    // memory). Rate curve 0.02 at 0.5 y, 0.04 at 2 y: int r to 1 y = 1/30, to 0.4 y = 0.008.
    json d = doc_of(R"({
      "market": {"spot": 100, "volatility": 0.3, "carry_yield": 0.01, "borrow": 0.005,
                 "rate": {"points": [{"years": 0.5, "rate": 0.02}, {"years": 2, "rate": 0.04}]},
                 "dividends": [{"time_years": 0.4, "amount": 2}]},
      "legs": [{"type": "call", "strike": 95, "expiry_years": 1, "quantity": 1},
               {"type": "put", "strike": 95, "expiry_years": 1, "quantity": -1}]
    })");
    const double pv_dividend = 2 * std::exp(-0.008);
    const double want = (100 - pv_dividend) * std::exp(-0.015) - 95 * std::exp(-1.0 / 30);
    CHECK(run_command("price", d)["premium"].get<double>() == Approx(want).margin(2e-6));
}

TEST_CASE("cash dividends and Bermudan dates keep working on curves", "[leg_market]") {
    // A curve of one rate at every point prices as that rate given as a number, and a
    // Bermudan put lies between the European and the American (common practice).
    json d = doc_of(R"({
      "market": {"spot": 100, "volatility": 0.25, "rate": 0.04,
                 "dividends": [{"time_years": 0.3, "amount": 1.5}, {"time_years": 0.8, "amount": 1.5}]},
      "option": {"type": "put", "strike": 105, "expiry_years": 1, "exercise": "american"}
    })");
    const double flat = run_command("price", d)["premium"].get<double>();
    d["market"]["rate"] = json::parse(R"({"points": [{"years": 0.25, "rate": 0.04}, {"years": 2, "rate": 0.04}]})");
    const double american = run_command("price", d)["premium"].get<double>();
    CHECK(american == Approx(flat).margin(1e-9));
    d["market"]["rate"] = json::parse(R"({"points": [{"years": 0.25, "rate": 0.02}, {"years": 2, "rate": 0.05}]})");
    const double american_curve = run_command("price", d)["premium"].get<double>();
    d["option"]["exercise"] = "bermudan";
    d["option"]["exercise_years"] = {0.29, 0.79};
    const double bermudan = run_command("price", d)["premium"].get<double>();
    d["option"]["exercise"] = "european";
    d["option"].erase("exercise_years");
    const double european = run_command("price", d)["premium"].get<double>();
    CHECK(european < bermudan);
    CHECK(bermudan < american_curve);
}

TEST_CASE("a curve that breaks the lattice's no-arbitrage bounds is refused with the fields to change",
          "[leg_market]") {
    const json d = doc_of(R"({
      "market": {"spot": 100, "volatility": 0.05,
                 "rate": {"points": [{"years": 0.5, "rate": 0.01}, {"years": 1, "rate": 0.45}]}},
      "option": {"type": "put", "strike": 100, "expiry_years": 1, "exercise": "american"},
      "lattice": {"method": "crr", "steps": 10}
    })");
    try {
        (void)run_command("price", d);
        FAIL("accepted");
    } catch (const input_error& e) {
        const std::string m = e.what();
        CHECK(m.rfind("market.volatility: the crr lattice breaks no-arbitrage", 0) == 0);
        CHECK(m.find("lattice.steps") != std::string::npos);
    }
}

TEST_CASE("strikes by percent of spot or forward and by delta, rounded to strike_tick", "[strikes]") {
    // Spot delta of a European option, -exp(-qT) N(-d1) for a put (Hull, from memory). The
    // strikes of -0.25 and 0.25 deltas at S 100, r 0.03, q 0.01, vol 0.2, 1 y found by
    // scipy.optimize.brentq on scipy.stats.norm: 91.09012277854545 and 118.9247565631898.
    json d = doc_of(R"({
      "market": {"spot": 100, "volatility": 0.2, "rate": 0.03, "carry_yield": 0.01},
      "legs": [{"type": "put", "strike": {"delta": -0.25}, "expiry_years": 1, "quantity": 1},
               {"type": "call", "strike": {"delta": 0.25}, "expiry_years": 1, "quantity": -1},
               {"type": "call", "strike": {"percent_of_forward": 100}, "expiry_years": 1, "quantity": 1},
               {"type": "put", "strike": {"percent_of_spot": 95}, "expiry_years": 1, "quantity": 1}]
    })");
    const trade exact = read_trade(d);
    CHECK(exact.legs[0].strike == Approx(91.09012277854545).epsilon(1e-10));
    CHECK(exact.legs[1].strike == Approx(118.9247565631898).epsilon(1e-10));
    CHECK(exact.legs[2].strike == Approx(100 * std::exp(0.02)).epsilon(1e-14));
    CHECK(exact.legs[3].strike == Approx(95).epsilon(1e-14));
    d["strike_tick"] = 0.5;
    const json out = run_command("price", d);
    CHECK(out["legs"][0]["strike"].get<double>() == 91.0);
    CHECK(out["legs"][0]["strike_written"]["before_rounding"].get<double>() == Approx(91.09012277854545));
    CHECK(out["legs"][1]["strike"].get<double>() == 119.0);
    CHECK(out["legs"][2]["strike"].get<double>() == 102.0);
    CHECK(out["legs"][1]["strike_percent_of_spot"].get<double>() == 119.0);
    d["legs"][0]["strike"] = json::parse(R"({"delta": 0.25})");
    try {
        (void)read_trade(d);
        FAIL("accepted");
    } catch (const input_error& e) {
        CHECK(std::string(e.what()) ==
              "legs[0].strike.delta: a put's delta lies between -1 and 0 (-0.25 for a 25-delta put), got 0.25");
    }
}

TEST_CASE("a zero-cost collar solved to a strike tick shows what rounding leaves", "[strikes]") {
    json d = doc_of(R"({
      "market": {"spot": 100, "volatility": 0.25, "rate": 0.03},
      "strike_tick": 0.5,
      "legs": [{"type": "put", "strike": 90, "expiry_years": 1, "quantity": 1},
               {"type": "call", "strike": 110, "expiry_years": 1, "quantity": -1}],
      "solve": {"for": "strike", "leg": 1, "target_premium": 0}
    })");
    d["market"]["volatility"] = json::parse(downside_skew);
    const json out = run_command("solve", d);
    const double rounded = out["rounded"]["strike"].get<double>();
    CHECK(std::fabs(rounded - out["solution"].get<double>()) <= 0.25);
    CHECK(std::fmod(rounded, 0.5) == 0.0);
    // The residual is the collar's premium at the rounded strike, priced on its own.
    d["legs"][1]["strike"] = rounded;
    const double premium = run_command("price", d)["premium"].get<double>();
    CHECK(out["rounded"]["residual"].get<double>() == Approx(premium).margin(1e-9));
    CHECK(out["rounded"]["residual"].get<double>() != 0.0);
}

TEST_CASE("the volatility solve on a smile finds a parallel move, or one leg's volatility", "[solver]") {
    // The move is added to the volatility read off the smile; on the grid's own expiries that
    // is the same as adding it to every cell (between expiries total variance interpolates,
    // which is not linear in the move), so the legs sit on expiries here.
    json grid = json::parse(downside_skew);
    grid["expiries"] = {1, 1.5};
    json d = three_styles(grid);
    json shifted = d;
    // Price the collar with the whole smile 2 points higher: the solve must find 0.02.
    for (auto& row : shifted["market"]["volatility"]["vols"])
        for (auto& v : row) v = v.get<double>() + 0.02;
    const double target = run_command("price", shifted)["premium"].get<double>();
    d["solve"] = {{"for", "volatility"}, {"target_premium", target}};
    const json out = run_command("solve", d);
    CHECK(out["solved_for"] == "parallel move of the smile");
    CHECK(out["solution"].get<double>() == Approx(0.02).margin(1e-7));
    // One leg: the 115 call's own volatility, the others at the smile's.
    const trade t = read_trade(d);
    const double call_vol = leg_volatility(t.market, t.legs[1]).volatility;
    json one = d;
    one["solve"] = {{"for", "volatility"}, {"leg", 1}, {"target_premium", run_command("price", d)["premium"]}};
    const json leg_out = run_command("solve", one);
    CHECK(leg_out["solved_for"] == "legs[1] volatility");
    CHECK(leg_out["solution"].get<double>() == Approx(call_vol).margin(1e-6));
}

TEST_CASE("ladders say how the smile moves with spot: sticky strike or sticky moneyness", "[ladder]") {
    // Sticky moneyness: strike K at spot S' takes today's volatility at K S / S' (common desk
    // practice). Check the +10 % row against a ladder of the same option at that volatility.
    json d = doc_of(R"({
      "market": {"spot": 100, "rate": 0.03},
      "option": {"type": "put", "strike": 100, "expiry_years": 1},
      "ladder": {"kind": "spot", "spot_from": 0.1, "spot_to": 0.1, "spot_step": 0.05}
    })");
    d["market"]["volatility"] = json::parse(downside_skew);
    const trade t = read_trade(d);
    const auto value_with = [&](const json& volatility, const char* move) {
        json x = d;
        x["market"]["volatility"] = volatility;
        if (move) x["ladder"]["smile"] = move;
        const json out = run_command("ladder", x);
        return out["rows"][0]["value"].get<double>();
    };
    const double sticky_strike = value_with(json::parse(downside_skew), nullptr);
    const double sticky_moneyness = value_with(json::parse(downside_skew), "sticky-moneyness");
    CHECK(sticky_strike == Approx(value_with(t.market.volatility_at(100, 1).volatility, nullptr)).epsilon(1e-12));
    CHECK(sticky_moneyness ==
          Approx(value_with(t.market.volatility_at(100 * 100 / 110.0, 1).volatility, nullptr)).epsilon(1e-12));
    CHECK(sticky_moneyness > sticky_strike);  // the put moves up the skew with the smile
    const json out = run_command("ladder", d);
    CHECK(out["smile"]["moves"] == "sticky-strike");
    // The caution says what the model assumed of the smile, not "constant volatility".
    CHECK(out["caution"].get<std::string>().find("at the volatility smile") != std::string::npos);
}
