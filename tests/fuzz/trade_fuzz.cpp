// Hedgeleaf fuzz target (libFuzzer + ASan + UBSan): every command over arbitrary bytes.
//
// Input layout: "<command>\n<trade document>". Without a newline the whole input is
// the document and the command is "price". The document goes through the same
// entry the page uses, run_command_text with the page's work budget, and (when it is
// JSON) through read_trade. The commands are those of dispatch/command_table.hpp.
//
// Beyond "no crash, no sanitizer report", each run checks the contract:
//   - the envelope is valid JSON with a boolean "ok";
//   - a refusal has a one-line message that starts with its field path, and is
//     never of kind "internal" (only input_error may reach the user);
//   - an accepted result holds no NaN or infinity anywhere.
//
// Work clamp (fuzzing only, product limits unchanged): a fuzzed trade may validly
// ask for 50,000 lattice steps or 200,000 simulated paths, which takes seconds per
// run. Work-size fields (work_fields below) whose value is within the product's
// range but above a small cap are lowered to the cap before the call, and missing
// ones are set to the cap (the defaults, e.g. 1601 lattice steps, would dominate run time).
// Values outside the product's range are left alone so their messages are fuzzed.
#include "commands/trade_reader.hpp"
#include "contract/limits.hpp"
#include "dispatch/command_table.hpp"
#include "dispatch/dispatch.hpp"

#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <map>
#include <string>
#include <vector>

namespace {

using hedgeleaf::json;

[[noreturn]] void broken(const std::string& what, const std::string& detail) {
    std::fprintf(stderr, "contract broken: %s\n%s\n", what.c_str(), detail.substr(0, 2000).c_str());
    std::abort();
}

/// A work-size field: `section.key` (or `section.sub.key`), lowered to `cap` when the
/// value lies in (cap, product_max]; `inject` gives a trade without it the cap.
struct work_field {
    const char* section;
    const char* sub;  // nullptr: the key sits in the section itself
    const char* key;
    long cap;
    double product_max;
    bool inject;
};

const std::vector<work_field>& work_fields() {
    static const std::vector<work_field> fields = {
        {"lattice", nullptr, "steps", 40, hedgeleaf::max_lattice_steps, true},                // default 1601
        {"simulate", nullptr, "paths", 16, static_cast<double>(hedgeleaf::max_paths), true},  // default 10,000
        {"simulate", nullptr, "lattice_steps", 20, hedgeleaf::max_simulate_lattice_steps,
         true},                                                                             // automatic: 200 and up
        {"hedge", nullptr, "lattice_steps", 12, hedgeleaf::max_hedge_lattice_steps, true},  // default 151
        {"hedge", "tree", "steps", 40, hedgeleaf::max_tree_steps, false},
        {"ladder", nullptr, "steps", 21, hedgeleaf::max_ladder_steps, true},    // default 101
        {"profile", nullptr, "steps", 21, hedgeleaf::max_profile_steps, true},  // default 101
    };
    return fields;
}

/// Lower (or set) the work-size fields of a trade document; true if it changed.
bool clamp_work(json& doc) {
    if (!doc.is_object()) return false;
    bool changed = false;
    for (const auto& f : work_fields()) {
        json* node = &doc;
        bool missing = false;
        for (const char* step : {f.section, f.sub}) {
            if (!step) continue;
            auto it = node->find(step);
            if (it == node->end() || it->is_null()) {
                if (!f.inject) {
                    missing = true;
                    break;
                }
                (*node)[step] = json::object();
                changed = true;
            } else if (!it->is_object()) {
                missing = true;  // a wrong type: leave it for the error message
                break;
            }
            node = &(*node)[step];
        }
        if (missing) continue;
        auto it = node->find(f.key);
        if (it == node->end()) {
            if (f.inject) {
                (*node)[f.key] = f.cap;
                changed = true;
            }
        } else if (it->is_number()) {
            const double v = it->get<double>();
            if (v > static_cast<double>(f.cap) && v <= f.product_max) {
                *it = f.cap;
                changed = true;
            }
        }
    }
    return changed;
}

bool all_finite(const json& node) {
    if (node.is_number_float()) return std::isfinite(node.get<double>());
    if (node.is_object() || node.is_array()) {
        for (const auto& e : node)
            if (!all_finite(e)) return false;
    }
    return true;
}

void check_envelope(const std::string& command, const std::string& text, const std::string& out) {
    const json env = json::parse(out, nullptr, false);
    if (env.is_discarded() || !env.is_object() || !env.contains("ok") || !env["ok"].is_boolean())
        broken("envelope is not {\"ok\": bool, ...}", out);
    if (env["ok"].get<bool>()) {
        // The envelope text turns NaN into null; look at the result itself.
        try {
            const json result = hedgeleaf::run_command(command, json::parse(text), hedgeleaf::page_work_budget);
            if (!all_finite(result))
                broken("result holds NaN or infinity", result.dump(-1, ' ', false, json::error_handler_t::replace));
        } catch (const std::exception& e) {
            broken(std::string("run_command threw after run_command_text succeeded: ") + e.what(), text);
        }
        return;
    }
    const json& error = env["error"];
    if (!error.is_object() || !error["field"].is_string() || !error["message"].is_string() ||
        !error["kind"].is_string())
        broken("error without field, message and kind", out);
    const std::string kind = error["kind"].get<std::string>();
    const std::string field = error["field"].get<std::string>();
    const std::string message = error["message"].get<std::string>();
    if (message.empty()) broken("empty message", out);
    if (message.find('\n') != std::string::npos) broken("message spans lines", out);
    // Classified by the structured kind, never by the text: a field may be named "internal errorside".
    if (kind == "internal") broken("internal error reached the user", out + "\n" + text);
    if (kind != "input" && kind != "budget") broken("unknown error kind", out);
    if (!field.empty() && message.rfind(field + ": ", 0) != 0) broken("message does not start with its field", out);
}

std::vector<std::string> all_commands;

}  // namespace

extern "C" int LLVMFuzzerInitialize(int*, char***) {
    for (const auto& d : hedgeleaf::command_table()) all_commands.push_back(d.name);
    // run.sh asks for the command names to build the seed corpus.
    if (std::getenv("HEDGELEAF_FUZZ_LIST_COMMANDS")) {
        for (const auto& name : all_commands) std::printf("%s\n", name.c_str());
        std::exit(0);
    }
    return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    std::string input(reinterpret_cast<const char*>(data), size);
    std::string command = "price";
    std::string text = input;
    if (const auto nl = input.find('\n'); nl != std::string::npos && nl <= 40) {
        command = input.substr(0, nl);
        text = input.substr(nl + 1);
    }

    json doc = json::parse(text, nullptr, false);
    if (!doc.is_discarded()) {
        if (clamp_work(doc)) text = doc.dump(-1, ' ', false, json::error_handler_t::replace);
        try {
            (void)hedgeleaf::read_trade(doc);
        } catch (const hedgeleaf::input_error&) {
            // expected for most fuzzed documents; the message is checked below
        }
    }
    check_envelope(command, text, hedgeleaf::run_command_text(command, text, hedgeleaf::page_work_budget));
    return 0;
}
