// Tests for analytics/simulate (through commands/simulate): the Derman-Kamal scaling of the hedging error, levels and caps.
#include "commands/simulate.hpp"
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"
#include "numerics/closed_form.hpp"

#include "test_support.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <string>

using namespace hedgeleaf;

namespace {

// The simulation of a trade document (its settings come from the document's simulate section).
simulation simulate(const std::string& text) { return run_steps(text, read_simulate_settings, run_simulation); }

// A one-year (364-day) at-the-money option on a fictional share, so weekly and
// four-weekly hedges have exactly 52 and 13 equal intervals.
std::string atm(const std::string& type, const std::string& exercise, const std::string& simulate) {
    return R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.0},
      "option": {"type": ")" +
           type + R"(", "strike": 48, "expiry_years": 0.9972602739726028, "exercise": ")" + exercise + R"("},
      "simulate": )" +
           simulate + "}";
}

}  // namespace

TEST_CASE("hedging error of an at-the-money European follows Derman and Kamal", "[simulate]") {
    // Derman and Kamal (1999), from memory: sd of the hedging error ~ sqrt(pi/4) * vega * sigma / sqrt(N),
    // falling like 1/sqrt(N). The formula is leading order in 1/N: with 100,000 paths we measured sd/formula - 1
    // = -7.6 % (N = 4), -4.6 % (13), -3.0 % (26), -1.7 % (52), -0.65 % (260). Monte Carlo tolerance: with
    // 20,000 paths the sd is known to about 0.6 % (sd_standard_error, from the sample kurtosis), so we allow
    // 3 % at N = 52, 7 % at N = 13, 5 % on the ratio of the two (sqrt(52/13) = 2), and require the gap to the
    // formula to shrink as N grows.
    const std::string text = atm("call", "european", R"({"paths": 20000, "seed": 11,
        "frequencies": [{"every": 4, "unit": "weeks"}, {"every": 1, "unit": "weeks"}]})");
    const trade t = trade_of(text);
    const simulation sim = simulate(text);
    REQUIRE(sim.closed_form_delta);
    REQUIRE(sim.frequencies.size() == 2);
    const pnl_summary& monthly = sim.frequencies[0];
    const pnl_summary& weekly = sim.frequencies[1];
    CHECK(monthly.rebalancings == 13);
    CHECK(weekly.rebalancings == 52);
    const double vega = closed_form(t.market, t.legs[0]).sensitivities.vega;
    const double dk13 = derman_kamal_sd(vega, 0.3, 13), dk52 = derman_kamal_sd(vega, 0.3, 52);
    CHECK(monthly.sd == Approx(dk13).epsilon(0.07));
    CHECK(weekly.sd == Approx(dk52).epsilon(0.03));
    CHECK(monthly.sd / weekly.sd == Approx(2.0).epsilon(0.05));
    CHECK(std::fabs(weekly.sd / dk52 - 1) < std::fabs(monthly.sd / dk13 - 1));
    CHECK(weekly.sd_standard_error < 0.01 * weekly.sd);
    // Hedged at the volatility the paths realise: no edge on average (mean within 4 standard errors).
    CHECK(std::fabs(weekly.mean) < 4 * weekly.mean_standard_error);
    CHECK(std::fabs(monthly.mean) < 4 * monthly.mean_standard_error);
    CHECK(weekly.p01 < weekly.p05);
    CHECK(weekly.p05 < weekly.p50);
    CHECK(weekly.p50 < weekly.p95);
    CHECK(weekly.p95 < weekly.p99);
    long total = weekly.below + weekly.above;
    for (long c : weekly.counts) total += c;
    CHECK(total == 20000);
}

TEST_CASE("realised volatility above the pricing volatility loses money for the option seller's hedge", "[simulate]") {
    // Common practice: a delta hedger short gamma loses about 0.5 * gamma * S^2 * (realised^2 - implied^2)
    // over time; here we only check the sign and that costs lower the mean by about the mean costs.
    const simulation s_hot = simulate(atm("call", "european", R"({"paths": 4000, "volatility": 0.4,
        "frequencies": [{"every": 1, "unit": "weeks"}]})"));
    CHECK(s_hot.frequencies[0].mean < -10 * s_hot.frequencies[0].mean_standard_error);
    const simulation a = simulate(atm("call", "european", R"({"paths": 4000, "cost_bp": 20,
        "frequencies": [{"every": 1, "unit": "weeks"}]})"));
    const simulation b =
        simulate(atm("call", "european", R"({"paths": 4000, "frequencies": [{"every": 1, "unit": "weeks"}]})"));
    CHECK(a.frequencies[0].mean_costs > 0);
    // Same seed, same paths: the gap is the costs (grown at the rate, which is 0 here).
    CHECK(b.frequencies[0].mean - a.frequencies[0].mean == Approx(a.frequencies[0].mean_costs).epsilon(0.05));
}

