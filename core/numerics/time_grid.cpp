// Hedgeleaf numerics: lattice time grids (see time_grid.hpp).
#include "numerics/time_grid.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

// Events strictly inside (0, expiry), sorted, with near repeats merged.
std::vector<double> inside(double expiry, std::vector<double> events) {
    std::sort(events.begin(), events.end());
    std::vector<double> out;
    for (double t : events) {
        if (!(t > time_tolerance_years && t < expiry - time_tolerance_years)) continue;
        if (!out.empty() && t - out.back() <= time_tolerance_years) continue;
        out.push_back(t);
    }
    return out;
}

// Steps per segment: proportional to length, at least one each, `total` in all (largest remainder).
std::vector<int> share_steps(const std::vector<double>& lengths, double expiry, int total) {
    const std::size_t k = lengths.size();
    std::vector<double> ideal(k);
    std::vector<int> n(k);
    int sum = 0;
    for (std::size_t i = 0; i < k; ++i) {
        ideal[i] = total * lengths[i] / expiry;
        n[i] = std::max(1, static_cast<int>(std::lround(ideal[i])));
        sum += n[i];
    }
    // Take from the segments most above their share, give to those most below it.
    while (sum > total) {
        std::size_t best = k;
        for (std::size_t i = 0; i < k; ++i)
            if (n[i] > 1 && (best == k || n[i] - ideal[i] > n[best] - ideal[best])) best = i;
        if (best == k) break;  // every segment holds one step
        --n[best];
        --sum;
    }
    while (sum < total) {
        std::size_t best = 0;
        for (std::size_t i = 1; i < k; ++i)
            if (ideal[i] - n[i] > ideal[best] - n[best]) best = i;
        ++n[best];
        ++sum;
    }
    return n;
}

}  // namespace

int time_grid::nearest_step(double years) const {
    if (uniform) {
        const long n = std::lround(years / (expiry / steps));
        return static_cast<int>(std::clamp<long>(n, 0, steps));
    }
    const auto it = std::lower_bound(times.begin(), times.end(), years);
    if (it == times.begin()) return 0;
    if (it == times.end()) return steps;
    const auto below = it - 1;
    return static_cast<int>((years - *below <= *it - years ? below : it) - times.begin());
}

std::vector<double> leg_events(const market_data& market, const option_leg& leg) {
    std::vector<double> events;
    if (leg.exercise == exercise_style::bermudan) events = leg.exercise_years;
    if (leg.exercise == exercise_style::american)
        for (const dividend& d : market.dividends) {
            events.push_back(d.years);
            events.push_back(d.years - 1.0 / 365.0);
        }
    return inside(leg.expiry_years, events);
}

time_grid make_time_grid(double expiry, int steps, std::vector<double> events) {
    time_grid g;
    g.expiry = expiry;
    g.steps = steps;
    const std::vector<double> cuts = inside(expiry, std::move(events));
    if (cuts.empty()) return g;
    std::vector<double> ends = cuts;
    ends.push_back(expiry);
    std::vector<double> lengths;
    double from = 0;
    for (double t : ends) {
        lengths.push_back(t - from);
        from = t;
    }
    const int total = std::max(steps, static_cast<int>(lengths.size()));
    const std::vector<int> per = share_steps(lengths, expiry, total);
    g.uniform = false;
    g.steps = total;
    g.segments = static_cast<int>(lengths.size());
    g.times.reserve(static_cast<std::size_t>(total) + 1);
    g.times.push_back(0.0);
    from = 0;
    for (std::size_t k = 0; k < ends.size(); ++k) {
        for (int j = 1; j < per[k]; ++j) g.times.push_back(from + lengths[k] * j / per[k]);
        g.times.push_back(ends[k]);  // exactly the event
        from = ends[k];
    }
    return g;
}

}  // namespace hedgeleaf
