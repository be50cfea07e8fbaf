// Hedgeleaf benchmarks: the fixed, seeded set of random American options used
// to measure accuracy per unit of time, and its reference file.
#pragma once

#include "contract/trade.hpp"

#include <cstdint>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace hedgeleaf::bench {

/// One American option of the set and its converged reference premium.
struct sample_option {
    payoff_kind type = payoff_kind::put;
    double spot = 0, strike = 100, volatility = 0, rate = 0, carry = 0, expiry = 0;
    double reference = 0;  ///< the finest extrapolated lattice (see accuracy_bench reference)
    double check = 0;      ///< the next coarser level, for the reference's own accuracy

    market_data market() const { return flat_market(spot, volatility, rate, carry); }
    option_leg leg() const { return single_leg(type, strike, expiry, exercise_style::american); }
};

/// SplitMix64 (Steele, Lea and Flood 2014): a fully specified generator, so the set is the
/// same on every compiler and standard library.
class splitmix64 {
public:
    explicit splitmix64(std::uint64_t seed) : state_(seed) {}
    std::uint64_t next() {
        std::uint64_t z = (state_ += 0x9E3779B97F4A7C15ull);
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
        return z ^ (z >> 31);
    }
    /// Uniform on [lo, hi) from the top 53 bits.
    double uniform(double lo, double hi) { return lo + (hi - lo) * static_cast<double>(next() >> 11) * 0x1.0p-53; }

private:
    std::uint64_t state_;
};

inline constexpr std::uint64_t option_set_seed = 20261202;
inline constexpr int option_set_size = 500;

/// The set: spot 70-130 around strike 100, volatility 10-60 %, rate 0-10 %, carry
/// 0-10 %, expiry 0.1-3 years, puts and calls alternating.
inline std::vector<sample_option> make_option_set() {
    splitmix64 rng(option_set_seed);
    std::vector<sample_option> set(option_set_size);
    for (int i = 0; i < option_set_size; ++i) {
        sample_option& o = set[static_cast<std::size_t>(i)];
        o.type = i % 2 == 0 ? payoff_kind::put : payoff_kind::call;
        o.spot = rng.uniform(70, 130);
        o.volatility = rng.uniform(0.10, 0.60);
        o.rate = rng.uniform(0.0, 0.10);
        o.carry = rng.uniform(0.0, 0.10);
        o.expiry = rng.uniform(0.1, 3.0);
    }
    return set;
}

inline const char* option_set_header = "type,spot,strike,volatility,rate,carry_yield,expiry_years,reference,check";

/// Read the reference file written by `accuracy_bench reference`.
inline std::vector<sample_option> read_option_set(const std::string& path) {
    std::ifstream in(path);
    if (!in) throw std::runtime_error("cannot open " + path);
    std::string line;
    std::getline(in, line);
    if (line != option_set_header) throw std::runtime_error(path + ": unexpected header");
    std::vector<sample_option> set;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') continue;
        std::istringstream row(line);
        std::string type;
        std::getline(row, type, ',');
        sample_option o;
        o.type = type == "put" ? payoff_kind::put : payoff_kind::call;
        char comma = 0;
        row >> o.spot >> comma >> o.strike >> comma >> o.volatility >> comma >> o.rate >> comma >> o.carry >> comma >>
            o.expiry >> comma >> o.reference >> comma >> o.check;
        if (!row) throw std::runtime_error(path + ": bad row: " + line);
        set.push_back(o);
    }
    return set;
}

}  // namespace hedgeleaf::bench
