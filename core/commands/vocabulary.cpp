// Hedgeleaf commands: the vocabulary (see vocabulary.hpp).
//
// Every bound below is the constant the reader of that field checks against;
// tests/commands/vocabulary_test.cpp feeds each reader a value just past each bound
// listed here, and tests/vocabulary_check.py holds the JSON Schema to this list.
#include "commands/vocabulary.hpp"

#include "contract/limits.hpp"
#include "contract/structures.hpp"

#include <algorithm>
#include <string>

namespace hedgeleaf {

namespace {

// Field rules in JSON Schema words.
json number_field() { return json{{"type", "number"}}; }
json whole_field() { return json{{"type", "integer"}}; }
json with(json rules, const char* keyword, const json& value) {
    rules[keyword] = value;
    return rules;
}
json at_least(json rules, const json& lo) { return with(std::move(rules), "minimum", lo); }
json above(json rules, const json& lo) { return with(std::move(rules), "exclusiveMinimum", lo); }
json at_most(json rules, const json& hi) { return with(std::move(rules), "maximum", hi); }
json between(json rules, const json& lo, const json& hi) { return at_most(at_least(std::move(rules), lo), hi); }
json positive_up_to(const json& hi) { return at_most(above(number_field(), 0), hi); }
json by_default(json rules, const json& value) { return with(std::move(rules), "default", value); }
json price_level() { return between(number_field(), min_price_level, max_price_level); }
json volatility_field() { return between(number_field(), min_volatility, max_volatility); }
json one_of(const std::vector<std::string>& words) { return json{{"enum", words}}; }
json list_of(std::size_t min_items, std::size_t max_items) {
    return json{{"type", "array"}, {"minItems", min_items}, {"maxItems", max_items}};
}

void market_fields(json& f) {
    f["market.spot"] = price_level();
    f["market.volatility"] = volatility_field();
    f["market.rate"] = between(number_field(), -max_abs_rate, max_abs_rate);
    f["market.carry_yield"] = by_default(between(number_field(), -max_abs_rate, max_abs_rate), 0);
    f["market.dividends"] = json{{"type", "array"}, {"maxItems", max_dividends}};
    f["market.dividends[].time_years"] = above(number_field(), 0);
    f["market.dividends[].amount"] = at_least(number_field(), 0);
    f["market.as_of"] = json{{"type", "string"}, {"maxLength", max_as_of_chars}};
    f["market.underlying"] = json{{"type", "string"}, {"maxLength", max_underlying_chars}};
    f["market.borrow"] = by_default(between(number_field(), 0, max_abs_rate), 0);
    // A volatility grid (market.volatility as an object; the number's bounds above).
    f["market.volatility.strike_basis"] = by_default(one_of(strike_bases), "percent_of_spot");
    f["market.volatility.expiries"] = list_of(1, max_smile_expiries);
    f["market.volatility.strikes"] = list_of(1, max_smile_strikes);
    f["market.volatility.strikes[]"] = above(number_field(), 0);
    f["market.volatility.vols"] = list_of(1, max_smile_expiries);
    f["market.volatility.vols[]"] = list_of(1, max_smile_strikes);
    f["market.volatility.vols[][]"] = volatility_field();
    // A currency pair's smile quoted by delta (commands/smile_by_delta.hpp).
    f["market.volatility.quotes_by_delta"] = list_of(1, max_smile_expiries);
    f["market.volatility.quotes_by_delta[].atm"] = volatility_field();
    for (const char* key : {"rr25", "bf25", "rr10", "bf10"})
        f[std::string("market.volatility.quotes_by_delta[].") + key] = number_field();
    // Curves (rate, carry_yield and borrow as objects; the numbers' bounds above).
    for (const char* name : {"rate", "carry_yield", "borrow", "domestic_rate", "foreign_rate"}) {
        const std::string at = std::string("market.") + name + ".points";
        f[at] = list_of(1, max_curve_points);
        f[at + "[].years"] = positive_up_to(max_expiry_years);
        f[at + "[].rate"] = between(number_field(), std::string(name) == "borrow" ? 0 : -max_abs_rate, max_abs_rate);
    }
}

// The option fields of `option` and of every `legs` element.
void option_fields(json& f, const std::string& at) {
    f[at + ".strike"] = price_level();
    f[at + ".strike.percent_of_spot"] = positive_up_to(max_strike_percent);
    f[at + ".strike.percent_of_forward"] = positive_up_to(max_strike_percent);
    f[at + ".expiry_years"] = between(number_field(), time_tolerance_years, max_expiry_years);
    f[at + ".expiry_tenor"] = json{{"type", "string"}, {"maxLength", max_tenor_chars}};
    f[at + ".exercise"] = by_default(one_of(exercise_styles), "european");
    f[at + ".exercise_dates"] = list_of(1, max_exercise_dates);
    f[at + ".exercise_years"] = list_of(1, max_exercise_dates);
    f[at + ".exercise_years[]"] = above(number_field(), 0);
    f[at + ".payout"] = by_default(price_level(), 1);
}

// A currency pair (docs/currency.md): the pair, its rates, its notional and its conventions.
void currency_fields(json& f) {
    f["underlying.kind"] = one_of(underlying_kinds);
    f["underlying.base"] = json{{"type", "string"}};
    f["underlying.quote"] = json{{"type", "string"}};
    f["underlying.pip_size"] = positive_up_to(max_pip_size);
    f["underlying.spot_lag_days"] = by_default(between(whole_field(), 0, max_spot_lag_days), default_spot_lag_days);
    for (const char* name : {"domestic_rate", "foreign_rate"}) {
        const std::string at = std::string("market.") + name;
        f[at] = between(number_field(), -max_abs_rate, max_abs_rate);
        f[at + ".rate"] = between(number_field(), -max_abs_rate, max_abs_rate);
        f[at + ".day_count"] = by_default(one_of(day_counts), "ACT/360");
        f[at + ".compounding"] = by_default(one_of(compoundings), "simple");
    }
    f["notional.amount"] = positive_up_to(max_quantity);
    f["notional.currency"] = json{{"type", "string"}};
    f["conventions.premium"] = by_default(one_of(premium_conventions), "domestic_per_foreign");
    f["conventions.premium_currency"] = json{{"type", "string"}};
    f["conventions.delta"] = one_of(delta_conventions);
}

void trade_fields(json& f) {
    f["option.type"] = one_of(option_types);
    option_fields(f, "option");
    f["legs"] = list_of(1, max_legs);
    f["legs[].type"] = one_of(leg_types);
    f["legs[].quantity"] = between(number_field(), -max_quantity, max_quantity);
    option_fields(f, "legs[]");
    std::size_t most_strikes = 1;
    for (const auto& shape : structure_shapes())
        most_strikes = std::max(most_strikes, static_cast<std::size_t>(shape_strike_count(shape)));
    f["structure.shape"] = one_of(structure_shapes());
    f["structure.strikes"] = list_of(1, most_strikes);
    f["structure.strikes[]"] = price_level();
    f["structure.strikes[].percent_of_spot"] = positive_up_to(max_strike_percent);
    f["structure.strikes[].percent_of_forward"] = positive_up_to(max_strike_percent);
    f["structure.expiry_years"] = between(number_field(), time_tolerance_years, max_expiry_years);
    f["structure.expiry_tenor"] = json{{"type", "string"}, {"maxLength", max_tenor_chars}};
    f["structure.exercise"] = by_default(one_of(structure_exercise_styles), "european");
    f["strike_tick"] = above(number_field(), 0);
    f["quantity"] = by_default(positive_up_to(max_quantity), 1);
    f["side"] = by_default(one_of(sides), "buy");
    f["lattice.method"] = by_default(one_of(lattice_methods), "leisen-reimer");
    f["lattice.steps"] = by_default(between(whole_field(), 1, max_lattice_steps), default_lattice_steps);
    f["lattice.extrapolate"] = json{{"type", "boolean"}, {"default", true}};
}

void quote_fields(json& f) {
    f["quote.margin_type"] = by_default(one_of(margin_types), "absolute");
    f["quote.margin"] = by_default(at_least(number_field(), 0), 0);
    f["quote.tick"] = above(number_field(), 0);
    f["quote.client"] = json{{"type", "string"}, {"maxLength", max_client_name_chars}};
    f["quote.notes"] = json{{"type", "string"}, {"maxLength", max_notes_chars}};
    f["quote.two_way"] = json{{"type", "boolean"}, {"default", false}};
    f["quote.label"] = json{{"type", "string"}, {"maxLength", max_label_chars}};
    f["quote.prepared_by"] = json{{"type", "string"}, {"maxLength", max_preparer_chars}};
    f["quote.contact"] = json{{"type", "string"}, {"maxLength", max_contact_chars}};
    f["quote.indicative_until"] = json{{"type", "string"}, {"maxLength", max_datetime_chars}};
    f["quote.holding.shares"] = positive_up_to(max_quantity);
}

void solve_fields(json& f) {
    f["solve.for"] = one_of(solve_unknowns);
    f["solve.leg"] = between(whole_field(), 0, max_legs - 1);
    // Above 0 for every unknown but the parallel move of a smile, which may be negative (solve.cpp
    // checks each case): the schema states the condition, the field itself is any number.
    f["solve.lower"] = number_field();
    f["solve.upper"] = number_field();
    f["solve.target_premium"] = between(number_field(), -max_price_level, max_price_level);
    f["solve.budget"] = positive_up_to(max_budget);
    f["solve.lot_size"] = between(number_field(), min_lot_size, max_quantity);
}

void ladder_fields(json& f) {
    f["ladder.kind"] = by_default(one_of(ladder_kinds), "spot");
    f["ladder.spot_from"] = by_default(at_least(number_field(), min_spot_shift), spot_axis.from);
    f["ladder.spot_to"] = by_default(at_most(number_field(), max_spot_shift), spot_axis.to);
    f["ladder.spot_step"] = by_default(above(number_field(), 0), spot_axis.step);
    f["ladder.vol_from"] = by_default(number_field(), vol_axis.from);
    f["ladder.vol_to"] = by_default(number_field(), vol_axis.to);
    f["ladder.vol_step"] = by_default(above(number_field(), 0), vol_axis.step);
    f["ladder.time_step_days"] = between(whole_field(), 1, max_ladder_days);
    f["ladder.time_to_days"] = between(whole_field(), 0, max_ladder_days);
    f["ladder.smile"] = by_default(one_of(smile_moves), "sticky-strike");
    f["ladder.steps"] = by_default(between(whole_field(), 1, max_ladder_steps), default_ladder_steps);
}

void profile_fields(json& f) {
    f["profile.spot_low"] = above(number_field(), 0);
    f["profile.spot_high"] = at_most(number_field(), max_scenario_level);
    f["profile.points"] = by_default(between(whole_field(), 2, max_profile_points), default_profile_points);
    f["profile.steps"] = by_default(between(whole_field(), 1, max_profile_steps), default_ladder_steps);
    f["profile.finance_premium"] = json{{"type", "boolean"}, {"default", false}};
}

// A rebalancing frequency: hedge.rebalance and each of simulate.frequencies.
void rebalance_fields(json& f, const std::string& at) {
    f[at + ".every"] = by_default(between(whole_field(), 1, max_rebalance_every), 1);
    f[at + ".unit"] = by_default(one_of(rebalance_units), "weeks");
    f[at + ".dates"] = list_of(1, max_rebalancing_dates);
    f[at + ".years"] = list_of(1, max_rebalancing_dates);
    f[at + ".years[]"] = above(number_field(), 0);
}

void hedge_fields(json& f) {
    rebalance_fields(f, "hedge.rebalance");
    f["hedge.path.kind"] = one_of(path_kinds);
    f["hedge.path.drift"] = between(number_field(), -max_abs_rate, max_abs_rate);
    f["hedge.path.volatility"] = between(number_field(), 0, max_volatility);
    f["hedge.path.seed"] = by_default(between(whole_field(), 0, max_seed), 1);
    f["hedge.path.spots"] = list_of(1, max_rebalancing_dates);
    f["hedge.path.spots[]"] = positive_up_to(max_scenario_level);
    f["hedge.path.moves"] = json{{"type", "string"}, {"maxLength", max_moves_chars}};
    f["hedge.path.nodes"] = list_of(2, static_cast<std::size_t>(max_tree_steps) + 1);
    f["hedge.path.nodes[]"] = between(whole_field(), 0, max_tree_steps);
    f["hedge.path.shape"] = one_of(stress_shapes);
    f["hedge.path.change"] = by_default(positive_up_to(max_rise), default_stress_change);
    f["hedge.path.years"] = above(number_field(), 0);
    f["hedge.cost_bp"] = by_default(between(number_field(), 0, max_cost_bp), 0);
    f["hedge.lattice_steps"] = by_default(between(whole_field(), min_hedge_lattice_steps, max_hedge_lattice_steps),
                                          default_hedge_lattice_steps);
    f["hedge.tree.steps"] = between(whole_field(), 1, max_tree_steps);
    f["hedge.tree.from_step"] = by_default(between(whole_field(), 0, max_tree_steps), 0);
    f["hedge.tree.to_step"] = between(whole_field(), 0, max_tree_steps);
}

void simulate_fields(json& f) {
    f["simulate.paths"] = by_default(between(whole_field(), 1, max_paths), default_paths);
    f["simulate.seed"] = by_default(between(whole_field(), 0, max_seed), 1);
    f["simulate.drift"] = between(number_field(), -max_abs_rate, max_abs_rate);
    f["simulate.volatility"] = between(number_field(), 0, max_volatility);
    f["simulate.cost_bp"] = by_default(between(number_field(), 0, max_cost_bp), 0);
    f["simulate.bins"] = by_default(between(whole_field(), min_bins, max_bins), default_bins);
    f["simulate.frequencies"] = list_of(1, max_frequencies);
    rebalance_fields(f, "simulate.frequencies[]");
    f["simulate.lattice_steps"] = between(whole_field(), min_simulate_lattice_steps, max_simulate_lattice_steps);
}

json lists() {
    json shapes = json::array();
    for (const auto& shape : structure_shapes())
        shapes.push_back({{"name", shape}, {"strikes", shape_strike_count(shape)}});
    return json{{"option_types", option_types},
                {"leg_types", leg_types},
                {"exercise_styles", exercise_styles},
                {"structure_exercise_styles", structure_exercise_styles},
                {"structure_shapes", shapes},
                {"lattice_methods", lattice_methods},
                {"sides", sides},
                {"margin_types", margin_types},
                {"solve_unknowns", solve_unknowns},
                {"ladder_kinds", ladder_kinds},
                {"path_kinds", path_kinds},
                {"stress_shapes", stress_shapes},
                {"rebalance_units", rebalance_units},
                {"strike_bases", strike_bases},
                {"strike_forms", strike_forms},
                {"smile_moves", smile_moves},
                {"underlying_kinds", underlying_kinds},
                {"premium_conventions", premium_conventions},
                {"delta_conventions", delta_conventions},
                {"day_counts", day_counts},
                {"compoundings", compoundings},
                {"sections", command_sections}};
}

json limits() {
    return json{{"document_bytes", max_document_bytes},
                {"document_depth", max_document_depth},
                {"first_year", min_year},
                {"last_year", max_year},
                {"spread", max_spread},
                {"price_level_floor", min_price_level},
                {"price_level_ceiling", max_price_level},
                {"scenario_spot_ceiling", max_scenario_level},
                {"tick_fraction_floor", min_tick_fraction},
                {"volatility_floor", min_volatility},
                {"ladder_volatility_floor", min_ladder_volatility},
                {"ladder_axis_points", max_points_per_axis},
                {"ladder_grid_cells", max_grid_cells},
                {"ladder_node_updates", max_ladder_work},
                {"profile_node_updates", max_profile_work},
                {"tree_nodes", max_tree_nodes},
                {"tree_default_steps", default_tree_steps},
                {"rebalancing_dates", max_rebalancing_dates},
                {"path_rebalancings", max_path_rebalancings},
                {"margin_fraction", max_margin_fraction},
                {"volatility_margin", max_volatility_margin},
                {"comparison_alternatives", max_alternatives},
                {"comparison_outcome_spots", max_outcome_spots},
                {"page_work_budget", page_work_budget},
                {"smile_expiries", max_smile_expiries},
                {"smile_strikes", max_smile_strikes},
                {"curve_points", max_curve_points},
                {"strike_percent", max_strike_percent},
                {"table_cells", max_table_cells}};
}

}  // namespace

json vocabulary_json() {
    json fields = json::object();
    market_fields(fields);
    trade_fields(fields);
    currency_fields(fields);
    quote_fields(fields);
    solve_fields(fields);
    ladder_fields(fields);
    profile_fields(fields);
    hedge_fields(fields);
    simulate_fields(fields);
    return json{{"lists", lists()}, {"limits", limits()}, {"fields", fields}};
}

}  // namespace hedgeleaf
