// Tests for commands/quote and analytics/client_price: the client price attached to the price command's result.
#include "commands/quote.hpp"
#include "commands/trade_reader.hpp"
#include "contract/errors.hpp"
#include "dispatch/dispatch.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {

json doc_with(const json& quote) {
    json doc{{"market", {{"spot", 36.4}, {"volatility", 0.27}, {"rate", 0.032}, {"carry_yield", 0.018}}},
             {"option", {{"type", "put"}, {"strike", 34}, {"expiry_years", 1.0}}},
             {"quantity", 150000}};
    if (!quote.is_null()) doc["quote"] = quote;
    return doc;
}

bool on_tick(double x, double tick) { return std::fabs(x / tick - std::round(x / tick)) < 1e-9; }

}  // namespace

TEST_CASE("no quote section, no client price", "[quote]") {
    CHECK_FALSE(run_command("price", doc_with(nullptr)).contains("client_price"));
}

TEST_CASE("absolute margin on each side of the mid", "[quote]") {
    const json r = run_command("price", doc_with({{"currency", "EUR"}, {"margin", 0.05}}));
    const double mid = r["premium"];
    const json& cp = r["client_price"];
    CHECK(cp["mid"]["per_unit"].get<double>() == mid);
    CHECK(cp["bid"]["per_unit"].get<double>() == Approx(mid - 0.05));
    CHECK(cp["offer"]["per_unit"].get<double>() == Approx(mid + 0.05));
    // The client buys: pays the offer; notional = quantity x spot.
    CHECK(cp["per_unit"] == cp["offer"]["per_unit"]);
    CHECK(cp["total"].get<double>() == Approx(150000 * (mid + 0.05)));
    CHECK(cp["notional"].get<double>() == Approx(150000 * 36.4));
    CHECK(cp["fraction_of_notional"].get<double>() == Approx((mid + 0.05) / 36.4));
    CHECK(cp["desk_margin_total"].get<double>() == Approx(150000 * 0.05));
    CHECK(cp["currency"] == "EUR");
    CHECK(cp["caution"].get<std::string>().rfind("Indicative only", 0) == 0);
}

TEST_CASE("margin as a fraction of the premium, client selling", "[quote]") {
    json doc = doc_with({{"currency", "USD"}, {"margin_type", "fraction_of_premium"}, {"margin", 0.02}});
    doc["side"] = "sell";
    const json r = run_command("price", doc);
    const double mid = r["premium"];
    const json& cp = r["client_price"];
    CHECK(cp["bid"]["per_unit"].get<double>() == Approx(0.98 * mid));
    CHECK(cp["per_unit"] == cp["bid"]["per_unit"]);  // the client sells at the bid
    CHECK(cp["client_side"] == "sells at the bid");
    CHECK(cp["desk_margin_total"].get<double>() == Approx(150000 * 0.02 * mid));
}

TEST_CASE("margin in volatility points re-prices at vol +- margin", "[quote]") {
    const json r =
        run_command("price", doc_with({{"currency", "GBP"}, {"margin_type", "volatility"}, {"margin", 0.01}}));
    json up = doc_with(nullptr), down = doc_with(nullptr);
    up["market"]["volatility"] = 0.28;
    down["market"]["volatility"] = 0.26;
    CHECK(r["client_price"]["offer"]["per_unit"].get<double>() ==
          Approx(run_command("price", up)["premium"].get<double>()).epsilon(1e-12));
    CHECK(r["client_price"]["bid"]["per_unit"].get<double>() ==
          Approx(run_command("price", down)["premium"].get<double>()).epsilon(1e-12));

    // A collar sold against a holding is short volatility on its call: the offer is still the dearer price.
    json collar{{"market", {{"spot", 36.4}, {"volatility", 0.27}, {"rate", 0.032}, {"carry_yield", 0.018}}},
                {"structure", {{"shape", "collar"}, {"strikes", {30, 38}}, {"expiry_years", 1.0}}},
                {"quote", {{"currency", "EUR"}, {"margin_type", "volatility"}, {"margin", 0.02}}}};
    const json c = run_command("price", collar);
    CHECK(c["client_price"]["offer"]["per_unit"].get<double>() > c["premium"].get<double>());
    CHECK(c["client_price"]["bid"]["per_unit"].get<double>() < c["premium"].get<double>());
}

TEST_CASE("rounding to a tick favours the desk", "[quote]") {
    const json r = run_command("price", doc_with({{"currency", "EUR"}, {"margin", 0.013}, {"tick", 0.05}}));
    const double mid = r["premium"];
    const json& cp = r["client_price"];
    const double bid = cp["bid"]["per_unit"], offer = cp["offer"]["per_unit"], shown = cp["mid"]["per_unit"];
    CHECK(on_tick(bid, 0.05));
    CHECK(on_tick(offer, 0.05));
    CHECK(on_tick(shown, 0.05));
    CHECK(offer >= mid + 0.013);
    CHECK(offer < mid + 0.013 + 0.05);
    CHECK(bid <= mid - 0.013);
    CHECK(bid > mid - 0.013 - 0.05);
    // A price already on a tick stays there (no 1.10 -> 1.11 from binary fractions).
    json exact = doc_with({{"currency", "EUR"}, {"margin", 0.0}, {"tick", 0.01}});
    const json e = run_command("price", exact);
    CHECK(e["client_price"]["offer"]["per_unit"].get<double>() - e["client_price"]["bid"]["per_unit"].get<double>() <=
          0.01 + 1e-12);
}

