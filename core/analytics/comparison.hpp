// Hedgeleaf analytics: alternatives side by side, as the client sees them (the compare command).
//
// A client rarely takes the first idea: a plain put, a put spread and a collar on the
// same shares are shown together. Each alternative is priced as the price command
// prices it (its own lattice and quote), dealt at its client price, and described by
// the client's own figures at expiry (analytics/client_price_outcomes.hpp): the
// outcome table at common spot levels, and the P&L at expiry on one common row of
// spots for a chart that overlays them. The desk's figures (model value, margin,
// Greeks, lattice) come along for the internal sheet.
#pragma once

#include "analytics/client_price.hpp"
#include "analytics/client_price_outcomes.hpp"

#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

/// One alternative: a trade and its `quote` section (none: dealt at the model value).
struct alternative {
    trade t;
    std::optional<quote_terms> quote;
};

/// The comparison's own settings (commands/compare.hpp reads them).
struct comparison_settings {
    std::string title;
    std::optional<double> spot_low, spot_high;  ///< the chart's spots; none: every strike and break-even with room
    int points = default_profile_points;        ///< evenly spaced chart spots (strikes and break-evens are added)
    std::vector<double> outcome_spots;          ///< none: today's spot moved by default_outcome_moves
};

/// One alternative's figures.
struct alternative_figures {
    price_result priced;                   ///< the price command's result (Greeks with re-pricing bumps)
    quote_terms terms;                     ///< the quote section, or a quote without margin
    client_price price;                    ///< always: at the mid when there is no quote section
    client_outcomes client;                ///< the client's figures at expiry
    std::vector<client_outcome> outcomes;  ///< at the comparison's outcome spots
    std::vector<client_outcome> curve;     ///< at the comparison's chart spots
};

struct comparison_result {
    std::vector<alternative_figures> alternatives;
    std::vector<double> outcome_spots;
    std::vector<double> chart_spots;  ///< evenly spaced, with every strike and break-even in range added
    double spot_low = 0, spot_high = 0;
};

/// Price and describe each alternative. The alternatives share today's spot (the reader checks).
comparison_result run_comparison(const std::vector<alternative>& alternatives, const comparison_settings& settings);

}  // namespace hedgeleaf
