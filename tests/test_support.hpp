// Hedgeleaf tests: helpers the analytics tests share (read a document the way the commands do).
#pragma once

#include "commands/json_read.hpp"
#include "commands/trade_reader.hpp"

#include <cmath>
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

/// The treasurer's EUR/USD market of examples/currency-receivable-put.json, shared by the
/// currency tests: spot 1.0850, volatility 8 %, 274 days trade to expiry (ACT/365F), forward
/// 1.0972472604432726 and domestic discount factor 0.9776763891152029 from 3 % and 1.5 %
/// ACT/360 simple over 274 days (computed with Python).
namespace treasurer_eurusd {
inline constexpr double spot = 1.0850, forward = 1.0972472604432726, discount = 0.9776763891152029;
inline const double years = 274 / 365.0;
inline market_data market() {
    const double rate = -std::log(discount) / years;
    return flat_market(spot, 0.08, rate, rate - std::log(forward / spot) / years);
}
}  // namespace treasurer_eurusd

}  // namespace hedgeleaf
