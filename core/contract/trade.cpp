// Hedgeleaf contract: the trade's own arithmetic and the words for its enums (see trade.hpp).
#include "contract/trade.hpp"

#include "contract/errors.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

bool operator==(const market_data& a, const market_data& b) {
    // Field by field (a defaulted comparison would compare the smile's pointer, not its grid);
    // a field added to market_data belongs here too.
    const bool same_smile = a.smile == b.smile || (a.smile && b.smile && *a.smile == *b.smile);
    return same_smile && a.spot == b.spot && a.volatility == b.volatility && a.rate == b.rate &&
           a.carry_yield == b.carry_yield && a.borrow == b.borrow && a.dividends == b.dividends &&
           a.smile_spot == b.smile_spot && a.smile_shift == b.smile_shift && a.as_of == b.as_of &&
           a.underlying == b.underlying;
}

double market_data::dividend_pv(double from_years, double until_years) const {
    double pv = 0;
    for (const auto& d : dividends)
        if (d.years > from_years && d.years <= until_years) pv += d.amount * rate.discount(from_years, d.years);
    return pv;
}

market_data market_data::seen_at(double years) const {
    market_data out = *this;
    out.rate = rate.seen_from(years);
    out.carry_yield = carry_yield.seen_from(years);
    out.borrow = borrow.seen_from(years);
    out.dividends.clear();
    for (const auto& d : dividends)
        if (d.years > years) out.dividends.push_back({d.years - years, d.amount});
    return out;
}

double market_data::carry_average(double from_years, double to_years) const {
    return carry_yield.average(from_years, to_years) + borrow.average(from_years, to_years);
}

double market_data::carry_forward_at(double years) const {
    return carry_yield.forward_at(years) + borrow.forward_at(years);
}

double market_data::forward_growth(double from_years, double to_years) const {
    if (flat_rates())
        return std::exp((rate.first_rate() - carry_yield.first_rate() - borrow.first_rate()) * (to_years - from_years));
    return rate.growth(from_years, to_years) /
           (carry_yield.growth(from_years, to_years) * borrow.growth(from_years, to_years));
}

double market_data::forward(double years, double from_spot) const {
    return (from_spot - dividend_pv(0, years)) * forward_growth(0, years);
}

smile_point market_data::volatility_at(double strike, double years) const {
    if (!smile) return {volatility};
    const smile_grid& g = smile->grid();
    double x = strike;  // absolute strikes: fixed in price while the smile's spot is today's
    if (g.basis == strike_basis::percent_of_spot)
        x = 100 * strike / smile_spot;
    else if (g.basis == strike_basis::percent_of_forward)
        x = 100 * strike / forward(years, smile_spot);
    else
        x = strike * (g.spot / smile_spot);
    smile_point p = smile->at(x, years);
    p.volatility += smile_shift;
    return p;
}

double highest_volatility(double years) {
    // rounded down to 4 decimals so that the limit is the number the messages show
    return years > 0 ? std::min(max_volatility, std::floor(max_spread / std::sqrt(years) * 1e4) / 1e4) : max_volatility;
}

void require_spread(double volatility, double years, const std::string& path) {
    if (volatility <= highest_volatility(years) * (1 + 1e-12)) return;
    fail(path, format_number(volatility) + " over " + format_number(years) +
                   " years spreads spot too wide for the lattice (volatility x sqrt(expiry) = " +
                   format_number(std::round(volatility * std::sqrt(years) * 100) / 100) + ", at most " +
                   format_number(max_spread) + "); for this expiry use a volatility of at most " +
                   format_number(highest_volatility(years)));
}

double trade::final_expiry_years() const {
    double t = 0;
    for (const auto& leg : legs) t = std::max(t, leg.expiry_years);
    return t;
}

std::string to_string(payoff_kind k) { return word_of(leg_types, k); }
std::string to_string(exercise_style e) { return word_of(exercise_styles, e); }
std::string to_string(lattice_method m) { return word_of(lattice_methods, m); }
payoff_kind parse_payoff_kind(const std::string& text) { return enum_of<payoff_kind>(leg_types, text); }
exercise_style parse_exercise_style(const std::string& text) { return enum_of<exercise_style>(exercise_styles, text); }
lattice_method parse_lattice_method(const std::string& text) { return enum_of<lattice_method>(lattice_methods, text); }

}  // namespace hedgeleaf
