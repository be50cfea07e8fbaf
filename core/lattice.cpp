// Hedgeleaf core: binomial lattices (see lattice.hpp).
#include "lattice.hpp"

#include "work.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <optional>
#if defined(__SSE__) || defined(__x86_64__)
#include <xmmintrin.h>
#endif

namespace hedgeleaf {

namespace {

// Peizer-Pratt inversion (method 2) of a normal quantile onto a binomial with n
// steps, as used by Leisen and Reimer (1996), as logarithms of p and of 1 - p.
// Far from the strike (|z| beyond about 6 sqrt(n): deep in or out of the money at
// low volatility) p rounds to 1 or 0 while 1 - p or p is still tiny but exact here,
// so the step stays defined (was "breaks no-arbitrage, down 0, up 0").
struct log_probability {
    double p;           ///< log p
    double not_p;       ///< log (1 - p)
};
log_probability peizer_pratt(double z, int n) {
    const double nn = static_cast<double>(n);
    const double a = z / (nn + 1.0 / 3.0 + 0.1 / (nn + 1.0));
    const double x = a * a * (nn + 1.0 / 6.0);
    const double root = std::sqrt(-std::expm1(-x));                   // sqrt(1 - e^-x)
    const double log_big = std::log1p(root) - std::log(2.0);           // log (1 + root) / 2
    const double log_small = -x - std::log(2.0) - std::log1p(root);    // log (1 - root) / 2
    return z >= 0 ? log_probability{log_big, log_small} : log_probability{log_small, log_big};
}

bool is_vanilla(payoff_kind k) { return k == payoff_kind::call || k == payoff_kind::put; }

struct richardson {
    double weight_fine;  // extrapolated = w * fine + (1 - w) * coarse
};

richardson weights(int fine, int coarse, int order) {
    const double a = std::pow(static_cast<double>(fine), order);
    const double b = std::pow(static_cast<double>(coarse), order);
    return {a / (a - b)};
}

}  // namespace

bool early_exercise_can_pay(const market_data& m, const option_leg& leg) {
    // Without cash dividends, C >= S e^{-qT} - K e^{-rT} > S - K when q <= 0 <= r, so a call
    // is never exercised early; likewise a put when r <= 0 <= q (Merton, 1973).
    if (!m.dividends.empty()) return true;
    if (leg.type == payoff_kind::call) return !(m.carry_yield <= 0 && m.rate >= 0);
    if (leg.type == payoff_kind::put) return !(m.rate <= 0 && m.carry_yield >= 0);
    return true;
}

int effective_steps(lattice_method method, int steps) {
    if (method == lattice_method::leisen_reimer && steps % 2 == 0) return steps + 1;
    return steps;
}

int default_steps(lattice_method method) { return effective_steps(method, default_lattice_steps); }

double diffusing_spot(const market_data& market, double expiry) {
    return market.spot - market.dividend_pv(0, expiry);
}

lattice_step make_step(lattice_method method, const market_data& m, double strike, double expiry, int steps) {
    lattice_step st;
    const double sigma = m.volatility;
    const double b = m.rate - m.carry_yield;
    st.dt = expiry / steps;
    st.growth = std::exp(b * st.dt);
    st.discount = std::exp(-m.rate * st.dt);
    const double sq = sigma * std::sqrt(st.dt);
    switch (method) {
        case lattice_method::crr:
            st.up = std::exp(sq);
            st.down = 1.0 / st.up;
            break;
        case lattice_method::jarrow_rudd: {
            const double drift = (b - 0.5 * sigma * sigma) * st.dt;
            st.up = std::exp(drift + sq);
            st.down = std::exp(drift - sq);
            break;
        }
        case lattice_method::tian: {
            const double v = std::exp(sigma * sigma * st.dt);
            const double root = std::sqrt(std::max(0.0, v * v + 2 * v - 3));
            st.up = 0.5 * st.growth * v * (v + 1 + root);
            st.down = 0.5 * st.growth * v * (v + 1 - root);
            break;
        }
        case lattice_method::leisen_reimer: {
            const double s = diffusing_spot(m, expiry);
            const double vol_t = sigma * std::sqrt(expiry);
            const double d1 = (std::log(s / strike) + (b + 0.5 * sigma * sigma) * expiry) / vol_t;
            const double d2 = d1 - vol_t;
            // up = growth p'/p and down = (growth - p up) / (1 - p) = growth (1 - p')/(1 - p),
            // taken as ratios of logarithms so neither cancels nor underflows.
            const log_probability p = peizer_pratt(d2, steps);
            const log_probability p_bar = peizer_pratt(d1, steps);
            st.up = st.growth * std::exp(p_bar.p - p.p);
            st.down = st.growth * std::exp(p_bar.not_p - p.not_p);
            break;
        }
    }
    // growth may equal up (or down) when the up (down) probability rounds to 1: the
    // step is then the forward itself, which prices such a far-off strike exactly.
    if (!(st.down > 0 && st.down <= st.growth && st.growth <= st.up && st.down < st.up && std::isfinite(st.up))) {
        fail("market.volatility",
             "the " + to_string(method) + " lattice breaks no-arbitrage (needs 0 < down < growth < up; got down " +
                 format_number(st.down) + ", growth " + format_number(st.growth) + ", up " + format_number(st.up) +
                 ") with market.volatility " + format_number(sigma) + ", market.rate " + format_number(m.rate) +
                 ", market.carry_yield " + format_number(m.carry_yield) + " and lattice.steps " + std::to_string(steps) +
                 " over " + format_number(expiry) + " years; raise the volatility or lattice.steps, or narrow the rate-carry gap");
    }
    st.p_up = (st.growth - st.down) / (st.up - st.down);
    return st;
}

std::vector<char> exercise_steps(const option_leg& leg, int steps, double dt) {
    std::vector<char> allowed(static_cast<std::size_t>(steps) + 1, 0);
    allowed[static_cast<std::size_t>(steps)] = 1;
    if (leg.exercise == exercise_style::american) {
        std::fill(allowed.begin(), allowed.end(), 1);
    } else if (leg.exercise == exercise_style::bermudan) {
        for (double t : leg.exercise_times) {
            const long n = std::lround(t / dt);
            allowed[static_cast<std::size_t>(std::clamp<long>(n, 1, steps))] = 1;
        }
    }
    return allowed;
}

double exercise_value(const option_leg& leg, double s) {
    switch (leg.type) {
        case payoff_kind::call: return std::max(s - leg.strike, 0.0);
        case payoff_kind::put: return std::max(leg.strike - s, 0.0);
        case payoff_kind::digital_call: return s > leg.strike ? leg.payout : (s == leg.strike ? 0.5 * leg.payout : 0.0);
        case payoff_kind::digital_put: return s < leg.strike ? leg.payout : (s == leg.strike ? 0.5 * leg.payout : 0.0);
        case payoff_kind::stock: return s;
    }
    return 0;
}

namespace {

// The sweep is compiled three times on x86-64 Linux with GCC: for AVX-512
// (x86-64-v4), AVX2+FMA (x86-64-v3) and the baseline; the loader picks one at
// start-up (ifunc). Elsewhere,
// including WebAssembly, it is compiled once with the build's own flags.
#if defined(__x86_64__) && defined(__linux__) && defined(__GNUC__) && !defined(__clang__)
#define HEDGELEAF_SWEEP_CLONES __attribute__((target_clones("arch=x86-64-v4", "arch=x86-64-v3", "default")))
#else
#define HEDGELEAF_SWEEP_CLONES
#endif
// The row loops must be inlined into each clone to get its instruction set.
#if defined(__GNUC__)
#define HEDGELEAF_ROW_INLINE [[gnu::always_inline]] inline
#else
#define HEDGELEAF_ROW_INLINE inline
#endif

// Powers of the up/down ratio are clamped here (log scale): nodes that far from
// spot carry no probability mass, and the clamp keeps every product of a row
// factor and a power finite (spot <= 1e9, row factors within e^+-100 of spot).
constexpr double log_power_clamp = 500.0;

// Everything one backward induction needs. Node (n, i) has diffusing spot
// S*_0 u^i d^(n-i) = factor_n * powers[i - centre_n], where powers[k] = (u/d)^k
// for k in [-steps, steps] and centre_n is the node nearest S*_0, so the factor
// stays near S*_0 and one table serves every row: no running product per node.
struct sweep {
    double* v = nullptr;             // row values, size steps + 1
    const double* powers = nullptr;  // points at k = 0 of the table (k in [-centre_steps, steps - centre_steps])
    const char* allowed = nullptr;   // exercise allowed at row n
    const market_data* market = nullptr;
    const option_leg* leg = nullptr;
    int steps = 0;
    double pu = 0, pd = 0;  // discounted up and down probabilities
    double log_s0 = 0, log_d = 0, log_ratio = 0, dt = 0;
    double inv_up = 0, inv_down = 0;  // 1/u and 1/d
    double p_low = 0, p_high = 0;     // the lower and higher of the up probabilities under the
                                      // pricing measure and the share measure (p u / growth)
    bool full = true;                 // sweep every node (no truncation)
    bool early = false, has_dividends = false;
    double updates = 0;               // node updates done
    double row1[2] = {0, 0}, row2[3] = {0, 0, 0};
};

int row_centre(const sweep& w, int n) {
    const double h = std::round(-n * w.log_d / w.log_ratio);
    return static_cast<int>(std::clamp(h, 0.0, static_cast<double>(n)));
}

// Row factor for centre h: S*_0 d^n (u/d)^h.
double row_factor(const sweep& w, int n, int h) {
    return std::exp(std::clamp(w.log_s0 + n * w.log_d + h * w.log_ratio, -700.0, 700.0));
}

// table[j] = (u/d)^(first + j) for j = 0..count-1: exp every 32 entries,
// products between (bounded rounding drift), then the clamp.
void fill_powers(double log_ratio, int first, int count, double* table) {
    const double ratio = std::exp(log_ratio);
    const double lo = std::exp(-log_power_clamp), hi = std::exp(log_power_clamp);
    for (int j = 0; j < count;) {
        double p = std::exp(std::clamp((first + j) * log_ratio, -log_power_clamp, log_power_clamp));
        const int end = std::min(count, j + 32);
        for (; j < end; ++j) {
            table[j] = std::clamp(p, lo, hi);
            p = std::min(p * ratio, hi);
        }
    }
}

// First index i in [0, count) with factor * r[i] >= level (count if none); r increases.
int first_at_or_above(const double* r, int count, double factor, double level) {
    return static_cast<int>(std::lower_bound(r, r + count, level, [factor](double x, double lv) { return factor * x < lv; }) - r);
}
// First index i in [0, count) with factor * r[i] > level.
int first_above(const double* r, int count, double factor, double level) {
    return static_cast<int>(std::upper_bound(r, r + count, level, [factor](double lv, double x) { return lv < factor * x; }) - r);
}

// The hot loops. Each node depends only on the row below, so the loops carry no
// dependency from node to node and the compiler vectorises them; the exercise
// value is one multiply-add on a precomputed power. In place, left to right:
// v[i] is overwritten only after v[i] and v[i + 1] are read.
HEDGELEAF_ROW_INLINE void continue_range(double* __restrict v, int from, int to, double pu, double pd) {
    for (int i = from; i < to; ++i) v[i] = pu * v[i + 1] + pd * v[i];
}
HEDGELEAF_ROW_INLINE void put_range(double* __restrict v, const double* __restrict r, int from, int to, double pu, double pd,
                      double level, double factor) {
    for (int i = from; i < to; ++i) v[i] = std::max(pu * v[i + 1] + pd * v[i], level - factor * r[i]);
}
HEDGELEAF_ROW_INLINE void call_range(double* __restrict v, const double* __restrict r, int from, int to, double pu, double pd,
                       double level, double factor) {
    for (int i = from; i < to; ++i) v[i] = std::max(pu * v[i + 1] + pd * v[i], factor * r[i] - level);
}

// How a row treats early exercise, planned once per row before its tiles run.
enum class row_rule : unsigned char { hold, put, call, general };

struct row_plan {
    row_rule rule = row_rule::hold;
    int lo = 0, hi = 0;            // nodes swept: [lo, hi] (the probable band, or the whole row)
    int next_lo = 0, next_hi = 0;  // the band of the row below (row n + 1)
    int split = 0;             // put: exercise can pay in [0, split); call: in [split, n]
    double factor = 0;         // node i's diffusing spot is factor * r[i]
    double level = 0;          // strike - pv of the dividends still to come
    double pv = 0;
    const double* r = nullptr;
};

// Row factors and exercise boundaries move by at most a node per row, so they
// are carried from row to row instead of recomputed (an exp and a search per
// row cost as much as a few hundred node updates).
struct row_tracker {
    int n = -1, centre = 0, put_split = -1, call_split = -1;
    double factor = 0;
    int band_lo = 0, band_hi = 0;  // band of the last row planned
};

// The probable band of row n. Node i of row n is reached after i up moves in n:
// a binomial count. By Hoeffding's inequality (1963) it strays t from its mean
// with probability at most 2 exp(-2 t^2 / n); with t = 6 sqrt(n) + 1 that is
// below 1e-31 per row, 1e-26 over 50,000 rows. Outside the band of both
// measures (the pricing one, and the share one that weighs a call's payoff by
// spot) a path contributes less than that fraction of the premium, so those
// nodes are skipped and read as zero: the premium moves by far less than
// rounding, and a long lattice costs about 12 sqrt(n) nodes a row, not n.
void row_band(const sweep& w, int n, int& lo, int& hi) {
    if (w.full) {
        lo = 0;
        hi = n;
        return;
    }
    const double t = 6.0 * std::sqrt(static_cast<double>(n)) + 1.0;
    lo = static_cast<int>(std::max(0.0, std::floor(n * w.p_low - t)));
    hi = static_cast<int>(std::min(static_cast<double>(n), std::ceil(n * w.p_high + t)));
}

void plan_row(sweep& w, int n, row_plan& plan, row_tracker& track) {
    plan = row_plan{};
    plan.next_lo = track.band_lo;
    plan.next_hi = track.band_hi;
    row_band(w, n, plan.lo, plan.hi);
    track.band_lo = plan.lo;
    track.band_hi = plan.hi;
    w.updates += plan.hi - plan.lo + 1;
    if (!(w.early && w.allowed[n])) return;
    const int h = row_centre(w, n);
    // Exact every 64 rows (bounds the drift of the product), otherwise one multiply:
    // going down a row divides by d, and by u when the centre also moves down.
    if (track.n == n + 1 && n % 64 != 0 && (track.centre == h || track.centre == h + 1)) {
        track.factor *= track.centre == h ? w.inv_down : w.inv_up;
    } else {
        track.factor = row_factor(w, n, h);
    }
    track.n = n;
    track.centre = h;
    plan.factor = track.factor;
    plan.r = w.powers - h;
    plan.pv = w.has_dividends ? w.market->dividend_pv(n * w.dt, w.leg->expiry) : 0.0;
    plan.level = w.leg->strike - plan.pv;
    const double f = plan.factor, level = plan.level;
    const double* r = plan.r;
    if (w.leg->type == payoff_kind::put) {
        // First node whose exercise value is not positive (spots increase with i).
        int m = track.put_split < 0 ? first_at_or_above(r, n + 1, f, level) : std::min(track.put_split, n + 1);
        while (m > 0 && f * r[m - 1] >= level) --m;
        while (m <= n && f * r[m] < level) ++m;
        plan.rule = row_rule::put;
        plan.split = track.put_split = m;
    } else if (w.leg->type == payoff_kind::call) {
        int m = track.call_split < 0 ? first_above(r, n + 1, f, level) : std::min(track.call_split, n + 1);
        while (m > 0 && f * r[m - 1] > level) --m;
        while (m <= n && !(f * r[m] > level)) ++m;
        plan.rule = row_rule::call;
        plan.split = track.call_split = m;
    } else {
        plan.rule = row_rule::general;
    }
}

// Row plan.rule's nodes [lo, hi) within its band, left to right.
HEDGELEAF_ROW_INLINE void apply_row(const sweep& w, const row_plan& plan, int lo, int hi) {
    double* v = w.v;
    if (!w.full) {
        lo = std::max(lo, plan.lo);
        hi = std::min(hi, plan.hi + 1);
        if (lo >= hi) return;
        // Values of row n + 1 read here but outside its band count as zero.
        for (int j = lo; j <= hi && j < plan.next_lo; ++j) v[j] = 0;
        for (int j = std::max(lo, plan.next_hi + 1); j <= hi; ++j) v[j] = 0;
    }
    // At the end of a row (or of its band) the loops run on to a whole number of
    // 8-node vectors: the extra nodes are never read (the rows above are shorter,
    // and a band's neighbours are zeroed before use), and no loop is left with a
    // scalar remainder. Likewise the put's exercise range is rounded up and the
    // call's down: there max(hold, exercise) is hold, the same value.
    const int end = hi == plan.hi + 1 ? lo + (hi - lo + 7) / 8 * 8 : hi;
    switch (plan.rule) {
        case row_rule::hold:
            continue_range(v, lo, end, w.pu, w.pd);
            return;
        case row_rule::put: {
            const int m = std::min(end, lo + (std::clamp(plan.split, lo, hi) - lo + 7) / 8 * 8);
            put_range(v, plan.r, lo, m, w.pu, w.pd, plan.level, plan.factor);
            continue_range(v, m, end, w.pu, w.pd);
            return;
        }
        case row_rule::call: {
            const int m = lo + (std::clamp(plan.split, lo, hi) - lo) / 8 * 8;
            continue_range(v, lo, m, w.pu, w.pd);
            call_range(v, plan.r, m, end, w.pu, w.pd, plan.level, plan.factor);
            return;
        }
        case row_rule::general:
            for (int i = lo; i < hi; ++i)
                v[i] = std::max(w.pu * v[i + 1] + w.pd * v[i], exercise_value(*w.leg, plan.factor * plan.r[i] + plan.pv));
            return;
    }
}

// Rows are swept in bands of tile_rows; each band runs tile by tile across the
// nodes so that a tile's values stay in the level-1 cache for all its rows
// (one pass over memory per band, not per row). Row t of a band covers nodes
// [a - t, a + tile_nodes - t) of tile a: the values it needs from row t - 1 were
// computed just before, in this tile or the one to its left.
constexpr int tile_rows = 32;
constexpr int tile_nodes = 1024;

// Subnormal values appear only where a lattice value decays towards zero far
// from spot; flushing them to zero changes a price by less than 1e-307 and
// avoids the processor's slow path for them. The mode is restored on return.
class flush_subnormals {
public:
#if defined(__SSE__) || defined(__x86_64__)
    flush_subnormals() : saved_(_mm_getcsr()) { _mm_setcsr(saved_ | 0x8040u); }  // FTZ | DAZ
    ~flush_subnormals() { _mm_setcsr(saved_); }
private:
    unsigned saved_;
#endif
};

// The whole backward induction: one call per price (V8 tiers a function up
// between calls, not inside a long one).
HEDGELEAF_SWEEP_CLONES void run_sweep(sweep& w) {
    [[maybe_unused]] const flush_subnormals flush;
    row_plan plans[tile_rows];
    row_tracker track;
    row_band(w, w.steps, track.band_lo, track.band_hi);
    for (int top = w.steps - 1; top >= 0; top -= tile_rows) {
        const int rows = std::min(tile_rows, top + 1);
        for (int t = 0; t < rows; ++t) plan_row(w, top - t, plans[t], track);
        for (int a = 0; a <= top; a += tile_nodes) {
            for (int t = 0; t < rows; ++t) {
                const int n = top - t;
                const int lo = std::max(0, a - t), hi = std::min(n + 1, a + tile_nodes - t);
                if (lo < hi) apply_row(w, plans[t], lo, hi);
                if (a == 0 && n == 2) std::copy(w.v, w.v + 3, w.row2);
                if (a == 0 && n == 1) std::copy(w.v, w.v + 2, w.row1);
            }
        }
    }
}

// One buffer per thread, grown when needed and reused by every price: the
// induction allocates nothing once warm.
std::vector<double>& scratch(std::size_t size) {
    thread_local std::vector<double> buffer;
    if (buffer.size() < size) buffer.resize(size);
    return buffer;
}

}  // namespace

induction_result induce(const market_data& market, const option_leg& leg, lattice_method method, int steps,
                        lattice_extent extent) {
    const int n_steps = effective_steps(method, steps);
    const double T = leg.expiry;
    const lattice_step st = make_step(method, market, leg.strike, T, n_steps);
    const double s0 = diffusing_spot(market, T);
    const std::vector<char> allowed = exercise_steps(leg, n_steps, st.dt);
    const std::size_t width = static_cast<std::size_t>(n_steps) + 1;
    sweep w;
    w.allowed = allowed.data();
    w.market = &market;
    w.leg = &leg;
    w.steps = n_steps;
    w.pu = st.discount * st.p_up;
    w.pd = st.discount * (1 - st.p_up);
    w.log_s0 = std::log(s0);
    w.log_d = std::log(st.down);
    w.log_ratio = std::log(st.up) - w.log_d;
    w.dt = st.dt;
    w.inv_up = 1 / st.up;
    w.inv_down = 1 / st.down;
    w.early = leg.exercise != exercise_style::european;
    w.has_dividends = !market.dividends.empty();
    w.full = extent == lattice_extent::full;
    const double p_share = std::min(1.0, st.p_up * st.up / st.growth);
    w.p_low = std::min(st.p_up, p_share);
    w.p_high = std::max(st.p_up, p_share);

    // Centres never decrease with n and nor does n - centre, so row n's powers
    // k = i - centre_n all lie in [-centre_steps, steps - centre_steps]: steps + 1 entries.
    const int last_centre = row_centre(w, n_steps);
    // Both rows start on a 64-byte boundary (a cache line; whole AVX-512 vectors).
    // Eight spare entries after each row: the sweep runs whole vectors past a row's end.
    const std::size_t padded = (width + 7) / 8 * 8 + 8;
    std::vector<double>& buffer = scratch(2 * padded + 8);
    double* base = buffer.data();
    base += (8 - reinterpret_cast<std::uintptr_t>(base) / sizeof(double) % 8) % 8;
    w.v = base;
    fill_powers(w.log_ratio, -last_centre, n_steps + 1 + 8, base + padded);
    w.powers = base + padded + last_centre;

    {  // the payoff row at expiry (no dividends left to add)
        const double factor = row_factor(w, n_steps, last_centre);
        const double* r = w.powers - last_centre;
        double* v = w.v;
        if (leg.type == payoff_kind::put) {
            for (int i = 0; i <= n_steps; ++i) v[i] = std::max(leg.strike - factor * r[i], 0.0);
        } else if (leg.type == payoff_kind::call) {
            for (int i = 0; i <= n_steps; ++i) v[i] = std::max(factor * r[i] - leg.strike, 0.0);
        } else {
            for (int i = 0; i <= n_steps; ++i) v[i] = exercise_value(leg, factor * r[i]);
        }
    }
    if (n_steps == 1) std::copy(w.v, w.v + 2, w.row1);
    if (n_steps == 2) std::copy(w.v, w.v + 3, w.row2);
    run_sweep(w);
    const double* row1 = w.row1;
    const double* row2 = w.row2;

    induction_result out;
    out.value = w.v[0];
    out.node_updates = w.updates;
    charge_work(w.updates);
    const double su = s0 * st.up, sd = s0 * st.down;
    out.delta = (row1[1] - row1[0]) / (su - sd);
    double v_at_s0_later;  // value at today's S* one or two steps later
    double later;
    if (n_steps >= 2) {
        const double suu = su * st.up, sud = su * st.down, sdd = sd * st.down;
        const double delta_up = (row2[2] - row2[1]) / (suu - sud);
        const double delta_down = (row2[1] - row2[0]) / (sud - sdd);
        out.gamma = (delta_up - delta_down) / (0.5 * (suu - sdd));
        // Quadratic through the three step-2 nodes, read at S*_0.
        const double x = s0;
        v_at_s0_later = row2[0] * (x - sud) * (x - suu) / ((sdd - sud) * (sdd - suu)) +
                        row2[1] * (x - sdd) * (x - suu) / ((sud - sdd) * (sud - suu)) +
                        row2[2] * (x - sdd) * (x - sud) / ((suu - sdd) * (suu - sud));
        later = 2 * st.dt;
    } else {
        v_at_s0_later = row1[0] + out.delta * (s0 - sd);
        later = st.dt;
    }
    // Tree theta holds S* fixed; with dividends S* = spot - PV drifts as time passes.
    out.theta = (v_at_s0_later - out.value) / later - out.delta * market.rate * market.dividend_pv(0, T);
    return out;
}

lattice_price price_lattice_only(const market_data& market, const option_leg& leg, const lattice_settings& settings) {
    lattice_price out;
    if (leg.type == payoff_kind::stock) {
        out.premium = market.spot;
        out.sensitivities.delta = 1;
        return out;
    }
    // Inputs are held to max_spread when read; bumps and scenario shifts may go a little past it,
    // and up to about 26 the lattice still holds every spot that matters.
    if (market.volatility * std::sqrt(leg.expiry) > 1.25 * max_spread)
        fail("market.volatility", format_number(market.volatility) + " over " + format_number(leg.expiry) +
                                      " years spreads spot too wide for the lattice (volatility x sqrt(expiry) above " +
                                      format_number(1.25 * max_spread) + ")");
    const lattice_method method = settings.method;
    const int fine = effective_steps(method, settings.steps > 0 ? settings.steps : default_steps(method));
    int coarse = effective_steps(method, std::max(1, fine / 2));
    if (method == lattice_method::leisen_reimer && coarse >= fine) coarse = fine + 2;  // fine == 1
    if (coarse >= fine && method != lattice_method::leisen_reimer) coarse = fine + 1;
    const bool can_extrapolate = coarse < fine;

    const induction_result f = induce(market, leg, method, fine);
    const induction_result c = induce(market, leg, method, coarse);
    // Leisen-Reimer converges at second order for European vanillas; early
    // exercise and digitals bring first-order terms.
    const bool early_may_pay = leg.exercise != exercise_style::european && early_exercise_can_pay(market, leg);
    const int order = (method == lattice_method::leisen_reimer && !early_may_pay && is_vanilla(leg.type)) ? 2 : 1;
    out.steps = fine;
    out.coarse_steps = coarse;
    if (settings.extrapolate && can_extrapolate) {
        const double w = weights(fine, coarse, order).weight_fine;
        const auto mix = [w](double a, double b) { return w * a + (1 - w) * b; };
        out.premium = mix(f.value, c.value);
        out.sensitivities.delta = mix(f.delta, c.delta);
        out.sensitivities.gamma = mix(f.gamma, c.gamma);
        out.sensitivities.theta = mix(f.theta, c.theta);
        out.error_estimate = std::fabs(out.premium - f.value);
        out.extrapolated = true;
    } else {
        out.premium = f.value;
        out.sensitivities.delta = f.delta;
        out.sensitivities.gamma = f.gamma;
        out.sensitivities.theta = f.theta;
        if (can_extrapolate) {
            const double w = weights(fine, coarse, order).weight_fine;
            out.error_estimate = std::fabs((w - 1) * (f.value - c.value));
        } else {
            out.error_estimate = std::fabs(f.value - c.value);
        }
    }
    return out;
}

lattice_price price_on_lattice(const market_data& market, const option_leg& leg, const lattice_settings& settings) {
    lattice_price out = price_lattice_only(market, leg, settings);
    if (leg.type == payoff_kind::stock) return out;
    // Vega and rho by central differences; where one side of a bump leaves the lattice's
    // no-arbitrage region (a tiny volatility beside a large rate gap), a one-sided difference
    // from the price already known. The typed inputs were priced above, so any refusal
    // here is the bump's, never the user's.
    const auto premium_with = [&](double vol, double rate) -> std::optional<double> {
        market_data m = market;
        m.volatility = vol;
        m.rate = rate;
        try {
            return price_lattice_only(m, leg, settings).premium;
        } catch (const work_exhausted&) {
            throw;  // the budget, not this trial value
        } catch (const input_error&) {
            return std::nullopt;
        }
    };
    const auto slope = [&](std::optional<double> up, std::optional<double> down, double h) {
        if (up && down) return (*up - *down) / (2 * h);
        if (up) return (*up - out.premium) / h;
        if (down) return (out.premium - *down) / h;
        fail("market.volatility", "the lattice cannot be bumped on either side of these inputs to measure vega and rho; "
                                  "raise the volatility or lattice.steps");
    };
    const double hv = std::min(vega_bump, 0.5 * market.volatility);
    out.sensitivities.vega = slope(premium_with(market.volatility + hv, market.rate),
                                   premium_with(market.volatility - hv, market.rate), hv);
    out.sensitivities.rho = slope(premium_with(market.volatility, market.rate + rho_bump),
                                  premium_with(market.volatility, market.rate - rho_bump), rho_bump);
    return out;
}

}  // namespace hedgeleaf
