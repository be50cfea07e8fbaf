// Hedgeleaf numerics: generalised Black-Scholes-Merton with a carry yield.
//
// European call, put and cash-or-nothing digitals on spot minus the present
// value of cash dividends before expiry (escrowed-dividend convention).
#pragma once

#include "contract/trade.hpp"

namespace hedgeleaf {

/// Sensitivities per unit. Conventions (docs/replication.md, sensitivities):
/// delta dV/dS; gamma d2V/dS2; theta dV/dt per year as calendar time passes
/// (negative = decay); vega dV/dsigma per 1.00 of volatility; rho dV/dr per
/// 1.00 of rate with carry_yield held fixed.
struct greeks {
    double delta = 0;
    double gamma = 0;
    double theta = 0;
    double vega = 0;
    double rho = 0;
};

greeks operator*(double scale, const greeks& g);
greeks operator+(const greeks& a, const greeks& b);

struct valuation {
    double premium = 0;
    greeks sensitivities;
};

/// Standard normal cumulative distribution.
double normal_cdf(double x);
/// Standard normal density.
double normal_pdf(double x);

/// Closed-form value and analytic Greeks of one leg treated as European
/// (American and Bermudan legs get their European reference). A stock leg is
/// worth spot with delta 1.
valuation closed_form(const market_data& market, const option_leg& leg);

}  // namespace hedgeleaf
