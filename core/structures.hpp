// Hedgeleaf core: ready-made structures expanded into signed legs.
#pragma once

#include "trade.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// Names of the ready-made shapes, e.g. "call-spread", "collar".
const std::vector<std::string>& structure_shapes();

/// Expand a `structure` object {shape, strikes (ascending), expiry_years|expiry_date,
/// exercise} into legs with signed quantities (+ = client buys).
std::vector<option_leg> expand_structure(const json& node, const time_reader& times);

}  // namespace hedgeleaf
