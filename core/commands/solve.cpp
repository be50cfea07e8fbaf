// Hedgeleaf commands: the `solve` section and the solve command's result (see solve.hpp).
#include "commands/solve.hpp"

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

void read_volatility_terms(field_reader& r, const trade& t, solve_settings& s) {
    s.target_premium = r.number("target_premium");
    const volatility_range range = default_volatility_range(t);
    read_bounds(r, s, range.lower, range.upper, range.upper);
}

void read_strike_terms(field_reader& r, const trade& t, solve_settings& s) {
    const long last = static_cast<long>(t.legs.size()) - 1;
    const std::string leg_path = r.child("leg");
    if (last > 0 && !r.has("leg"))
        fail(leg_path, "is required: which leg's strike to solve (0 to " + std::to_string(last) +
                           ", in the order of "
                           "the legs; a ready-made structure lists its legs in the result of price)");
    s.leg = static_cast<std::size_t>(r.integer_or("leg", 0, 0, last));
    if (t.legs[s.leg].type == payoff_kind::stock)
        fail(leg_path, "leg " + std::to_string(s.leg) + " is the stock; it has no strike to solve");
    s.target_premium = r.number_or("target_premium", 0.0);
    read_bounds(r, s, t.market.spot / 4, t.market.spot * 4, max_price_level);
}

void read_quantity_terms(field_reader& r, solve_settings& s) {
    const std::string budget_path = r.child("budget");
    s.budget = r.number("budget");
    require_positive(s.budget, budget_path);
    require_at_most(s.budget, max_budget, budget_path);
    s.lot_size = r.number_optional("lot_size");
    if (s.lot_size) {
        require_positive(*s.lot_size, r.child("lot_size"));
        require_at_most(*s.lot_size, max_quantity, r.child("lot_size"));
    }
}

json leg_rows(const std::vector<solved_leg>& legs) {
    json rows = json::array();
    for (std::size_t i = 0; i < legs.size(); ++i) {
        const option_leg& leg = legs[i].leg;
        json row{{"leg", i}, {"type", to_string(leg.type)}, {"quantity", leg.quantity}, {"premium", legs[i].premium}};
        row["strike"] = leg.type == payoff_kind::stock ? json(nullptr) : json(leg.strike);
        row["expiry_years"] = leg.type == payoff_kind::stock ? json(nullptr) : json(leg.expiry_years);
        row["exercise"] = leg.type == payoff_kind::stock ? json(nullptr) : json(to_string(leg.exercise));
        rows.push_back(row);
    }
    return rows;
}

// The part that depends on the unknown, in the order the result gives it.
json unknown_json(const solve_settings& s, const solve_result& r) {
    if (s.unknown == solve_unknown::volatility)
        return json{{"solution", r.solution},
                    {"target_premium", r.target_premium},
                    {"lower", s.lower},
                    {"upper", s.upper},
                    {"rows", leg_rows(r.legs)}};
    if (s.unknown == solve_unknown::strike)
        return json{{"solution", r.solution}, {"leg", s.leg},     {"target_premium", r.target_premium},
                    {"lower", s.lower},       {"upper", s.upper}, {"rows", leg_rows(r.legs)}};
    json out{{"solution", r.solution},
             {"target_premium", r.target_premium},
             {"budget", s.budget},
             {"rows", leg_rows(r.legs)}};
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

json write_solve_result(const trade&, const solve_settings& s, const solve_result& r) {
    json out = unknown_json(s, r);
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
    out["notes"] = r.notes;
    out["caution"] = client_caution();
    return out;
}

}  // namespace hedgeleaf
