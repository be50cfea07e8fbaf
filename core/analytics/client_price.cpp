// Hedgeleaf analytics: the client price (see client_price.hpp).
#include "analytics/client_price.hpp"

#include "numerics/rounding.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

// Ticks: a price within a billionth of a tick of a tick is on it (binary
// fractions would otherwise push 1.10 up to 1.11).
double round_up(double x, double tick) { return std::ceil(x / tick - 1e-9) * tick; }
double round_down(double x, double tick) { return std::floor(x / tick + 1e-9) * tick; }
double round_near(double x, double tick) { return std::round(x / tick) * tick; }
// A whole number of ticks, shown as 1.1 rather than 1.1000000000000001 at any price level
// (and 0 rather than -1e-17 when it is no tick at all).
double in_ticks(double x, double tick) {
    const double n = std::round(x / tick);
    return n == 0 ? 0.0 : round_significant(n * tick);
}

price_level level_of(double per_unit, double quantity, double spot) {
    return {per_unit, per_unit * quantity + 0.0, per_unit / spot};
}

}  // namespace

client_price price_for_client(const trade& t, const trade_result& priced, const quote_terms& terms) {
    const double margin = terms.margin;
    const double mid = priced.premium;
    double bid = mid, offer = mid;
    if (terms.margin_type == margin_kind::absolute) {
        bid = mid - margin;
        offer = mid + margin;
    } else if (terms.margin_type == margin_kind::fraction_of_premium) {
        bid = mid - margin * std::fabs(mid);
        offer = mid + margin * std::fabs(mid);
    } else if (margin > 0) {
        // A structure can be short volatility: the offer is the dearer of the two re-prices.
        // With a smile the whole smile moves by the margin (a parallel move).
        const auto at_vol = [&](double shift) {
            trade moved = t;
            moved.market.volatility = t.market.volatility + shift;
            if (t.market.smile) moved.market.smile_shift += shift;
            return price_trade(moved, bumped_greeks::off).premium;
        };
        const double up = at_vol(margin), down = at_vol(-margin);
        bid = std::min(up, down);
        offer = std::max(up, down);
    }
    double shown_mid = mid;
    if (terms.tick) {
        bid = in_ticks(round_down(bid, *terms.tick), *terms.tick);
        offer = in_ticks(round_up(offer, *terms.tick), *terms.tick);
        shown_mid = in_ticks(round_near(mid, *terms.tick), *terms.tick);
    }

    const double q = t.quantity;
    const double spot = t.market.spot;
    client_price out;
    out.client_buys = !t.client_sells;
    out.per_unit = out.client_buys ? offer : bid;
    out.mid = level_of(shown_mid, q, spot);
    out.bid = level_of(bid, q, spot);
    out.offer = level_of(offer, q, spot);
    out.total = out.per_unit * q;
    out.fraction_of_notional = out.per_unit / spot;
    out.notional = q * spot;
    out.desk_margin_total = (out.client_buys ? out.per_unit - mid : mid - out.per_unit) * q;
    out.spread = terms.tick ? in_ticks(offer - bid, *terms.tick) : offer - bid;
    return out;
}

}  // namespace hedgeleaf
