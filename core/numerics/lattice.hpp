// Hedgeleaf numerics: recombining binomial lattices and backward induction.
//
// The lattice runs on the diffusing part of spot, S* = spot - PV(cash dividends
// before expiry) (escrowed-dividend convention); a node's full spot is S* plus
// the PV of the dividends still to come. One step multiplies S* by `up` or
// `down`; the risk-neutral probability comes from the growth factor over one
// step, p = (growth - down) / (up - down), which needs 0 < down < growth < up.
//
// A lattice runs on a time grid (numerics/time_grid.hpp). On a uniform grid every step
// is the same `lattice_step` of the chosen method, exactly as it always was. On a
// piecewise grid (events strictly inside the life) the steps differ in length, so the
// spacing of log S* is fixed at L = 2 sigma sqrt(longest dt) for every method, and each
// step n takes its own up probability from its variance, p_n (1 - p_n) L^2 = sigma^2 dt_n,
// and its down factor from its forward, log d_n = log g_n - log(p_n e^L + 1 - p_n): the
// mean and variance of every step then match exactly and d_n < g_n < u_n holds.
//
// lattice.cpp builds the steps and the payoffs, lattice_kernel.cpp runs the
// induction; lattice_price.hpp turns inductions into a price.
#pragma once

#include "contract/trade.hpp"
#include "numerics/time_grid.hpp"

#include <cmath>
#include <vector>

namespace hedgeleaf {

/// The parameters of one lattice step.
struct lattice_step {
    double dt = 0;        ///< years per step
    double up = 0;        ///< S* multiplier on an up move
    double down = 0;      ///< S* multiplier on a down move
    double growth = 0;    ///< exp((rate - carry_yield) * dt): forward growth of S* over a step
    double discount = 0;  ///< exp(-rate * dt)
    double p_up = 0;      ///< (growth - down) / (up - down)
};

/// Steps actually used for a method: Leisen-Reimer needs an odd count.
int effective_steps(lattice_method method, int steps);
/// Default steps for a method when the trade gives none.
int default_steps(lattice_method method);

/// The diffusing spot S* at valuation (spot minus PV of dividends up to `expiry_years`).
double diffusing_spot(const market_data& market, double expiry_years);

/// Build the step for `method` with `steps` steps to `expiry_years`. `strike` centres
/// Leisen-Reimer. Throws input_error naming the inputs if 0 < d < growth < u fails.
lattice_step make_step(lattice_method method, const market_data& market, double strike, double expiry_years, int steps);

/// Every step of a lattice on its time grid. Node (n, i) has diffusing spot
/// S*_0 exp(offset(n) + i L), with L = log(up / down) the same on every step.
struct lattice_geometry {
    time_grid grid;
    bool constant = true;                ///< one step repeated (a uniform grid): `step` is every step
    lattice_step step;                   ///< constant: every step; piecewise: the longest step
    std::vector<lattice_step> per_step;  ///< piecewise: step n, from t_n to t_{n+1}
    std::vector<double> offsets;         ///< piecewise: log offset of row n (the sum of log down before it)
    double log_ratio = 0;                ///< L = log(up / down)

    int steps() const { return grid.steps; }
    /// Step n (from row n to row n + 1).
    const lattice_step& at(int n) const { return constant ? step : per_step[static_cast<std::size_t>(n)]; }
    /// Years from valuation to row n.
    double time(int n) const { return grid.time(n); }
    /// log(S*(n, 0) / S*_0): n log down on a constant lattice.
    double offset(int n) const { return constant ? n * std::log(step.down) : offsets[static_cast<std::size_t>(n)]; }
};

/// The lattice of `method` on `grid` (`strike` centres Leisen-Reimer on a uniform grid; a
/// piecewise grid uses the same construction for every method, see above). Throws input_error
/// naming the inputs when a step breaks 0 < d < growth < u.
lattice_geometry make_geometry(lattice_method method, const market_data& market, double strike, const time_grid& grid);

/// Which rows allow early exercise (size steps+1; the last row always pays). Bermudan dates
/// fall on the nearest row: exactly on it when the grid was built with them as events.
std::vector<char> exercise_steps(const option_leg& leg, const time_grid& grid);

/// False when early exercise can never beat holding (American call with no dividends and
/// carry_yield <= 0 <= rate; put with rate <= 0 <= carry_yield): the leg is then European in value.
bool early_exercise_can_pay(const market_data& market, const option_leg& leg);

/// Value of a leg if exercised (or paid) at full spot s.
double exercise_value(const option_leg& leg, double s);

/// The slope of exercise_value in s: the delta of a leg at its expiry (a call 1 in the money,
/// 0 out of it, 1/2 at the strike, the limit of its delta there as the time left goes to 0; a
/// digital 0, its jump has no slope).
double exercise_slope(const option_leg& leg, double s);

/// Value and lattice Greeks (delta, gamma, theta; vega and rho left 0) from one backward induction.
struct induction_result {
    double value = 0;
    double delta = 0;
    double gamma = 0;
    double theta = 0;
    double node_updates = 0;  ///< work: nodes swept (rows 0 to steps - 1), or summed_work(steps) if summed
    int steps = 0;            ///< steps of the grid actually used
    int segments = 1;         ///< pieces of equal steps (1: a uniform grid)
};

/// How much of the lattice a backward induction sweeps.
enum class lattice_extent {
    probable,  ///< nodes a path reaches with probability above 1e-31 under the pricing or the
               ///< share measure (about 12 sqrt(n) of row n); the premium moves far less than rounding
    full,      ///< every node (for the benchmarks' loop-speed figures)
};

/// True when `leg` on a `method` lattice is European with one up probability on every step
/// (its grid has equal steps, leg_events being empty; and for Cox-Ross-Rubinstein, flat rates,
/// since under curves it moves p from step to step). Its backward induction is
/// then the binomial sum V(n, k) = D(n) sum_j C(N - n, j) p^j (1 - p)^(N - n - j) V(N, k + j)
/// (Cox, Ross and Rubinstein 1979, "Option pricing: a simplified approach", the binomial option
/// pricing formula), with D(n) the discount from row n to expiry: the same lattice value,
/// found in O(steps) instead of sweeping the probable band of every row.
bool sums_directly(const market_data& market, const option_leg& leg, lattice_method method);

/// What the binomial sum of a lattice that sums directly needs, without building every step:
/// the first min(2, steps) steps (`head`: for the last two steps back and the Greeks; on flat
/// rates the one repeated step), the log offset of the last row, log(S*(N, 0) / S*_0), and the
/// discount from row min(2, steps) to expiry.
struct summed_lattice {
    lattice_geometry head;
    double last_offset = 0;
    double discount_to_expiry = 1;
};
summed_lattice make_summed_lattice(lattice_method method, const market_data& market, double strike,
                                   const time_grid& grid);

/// One backward induction of `leg` on `steps` steps with O(steps) memory (lattice_kernel.cpp),
/// on the leg's time grid (leg_events: exercise and dividend dates fall on steps); where
/// sums_directly holds and the extent is `probable`, rows 0 to 2 come from the binomial sum.
/// Charges its node updates to the live work meter (numerics/work_meter.hpp).
induction_result induce(const market_data& market, const option_leg& leg, lattice_method method, int steps,
                        lattice_extent extent = lattice_extent::probable);

/// Node updates of one backward induction over `steps` steps (probable band): an upper
/// bound on induce's node_updates, for estimating a request before it runs.
double induction_work(int steps);

/// The work of an induction that sums directly (sums_directly): one binomial row of about
/// `steps` terms and the last two steps, in node-update units.
double summed_work(int steps);

}  // namespace hedgeleaf
