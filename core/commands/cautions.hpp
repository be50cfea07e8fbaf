// Hedgeleaf commands: the caution every result that reaches a client carries.
#pragma once

namespace hedgeleaf {

/// The caution shown wherever a price reaches a client (quote, solve, ladder, profile).
const char* client_caution();

}  // namespace hedgeleaf
