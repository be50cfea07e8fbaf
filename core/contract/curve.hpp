// Hedgeleaf contract: a term structure of interest rates or yields.
//
// A curve holds continuously compounded zero rates r(t) at times t in years from valuation
// (ACT/365F). Between its points r(t) t is linear in t, so the forward rate is constant from
// one point to the next (flat forwards: common practice for short-dated equity pricing);
// before the first point and after the last the zero rate stays that point's rate. A flat
// curve is one number and every operation on it is the plain formula (exp(r dt), ...), so a
// trade given with one rate prices exactly as it always has.
#pragma once

#include <vector>

namespace hedgeleaf {

class curve {
public:
    /// A flat curve at 0.
    curve() = default;
    /// One rate at every maturity.
    static curve flat(double rate);
    /// Zero rates at increasing times (years > 0); at least one point. The caller validates.
    static curve from_points(std::vector<double> years, std::vector<double> zero_rates);

    bool is_flat() const { return years_.empty(); }
    /// A flat curve at exactly 0.
    bool is_zero() const { return is_flat() && flat_ == 0; }
    /// The rate of a flat curve; of any other, the zero rate at its first point.
    double first_rate() const { return is_flat() ? flat_ : zero_rates_.front(); }
    /// Points of a curve given by points (empty for a flat one).
    const std::vector<double>& years() const { return years_; }
    const std::vector<double>& zero_rates() const { return zero_rates_; }

    /// Zero rate to `t` years (t >= 0; at t = 0 the first rate).
    double zero(double t) const;
    /// r(t) t: minus the logarithm of the discount factor to t.
    double integral(double t) const;
    /// The average rate over (from, to]: (integral(to) - integral(from)) / (to - from); the
    /// rate at `from` when the interval is empty. Flat: the rate itself, exactly.
    double average(double from, double to) const;
    /// exp of the integral over (from, to]: what 1 grows to. Flat: exp(rate (to - from)).
    double growth(double from, double to) const;
    /// 1 / growth(from, to): the discount factor from `to` back to `from`.
    double discount(double from, double to) const;
    /// The instantaneous forward rate at `t` (t >= 0): the forward of the stretch that starts
    /// at or runs through t. Flat: the rate. At 0 it is what the curve earns over the next instant.
    double forward_at(double t) const;
    /// The lowest and the highest forward rate anywhere on the curve.
    double lowest_forward() const;
    double highest_forward() const;
    /// The curve moved by `shift` at every maturity (a parallel shift).
    curve shifted(double shift) const;
    /// The curve as seen `years` from now: its zero rates run from then (forward rates kept).
    curve seen_from(double years) const;

    /// The same rates at the same points (analytics/pricing.cpp remembers prices by their inputs).
    friend bool operator==(const curve&, const curve&) = default;

private:
    // A curve given by points is kept as its integral r(t) t, linear between knots
    // (years_[i], integrals_[i]) that start at (0, 0) implicitly, with the last forward
    // (tail_) beyond the last knot. zero_rates_ are the zero rates at the knots.
    double flat_ = 0;
    std::vector<double> years_;       // increasing, > 0
    std::vector<double> zero_rates_;  // at years_
    std::vector<double> integrals_;   // zero_rates_[i] * years_[i]
    double tail_ = 0;
};

}  // namespace hedgeleaf
