// Tests for analytics/replication: the replicating portfolio on every node and every path of small trees.
#include "analytics/replication.hpp"
#include "commands/hedge.hpp"
#include "commands/trade_reader.hpp"
#include "dispatch/dispatch.hpp"
#include "numerics/lattice.hpp"

#include "test_support.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <string>

using namespace hedgeleaf;

namespace {

// |a - b| within 1e-12 of the size of the terms that produced them.
bool close(double a, double b, double scale) {
    return std::fabs(a - b) <= 1e-12 * std::max({scale, std::fabs(a), std::fabs(b)});
}

struct case_spec {
    const char* name;
    const char* text;
    int steps;
};

// Invented markets around a fictional share (Orchard Vale Robotics, spot near 48).
const case_spec cases[] = {
    {"European call, CRR", R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.04},
        "option": {"type": "call", "strike": 50, "expiry_years": 0.75}, "lattice": {"method": "crr"}})",
     6},
    {"European put with dividend and carry, Leisen-Reimer", R"({"market": {"spot": 48, "volatility": 0.28, "rate": 0.03,
        "carry_yield": 0.015, "dividends": [{"time_years": 0.3, "amount": 0.6}]},
        "option": {"type": "put", "strike": 47, "expiry_years": 1}, "lattice": {"method": "leisen-reimer"}})",
     7},
    {"American put with dividends, CRR", R"({"market": {"spot": 48, "volatility": 0.35, "rate": 0.06,
        "dividends": [{"time_years": 0.2, "amount": 0.8}, {"time_years": 0.7, "amount": 0.8}]},
        "option": {"type": "put", "strike": 52, "expiry_years": 1, "exercise": "american"}, "lattice": {"method": "crr"}})",
     8},
    {"American call with a large dividend, Jarrow-Rudd", R"({"market": {"spot": 48, "volatility": 0.25, "rate": 0.02,
        "dividends": [{"time_years": 0.45, "amount": 4.0}]},
        "option": {"type": "call", "strike": 44, "expiry_years": 0.9, "exercise": "american"}, "lattice": {"method": "jarrow-rudd"}})",
     6},
    {"digital call, Jarrow-Rudd", R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.03},
        "option": {"type": "digital-call", "strike": 49, "expiry_years": 0.5, "payout": 10}, "lattice": {"method": "jarrow-rudd"}})",
     6},
    {"digital put, CRR", R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.03},
        "option": {"type": "digital-put", "strike": 46, "expiry_years": 0.5}, "lattice": {"method": "crr"}})",
     7},
    {"Bermudan put, Tian", R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.05},
        "option": {"type": "put", "strike": 50, "expiry_years": 1, "exercise": "bermudan", "exercise_years": [0.25, 0.5, 0.75]},
        "lattice": {"method": "tian"}})",
     8},
};

// Every move sequence of `steps` moves.
std::vector<std::vector<int>> all_paths(int steps) {
    std::vector<std::vector<int>> out;
    for (int bits = 0; bits < (1 << steps); ++bits) {
        std::vector<int> moves;
        for (int n = 0; n < steps; ++n) moves.push_back((bits >> n) & 1);
        out.push_back(moves);
    }
    return out;
}

void check_tree(const trade& t, int steps, bool single_leg) {
    const trade_lattice lat(t, steps);
    const auto nodes = tree_window(lat, 0, steps);
    REQUIRE(nodes.size() == static_cast<std::size_t>((steps + 1) * (steps + 2) / 2));
    const auto at = [&](int n, int j) -> const tree_node& {
        return nodes[static_cast<std::size_t>(n * (n + 1) / 2 + j)];
    };
    for (const auto& node : nodes) {
        INFO("node (" << node.step << ", " << node.index << ")");
        const double scale =
            std::max({std::fabs(node.value), std::fabs(node.shares * node.spot), std::fabs(node.cash)});
        CHECK(close(node.shares * node.spot + node.cash, node.value - node.paid, scale));
        if (!single_leg || node.event != node_event::none || node.step == steps) continue;
        // Both branches: the portfolio grows into the child's value (dividends and carry in `income`).
        const double growth = 1.0 / lat.step(node.step).discount;
        for (int up = 0; up <= 1; ++up) {
            const tree_node& child = at(node.step + 1, node.index + up);
            CHECK(close(node.shares * (child.spot + node.income) + node.cash * growth, child.value,
                        std::fabs(node.shares * child.spot) + std::fabs(node.cash * growth)));
        }
    }
}

