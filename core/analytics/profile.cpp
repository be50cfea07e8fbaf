// Hedgeleaf analytics: payoff at expiry and break-even points (see profile.hpp).
#include "analytics/profile.hpp"

#include "analytics/ladder.hpp"
#include "analytics/leg_market.hpp"
#include "analytics/pricing.hpp"
#include "contract/errors.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/lattice.hpp"
#include "numerics/root_finder.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>

namespace hedgeleaf {

namespace {

constexpr double expiry_epsilon = 1e-9;

bool is_digital(const option_leg& leg) {
    return leg.type == payoff_kind::digital_call || leg.type == payoff_kind::digital_put;
}

bool digital_at(const trade& t, double k) {
    return std::any_of(t.legs.begin(), t.legs.end(),
                       [k](const option_leg& l) { return is_digital(l) && l.strike == k; });
}

/// Slope of the payoff beyond the highest strike when all legs expire together:
/// each call and each share adds its quantity.
double tail_slope(const trade& t) {
    double slope = 0;
    for (const auto& leg : t.legs)
        if (leg.type == payoff_kind::call || leg.type == payoff_kind::stock) slope += leg.quantity;
    return slope;
}

// Values within this of zero count as zero: a zero-cost collar is flat at 0
// between its strikes up to rounding, which must not read as many roots.
double zero_tolerance(const trade& t) { return 1e-9 * t.market.spot; }

int sign_of(double x, double tol) { return x > tol ? 1 : (x < -tol ? -1 : 0); }

// Points between which the P&L has one shape: 0, the strikes, and past the
// last strike either the closed-form tail root (linear case) or a scan.
// A digital jumps at its strike, so its strike is looked at from both sides.
std::vector<double> shape_points(const trade& t, bool linear, const std::function<double(double)>& pnl) {
    std::vector<double> points{0.0};
    for (double k : sorted_strikes(t)) {
        if (!linear) {
            const double from = points.back();
            for (int j = 1; j < 16; ++j) points.push_back(from + (k - from) * j / 16.0);
        }
        if (digital_at(t, k)) points.push_back(k * (1 - 1e-12));
        points.push_back(k);
        if (digital_at(t, k)) points.push_back(k * (1 + 1e-12));
    }
    const double last = points.back();
    if (linear) {
        const double slope = tail_slope(t);
        const double beyond = pnl(2 * last);
        const double root = slope != 0 ? 2 * last - beyond / slope : 0;
        points.push_back(root > last ? std::min(2 * root, 4 * max_price_level) : 2 * last);
    } else {
        const double far = 64 * std::max(last, t.market.spot);
        for (double x = last * 1.04; x < far; x *= 1.04) points.push_back(x);
        points.push_back(far);
    }
    return points;
}

// The rows: payoff and P&L at the horizon, value today on the ladder's lattice.
void profile_rows(const trade& t, const profile_settings& s, double cost, profile_result& out) {
    // Dealt at a client price, the client's value today starts below zero by the desk's margin.
    const double markup = out.quote ? out.quote->per_unit - out.premium : 0.0;
    const double spot = t.market.spot;
    const double q = t.signed_quantity();
    const auto today_at = [&](double x) { return value_scenario(t, {x / spot - 1, 0, 0}, s.steps).value; };
    const double today = today_at(spot);
    for (int i = 0; i < s.points; ++i) {
        const double x = s.spot_low + (s.spot_high - s.spot_low) * i / (s.points - 1);
        const double payoff = horizon_payoff(t, x, out.horizon_years);
        const double value = today_at(x);
        profile_row row;
        row.spot = x;
        row.spot_change = x / spot - 1;
        row.payoff = payoff;
        row.pnl_at_expiry = payoff - cost;
        row.value_today = value;
        row.pnl_today = value - today - markup;
        row.position_pnl_at_expiry = q * (payoff - cost) + 0.0;
        row.position_pnl_today = q * row.pnl_today + 0.0;
        out.rows.push_back(row);
    }
}

// The payoff is piecewise linear: extremes sit at 0, at a strike, or at infinity.
void linear_extremes(const trade& t, double cost, profile_result& out) {
    std::vector<double> at{0.0};
    for (double k : sorted_strikes(t)) {
        at.push_back(k);
        if (digital_at(t, k)) {
            at.push_back(k * (1 - 1e-12));
            at.push_back(k * (1 + 1e-12));
        }
    }
    double hi = -std::numeric_limits<double>::infinity(), lo = -hi;
    for (double s : at) {
        const double v = horizon_payoff(t, s, out.horizon_years) - cost;
        hi = std::max(hi, v);
        lo = std::min(lo, v);
    }
    const double slope = tail_slope(t);
    const double q = t.signed_quantity();
    if (!(slope > 0)) out.max_pnl = hi;
    if (!(slope < 0)) out.min_pnl = lo;
    if (q >= 0) {
        if (out.max_pnl) out.position_max_pnl = q * hi;
        if (out.min_pnl) out.position_min_pnl = q * lo;
    } else {
        if (out.min_pnl) out.position_max_pnl = q * lo;
        if (out.max_pnl) out.position_min_pnl = q * hi;
    }
}

void profile_notes(const trade& t, const profile_settings& s, profile_result& out) {
    out.notes.push_back(
        "per unit for the buyer of the trade as written; position figures are times the signed quantity");
    const std::string paid =
        out.quote ? std::string(out.quote->client_buys ? "the client price (the offer)" : "the client price (the bid)")
                  : std::string("premium");
    out.notes.push_back(s.finance_premium ? "P&L at expiry = payoff - " + paid + " carried to expiry at market.rate"
                                          : "P&L at expiry = payoff - " + paid + " paid today (not carried to expiry)");
    if (out.quote)
        out.notes.push_back(
            "P&L if valued today = value at the model - the client price: at today's spot it is the desk's margin "
            "lost");
    if (out.one_expiry) {
        out.notes.push_back("max/min P&L at expiry: null means unbounded");
    } else {
        out.notes.push_back(
            "legs expire on different dates: the profile is taken at the first expiry, later legs valued "
            "there in closed form (European, same volatility and rates) with their remaining time");
    }
    const bool has_stock =
        std::any_of(t.legs.begin(), t.legs.end(), [](const option_leg& l) { return l.type == payoff_kind::stock; });
    if (has_stock && (!t.market.carry_yield.is_zero() || !t.market.borrow.is_zero() || !t.market.dividends.empty()))
        out.notes.push_back(
            "a stock leg pays the share price at expiry; dividends received before then are not in the payoff");
    if (std::any_of(t.legs.begin(), t.legs.end(), is_digital))
        out.notes.push_back("a digital's payoff jumps at its strike: a break-even there is where the P&L changes sign");
    if (t.market.smile)
        out.notes.push_back(
            "each leg is valued at the smile's volatility for its strike and expiry; value today at other spots "
            "keeps each strike's volatility (sticky strike), and later legs keep today's volatility");
}

}  // namespace

double first_expiry(const trade& t) {
    double h = std::numeric_limits<double>::infinity();
    for (const auto& leg : t.legs)
        if (leg.type != payoff_kind::stock) h = std::min(h, leg.expiry_years);
    return h;
}

bool one_expiry(const trade& t) {
    const double h = first_expiry(t);
    return std::all_of(t.legs.begin(), t.legs.end(), [h](const option_leg& l) {
        return l.type == payoff_kind::stock || l.expiry_years <= h + expiry_epsilon;
    });
}

std::vector<double> sorted_strikes(const trade& t) {
    std::vector<double> k;
    for (const auto& leg : t.legs)
        if (leg.type != payoff_kind::stock) k.push_back(leg.strike);
    std::sort(k.begin(), k.end());
    k.erase(std::unique(k.begin(), k.end()), k.end());
    return k;
}

double horizon_payoff(const trade& t, double s, double horizon_years) {
    const market_data later = t.market.seen_at(horizon_years);
    double total = 0;
    for (const auto& leg : t.legs) {
        if (leg.type == payoff_kind::stock || leg.expiry_years <= horizon_years + expiry_epsilon) {
            total += leg.quantity * exercise_value(leg, s);
            continue;
        }
        option_leg rest = leg;
        rest.expiry_years -= horizon_years;
        // Escrowed dividends need spot above their present value; below it the
        // later leg is valued as if spot held only the dividends.
        market_data m = later;
        const double pv = m.dividend_pv(0, rest.expiry_years);
        m.spot = std::max(s, pv * (1 + 1e-12) + 1e-12);
        if (t.market.smile || leg.volatility)
            m.volatility = leg_volatility(t.market, leg).volatility;  // held at today's
        total += leg.quantity * closed_form(m, rest).premium;
    }
    return total;
}

break_evens find_break_evens(const trade& t, double cost) {
    const double h = first_expiry(t);
    const bool linear = one_expiry(t);
    const double tol = zero_tolerance(t);
    const auto pnl = [&](double s) { return horizon_payoff(t, s, h) - cost; };
    const std::vector<double> points = shape_points(t, linear, pnl);

    std::vector<double> values;
    for (double x : points) values.push_back(pnl(x));
    break_evens out;
    root_options options;
    options.f_tolerance = 1e-13 * t.market.spot;
    for (std::size_t i = 0; i < points.size();) {
        const int si = sign_of(values[i], tol);
        if (si == 0) {
            std::size_t j = i;
            while (j + 1 < points.size() && sign_of(values[j + 1], tol) == 0) ++j;
            if (j > i)
                out.ranges.emplace_back(points[i], points[j]);
            else
                out.points.push_back(points[i]);
            i = j + 1;
            continue;
        }
        if (i + 1 < points.size() && si * sign_of(values[i + 1], tol) < 0) {
            // A sign change inside the piece: a root, or the jump of a digital.
            const root_result r = find_root(pnl, points[i], points[i + 1], options);
            out.points.push_back(r.x);
        }
        ++i;
    }
    std::sort(out.points.begin(), out.points.end());
    return out;
}

profile_result run_profile(const trade& t, const profile_settings& s) {
    const double pv = t.market.dividend_pv(0, t.final_expiry_years());
    if (!(s.spot_low > pv))
        fail("profile.spot_low", "must be above the present value " + format_number(pv) +
                                     " of the dividends before expiry, got " + format_number(s.spot_low));
    const double lowest = t.market.spot * min_profile_spot_fraction;
    if (!(s.spot_low >= lowest))
        fail("profile.spot_low", "must be at least " + format_number(lowest) + " (market.spot x " +
                                     format_number(min_profile_spot_fraction) + "), got " + format_number(s.spot_low));
    const double work = scenario_work(static_cast<std::size_t>(s.points) + 1, t.legs.size(), s.steps);
    if (work > max_profile_work)
        fail("profile.steps", "the profile would need about " + format_number(std::round(work / 1e6)) +
                                  " million lattice node updates, at most " + format_number(max_profile_work / 1e6) +
                                  " million; use fewer steps or points");

    profile_result out;
    out.horizon_years = first_expiry(t);
    out.one_expiry = one_expiry(t);
    // The premium is the price command's (the trade's own lattice settings).
    const trade_result priced = price_trade(t, bumped_greeks::off);
    out.premium = priced.premium;
    if (s.quote) out.quote = price_for_client(t, priced, *s.quote);
    const double paid = out.quote ? out.quote->per_unit : out.premium;
    out.cost_at_expiry = s.finance_premium ? paid * t.market.rate.growth(0, out.horizon_years) : paid;
    profile_rows(t, s, out.cost_at_expiry, out);
    out.zero_pnl = find_break_evens(t, out.cost_at_expiry);
    if (out.one_expiry) linear_extremes(t, out.cost_at_expiry, out);
    profile_notes(t, s, out);
    return out;
}

}  // namespace hedgeleaf
