// Hedgeleaf analytics: the client's figures at the client price (see client_price_outcomes.hpp).
#include "analytics/client_price_outcomes.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace hedgeleaf {

namespace {

// A slope within this of zero (shares per unit) is flat: a collar's legs cancel exactly
// between its strikes, up to rounding.
constexpr double flat_slope = 1e-9;

/// The client's position per unit written as a trade (the legs signed by the client's side,
/// the holding as a stock leg) and what it cost: its P&L at expiry is payoff - cost.
struct position_at_price {
    trade legs;
    double cost = 0;
};

position_at_price client_position(const trade& t, const client_price& price, double holding_per_unit) {
    position_at_price p{t, 0};
    const double side = price.client_buys ? 1.0 : -1.0;
    for (auto& leg : p.legs.legs) leg.quantity *= side;
    p.cost = side * price.per_unit;
    if (holding_per_unit != 0) {
        option_leg shares;
        shares.type = payoff_kind::stock;
        shares.quantity = holding_per_unit;
        p.legs.legs.push_back(shares);
        p.cost += holding_per_unit * t.market.spot;
    }
    return p;
}

double pnl_at(const position_at_price& p, double spot, double horizon_years) {
    return horizon_payoff(p.legs, spot, horizon_years) - p.cost;
}

/// The slope of the payoff at expiry on the piece between strikes that holds `spot`
/// (not a strike): calls above their strike, puts below theirs, and shares everywhere
/// move with spot; a digital only jumps.
double slope_near(const trade& t, double spot) {
    double slope = 0;
    for (const auto& leg : t.legs) {
        if (leg.type == payoff_kind::stock || (leg.type == payoff_kind::call && spot > leg.strike))
            slope += leg.quantity;
        else if (leg.type == payoff_kind::put && spot < leg.strike)
            slope -= leg.quantity;
    }
    return slope;
}

/// Slopes of the pieces below and above each strike of `kinks` (ascending).
struct piece_slopes {
    std::vector<double> below, above;
};

piece_slopes slopes_around(const trade& t, const std::vector<double>& kinks) {
    piece_slopes s;
    for (std::size_t i = 0; i < kinks.size(); ++i) {
        s.below.push_back(slope_near(t, i == 0 ? kinks[0] / 2 : (kinks[i - 1] + kinks[i]) / 2));
        s.above.push_back(slope_near(t, i + 1 < kinks.size() ? (kinks[i] + kinks[i + 1]) / 2 : 2 * kinks[i]));
    }
    return s;
}

/// The highest strike below which the position stops losing (rising above it, flat or
/// gaining below), and the next strike down where it starts losing again.
std::optional<protection_span> protection_of(const std::vector<double>& kinks, const piece_slopes& s) {
    for (std::size_t i = kinks.size(); i-- > 0;) {
        if (!(s.above[i] > flat_slope && s.below[i] <= flat_slope)) continue;
        protection_span p{kinks[i], std::nullopt};
        for (std::size_t j = i; j-- > 0;)
            if (s.below[j] > flat_slope) {
                p.down_to = kinks[j];
                break;
            }
        return p;
    }
    return std::nullopt;
}

/// The strike above which the position never gains again: every piece above it is flat or
/// falling and the one below it rises (a put spread on shares, flat between its strikes and
/// rising again below, has no cap at its lower strike).
std::optional<double> cap_of(const std::vector<double>& kinks, const piece_slopes& s) {
    for (std::size_t i = kinks.size(); i-- > 0;) {
        if (s.above[i] > flat_slope) return std::nullopt;
        if (s.below[i] > flat_slope) return kinks[i];
    }
    return std::nullopt;
}

/// The best and worst P&L per unit: the payoff is piecewise linear, so they lie at spot 0,
/// at a strike (either side of a digital's jump) or, where the last piece slopes, far away.
void best_and_worst(const position_at_price& p, double horizon_years, const std::vector<double>& kinks,
                    client_outcomes& out) {
    std::vector<double> spots{0.0};
    for (double k : kinks)
        for (double x : {k * (1 - 1e-12), k, k * (1 + 1e-12)}) spots.push_back(x);
    double best = -std::numeric_limits<double>::infinity(), worst = -best;
    for (double x : spots) {
        const double v = pnl_at(p, x, horizon_years);
        best = std::max(best, v);
        worst = std::min(worst, v);
    }
    const double last = kinks.empty() ? 0.0 : slope_near(p.legs, 2 * kinks.back());
    if (!(last > flat_slope)) out.best_per_unit = best;
    if (!(last < -flat_slope)) out.worst_per_unit = worst;
}

}  // namespace

client_outcomes outcomes_for_client(const trade& t, const client_price& price, double holding_shares) {
    client_outcomes out;
    out.horizon_years = first_expiry(t);
    out.one_expiry = one_expiry(t);
    out.holding_per_unit = holding_shares / t.quantity;
    out.kinks = sorted_strikes(t);
    const position_at_price alone = client_position(t, price, 0);
    out.alone = find_break_evens(alone.legs, alone.cost);
    const position_at_price whole = client_position(t, price, out.holding_per_unit);
    if (holding_shares != 0) out.with_holding = find_break_evens(whole.legs, whole.cost);
    if (out.one_expiry) {
        best_and_worst(whole, out.horizon_years, out.kinks, out);
        const piece_slopes slopes = slopes_around(whole.legs, out.kinks);
        out.protection = protection_of(out.kinks, slopes);
        out.cap = cap_of(out.kinks, slopes);
    }
    return out;
}

std::vector<client_outcome> outcomes_at(const trade& t, const client_price& price, const client_outcomes& outcomes,
                                        const std::vector<double>& spots) {
    const position_at_price alone = client_position(t, price, 0);
    const double q = t.quantity;
    const double side = price.client_buys ? 1.0 : -1.0;
    const double held = outcomes.holding_per_unit * q;
    std::vector<client_outcome> rows;
    for (double s : spots) {
        client_outcome row;
        row.spot = s;
        row.spot_change = s / t.market.spot - 1;
        row.payoff = side * q * horizon_payoff(t, s, outcomes.horizon_years) + 0.0;
        row.pnl_per_unit = pnl_at(alone, s, outcomes.horizon_years);
        row.pnl = q * row.pnl_per_unit + 0.0;
        row.holding_pnl = held * (s - t.market.spot) + 0.0;
        row.pnl_with_holding = row.pnl + row.holding_pnl;
        row.pnl_with_holding_per_unit = row.pnl_with_holding / q;
        rows.push_back(row);
    }
    return rows;
}

std::vector<double> default_outcome_spots(double spot) {
    std::vector<double> spots;
    for (double move : default_outcome_moves) spots.push_back(spot * (1 + move));
    return spots;
}

price_result run_price(const trade& t, const price_settings& settings) {
    price_result out;
    out.priced = price_trade(t, bumped_greeks::on, error_bound::on);
    if (!settings.quote) return out;
    out.quote = price_for_client(t, out.priced, *settings.quote);
    out.client = outcomes_for_client(t, *out.quote, settings.quote->holding_shares);
    out.outcomes = outcomes_at(t, *out.quote, *out.client, default_outcome_spots(t.market.spot));
    return out;
}

}  // namespace hedgeleaf
