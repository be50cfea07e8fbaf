// Hedgeleaf contract: the trade and its market as typed values (no JSON here).
//
// Units: spot and strike in price units; volatility, rates and yields are
// decimals per year (0.25 = 25 %), rates continuously compounded zero rates
// (contract/curve.hpp); times are years from valuation (ACT/365F from
// valuation_date when dates are given).
// A time measured from valuation is named *_years throughout the C++.
#pragma once

#include "contract/currency.hpp"
#include "contract/curve.hpp"
#include "contract/dates.hpp"
#include "contract/limits.hpp"
#include "contract/smile.hpp"

#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

// In the order of their words in contract/limits.hpp (leg_types, exercise_styles, lattice_methods).
enum class payoff_kind { call, put, digital_call, digital_put, stock };
enum class exercise_style { european, american, bermudan };
enum class lattice_method { crr, jarrow_rudd, tian, leisen_reimer };

/// A discrete cash dividend (escrowed-dividend model).
struct dividend {
    double years = 0;   ///< paid this many years from valuation
    double amount = 0;  ///< cash per share

    friend bool operator==(const dividend&, const dividend&) = default;
};

struct market_data {
    double spot = 0;
    /// Decimal, annualised. Given as one number: every leg's volatility. With a smile: the one
    /// volatility of a lattice shared by all legs (analytics/leg_market.hpp, shared_volatility).
    double volatility = 0;
    curve rate;         ///< interest rate of the price currency
    curve carry_yield;  ///< continuous dividend yield, or the foreign rate
    curve borrow;       ///< stock-loan fee: lowers the share's forward like a yield
    std::vector<dividend> dividends;
    /// Implied volatilities by expiry and strike; none when `volatility` was given as a number.
    std::shared_ptr<const volatility_smile> smile;
    /// The spot the smile's strikes are measured from: today's spot (sticky strike); a scenario
    /// that moves the smile with spot (sticky moneyness) sets its own spot here.
    double smile_spot = 0;
    /// A parallel move of the whole smile, in volatility (0.01 = one point): scenarios, margins.
    double smile_shift = 0;
    std::string as_of;       ///< when the market was taken, ISO 8601 date-time ("" = not given)
    std::string underlying;  ///< the share's name, plain text ("" = not given)

    /// Present value at `from_years` of the cash dividends paid in (from_years, until_years].
    double dividend_pv(double from_years, double until_years) const;
    /// Average of carry_yield + borrow over (from, to]: what holding the share earns
    /// instead of the rate (the q of the generalised Black-Scholes-Merton formula).
    double carry_average(double from_years, double to_years) const;
    /// carry_yield + borrow as a forward rate at `years` (curve::forward_at of each).
    double carry_forward_at(double years) const;
    /// What the share's forward (net of cash dividends) grows by over (from, to]:
    /// exp of the integral of rate - carry_yield - borrow.
    double forward_growth(double from_years, double to_years) const;
    /// The market as seen `years` from now at the same spot: dividends paid by then dropped,
    /// the rest and the curves' times measured from then.
    market_data seen_at(double years) const;
    /// True when rate, carry_yield and borrow are each one number.
    bool flat_rates() const { return rate.is_flat() && carry_yield.is_flat() && borrow.is_flat(); }
    /// One volatility, one rate, one yield and no borrow: the market of every trade file
    /// written before smiles and curves (its results keep their old shape).
    bool is_plain() const { return !smile && flat_rates() && borrow.is_zero(); }
    /// The forward price for delivery `years` from now if spot were `from_spot`: spot net of
    /// the cash dividends paid by then, grown at rate - carry_yield - borrow.
    double forward(double years, double from_spot) const;
    double forward(double years) const { return forward(years, spot); }
    /// The volatility for `strike` at `years`: the smile's (at its own spot, plus its shift),
    /// or `volatility` when there is no smile.
    smile_point volatility_at(double strike, double years) const;

    /// Every field equal, the smile by its grid (analytics/pricing.cpp remembers prices by their inputs).
    friend bool operator==(const market_data& a, const market_data& b);
};

