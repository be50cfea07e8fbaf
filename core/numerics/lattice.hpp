// Hedgeleaf numerics: recombining binomial lattices and backward induction.
//
// The lattice runs on the diffusing part of spot, S* = spot - PV(cash dividends
// before expiry) (escrowed-dividend convention); a node's full spot is S* plus
// the PV of the dividends still to come. One step multiplies S* by `up` or
// `down`; the risk-neutral probability comes from the growth factor over one
// step, p = (growth - down) / (up - down), which needs 0 < down < growth < up.
//
// lattice.cpp builds the step and the payoffs, lattice_kernel.cpp runs the
// induction; lattice_price.hpp turns two inductions into a price.
#pragma once

#include "contract/trade.hpp"

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

/// Which steps allow early exercise (size steps+1; the last step always pays).
std::vector<char> exercise_steps(const option_leg& leg, int steps, double dt);

/// False when early exercise can never beat holding (American call with no dividends and
/// carry_yield <= 0 <= rate; put with rate <= 0 <= carry_yield): the leg is then European in value.
bool early_exercise_can_pay(const market_data& market, const option_leg& leg);

/// Value of a leg if exercised (or paid) at full spot s.
double exercise_value(const option_leg& leg, double s);

/// Value and lattice Greeks (delta, gamma, theta; vega and rho left 0) from one backward induction.
struct induction_result {
    double value = 0;
    double delta = 0;
    double gamma = 0;
    double theta = 0;
    double node_updates = 0;  ///< nodes the sweep updated (rows 0 to steps - 1)
};

/// How much of the lattice a backward induction sweeps.
enum class lattice_extent {
    probable,  ///< nodes a path reaches with probability above 1e-31 under the pricing or the
               ///< share measure (about 12 sqrt(n) of row n); the premium moves far less than rounding
    full,      ///< every node (for the benchmarks' loop-speed figures)
};

/// One backward induction of `leg` on `steps` steps with O(steps) memory (lattice_kernel.cpp).
/// Charges its node updates to the live work meter (numerics/work_meter.hpp).
induction_result induce(const market_data& market, const option_leg& leg, lattice_method method, int steps,
                        lattice_extent extent = lattice_extent::probable);

/// Node updates of one backward induction over `steps` steps (probable band): an upper
/// bound on induce's node_updates, for estimating a request before it runs.
double induction_work(int steps);

}  // namespace hedgeleaf
