// Hedgeleaf module: the Embind glue between JavaScript and core/dispatch/dispatch.hpp.
//
// JSON text in, JSON text out (the envelope documented in hedgeleaf.d.ts), so the
// page owns plain strings and never has a C++ handle to .delete(). Every C++
// exception is caught inside run_command_text; nothing throws across this line.
#include "contract/limits.hpp"
#include "dispatch/dispatch.hpp"

#include <emscripten/bind.h>

#include <string>

namespace {

/// Run one engine command on a trade document; returns the envelope text. A request
/// estimated above the page's work budget is refused up front (analytics/work_estimate.hpp).
std::string run(const std::string& command, const std::string& trade_json) {
    return hedgeleaf::run_command_text(command, trade_json, hedgeleaf::page_work_budget);
}

/// The same with a market snapshot (JSON text, docs/market.md) for a trade without a market
/// of its own; the result carries the snapshot's market_as_of.
std::string run_in_market(const std::string& command, const std::string& trade_json, const std::string& market_json) {
    return hedgeleaf::run_command_text(command, trade_json, hedgeleaf::page_work_budget, market_json);
}

/// Engine version printed on quote sheets.
std::string version() { return hedgeleaf::engine_version(); }

/// The command names the engine accepts, comma separated (the page enables features by them).
std::string commands() {
    std::string list;
    for (const auto& name : hedgeleaf::command_names()) list += (list.empty() ? "" : ",") + name;
    return list;
}

/// The words and limits the engine accepts, as JSON text (commands/vocabulary.hpp).
std::string vocabulary() { return hedgeleaf::vocabulary().dump(); }

}  // namespace

EMSCRIPTEN_BINDINGS(hedgeleaf) {
    emscripten::function("run", &run);
    emscripten::function("runInMarket", &run_in_market);
    emscripten::function("version", &version);
    emscripten::function("commands", &commands);
    emscripten::function("vocabulary", &vocabulary);
}
