// Hedgeleaf contract: currency pairs, their dates and money-market rates (no JSON here).
//
// A pair BASE/QUOTE is quoted as QUOTE per one BASE (EUR/USD 1.0850: dollars per euro). The
// base currency is the foreign one, the quote currency the domestic one (the premium, the
// strike and the spot are domestic per unit of foreign). Dates follow common practice on
// currency desks, weekends only (no holiday calendar): spot is the trade date plus the spot
// lag in business days; delivery is the expiry plus the spot lag; the premium is paid on the
// spot date unless another date is given.
#pragma once

#include "contract/curve.hpp"
#include "contract/dates.hpp"

#include <optional>
#include <string>
#include <vector>

namespace hedgeleaf {

/// Base (foreign) and quote (domestic) currency, ISO 4217 codes, and the pip: the smallest
/// move of the quote as desks count it.
struct currency_pair {
    std::string base;   ///< foreign currency, e.g. "EUR"
    std::string quote;  ///< domestic currency, e.g. "USD"
    double pip_size = 0.0001;
    /// "EUR/USD".
    std::string name() const { return base + "/" + quote; }
};

/// True when `code` has the shape of an ISO 4217 code: exactly three capital letters A-Z.
bool is_currency_code(const std::string& code);
/// The pip by common practice: 0.01 when the quote currency is JPY, else 0.0001.
double default_pip_size(const std::string& quote_currency);
/// Business days from trade to spot by common practice: 1 for USD/CAD (either way round), else
/// default_spot_lag_days (2).
int default_spot_lag(const std::string& base, const std::string& quote);

/// `d` moved by `count` business days (Monday to Friday), forward for count > 0; count 0 is `d`.
date add_business_days(const date& d, int count);

/// The dates of a currency option.
struct currency_dates {
    date trade;     ///< the valuation (trade) date
    date spot;      ///< trade + spot lag business days
    date expiry;    ///< when the option is exercised
    date delivery;  ///< expiry + spot lag business days: when the currencies change hands
    date premium;   ///< when the premium is paid (the spot date unless given)
};
/// Spot, delivery and (unless given) premium dates from the trade date, the expiry and the lag.
currency_dates settle_dates(const date& trade, const date& expiry, int spot_lag_days);

/// Day counts of a money-market rate: actual days over 360 or over 365.
enum class day_count { act_360, act_365 };
/// How a quoted rate compounds over its period.
enum class compounding { simple, annual, continuous };

/// A money-market rate as quoted: a decimal a year with its day count and compounding.
struct quoted_rate {
    double rate = 0;
    day_count basis = day_count::act_360;
    compounding compounds = compounding::simple;
};

/// What 1 grows to over `days` calendar days at the quoted rate: simple 1 + r d/B, annual
/// (1 + r)^(d/B), continuous exp(r d/B), B = 360 or 365.
double growth_over(const quoted_rate& q, long days);
/// The continuously compounded ACT/365F zero rate with the same growth over `days` (> 0):
/// ln(growth_over(q, days)) x 365 / days (exact, not an approximation).
double continuous_act365f(const quoted_rate& q, long days);

/// How a premium is written (contract/limits.hpp premium_conventions, docs/currency.md), for a
/// premium V in domestic per unit of foreign, spot S, strike K and pip p: V; V / p; 100 V / S
/// (% of the foreign notional); 100 V / K (% of the domestic notional); V / (S K) / 0.0001.
enum class premium_convention {
    domestic_per_foreign,
    domestic_pips,
    percent_of_foreign,
    percent_of_domestic,
    foreign_pips
};
/// Which delta a currency desk means: d(value)/d(spot) or d(value)/d(forward), each with or
/// without the premium paid in the foreign currency taken off (premium-adjusted).
enum class delta_convention { spot, forward, spot_premium_adjusted, forward_premium_adjusted };

/// One point a smile quoted by delta gave: "atm", "call_25", "put_25", "call_10" or "put_10",
/// its strike (domestic per unit of foreign) and its volatility (decimal).
struct delta_smile_point {
    std::string name;
    double strike = 0;
    double volatility = 0;
};
/// One expiry of a smile quoted by delta (docs/currency.md) and the points its quotes gave.
struct delta_smile_row {
    double expiry_years = 0;                ///< ACT/365F from the trade date
    double forward = 0;                     ///< outright forward to that expiry's delivery date
    std::vector<delta_smile_point> points;  ///< in increasing strike
};

/// A currency option's terms as a desk writes them, and what the trade reader derived.
struct currency_terms {
    currency_pair pair;
    int spot_lag_days = 2;
    currency_dates dates;
    premium_convention premium = premium_convention::domestic_per_foreign;
    std::string premium_currency;  ///< pair.base or pair.quote
    delta_convention delta = delta_convention::spot;
    std::optional<date> premium_date;  ///< as written (else the spot date)
    double notional_amount = 0;        ///< as written, in notional_currency
    std::string notional_currency;
    /// Continuously compounded ACT/365F zero-rate curves from the trade date (a money-market
    /// quote becomes the flat rate with the same growth from the spot to the delivery date).
    curve domestic, foreign;
    std::optional<quoted_rate> domestic_quoted, foreign_quoted;  ///< as written, when quoted
    double forward = 0;                                          ///< outright forward for the delivery date
    double discount = 1;          ///< domestic discount factor from delivery back to the premium date
    double volatility_years = 0;  ///< trade -> expiry, ACT/365F
    /// The smile's points when it was quoted by delta (market.volatility.quotes_by_delta), else empty.
    std::vector<delta_smile_row> smile_by_delta;
};

/// The words of contract/limits.hpp (day_counts, compoundings) and back.
std::string to_string(day_count d);
std::string to_string(compounding c);
std::string to_string(premium_convention p);
std::string to_string(delta_convention d);

}  // namespace hedgeleaf
