// Tests for commands/currency: a currency pair in the trade document, through the price command.
#include "commands/currency.hpp"

#include "contract/errors.hpp"
#include "dispatch/dispatch.hpp"
#include "test_support.hpp"

#include <catch2/catch.hpp>

using namespace hedgeleaf;

namespace {

// The treasurer of the issue: 5 million EUR received in 9 months, spot 1.0850, USD 3 %, EUR
// 1.5 % (money-market ACT/360 simple), a put on 1.0600 at 8 % (examples/currency-receivable-put.json).
json treasurer() {
    return parse_json_text(R"({
      "valuation_date": "2026-12-03",
      "underlying": {"kind": "currency_pair", "base": "EUR", "quote": "USD"},
      "market": {"spot": 1.0850, "volatility": 0.08,
                 "domestic_rate": {"rate": 0.03, "day_count": "ACT/360", "compounding": "simple"},
                 "foreign_rate": {"rate": 0.015, "day_count": "ACT/360", "compounding": "simple"}},
      "option": {"type": "put", "strike": 1.0600, "expiry_date": "2027-09-03"},
      "notional": {"amount": 5000000, "currency": "EUR"},
      "conventions": {"premium": "domestic_pips", "delta": "spot"}})");
}

}  // namespace

TEST_CASE("the treasurer's put: dates, forward, premium and delta in every convention", "[currency]") {
    const json r = run_command("price", treasurer());
    const json& c = r.at("currency");
    // Thursday trade -> Monday spot; Friday expiry -> Tuesday delivery (calendar facts, T+2).
    CHECK(c["dates"]["spot"] == "2026-12-07");
    CHECK(c["dates"]["delivery"] == "2027-09-07");
    CHECK(c["dates"]["premium"] == "2026-12-07");
    CHECK(c["years"]["volatility"].get<double>() == Approx(274 / 365.0));
    // Python (tests/analytics/currency_test.cpp): F = S (1 + 0.03 d/360) / (1 + 0.015 d/360), d = 274.
    CHECK(c["forward"].get<double>() == Approx(1.0972472604432726).epsilon(1e-13));
    CHECK(c["forward_points"].get<double>() == Approx(122.47260443272623).epsilon(1e-9));
    CHECK(c["discount_factor"].get<double>() == Approx(0.9776763891152029).epsilon(1e-13));
    CHECK(c["rates"]["domestic"]["zero_rate"].get<double>() == Approx(0.030074606844161605).epsilon(1e-12));
    CHECK(c["rates"]["foreign"]["zero_rate"].get<double>() == Approx(0.015122174243510186).epsilon(1e-12));
    // D x Black (scipy) 0.014490687623303385 = 144.9069 USD pips; the lattice within 0.002 pips.
    CHECK(r["closed_form"]["premium"].get<double>() == Approx(0.014490687623303385).epsilon(1e-12));
    CHECK(c["premium"]["value"].get<double>() == Approx(144.90687623303384).margin(0.002));
    CHECK(c["premium"]["currency"] == "USD");
    CHECK(c["premium"]["amount"].get<double>() == Approx(5e6 * 0.014490687623303385).margin(1));
    CHECK(c["premium"]["in_each_convention"]["percent_of_foreign"].get<double>() ==
          Approx(1.3355472463874087).epsilon(1e-4));
    CHECK(c["delta"]["in_each_convention"]["forward"].get<double>() == Approx(-0.29704847281389646).margin(1e-4));
    CHECK(c["delta"]["value"].get<double>() == Approx(-0.29369544976244194).margin(1e-4));
    CHECK(c["delta"]["position_EUR"].get<double>() == Approx(5e6 * -0.29369544976244194).margin(500));
    // The replicating portfolio holds euros and dollars, not shares.
    CHECK(r["replication"].contains("foreign"));
    CHECK_FALSE(r["replication"].contains("shares"));
}

TEST_CASE("USD/CAD settles one business day after the trade unless told otherwise", "[currency]") {
    // Common practice (from memory): USD/CAD spot is T+1, most other pairs T+2 (docs/currency.md).
    for (const auto& [base, quote] : {std::pair{"USD", "CAD"}, std::pair{"CAD", "USD"}}) {
        json doc = treasurer();
        doc["underlying"]["base"] = base;
        doc["underlying"]["quote"] = quote;
        doc["market"]["spot"] = std::string(base) == "USD" ? 1.38 : 1 / 1.38;
        doc["option"]["strike"] = std::string(base) == "USD" ? 1.38 : 1 / 1.38;
        doc["option"]["expiry_date"] = "2027-03-05";  // a Friday
        doc["notional"]["currency"] = base;
        const json c = run_command("price", doc).at("currency");
        CHECK(c["spot_lag_days"] == 1);
        CHECK(c["dates"]["spot"] == "2026-12-04");      // Thursday -> Friday
        CHECK(c["dates"]["delivery"] == "2027-03-08");  // Friday -> Monday
    }
    json given = treasurer();
    given["underlying"] = {{"kind", "currency_pair"}, {"base", "USD"}, {"quote", "CAD"}, {"spot_lag_days", 2}};
    given["market"]["spot"] = 1.38;
    given["option"]["strike"] = 1.38;
    given["notional"]["currency"] = "USD";
    CHECK(run_command("price", given).at("currency")["dates"]["spot"] == "2026-12-07");  // as given
    CHECK(run_command("price", treasurer()).at("currency")["spot_lag_days"] == 2);       // EUR/USD: T+2
}