void check_paths(const trade& t, int steps) {
    const trade_lattice lat(t, steps);
    int exercised = 0;
    for (const auto& moves : all_paths(steps)) {
        const auto walk = walk_path(lat, moves);
        INFO("path " << moves_text(moves));
        double previous_scale = 0;
        for (const auto& ps : walk) {
            if (ps.node.event == node_event::early_exercise) ++exercised;
            CHECK(close(ps.carried, ps.node.value, std::max(previous_scale, std::fabs(ps.node.value))));
            if (ps.node.step == steps) break;  // expiry: no step after it (lat.step(steps) is out of range)
            previous_scale =
                std::fabs(ps.node.shares * ps.node.spot) + std::fabs(ps.node.cash / lat.step(ps.node.step).discount);
        }
        // The end: the payoff at expiry, or the exercise value where the holder exercises.
        const tree_node& end = walk.back().node;
        CHECK(end.event != node_event::none);
        if (t.legs.size() == 1) CHECK(end.value == exercise_value(t.legs[0], end.spot));
        if (end.event == node_event::early_exercise) {
            CHECK(end.step < steps);
        } else {
            CHECK(end.step == steps);
        }
    }
    if (t.legs[0].exercise != exercise_style::european) CHECK(exercised > 0);
}

}  // namespace

TEST_CASE("every node replicates and every path of small trees ends on the payoff", "[replication]") {
    for (const auto& c : cases) {
        SECTION(c.name) {
            const trade t = trade_of(c.text);
            check_tree(t, c.steps, true);
            check_paths(t, c.steps);
            // The root is the same price the pricer's own backward induction gives on the same lattice.
            const induction_result ref = induce(t.market, t.legs[0], t.lattice.method, c.steps);
            const trade_lattice lat(t, c.steps);
            CHECK(tree_window(lat, 0, 0)[0].value == Approx(ref.value).epsilon(1e-12));
            CHECK(tree_window(lat, 0, 0)[0].shares == Approx(ref.delta).epsilon(1e-10));
        }
    }
}

TEST_CASE("structures with different expiries and shares replicate on one lattice", "[replication]") {
    SECTION("short American put expiring before a long European call") {
        const trade t = trade_of(R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.05,
            "dividends": [{"time_years": 0.4, "amount": 0.5}]},
            "legs": [{"type": "put", "strike": 58, "expiry_years": 0.5, "exercise": "american", "quantity": -2},
                     {"type": "call", "strike": 52, "expiry_years": 1, "quantity": 1}],
            "lattice": {"method": "crr"}})");
        check_tree(t, 6, false);
        check_paths(t, 6);
        // The put's expiry (0.5), the ex-date (0.4) and the day before it cut the year into 4
        // pieces of whole steps: 2, 1, 1, 2 (lengths 0.397, 0.003, 0.1, 0.5; largest remainder).
        const trade_lattice lat(t, 6);
        CHECK(lat.last_step[0] == 4);
        CHECK(lat.years_at(4) == 0.5);
        CHECK(lat.years_at(3) == 0.4);
        CHECK(lat.years_at(2) == Approx(0.4 - 1.0 / 365).epsilon(1e-15));
        REQUIRE(lat.notes.size() == 1);
        CHECK(lat.notes[0].find("4 pieces of equal steps") != std::string::npos);
    }
    SECTION("covered call with a dividend: the share leg's income goes to its holder") {
        const trade t = trade_of(R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.05, "carry_yield": 0.01,
            "dividends": [{"time_years": 0.3, "amount": 0.7}]},
            "structure": {"shape": "covered-call", "strikes": [52], "expiry_years": 0.5},
            "lattice": {"method": "crr"}})");
        check_tree(t, 6, false);
        check_paths(t, 6);
    }
    SECTION("an earlier expiry falls exactly on a step") {
        const trade t = trade_of(R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.05},
            "legs": [{"type": "put", "strike": 46, "expiry_years": 0.3, "quantity": 1},
                     {"type": "call", "strike": 52, "expiry_years": 1, "quantity": 1}],
            "lattice": {"method": "crr"}})");
        const trade_lattice lat(t, 4);
        CHECK(lat.last_step[0] == 1);
        CHECK(lat.years_at(1) == 0.3);
        check_tree(t, 4, false);
        check_paths(t, 4);
    }
    SECTION("with fewer steps than pieces an expiry pays at the nearest step and says so") {
        const trade t = trade_of(R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.05},
            "legs": [{"type": "put", "strike": 46, "expiry_years": 0.3, "quantity": 1},
                     {"type": "put", "strike": 44, "expiry_years": 0.6, "quantity": 1},
                     {"type": "call", "strike": 52, "expiry_years": 1, "quantity": 1}],
            "lattice": {"method": "crr"}})");
        const trade_lattice lat(t, 2);
        CHECK(lat.geometry.grid.uniform);
        CHECK(lat.last_step[0] == 1);
        REQUIRE(lat.notes.size() == 3);
        CHECK(lat.notes[0].find("need 3 pieces of the lattice, more than its 2 steps") != std::string::npos);
        CHECK(lat.notes[1] == "legs[0] expires at 0.3 years, between lattice steps; it pays at step 1 (0.5 years)");
        check_paths(t, 2);
    }
}

