// Hedgeleaf analytics: scenario ladders (see ladder.hpp).
#include "analytics/ladder.hpp"

#include "analytics/leg_market.hpp"
#include "contract/errors.hpp"
#include "numerics/lattice.hpp"
#include "numerics/lattice_price.hpp"
#include "numerics/rounding.hpp"

#include <algorithm>
#include <cmath>

namespace hedgeleaf {

namespace {

// Legs this close to expiry at the horizon count as expired (paid at their payoff).
constexpr double expiry_epsilon = 1e-9;

// Selling a zero gives -0; show 0.
double unsigned_zero(double x) { return x + 0.0; }

/// The trade moved `h` years forward: expired legs leave at their payoff,
/// dividends already paid drop out, later times shorten by h.
struct aged_trade {
    market_data market;
    std::vector<option_leg> alive;
    double settled = 0;        // per unit: payoffs of legs expired by the horizon
    double settled_delta = 0;  // and their slopes in spot: the shares they deliver
};

aged_trade age(const trade& t, const market_data& m, double h) {
    aged_trade out;
    out.market = m;
    if (h <= 0) {
        out.alive = t.legs;
        return out;
    }
    out.market = m.seen_at(h);  // dividends paid by then drop out; curves run from then
    for (option_leg leg : with_fixed_volatilities(m, t.legs)) {
        if (leg.type != payoff_kind::stock && leg.expiry_years <= h + expiry_epsilon) {
            out.settled += leg.quantity * exercise_value(leg, m.spot);
            out.settled_delta += leg.quantity * exercise_slope(leg, m.spot);
            continue;
        }
        if (leg.type != payoff_kind::stock) {
            leg.expiry_years -= h;
            std::vector<double> years;
            for (double x : leg.exercise_years)
                if (x - h > expiry_epsilon) years.push_back(x - h);
            leg.exercise_years = years;
        }
        out.alive.push_back(leg);
    }
    return out;
}

// The scenarios of a ladder, in row order (a grid: spot by spot, volatility within).
std::vector<scenario> scenarios_of(const ladder_settings& s) {
    std::vector<scenario> out;
    if (s.kind == ladder_kind::spot)
        for (double x : s.spot_shifts) out.push_back({x, 0, 0});
    else if (s.kind == ladder_kind::volatility)
        for (double x : s.vol_shifts) out.push_back({0, x, 0});
    else if (s.kind == ladder_kind::time)
        for (long d : s.days) out.push_back({0, 0, static_cast<double>(d) / 365.0});
    else {
        if (static_cast<long>(s.spot_shifts.size() * s.vol_shifts.size()) > max_grid_cells)
            fail("ladder.spot_step", "the grid has " + std::to_string(s.spot_shifts.size() * s.vol_shifts.size()) +
                                         " cells, at most " + std::to_string(max_grid_cells) + "; use larger steps");
        for (double x : s.spot_shifts)
            for (double y : s.vol_shifts) out.push_back({x, y, 0});
    }
    return out;
}

ladder_row row_of(const trade& t, const scenario& s, const scenario_value& v, const scenario_value& today) {
    const double q = t.signed_quantity();
    ladder_row row;
    row.moved = s;
    row.at = v;
    row.pnl = v.value - today.value;
    row.position_pnl = unsigned_zero(q * (v.value - today.value));
    row.position_delta = unsigned_zero(q * v.delta);
    row.position_gamma = unsigned_zero(q * v.gamma);
    row.spot = round_significant(t.market.spot * (1 + s.spot_shift));
    row.volatility = tidy_decimal(t.market.volatility + s.vol_shift);
    return row;
}

}  // namespace

double tidy_decimal(double x) { return std::round(x * 1e12) / 1e12 + 0.0; }

double scenario_work(std::size_t scenarios, std::size_t legs, int steps) {
    return static_cast<double>(scenarios) * static_cast<double>(legs) * 0.625 * steps * static_cast<double>(steps);
}

scenario_value value_scenario(const trade& t, const scenario& s, int steps, smile_move move) {
    market_data m = t.market;
    m.spot = round_significant(t.market.spot * (1 + s.spot_shift));  // the spot shown in the row
    m.volatility = t.market.volatility + s.vol_shift;
    if (m.smile) {
        m.smile_shift += s.vol_shift;
        if (move == smile_move::sticky_moneyness) m.smile_spot = m.spot;
    }
    if (!(m.spot > 0)) fail("", "spot shift " + format_number(s.spot_shift) + " leaves no positive spot");
    if (!(m.volatility > 0))
        fail("", "volatility shift " + format_number(s.vol_shift) + " leaves no positive volatility");
    const aged_trade aged = age(t, m, s.years_ahead);
    double last = 0;
    for (const auto& leg : aged.alive) last = std::max(last, leg.expiry_years);
    const double pv = aged.market.dividend_pv(0, last);
    if (!(pv < m.spot))
        fail("", "spot " + format_number(m.spot) + " is not above the present value " + format_number(pv) +
                     " of the dividends before expiry");

    lattice_settings fast = t.lattice;
    fast.steps = steps;
    fast.extrapolate = true;
    scenario_value out;
    out.value = aged.settled;
    out.delta = aged.settled_delta;
    for (const auto& leg : aged.alive) {
        const market_data lm = leg_market(aged.market, leg);
        if (!(lm.volatility > 0))
            fail("", "volatility shift " + format_number(s.vol_shift) + " leaves a leg with no positive volatility");
        const lattice_price p = price_leg(lm, leg, fast);
        out.value += leg.quantity * p.premium;
        out.delta += leg.quantity * p.sensitivities.delta;
        out.gamma += leg.quantity * p.sensitivities.gamma;
        if (leg.type != payoff_kind::stock) out.extrapolated = out.extrapolated && p.extrapolated;
    }
    return out;
}

ladder_result run_ladder(const trade& t, const ladder_settings& settings) {
    const std::vector<scenario> scenarios = scenarios_of(settings);
    const double work = scenario_work(scenarios.size() + 1, t.legs.size(), settings.steps);
    if (work > max_ladder_work)
        fail("ladder.steps", "the ladder would need about " + format_number(std::round(work / 1e6)) +
                                 " million lattice node updates, at most " + format_number(max_ladder_work / 1e6) +
                                 " million; use fewer steps or fewer rows");

    const auto value_at = [&](const scenario& s) {
        try {
            return value_scenario(t, s, settings.steps, settings.smile);
        } catch (const work_exhausted&) {
            throw;  // the budget, not this trial value
        } catch (const input_error& e) {
            fail(settings.axis_path, "a scenario cannot be priced (spot shift " + format_number(s.spot_shift) +
                                         ", volatility shift " + format_number(s.vol_shift) + ", " +
                                         format_number(s.years_ahead) + " years ahead): " + e.what());
        }
    };
    ladder_result out;
    out.today = value_at({});
    out.against_price = compare_with_price(t, out.today.value);
    for (std::size_t i = 0; i < scenarios.size(); ++i) {
        ladder_row row = row_of(t, scenarios[i], value_at(scenarios[i]), out.today);
        if (settings.kind == ladder_kind::time) row.days = settings.days[i];
        out.rows.push_back(row);
    }
    return out;
}

}  // namespace hedgeleaf
