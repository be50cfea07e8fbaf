// Hedgeleaf commands: reading a trade document into the typed trade.
//
// The document's top level and its market, legs, structure and lattice become a
// contract/trade.hpp trade; the sections each command reads (quote, hedge,
// simulate, solve, ladder, profile) are only named here, so that a misspelt
// section is refused, and are read by their command (commands/<command>.hpp).
#pragma once

#include "commands/json_read.hpp"
#include "commands/market_reader.hpp"
#include "contract/trade.hpp"

#include <optional>
#include <string>

namespace hedgeleaf {

/// Read and validate a trade document. Throws input_error naming the field.
trade read_trade(const json& document);

/// Read one option leg from an object (shared by `option`, `legs[i]` and structures);
/// `signed_quantity`: a leg of `legs`, with its quantity and possibly stock.
option_leg read_option_leg(field_reader& r, const years_reader& times, bool signed_quantity);

/// The section `name` of a document, or nullptr when it is absent or null.
const json* section_of(const json& document, const std::string& name);
/// The section `name` of a document, or an empty object when it is absent or null
/// (for sections whose every field is optional).
const json& section_or_empty(const json& document, const std::string& name);

}  // namespace hedgeleaf
