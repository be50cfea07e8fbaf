// Hedgeleaf numerics: closed-form European values (see closed_form.hpp).
#include "numerics/closed_form.hpp"

#include <cmath>

namespace hedgeleaf {

greeks operator*(double s, const greeks& g) { return {s * g.delta, s * g.gamma, s * g.theta, s * g.vega, s * g.rho}; }
greeks operator+(const greeks& a, const greeks& b) {
    return {a.delta + b.delta, a.gamma + b.gamma, a.theta + b.theta, a.vega + b.vega, a.rho + b.rho};
}

double normal_cdf(double x) { return 0.5 * std::erfc(-x / std::sqrt(2.0)); }
double normal_pdf(double x) { return std::exp(-0.5 * x * x) / std::sqrt(2.0 * M_PI); }

valuation closed_form(const market_data& m, const option_leg& leg) {
    if (leg.type == payoff_kind::stock) return {m.spot, {1, 0, 0, 0, 0}};

    const double T = leg.expiry_years;
    const double K = leg.strike;
    // With term structures, the rate and the carry averaged over the option's life: a
    // European option under deterministic rates depends on them only through those averages.
    const double r = m.rate.average(0, T);
    const double q = m.carry_average(0, T);
    const double sigma = m.volatility;
    // Escrowed dividends: the diffusing part of spot.
    double pv = 0, pv_time = 0;  // PV and sum of t_i * PV_i (for rho)
    for (const auto& d : m.dividends)
        if (d.years > 0 && d.years <= T) {
            const double pvi = d.amount * m.rate.discount(0, d.years);
            pv += pvi;
            pv_time += d.years * pvi;
        }
    const double S = m.spot - pv;
    const double sqrt_t = std::sqrt(T);
    const double vol_t = sigma * sqrt_t;
    const double d1 = (std::log(S / K) + (r - q + 0.5 * sigma * sigma) * T) / vol_t;
    const double d2 = d1 - vol_t;
    const double df_r = std::exp(-r * T);
    const double df_q = std::exp(-q * T);

    valuation v;
    greeks& g = v.sensitivities;
    switch (leg.type) {
        case payoff_kind::call:
        case payoff_kind::put: {
            const double w = leg.type == payoff_kind::call ? 1.0 : -1.0;
            const double nd1 = normal_cdf(w * d1), nd2 = normal_cdf(w * d2);
            v.premium = w * (S * df_q * nd1 - K * df_r * nd2);
            g.delta = w * df_q * nd1;
            g.gamma = df_q * normal_pdf(d1) / (S * vol_t);
            g.vega = S * df_q * normal_pdf(d1) * sqrt_t;
            g.theta = -S * df_q * normal_pdf(d1) * sigma / (2 * sqrt_t) + w * (q * S * df_q * nd1 - r * K * df_r * nd2);
            g.rho = w * K * T * df_r * nd2;
            break;
        }
        case payoff_kind::digital_call:
        case payoff_kind::digital_put: {
            const double w = leg.type == payoff_kind::digital_call ? 1.0 : -1.0;
            const double Q = leg.payout * df_r;
            const double n2 = normal_pdf(d2);
            v.premium = Q * normal_cdf(w * d2);
            g.delta = w * Q * n2 / (S * vol_t);
            g.gamma = -w * Q * n2 * d1 / (S * S * sigma * sigma * T);
            g.vega = -w * Q * n2 * d1 / sigma;
            const double dd2_dT = (d2 - 2 * std::log(S / K) / vol_t) / (2 * T);
            g.theta = r * v.premium - w * Q * n2 * dd2_dT;
            g.rho = -T * v.premium + w * Q * n2 * sqrt_t / sigma;
            break;
        }
        case payoff_kind::stock: break;
    }
    // Dividends: S' = spot - PV(D) moves with the rate and with the passage of time.
    g.rho += g.delta * pv_time;
    g.theta -= g.delta * r * pv;
    // Theta is dV/dt as calendar time passes, spot held and the curves fixed in calendar time.
    // V = exp(-R) f(S' exp(R - Y), sigma^2 tau) with R and Y the rate's and the carry's integrals
    // over the option's remaining life, so dV/dt = -r0 dV/dR - q0 dV/dY + ... with r0 and q0 the
    // forwards at the valuation date, where the lines above used the averages r and q (exact for
    // flat rates, where they are equal): dV/dR = V - delta S', dV/dY = -delta S', and the
    // dividends' present value grows at r0. The difference, added here, is zero for flat rates.
    const double r0 = m.rate.forward_at(0);
    const double q0 = m.carry_forward_at(0);
    if (r0 != r || q0 != q) g.theta += (r0 - r) * (v.premium - g.delta * m.spot) + (q0 - q) * g.delta * S;
    return v;
}

}  // namespace hedgeleaf
