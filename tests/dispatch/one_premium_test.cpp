// One trade, one premium: price, hedge, ladder, tree and profile show the same premium for
// the same trade at the same spot, or state how far their own lattice is from it.
#include "dispatch/dispatch.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <string>

using namespace hedgeleaf;

namespace {

json trade_with_cards(const std::string& exercise) {
    // Hull, Options, Futures, and Other Derivatives (8th ed.), Example 15.6 (from memory): S = 42,
    // K = 40, r = 10 %, sigma = 20 %, T = 0.5: the European call is worth 4.76.
    json doc = json::parse(R"({
      "market": {"spot": 42, "volatility": 0.2, "rate": 0.1},
      "option": {"type": "call", "strike": 40, "expiry_years": 0.5},
      "hedge": {"path": {"kind": "scenario", "drift": 0.05, "volatility": 0.2, "seed": 7}},
      "ladder": {"kind": "spot"},
      "profile": {}
    })");
    doc["option"]["exercise"] = exercise;
    if (exercise == "american") doc["option"]["type"] = "put";
    return doc;
}

bool has_note_naming(const json& card, const std::string& field) {
    for (const auto& note : card["notes"])
        if (note.get<std::string>().find(field) != std::string::npos) return true;
    return false;
}

/// A card's value today is the price's premium, or its result states the difference and a note names
/// the field that sets its lattice.
void check_card(const json& card, double card_value, double premium, const std::string& field) {
    INFO(field << ": card " << card_value << ", price " << premium);
    CHECK(card["price_premium"].get<double>() == premium);
    CHECK(card["difference_from_price"].get<double>() == Approx(card_value - premium).margin(1e-14));
    const bool visible = std::fabs(card_value - premium) >= 5e-5 * std::max(1.0, std::fabs(premium));
    CHECK(has_note_naming(card, field) == visible);
}

}  // namespace

TEST_CASE("price, hedge, ladder, tree and profile: one premium or a stated difference", "[one premium]") {
    for (const std::string exercise : {"european", "american"}) {
        INFO(exercise);
        const json doc = trade_with_cards(exercise);
        const double premium = run_command("price", doc)["premium"].get<double>();
        if (exercise == "european") CHECK(premium == Approx(4.76).margin(0.005));
        CHECK(run_command("profile", doc)["premium"].get<double>() == premium);

        const json hedge = run_command("hedge", doc);
        check_card(hedge, hedge["totals"]["premium"].get<double>(), premium, "hedge.lattice_steps");
        const json ladder = run_command("ladder", doc);
        check_card(ladder, ladder["today"]["value"].get<double>(), premium, "ladder.steps");
        const json tree = run_command("tree", doc);
        check_card(tree, tree["premium"].get<double>(), premium, "hedge.tree.steps");
        // The tree's default lattice is coarse: its difference is visible and said.
        CHECK(has_note_naming(tree, "hedge.tree.steps"));
    }
}
