// Hedgeleaf commands: strict reading of JSON objects with field paths.
//
// A field_reader walks one JSON object, hands out typed values with range
// checks, and at the end rejects any key nobody asked for (a misspelt field is
// an error, never silently ignored). All failures go through fail().
#pragma once

#include "contract/errors.hpp"

#include <nlohmann/json.hpp>

#include <optional>
#include <set>
#include <string>
#include <vector>

namespace hedgeleaf {

using json = nlohmann::ordered_json;  // objects keep the order they are built in (premium first)

/// Short description of a JSON value for messages: `string "abc"`, `null`, ...
std::string describe(const json& value);

/// Read a finite number at `path` from `value` (not from an object).
double as_number(const json& value, const std::string& path);

/// The candidate at most two edits from `word` (the nearest), or "": the did-you-mean hints.
std::string nearest(const std::string& word, const std::vector<std::string>& candidates);

/// Reads the fields of one JSON object; call finish() to reject unknown keys.
class field_reader {
public:
    field_reader(const json& object, std::string path);

    const std::string& path() const { return path_; }
    bool has(const std::string& key) const;
    /// Path of a child field, for messages.
    std::string child(const std::string& key) const { return join_path(path_, key); }

    /// The raw child value (marks it as read); throws if missing.
    const json& raw(const std::string& key);
    /// The raw child if present.
    const json* raw_optional(const std::string& key);

    double number(const std::string& key);
    std::optional<double> number_optional(const std::string& key);
    double number_or(const std::string& key, double fallback);
    /// A whole number within [lo, hi]; 64-bit because `long` is 32 bits under WebAssembly (wasm32).
    long long integer_or(const std::string& key, long long fallback, long long lo, long long hi);
    std::string text(const std::string& key, std::size_t max_length = 200);
    std::optional<std::string> text_optional(const std::string& key, std::size_t max_length = 200);
    bool boolean_or(const std::string& key, bool fallback);
    /// A string that must be one of `choices`.
    std::string choice(const std::string& key, const std::vector<std::string>& choices);
    std::string choice_or(const std::string& key, const std::vector<std::string>& choices, const std::string& fallback);

    /// Reject keys that were never read (with a did-you-mean hint).
    void finish() const;

private:
    const json& object_;
    std::string path_;
    mutable std::set<std::string> seen_;
};

/// What parse_json_text calls the text it reads, and where its fields are: a trade document at the
/// top ("" path), or a market snapshot, whose fields stand for the trade's market.<field>.
struct json_text_words {
    const char* path;       ///< the field the whole text stands for, and its fields' prefix
    const char* document;   ///< "the trade document is ... bytes", "not a valid trade document"
    const char* json_name;  ///< "not a valid JSON document (near character 81)"
    const char* one;        ///< "a trade needs fewer than 10" (levels of nesting)
};
inline constexpr json_text_words trade_document_words{"", "trade document", "JSON document", "a trade"};
inline constexpr json_text_words market_snapshot_words{"market", "market snapshot", "JSON market snapshot",
                                                       "a snapshot"};

/// Parse a trade document's text (or, with market_snapshot_words, a market snapshot's). Reports text over
/// max_document_bytes, malformed JSON and nesting past max_document_depth (contract/limits.hpp)
/// as an input_error naming words.path, and a name given twice by its path under words.path.
json parse_json_text(const std::string& text, const json_text_words& words = trade_document_words);

/// Range checks that name the field: "must be > 0, got -0.2".
void require_positive(double value, const std::string& path);
void require_non_negative(double value, const std::string& path);
void require_at_most(double value, double limit, const std::string& path);
void require_at_least(double value, double limit, const std::string& path);
/// A price level (spot, typed strike, payout): between min_price_level and max_price_level,
/// the range named in the message: "must be between 1e-06 and 1e+09 (...), got 1e-20".
void require_price_level(double value, const std::string& path);
/// A volatility: between min_volatility and max_volatility, in the same words.
void require_volatility(double value, const std::string& path);
/// A tick (quote.tick, strike_tick): at least min_tick_fraction of spot and at most spot.
void require_tick(double tick, double spot, const std::string& path);

}  // namespace hedgeleaf
