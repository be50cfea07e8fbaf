// Hedgeleaf numerics: the backward-induction kernel (see lattice.hpp).
//
// One induction per price: rows swept in cache-sized tiles, early exercise planned
// once per row, nodes a path almost never reaches skipped (the probable band).
#include "numerics/lattice.hpp"

#include "numerics/work_meter.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#if defined(__SSE__) || defined(__x86_64__)
#include <xmmintrin.h>
#endif

namespace hedgeleaf {

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
// In WebAssembly the sweep stays a function of its own, not inlined into induce: the
// browser's optimising compiler takes a time that grows faster than a function's size, and
// induce with the sweep inside is the largest hot function of the module (18 KB of code,
// some 300 ms of a 2-core laptop's second core while the page opens).
#if defined(__EMSCRIPTEN__)
#define HEDGELEAF_SWEEP_APART [[gnu::noinline]]
#else
#define HEDGELEAF_SWEEP_APART
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

// What differs from step to step on a piecewise grid (numerics/lattice.hpp): per step n
// the discounted probabilities and 1/u, 1/d; per row the log offset, the time and the
// cumulative up probabilities of the band's two measures.
struct varying_steps {
    std::vector<double> pu, pd, inv_up, inv_down;
    std::vector<double> offset, time, mean_low, mean_high;
};

// Everything one backward induction needs. Node (n, i) has diffusing spot
// S*_0 u^i d^(n-i) = factor_n * powers[i - centre_n], where powers[k] = (u/d)^k
// for k in [-steps, steps] and centre_n is the node nearest S*_0, so the factor
// stays near S*_0 and one table serves every row: no running product per node.
// On a piecewise grid d^n becomes exp(offset_n) and the per-step figures come from `vary`.
struct sweep {
    double* v = nullptr;             // row values, size steps + 1
    const double* powers = nullptr;  // points at k = 0 of the table (k in [-max centre, max (n - centre)])
    const char* allowed = nullptr;   // exercise allowed at row n
    const market_data* market = nullptr;
    const option_leg* leg = nullptr;
    const varying_steps* vary = nullptr;  // piecewise grid; nullptr: one step repeated
    int steps = 0;
    double pu = 0, pd = 0;  // discounted up and down probabilities
    double log_s0 = 0, log_d = 0, log_ratio = 0, dt = 0;
    double inv_up = 0, inv_down = 0;  // 1/u and 1/d
    double p_low = 0, p_high = 0;     // the lower and higher of the up probabilities under the
                                      // pricing measure and the share measure (p u / growth)
    bool full = true;                 // sweep every node (no truncation)
    bool early = false, has_dividends = false;
    double updates = 0;  // node updates done
    double row1[2] = {0, 0}, row2[3] = {0, 0, 0};
};

int row_centre(const sweep& w, int n) {
    const double h = std::round(w.vary ? -w.vary->offset[n] / w.log_ratio : -n * w.log_d / w.log_ratio);
    return static_cast<int>(std::clamp(h, 0.0, static_cast<double>(n)));
}

// Row factor for centre h: S*_0 d^n (u/d)^h.
double row_factor(const sweep& w, int n, int h) {
    if (w.vary) return std::exp(std::clamp(w.log_s0 + w.vary->offset[n] + h * w.log_ratio, -700.0, 700.0));
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
    return static_cast<int>(
        std::lower_bound(r, r + count, level, [factor](double x, double lv) { return factor * x < lv; }) - r);
}
// First index i in [0, count) with factor * r[i] > level.
int first_above(const double* r, int count, double factor, double level) {
    return static_cast<int>(
        std::upper_bound(r, r + count, level, [factor](double lv, double x) { return lv < factor * x; }) - r);
}

// The hot loops. Each node depends only on the row below, so the loops carry no
// dependency from node to node and the compiler vectorises them; the exercise
// value is one multiply-add on a precomputed power. In place, left to right:
// v[i] is overwritten only after v[i] and v[i + 1] are read.
HEDGELEAF_ROW_INLINE void continue_range(double* __restrict v, int from, int to, double pu, double pd) {
    for (int i = from; i < to; ++i) v[i] = pu * v[i + 1] + pd * v[i];
}
HEDGELEAF_ROW_INLINE void put_range(double* __restrict v, const double* __restrict r, int from, int to, double pu,
                                    double pd, double level, double factor) {
    for (int i = from; i < to; ++i) v[i] = std::max(pu * v[i + 1] + pd * v[i], level - factor * r[i]);
}
HEDGELEAF_ROW_INLINE void call_range(double* __restrict v, const double* __restrict r, int from, int to, double pu,
                                     double pd, double level, double factor) {
    for (int i = from; i < to; ++i) v[i] = std::max(pu * v[i + 1] + pd * v[i], factor * r[i] - level);
}

// How a row treats early exercise, planned once per row before its tiles run.
enum class row_rule : unsigned char { hold, put, call, general };

struct row_plan {
    row_rule rule = row_rule::hold;
    double pu = 0, pd = 0;         // this row's discounted probabilities
    int lo = 0, hi = 0;            // nodes swept: [lo, hi] (the probable band, or the whole row)
    int next_lo = 0, next_hi = 0;  // the band of the row below (row n + 1)
    int split = 0;                 // put: exercise can pay in [0, split); call: in [split, n]
    double factor = 0;             // node i's diffusing spot is factor * r[i]
    double level = 0;              // strike - pv of the dividends still to come
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
    // Hoeffding's bound holds for a sum of moves with different probabilities too, about its mean.
    const double mean_low = w.vary ? w.vary->mean_low[n] : n * w.p_low;
    const double mean_high = w.vary ? w.vary->mean_high[n] : n * w.p_high;
    lo = static_cast<int>(std::max(0.0, std::floor(mean_low - t)));
    hi = static_cast<int>(std::min(static_cast<double>(n), std::ceil(mean_high + t)));
}

HEDGELEAF_SWEEP_APART void plan_row(sweep& w, int n, row_plan& plan, row_tracker& track) {
    plan = row_plan{};
    plan.pu = w.vary ? w.vary->pu[n] : w.pu;
    plan.pd = w.vary ? w.vary->pd[n] : w.pd;
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
        if (w.vary)
            track.factor *= track.centre == h ? w.vary->inv_down[n] : w.vary->inv_up[n];
        else
            track.factor *= track.centre == h ? w.inv_down : w.inv_up;
    } else {
        track.factor = row_factor(w, n, h);
    }
    track.n = n;
    track.centre = h;
    plan.factor = track.factor;
    plan.r = w.powers - h;
    plan.pv = w.has_dividends ? w.market->dividend_pv(w.vary ? w.vary->time[n] : n * w.dt, w.leg->expiry_years) : 0.0;
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
        case row_rule::hold: continue_range(v, lo, end, plan.pu, plan.pd); return;
        case row_rule::put: {
            const int m = std::min(end, lo + (std::clamp(plan.split, lo, hi) - lo + 7) / 8 * 8);
            put_range(v, plan.r, lo, m, plan.pu, plan.pd, plan.level, plan.factor);
            continue_range(v, m, end, plan.pu, plan.pd);
            return;
        }
        case row_rule::call: {
            const int m = lo + (std::clamp(plan.split, lo, hi) - lo) / 8 * 8;
            continue_range(v, lo, m, plan.pu, plan.pd);
            call_range(v, plan.r, m, end, plan.pu, plan.pd, plan.level, plan.factor);
            return;
        }
        case row_rule::general:
            for (int i = lo; i < hi; ++i)
                v[i] = std::max(plan.pu * v[i + 1] + plan.pd * v[i],
                                exercise_value(*w.leg, plan.factor * plan.r[i] + plan.pv));
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
HEDGELEAF_SWEEP_APART HEDGELEAF_SWEEP_CLONES void run_sweep(sweep& w) {
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

// C(m, j) p^j (1 - p)^(m - j) for j = 0..m into pmf: each term from its neighbour towards the
// mode by the ratio of successive terms (no power of p underflows on the way; terms past the
// smallest double are 0), then all divided by their sum, which is 1 exactly: the scale is not
// taken from log-gamma, whose rounding at m = 20,000 (about 2e-11) would carry into every term.
// Each term keeps a relative rounding error of about its distance from the mode times the
// machine epsilon.
void binomial_weights(int m, double p, double* pmf) {
    if (!(p > 0)) {
        std::fill(pmf, pmf + m + 1, 0.0);
        pmf[0] = 1;
        return;
    }
    if (!(p < 1)) {
        std::fill(pmf, pmf + m + 1, 0.0);
        pmf[m] = 1;
        return;
    }
    const double q = 1 - p;
    const int mode = std::clamp(static_cast<int>(std::floor((m + 1) * p)), 0, m);
    pmf[mode] = 1;
    const double odds = p / q;
    for (int j = mode; j < m; ++j) pmf[j + 1] = pmf[j] * (static_cast<double>(m - j) / (j + 1)) * odds;
    for (int j = mode; j > 0; --j) pmf[j - 1] = pmf[j] * (static_cast<double>(j) / (m - j + 1)) / odds;
    double total = 0;
    for (int j = 0; j <= m; ++j) total += pmf[j];
    for (int j = 0; j <= m; ++j) pmf[j] /= total;
}

// One buffer per thread, grown when needed and reused by every price: the
// induction allocates nothing once warm.
std::vector<double>& scratch(std::size_t size) {
    thread_local std::vector<double> buffer;
    if (buffer.size() < size) buffer.resize(size);
    return buffer;
}

// The sweep's constants for `leg` on the lattice `geo` (diffusing spot s0).
sweep sweep_for(const market_data& market, const option_leg& leg, const lattice_geometry& geo, double s0,
                const std::vector<char>& allowed, lattice_extent extent) {
    const lattice_step& st = geo.step;
    sweep w;
    w.allowed = allowed.data();
    w.market = &market;
    w.leg = &leg;
    w.steps = geo.steps();
    w.pu = st.discount * st.p_up;
    w.pd = st.discount * (1 - st.p_up);
    w.log_s0 = std::log(s0);
    w.log_d = std::log(st.down);
    w.log_ratio = geo.constant ? std::log(st.up) - w.log_d : geo.log_ratio;
    w.dt = st.dt;
    w.inv_up = 1 / st.up;
    w.inv_down = 1 / st.down;
    w.early = leg.exercise != exercise_style::european;
    w.has_dividends = !market.dividends.empty();
    w.full = extent == lattice_extent::full;
    const double p_share = std::min(1.0, st.p_up * st.up / st.growth);
    w.p_low = std::min(st.p_up, p_share);
    w.p_high = std::max(st.p_up, p_share);
    return w;
}

// The per-step figures of a piecewise lattice, for the sweep.
varying_steps varying_of(const lattice_geometry& geo) {
    const int n_steps = geo.steps();
    varying_steps out;
    const std::size_t rows = static_cast<std::size_t>(n_steps) + 1;
    for (auto* v : {&out.pu, &out.pd, &out.inv_up, &out.inv_down}) v->resize(rows - 1);
    for (auto* v : {&out.offset, &out.time, &out.mean_low, &out.mean_high}) v->resize(rows);
    double low = 0, high = 0;
    for (int n = 0; n <= n_steps; ++n) {
        out.offset[n] = geo.offset(n);
        out.time[n] = geo.time(n);
        out.mean_low[n] = low;
        out.mean_high[n] = high;
        if (n == n_steps) break;
        const lattice_step& st = geo.at(n);
        out.pu[n] = st.discount * st.p_up;
        out.pd[n] = st.discount * (1 - st.p_up);
        out.inv_up[n] = 1 / st.up;
        out.inv_down[n] = 1 / st.down;
        const double p_share = std::min(1.0, st.p_up * st.up / st.growth);
        low += std::min(st.p_up, p_share);
        high += std::max(st.p_up, p_share);
    }
    return out;
}

// Point the sweep at the thread's buffer: the row values, then the table of powers.
// Returns the centre of the last row.
int place_rows(sweep& w, int n_steps) {
    const std::size_t width = static_cast<std::size_t>(n_steps) + 1;
    // On one step repeated, centres never decrease with n and nor does n - centre, so row n's
    // powers k = i - centre_n all lie in [-centre_steps, steps - centre_steps]: steps + 1
    // entries. Steps of different lengths may break that; the table then spans every row's range.
    const int last_centre = row_centre(w, n_steps);
    int most_below = last_centre, most_above = n_steps - last_centre;
    if (w.vary)
        for (int n = 0; n < n_steps; ++n) {
            const int h = row_centre(w, n);
            most_below = std::max(most_below, h);
            most_above = std::max(most_above, n - h);
        }
    const int table_count = most_below + most_above + 1 + 8;
    // Both rows start on a 64-byte boundary (a cache line; whole AVX-512 vectors).
    // Eight spare entries after each row: the sweep runs whole vectors past a row's end.
    const std::size_t padded = (width + 7) / 8 * 8 + 8;
    std::vector<double>& buffer = scratch(padded + std::max(padded, static_cast<std::size_t>(table_count)) + 8);
    double* base = buffer.data();
    base += (8 - reinterpret_cast<std::uintptr_t>(base) / sizeof(double) % 8) % 8;
    w.v = base;
    fill_powers(w.log_ratio, -most_below, table_count, base + padded);
    w.powers = base + padded + most_below;
    return last_centre;
}

// The payoff of nodes 0..n_steps at spots factor * r[i] into v.
void payoff_values(const option_leg& leg, double factor, const double* r, int n_steps, double* v) {
    if (leg.type == payoff_kind::put) {
        for (int i = 0; i <= n_steps; ++i) v[i] = std::max(leg.strike - factor * r[i], 0.0);
    } else if (leg.type == payoff_kind::call) {
        for (int i = 0; i <= n_steps; ++i) v[i] = std::max(factor * r[i] - leg.strike, 0.0);
    } else {
        for (int i = 0; i <= n_steps; ++i) v[i] = exercise_value(leg, factor * r[i]);
    }
}

// The payoff row at expiry (no dividends left to add).
void fill_payoff_row(sweep& w, const option_leg& leg, int n_steps, int last_centre) {
    payoff_values(leg, row_factor(w, n_steps, last_centre), w.powers - last_centre, n_steps, w.v);
    if (n_steps == 1) std::copy(w.v, w.v + 2, w.row1);
    if (n_steps == 2) std::copy(w.v, w.v + 3, w.row2);
}

// Delta, gamma and theta from the values of the first two rows.
void first_rows_greeks(const sweep& w, const lattice_geometry& geo, double s0, int n_steps, const market_data& market,
                       double expiry_years, induction_result& out) {
    const double* row1 = w.row1;
    const double* row2 = w.row2;
    const lattice_step& first = geo.at(0);
    const double su = s0 * first.up, sd = s0 * first.down;
    out.delta = (row1[1] - row1[0]) / (su - sd);
    double v_at_s0_later;  // value at today's S* one or two steps later
    double later;
    if (n_steps >= 2) {
        const lattice_step& second = geo.at(1);
        const double suu = su * second.up, sud = su * second.down, sdd = sd * second.down;
        const double delta_up = (row2[2] - row2[1]) / (suu - sud);
        const double delta_down = (row2[1] - row2[0]) / (sud - sdd);
        out.gamma = (delta_up - delta_down) / (0.5 * (suu - sdd));
        // Quadratic through the three step-2 nodes, read at S*_0.
        const double x = s0;
        v_at_s0_later = row2[0] * (x - sud) * (x - suu) / ((sdd - sud) * (sdd - suu)) +
                        row2[1] * (x - sdd) * (x - suu) / ((sud - sdd) * (sud - suu)) +
                        row2[2] * (x - sdd) * (x - sud) / ((suu - sdd) * (suu - sud));
        later = geo.constant ? 2 * first.dt : geo.time(2);
    } else {
        v_at_s0_later = row1[0] + out.delta * (s0 - sd);
        later = first.dt;
    }
    // Tree theta holds S* fixed; with dividends S* = spot - PV drifts as time passes.
    out.theta =
        (v_at_s0_later - out.value) / later - out.delta * market.rate.zero(0) * market.dividend_pv(0, expiry_years);
}

// A European leg that sums directly (sums_directly in lattice.hpp): the payoff row N, then row
// r = min(2, N) as the binomial sum, node (r, k) being
// D(r) sum_j C(N - r, j) p^j (1 - p)^(N - r - j) V(N, k + j) with D(r) the discount from row r to
// expiry, then rows 1 and 0 by the sweep's own step; the Greeks from rows 1 and 2 as the sweep's.
induction_result summed_induction(const market_data& market, const option_leg& leg, lattice_method method,
                                  const time_grid& grid) {
    const summed_lattice lat = make_summed_lattice(method, market, leg.strike, grid);
    const lattice_geometry& head = lat.head;
    const int n_steps = grid.steps, top = std::min(2, n_steps), m = n_steps - top;
    const double T = leg.expiry_years;
    const double s0 = diffusing_spot(market, T);
    // the payoff row, node i at S*_0 exp(last_offset + i L), as the sweep's row factor and powers
    const double log_ratio = head.log_ratio;
    const int centre =
        static_cast<int>(std::clamp(std::round(-lat.last_offset / log_ratio), 0.0, static_cast<double>(n_steps)));
    const std::size_t width = static_cast<std::size_t>(n_steps) + 1;
    std::vector<double>& buffer = scratch(3 * width);
    double* v = buffer.data();
    double* powers = v + width;
    double* pmf = powers + width;
    fill_powers(log_ratio, -centre, n_steps + 1, powers);
    const double factor = std::exp(std::clamp(std::log(s0) + lat.last_offset + centre * log_ratio, -700.0, 700.0));
    payoff_values(leg, factor, powers, n_steps, v);
    binomial_weights(m, head.at(0).p_up, pmf);
    double row[3] = {0, 0, 0};
    for (int k = 0; k <= top; ++k) {
        double sum = 0;
        for (int j = 0; j <= m; ++j) sum += pmf[j] * v[k + j];
        row[k] = lat.discount_to_expiry * sum;
    }
    sweep w;
    for (int n = top; n >= 0; --n) {
        if (n == 2) std::copy(row, row + 3, w.row2);
        if (n == 1) std::copy(row, row + 2, w.row1);
        if (n == 0) break;
        const lattice_step& st = head.at(n - 1);
        const double pu = st.discount * st.p_up, pd = st.discount * (1 - st.p_up);
        for (int k = 0; k < n; ++k) row[k] = pu * row[k + 1] + pd * row[k];
    }
    induction_result out;
    out.value = row[0];
    out.node_updates = summed_work(n_steps);
    out.steps = n_steps;
    out.segments = grid.segments;
    charge_work(out.node_updates);
    first_rows_greeks(w, head, s0, n_steps, market, T, out);
    return out;
}

}  // namespace

induction_result induce(const market_data& market, const option_leg& leg, lattice_method method, int steps,
                        lattice_extent extent) {
    const double T = leg.expiry_years;
    const time_grid grid = make_time_grid(T, effective_steps(method, steps), leg_events(market, leg));
    if (extent == lattice_extent::probable && sums_directly(market, leg, method))
        return summed_induction(market, leg, method, grid);
    const lattice_geometry geo = make_geometry(method, market, leg.strike, grid);
    const int n_steps = geo.steps();
    const double s0 = diffusing_spot(market, T);
    const std::vector<char> allowed = exercise_steps(leg, grid);
    sweep w = sweep_for(market, leg, geo, s0, allowed, extent);
    varying_steps vary;
    if (!geo.constant) {
        vary = varying_of(geo);
        w.vary = &vary;
    }
    const int last_centre = place_rows(w, n_steps);
    fill_payoff_row(w, leg, n_steps, last_centre);
    run_sweep(w);

    induction_result out;
    out.value = w.v[0];
    out.node_updates = w.updates;
    out.steps = n_steps;
    out.segments = grid.segments;
    charge_work(w.updates);
    first_rows_greeks(w, geo, s0, n_steps, market, T, out);
    return out;
}

double summed_work(int steps) { return steps + 4.0; }

double induction_work(int steps) {
    // Row k costs min(k + 1, 14 sqrt(k) + 3): the kernel's band of 2 (6 sqrt(k) + 1) + 1
    // nodes about the centre of each of two measures, with room for their spread.
    // Every node below the crossover, the integral of the band above it.
    const double n = steps;
    const double crossover = 200;  // k + 1 = 14 sqrt(k) + 3 near k = 200
    if (n <= crossover) return n * (n + 1) / 2;
    const double below = crossover * (crossover + 1) / 2;
    const double above = 14.0 * (2.0 / 3.0) * (std::pow(n, 1.5) - std::pow(crossover, 1.5)) + 3.0 * (n - crossover);
    return below + above;
}

}  // namespace hedgeleaf
