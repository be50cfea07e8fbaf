// Hedgeleaf core: command dispatch (see engine.hpp).
#include "engine.hpp"

#include "hedge.hpp"
#include "ladder.hpp"
#include "pricer.hpp"
#include "profile.hpp"
#include "quote.hpp"
#include "replication.hpp"
#include "simulate.hpp"
#include "solver.hpp"
#include "trade.hpp"
#include "work.hpp"

#include <functional>
#include <map>

namespace hedgeleaf {

namespace {
using command_fn = std::function<json(const trade&)>;

const std::map<std::string, command_fn>& commands() {
    static const std::map<std::string, command_fn> table = {
        {"price", [](const trade& t) {
             const trade_result priced = price_trade(t);
             json out = price_result_json(t, priced);
             if (json client = client_price_json(t, priced); !client.is_null()) out["client_price"] = client;
             return out;
         }},
        {"hedge", hedge_command},
        {"simulate", simulate_command},
        {"tree", tree_command},
        {"solve", solve_json},
        {"profile", profile_json},
        {"ladder", ladder_json},
    };
    return table;
}
}  // namespace

const char* engine_version() { return "0.1.0"; }

std::vector<std::string> command_names() {
    std::vector<std::string> names;
    for (const auto& [name, fn] : commands()) names.push_back(name);
    return names;
}

json run_command(const std::string& command, const json& document, double work_budget) {
    const auto it = commands().find(command);
    if (it == commands().end()) {
        std::string list;
        for (const auto& n : command_names()) list += (list.empty() ? "" : ", ") + n;
        const std::string hint = nearest(command, command_names());
        fail("", "unknown command \"" + shorten(command, 40) + "\" (one of " + list + ")" +
                     (hint.empty() ? std::string() : "; did you mean \"" + hint + "\"?"));
    }
    const trade t = parse_trade(document);
    check_work_budget(command, t, work_budget);  // refuse up front, before any work
    const work_meter meter(work_budget, work_field(command));  // and hold the run itself to the budget
    json result = it->second(t);
    result["engine_version"] = engine_version();
    return result;
}

std::string run_command_text(const std::string& command, const std::string& text, double work_budget) {
    try {
        if (text.size() > max_document_bytes)
            fail("", "the trade document is " + std::to_string(text.size()) + " bytes, at most " +
                         std::to_string(max_document_bytes));
        const json doc = parse_json_text(text);
        return json{{"ok", true}, {"result", run_command(command, doc, work_budget)}}.dump(-1, ' ', false, json::error_handler_t::replace);
    } catch (const input_error& e) {
        return json{{"ok", false}, {"error", {{"field", e.field()}, {"message", e.what()}}}}.dump(-1, ' ', false, json::error_handler_t::replace);
    } catch (const std::bad_alloc&) {
        return json{{"ok", false}, {"error", {{"field", ""}, {"message", "out of memory: reduce lattice.steps or paths"}}}}.dump(-1, ' ', false, json::error_handler_t::replace);
    } catch (const std::exception& e) {
        return json{{"ok", false}, {"error", {{"field", ""}, {"message", std::string("internal error: ") + e.what()}}}}.dump(-1, ' ', false, json::error_handler_t::replace);
    }
}

}  // namespace hedgeleaf
