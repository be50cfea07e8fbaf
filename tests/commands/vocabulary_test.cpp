// Tests for commands/vocabulary: every bound, list and default the vocabulary hands to the
// page, the schema and the declarations is the one the readers enforce. For each field the
// vocabulary lists, a document is given a value just past each bound (or a word not in the
// list, one item too many or too few, one character too many) and must be refused with a
// message naming exactly that field; leaving a field with a default out must give the same
// result as writing the default.
#include "commands/vocabulary.hpp"
#include "dispatch/dispatch.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <regex>
#include <string>

using namespace hedgeleaf;

namespace {

const json market = {{"spot", 100}, {"volatility", 0.2}, {"rate", 0.03}};
const json call = {{"type", "call"}, {"strike", 100}, {"expiry_years", 1}};

/// `leg` as a Bermudan option, its schedule given the way `path` names it (dates or years).
json bermudan(json leg, const std::string& path) {
    leg["exercise"] = "bermudan";
    if (path.find("exercise_dates") != std::string::npos)
        leg["exercise_dates"] = {"2027-06-01"};
    else
        leg["exercise_years"] = {0.5};
    return leg;
}

/// A rebalancing frequency given the way `path` names it (dates, years, or every/unit).
json frequency_for(json& doc, const std::string& path) {
    if (path.find(".dates") != std::string::npos) {
        doc["valuation_date"] = "2027-01-04";
        return {{"dates", {"2027-06-01"}}};
    }
    if (path.find(".years") != std::string::npos) return {{"years", {0.5}}};
    return {{"every", 1}, {"unit", "months"}};
}

/// A document in which `path` is read, and the command that reads it.
std::pair<json, std::string> base_for(const std::string& path) {
    const auto starts = [&](const char* prefix) { return path.rfind(prefix, 0) == 0; };
    if (starts("underlying") || starts("notional") || starts("conventions") || starts("market.domestic_rate") ||
        starts("market.foreign_rate") ||
        starts("market.volatility.quotes_by_delta")) {  // a currency pair (docs/currency.md)
        json pair{{"valuation_date", "2026-12-03"},
                  {"underlying", {{"kind", "currency_pair"}, {"base", "EUR"}, {"quote", "USD"}}},
                  {"market",
                   {{"spot", 1.085},
                    {"volatility", 0.08},
                    {"domestic_rate", {{"rate", 0.03}}},
                    {"foreign_rate", {{"rate", 0.015}}}}},
                  {"option", {{"type", "put"}, {"strike", 1.06}, {"expiry_date", "2027-09-03"}}},
                  {"notional", {{"amount", 1e6}, {"currency", "EUR"}}},
                  {"lattice", {{"steps", 101}}}};
        for (const char* curve : {"domestic_rate", "foreign_rate"})
            if (starts((std::string("market.") + curve + ".points").c_str()))
                pair["market"][curve] = {{"points", json::array({{{"years", 1}, {"rate", 0.01}}})}};
        if (starts("market.volatility.quotes_by_delta"))
            pair["market"]["volatility"] = {
                {"quotes_by_delta", json::array({{{"expiry", "9m"}, {"atm", 0.08}, {"rr25", 0}, {"bf25", 0}}})}};
        return {pair, "price"};
    }
    json doc{{"market", market}, {"option", call}, {"lattice", {{"steps", 101}}}};
    if (starts("market.dividends")) doc["market"]["dividends"] = json::array({{{"time_years", 0.5}, {"amount", 1}}});
    if (starts("market.volatility."))
        doc["market"]["volatility"] = {{"expiries", {1}}, {"strikes", {100}}, {"vols", json::array({{0.2}})}};
    for (const char* curve : {"rate", "carry_yield", "borrow"})
        if (starts((std::string("market.") + curve + ".points").c_str()))
            doc["market"][curve] = {{"points", json::array({{{"years", 1}, {"rate", 0.01}}})}};
    if (path == "option.strike.percent_of_forward") doc["option"]["strike"] = {{"percent_of_forward", 100}};
    if (path == "option.strike.percent_of_spot") doc["option"]["strike"] = {{"percent_of_spot", 100}};
    if (starts("option.payout")) doc["option"]["type"] = "digital-call";
    if (starts("option.exercise_") || starts("legs[].exercise_")) doc["valuation_date"] = "2027-01-04";
    if (starts("option.exercise_")) doc["option"] = bermudan(doc["option"], path);
    if (starts("legs")) {
        doc.erase("option");
        json leg = call;
        leg["quantity"] = 1;
        if (starts("legs[].payout")) leg["type"] = "digital-call";
        if (starts("legs[].strike.")) leg["strike"] = {{path.substr(std::string("legs[].strike.").size()), 100}};
        if (starts("legs[].exercise_")) leg = bermudan(leg, path);
        doc["legs"] = json::array({leg});
    }
    if (starts("structure")) {
        doc.erase("option");
        doc["structure"] = {{"shape", "collar"}, {"strikes", {90, 110}}, {"expiry_years", 1}};
    }
    if (starts("quote")) doc["quote"] = json::object();
    if (starts("solve")) {
        doc["legs"] = json::array({{{"type", "call"}, {"strike", 100}, {"expiry_years", 1}, {"quantity", 1}},
                                   {{"type", "call"}, {"strike", 120}, {"expiry_years", 1}, {"quantity", -1}}});
        doc.erase("option");
        doc["solve"] = {{"for", "volatility"}, {"target_premium", 1}};
        if (starts("solve.leg")) doc["solve"] = {{"for", "strike"}, {"leg", 1}};
        if (starts("solve.budget") || starts("solve.lot_size")) doc["solve"] = {{"for", "quantity"}, {"budget", 1000}};
        return {doc, "solve"};
    }
    if (starts("ladder")) {
        doc["ladder"] = {{"kind", starts("ladder.vol") ? "volatility" : starts("ladder.time") ? "time" : "spot"}};
        return {doc, "ladder"};
    }
    if (starts("profile")) return {doc, "profile"};
    if (starts("hedge")) {
        const bool tree = starts("hedge.tree");
        doc["hedge"] = json::object();
        if (starts("hedge.path")) {
            const std::string field = path.substr(std::string("hedge.path.").size());
            json p;  // (doc["hedge"] keeps its keys in a vector: no reference into it across inserts)
            if (field.rfind("spots", 0) == 0) {  // one spot per date after valuation: 0.5 and 1 years
                doc["hedge"]["rebalance"] = {{"years", {0.5}}};
                p = {{"kind", "spots"}, {"spots", {100, 100}}};
            } else if (field.rfind("moves", 0) == 0) {
                p = {{"kind", "lattice"}, {"moves", "UD"}};
            } else if (field.rfind("nodes", 0) == 0) {
                p = {{"kind", "lattice"}, {"nodes", {0, 1}}};
            } else if (field == "shape" || field == "change") {
                p = {{"kind", "stress"}, {"shape", "rise"}};
            } else if (field == "years") {
                p = {{"kind", "stress"}, {"shape", "gap-down"}, {"years", 0.5}};
            } else {
                p = {{"kind", "scenario"}};
            }
            doc["hedge"]["path"] = p;
        }
        if (starts("hedge.rebalance.years") || starts("hedge.rebalance.dates"))
            doc["hedge"]["rebalance"] = frequency_for(doc, path);
        return {doc, tree ? "tree" : "hedge"};
    }
    if (starts("simulate")) {
        doc["simulate"] = {{"paths", 50}, {"frequencies", json::array({frequency_for(doc, path)})}};
        return {doc, "simulate"};
    }
    return {doc, "price"};
}

/// The path with "[]" as the first element: the field a message names.
std::string concrete(const std::string& path) { return std::regex_replace(path, std::regex(R"(\[\])"), "[0]"); }

/// Set `value` at `path` ("a.b[].c", "a.b[][]"), making objects and first list elements on the way.
void set_at(json& doc, const std::string& path, const json& value) {
    json* node = &doc;
    std::smatch m;
    std::string rest = path;
    const std::regex step(R"(^([^.\[]+)((?:\[\])*)\.?)");
    while (std::regex_search(rest, m, step)) {
        json* child = &(*node)[m[1].str()];
        const std::size_t lists = m[2].length() / 2;
        rest = m.suffix();
        for (std::size_t i = 0; i < lists; ++i) {
            const bool inner = i + 1 < lists || !rest.empty();
            if (!child->is_array() || child->empty())
                *child = json::array({inner && i + 1 < lists ? json::array() : json::object()});
            child = &(*child)[0];
        }
        if (rest.empty()) {
            *child = value;
            return;
        }
        if (!child->is_object()) *child = json::object();
        node = child;
    }
}

/// The document without its null values (a field set to null above, to leave it out).
json without_nulls(json doc) {
    if (doc.is_object()) {
        json out = json::object();
        for (auto& [key, value] : doc.items())
            if (!value.is_null()) out[key] = without_nulls(value);
        return out;
    }
    if (doc.is_array())
        for (auto& e : doc) e = without_nulls(e);
    return doc;
}

/// The input error a document gets (field "(accepted)" when there is none).
struct refusal {
    std::string field = "(accepted)";
    std::string message;
};
refusal refusal_of(const std::string& command, const json& doc) {
    try {
        (void)run_command(command, doc);
    } catch (const input_error& e) {
        return {e.field(), e.what()};
    }
    return {};
}

/// Whether a refusal's message states the bound (as the messages write numbers) or, for a
/// list of words, every word: a vocabulary looser than the reader would not be stated.
bool states(const std::string& message, const std::string& rule, const json& rules) {
    if (rule == "enum") {
        for (const auto& word : rules["enum"])
            if (message.find(word.get<std::string>()) == std::string::npos) return false;
        return true;
    }
    const double bound = rules[rule].get<double>();
    const bool whole = bound == std::floor(bound) && std::fabs(bound) < 1e18;
    return message.find(format_number(bound)) != std::string::npos ||
           (whole && message.find(std::to_string(static_cast<long long>(bound))) != std::string::npos);
}

/// A value just past a bound: integers by one, other numbers by half their size (at least 1);
/// below a positive floor under 1 (a price level's 1e-6, a volatility's 0.001), half the floor.
json past(double bound, int direction, bool whole) {
    if (whole) return static_cast<long long>(bound) + direction;
    if (direction < 0 && bound > 0 && bound < 1) return bound * 0.5;
    return bound + direction * std::max(1.0, std::fabs(bound) * 0.5);
}

/// Values that break each rule of a field, with what each one breaks.
std::vector<std::pair<std::string, json>> breaking_values(const json& rules) {
    std::vector<std::pair<std::string, json>> out;
    const bool whole = rules.value("type", "") == "integer";
    if (rules.contains("maximum")) out.emplace_back("maximum", past(rules["maximum"].get<double>(), +1, whole));
    if (rules.contains("minimum")) out.emplace_back("minimum", past(rules["minimum"].get<double>(), -1, whole));
    if (rules.contains("exclusiveMinimum")) out.emplace_back("exclusiveMinimum", rules["exclusiveMinimum"]);
    if (rules.contains("enum")) out.emplace_back("enum", "not-a-word");
    if (rules.contains("maxLength"))
        out.emplace_back("maxLength", std::string(rules["maxLength"].get<std::size_t>() + 1, 'U'));
    if (rules.contains("maxItems"))
        out.emplace_back("maxItems", json(std::vector<json>(rules["maxItems"].get<std::size_t>() + 1, json(0.5))));
    if (rules.contains("minItems") && rules["minItems"].get<std::size_t>() > 0)
        out.emplace_back("minItems", json(std::vector<json>(rules["minItems"].get<std::size_t>() - 1, json(0))));
    return out;
}

// Fields whose message states their bound another way (each reason as the reader words it).
bool states_otherwise(const std::string& path) {
    return path == "legs[].quantity"         // |quantity| <= 1e12: the message states 1e+12
           || path == "structure.strikes"    // "a collar takes 2 strikes": the shape's own count
           || path == "solve.leg"            // "between 0 and <the last leg>": the trade's own legs
           || path == "hedge.path.nodes[]";  // "a whole number from 0 up": the cap is the list's
}

}  // namespace

