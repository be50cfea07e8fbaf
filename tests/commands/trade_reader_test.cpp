// Tests for commands/trade_reader: reading the trade document, dates, and one message per bad field.
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <fstream>
#include <sstream>

using namespace hedgeleaf;

namespace {
json base() {
    return json::parse(R"({
      "market": {"spot": 100, "volatility": 0.2, "rate": 0.03},
      "option": {"type": "call", "strike": 100, "expiry_years": 1}
    })");
}
std::string message_of(const json& doc) {
    try {
        (void)read_trade(doc);
    } catch (const input_error& e) {
        return e.what();
    }
    return "(accepted)";
}
}  // namespace

TEST_CASE("a minimal trade gets the documented defaults", "[trade]") {
    const trade t = read_trade(base());
    REQUIRE(t.legs.size() == 1);
    CHECK(t.legs[0].exercise == exercise_style::european);
    CHECK(t.market.carry_yield.is_zero());
    CHECK(t.quantity == 1);
    CHECK_FALSE(t.client_sells);
    CHECK(t.lattice.method == lattice_method::leisen_reimer);
    CHECK(t.lattice.extrapolate);
}

TEST_CASE("dates become ACT/365F year fractions", "[trade]") {
    json doc = base();
    doc["valuation_date"] = "2026-12-02";
    doc["option"].erase("expiry_years");
    doc["option"]["expiry_date"] = "2027-06-18";
    doc["market"]["dividends"] = json::array({{{"date", "2027-03-15"}, {"amount", 0.4}}});
    const trade t = read_trade(doc);
    CHECK(t.legs[0].expiry_years == Approx(198.0 / 365.0));
    CHECK(t.market.dividends[0].years == Approx(103.0 / 365.0));
}

TEST_CASE("each bad field gets one message naming it", "[trade]") {
    struct bad_case {
        const char* patch;  // JSON merge patch applied to the base document
        const char* message;
    };
    const bad_case cases[] = {
        {R"({"market": {"volatility": -0.2}})", "market.volatility: must be > 0, got -0.2"},
        {R"({"market": {"volatility": 6}})", "market.volatility: must be <= 5, got 6"},
        {R"({"market": {"spot": "100"}})",
         "market.spot: must be a number, got string \"100\" (write numbers without quotes)"},
        {R"({"market": {"spot": "NaN"}})", "market.spot: must be a number, got string \"NaN\""},
        {R"({"market": {"spot": 0}})", "market.spot: must be > 0, got 0"},
        {R"({"market": {"volatilty": 0.2}})", "market.volatilty: unknown field (did you mean \"volatility\"?)"},
        {R"({"option": {"strike": -5}})", "option.strike: must be > 0, got -5"},
        {R"({"option": {"expiry_years": 0}})", "option.expiry_years: must be > 0, got 0"},
        {R"({"option": {"type": "straddle"}})",
         "option.type: must be one of call, put, digital-call, digital-put, got string \"straddle\""},
        {R"({"option": {"exercise": "bermudan"}})",
         "option.exercise_dates: a bermudan option needs a list of exercise dates"},
        {R"({"option": {"type": "digital-call", "exercise": "american"}})",
         "option.exercise: digital options are European only, got \"american\""},
        {R"({"option": {"expiry_date": "2027-01-01"}})",
         "option.expiry_years: give either expiry_years or expiry_date, not both"},
        {R"({"lattice": {"steps": 0}})", "lattice.steps: must be between 1 and 50000, got 0"},
        {R"({"lattice": {"steps": 50001}})", "lattice.steps: must be between 1 and 50000, got 50001"},
        {R"({"lattice": {"method": "trinomial"}})",
         "lattice.method: must be one of crr, jarrow-rudd, tian, leisen-reimer, got string \"trinomial\""},
        {R"({"side": "short"})", "side: must be one of buy, sell, got string \"short\""},
        {R"({"quantity": -3})", "quantity: must be > 0, got -3"},
        {R"({"notes": "x"})", "notes: unknown field"},
    };
    for (const auto& c : cases) {
        json doc = base();
        doc.merge_patch(json::parse(c.patch));
        INFO(c.patch);
        CHECK(message_of(doc) == c.message);
    }
}

