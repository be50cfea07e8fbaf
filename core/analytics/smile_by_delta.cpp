// Hedgeleaf analytics: a currency smile quoted by delta (see smile_by_delta.hpp).
#include "analytics/smile_by_delta.hpp"

#include "analytics/currency.hpp"
#include "contract/errors.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

bool premium_adjusted(delta_convention c) {
    return c == delta_convention::spot_premium_adjusted || c == delta_convention::forward_premium_adjusted;
}

/// The strike of a call or a put with `delta` at its own flat `volatility`.
double wing_strike(const market_data& expiry_market, payoff_kind type, double volatility, double years,
                   delta_convention convention, double delta, const std::string& path) {
    market_data flat = expiry_market;
    flat.smile = nullptr;
    flat.smile_shift = 0;
    flat.volatility = volatility;
    option_leg leg = single_leg(type, expiry_market.forward(years), years);
    leg.volatility = volatility;
    return strike_for_currency_delta(flat, leg, convention, delta, path);
}

/// The put and call of one delta (0.25 or 0.10), put first.
void add_wings(std::vector<delta_smile_point>& points, const market_data& m, const delta_quote& q, double rr, double bf,
               double delta, delta_convention convention, const std::string& path, const char* field) {
    const wing_volatilities w = wings_of(q.atm, rr, bf);
    const std::string where = join_path(path, field);
    const std::string tag = delta > 0.2 ? "25" : "10";
    points.push_back(
        {"put_" + tag, wing_strike(m, payoff_kind::put, w.put, q.expiry_years, convention, -delta, where), w.put});
    points.push_back(
        {"call_" + tag, wing_strike(m, payoff_kind::call, w.call, q.expiry_years, convention, delta, where), w.call});
}

}  // namespace

wing_volatilities wings_of(double atm, double rr, double bf) { return {atm + bf + rr / 2, atm + bf - rr / 2}; }

double atm_strike(double forward, double volatility, double years, delta_convention convention) {
    const double half_variance = volatility * volatility * years / 2;
    // Unadjusted: the deltas cancel where d1 = 0; premium-adjusted: where d2 = 0.
    return forward * std::exp(premium_adjusted(convention) ? -half_variance : half_variance);
}

delta_smile_row smile_row_of(const market_data& m, const delta_quote& q, delta_convention convention,
                             const std::string& path) {
    delta_smile_row row;
    row.expiry_years = q.expiry_years;
    row.forward = m.forward(q.expiry_years);
    std::vector<delta_smile_point> wings;
    add_wings(wings, m, q, q.rr25, q.bf25, 0.25, convention, path, "bf25");
    if (q.rr10 && q.bf10) add_wings(wings, m, q, *q.rr10, *q.bf10, 0.10, convention, path, "bf10");
    const auto& put25 = wings[0];
    const auto& call25 = wings[1];
    row.points.push_back({"atm", atm_strike(row.forward, q.atm, q.expiry_years, convention), q.atm});
    if (wings.size() == 4) {
        const auto& put10 = wings[2];
        const auto& call10 = wings[3];
        if (!(put10.strike < put25.strike && call25.strike < call10.strike))
            fail(join_path(path, "bf10"), "puts the 10-delta strikes (" + format_number(put10.strike) + ", " +
                                              format_number(call10.strike) + ") inside the 25-delta strikes (" +
                                              format_number(put25.strike) + ", " + format_number(call25.strike) +
                                              "); the 10-delta wings need volatilities nearer the 25-delta ones");
        row.points.insert(row.points.begin(), put10);
        row.points.push_back(call10);
    }
    const double atm = row.points[wings.size() == 4 ? 1 : 0].strike;
    if (!(put25.strike < atm && atm < call25.strike))
        fail(join_path(path, "bf25"), "puts the 25-delta strikes (" + format_number(put25.strike) + ", " +
                                          format_number(call25.strike) + ") on one side of the at-the-money strike " +
                                          format_number(atm) +
                                          "; check rr25 and bf25 against atm (decimals: 0.004 = 0.4 %)");
    const std::size_t at = wings.size() == 4 ? 1 : 0;
    row.points.insert(row.points.begin() + static_cast<std::ptrdiff_t>(at), put25);
    row.points.insert(row.points.begin() + static_cast<std::ptrdiff_t>(at + 2), call25);
    return row;
}

smile_grid grid_of_rows(const std::vector<delta_smile_row>& rows, double spot) {
    smile_grid g;
    g.basis = strike_basis::percent_of_forward;
    g.spot = spot;
    std::vector<volatility_smile> own;  // each expiry's points alone, to read its row anywhere
    for (const auto& row : rows) {
        smile_grid one;
        one.basis = strike_basis::percent_of_forward;
        one.spot = spot;
        one.expiries = {row.expiry_years};
        one.vols.emplace_back();
        for (const auto& p : row.points) {
            one.strikes.push_back(100 * p.strike / row.forward);
            one.vols[0].push_back(p.volatility);
            g.strikes.push_back(one.strikes.back());
        }
        g.expiries.push_back(row.expiry_years);
        own.emplace_back(std::move(one));
    }
    std::sort(g.strikes.begin(), g.strikes.end());
    // Columns closer than a part in 1e12 are one column (a flat quote repeats its moneyness).
    g.strikes.erase(std::unique(g.strikes.begin(), g.strikes.end(),
                                [](double a, double b) { return std::fabs(b - a) <= 1e-12 * std::fabs(a); }),
                    g.strikes.end());
    for (const auto& s : own) {
        std::vector<double> vols;
        for (const double x : g.strikes) vols.push_back(s.row_at(0, x));
        g.vols.push_back(std::move(vols));
    }
    return g;
}

}  // namespace hedgeleaf