/// How a strike was written (contract/limits.hpp: strike_forms, after "price").
enum class strike_form { price, percent_of_spot, percent_of_forward, delta };

/// A strike as written: a price, a percentage of spot or of the forward to the leg's expiry,
/// or a spot delta solved on the smile; derived strikes are rounded to the trade's strike_tick.
struct strike_terms {
    strike_form form = strike_form::price;
    double value = 0;      ///< the number written (a price, a percentage, or a delta such as -0.25)
    double unrounded = 0;  ///< the strike before rounding to strike_tick (a price: the strike itself)

    friend bool operator==(const strike_terms&, const strike_terms&) = default;
};

/// One option (or share) position inside a trade.
struct option_leg {
    payoff_kind type = payoff_kind::call;
    double strike = 0;  ///< unused for stock
    double expiry_years = 0;
    exercise_style exercise = exercise_style::european;
    std::vector<double> exercise_years;  ///< Bermudan exercise dates (the expiry always may)
    double payout = 1;                   ///< cash paid by a digital
    double quantity = 1;                 ///< signed; + = client buys
    strike_terms strike_given;           ///< how the strike was written
    /// The leg's own volatility when it is fixed: solved for this leg alone, or held at today's
    /// smile while time moves (schedules, time ladders). None: market_data::volatility_at.
    std::optional<double> volatility;

    friend bool operator==(const option_leg&, const option_leg&) = default;
};

/// A market without cash dividends, in one line (tests, benchmarks).
inline market_data flat_market(double spot, double volatility, double rate, double carry_yield = 0) {
    market_data m;
    m.spot = spot;
    m.volatility = volatility;
    m.rate = curve::flat(rate);
    m.carry_yield = curve::flat(carry_yield);
    return m;
}

/// One leg of quantity 1, in one line.
inline option_leg single_leg(payoff_kind type, double strike, double expiry_years,
                             exercise_style exercise = exercise_style::european, double payout = 1) {
    option_leg leg;
    leg.type = type;
    leg.strike = strike;
    leg.expiry_years = expiry_years;
    leg.exercise = exercise;
    leg.payout = payout;
    return leg;
}

struct lattice_settings {
    lattice_method method = lattice_method::leisen_reimer;
    int steps = 0;  ///< 0 = default for the method
    bool extrapolate = true;

    friend bool operator==(const lattice_settings&, const lattice_settings&) = default;
};

/// The highest volatility the lattice takes for a trade whose last expiry is `years` away
/// (max_spread / sqrt(years) rounded down to 4 decimals, at most max_volatility).
double highest_volatility(double years);
/// Refuse (naming `path`) a volatility the lattice cannot hold over `years`.
void require_spread(double volatility, double years, const std::string& path);

/// A whole trade after validation (commands/trade_reader.hpp reads it from a document).
struct trade {
    std::optional<date> valuation_date;
    market_data market;
    std::vector<option_leg> legs;  ///< one leg for a single option
    bool is_structure = false;     ///< given as `legs` or `structure`
    double quantity = 1;           ///< number of units (structures) or options
    bool client_sells = false;     ///< side: "sell"
    lattice_settings lattice;
    std::optional<double> strike_tick;  ///< derived and solved strikes round to a multiple of it
    /// A currency pair's terms (docs/currency.md); none for an equity. With a pair, `market`
    /// holds the lattice's flat effective rate and carry (analytics/currency.hpp), the legs'
    /// expiry_years the volatility time and `quantity` the foreign notional.
    std::optional<currency_terms> currency;

    /// +quantity for buy, -quantity for sell.
    double signed_quantity() const { return client_sells ? -quantity : quantity; }
    /// Latest expiry across legs.
    double final_expiry_years() const;
};

/// The words of contract/limits.hpp for the enums, and back (the text must be one of them).
std::string to_string(payoff_kind k);
std::string to_string(exercise_style e);
std::string to_string(lattice_method m);
payoff_kind parse_payoff_kind(const std::string& text);
exercise_style parse_exercise_style(const std::string& text);
lattice_method parse_lattice_method(const std::string& text);

}  // namespace hedgeleaf
