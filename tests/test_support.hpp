// Hedgeleaf tests: helpers the analytics tests share (read a document the way the commands do).
#pragma once

#include "commands/json_read.hpp"
#include "commands/trade_reader.hpp"

#include <string>

namespace hedgeleaf {

/// The trade of a document's text.
inline trade trade_of(const std::string& text) { return read_trade(parse_json_text(text)); }

/// The message a document's trade is refused with, or "(accepted)".
inline std::string message_of(const json& doc) {
    try {
        (void)read_trade(doc);
    } catch (const input_error& e) {
        return e.what();
    }
    return "(accepted)";
}

/// A command's typed steps on a document's text: its settings read from the document
/// (`read`, e.g. read_hedge_settings), then `run` (e.g. run_hedge) on the trade.
template <class Read, class Run>
auto run_steps(const std::string& text, Read read, Run run) {
    const json doc = parse_json_text(text);
    const trade t = read_trade(doc);
    return run(t, read(doc, t));
}

}  // namespace hedgeleaf
