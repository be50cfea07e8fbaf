// Hedgeleaf core: the trade model and its JSON document.
//
// Units: spot and strike in price units; volatility, rate and carry_yield are
// decimals per year (0.25 = 25 %), rates continuously compounded; times are
// years (ACT/365F from valuation_date when dates are given).
#pragma once

#include "dates.hpp"
#include "json_read.hpp"

#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

enum class payoff_kind { call, put, digital_call, digital_put, stock };
enum class exercise_style { european, american, bermudan };
enum class lattice_method { crr, jarrow_rudd, tian, leisen_reimer };

/// A discrete cash dividend (escrowed-dividend model).
struct dividend {
    double time = 0;    ///< years from valuation
    double amount = 0;  ///< cash per share
};

struct market_data {
    double spot = 0;
    double volatility = 0;   ///< decimal, annualised
    double rate = 0;         ///< continuously compounded, decimal
    double carry_yield = 0;  ///< continuous dividend yield or foreign rate, decimal
    std::vector<dividend> dividends;

    /// Present value at time `from` of the cash dividends paid in (from, until].
    double dividend_pv(double from, double until) const;
};

/// One option (or share) position inside a trade.
struct option_leg {
    payoff_kind type = payoff_kind::call;
    double strike = 0;      ///< unused for stock
    double expiry = 0;      ///< years
    exercise_style exercise = exercise_style::european;
    std::vector<double> exercise_times;  ///< Bermudan dates in years (expiry is always included)
    double payout = 1;      ///< cash paid by a digital
    double quantity = 1;    ///< signed; + = client buys
};

/// A market without cash dividends, in one line (tests, benchmarks, the module's timing hooks).
inline market_data flat_market(double spot, double volatility, double rate, double carry_yield = 0) {
    market_data m;
    m.spot = spot;
    m.volatility = volatility;
    m.rate = rate;
    m.carry_yield = carry_yield;
    return m;
}

/// One leg of quantity 1, in one line.
inline option_leg single_leg(payoff_kind type, double strike, double expiry,
                             exercise_style exercise = exercise_style::european, double payout = 1) {
    option_leg leg;
    leg.type = type;
    leg.strike = strike;
    leg.expiry = expiry;
    leg.exercise = exercise;
    leg.payout = payout;
    return leg;
}

struct lattice_settings {
    lattice_method method = lattice_method::leisen_reimer;
    int steps = 0;          ///< 0 = default for the method
    bool extrapolate = true;
};

inline constexpr double max_volatility = 5.0;  ///< 500 % a year
/// The widest spread of log-spot a lattice holds: volatility x sqrt(years to the
/// last expiry). Beyond about 26 the spots that carry a call's value lie past
/// e^500 from spot, where a double-precision lattice clamps them; 20 keeps a
/// margin (it is 283 % a year over 5 years, or 63 % over 100).
inline constexpr double max_spread = 20.0;
/// The highest volatility the lattice takes for a trade whose last expiry is `years` away
/// (max_spread / sqrt(years) rounded down to 4 decimals, at most max_volatility).
double highest_volatility(double years);
/// Refuse (naming `path`) a volatility the lattice cannot hold over `years`.
void require_spread(double volatility, double years, const std::string& path);

inline constexpr int max_lattice_steps = 50000;
inline constexpr int default_lattice_steps = 1601;  // chosen from bench/accuracy_bench (docs: speed)

/// A whole trade document after validation.
struct trade {
    std::optional<date> valuation_date;
    market_data market;
    std::vector<option_leg> legs;  ///< one leg for a single option
    bool is_structure = false;     ///< given as `legs` or `structure`
    double quantity = 1;           ///< number of units (structures) or options
    bool client_sells = false;     ///< side: "sell"
    lattice_settings lattice;
    json source;                   ///< the document as read (for sections other modules read)

    /// +quantity for buy, -quantity for sell.
    double signed_quantity() const { return client_sells ? -quantity : quantity; }
    /// Latest expiry across legs.
    double final_expiry() const;
};

/// Context for reading times: a valuation date lets fields be given as dates.
struct time_reader {
    std::optional<date> valuation_date;
    /// Years from either `<stem>_years` or `<stem>_date` of `r` (exactly one).
    double read_time(field_reader& r, const std::string& years_key, const std::string& date_key) const;
    /// Years from a date string at `path`.
    double from_date_text(const json& value, const std::string& path) const;
};

/// Parse and validate a trade document. Throws input_error naming the field.
trade parse_trade(const json& document);
/// Deepest nesting of objects and arrays a trade document may have.
inline constexpr int max_document_depth = 64;
/// Parse text (reports malformed JSON, and nesting past max_document_depth, as an
/// input_error with an empty field).
json parse_json_text(const std::string& text);

/// Read one option leg from an object (shared by `option`, `legs[i]` and structures).
option_leg read_option_leg(field_reader& r, const time_reader& times, bool signed_quantity);

std::string to_string(payoff_kind k);
std::string to_string(exercise_style e);
std::string to_string(lattice_method m);
lattice_method parse_lattice_method(const std::string& text);

}  // namespace hedgeleaf