TEST_CASE("an expiry tenor becomes years from its rolled date", "[trade][tenor]") {
    // Common practice: "6m" from a valuation date is that date six months on, rolled by modified
    // following, counted ACT/365F; with no valuation date, months / 12.
    json doc = base();
    doc["option"].erase("expiry_years");
    doc["option"]["expiry_tenor"] = "18m";
    CHECK(read_trade(doc).legs[0].expiry_years == 1.5);
    doc["valuation_date"] = "2026-12-02";
    doc["option"]["expiry_tenor"] = "6m";
    CHECK(read_trade(doc).legs[0].expiry_years == 182.0 / 365.0);  // 2027-06-02, a Wednesday
    doc["option"]["expiry_tenor"] = "6M";
    CHECK(read_trade(doc).legs[0].expiry_years == 182.0 / 365.0);
    doc["option"]["expiry_years"] = 1;
    CHECK(message_of(doc) ==
          "option.expiry_tenor: give one of expiry_years, expiry_date or expiry_tenor, not expiry_years as well");
    doc["option"].erase("expiry_years");
    doc["option"]["expiry_tenor"] = 6;
    CHECK(message_of(doc) == "option.expiry_tenor: must be a tenor such as 6m (text), got 6");
    doc["valuation_date"] = "2027-07-30";  // a Friday; the next day is Saturday 31 July
    doc["option"]["expiry_tenor"] = "1d";
    CHECK(message_of(doc) ==
          "option.expiry_tenor: 1d from valuation_date 2027-07-30 rolls back to 2027-07-30 "
          "(modified following); give expiry_date instead");
    doc["option"]["expiry_tenor"] = "51y";
    CHECK(message_of(doc).rfind("option.expiry_tenor: must be <= 50", 0) == 0);
}

TEST_CASE("dates are checked against the valuation date", "[trade]") {
    json doc = base();
    doc["valuation_date"] = "2026-12-02";
    doc["option"].erase("expiry_years");
    doc["option"]["expiry_date"] = "2026-12-02";
    CHECK(message_of(doc) == "option.expiry_date: must be after valuation_date 2026-12-02");
    doc["option"]["expiry_date"] = "2026-11-30";
    CHECK(message_of(doc) == "option.expiry_date: must be after valuation_date 2026-12-02");
    doc.erase("valuation_date");
    doc["option"]["expiry_date"] = "2027-06-18";
    CHECK(message_of(doc) ==
          "option.expiry_date: a date needs valuation_date at the top of the trade (or give years instead)");
}

TEST_CASE("structures and legs", "[trade]") {
    json doc = base();
    doc.erase("option");
    doc["legs"] = json::array();
    CHECK(message_of(doc) == "legs: must hold at least one leg");
    doc["legs"] = json::parse(R"([{"type": "put", "strike": 90, "expiry_years": 1, "quantity": 1},
                                  {"type": "call", "strike": 115, "expiry_years": 1, "quantity": -1}])");
    const trade t = read_trade(doc);
    CHECK(t.legs.size() == 2);
    CHECK(t.legs[1].quantity == -1);
    doc["legs"][1]["quantity"] = 0;
    CHECK(message_of(doc) == "legs[1].quantity: must not be 0 (+ client buys, - client sells)");
}

TEST_CASE("malformed JSON is one message, not a crash", "[trade]") {
    const json env = json::parse(run_command_text("price", "{\"market\": "));
    CHECK_FALSE(env["ok"].get<bool>());
    CHECK(env["error"]["message"].get<std::string>().rfind("not a valid JSON document", 0) == 0);
}

TEST_CASE("the example trade files all parse", "[trade]") {
    for (const char* name : {"american-put.json"}) {
        std::ifstream in(std::string(HEDGELEAF_SOURCE_DIR) + "/examples/" + name);
        REQUIRE(in);
        std::stringstream buf;
        buf << in.rdbuf();
        CHECK_NOTHROW(read_trade(parse_json_text(buf.str())));
    }
}
