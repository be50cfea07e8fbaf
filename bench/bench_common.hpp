// Hedgeleaf benchmarks: clocks and small helpers shared by the bench programs.
#pragma once

#include <time.h>
#include <chrono>
#include <cstdint>
#include <fstream>
#include <string>

#if defined(__x86_64__)
#include <x86intrin.h>
#endif

namespace hedgeleaf::bench {

/// Seconds on a monotonic clock.
inline double now_seconds() {
    return std::chrono::duration<double>(std::chrono::steady_clock::now().time_since_epoch()).count();
}

/// CPU seconds of the calling thread: time while other processes hold the
/// core is not counted (this machine is shared while benchmarks run).
inline double cpu_seconds() {
    timespec ts{};
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
    return static_cast<double>(ts.tv_sec) + 1e-9 * static_cast<double>(ts.tv_nsec);
}

/// The time-stamp counter (x86-64), or 0 elsewhere. It ticks at the processor's
/// nominal rate whatever the current core clock (constant_tsc), so "cycles"
/// below are reference cycles at that rate.
inline std::uint64_t tsc() {
#if defined(__x86_64__)
    return __rdtsc();
#else
    return 0;
#endif
}

/// Node updates of one backward induction on `steps` steps: rows n = steps-1..0 of n+1 nodes.
inline double node_updates(int steps) { return 0.5 * static_cast<double>(steps) * (steps + 1.0); }

/// The processor's name from /proc/cpuinfo (empty when unavailable).
inline std::string cpu_name() {
    std::ifstream in("/proc/cpuinfo");
    std::string line;
    while (std::getline(in, line))
        if (line.rfind("model name", 0) == 0) return line.substr(line.find(':') + 2);
    return "";
}

}  // namespace hedgeleaf::bench
