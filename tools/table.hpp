// Hedgeleaf CLI: human-readable renderings of a command's JSON result.
#pragma once

#include <nlohmann/json.hpp>

#include <string>

namespace hedgeleaf::cli {

/// Nested "key  value" lines; lists of row objects become aligned columns.
std::string render_table(const nlohmann::ordered_json& result);
/// The first list of row objects in the result (e.g. hedge "rows") as CSV; empty if none.
std::string render_csv(const nlohmann::ordered_json& result);

}  // namespace hedgeleaf::cli
