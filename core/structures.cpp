// Hedgeleaf core: the shapes a desk quotes every day, as signed legs.
//
//   call-spread   [K1<K2]     +call K1  -call K2
//   put-spread    [K1<K2]     +put K2   -put K1
//   collar        [K1<K2]     +put K1   -call K2         (on shares the client holds)
//   risk-reversal [K1<K2]     +call K2  -put K1
//   straddle      [K]         +call K   +put K
//   strangle      [K1<K2]     +put K1   +call K2
//   seagull       [K1<K2<K3]  -put K1   +call K2  -call K3
//   covered-call  [K]         +stock    -call K
#include "structures.hpp"

namespace hedgeleaf {

namespace {
struct shape_leg {
    payoff_kind type;
    int strike_index;  // -1 for stock
    double quantity;
};
struct shape {
    std::string name;
    int strikes;
    std::vector<shape_leg> legs;
};

const std::vector<shape>& shapes() {
    using pk = payoff_kind;
    static const std::vector<shape> all = {
        {"call-spread", 2, {{pk::call, 0, 1}, {pk::call, 1, -1}}},
        {"put-spread", 2, {{pk::put, 1, 1}, {pk::put, 0, -1}}},
        {"collar", 2, {{pk::put, 0, 1}, {pk::call, 1, -1}}},
        {"risk-reversal", 2, {{pk::call, 1, 1}, {pk::put, 0, -1}}},
        {"straddle", 1, {{pk::call, 0, 1}, {pk::put, 0, 1}}},
        {"strangle", 2, {{pk::put, 0, 1}, {pk::call, 1, 1}}},
        {"seagull", 3, {{pk::put, 0, -1}, {pk::call, 1, 1}, {pk::call, 2, -1}}},
        {"covered-call", 1, {{pk::stock, -1, 1}, {pk::call, 0, -1}}},
    };
    return all;
}
}  // namespace

const std::vector<std::string>& structure_shapes() {
    static const std::vector<std::string> names = [] {
        std::vector<std::string> out;
        for (const auto& s : shapes()) out.push_back(s.name);
        return out;
    }();
    return names;
}

std::vector<option_leg> expand_structure(const json& node, const time_reader& times) {
    field_reader r(node, "structure");
    const std::string name = r.choice("shape", structure_shapes());
    const shape* found = nullptr;
    for (const auto& s : shapes())
        if (s.name == name) found = &s;

    const json& list = r.raw("strikes");
    const std::string path = r.child("strikes");
    if (!list.is_array()) fail(path, "must be a list of strikes in ascending order, got " + describe(list));
    if (static_cast<int>(list.size()) != found->strikes)
        fail(path, "a " + name + " takes " + std::to_string(found->strikes) + " strike" +
                       (found->strikes > 1 ? "s" : "") + ", got " + std::to_string(list.size()));
    std::vector<double> strikes;
    for (std::size_t i = 0; i < list.size(); ++i) {
        const double k = as_number(list[i], index_path(path, i));
        require_positive(k, index_path(path, i));
        require_at_most(k, 1e9, index_path(path, i));
        if (!strikes.empty() && !(k > strikes.back()))
            fail(index_path(path, i), "strikes must be in ascending order, got " + format_number(k) +
                                          " after " + format_number(strikes.back()));
        strikes.push_back(k);
    }

    // The option fields shared by every leg are read once through the leg reader,
    // with a dummy type and strike so the same checks and messages apply.
    json common = json::object();
    for (const char* key : {"expiry_years", "expiry_date", "exercise"})
        if (r.has(key)) common[key] = r.raw(key);
    if (common.contains("exercise") && common["exercise"] == "bermudan")  // any type: read_option_leg names a non-string
        fail(r.child("exercise"), "structures are european or american; give bermudan options as legs");
    common["type"] = "call";
    common["strike"] = strikes.front();
    field_reader common_reader(common, "structure");
    const option_leg base = read_option_leg(common_reader, times, false);
    r.finish();

    std::vector<option_leg> legs;
    for (const auto& sl : found->legs) {
        option_leg leg = base;
        leg.type = sl.type;
        leg.quantity = sl.quantity;
        if (sl.type == payoff_kind::stock) {
            leg = option_leg{};
            leg.type = payoff_kind::stock;
            leg.quantity = sl.quantity;
        } else {
            leg.strike = strikes[static_cast<std::size_t>(sl.strike_index)];
        }
        legs.push_back(leg);
    }
    return legs;
}

}  // namespace hedgeleaf
