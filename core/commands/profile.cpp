// Hedgeleaf commands: the `profile` section and the profile command's result (see profile.hpp).
#include "commands/profile.hpp"

#include "commands/cautions.hpp"
#include "commands/quote.hpp"
#include "commands/table_columns.hpp"
#include "commands/trade_reader.hpp"
#include "numerics/lattice.hpp"

#include <cmath>

namespace hedgeleaf {

namespace {

using profile_column = column<profile_row>;

// One row per spot, in the order --table and --csv follow.
const std::vector<profile_column>& profile_columns() {
    static const std::vector<profile_column> columns = {
        {"spot", &profile_row::spot},
        {"spot_change", &profile_row::spot_change},
        {"payoff", &profile_row::payoff},
        {"pnl_at_expiry", &profile_row::pnl_at_expiry},
        {"value_today", &profile_row::value_today},
        {"pnl_today", &profile_row::pnl_today},
        {"position_pnl_at_expiry", &profile_row::position_pnl_at_expiry},
        {"position_pnl_today", &profile_row::position_pnl_today},
    };
    return columns;
}

}  // namespace

profile_settings read_profile_settings(const json& document, const trade& t) {
    field_reader r(section_or_empty(document, "profile"), "profile");
    const double spot = t.market.spot;
    profile_settings s;
    s.spot_low = r.number_or("spot_low", 0.5 * spot);
    s.spot_high = r.number_or("spot_high", 1.5 * spot);
    require_positive(s.spot_low, r.child("spot_low"));
    require_at_most(s.spot_high, max_scenario_level, r.child("spot_high"));
    if (!(s.spot_high > s.spot_low))
        fail(r.child("spot_high"),
             "must be above spot_low " + format_number(s.spot_low) + ", got " + format_number(s.spot_high));
    s.points = static_cast<int>(r.integer_or("points", default_profile_points, 2, max_profile_points));
    s.steps = static_cast<int>(r.integer_or("steps", default_ladder_steps, 1, max_profile_steps));
    s.finance_premium = r.boolean_or("finance_premium", false);
    r.finish();
    s.quote = read_quote_terms(document, t);
    return s;
}

json write_profile_result(const trade& t, const profile_settings& s, const profile_result& p) {
    json ranges = json::array();
    for (const auto& [a, b] : p.zero_pnl.ranges) ranges.push_back({a, b});
    json out{
        {"premium", p.premium},
        {"cost_at_expiry", p.cost_at_expiry},
        {"finance_premium", s.finance_premium},
        {"horizon_years", p.horizon_years},
        {"break_even", p.zero_pnl.points},
        {"break_even_ranges", ranges},
        {"quantity", t.quantity},
        {"side", t.client_sells ? "sell" : "buy"},
        {"lattice", {{"method", to_string(t.lattice.method)}, {"steps", effective_steps(t.lattice.method, s.steps)}}},
        {"rows", row_objects(profile_columns(), p.rows)},
        {"columns", column_names(profile_columns())}};
    if (t.valuation_date) out["horizon_date"] = to_iso(add_days(*t.valuation_date, std::lround(p.horizon_years * 365)));
    if (p.one_expiry) {
        out["max_pnl_at_expiry"] = number_or_null(p.max_pnl);
        out["min_pnl_at_expiry"] = number_or_null(p.min_pnl);
        out["position_max_pnl_at_expiry"] = number_or_null(p.position_max_pnl);
        out["position_min_pnl_at_expiry"] = number_or_null(p.position_min_pnl);
    }
    if (p.quote) {  // the P&L is the client's: after the price the client pays or receives
        out["priced_at"] = "client price";
        out["client_price"] = p.quote->per_unit;
    }
    out["notes"] = p.notes;
    out["caution"] = client_caution(!t.market.is_plain());
    return out;
}

}  // namespace hedgeleaf
