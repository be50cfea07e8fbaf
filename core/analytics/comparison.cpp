// Hedgeleaf analytics: alternatives side by side (see comparison.hpp).
#include "analytics/comparison.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

bool is_digital(const option_leg& leg) {
    return leg.type == payoff_kind::digital_call || leg.type == payoff_kind::digital_put;
}

/// Spots worth seeing of one alternative: its strikes and its break-evens.
std::vector<double> landmarks(const alternative_figures& a) {
    std::vector<double> out = a.client.kinks;
    for (const break_evens* b : {&a.client.alone, &a.client.with_holding}) {
        out.insert(out.end(), b->points.begin(), b->points.end());
        for (const auto& [from, to] : b->ranges) {
            out.push_back(from);
            out.push_back(to);
        }
    }
    return out;
}

/// The chart's range when none is given: today's spot and every strike and break-even within
/// a factor ten of it, with room on each side (a quarter of their span, one standard
/// deviation of spot to the last expiry, or 2 % of spot, whichever is most).
void default_range(const std::vector<alternative>& alternatives, comparison_result& r) {
    const double spot = alternatives.front().t.market.spot;
    double lo = spot, hi = spot, spread = 0;
    for (std::size_t i = 0; i < alternatives.size(); ++i) {
        const trade& t = alternatives[i].t;
        spread = std::max(spread, t.market.volatility * std::sqrt(t.final_expiry_years()));
        for (double x : landmarks(r.alternatives[i]))
            if (x > spot / 10 && x < spot * 10) {
                lo = std::min(lo, x);
                hi = std::max(hi, x);
            }
    }
    const double pad = std::max({0.25 * (hi - lo), spread * spot, 0.02 * spot});
    r.spot_low = std::max(lo - pad, 0.01 * spot);
    r.spot_high = hi + pad;
}

/// Evenly spaced spots over the range, with every alternative's strikes and break-evens in it
/// (and both sides of a digital's jump), so that each line turns exactly where it does.
std::vector<double> chart_spots(const std::vector<alternative>& alternatives, const comparison_result& r, int points) {
    std::vector<double> spots;
    for (int i = 0; i < points; ++i) spots.push_back(r.spot_low + (r.spot_high - r.spot_low) * i / (points - 1));
    const auto inside = [&](double x) { return x > r.spot_low && x < r.spot_high; };
    for (std::size_t i = 0; i < alternatives.size(); ++i) {
        for (double x : landmarks(r.alternatives[i]))
            if (inside(x)) spots.push_back(x);
        for (const auto& leg : alternatives[i].t.legs)
            if (is_digital(leg) && inside(leg.strike))
                for (double x : {leg.strike * (1 - 1e-9), leg.strike * (1 + 1e-9)}) spots.push_back(x);
    }
    std::sort(spots.begin(), spots.end());
    spots.erase(std::unique(spots.begin(), spots.end()), spots.end());
    return spots;
}

alternative_figures figures_of(const alternative& a) {
    alternative_figures f;
    f.priced.priced = price_trade(a.t, bumped_greeks::on, error_bound::on);
    f.terms = a.quote.value_or(quote_terms{});
    f.price = price_for_client(a.t, f.priced.priced, f.terms);
    if (a.quote) f.priced.quote = f.price;
    f.client = outcomes_for_client(a.t, f.price, f.terms.holding_shares);
    return f;
}

}  // namespace

comparison_result run_comparison(const std::vector<alternative>& alternatives, const comparison_settings& settings) {
    comparison_result r;
    for (const auto& a : alternatives) r.alternatives.push_back(figures_of(a));
    const double spot = alternatives.front().t.market.spot;
    r.outcome_spots = settings.outcome_spots.empty() ? default_outcome_spots(spot) : settings.outcome_spots;
    default_range(alternatives, r);
    // A range given at one end only keeps the other end clear of it.
    if (settings.spot_low) r.spot_low = *settings.spot_low;
    if (settings.spot_high) r.spot_high = *settings.spot_high;
    if (!settings.spot_high && r.spot_high <= r.spot_low) r.spot_high = 1.5 * r.spot_low;
    if (!settings.spot_low && r.spot_low >= r.spot_high) r.spot_low = r.spot_high / 1.5;
    r.chart_spots = chart_spots(alternatives, r, settings.points);
    for (std::size_t i = 0; i < alternatives.size(); ++i) {
        alternative_figures& f = r.alternatives[i];
        f.outcomes = outcomes_at(alternatives[i].t, f.price, f.client, r.outcome_spots);
        f.curve = outcomes_at(alternatives[i].t, f.price, f.client, r.chart_spots);
    }
    return r;
}

}  // namespace hedgeleaf
