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

/// A smile skewed to the downside, percent of spot, two expiries (invented figures).
inline constexpr const char* downside_skew = R"({"expiries": [0.5, 2], "strikes": [70, 85, 100, 115, 130],
    "vols": [[0.33, 0.27, 0.22, 0.195, 0.19], [0.3, 0.26, 0.225, 0.205, 0.2]]})";

/// Three legs, one of each exercise style (an American 90 put, a European 115 call sold, half a
/// Bermudan 120 call), with a cash dividend, at `volatility` (a number or a smile document).
inline json three_styles(const json& volatility) {
    json d = json::parse(R"({
      "market": {"spot": 100, "rate": 0.03, "carry_yield": 0.01,
                 "dividends": [{"time_years": 0.4, "amount": 1.2}]},
      "legs": [
        {"type": "put", "strike": 90, "expiry_years": 1, "quantity": 1, "exercise": "american"},
        {"type": "call", "strike": 115, "expiry_years": 1, "quantity": -1},
        {"type": "call", "strike": 120, "expiry_years": 1.5, "quantity": 0.5, "exercise": "bermudan",
         "exercise_years": [0.75, 1.25]}
      ]
    })");
    d["market"]["volatility"] = volatility;
    return d;
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
