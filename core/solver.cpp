// Hedgeleaf core: Brent's root finder and the `solve` command (see solver.hpp).
#include "solver.hpp"

#include "closed_form.hpp"
#include "lattice.hpp"
#include "quote.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>

namespace hedgeleaf {

root_result find_root(const std::function<double(double)>& f, double lower, double upper, const root_options& options) {
    root_result out;
    double a = lower, b = upper;
    double fa = f(a), fb = f(b);
    out.f_lower = fa;
    out.f_upper = fb;
    const auto at = [&](double x, double fx, bool bracketed, bool converged) {
        out.x = x;
        out.fx = fx;
        out.bracketed = bracketed;
        out.converged = converged;
        return out;
    };
    if (!std::isfinite(fa) || !std::isfinite(fb)) return at(b, fb, false, false);
    if (fa == 0) return at(a, fa, true, true);
    if (fb == 0) return at(b, fb, true, true);
    if ((fa > 0) == (fb > 0)) return std::fabs(fa) < std::fabs(fb) ? at(a, fa, false, false) : at(b, fb, false, false);

    // b is the best estimate, c the other end of the bracket, a the previous b.
    double c = a, fc = fa;
    double d = b - a, e = d;
    const double eps = std::numeric_limits<double>::epsilon();
    int iterations = 0;
    bool converged = false;
    for (;;) {
        if ((fb > 0) == (fc > 0)) {
            c = a;
            fc = fa;
            d = e = b - a;
        }
        if (std::fabs(fc) < std::fabs(fb)) {
            a = b; b = c; c = a;
            fa = fb; fb = fc; fc = fa;
        }
        const double tol = 2 * eps * std::fabs(b) + 0.5 * options.x_tolerance;
        const double m = 0.5 * (c - b);
        if (std::fabs(m) <= tol || fb == 0 || std::fabs(fb) <= options.f_tolerance) {
            converged = true;
            break;
        }
        if (iterations >= options.max_iterations) break;
        if (std::fabs(e) >= tol && std::fabs(fa) > std::fabs(fb)) {
            // Interpolate: secant when only two points differ, inverse quadratic otherwise.
            double p, q;
            const double s = fb / fa;
            if (a == c) {
                p = 2 * m * s;
                q = 1 - s;
            } else {
                const double qa = fa / fc, r = fb / fc;
                p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
                q = (qa - 1) * (r - 1) * (s - 1);
            }
            if (p > 0) q = -q;
            else p = -p;
            // Accept the step only if it stays well inside the bracket and shrinks fast enough.
            if (2 * p < std::min(3 * m * q - std::fabs(tol * q), std::fabs(e * q))) {
                e = d;
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        } else {
            d = m;
            e = m;
        }
        a = b;
        fa = fb;
        b += std::fabs(d) > tol ? d : std::copysign(tol, m);
        fb = f(b);
        ++iterations;
        if (!std::isfinite(fb)) break;
    }
    out.iterations = iterations;
    return at(b, fb, true, converged);
}

namespace {

constexpr double max_budget = 1e15;
constexpr double max_quantity = 1e12;
// Re-pricing at the solution must match the target within 1e-8 of notional
// (quantity * spot); the finder aims far tighter so the solved volatility or
// strike itself is accurate even where the premium barely moves with it.
constexpr double target_tolerance = 1e-8;
constexpr double finder_tolerance = 1e-13;

bool on_lattice(const option_leg& leg) {
    return leg.type != payoff_kind::stock && leg.exercise != exercise_style::european;
}

std::string pricing_label(const std::vector<option_leg>& legs) {
    const bool any_lattice = std::any_of(legs.begin(), legs.end(), on_lattice);
    const bool any_closed = std::any_of(legs.begin(), legs.end(), [](const option_leg& l) {
        return l.type != payoff_kind::stock && l.exercise == exercise_style::european;
    });
    if (any_lattice && any_closed) return "closed-form (european legs) and lattice (others)";
    return any_lattice ? "lattice" : "closed-form";
}

double leg_premium(const market_data& m, const option_leg& leg, const lattice_settings& settings) {
    if (leg.type == payoff_kind::stock) return m.spot;
    if (!on_lattice(leg)) return closed_form(m, leg).premium;
    return price_lattice_only(m, leg, settings).premium;
}

/// One unknown to solve for: how the net premium depends on it and where to look.
struct search {
    std::string unknown;      // "volatility", "strike of leg 1"
    double lower = 0, upper = 0;
    std::string lower_path, upper_path;
    double target = 0;        // net premium per unit
    std::function<double(double)> premium_at;
};

// A lattice that cannot be built at a trial value (e.g. a tiny volatility far
// from the strike) is reported against the nearer bound, which is what to change.
double premium_or_fail(const search& s, double x) {
    try {
        return s.premium_at(x);
    } catch (const work_exhausted&) {
        throw;  // the budget, not this trial value
    } catch (const input_error& e) {
        const bool near_lower = std::fabs(std::log(x / s.lower)) <= std::fabs(std::log(s.upper / x));
        fail(near_lower ? s.lower_path : s.upper_path,
             "the lattice cannot price the trade at " + s.unknown + " " + format_number(x) + " (" + e.what() +
                 "); narrow the search range");
    }
}

root_result run_search(const search& s, double spot) {
    root_options options;
    options.f_tolerance = finder_tolerance * spot;
    const root_result r = find_root([&](double x) { return premium_or_fail(s, x) - s.target; }, s.lower, s.upper, options);
    if (r.bracketed) return r;
    const double p_lower = r.f_lower + s.target, p_upper = r.f_upper + s.target;
    const bool too_high = s.target > std::max(p_lower, p_upper);
    // The end whose premium is nearest the target is the bound that stops the search.
    const bool lower_hit = too_high ? p_lower >= p_upper : p_lower <= p_upper;
    const double hit_premium = lower_hit ? p_lower : p_upper;
    fail(lower_hit ? s.lower_path : s.upper_path,
         "no solution: the " + std::string(too_high ? "highest" : "lowest") + " net premium in the search range is " +
             format_number(hit_premium) + " at the " + (lower_hit ? "lower" : "upper") + " bound " + s.unknown + " " +
             format_number(lower_hit ? s.lower : s.upper) + ", " + (too_high ? "below" : "above") +
             " the target " + format_number(s.target) + " (solve.target_premium); widen the range or check the target");
}

/// Read solve.lower / solve.upper with defaults and limits.
void read_bounds(field_reader& r, search& s, double default_lower, double default_upper, double limit_upper) {
    s.lower_path = r.child("lower");
    s.upper_path = r.child("upper");
    s.lower = r.number_or("lower", default_lower);
    s.upper = r.number_or("upper", default_upper);
    require_positive(s.lower, s.lower_path);
    require_at_most(s.upper, limit_upper, s.upper_path);
    if (!(s.lower < s.upper))
        fail(s.upper_path, "must be above solve.lower " + format_number(s.lower) + ", got " + format_number(s.upper));
}

json leg_rows(const market_data& m, const std::vector<option_leg>& legs, const lattice_settings& settings) {
    json rows = json::array();
    for (std::size_t i = 0; i < legs.size(); ++i) {
        const option_leg& leg = legs[i];
        json row{{"leg", i}, {"type", to_string(leg.type)}, {"quantity", leg.quantity},
                 {"premium", leg_premium(m, leg, settings)}};
        row["strike"] = leg.type == payoff_kind::stock ? json(nullptr) : json(leg.strike);
        row["expiry_years"] = leg.type == payoff_kind::stock ? json(nullptr) : json(leg.expiry);
        row["exercise"] = leg.type == payoff_kind::stock ? json(nullptr) : json(to_string(leg.exercise));
        rows.push_back(row);
    }
    return rows;
}

/// The no-arbitrage range of a single call or put premium (spot net of escrowed dividends).
struct premium_range {
    double lower = 0, upper = 0;
    std::string lower_reason, upper_reason;
};

std::optional<premium_range> option_premium_range(const trade& t) {
    if (t.legs.size() != 1) return std::nullopt;
    const option_leg& leg = t.legs.front();
    if (leg.type != payoff_kind::call && leg.type != payoff_kind::put) return std::nullopt;
    const market_data& m = t.market;
    const double forward_spot = (m.spot - m.dividend_pv(0, leg.expiry)) * std::exp(-m.carry_yield * leg.expiry);
    const double pv_strike = leg.strike * std::exp(-m.rate * leg.expiry);
    const bool call = leg.type == payoff_kind::call;
    premium_range out;
    out.lower = std::max(0.0, call ? forward_spot - pv_strike : pv_strike - forward_spot);
    out.lower_reason = call ? "max(spot·e^(-carry·T) - strike·e^(-rate·T), 0)" : "max(strike·e^(-rate·T) - spot·e^(-carry·T), 0)";
    out.upper = call ? forward_spot : pv_strike;
    out.upper_reason = call ? "spot·e^(-carry·T): a call is never worth more than the share"
                            : "strike·e^(-rate·T): a put is never worth more than the strike paid at expiry";
    if (leg.exercise != exercise_style::european) {
        const double intrinsic = std::max(0.0, call ? m.spot - leg.strike : leg.strike - m.spot);
        if (intrinsic >= out.lower) {
            out.lower = intrinsic;
            out.lower_reason = call ? "intrinsic value max(spot - strike, 0)" : "intrinsic value max(strike - spot, 0)";
        }
        out.upper = call ? m.spot : leg.strike;
        out.upper_reason = call ? "spot: a call is never worth more than the share"
                                : "strike: a put is never worth more than its strike";
    }
    if (!m.dividends.empty()) out.lower_reason += ", spot net of dividends";
    return out;
}

json solve_volatility(const trade& t, field_reader& r, json& notes) {
    search s;
    s.unknown = "volatility";
    s.target = r.number("target_premium");
    const std::string target_path = r.child("target_premium");
    const bool any_lattice = std::any_of(t.legs.begin(), t.legs.end(), on_lattice);
    const double highest = highest_volatility(t.final_expiry());  // the lattice's limit for this expiry
    read_bounds(r, s, any_lattice ? 0.01 : 1e-4, highest, highest);
    r.finish();

    if (const auto range = option_premium_range(t)) {
        const std::string kind = to_string(t.legs.front().exercise) + " " + to_string(t.legs.front().type);
        if (!(s.target > range->lower))
            fail(target_path, format_number(s.target) + " is at or below the lowest premium any volatility gives the " +
                                  kind + ", " + format_number(range->lower) + " (" + range->lower_reason + ")");
        if (!(s.target < range->upper))
            fail(target_path, format_number(s.target) + " is at or above the no-arbitrage upper bound of the " + kind +
                                  ", " + format_number(range->upper) + " (" + range->upper_reason + ")");
    } else {
        notes.push_back("the net premium of a structure or a digital need not rise with volatility; the solution "
                        "found in the range is one of possibly several");
    }
    s.premium_at = [&](double vol) {
        market_data m = t.market;
        m.volatility = vol;
        return solver_net_premium(m, t.legs, t.lattice);
    };
    const root_result root = run_search(s, t.market.spot);
    market_data solved = t.market;
    solved.volatility = root.x;
    notes.push_back("market.volatility in the file is not used; the solution replaces it");
    return json{{"solution", root.x}, {"root", {{"x", root.x}, {"fx", root.fx}, {"iterations", root.iterations},
                                                {"converged", root.converged}}},
                {"target_premium", s.target}, {"lower", s.lower}, {"upper", s.upper},
                {"rows", leg_rows(solved, t.legs, t.lattice)}};
}

json solve_strike(const trade& t, field_reader& r, json& notes) {
    const long last = static_cast<long>(t.legs.size()) - 1;
    const std::string leg_path = r.child("leg");
    if (last > 0 && !r.has("leg"))
        fail(leg_path, "is required: which leg's strike to solve (0 to " + std::to_string(last) + ", in the order of "
                           "the legs; a ready-made structure lists its legs in the result of price)");
    const std::size_t index = static_cast<std::size_t>(r.integer_or("leg", 0, 0, last));
    const option_leg& chosen = t.legs[index];
    if (chosen.type == payoff_kind::stock)
        fail(leg_path, "leg " + std::to_string(index) + " is the stock; it has no strike to solve");

    search s;
    s.unknown = "strike of leg " + std::to_string(index);
    s.target = r.number_or("target_premium", 0.0);
    read_bounds(r, s, t.market.spot / 4, t.market.spot * 4, 1e9);
    r.finish();

    std::vector<option_leg> legs = t.legs;
    s.premium_at = [&](double strike) {
        legs[index].strike = strike;
        return solver_net_premium(t.market, legs, t.lattice);
    };
    const root_result root = run_search(s, t.market.spot);
    legs[index].strike = root.x;

    // The solved strike may cross another leg's strike: the position then no
    // longer has the shape the trade was written as (e.g. a collar whose call
    // strike falls below its put strike).
    for (std::size_t j = 0; j < t.legs.size(); ++j) {
        if (j == index || t.legs[j].type == payoff_kind::stock) continue;
        const double before = chosen.strike - t.legs[j].strike, after = root.x - t.legs[j].strike;
        if ((before > 0) != (after > 0) || (before == 0) != (after == 0))
            notes.push_back("the solved strike " + format_number(root.x) + " is " + (after > 0 ? "above" : "below") +
                            " leg " + std::to_string(j) + "'s strike " + format_number(t.legs[j].strike) +
                            ", unlike the trade as written; the legs no longer make the same shape");
    }
    return json{{"solution", root.x}, {"leg", index},
                {"root", {{"x", root.x}, {"fx", root.fx}, {"iterations", root.iterations}, {"converged", root.converged}}},
                {"target_premium", s.target}, {"lower", s.lower}, {"upper", s.upper},
                {"rows", leg_rows(t.market, legs, t.lattice)}};
}

json solve_quantity(const trade& t, field_reader& r, json& notes) {
    const std::string budget_path = r.child("budget");
    const double budget = r.number("budget");
    require_positive(budget, budget_path);
    require_at_most(budget, max_budget, budget_path);
    const std::optional<double> lot = r.number_optional("lot_size");
    if (lot) {
        require_positive(*lot, r.child("lot_size"));
        require_at_most(*lot, max_quantity, r.child("lot_size"));
    }
    r.finish();

    const double premium = solver_net_premium(t.market, t.legs, t.lattice);
    if (!(premium > 0))
        fail(budget_path, "the net premium per unit is " + format_number(premium) +
                              " (the client does not pay premium), so a budget does not fix the quantity");
    const double quantity = budget / premium;
    if (quantity > max_quantity)
        fail(budget_path, "buys " + format_number(quantity) + " units, more than the limit " + format_number(max_quantity));
    notes.push_back("the premium is linear in the quantity: quantity = budget / net premium per unit, no iteration");
    json out{{"solution", quantity}, {"target_premium", budget / quantity}, {"budget", budget},
             {"root", {{"x", quantity}, {"fx", quantity * premium - budget}, {"iterations", 0}, {"converged", true}}},
             {"rows", leg_rows(t.market, t.legs, t.lattice)}};
    if (lot) {
        const double lots = std::floor(quantity / *lot * (1 + 1e-12));
        out["lot_size"] = *lot;
        out["quantity_in_lots"] = lots * *lot;
        out["premium_in_lots"] = lots * *lot * premium;
        out["budget_left"] = budget - lots * *lot * premium;
    }
    return out;
}

}  // namespace

double solver_net_premium(const market_data& market, const std::vector<option_leg>& legs, const lattice_settings& settings) {
    double total = 0;
    for (const auto& leg : legs) total += leg.quantity * leg_premium(market, leg, settings);
    return total;
}

json solve_json(const trade& t) {
    const json* section = t.source.is_object() && t.source.contains("solve") ? &t.source.at("solve") : nullptr;
    if (!section || section->is_null()) fail("solve", "is required for the solve command: {\"for\": \"volatility\" | \"strike\" | \"quantity\", ...}");
    field_reader r(*section, "solve");
    const std::string unknown = r.choice("for", {"volatility", "strike", "quantity"});
    json notes = json::array();
    json out = unknown == "volatility" ? solve_volatility(t, r, notes)
             : unknown == "strike"     ? solve_strike(t, r, notes)
                                       : solve_quantity(t, r, notes);

    const json root = out["root"];
    out.erase("root");
    const double quantity = unknown == "quantity" ? out["solution"].get<double>() : t.quantity;
    const double residual = unknown == "quantity" ? root["fx"].get<double>() / quantity : root["fx"].get<double>();
    const double notional = quantity * t.market.spot;
    out["solve_for"] = unknown;
    out["residual"] = residual;
    out["residual_position"] = residual * quantity;
    out["iterations"] = root["iterations"];
    out["evaluations"] = root["iterations"].get<int>() + (unknown == "quantity" ? 1 : 2);
    out["premium_at_solution"] = out["target_premium"].get<double>() + residual;
    out["quantity"] = quantity;
    out["notional"] = notional;
    out["position_premium"] = (t.client_sells ? -1.0 : 1.0) * quantity * out["premium_at_solution"].get<double>();
    out["within_tolerance"] = std::fabs(residual * quantity) <= target_tolerance * notional;
    if (!out["within_tolerance"].get<bool>())
        notes.push_back("the residual is larger than 1e-8 of notional: the premium jumps near the solution "
                        "(a digital leg or a coarse lattice); check the legs at the solution");
    out["pricing"] = pricing_label(t.legs);
    out["method"] = unknown == "quantity" ? "direct" : "brent";
    out["columns"] = {"leg", "type", "strike", "expiry_years", "exercise", "quantity", "premium"};
    out["notes"] = notes;
    out["caution"] = client_caution();
    return out;
}

}  // namespace hedgeleaf
