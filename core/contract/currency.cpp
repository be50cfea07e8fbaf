// Hedgeleaf contract: currency pairs, their dates and money-market rates (see currency.hpp).
#include "contract/currency.hpp"

#include "contract/limits.hpp"

#include <cmath>

namespace hedgeleaf {

bool is_currency_code(const std::string& code) {
    if (code.size() != 3) return false;
    for (char c : code)
        if (c < 'A' || c > 'Z') return false;
    return true;
}

double default_pip_size(const std::string& quote_currency) { return quote_currency == "JPY" ? 0.01 : 0.0001; }

int default_spot_lag(const std::string& base, const std::string& quote) {
    const bool usd_cad = (base == "USD" && quote == "CAD") || (base == "CAD" && quote == "USD");
    return usd_cad ? 1 : default_spot_lag_days;
}

date add_business_days(const date& d, int count) {
    date out = d;
    for (int moved = 0; moved < count;) {
        out = add_days(out, 1);
        if (is_business_day(out)) ++moved;
    }
    return out;
}

currency_dates settle_dates(const date& trade, const date& expiry, int spot_lag_days) {
    currency_dates out;
    out.trade = trade;
    out.spot = add_business_days(trade, spot_lag_days);
    out.expiry = expiry;
    out.delivery = add_business_days(expiry, spot_lag_days);
    out.premium = out.spot;
    return out;
}

double growth_over(const quoted_rate& q, long days) {
    const double fraction = static_cast<double>(days) / (q.basis == day_count::act_360 ? 360.0 : 365.0);
    switch (q.compounds) {
        case compounding::simple: return 1 + q.rate * fraction;
        case compounding::annual: return std::pow(1 + q.rate, fraction);
        case compounding::continuous: return std::exp(q.rate * fraction);
    }
    return 1;
}

double continuous_act365f(const quoted_rate& q, long days) {
    // ln(growth) x 365 / days, written so that no digits are lost to a growth near 1.
    const double basis = q.basis == day_count::act_360 ? 360.0 : 365.0;
    switch (q.compounds) {
        case compounding::simple: return std::log1p(q.rate * static_cast<double>(days) / basis) * 365.0 / days;
        case compounding::annual: return std::log1p(q.rate) * 365.0 / basis;
        case compounding::continuous: return q.rate * 365.0 / basis;
    }
    return q.rate;
}

std::string to_string(day_count d) { return word_of(day_counts, d); }
std::string to_string(compounding c) { return word_of(compoundings, c); }
std::string to_string(premium_convention p) { return word_of(premium_conventions, p); }
std::string to_string(delta_convention d) { return word_of(delta_conventions, d); }

}  // namespace hedgeleaf
