// Hedgeleaf contract: the shapes a desk quotes every day, as signed legs.
//
//   call-spread   [K1<K2]     +call K1  -call K2
//   put-spread    [K1<K2]     +put K2   -put K1
//   collar        [K1<K2]     +put K1   -call K2         (on shares the client holds)
//   risk-reversal [K1<K2]     +call K2  -put K1
//   straddle      [K]         +call K   +put K
//   strangle      [K1<K2]     +put K1   +call K2
//   seagull       [K1<K2<K3]  -put K1   +call K2  -call K3
//   covered-call  [K]         +stock    -call K
#include "contract/structures.hpp"

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

const shape& find_shape(const std::string& name) {
    for (const auto& s : shapes())
        if (s.name == name) return s;
    return shapes().front();  // callers pass a name from structure_shapes()
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

int shape_strike_count(const std::string& shape) { return find_shape(shape).strikes; }

std::vector<option_leg> structure_legs(const std::string& shape, const std::vector<double>& strikes,
                                       const option_leg& terms) {
    std::vector<option_leg> legs;
    for (const auto& sl : find_shape(shape).legs) {
        option_leg leg = terms;
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