TEST_CASE("every bound and list of the vocabulary is what the readers refuse past", "[vocabulary]") {
    const json fields = vocabulary_json()["fields"];
    REQUIRE(fields.size() > 80);
    int checked = 0;
    for (const auto& [path, rules] : fields.items()) {
        const auto [doc, command] = base_for(path);
        REQUIRE(refusal_of(command, doc).field == "(accepted)");
        for (const auto& [rule, value] : breaking_values(rules)) {
            json bad = doc;
            set_at(bad, path, value);
            INFO(path << " " << rule << " " << value.dump().substr(0, 60) << " through " << command);
            const refusal r = refusal_of(command, bad);
            CHECK(r.field == concrete(path));
            if (rule != "minItems" && rule != "exclusiveMinimum" && !states_otherwise(path))
                CHECK(states(r.message, rule, rules));
            ++checked;
        }
    }
    CHECK(checked > 100);
}

TEST_CASE("leaving out a field gives the default the vocabulary states", "[vocabulary]") {
    const json fields = vocabulary_json()["fields"];
    int checked = 0;
    for (const auto& [path, rules] : fields.items()) {
        if (!rules.contains("default")) continue;
        auto [doc, command] = base_for(path);
        json without = doc, with = doc;
        set_at(with, path, rules["default"]);
        // Out: the key removed from its parent (made first, so the parent exists).
        set_at(without, path, nullptr);
        without = without_nulls(without);
        INFO(path << " default " << rules["default"].dump() << " through " << command);
        CHECK(run_command(command, without) == run_command(command, with));
        ++checked;
    }
    CHECK(checked > 30);
}
