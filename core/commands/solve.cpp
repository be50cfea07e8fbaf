// Hedgeleaf commands: the `solve` section and the solve command's result (see solve.hpp).
#include "commands/solve.hpp"

#include "analytics/leg_market.hpp"
#include "commands/cautions.hpp"
#include "commands/trade_reader.hpp"

namespace hedgeleaf {

namespace {

/// Read solve.lower / solve.upper with defaults and limits.
void read_bounds(field_reader& r, solve_settings& s, double default_lower, double default_upper, double limit_upper) {
    s.lower_path = r.child("lower");
    s.upper_path = r.child("upper");
    s.lower = r.number_or("lower", default_lower);
    s.upper = r.number_or("upper", default_upper);
    require_positive(s.lower, s.lower_path);
    require_at_most(s.upper, limit_upper, s.upper_path);
    if (!(s.lower < s.upper))
        fail(s.upper_path, "must be above solve.lower " + format_number(s.lower) + ", got " + format_number(s.upper));
}

/// solve.leg: which leg (0 to the last); the stock has no strike or volatility to solve.
std::size_t read_leg(field_reader& r, const trade& t, const char* what) {
    const long last = static_cast<long>(t.legs.size()) - 1;
    const std::size_t leg = static_cast<std::size_t>(r.integer_or("leg", 0, 0, last));
    if (t.legs[leg].type == payoff_kind::stock)
        fail(r.child("leg"), "leg " + std::to_string(leg) + " is the stock; it has no " + what + " to solve");
    return leg;
}

/// The net premium per unit to solve for: within the price cap either way (a target beyond it
/// would swallow the premium in rounding, and every strike would look alike).
void require_target(double target, const std::string& path) {
    if (!(std::fabs(target) <= max_price_level))
        fail(path, "must be between -" + format_number(max_price_level) + " and " + format_number(max_price_level) +
                       " (a net premium per unit), got " + format_number(target));
}

void read_volatility_terms(field_reader& r, const trade& t, solve_settings& s) {
    s.target_premium = r.number("target_premium");
    require_target(s.target_premium, r.child("target_premium"));
    s.one_leg = r.has("leg");
    if (s.one_leg) s.leg = read_leg(r, t, "volatility");
    const volatility_range range = default_volatility_range(t, s.one_leg ? std::optional(s.leg) : std::nullopt);
    if (!t.market.smile || s.one_leg) {
        read_bounds(r, s, range.lower, range.upper, range.upper);
        return;
    }
    // A parallel move of the smile: it may be negative, within what keeps every leg priceable.
    s.lower_path = r.child("lower");
    s.upper_path = r.child("upper");
    s.lower = r.number_or("lower", range.lower);
    s.upper = r.number_or("upper", range.upper);
    require_at_least(s.lower, range.lower, s.lower_path);
    require_at_most(s.upper, range.upper, s.upper_path);
    if (!(s.lower < s.upper))
        fail(s.upper_path, "must be above solve.lower " + format_number(s.lower) + ", got " + format_number(s.upper));
}

void read_strike_terms(field_reader& r, const trade& t, solve_settings& s) {
    const long last = static_cast<long>(t.legs.size()) - 1;
    const std::string leg_path = r.child("leg");
    if (last > 0 && !r.has("leg"))
        fail(leg_path, "is required: which leg's strike to solve (0 to " + std::to_string(last) +
                           ", in the order of "
                           "the legs; a ready-made structure lists its legs in the result of price)");
    s.leg = read_leg(r, t, "strike");
    s.target_premium = r.number_or("target_premium", 0.0);
    require_target(s.target_premium, r.child("target_premium"));
    read_bounds(r, s, t.market.spot / 4, t.market.spot * 4, max_price_level);
}

void read_quantity_terms(field_reader& r, solve_settings& s) {
    const std::string budget_path = r.child("budget");
    s.budget = r.number("budget");
    require_positive(s.budget, budget_path);
    require_at_most(s.budget, max_budget, budget_path);
    s.lot_size = r.number_optional("lot_size");
    if (s.lot_size) {
        require_at_least(*s.lot_size, min_lot_size, r.child("lot_size"));
        require_at_most(*s.lot_size, max_quantity, r.child("lot_size"));
    }
}

json leg_rows(const std::vector<solved_leg>& legs, bool detail) {
    json rows = json::array();
    for (std::size_t i = 0; i < legs.size(); ++i) {
        const option_leg& leg = legs[i].leg;
        const bool stock = leg.type == payoff_kind::stock;
        json row{{"leg", i}, {"type", to_string(leg.type)}, {"quantity", leg.quantity}, {"premium", legs[i].premium}};
        row["strike"] = stock ? json(nullptr) : json(leg.strike);
        row["expiry_years"] = stock ? json(nullptr) : json(leg.expiry_years);
        row["exercise"] = stock ? json(nullptr) : json(to_string(leg.exercise));
        if (detail) row["volatility"] = stock ? json(nullptr) : json(legs[i].volatility);
        rows.push_back(row);
    }
    return rows;
}

json rounded_json(const trade& t, const rounded_strike& r, bool detail) {
    return json{{"strike", r.strike},
                {"strike_percent_of_spot", 100 * r.strike / t.market.spot},
                {"strike_tick", *t.strike_tick},
                {"premium", r.premium},
                {"residual", r.residual},
                {"residual_position", r.residual * t.quantity},
                {"rows", leg_rows(r.legs, detail)}};
}

// The part that depends on the unknown, in the order the result gives it.
json unknown_json(const trade& t, const solve_settings& s, const solve_result& r) {
    const bool detail = shows_market_detail(t) || s.one_leg;
    if (s.unknown == solve_unknown::volatility) {
        json out{{"solution", r.solution},
                 {"target_premium", r.target_premium},
                 {"lower", s.lower},
                 {"upper", s.upper},
                 {"rows", leg_rows(r.legs, detail)}};
        if (detail) out["solved_for"] = r.solved_for;
        if (s.one_leg) out["leg"] = s.leg;
        return out;
    }
    if (s.unknown == solve_unknown::strike) {
        json out{{"solution", r.solution}, {"leg", s.leg},     {"target_premium", r.target_premium},
                 {"lower", s.lower},       {"upper", s.upper}, {"rows", leg_rows(r.legs, detail)}};
        if (detail) out["solution_percent_of_spot"] = 100 * r.solution / t.market.spot;
        if (r.rounded) out["rounded"] = rounded_json(t, *r.rounded, detail);
        return out;
    }
    json out{{"solution", r.solution},
             {"target_premium", r.target_premium},
             {"budget", s.budget},
             {"rows", leg_rows(r.legs, detail)}};
    if (s.lot_size) {
        out["lot_size"] = *s.lot_size;
        out["quantity_in_lots"] = r.quantity_in_lots;
        out["premium_in_lots"] = r.premium_in_lots;
        out["budget_left"] = r.budget_left;
    }
    return out;
}

}  // namespace

solve_settings read_solve_settings(const json& document, const trade& t) {
    const json* section = section_of(document, "solve");
    if (!section)
        fail("solve", "is required for the solve command: {\"for\": \"volatility\" | \"strike\" | \"quantity\", ...}");
    field_reader r(*section, "solve");
    solve_settings s;
    s.unknown = enum_of<solve_unknown>(solve_unknowns, r.choice("for", solve_unknowns));
    if (s.unknown == solve_unknown::volatility)
        read_volatility_terms(r, t, s);
    else if (s.unknown == solve_unknown::strike)
        read_strike_terms(r, t, s);
    else
        read_quantity_terms(r, s);
    r.finish();
    return s;
}

json write_solve_result(const trade& t, const solve_settings& s, const solve_result& r) {
    json out = unknown_json(t, s, r);
    out["solve_for"] = word_of(solve_unknowns, s.unknown);
    out["residual"] = r.residual;
    out["residual_position"] = r.residual_position;
    out["iterations"] = r.root.iterations;
    out["evaluations"] = r.evaluations;
    out["premium_at_solution"] = r.premium_at_solution;
    out["quantity"] = r.quantity;
    out["notional"] = r.notional;
    out["position_premium"] = r.position_premium;
    out["within_tolerance"] = r.within_tolerance;
    out["pricing"] = r.pricing;
    out["method"] = s.unknown == solve_unknown::quantity ? "direct" : "brent";
    out["columns"] = {"leg", "type", "strike", "expiry_years", "exercise", "quantity", "premium"};
    if (shows_market_detail(t) || s.one_leg) out["columns"].push_back("volatility");
    out["notes"] = r.notes;
    out["caution"] = client_caution(!t.market.is_plain());
    return out;
}

}  // namespace hedgeleaf
