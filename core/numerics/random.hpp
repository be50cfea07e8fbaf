// Hedgeleaf numerics: random numbers that are the same on every platform.
//
// Our own generator so a seed gives the same paths natively and in WebAssembly:
// xoshiro256** seeded through splitmix64, and normals by inverting the normal
// distribution (Wichura's AS241) rather than std::normal_distribution, whose
// output differs between standard libraries.
#pragma once

#include <cstdint>

namespace hedgeleaf {

/// xoshiro256** (Blackman and Vigna), seeded by splitmix64.
class random_stream {
public:
    explicit random_stream(std::uint64_t seed);
    std::uint64_t next();
    /// Uniform in (0, 1), never 0 or 1 (53 random bits, centred in their cell).
    double uniform() { return (static_cast<double>(next() >> 11) + 0.5) * 0x1.0p-53; }
    /// Standard normal by inverse transform.
    double normal();

private:
    std::uint64_t s_[4];
};

/// Inverse of the standard normal distribution function (Wichura 1988, AS241 PPND16),
/// accurate to about 1e-16 relative over (0, 1).
double normal_quantile(double p);

}  // namespace hedgeleaf
