// Hedgeleaf contract: the one error type for bad input, and the field paths it names.
//
// Every rejected input travels as an input_error carrying the field path
// (e.g. "market.volatility") and a message that starts with that path, so the
// CLI, the WebAssembly module and the page all show the same sentence.
#pragma once

#include <cstddef>
#include <optional>
#include <stdexcept>
#include <string>

namespace hedgeleaf {

/// At most `bytes` bytes of `text`, cut on a UTF-8 character boundary.
std::string shorten(const std::string& text, std::size_t bytes);

/// `text` with control characters written out (\n, \r, \t, \u001b, ...), so a
/// message that quotes the user's text stays one line and cannot steer a terminal.
std::string one_line(const std::string& text);

/// The broken bound of a range check, in the units of the file: the value given must stand
/// in `relation` to `limit` ("value > limit", "value <= limit", ...). The page uses it to say
/// the same sentence in the units on screen (a volatility of -0.2 shows as -20 %).
struct bound_detail {
    double value = 0;
    double limit = 0;
    std::string relation;  ///< one of "<", "<=", ">", ">="
};

/// Bad input: `field` is the JSON path of the offending value, `what()` is
/// "<field>: <problem>", on one line (both pass through one_line: a quoted line
/// break once split the CLI's one-line message; found by tests/fuzz).
class input_error : public std::runtime_error {
public:
    input_error(const std::string& field, const std::string& problem, std::optional<bound_detail> bound = std::nullopt)
        : std::runtime_error(field.empty() ? one_line(problem) : one_line(field) + ": " + one_line(problem)),
          field_(one_line(field)),
          bound_(std::move(bound)) {}
    /// JSON path of the offending input ("" when the whole document is at fault).
    const std::string& field() const noexcept { return field_; }
    /// The bound a range check found broken, when the refusal is one.
    const std::optional<bound_detail>& bound() const noexcept { return bound_; }

private:
    std::string field_;
    std::optional<bound_detail> bound_;
};

/// The page's work budget ran out while a request ran (numerics/work_meter.hpp). Reported
/// like bad input (it names the field that sets the size), but code that catches input
/// errors from trial values (bumps, search points, scenarios) passes it on untouched.
class work_exhausted : public input_error {
public:
    using input_error::input_error;
};

/// Throw an input_error; the single funnel for validation failures.
[[noreturn]] inline void fail(const std::string& field, const std::string& problem) {
    throw input_error(field, problem);
}

/// Throw an input_error for a broken bound: "<field>: must be <relation> <limit>, got <value>",
/// with the bound attached for callers that re-word it (a non-finite value carries none).
[[noreturn]] void fail_bound(const std::string& field, double value, const std::string& relation, double limit);

/// Shortest round-trip text of a number, for messages ("got -0.2").
std::string format_number(double x);

/// Join a parent path and a key: join_path("market", "spot") == "market.spot".
std::string join_path(const std::string& parent, const std::string& key);
/// Element path: index_path("legs", 2) == "legs[2]".
std::string index_path(const std::string& parent, std::size_t index);

}  // namespace hedgeleaf
