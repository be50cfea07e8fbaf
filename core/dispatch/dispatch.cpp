// Hedgeleaf dispatch: running a command on a document (see dispatch.hpp).
#include "dispatch/dispatch.hpp"

#include "commands/market_reader.hpp"
#include "commands/vocabulary.hpp"
#include "contract/version.hpp"
#include "dispatch/command_table.hpp"

namespace hedgeleaf {

namespace {
std::string envelope_text(const json& envelope) {
    return envelope.dump(-1, ' ', false, json::error_handler_t::replace);
}

/// The refusal envelope. `kind` tells callers what to do without reading the message:
/// "input" (fix the named field), "budget" (the request is too large for the page: fewer
/// steps or paths, or the CLI) or "internal" (a defect of the engine, never the user's input).
std::string refusal(const std::string& kind, const std::string& field, const std::string& message,
                    const std::optional<bound_detail>& bound = std::nullopt) {
    json error{{"field", field}, {"message", message}, {"kind", kind}};
    if (bound) error["detail"] = {{"value", bound->value}, {"limit", bound->limit}, {"relation", bound->relation}};
    return envelope_text(json{{"ok", false}, {"error", error}});
}
}  // namespace

const char* engine_version() { return project_version; }

std::vector<std::string> command_names() {
    std::vector<std::string> names;
    for (const auto& d : command_table()) names.push_back(d.name);
    return names;
}

json run_command(const std::string& command, const json& document, double work_budget) {
    const command_descriptor& d = find_command(command);
    json result = d.execute(d, document, work_budget);
    result["engine_version"] = engine_version();
    return result;
}

std::string run_command_text(const std::string& command, const std::string& text, double work_budget,
                             const std::string& market_text) {
    try {
        json doc = parse_json_text(text);
        if (!market_text.empty()) doc = with_market_snapshot(doc, parse_json_text(market_text, market_snapshot_words));
        return envelope_text(json{{"ok", true}, {"result", run_command(command, doc, work_budget)}});
    } catch (const work_exhausted& e) {
        return refusal("budget", e.field(), e.what());
    } catch (const input_error& e) {
        return refusal("input", e.field(), e.what(), e.bound());
    } catch (const std::bad_alloc&) {
        return refusal("budget", "", "out of memory: reduce lattice.steps or paths");
    } catch (const std::exception& e) {
        return refusal("internal", "", std::string("internal error: ") + e.what());
    }
}

work_estimate estimate_work(const std::string& command, const json& document) {
    const command_descriptor& d = find_command(command);
    work_estimate w = d.estimate(document);
    w.field = d.work_field;
    return w;
}

json vocabulary() {
    json commands = json::array();
    for (const auto& d : command_table())
        commands.push_back({{"name", d.name}, {"help", d.help}, {"work_field", d.work_field}});
    json out{{"engine_version", engine_version()}, {"commands", commands}};
    const json lists_and_limits = vocabulary_json();
    for (const auto& [key, value] : lists_and_limits.items()) out[key] = value;
    return out;
}

}  // namespace hedgeleaf
