// Hedgeleaf commands: the caution every result that reaches a client carries.
#pragma once

namespace hedgeleaf {

/// The caution shown wherever a price reaches a client (quote, solve, ladder, profile).
/// `term_structures`: the market has a smile, curves or a borrow fee, and the caution says
/// what the model assumed of them instead of "constant volatility and interest rates".
const char* client_caution(bool term_structures = false);

}  // namespace hedgeleaf
