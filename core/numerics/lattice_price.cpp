// Hedgeleaf numerics: a leg's price from two lattices (see lattice_price.hpp).
#include "numerics/lattice_price.hpp"

#include "contract/errors.hpp"
#include "numerics/lattice.hpp"

#include <algorithm>
#include <cmath>
#include <optional>

namespace hedgeleaf {

namespace {

bool is_vanilla(payoff_kind k) { return k == payoff_kind::call || k == payoff_kind::put; }

struct richardson {
    double weight_fine;  // extrapolated = w * fine + (1 - w) * coarse
};

richardson weights(int fine, int coarse, int order) {
    const double a = std::pow(static_cast<double>(fine), order);
    const double b = std::pow(static_cast<double>(coarse), order);
    return {a / (a - b)};
}

lattice_price price_without_bumps(const market_data& market, const option_leg& leg, const lattice_settings& settings) {
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
    const int fine = effective_steps(method, settings.steps > 0 ? settings.steps : default_steps(method));
    int coarse = effective_steps(method, std::max(1, fine / 2));
    if (method == lattice_method::leisen_reimer && coarse >= fine) coarse = fine + 2;  // fine == 1
    if (coarse >= fine && method != lattice_method::leisen_reimer) coarse = fine + 1;
    const bool can_extrapolate = coarse < fine;

    const induction_result f = induce(market, leg, method, fine);
    const induction_result c = induce(market, leg, method, coarse);
    // Leisen-Reimer converges at second order for European vanillas; early
    // exercise and digitals bring first-order terms.
    const bool early_may_pay = leg.exercise != exercise_style::european && early_exercise_can_pay(market, leg);
    const int order = (method == lattice_method::leisen_reimer && !early_may_pay && is_vanilla(leg.type)) ? 2 : 1;
    out.steps = fine;
    out.coarse_steps = coarse;
    if (settings.extrapolate && can_extrapolate) {
        const double w = weights(fine, coarse, order).weight_fine;
        const auto mix = [w](double a, double b) { return w * a + (1 - w) * b; };
        out.premium = mix(f.value, c.value);
        out.sensitivities.delta = mix(f.delta, c.delta);
        out.sensitivities.gamma = mix(f.gamma, c.gamma);
        out.sensitivities.theta = mix(f.theta, c.theta);
        out.error_estimate = std::fabs(out.premium - f.value);
        out.extrapolated = true;
    } else {
        out.premium = f.value;
        out.sensitivities.delta = f.delta;
        out.sensitivities.gamma = f.gamma;
        out.sensitivities.theta = f.theta;
        if (can_extrapolate) {
            const double w = weights(fine, coarse, order).weight_fine;
            out.error_estimate = std::fabs((w - 1) * (f.value - c.value));
        } else {
            out.error_estimate = std::fabs(f.value - c.value);
        }
    }
    return out;
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
            return price_without_bumps(m, leg, settings).premium;
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
    const double hv = std::min(vega_bump, 0.5 * market.volatility);
    out.sensitivities.vega =
        slope(premium_with(market.volatility + hv, market.rate), premium_with(market.volatility - hv, market.rate), hv);
    // rho: the whole rate curve moved in parallel.
    out.sensitivities.rho = slope(premium_with(market.volatility, market.rate.shifted(rho_bump)),
                                  premium_with(market.volatility, market.rate.shifted(-rho_bump)), rho_bump);
}

}  // namespace

lattice_price price_leg(const market_data& market, const option_leg& leg, const lattice_settings& settings,
                        bumped_greeks bumps) {
    lattice_price out = price_without_bumps(market, leg, settings);
    if (bumps == bumped_greeks::off || leg.type == payoff_kind::stock) return out;
    add_bumped_greeks(market, leg, settings, out);
    return out;
}

}  // namespace hedgeleaf