TEST_CASE("a pair's notional in the quote currency and a premium paid in the base currency", "[currency]") {
    json doc = treasurer();
    doc["notional"] = {{"amount", 5300000}, {"currency", "USD"}};  // 5,000,000 EUR at 1.06
    doc["conventions"] = {{"premium", "percent_of_foreign"}, {"premium_currency", "EUR"}};
    const json r = run_command("price", doc);
    CHECK(r["position"]["quantity"].get<double>() == Approx(5e6));
    // Paid in EUR: premium-adjusted spot delta by default (common practice).
    CHECK(r["currency"]["delta"]["convention"] == "spot_premium_adjusted");
    CHECK(r["currency"]["premium"]["amount"].get<double>() == Approx(5e6 * 0.014490687623303385 / 1.085).epsilon(1e-4));
}

TEST_CASE("a put by 25 delta solved in the trade's convention", "[currency]") {
    json doc = treasurer();
    doc["option"]["strike"] = {{"delta", -0.25}};
    doc["conventions"]["delta"] = "spot_premium_adjusted";
    // scipy brentq on -D (K/S) N(-d2) = -0.25 (tests/analytics/currency_test.cpp).
    CHECK(trade_of(doc.dump()).legs[0].strike == Approx(1.0479340503527794).epsilon(1e-10));
}

TEST_CASE("a pair's document is refused field by field", "[currency]") {
    const auto refused = [](const char* pointer, const json& value) {
        json doc = treasurer();
        doc[json::json_pointer(pointer)] = value;
        return message_of(doc);
    };
    CHECK(refused("/underlying/base", "EURO") ==
          "underlying.base: must be an ISO 4217 currency code, three capital letters such as EUR or USD, got \"EURO\"");
    CHECK(refused("/underlying/quote", "EUR") == "underlying.quote: must differ from underlying.base (EUR)");
    CHECK(refused("/market/carry_yield", 0.015) ==
          "market.carry_yield: a currency pair takes domestic_rate (the quote currency's) and foreign_rate (the "
          "base currency's)");
    CHECK(refused("/quantity", 10) ==
          "quantity: a currency trade's size is its notional: {\"amount\": 5000000, \"currency\": \"EUR\"}");
    CHECK(refused("/notional/currency", "GBP") == "notional.currency: must be EUR or USD, got GBP");
    CHECK(refused("/conventions/premium", "points") ==
          "conventions.premium: must be one of domestic_per_foreign, domestic_pips, percent_of_foreign, "
          "percent_of_domestic, foreign_pips, got string \"points\"");
    CHECK(refused("/market/domestic_rate/day_count", "30/360") ==
          "market.domestic_rate.day_count: must be one of ACT/360, ACT/365, got string \"30/360\"");
    CHECK(refused("/conventions/premium_date", "2027-09-08") ==
          "conventions.premium_date: is 2027-09-08, after the delivery date 2027-09-07");
    json no_date = treasurer();
    no_date.erase("valuation_date");
    CHECK(message_of(no_date).rfind("valuation_date: is required for a currency pair", 0) == 0);
    json years = treasurer();
    years["option"].erase("expiry_date");
    years["option"]["expiry_years"] = 0.75;
    CHECK(message_of(years) ==
          "option.expiry_date: a currency option's expiry is a date: give expiry_date or "
          "expiry_tenor (valuation_date is the trade date)");
    json equity = treasurer();
    equity.erase("underlying");
    CHECK(message_of(equity).rfind("market.rate: ", 0) == 0);
    // The client price's amounts are in the quote currency: a label in another one was printed
    // beside USD figures (a EUR premium is conventions.premium_currency's, not the quote's).
    json labelled = treasurer();
    labelled["quote"] = {{"currency", "EUR"}, {"margin", 0.0005}};
    CHECK_THROWS_WITH(run_command("price", labelled),
                      "quote.currency: the client price of a EUR/USD trade is in USD (per EUR and in total), got "
                      "EUR; give USD or leave it out (the premium in EUR is conventions.premium_currency's)");
    labelled["quote"]["currency"] = "USD";
    CHECK(run_command("price", labelled).at("client_price")["currency"] == "USD");
    // Percent of the quote-currency notional converts at the strike: a risk reversal has two
    // (it printed null for the premium in that convention, exit 0).
    for (const char* convention : {"percent_of_domestic", "foreign_pips"}) {
        json rr = treasurer();
        rr.erase("option");
        rr["structure"] = {{"shape", "risk-reversal"}, {"strikes", {1.05, 1.15}}, {"expiry_date", "2027-09-03"}};
        rr["conventions"]["premium"] = convention;
        CHECK(message_of(rr) == "conventions.premium: " + std::string(convention) +
                                    " is per unit of the USD notional, which converts at the strike, and these legs "
                                    "have several; use domestic_per_foreign, domestic_pips or percent_of_foreign");
    }
}

TEST_CASE("a comparison of currency options carries the pair's pip; one of shares carries none", "[currency]") {
    // The pip by common practice: 0.0001 for EUR/USD, 0.01 when the quote currency is JPY.
    const json eur = treasurer();
    json jpy = treasurer();
    jpy["underlying"]["quote"] = "JPY";
    jpy["market"]["spot"] = 162.5;
    jpy["option"]["strike"] = 158;
    const auto compared = [](const json& alternative) {
        return run_command("compare", json{{"comparison", {{"alternatives", {alternative, alternative}}}}});
    };
    CHECK(compared(eur)["pip_size"] == 0.0001);
    CHECK(compared(jpy)["pip_size"] == 0.01);
    CHECK(compared(eur)["currency"] == "USD");
    const json shares = parse_json_text(R"({"market": {"spot": 40, "volatility": 0.25, "rate": 0.03},
      "option": {"type": "put", "strike": 38, "expiry_years": 1}})");
    CHECK(compared(shares)["pip_size"].is_null());
}