TEST_CASE("the currency is an ISO 4217 code of three capital letters", "[quote]") {
    const std::string shape =
        "quote.currency: must be an ISO 4217 currency code of three capital letters (e.g. EUR, USD, GBP), got ";
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", "eur"}})), shape + "string \"eur\"");
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", "EURO"}})), shape + "string \"EURO\"");
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", 978}})), shape + "978");
    CHECK_NOTHROW(run_command("price", doc_with({{"margin", 0.1}})));  // the currency is an optional label
}

TEST_CASE("client name and notes are plain, length-limited text", "[quote]") {
    std::string accented;
    for (int i = 0; i < 80; ++i) accented += "\xC3\xA9";  // 80 x e-acute: 160 bytes, 80 characters
    CHECK_NOTHROW(run_command("price", doc_with({{"currency", "EUR"}, {"client", accented}})));
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", "EUR"}, {"client", std::string(81, 'K')}})),
                      "quote.client: is too long (81 characters, at most 80)");
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", "EUR"}, {"client", "Kestrel\nHarbour"}})),
                      "quote.client: must be plain text without control characters (character 8)");
    const json r = run_command("price", doc_with({{"currency", "EUR"}, {"notes", "Line one.\nLine two."}}));
    CHECK(r["client_price"]["notes"] == "Line one.\nLine two.");
    CHECK(r["client_price"]["client"].is_null());
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", "EUR"}, {"notes", std::string(501, 'n')}})),
                      "quote.notes: is too long (501 characters, at most 500)");
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", "EUR"}, {"client", 7}})),
                      "quote.client: must be text, got 7");
}

TEST_CASE("quote fields are checked and named", "[quote]") {
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", "EUR"}, {"margn", 0.1}})),
                      "quote.margn: unknown field (did you mean \"margin\"?)");
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", "EUR"}, {"margin", -0.1}})),
                      "quote.margin: must be >= 0, got -0.1");
    CHECK_THROWS_WITH(
        run_command("price", doc_with({{"currency", "EUR"}, {"margin_type", "volatility"}, {"margin", 0.3}})),
        "quote.margin: must be below market.volatility 0.27 (the bid re-prices at volatility - margin), got 0.3");
    CHECK_THROWS_WITH(
        run_command("price", doc_with({{"currency", "EUR"}, {"margin_type", "percent"}})),
        "quote.margin_type: must be one of absolute, fraction_of_premium, volatility, got string \"percent\"");
    CHECK_THROWS_WITH(run_command("price", doc_with({{"currency", "EUR"}, {"tick", 0}})),
                      "quote.tick: must be > 0, got 0");
}

TEST_CASE("a quote without a currency still prices (client name only)", "[quote]") {
    // Regression: typing only a client name on the page refused the whole trade.
    const json r = run_command("price", doc_with({{"client", "Kestrel Harbour Foods"}}));
    CHECK(r["client_price"]["currency"].is_null());
    CHECK(r["client_price"]["client"] == "Kestrel Harbour Foods");
}

TEST_CASE("the sheet's terms and the holding ride along; the price ignores the holding", "[quote]") {
    json terms{{"margin", 0.05},
               {"two_way", true},
               {"label", "One-year put"},
               {"prepared_by", "Mara Lindqvist"},
               {"contact", "+44 20 7946 0321"},
               {"indicative_until", "2026-12-02T17:00+01:00"}};
    const json plain = run_command("price", doc_with(terms));
    terms["holding"] = {{"shares", 150000}};
    const json r = run_command("price", doc_with(terms));
    const json& cp = r["client_price"];
    CHECK(cp["two_way"] == true);
    CHECK(cp["label"] == "One-year put");
    CHECK(cp["prepared_by"] == "Mara Lindqvist");
    CHECK(cp["contact"] == "+44 20 7946 0321");
    CHECK(cp["indicative_until"] == "2026-12-02T17:00+01:00");
    CHECK(cp["holding"]["shares"] == 150000);
    // Regression: a share leg once turned the client price into the share price; a holding never does.
    CHECK(cp["per_unit"] == plain["client_price"]["per_unit"]);
    CHECK(cp["spread"].get<double>() == Approx(0.1));
    // The client's break-even is at the offer (strike - offer), not at the mid.
    CHECK(cp["at_expiry"]["break_even"]["points"][0].get<double>() == Approx(34 - cp["per_unit"].get<double>()));
    CHECK(cp["at_expiry"]["break_even_with_holding"]["points"][0].get<double>() ==
          Approx(36.4 + cp["per_unit"].get<double>()));
    CHECK(cp["outcomes"].size() == default_outcome_moves.size());
}

TEST_CASE("the sheet's terms and the holding are checked and named", "[quote]") {
    CHECK_THROWS_WITH(run_command("price", doc_with({{"two_way", "yes"}})),
                      "quote.two_way: must be true or false, got string \"yes\"");
    CHECK_THROWS_WITH(run_command("price", doc_with({{"indicative_until", "tomorrow 5pm"}})),
                      Catch::Contains("quote.indicative_until: must be a date YYYY-MM-DD or a date and time"));
    CHECK_THROWS_WITH(run_command("price", doc_with({{"indicative_until", "2026-12-02T25:00"}})),
                      Catch::Contains("quote.indicative_until: must be a date YYYY-MM-DD"));
    CHECK_NOTHROW(run_command("price", doc_with({{"indicative_until", "2026-12-02"}})));
    CHECK_THROWS_WITH(run_command("price", doc_with({{"holding", {{"shares", -5}}}})),
                      "quote.holding.shares: must be > 0, got -5");
    CHECK_THROWS_WITH(run_command("price", doc_with({{"holding", {{"shares", 5}, {"cash", 1}}}})),
                      Catch::StartsWith("quote.holding.cash: unknown field"));
    CHECK_THROWS_WITH(run_command("price", doc_with({{"contact", "line\nbreak"}})),
                      Catch::StartsWith("quote.contact: must be plain text without control characters"));
}
