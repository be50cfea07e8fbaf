// Hedgeleaf commands: cautions (see cautions.hpp).
#include "commands/cautions.hpp"

namespace hedgeleaf {

const char* client_caution(bool term_structures) {
    if (term_structures)
        return "Indicative only: not an offer to deal, not a commitment to trade and not advice. Model values from "
               "a binomial lattice at the volatility smile and the rate, yield and borrow curves given, held as they "
               "are (the model does not move them); they hold only for the inputs shown. Follow your firm's and "
               "your jurisdiction's sales rules.";
    return "Indicative only: not an offer to deal, not a commitment to trade and not advice. Model values from a "
           "binomial lattice with constant volatility and interest rates; they hold only for the inputs shown. "
           "Follow your firm's and your jurisdiction's sales rules.";
}

}  // namespace hedgeleaf
