// Hedgeleaf contract: term structures of rates (see curve.hpp).
#include "contract/curve.hpp"

#include <algorithm>
#include <cmath>
#include <utility>

namespace hedgeleaf {

curve curve::flat(double rate) {
    curve c;
    c.flat_ = rate;
    return c;
}

curve curve::from_points(std::vector<double> years, std::vector<double> zero_rates) {
    curve c;
    c.flat_ = zero_rates.empty() ? 0.0 : zero_rates.front();
    if (years.size() <= 1) return c;  // one point is one rate everywhere
    c.years_ = std::move(years);
    c.zero_rates_ = std::move(zero_rates);
    for (std::size_t i = 0; i < c.years_.size(); ++i) c.integrals_.push_back(c.zero_rates_[i] * c.years_[i]);
    c.tail_ = c.zero_rates_.back();  // flat zero rate beyond the last point
    return c;
}

double curve::integral(double t) const {
    if (is_flat()) return flat_ * t;
    if (t >= years_.back()) return integrals_.back() + tail_ * (t - years_.back());
    const std::size_t i = static_cast<std::size_t>(std::upper_bound(years_.begin(), years_.end(), t) - years_.begin());
    const double t0 = i == 0 ? 0.0 : years_[i - 1], a = i == 0 ? 0.0 : integrals_[i - 1];
    return a + (integrals_[i] - a) * (t - t0) / (years_[i] - t0);
}

double curve::zero(double t) const {
    if (is_flat()) return flat_;
    if (t <= 0) return integrals_.front() / years_.front();
    return integral(t) / t;
}

double curve::forward_at(double t) const {
    if (is_flat()) return flat_;
    if (t >= years_.back()) return tail_;
    const std::size_t i = static_cast<std::size_t>(std::upper_bound(years_.begin(), years_.end(), t) - years_.begin());
    const double t0 = i == 0 ? 0.0 : years_[i - 1], a = i == 0 ? 0.0 : integrals_[i - 1];
    return (integrals_[i] - a) / (years_[i] - t0);
}

double curve::average(double from, double to) const {
    if (is_flat()) return flat_;
    if (!(to > from)) return zero(from);
    return (integral(to) - integral(from)) / (to - from);
}

double curve::growth(double from, double to) const {
    if (is_flat()) return std::exp(flat_ * (to - from));
    return std::exp(integral(to) - integral(from));
}

double curve::discount(double from, double to) const {
    if (is_flat()) return std::exp(-flat_ * (to - from));
    return std::exp(integral(from) - integral(to));
}

namespace {
/// The forward rates of the pieces between knots (r·t linear between (0, 0) and each knot)
/// and of the tail beyond the last, folded into one by `pick` (std::min or std::max).
template <class Pick>
double fold_forwards(const std::vector<double>& years, const std::vector<double>& integrals, double tail, Pick pick) {
    double folded = tail, before = 0, at = 0;
    for (std::size_t i = 0; i < years.size(); ++i) {
        folded = pick(folded, (integrals[i] - at) / (years[i] - before));
        before = years[i];
        at = integrals[i];
    }
    return folded;
}
}  // namespace

double curve::lowest_forward() const {
    if (is_flat()) return flat_;
    return fold_forwards(years_, integrals_, tail_, [](double a, double b) { return std::min(a, b); });
}

double curve::highest_forward() const {
    if (is_flat()) return flat_;
    return fold_forwards(years_, integrals_, tail_, [](double a, double b) { return std::max(a, b); });
}

curve curve::shifted(double shift) const {
    if (is_flat()) return flat(flat_ + shift);
    curve c = *this;
    for (std::size_t i = 0; i < c.years_.size(); ++i) {
        c.zero_rates_[i] += shift;
        c.integrals_[i] += shift * c.years_[i];
    }
    c.tail_ += shift;
    c.flat_ = c.zero_rates_.front();
    return c;
}

curve curve::seen_from(double years) const {
    if (is_flat() || !(years > 0)) return *this;
    curve c;
    c.tail_ = tail_;
    const double base = integral(years);
    for (std::size_t i = 0; i < years_.size(); ++i) {
        if (years_[i] <= years) continue;
        const double t = years_[i] - years;
        c.years_.push_back(t);
        c.integrals_.push_back(integrals_[i] - base);
        c.zero_rates_.push_back((integrals_[i] - base) / t);
    }
    if (c.years_.empty()) return flat(tail_);  // past the last point only the tail forward is left
    c.flat_ = c.zero_rates_.front();
    return c;
}

}  // namespace hedgeleaf
