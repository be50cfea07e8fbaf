// Hedgeleaf numerics: a leg's price from lattices of three sizes (see lattice_price.hpp).
#include "numerics/lattice_price.hpp"

#include "contract/errors.hpp"
#include "numerics/lattice.hpp"

#include <algorithm>
#include <cmath>
#include <optional>

namespace hedgeleaf {

namespace {

bool is_vanilla(payoff_kind k) { return k == payoff_kind::call || k == payoff_kind::put; }

bool on_equal_steps(const market_data& market, const option_leg& leg) { return leg_events(market, leg).empty(); }

bool early_may_pay(const market_data& market, const option_leg& leg) {
    return leg.exercise != exercise_style::european && early_exercise_can_pay(market, leg);
}

// k in error ~ c / n^k: Leisen-Reimer on equal steps converges at second order without early
// exercise (Leisen and Reimer 1996; digitals likewise, the strike being centred), at first
// order with it; the other lattices at first order for calls and puts and at order one half
// for digitals (the payout jumps between nodes one spacing, ~ 1/sqrt(n), apart).
double convergence_order(lattice_method method, const market_data& market, const option_leg& leg) {
    if (method == lattice_method::leisen_reimer && on_equal_steps(market, leg))
        return early_may_pay(market, leg) ? 1.0 : 2.0;
    return is_vanilla(leg.type) ? 1.0 : 0.5;
}

// Richardson: the value at infinitely many steps from two levels with error c / n^k.
double richardson(double fine, int n_fine, double coarse, int n_coarse, double k) {
    const double a = std::pow(static_cast<double>(n_fine), k);
    const double b = std::pow(static_cast<double>(n_coarse), k);
    const double w = a / (a - b);
    return w * fine + (1 - w) * coarse;
}

// c / n_a^k from the values at two other levels b and c (either may be a itself).
double error_at(int n_a, double v_b, int n_b, double v_c, int n_c, double k) {
    const double ratio_b = std::pow(static_cast<double>(n_a) / n_b, k);
    const double ratio_c = std::pow(static_cast<double>(n_a) / n_c, k);
    return std::fabs((v_b - v_c) / (ratio_b - ratio_c));
}

// An induction at a level below the fine one, or nothing if that lattice cannot be built.
std::optional<induction_result> try_induce(const market_data& market, const option_leg& leg, lattice_method method,
                                           int steps) {
    try {
        return induce(market, leg, method, steps);
    } catch (const work_exhausted&) {
        throw;  // the budget, not this level
    } catch (const input_error&) {
        return std::nullopt;
    }
}

std::string range_text(const premium_bounds& b) {
    // appended, not "[" + ...: GCC 12 warns falsely (-Wrestrict) on a literal + temporary at -O3
    std::string text = "[";
    text += format_number(b.lower);
    text += ", ";
    text += format_number(b.upper);
    text += "]";
    return text;
}

// The fine lattice, the levels the error bound and the extrapolation use, and the price.
struct levels {
    int n[3] = {0, 0, 0};
    induction_result r[3];
    bool below = false;  // levels 1 and 2 have fewer steps than level 0
};

levels build_levels(const market_data& market, const option_leg& leg, lattice_method method, int fine, bool need_second,
                    bool need_third) {
    levels out;
    out.n[0] = effective_steps(method, fine);
    out.r[0] = induce(market, leg, method, out.n[0]);
    out.n[0] = out.r[0].steps;
    if (!need_second) return out;
    const int half = effective_steps(method, std::max(1, out.n[0] / 2));
    const int quarter = effective_steps(method, std::max(1, out.n[0] / 4));
    if (half < out.n[0] && (!need_third || quarter < half)) {
        const auto second = try_induce(market, leg, method, half);
        const auto third = need_third ? try_induce(market, leg, method, quarter) : std::nullopt;
        // Exercise and dividend dates each need a step: a smaller lattice may come back with as
        // many steps as the fine one (100 dates on 101 steps), which says nothing about the error.
        const bool smaller = second && second->steps < out.n[0] && (!third || third->steps < second->steps);
        if (smaller && (third || !need_third)) {
            out.n[1] = second->steps;
            out.r[1] = *second;
            if (third) {
                out.n[2] = third->steps;
                out.r[2] = *third;
            }
            out.below = true;
            return out;
        }
    }
    // Too few steps for smaller lattices, or they break no-arbitrage: compare with larger ones.
    out.r[1] = induce(market, leg, method, effective_steps(method, 2 * out.n[0]));
    out.n[1] = out.r[1].steps;
    if (need_third) {
        out.r[2] = induce(market, leg, method, effective_steps(method, 4 * out.n[0]));
        out.n[2] = out.r[2].steps;
    }
    return out;
}

void take_greeks(const induction_result& r, lattice_price& out) {
    out.sensitivities.delta = r.delta;
    out.sensitivities.gamma = r.gamma;
    out.sensitivities.theta = r.theta;
}

// Why a leg is not extrapolated although the settings ask for it.
std::string why_not_extrapolated(lattice_method method, const market_data& market, const option_leg& leg) {
    if (!on_equal_steps(market, leg))
        return "not extrapolated: the steps differ in length so that exercise and dividend dates fall on steps, "
               "and the error of such a lattice oscillates with the step count; on such steps every lattice.method "
               "builds the same lattice (one node spacing, each step's probability from its length), so " +
               to_string(method) + " names the settings, not the lattice";
    return "not extrapolated: the error of a " + to_string(method) +
           " lattice oscillates with the step count and Richardson extrapolation makes it larger (it helps "
           "leisen-reimer lattices)";
}

lattice_price price_without_bumps(const market_data& market, const option_leg& leg, const lattice_settings& settings,
                                  error_bound bound) {
    lattice_price out;
    if (leg.type == payoff_kind::stock) {
        out.premium = market.spot;
        out.sensitivities.delta = 1;
        return out;
    }
    // Inputs are held to max_spread when read; bumps and scenario shifts may go a little past it,
    // and up to about 26 the lattice still holds every spot that matters.
    if (market.volatility * std::sqrt(leg.expiry_years) > 1.25 * max_spread)
        fail("market.volatility", format_number(market.volatility) + " over " + format_number(leg.expiry_years) +
                                      " years spreads spot too wide for the lattice (volatility x sqrt(expiry) above " +
                                      format_number(1.25 * max_spread) + ")");
    const lattice_method method = settings.method;
    const bool helps = extrapolation_helps(method, market, leg);
    const bool extrapolate = settings.extrapolate && helps;
    const bool estimate = bound == error_bound::on;
    const int fine = settings.steps > 0 ? settings.steps : default_steps(method);
    const levels lv = build_levels(market, leg, method, fine, extrapolate || estimate, estimate);
    const double k = convergence_order(method, market, leg);
    const induction_result& f = lv.r[0];
    out.steps = lv.n[0];
    out.segments = f.segments;
    out.premium = f.value;
    take_greeks(f, out);
    // (said also when extrapolation was not asked for: the method given is not the lattice's)
    if ((settings.extrapolate && !helps) || !on_equal_steps(market, leg))
        out.notes.push_back(why_not_extrapolated(method, market, leg));
    const premium_bounds range = no_arbitrage_bounds(market, leg);
    if (extrapolate && !lv.below) {
        out.notes.push_back("not extrapolated: lattice.steps " + std::to_string(lv.n[0]) +
                            " leaves too few steps for a second, smaller lattice");
    } else if (extrapolate) {
        const double w = std::pow(static_cast<double>(lv.n[0]), k) /
                         (std::pow(static_cast<double>(lv.n[0]), k) - std::pow(static_cast<double>(lv.n[1]), k));
        const auto mix = [w](double a, double b) { return w * a + (1 - w) * b; };
        const double value = mix(f.value, lv.r[1].value);
        const double slack = 1e-12 * (range.upper - range.lower + std::fabs(range.upper));
        if (value >= range.lower - slack && value <= range.upper + slack) {
            out.premium = value;
            out.sensitivities.delta = mix(f.delta, lv.r[1].delta);
            out.sensitivities.gamma = mix(f.gamma, lv.r[1].gamma);
            out.sensitivities.theta = mix(f.theta, lv.r[1].theta);
            out.coarse_steps = lv.n[1];
            out.extrapolated = true;
        } else {
            out.notes.push_back("not extrapolated: the extrapolated premium " + format_number(value) +
                                " leaves the no-arbitrage range " + range_text(range) +
                                "; the fine lattice's premium is shown");
        }
    }
    // Rounding may carry a lattice value an ulp past a bound; a premium never is.
    out.premium = std::clamp(out.premium, range.lower, range.upper);
    if (estimate) {
        out.estimate_steps = {lv.n[1], lv.n[2]};
        double largest;
        if (out.extrapolated) {
            // The extrapolation one level down, against this one.
            largest = std::fabs(out.premium - richardson(lv.r[1].value, lv.n[1], lv.r[2].value, lv.n[2], k));
            // With an exercise boundary the error falls unevenly and one level down says too little
            // (the bound covered 90-92 % of the coverage benchmark's American cases): the step the
            // extrapolation took from the fine lattice bounds it as well.
            if (early_may_pay(market, leg)) largest = std::max(largest, std::fabs(out.premium - f.value));
        } else {
            const double v0 = f.value, v1 = lv.r[1].value, v2 = lv.r[2].value;
            largest = std::max({error_at(lv.n[0], v1, lv.n[1], v0, lv.n[0], k),
                                error_at(lv.n[0], v2, lv.n[2], v0, lv.n[0], k),
                                error_at(lv.n[0], v1, lv.n[1], v2, lv.n[2], k)});
        }
        // Rounding of the induction itself: a few parts in 1e13 of the payoff's scale.
        const double rounding = 1e-12 * std::max({market.spot, leg.strike, leg.payout});
        out.error_estimate = error_safety * largest + rounding;
    }
    if (lv.n[0] < min_steps_for_greeks)
        out.notes.push_back("lattice.steps " + std::to_string(lv.n[0]) +
                            ": delta, gamma, theta and the error estimate from so few steps are rough" +
                            (lv.n[0] < 2 ? " (gamma needs two steps and is shown as 0)" : "") +
                            "; use 50 steps or more for sensitivities");
    return out;
}

// A digital's value turns on the scale of its volatility: bump by a fraction of it.
double vega_bump_for(const market_data& market, const option_leg& leg) {
    const double h = std::min(vega_bump, 0.5 * market.volatility);
    if (is_vanilla(leg.type)) return h;
    return std::min(h, digital_vega_bump_fraction * market.volatility);
}

// Vega and rho by central differences; where one side of a bump leaves the lattice's
// no-arbitrage region (a tiny volatility beside a large rate gap), a one-sided difference
// from the price already known. The typed inputs were priced before, so any refusal
// here is the bump's, never the user's.
void add_bumped_greeks(const market_data& market, const option_leg& leg, const lattice_settings& settings,
                       lattice_price& out) {
    const auto premium_with = [&](double vol, const curve& rate) -> std::optional<double> {
        market_data m = market;
        m.volatility = vol;
        m.rate = rate;
        try {
            return price_without_bumps(m, leg, settings, error_bound::off).premium;
        } catch (const work_exhausted&) {
            throw;  // the budget, not this trial value
        } catch (const input_error&) {
            return std::nullopt;
        }
    };
    const auto slope = [&](std::optional<double> up, std::optional<double> down, double h) {
        if (up && down) return (*up - *down) / (2 * h);
        if (up) return (*up - out.premium) / h;
        if (down) return (out.premium - *down) / h;
        fail("market.volatility",
             "the lattice cannot be bumped on either side of these inputs to measure vega and rho; "
             "raise the volatility or lattice.steps");
    };
    const double hv = vega_bump_for(market, leg);
    out.sensitivities.vega =
        slope(premium_with(market.volatility + hv, market.rate), premium_with(market.volatility - hv, market.rate), hv);
    // rho: the whole rate curve moved in parallel.
    out.sensitivities.rho = slope(premium_with(market.volatility, market.rate.shifted(rho_bump)),
                                  premium_with(market.volatility, market.rate.shifted(-rho_bump)), rho_bump);
}

// The largest discount factor to any time in [0, T] of the rate (or of the carry: carry yield
// plus borrow): 1 unless a forward is negative. log discount is linear between curve points.
double largest_discount(const market_data& m, double T, bool carry) {
    const auto log_discount = [&](double t) {
        return carry ? -(m.carry_yield.integral(t) + m.borrow.integral(t)) : -m.rate.integral(t);
    };
    double most = std::max(0.0, log_discount(T));
    for (const curve* c : {&m.rate, &m.carry_yield, &m.borrow})
        for (double t : c->years())
            if (t < T) most = std::max(most, log_discount(t));
    return std::exp(most);
}

}  // namespace

premium_bounds no_arbitrage_bounds(const market_data& m, const option_leg& leg) {
    const double T = leg.expiry_years;
    const double pv = m.dividend_pv(0, T);
    const double forward_value = (m.spot - pv) * std::exp(-m.carry_average(0, T) * T);  // S* e^-qT
    const double strike_value = leg.strike * m.rate.discount(0, T);                     // K e^-rT
    const bool early = leg.exercise != exercise_style::european;
    const bool now = leg.exercise == exercise_style::american;  // may be exercised today
    switch (leg.type) {
        case payoff_kind::call: {
            double lower = std::max(0.0, forward_value - strike_value);
            if (now) lower = std::max(lower, m.spot - leg.strike);
            const double upper = early ? (m.spot - pv) * largest_discount(m, T, true) + pv : forward_value;
            return {lower, upper};
        }
        case payoff_kind::put: {
            double lower = std::max(0.0, strike_value - forward_value);
            if (now) lower = std::max(lower, leg.strike - m.spot);
            const double upper = early ? leg.strike * largest_discount(m, T, false) : strike_value;
            return {lower, upper};
        }
        case payoff_kind::digital_call:
        case payoff_kind::digital_put: return {0.0, leg.payout * m.rate.discount(0, T)};
        case payoff_kind::stock: return {m.spot, m.spot};
    }
    return {0.0, 0.0};
}

bool extrapolation_helps(lattice_method method, const market_data& market, const option_leg& leg) {
    return method == lattice_method::leisen_reimer && leg.type != payoff_kind::stock && on_equal_steps(market, leg);
}

lattice_price price_leg(const market_data& market, const option_leg& leg, const lattice_settings& settings,
                        bumped_greeks bumps, error_bound bound) {
    lattice_price out = price_without_bumps(market, leg, settings, bound);
    if (bumps == bumped_greeks::off || leg.type == payoff_kind::stock) return out;
    add_bumped_greeks(market, leg, settings, out);
    // A digital's payout jumps at the strike: on a lattice that does not centre it, a bump of the
    // volatility or the rate moves nodes across the strike and the difference is mostly that jump.
    if (!is_vanilla(leg.type) && settings.method != lattice_method::leisen_reimer)
        out.notes.push_back("vega and rho of a digital on a " + to_string(settings.method) +
                            " lattice turn on where the strike falls between nodes and may even have the wrong "
                            "sign; leisen-reimer (the default) centres the strike and gives them smoothly");
    return out;
}

}  // namespace hedgeleaf