TEST_CASE("tree command: nodes, the highlighted path, caps and messages", "[replication]") {
    const std::string head = R"({"market": {"spot": 48, "volatility": 0.3, "rate": 0.04},
        "option": {"type": "put", "strike": 50, "expiry_years": 1, "exercise": "american"}, "lattice": {"method": "crr"})";
    const json r =
        run_command("tree", parse_json_text(head + R"(, "hedge": {"path": {"kind": "lattice", "moves": "UDDU"}}})"));
    CHECK(r["steps"] == 4);
    CHECK(r["nodes"].size() == 15);
    CHECK(r["path"]["moves"] == "UDDU");
    CHECK(r["path"]["rows"].size() >= 2);
    for (const auto& node : r["nodes"]) CHECK(std::fabs(node["check"].get<double>()) < 1e-12);

    const json big = run_command("tree", parse_json_text(head + R"(, "hedge": {"tree": {"steps": 500}}})"));
    CHECK(big["to_step"] == 61);  // 62 levels hold 1953 nodes; 63 would hold 2016
    CHECK(big["notes"][0] ==
          "steps 0 to 61 of 500 listed (at most 2000 nodes); set hedge.tree.from_step and to_step for other levels");
    const json window = run_command(
        "tree", parse_json_text(head + R"(, "hedge": {"tree": {"steps": 500, "from_step": 490, "to_step": 492}}})"));
    CHECK(window["nodes"].size() == 491 + 492 + 493);

    const auto message = [&](const std::string& tail) {
        try {
            (void)run_command("tree", parse_json_text(head + tail));
        } catch (const input_error& e) {
            return std::string(e.what());
        }
        return std::string("(no error)");
    };
    CHECK(message(R"(, "hedge": {"tree": {"steps": 100, "to_step": 80}}})") ==
          "hedge.tree.to_step: steps 0 to 80 hold 3321 nodes, at most 2000 are listed; narrow the window");
    CHECK(message(R"(, "hedge": {"tree": {"steps": 3}, "path": {"kind": "lattice", "moves": "UDDU"}}})") ==
          "hedge.path.moves: has 4 moves, more than hedge.tree.steps 3");
    CHECK(message(R"(, "hedge": {"tree": {"steps": 6000}}})") ==
          "hedge.tree.steps: must be between 1 and 5000, got 6000");
    // One step of a year at 5 % volatility and a 30 % rate: growth e^0.3 is above up e^0.05, so the
    // tree breaks d < growth < u (common practice) where the price's 1,601 steps do not; the
    // refusal names the tree's steps, which the user can raise, not lattice.steps (it did).
    const std::string quiet = R"({"market": {"spot": 48, "volatility": 0.05, "rate": 0.3},
        "option": {"type": "put", "strike": 50, "expiry_years": 1}, "lattice": {"method": "crr"},
        "hedge": {"tree": {"steps": 1}}})";
    CHECK_NOTHROW(run_command("price", parse_json_text(quiet)));
    CHECK_THROWS_WITH(run_command("tree", parse_json_text(quiet)),
                      Catch::Matchers::StartsWith("hedge.tree.steps: the crr lattice breaks no-arbitrage") &&
                          Catch::Matchers::EndsWith("and hedge.tree.steps 1 over 1 years; raise the volatility or "
                                                    "hedge.tree.steps, or narrow the rate-carry gap"));
}
