// Tests for commands/smile_by_delta: a currency pair's smile quoted by delta in the trade
// document, through the price command, and each bad quote's message.
#include "commands/smile_by_delta.hpp"

#include "contract/errors.hpp"
#include "dispatch/dispatch.hpp"
#include "test_support.hpp"

#include <catch2/catch.hpp>

using namespace hedgeleaf;

namespace {

// The treasurer of the issue (examples/currency-receivable-put.json): a EUR/USD put on 1.0600
// expiring 2027-09-03, spot 1.0850, USD 3 %, EUR 1.5 % money-market ACT/360 simple.
json treasurer(const json& volatility) {
    json doc = parse_json_text(R"({
      "valuation_date": "2026-12-03",
      "underlying": {"kind": "currency_pair", "base": "EUR", "quote": "USD"},
      "market": {"spot": 1.0850,
                 "domestic_rate": {"rate": 0.03, "day_count": "ACT/360", "compounding": "simple"},
                 "foreign_rate": {"rate": 0.015, "day_count": "ACT/360", "compounding": "simple"}},
      "option": {"type": "put", "strike": 1.0600, "expiry_date": "2027-09-03"},
      "notional": {"amount": 5000000, "currency": "EUR"},
      "conventions": {"premium": "domestic_pips", "delta": "spot"}})");
    doc["market"]["volatility"] = volatility;
    return doc;
}

json quotes(const json& list) { return {{"quotes_by_delta", list}}; }
// One element per entry (a braced single object would be the object itself, not a list of one).
json quotes(std::initializer_list<json> entries) {
    json list = json::array();
    for (const json& e : entries) list.push_back(e);
    return quotes(list);
}

json nine_months(double atm, double rr25, double bf25) {
    return {{"expiry", "2027-09-03"}, {"atm", atm}, {"rr25", rr25}, {"bf25", bf25}};
}

std::string refusal_message(const json& doc) {
    try {
        run_command("price", doc);
    } catch (const input_error& e) {
        return e.what();
    }
    return "accepted";
}

}  // namespace

TEST_CASE("a flat quote by delta prices as the flat volatility", "[smile_by_delta]") {
    const json flat = run_command("price", treasurer(0.08));
    const json quoted = run_command("price", treasurer(quotes({nine_months(0.08, 0, 0)})));
    CHECK(quoted["premium"].get<double>() == Approx(flat["premium"].get<double>()).epsilon(1e-12));
    CHECK(quoted["closed_form"]["premium"].get<double>() == Approx(0.014490687623303385).epsilon(1e-12));
}

TEST_CASE("the treasurer's put on a smile quoted by delta", "[smile_by_delta]") {
    // atm 8 %, 25-delta risk reversal -0.6 %, butterfly 0.25 %, spot delta. scipy (norm.ppf for
    // the strikes, PchipInterpolator, norm.cdf for the price) puts the 25-delta put at
    // 1.047332280450766 (8.55 %), at-the-money (delta-neutral straddle) at 1.0998862271769188,
    // the 25-delta call at 1.1514467152340528 (7.95 %); scipy's PchipInterpolator in log
    // moneyness reads 8.358459088267516 % at 1.0600, and D x Black of the put there is
    // 0.015650031167693278.
    const json r = run_command("price", treasurer(quotes({nine_months(0.08, -0.006, 0.0025)})));
    const json& points = r["currency"]["smile_by_delta"][0]["points"];
    CHECK(points["put_25"]["strike"].get<double>() == Approx(1.047332280450766).epsilon(1e-10));
    CHECK(points["put_25"]["volatility"].get<double>() == Approx(0.0855).epsilon(1e-14));
    CHECK(points["atm"]["strike"].get<double>() == Approx(1.0998862271769188).epsilon(1e-12));
    CHECK(points["call_25"]["strike"].get<double>() == Approx(1.1514467152340528).epsilon(1e-10));
    CHECK(r["legs"][0]["market"]["volatility"].get<double>() == Approx(0.08358459088267516).epsilon(1e-9));
    CHECK(r["closed_form"]["premium"].get<double>() == Approx(0.015650031167693278).epsilon(1e-9));
}

TEST_CASE("each bad quote by delta has its own message naming the field", "[smile_by_delta]") {
    json no_atm = nine_months(0.08, -0.006, 0.0025);
    no_atm.erase("atm");
    CHECK_THAT(refusal_message(treasurer(quotes({no_atm}))),
               Catch::StartsWith("market.volatility.quotes_by_delta[0].atm"));
    CHECK_THAT(refusal_message(treasurer(quotes({nine_months(0.08, -0.2, 0.0025)}))),
               Catch::StartsWith("market.volatility.quotes_by_delta[0].bf25: gives the 25-delta call volatility "
                                 "atm + bf25 + rr25 / 2 = -0.0175; it must be at least 0.001"));
    json later = nine_months(0.08, -0.006, 0.0025), sooner = later;
    sooner["expiry"] = "1m";
    CHECK_THAT(
        refusal_message(treasurer(quotes({later, sooner}))),
        Catch::StartsWith("market.volatility.quotes_by_delta[1].expiry: ") && Catch::Contains("in increasing expiry"));
    json half = nine_months(0.08, -0.006, 0.0025);
    half["rr10"] = -0.01;
    CHECK(refusal_message(treasurer(quotes({half}))) ==
          "market.volatility.quotes_by_delta[0].bf10: is missing: rr10 is given, and the 10-delta wings need both "
          "rr10 and bf10");
    CHECK_THAT(refusal_message(treasurer(quotes(json::array()))),
               Catch::StartsWith("market.volatility.quotes_by_delta: "));
    // An equity trade's smile is a strike grid.
    json equity = parse_json_text(R"({"market": {"spot": 100, "rate": 0.03},
                                      "option": {"type": "call", "strike": 100, "expiry_years": 1}})");
    equity["market"]["volatility"] = quotes({json{{"expiry", 1}, {"atm", 0.2}, {"rr25", 0}, {"bf25", 0}}});
    CHECK_THAT(refusal_message(equity),
               Catch::StartsWith("market.volatility.quotes_by_delta: a smile quoted by delta") &&
                   Catch::Contains("currency pair"));
    // A calendar arbitrage between two expiries names the quote that makes it.
    json one_month = nine_months(0.20, 0, 0);
    one_month["expiry"] = "1m";
    CHECK_THAT(refusal_message(treasurer(quotes({one_month, nine_months(0.05, 0, 0)}))),
               Catch::StartsWith("market.volatility.quotes_by_delta[1]") && Catch::Contains("% of the forward"));
}
