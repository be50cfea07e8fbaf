// Hedgeleaf analytics: one unknown for a target (see solve.hpp).
#include "analytics/solve.hpp"

#include "analytics/leg_market.hpp"
#include "analytics/strikes.hpp"
#include "contract/errors.hpp"
#include "contract/limits.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/lattice_price.hpp"

#include <algorithm>
#include <cmath>
#include <functional>

namespace hedgeleaf {

namespace {

// Re-pricing at the solution must match the target within 1e-8 of notional
// (quantity * spot); the finder aims far tighter so the solved volatility or
// strike itself is accurate even where the premium barely moves with it.
constexpr double target_tolerance = 1e-8;
constexpr double finder_tolerance = 1e-13;

bool on_lattice(const option_leg& leg) {
    return leg.type != payoff_kind::stock && leg.exercise != exercise_style::european;
}

std::string pricing_label(const std::vector<option_leg>& legs) {
    const bool any_lattice = std::any_of(legs.begin(), legs.end(), on_lattice);
    const bool any_closed = std::any_of(legs.begin(), legs.end(), [](const option_leg& l) {
        return l.type != payoff_kind::stock && l.exercise == exercise_style::european;
    });
    if (any_lattice && any_closed) return "closed-form (european legs) and lattice (others)";
    return any_lattice ? "lattice" : "closed-form";
}

double leg_premium(const market_data& market, const option_leg& leg, const lattice_settings& settings) {
    if (leg.type == payoff_kind::stock) return market.spot;
    const market_data m = leg_market(market, leg);
    if (!on_lattice(leg)) return closed_form(m, leg).premium;
    return price_leg(m, leg, settings).premium;
}

/// One unknown to solve for: how the net premium depends on it and where to look.
struct search {
    std::string unknown;  // "volatility", "strike of leg 1"
    double lower = 0, upper = 0;
    std::string lower_path, upper_path;
    double target = 0;  // net premium per unit
    std::function<double(double)> premium_at;
};

search search_of(const solve_settings& s, std::string unknown) {
    search out;
    out.unknown = std::move(unknown);
    out.lower = s.lower;
    out.upper = s.upper;
    out.lower_path = s.lower_path;
    out.upper_path = s.upper_path;
    out.target = s.target_premium;
    return out;
}

// A lattice that cannot be built at a trial value (e.g. a tiny volatility far
// from the strike) is reported against the nearer bound, which is what to change.
double premium_or_fail(const search& s, double x) {
    try {
        return s.premium_at(x);
    } catch (const work_exhausted&) {
        throw;  // the budget, not this trial value
    } catch (const input_error& e) {
        const bool near_lower = s.lower > 0 ? std::fabs(std::log(x / s.lower)) <= std::fabs(std::log(s.upper / x))
                                            : x - s.lower <= s.upper - x;  // a smile's move may start below 0
        fail(near_lower ? s.lower_path : s.upper_path, "the lattice cannot price the trade at " + s.unknown + " " +
                                                           format_number(x) + " (" + e.what() +
                                                           "); narrow the search range");
    }
}

root_result run_search(const search& s, double spot) {
    root_options options;
    options.f_tolerance = finder_tolerance * spot;
    const root_result r =
        find_root([&](double x) { return premium_or_fail(s, x) - s.target; }, s.lower, s.upper, options);
    if (r.bracketed) return r;
    const double p_lower = r.f_lower + s.target, p_upper = r.f_upper + s.target;
    const bool too_high = s.target > std::max(p_lower, p_upper);
    // The end whose premium is nearest the target is the bound that stops the search.
    const bool lower_hit = too_high ? p_lower >= p_upper : p_lower <= p_upper;
    const double hit_premium = lower_hit ? p_lower : p_upper;
    fail(lower_hit ? s.lower_path : s.upper_path,
         "no solution: the " + std::string(too_high ? "highest" : "lowest") + " net premium in the search range is " +
             format_number(hit_premium) + " at the " + (lower_hit ? "lower" : "upper") + " bound " + s.unknown + " " +
             format_number(lower_hit ? s.lower : s.upper) + ", " + (too_high ? "below" : "above") + " the target " +
             format_number(s.target) + " (solve.target_premium); widen the range or check the target");
}

std::vector<solved_leg> price_legs(const market_data& m, const std::vector<option_leg>& legs,
                                   const lattice_settings& settings) {
    std::vector<solved_leg> out;
    for (const auto& leg : legs) out.push_back({leg, leg_premium(m, leg, settings), leg_volatility(m, leg).volatility});
    return out;
}

/// The no-arbitrage range of a single call or put premium (spot net of escrowed dividends).
struct premium_range {
    double lower = 0, upper = 0;
    std::string lower_reason, upper_reason;
};

std::optional<premium_range> option_premium_range(const trade& t) {
    if (t.legs.size() != 1) return std::nullopt;
    const option_leg& leg = t.legs.front();
    if (leg.type != payoff_kind::call && leg.type != payoff_kind::put) return std::nullopt;
    const market_data& m = t.market;
    const double forward_spot = (m.spot - m.dividend_pv(0, leg.expiry_years)) *
                                std::exp(-m.carry_average(0, leg.expiry_years) * leg.expiry_years);
    const double pv_strike = leg.strike * m.rate.discount(0, leg.expiry_years);
    const bool call = leg.type == payoff_kind::call;
    premium_range out;
    out.lower = std::max(0.0, call ? forward_spot - pv_strike : pv_strike - forward_spot);
    out.lower_reason =
        call ? "max(spot·e^(-carry·T) - strike·e^(-rate·T), 0)" : "max(strike·e^(-rate·T) - spot·e^(-carry·T), 0)";
    out.upper = call ? forward_spot : pv_strike;
    out.upper_reason = call ? "spot·e^(-carry·T): a call is never worth more than the share"
                            : "strike·e^(-rate·T): a put is never worth more than the strike paid at expiry";
    if (leg.exercise != exercise_style::european) {
        const double intrinsic = std::max(0.0, call ? m.spot - leg.strike : leg.strike - m.spot);
        if (intrinsic >= out.lower) {
            out.lower = intrinsic;
            out.lower_reason = call ? "intrinsic value max(spot - strike, 0)" : "intrinsic value max(strike - spot, 0)";
        }
        out.upper = call ? m.spot : leg.strike;
        out.upper_reason = call ? "spot: a call is never worth more than the share"
                                : "strike: a put is never worth more than its strike";
    }
    if (!m.dividends.empty()) out.lower_reason += ", spot net of dividends";
    return out;
}

// The market the volatility solve prices at `x`: the one volatility replaced, the whole smile
// moved in parallel by x, or (one leg) unchanged while that leg takes x as its own.
market_data volatility_market(const trade& t, const solve_settings& settings, double x) {
    market_data m = t.market;
    if (settings.one_leg) return m;
    if (m.smile) {
        m.smile_shift += x;
        m.volatility += x;
    } else {
        m.volatility = x;
    }
    return m;
}

std::string volatility_unknown(const trade& t, const solve_settings& settings) {
    if (settings.one_leg) return "legs[" + std::to_string(settings.leg) + "] volatility";
    return t.market.smile ? "parallel move of the smile" : "volatility";
}

solve_result solve_volatility(const trade& t, const solve_settings& settings) {
    solve_result out;
    out.solved_for = volatility_unknown(t, settings);
    search s = search_of(settings, out.solved_for);
    if (const auto range = option_premium_range(t)) {
        const std::string kind = to_string(t.legs.front().exercise) + " " + to_string(t.legs.front().type);
        if (!(s.target > range->lower))
            fail("solve.target_premium", format_number(s.target) +
                                             " is at or below the lowest premium any volatility gives the " + kind +
                                             ", " + format_number(range->lower) + " (" + range->lower_reason + ")");
        if (!(s.target < range->upper))
            fail("solve.target_premium", format_number(s.target) +
                                             " is at or above the no-arbitrage upper bound of the " + kind + ", " +
                                             format_number(range->upper) + " (" + range->upper_reason + ")");
    } else {
        out.notes.push_back(
            "the net premium of a structure or a digital need not rise with volatility; the solution "
            "found in the range is one of possibly several");
    }
    std::vector<option_leg> legs = t.legs;
    s.premium_at = [&](double x) {
        if (settings.one_leg) legs[settings.leg].volatility = x;
        return solver_net_premium(volatility_market(t, settings, x), legs, t.lattice);
    };
    out.root = run_search(s, t.market.spot);
    if (settings.one_leg) {
        legs[settings.leg].volatility = out.root.x;
        out.notes.push_back("the solution is legs[" + std::to_string(settings.leg) +
                            "]'s own volatility; the other legs keep theirs");
    } else if (t.market.smile) {
        out.notes.push_back(
            "the solution is a parallel move of the whole smile, in volatility (0.01 = one point): every leg's "
            "volatility moves by it (rows give each leg's volatility at the solution)");
    } else {
        out.notes.push_back("market.volatility in the file is not used; the solution replaces it");
    }
    out.solution = out.root.x;
    out.target_premium = s.target;
    out.legs = price_legs(volatility_market(t, settings, out.root.x), legs, t.lattice);
    return out;
}

// The solved strike on the strike_tick grid, and the cost left by rounding it.
rounded_strike round_solved_strike(const trade& t, std::vector<option_leg> legs, std::size_t index, double target) {
    rounded_strike out;
    out.strike = round_to_tick(legs[index].strike, *t.strike_tick);
    legs[index].strike = out.strike;
    out.premium = solver_net_premium(t.market, legs, t.lattice);
    out.residual = out.premium - target;
    out.legs = price_legs(t.market, legs, t.lattice);
    return out;
}

solve_result solve_strike(const trade& t, const solve_settings& settings) {
    solve_result out;
    const std::size_t index = settings.leg;
    const option_leg& chosen = t.legs[index];
    search s = search_of(settings, "strike of leg " + std::to_string(index));
    out.solved_for = "legs[" + std::to_string(index) + "] strike";
    std::vector<option_leg> legs = t.legs;
    s.premium_at = [&](double strike) {
        legs[index].strike = strike;
        return solver_net_premium(t.market, legs, t.lattice);
    };
    out.root = run_search(s, t.market.spot);
    legs[index].strike = out.root.x;

    // The solved strike may cross another leg's strike: the position then no
    // longer has the shape the trade was written as (e.g. a collar whose call
    // strike falls below its put strike).
    for (std::size_t j = 0; j < t.legs.size(); ++j) {
        if (j == index || t.legs[j].type == payoff_kind::stock) continue;
        const double before = chosen.strike - t.legs[j].strike, after = out.root.x - t.legs[j].strike;
        if ((before > 0) != (after > 0) || (before == 0) != (after == 0))
            out.notes.push_back("the solved strike " + format_number(out.root.x) + " is " +
                                (after > 0 ? "above" : "below") + " leg " + std::to_string(j) + "'s strike " +
                                format_number(t.legs[j].strike) +
                                ", unlike the trade as written; the legs no longer make the same shape");
    }
    if (t.market.smile) out.notes.push_back("each trial strike is priced at the smile's volatility for that strike");
    out.solution = out.root.x;
    out.target_premium = s.target;
    out.legs = price_legs(t.market, legs, t.lattice);
    if (t.strike_tick) {
        out.rounded = round_solved_strike(t, legs, index, s.target);
        out.notes.push_back("the solved strike rounds to " + format_number(out.rounded->strike) + " (strike_tick " +
                            format_number(*t.strike_tick) + "); there the trade costs " +
                            format_number(out.rounded->premium) + " per unit instead of " + format_number(s.target) +
                            " (rounded.residual)");
    }
    return out;
}

solve_result solve_quantity(const trade& t, const solve_settings& settings) {
    solve_result out;
    const double budget = settings.budget;
    const double premium = solver_net_premium(t.market, t.legs, t.lattice);
    if (!(premium > 0))
        fail("solve.budget", "the net premium per unit is " + format_number(premium) +
                                 " (the client does not pay premium), so a budget does not fix the quantity");
    const double quantity = budget / premium;
    if (quantity > max_quantity)
        fail("solve.budget",
             "buys " + format_number(quantity) + " units, more than the limit " + format_number(max_quantity));
    out.notes.push_back(
        "the premium is linear in the quantity: quantity = budget / net premium per unit, no iteration");
    out.solution = quantity;
    out.target_premium = budget / quantity;
    out.root.x = quantity;
    out.root.fx = quantity * premium - budget;
    out.root.iterations = 0;
    out.root.converged = true;
    out.legs = price_legs(t.market, t.legs, t.lattice);
    if (settings.lot_size) {
        const double lot = *settings.lot_size;
        const double lots = std::floor(quantity / lot * (1 + 1e-12));
        out.quantity_in_lots = lots * lot;
        out.premium_in_lots = lots * lot * premium;
        out.budget_left = budget - lots * lot * premium;
    }
    return out;
}

// Why the premium is not smooth enough near a solution, naming the cause the user can act on.
std::string why_not_smooth(const trade& t) {
    const auto digital = [](const option_leg& l) {
        return l.type == payoff_kind::digital_call || l.type == payoff_kind::digital_put;
    };
    if (std::any_of(t.legs.begin(), t.legs.end(), digital))
        return "a digital leg's premium changes sharply near its strike, so no input gives the target exactly; "
               "check the legs at the solution";
    if (std::any_of(t.legs.begin(), t.legs.end(), on_lattice) && t.lattice.method != lattice_method::leisen_reimer)
        return "the " + to_string(t.lattice.method) +
               " lattice's premium moves in small jumps as its nodes cross the strikes (at any number of "
               "steps); lattice.method \"leisen-reimer\" moves smoothly";
    return "the premium moves in small jumps near the solution at lattice.steps " + std::to_string(t.lattice.steps) +
           "; more steps make them smaller";
}

// The figures every solve reports: residual, evaluations, the position at the solution.
void report_figures(const trade& t, const solve_settings& settings, solve_result& out) {
    const bool for_quantity = settings.unknown == solve_unknown::quantity;
    out.quantity = for_quantity ? out.solution : t.quantity;
    out.residual = for_quantity ? out.root.fx / out.quantity : out.root.fx;
    out.notional = out.quantity * t.market.spot;
    out.residual_position = out.residual * out.quantity;
    out.evaluations = out.root.iterations + (for_quantity ? 1 : 2);
    out.premium_at_solution = out.target_premium + out.residual;
    out.position_premium = (t.client_sells ? -1.0 : 1.0) * out.quantity * out.premium_at_solution;
    out.within_tolerance = std::fabs(out.residual * out.quantity) <= target_tolerance * out.notional;
    if (!out.within_tolerance)
        out.notes.push_back("the residual is larger than 1e-8 of notional: " + why_not_smooth(t));
    out.pricing = pricing_label(t.legs);
}

}  // namespace

double solver_net_premium(const market_data& market, const std::vector<option_leg>& legs,
                          const lattice_settings& settings) {
    double total = 0;
    for (const auto& leg : legs) total += leg.quantity * leg_premium(market, leg, settings);
    return total;
}

volatility_range default_volatility_range(const trade& t, std::optional<std::size_t> leg) {
    const bool any_lattice = std::any_of(t.legs.begin(), t.legs.end(), on_lattice);
    const double floor = any_lattice ? 0.01 : min_volatility;
    if (leg) return {floor, highest_volatility(t.legs[*leg].expiry_years)};
    if (!t.market.smile) return {floor, highest_volatility(t.final_expiry_years())};
    // The parallel move that keeps every leg between the floor and its lattice's limit.
    volatility_range out{-1e300, 1e300};
    for (const auto& l : t.legs) {
        if (l.type == payoff_kind::stock) continue;
        const double v = leg_volatility(t.market, l).volatility;
        out.lower = std::max(out.lower, floor - v);
        out.upper = std::min(out.upper, highest_volatility(l.expiry_years) - v);
    }
    out.lower = std::ceil(out.lower * 1e8) / 1e8;  // tidy bounds for the result
    out.upper = std::floor(out.upper * 1e8) / 1e8;
    return out;
}

solve_result run_solve(const trade& t, const solve_settings& settings) {
    solve_result out = settings.unknown == solve_unknown::volatility ? solve_volatility(t, settings)
                       : settings.unknown == solve_unknown::strike   ? solve_strike(t, settings)
                                                                     : solve_quantity(t, settings);
    report_figures(t, settings, out);
    return out;
}

}  // namespace hedgeleaf
