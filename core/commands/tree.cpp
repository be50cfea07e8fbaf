// Hedgeleaf commands: the tree command (see tree.hpp).
#include "commands/tree.hpp"

#include "commands/hedge.hpp"
#include "commands/price.hpp"

namespace hedgeleaf {

namespace {
json node_json(const tree_node& node, const lattice_geometry& geo) {
    return json{{"step", node.step},     {"index", node.index}, {"time_years", geo.time(node.step)},
                {"spot", node.spot},     {"value", node.value}, {"paid", node.paid},
                {"shares", node.shares}, {"cash", node.cash},   {"event", to_string(node.event)},
                {"check", node.check()}};
}
}  // namespace

tree_settings read_tree_settings(const json& document, const trade& t) {
    const hedge_settings hs = read_hedge_settings(document, t);
    return {hs.tree, hs.path.kind == path_kind::lattice, hs.path.moves};
}

json write_tree_result(const trade& t, const tree_settings& settings, const tree_result& result) {
    const lattice_geometry& geo = result.geometry;
    json nodes = json::array();
    for (const auto& node : result.nodes) nodes.push_back(node_json(node, geo));

    json path = nullptr;
    if (settings.lattice_path) {
        json rows = json::array();
        for (const auto& ps : result.path) {
            json row = node_json(ps.node, geo);
            row["carried"] = ps.carried;
            row["error"] = ps.carried - ps.node.value;
            rows.push_back(row);
        }
        path = json{{"moves", moves_text(settings.moves)}, {"rows", rows}};
    }
    const double q = t.signed_quantity();
    json out{
        {"steps", result.steps},
        {"method", to_string(t.lattice.method)},
        {"dt_years", geo.step.dt},
        {"up", geo.step.up},
        {"down", geo.step.down},
        {"p_up", geo.step.p_up},
        {"discount", geo.step.discount},
        {"from_step", result.from_step},
        {"to_step", result.to_step},
        {"nodes", nodes},
        {"premium", result.against_price.card_premium},  // the root's value, whichever levels are listed
        {"position", {{"quantity", t.quantity}, {"side", t.client_sells ? "sell" : "buy"}, {"signed_quantity", q}}},
        {"view",
         "Per unit of the trade held long (legs with their signed quantities). value = the legs still running, "
         "including what they pay at the node (paid); shares and cash replicate value - paid until the next step; "
         "check = shares*spot + cash - (value - paid). The desk that sold the client the trade holds signed_quantity "
         "times these shares and cash."},
        {"notes", result.notes},
    };
    if (!path.is_null()) out["path"] = path;  // only for a lattice hedge path
    add_price_comparison(out, result.against_price, "The tree", "hedge.tree.steps", result.steps);
    return out;
}

}  // namespace hedgeleaf
