// Tests for contract/smile: reading volatilities off a grid by expiry and strike.
#include "contract/smile.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace hedgeleaf;

namespace {
smile_grid one_row(std::vector<double> vols) {
    smile_grid g;
    g.expiries = {1.0};
    g.strikes = {80, 90, 100, 110, 120};
    g.vols = {std::move(vols)};
    g.spot = 100;
    return g;
}
}  // namespace

TEST_CASE("along the strike the smile is the monotone cubic of scipy's PchipInterpolator in log strike", "[smile]") {
    // Reference: scipy.interpolate.PchipInterpolator(log([80, 90, 100, 110, 120]),
    // [0.30, 0.26, 0.22, 0.21, 0.215]) evaluated at log(x), scipy 1.10 via /usr/bin/python3
    // (Fritsch and Carlson, SIAM J. Numer. Anal. 17, 1980).
    const volatility_smile s(one_row({0.30, 0.26, 0.22, 0.21, 0.215}));
    CHECK(s.row_at(0, 85) == Approx(0.2800050881368926).epsilon(1e-12));
    CHECK(s.row_at(0, 95) == Approx(0.23681132061051557).epsilon(1e-12));
    CHECK(s.row_at(0, 104) == Approx(0.2141013461447572).epsilon(1e-12));
    CHECK(s.row_at(0, 117) == Approx(0.21225863566885653).epsilon(1e-12));
    // On the knots the quoted volatilities themselves.
    CHECK(s.row_at(0, 90) == 0.26);
    CHECK(s.row_at(0, 110) == 0.21);
}

TEST_CASE("the smile never overshoots between two quoted strikes (monotone between knots)", "[smile]") {
    const volatility_smile s(one_row({0.30, 0.26, 0.22, 0.21, 0.215}));
    double before = s.row_at(0, 80);
    for (double x = 80.5; x <= 110; x += 0.5) {
        const double v = s.row_at(0, x);
        CHECK(v <= before + 1e-15);  // the quotes fall from 80 to 110: so does the smile
        before = v;
    }
}

TEST_CASE("beyond the grid the smile is held flat and says so", "[smile]") {
    smile_grid g = one_row({0.30, 0.26, 0.22, 0.21, 0.215});
    g.expiries = {0.5, 1.0};
    g.vols.push_back({0.29, 0.255, 0.22, 0.212, 0.218});
    const volatility_smile s(g);
    const smile_point low = s.at(60, 0.75);
    CHECK(low.beyond_strikes);
    CHECK_FALSE(low.beyond_expiries);
    const smile_point early = s.at(100, 0.25);  // before the first expiry: its volatility
    CHECK(early.beyond_expiries);
    CHECK(early.volatility == 0.22);
    const smile_point late = s.at(130, 3.0);  // after the last expiry, past the last strike
    CHECK(late.extrapolated());
    CHECK(late.volatility == 0.218);
    CHECK_FALSE(s.at(100, 0.75).extrapolated());
}

TEST_CASE("along time total variance is linear at a fixed strike", "[smile]") {
    // Common practice: between expiries t1 < t < t2 the total variance v^2 t interpolates
    // linearly, so the forward variance is constant. 0.2 at 1 y and 0.3 at 2 y: at 1.5 y,
    // v^2 1.5 = 0.04 + (0.18 - 0.04) / 2 = 0.11.
    smile_grid g;
    g.expiries = {1.0, 2.0};
    g.strikes = {100};
    g.vols = {{0.2}, {0.3}};
    g.spot = 100;
    const volatility_smile s(g);
    CHECK(s.at(100, 1.5).volatility == Approx(std::sqrt(0.11 / 1.5)).epsilon(1e-14));
    CHECK(s.at(100, 1.0).volatility == 0.2);
    CHECK(s.at(100, 2.0).volatility == 0.3);
}

TEST_CASE("a flat grid gives its one volatility exactly, anywhere", "[smile]") {
    smile_grid g;
    g.expiries = {0.25, 1.0, 2.0};
    g.strikes = {80, 100, 125};
    g.vols = {{0.23, 0.23, 0.23}, {0.23, 0.23, 0.23}, {0.23, 0.23, 0.23}};
    g.spot = 100;
    const volatility_smile s(g);
    for (double t : {0.1, 0.25, 0.6, 1.0, 1.7, 2.0, 3.5})
        for (double x : {50.0, 80.0, 93.0, 100.0, 117.0, 125.0, 160.0}) CHECK(s.at(x, t).volatility == 0.23);
}
