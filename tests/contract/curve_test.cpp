// Tests for contract/curve: zero rates, flat forwards between points, shifts and time moves.
#include "contract/curve.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

TEST_CASE("a flat curve is the plain formula, exactly", "[curve]") {
    const curve c = curve::flat(0.031);
    CHECK(c.is_flat());
    CHECK(c.average(0.2, 1.7) == 0.031);
    CHECK(c.growth(0.25, 1.0) == std::exp(0.031 * (1.0 - 0.25)));
    CHECK(c.discount(0.0, 2.0) == std::exp(-0.031 * 2.0));
    CHECK(c.shifted(0.0005).average(0, 1) == 0.031 + 0.0005);
    CHECK(c.seen_from(0.5).average(0, 1) == 0.031);
    CHECK(curve::from_points({1.0}, {0.02}).is_flat());  // one point is one rate
}

TEST_CASE("between points the forward rate is flat and zero rates interpolate r t linearly", "[curve]") {
    // Common practice (flat forwards, i.e. linear interpolation of log discount factors).
    const curve c = curve::from_points({0.5, 1.0, 2.0}, {0.02, 0.03, 0.035});
    CHECK(c.zero(0.25) == Approx(0.02));  // flat zero before the first point
    CHECK(c.zero(1.0) == Approx(0.03));
    CHECK(c.zero(3.0) == Approx(0.035));  // and after the last
    // Forward over (0.5, 1]: (0.03 * 1 - 0.02 * 0.5) / 0.5 = 0.04.
    CHECK(c.average(0.5, 1.0) == Approx(0.04));
    CHECK(c.average(0.6, 0.9) == Approx(0.04));
    // Forward over (1, 2]: (0.07 - 0.03) / 1 = 0.04; past 2 years the last zero rate 0.035.
    CHECK(c.average(1.0, 2.0) == Approx(0.04));
    CHECK(c.average(2.0, 5.0) == Approx(0.035));
    CHECK(c.discount(0, 2.0) == Approx(std::exp(-0.07)));
    CHECK(c.growth(0.5, 2.0) * c.discount(0, 2.0) == Approx(c.discount(0, 0.5)));
    CHECK(c.lowest_forward() == Approx(0.02));
    CHECK(c.highest_forward() == Approx(0.04));
}

TEST_CASE("a curve seen later keeps its forward rates", "[curve]") {
    const curve c = curve::from_points({0.5, 1.0, 2.0}, {0.02, 0.03, 0.035});
    for (double later : {0.1, 0.5, 0.75, 1.5, 2.5}) {
        const curve l = c.seen_from(later);
        for (double a : {0.0, 0.2, 0.6, 1.3, 3.0})
            for (double b : {0.05, 0.4, 1.1, 2.2})
                if (b > a) CHECK(l.average(a, b) == Approx(c.average(later + a, later + b)).margin(1e-15));
    }
    // A parallel shift moves every forward by the shift.
    const curve s = c.shifted(-0.01);
    CHECK(s.average(0.5, 1.0) == Approx(0.03));
    CHECK(s.zero(3.0) == Approx(0.025));
}
