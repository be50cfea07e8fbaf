// Hedgeleaf contract: the ready-made shapes a desk quotes every day, as signed legs.
#pragma once

#include "contract/trade.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// Names of the ready-made shapes, e.g. "call-spread", "collar", in table order.
const std::vector<std::string>& structure_shapes();

/// How many strikes `shape` (one of structure_shapes()) takes.
int shape_strike_count(const std::string& shape);

/// The legs of `shape` on `strikes` (ascending, shape_strike_count of them), with signed
/// quantities (+ = client buys): each option leg is `terms` (expiry, exercise) with the
/// shape's type and strike; a stock leg is a plain share.
std::vector<option_leg> structure_legs(const std::string& shape, const std::vector<double>& strikes,
                                       const option_leg& terms);

}  // namespace hedgeleaf
