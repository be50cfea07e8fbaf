// Hedgeleaf core: payoff at expiry and break-even points (see profile.hpp).
#include "profile.hpp"

#include "closed_form.hpp"
#include "ladder.hpp"
#include "lattice.hpp"
#include "pricer.hpp"
#include "quote.hpp"
#include "solver.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>

namespace hedgeleaf {

namespace {

constexpr int max_profile_points = 501;
constexpr int max_profile_steps = 2001;
constexpr double max_profile_work = 2e9;  // lattice node updates, as for ladders
constexpr double expiry_epsilon = 1e-9;
constexpr double max_price_level = 1e9;

double first_expiry(const trade& t) {
    double h = std::numeric_limits<double>::infinity();
    for (const auto& leg : t.legs)
        if (leg.type != payoff_kind::stock) h = std::min(h, leg.expiry);
    return h;
}

bool one_expiry(const trade& t) {
    const double h = first_expiry(t);
    return std::all_of(t.legs.begin(), t.legs.end(), [h](const option_leg& l) {
        return l.type == payoff_kind::stock || l.expiry <= h + expiry_epsilon;
    });
}

bool is_digital(const option_leg& leg) {
    return leg.type == payoff_kind::digital_call || leg.type == payoff_kind::digital_put;
}

std::vector<double> sorted_strikes(const trade& t) {
    std::vector<double> k;
    for (const auto& leg : t.legs)
        if (leg.type != payoff_kind::stock) k.push_back(leg.strike);
    std::sort(k.begin(), k.end());
    k.erase(std::unique(k.begin(), k.end()), k.end());
    return k;
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

}  // namespace

double horizon_payoff(const trade& t, double s, double horizon) {
    market_data later = t.market;
    later.dividends.clear();
    for (dividend d : t.market.dividends)
        if (d.time > horizon) {
            d.time -= horizon;
            later.dividends.push_back(d);
        }
    double total = 0;
    for (const auto& leg : t.legs) {
        if (leg.type == payoff_kind::stock || leg.expiry <= horizon + expiry_epsilon) {
            total += leg.quantity * exercise_value(leg, s);
            continue;
        }
        option_leg rest = leg;
        rest.expiry -= horizon;
        // Escrowed dividends need spot above their present value; below it the
        // later leg is valued as if spot held only the dividends.
        market_data m = later;
        const double pv = m.dividend_pv(0, rest.expiry);
        m.spot = std::max(s, pv * (1 + 1e-12) + 1e-12);
        total += leg.quantity * closed_form(m, rest).premium;
    }
    return total;
}

break_evens find_break_evens(const trade& t, double cost) {
    const double h = first_expiry(t);
    const bool linear = one_expiry(t);
    const double tol = zero_tolerance(t);
    const auto pnl = [&](double s) { return horizon_payoff(t, s, h) - cost; };

    // Points between which the P&L has one shape: 0, the strikes, and past the
    // last strike either the closed-form tail root (linear case) or a scan.
    // A digital jumps at its strike, so its strike is looked at from both sides.
    const std::vector<double> strikes = sorted_strikes(t);
    const auto jumps_at = [&](double k) {
        return std::any_of(t.legs.begin(), t.legs.end(), [k](const option_leg& l) { return is_digital(l) && l.strike == k; });
    };
    std::vector<double> points{0.0};
    for (double k : strikes) {
        if (!linear) {
            const double from = points.back();
            for (int j = 1; j < 16; ++j) points.push_back(from + (k - from) * j / 16.0);
        }
        if (jumps_at(k)) points.push_back(k * (1 - 1e-12));
        points.push_back(k);
        if (jumps_at(k)) points.push_back(k * (1 + 1e-12));
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
            if (j > i) out.ranges.emplace_back(points[i], points[j]);
            else out.points.push_back(points[i]);
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

json profile_json(const trade& t) {
    static const json empty = json::object();
    const json* section = t.source.is_object() && t.source.contains("profile") && !t.source.at("profile").is_null()
                              ? &t.source.at("profile") : &empty;
    field_reader r(*section, "profile");
    const double spot = t.market.spot;
    const double low = r.number_or("spot_low", 0.5 * spot);
    const double high = r.number_or("spot_high", 1.5 * spot);
    require_positive(low, r.child("spot_low"));
    require_at_most(high, max_price_level, r.child("spot_high"));
    if (!(high > low)) fail(r.child("spot_high"), "must be above spot_low " + format_number(low) + ", got " + format_number(high));
    const int count = static_cast<int>(r.integer_or("points", 41, 2, max_profile_points));
    const int steps = static_cast<int>(r.integer_or("steps", default_ladder_steps, 1, max_profile_steps));
    const bool finance = r.boolean_or("finance_premium", false);
    r.finish();
    const double pv = t.market.dividend_pv(0, t.final_expiry());
    if (!(low > pv))
        fail("profile.spot_low", "must be above the present value " + format_number(pv) +
                                     " of the dividends before expiry, got " + format_number(low));
    const double work = static_cast<double>(count + 1) * static_cast<double>(t.legs.size()) * 0.625 * steps * steps;
    if (work > max_profile_work)
        fail("profile.steps", "the profile would need about " + format_number(std::round(work / 1e6)) +
                                  " million lattice node updates, at most " + format_number(max_profile_work / 1e6) +
                                  " million; use fewer steps or points");

    const double horizon = first_expiry(t);
    const bool linear = one_expiry(t);
    // The premium is the price command's (the trade's own lattice settings).
    const double premium = price_trade_fast(t).premium;
    const double cost = finance ? premium * std::exp(t.market.rate * horizon) : premium;
    const double q = t.signed_quantity();
    const auto today_at = [&](double s) { return value_scenario(t, {s / spot - 1, 0, 0}, steps).value; };
    const double today = today_at(spot);

    json rows = json::array();
    for (int i = 0; i < count; ++i) {
        const double s = low + (high - low) * i / (count - 1);
        const double payoff = horizon_payoff(t, s, horizon);
        const double value = today_at(s);
        rows.push_back({{"spot", s},
                        {"spot_change", s / spot - 1},
                        {"payoff", payoff},
                        {"pnl_at_expiry", payoff - cost},
                        {"value_today", value},
                        {"pnl_today", value - today},
                        {"position_pnl_at_expiry", q * (payoff - cost) + 0.0},
                        {"position_pnl_today", q * (value - today) + 0.0}});
    }

    const break_evens be = find_break_evens(t, cost);
    json ranges = json::array();
    for (const auto& [a, b] : be.ranges) ranges.push_back({a, b});
    json out{{"premium", premium},
             {"cost_at_expiry", cost},
             {"finance_premium", finance},
             {"horizon_years", horizon},
             {"break_even", be.points},
             {"break_even_ranges", ranges},
             {"quantity", t.quantity},
             {"side", t.client_sells ? "sell" : "buy"},
             {"lattice", {{"method", to_string(t.lattice.method)}, {"steps", effective_steps(t.lattice.method, steps)}}},
             {"rows", rows},
             {"columns", {"spot", "spot_change", "payoff", "pnl_at_expiry", "value_today", "pnl_today",
                          "position_pnl_at_expiry", "position_pnl_today"}}};
    if (t.valuation_date) out["horizon_date"] = to_iso(add_days(*t.valuation_date, std::lround(horizon * 365)));

    json notes = json::array();
    notes.push_back("per unit for the buyer of the trade as written; position figures are times the signed quantity");
    notes.push_back(finance ? "P&L at expiry = payoff - premium carried to expiry at market.rate"
                            : "P&L at expiry = payoff - premium paid today (not carried to expiry)");
    if (linear) {
        // The payoff is piecewise linear: extremes sit at 0, at a strike, or at infinity.
        std::vector<double> at{0.0};
        for (double k : sorted_strikes(t)) {
            at.push_back(k);
            if (std::any_of(t.legs.begin(), t.legs.end(), [k](const option_leg& l) { return is_digital(l) && l.strike == k; })) {
                at.push_back(k * (1 - 1e-12));
                at.push_back(k * (1 + 1e-12));
            }
        }
        double hi = -std::numeric_limits<double>::infinity(), lo = -hi;
        for (double s : at) {
            const double v = horizon_payoff(t, s, horizon) - cost;
            hi = std::max(hi, v);
            lo = std::min(lo, v);
        }
        const double slope = tail_slope(t);
        const json max_pnl = slope > 0 ? json(nullptr) : json(hi);
        const json min_pnl = slope < 0 ? json(nullptr) : json(lo);
        out["max_pnl_at_expiry"] = max_pnl;
        out["min_pnl_at_expiry"] = min_pnl;
        out["position_max_pnl_at_expiry"] = q >= 0 ? (max_pnl.is_null() ? max_pnl : json(q * hi))
                                                   : (min_pnl.is_null() ? min_pnl : json(q * lo));
        out["position_min_pnl_at_expiry"] = q >= 0 ? (min_pnl.is_null() ? min_pnl : json(q * lo))
                                                   : (max_pnl.is_null() ? max_pnl : json(q * hi));
        notes.push_back("max/min P&L at expiry: null means unbounded");
    } else {
        notes.push_back("legs expire on different dates: the profile is taken at the first expiry, later legs valued "
                        "there in closed form (European, same volatility and rates) with their remaining time");
    }
    const bool has_stock = std::any_of(t.legs.begin(), t.legs.end(), [](const option_leg& l) { return l.type == payoff_kind::stock; });
    if (has_stock && (t.market.carry_yield != 0 || !t.market.dividends.empty()))
        notes.push_back("a stock leg pays the share price at expiry; dividends received before then are not in the payoff");
    if (std::any_of(t.legs.begin(), t.legs.end(), is_digital))
        notes.push_back("a digital's payoff jumps at its strike: a break-even there is where the P&L changes sign");
    out["notes"] = notes;
    out["caution"] = client_caution();
    return out;
}

}  // namespace hedgeleaf
