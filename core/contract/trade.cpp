// Hedgeleaf contract: the trade's own arithmetic and the words for its enums (see trade.hpp).
#include "contract/trade.hpp"

#include "contract/errors.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

double market_data::dividend_pv(double from_years, double until_years) const {
    double pv = 0;
    for (const auto& d : dividends)
        if (d.years > from_years && d.years <= until_years) pv += d.amount * std::exp(-rate * (d.years - from_years));
    return pv;
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

std::string to_string(payoff_kind k) {
    switch (k) {
        case payoff_kind::call: return "call";
        case payoff_kind::put: return "put";
        case payoff_kind::digital_call: return "digital-call";
        case payoff_kind::digital_put: return "digital-put";
        case payoff_kind::stock: return "stock";
    }
    return "call";
}

std::string to_string(exercise_style e) {
    switch (e) {
        case exercise_style::european: return "european";
        case exercise_style::american: return "american";
        case exercise_style::bermudan: return "bermudan";
    }
    return "european";
}

std::string to_string(lattice_method m) {
    switch (m) {
        case lattice_method::crr: return "crr";
        case lattice_method::jarrow_rudd: return "jarrow-rudd";
        case lattice_method::tian: return "tian";
        case lattice_method::leisen_reimer: return "leisen-reimer";
    }
    return "leisen-reimer";
}

payoff_kind parse_payoff_kind(const std::string& text) {
    if (text == "call") return payoff_kind::call;
    if (text == "put") return payoff_kind::put;
    if (text == "digital-call") return payoff_kind::digital_call;
    if (text == "digital-put") return payoff_kind::digital_put;
    return payoff_kind::stock;
}

exercise_style parse_exercise_style(const std::string& text) {
    if (text == "american") return exercise_style::american;
    if (text == "bermudan") return exercise_style::bermudan;
    return exercise_style::european;
}

lattice_method parse_lattice_method(const std::string& text) {
    if (text == "crr") return lattice_method::crr;
    if (text == "jarrow-rudd") return lattice_method::jarrow_rudd;
    if (text == "tian") return lattice_method::tian;
    return lattice_method::leisen_reimer;
}

}  // namespace hedgeleaf
