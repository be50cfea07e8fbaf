// Tests of bad input through the engine's one entry point (run_command_text, which the
// WebAssembly module wraps) and run_command (which the CLI calls): every case of
// tests/bad_inputs.json gives one line "<field>: <problem>" naming the expected field.
// The same table drives tests/bad_inputs_cli.py (CLI) and tests/node/bad_inputs.test.mjs
// (module == CLI). Regressions found by the fuzzer (tests/fuzz) are named below.
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"

#include <catch2/catch.hpp>

#include <fstream>
#include <set>
#include <sstream>

using namespace hedgeleaf;

namespace {

json load_table() {
    std::ifstream in(std::string(HEDGELEAF_SOURCE_DIR) + "/tests/bad_inputs.json");
    REQUIRE(in.good());
    std::stringstream buf;
    buf << in.rdbuf();
    return json::parse(buf.str());
}

/// {"$repeat": [s, n]} -> s repeated n times, anywhere in the document.
json expand(const json& node) {
    if (node.is_object()) {
        if (node.size() == 1 && node.contains("$repeat")) {
            const std::string piece = node["$repeat"][0].get<std::string>();
            const auto count = node["$repeat"][1].get<std::size_t>();
            std::string out;
            out.reserve(piece.size() * count);
            for (std::size_t i = 0; i < count; ++i) out += piece;
            return out;
        }
        json out = json::object();
        for (auto it = node.begin(); it != node.end(); ++it) out[it.key()] = expand(it.value());
        return out;
    }
    if (node.is_array()) {
        json out = json::array();
        for (const auto& e : node) out.push_back(expand(e));
        return out;
    }
    return node;
}

/// The text a case feeds to the engine: a raw text, or a base trade with a merge patch.
std::string document_text(const json& table, const json& c) {
    if (c.contains("text")) return c["text"].get<std::string>();
    json doc = table["bases"][c["base"].get<std::string>()];
    doc.merge_patch(c["patch"]);
    return expand(doc).dump();
}

struct refusal {
    std::string field, message;
};

refusal refusal_of(const std::string& command, const std::string& text) {
    const json envelope = json::parse(run_command_text(command, text));
    REQUIRE(envelope["ok"] == false);
    return {envelope["error"]["field"].get<std::string>(), envelope["error"]["message"].get<std::string>()};
}

}  // namespace

TEST_CASE("every bad input of the table names its field in one line", "[bad_inputs]") {
    const json table = load_table();
    const json& cases = table["cases"];
    REQUIRE(cases.size() >= 40);
    std::set<std::string> kinds;
    for (const auto& c : cases) {
        const std::string name = c["name"].get<std::string>();
        const std::string command = c["command"].get<std::string>();
        const std::string field = c["field"].get<std::string>();
        kinds.insert(c["kind"].get<std::string>());
        INFO("case: " << name);
        const std::string text = document_text(table, c);
        const refusal r = refusal_of(command, text);
        CHECK(r.field == field);
        CHECK_THAT(r.message, Catch::Contains(c["message"].get<std::string>()));
        if (!field.empty()) CHECK_THAT(r.message, Catch::StartsWith(field + ": "));
        CHECK(r.message.find('\n') == std::string::npos);
        CHECK(r.message.rfind("internal error", 0) == std::string::npos);
        // The CLI's path (run_command on a parsed document) throws the same error.
        if (text.size() <= max_document_bytes) {
            std::string thrown;
            try {
                (void)run_command(command, parse_json_text(text));
            } catch (const input_error& e) {
                thrown = e.what();
            }
            CHECK(thrown == r.message);
        }
    }
    // The kinds the hardening issue asks for are all present.
    for (const char* kind : {"wrong type", "missing", "misspelt", "not a number", "zero or negative", "absurd size",
                             "dates", "arbitrage", "empty", "not JSON"})
        CHECK(kinds.count(kind) == 1);
}

TEST_CASE("regression (fuzz): a number beyond double range is bad input, not an internal error", "[bad_inputs]") {
    // Found by tests/fuzz/trade_fuzz.cpp: nlohmann's out_of_range 406 escaped parse_json_text
    // and reached the user as "internal error: [json.exception.out_of_range.406] ...".
    const refusal r = refusal_of("price", R"({"market": {"spot": 1e400, "volatility": 0.2, "rate": 0.03}})");
    CHECK(r.field.empty());
    CHECK(r.message == "not a valid JSON document (a number is too large to read)");
    CHECK_THROWS_AS(parse_json_text("[1e3083333333333333333333]"), input_error);
}

TEST_CASE("regression: empty input is reported as empty, not as an error at character 1", "[bad_inputs]") {
    CHECK(refusal_of("price", "").message == "not a valid JSON document (empty input)");
    CHECK(refusal_of("price", " \n\t").message == "not a valid JSON document (empty input)");
    CHECK(refusal_of("price", "{").message == "not a valid JSON document (near character 2)");
}

TEST_CASE("regression: a misspelt required field is named as the likely cause", "[bad_inputs]") {
    // Before: "market.volatility: is required but missing", with no word about the
    // "volatilty" sitting in the same object (finish() never ran to flag it).
    const refusal r = refusal_of("price", R"({"market": {"spot": 100, "volatilty": 0.2, "rate": 0.03},
        "option": {"type": "call", "strike": 100, "expiry_years": 1}})");
    CHECK(r.field == "market.volatility");
    CHECK(r.message == "market.volatility: is required but missing; \"volatilty\" looks like a misspelling of it");
    // Nothing close: the plain message.
    CHECK(refusal_of("price", R"({"market": {"spot": 100, "rate": 0.03},
        "option": {"type": "call", "strike": 100, "expiry_years": 1}})")
              .message == "market.volatility: is required but missing");
}

TEST_CASE("regression: an empty list is described as empty", "[bad_inputs]") {
    // Before: "must be a non-empty list, got a list".
    CHECK(describe(json::array()) == "an empty list");
    CHECK(describe(json::array({1})) == "a list");
}

TEST_CASE("regression (fuzz): quoted text with a line break or a terminal escape stays on one line", "[bad_inputs]") {
    // Found by tests/fuzz/trade_fuzz.cpp: "bermud\n" was quoted raw, so the CLI printed
    // a two-line message. Control characters are now written out as \n, \u001b, ...
    const refusal r = refusal_of("price", R"({"market": {"spot": 100, "volatility": 0.2, "rate": 0.03},
        "option": {"type": "put", "strike": 100, "expiry_years": 1, "exercise": "bermud\n\u001b[31m"}})");
    CHECK(r.message ==
          R"(option.exercise: must be one of european, american, bermudan, got string "bermud\n\u001b[31m")");
    // A misspelt key with a line break in it: the field path is escaped the same way.
    const refusal k = refusal_of("price", R"({"market": {"spot": 100, "volatility": 0.2, "rate": 0.03, "a\tb\n": 1},
        "option": {"type": "put", "strike": 100, "expiry_years": 1}})");
    CHECK(k.field == R"(market.a\tb\n)");
    CHECK(k.message == R"(market.a\tb\n: unknown field)");
    CHECK(one_line("plain €") == "plain €");
    // Quoted text is cut on a character boundary, never inside a UTF-8 sequence.
    CHECK(shorten("ab€", 3) == "ab");
    CHECK(shorten("ab€", 5) == "ab€");
}
