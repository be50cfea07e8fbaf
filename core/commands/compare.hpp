// Hedgeleaf commands: the compare command's JSON in and out.
//
// A comparison document holds one to four trade documents side by side:
//   {"comparison": {"title": "...", "alternatives": [trade, trade, ...],
//                   "spot_low": .., "spot_high": .., "points": .., "outcome_spots": [..]}}
// A plain trade document is a comparison of one. Each alternative is read as the
// price command reads a trade (its own market, contract, lattice and quote section);
// a refusal names the field inside the comparison
// ("comparison.alternatives[1].market.volatility: must be > 0, got -0.2").
#pragma once

#include "analytics/comparison.hpp"
#include "analytics/work_estimate.hpp"
#include "commands/json_read.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// What compare reads from a document.
struct comparison_input {
    std::vector<alternative> alternatives;
    comparison_settings settings;
};

/// Read a comparison document, or a trade document as a comparison of one. Throws input_error
/// naming the field: the alternatives share today's spot, their valuation date and currency.
comparison_input read_comparison(const json& document);

/// Each alternative priced as the price command prices it.
work_estimate estimate_comparison_work(const comparison_input& input);

/// The comparison table (`rows`, one per alternative, for --table and --csv), each alternative's
/// legs, client price, outcomes at expiry, chart points and desk figures, notes and the caution.
json write_comparison_result(const comparison_input& input, const comparison_result& result);

}  // namespace hedgeleaf