TEST_CASE("American put: lattice delta table, error falls with more rebalancing, reproducible", "[simulate]") {
    const std::string text = atm("put", "american", R"({"paths": 3000, "seed": 3,
        "frequencies": [{"every": 4, "unit": "weeks"}, {"every": 1, "unit": "weeks"}]})");
    const simulation a = simulate(text);
    CHECK_FALSE(a.closed_form_delta);
    CHECK(a.frequencies[1].sd < 0.65 * a.frequencies[0].sd);
    CHECK(std::fabs(a.frequencies[1].mean) < 4 * a.frequencies[1].mean_standard_error + 0.01);
    const simulation b = simulate(text);
    for (std::size_t i = 0; i < a.frequencies[1].pnl.size(); ++i)
        REQUIRE(a.frequencies[1].pnl[i] == b.frequencies[1].pnl[i]);
}

TEST_CASE("covered call with a dividend: the share leg's income is passed through", "[simulate]") {
    const simulation s = simulate(R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.03, "carry_yield": 0.01,
        "dividends": [{"time_years": 0.3, "amount": 0.6}]},
        "structure": {"shape": "covered-call", "strikes": [52], "expiry_years": 0.5},
        "simulate": {"paths": 4000, "frequencies": [{"every": 1, "unit": "days"}]}})");
    CHECK(std::fabs(s.frequencies[0].mean) < 4 * s.frequencies[0].mean_standard_error + 1e-3);
}

TEST_CASE("simulate result, caps and bad input", "[simulate]") {
    const json r = run_command("simulate", parse_json_text(atm("call", "european", R"({"paths": 500})")));
    REQUIRE(r["rows"].size() == 3);  // business days, weeks, months by default
    CHECK(r["rows"][0]["frequency"] == "every 1 business days");
    CHECK(r["histogram"]["edges"].size() == 41);
    CHECK(r["histogram"]["series"].size() == 3);
    CHECK(r["rows"][1]["derman_kamal_sd"].is_number());
    const auto message = [](const std::string& text) {
        try {
            (void)run_command("simulate", parse_json_text(text));
        } catch (const input_error& e) {
            return std::string(e.what());
        }
        return std::string("(no error)");
    };
    CHECK(message(atm("call", "european", R"({"paths": 300000})")) ==
          "simulate.paths: must be between 1 and 200000, got 300000");
    CHECK(message(atm("call", "european", R"({"paths": 200000, "frequencies": [{"every": 1, "unit": "days"}]})")) ==
          "simulate.paths: paths x rebalancings over all frequencies is 52000000, at most 50000000; use fewer paths or "
          "rebalance less often");
    CHECK(message(atm("call", "european", R"({"frequencies": [{"every": 1, "unit": "fortnights"}]})")) ==
          "simulate.frequencies[0].unit: must be one of days, weeks, months, got string \"fortnights\"");
    CHECK(message(atm("call", "european", R"({"path": 5})")) ==
          "simulate.path: unknown field (did you mean \"paths\"?)");
}

TEST_CASE("an American leg that expires at the first hedge date is valued, not read from a missing level",
          "[simulate]") {
    // Expiry 1e-9 years, within the time tolerance of today: the leg has no delta table on any hedge
    // date, and its opening value is read off the lattice. Check: an at-the-money option this close to
    // expiry is worth S * sigma * sqrt(T / (2 pi)) (Brenner and Subrahmanyam (1988), "A simple formula
    // to compute the implied standard deviation", from memory; early exercise adds nothing here).
    for (const char* exercise : {"american", "bermudan"}) {
        const std::string extra = std::string(exercise) == "bermudan" ? R"(, "exercise_years": [1e-9])" : "";
        const std::string text = R"({"market": {"spot": 100, "volatility": 0.2, "rate": 0.03},
          "option": {"type": "put", "strike": 100, "expiry_years": 1e-9, "exercise": ")" +
                                 std::string(exercise) + "\"" + extra + R"(}, "simulate": {"paths": 4, "seed": 3}})";
        const simulation sim = simulate(text);
        const double expected = 100 * 0.2 * std::sqrt(1e-9 / (2 * M_PI));
        CHECK(sim.premium == Approx(expected).epsilon(0.02));
        for (const pnl_summary& f : sim.frequencies) CHECK(std::isfinite(f.mean));
    }
}
