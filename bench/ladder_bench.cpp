// Hedgeleaf benchmark: how long the `ladder` command takes natively.
//
// The page recomputes a 21 x 11 spot x volatility P&L grid as the user types,
// so that grid is timed end to end through run_command (JSON in, JSON out, as
// the module calls it) for a single option and for three-leg structures, at
// the default 101 lattice steps and at 51 and 201 for comparison; plus a
// 21-row spot ladder. Prints the median and the fastest of several runs after
// one warm-up run. On a shared machine the fastest run is the better guide.
// Usage: ladder_bench
#include "dispatch/dispatch.hpp"

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <string>
#include <vector>

using hedgeleaf::json;

namespace {

double seconds_now() {
    return std::chrono::duration<double>(std::chrono::steady_clock::now().time_since_epoch()).count();
}

json market() { return json{{"spot", 36.4}, {"volatility", 0.27}, {"rate", 0.032}, {"carry_yield", 0.018}}; }

json european_call() {
    return json{{"market", market()},
                {"option", {{"type", "call"}, {"strike", 38}, {"expiry_years", 1.0}, {"exercise", "european"}}}};
}

json structure(const std::string& shape, const std::vector<double>& strikes, const std::string& exercise) {
    return json{{"market", market()},
                {"structure", {{"shape", shape}, {"strikes", strikes}, {"expiry_years", 1.0}, {"exercise", exercise}}}};
}

struct timing {
    double median_ms = 0;
    double best_ms = 0;
};

timing time_command(const json& doc, int runs) {
    std::vector<double> ms;
    hedgeleaf::run_command("ladder", doc);  // warm-up: caches and page faults out of the figures
    for (int i = 0; i < runs; ++i) {
        const double start = seconds_now();
        const json out = hedgeleaf::run_command("ladder", doc);
        ms.push_back(1e3 * (seconds_now() - start));
        if (out["rows"].empty()) std::printf("no rows?\n");
    }
    std::sort(ms.begin(), ms.end());
    return {ms[ms.size() / 2], ms.front()};
}

void report(const char* label, json doc, const json& ladder, int runs) {
    doc["ladder"] = ladder;
    const timing t = time_command(doc, runs);
    std::printf("  %-44s %9.2f ms median  %9.2f ms best\n", label, t.median_ms, t.best_ms);
}

}  // namespace

int main() {
    const int runs = 15;
    std::printf("ladder command, native, %d runs each (end to end: JSON document in, JSON result out)\n", runs);
    const json grid{{"kind", "grid"}};  // defaults: spot -20 %..+20 % by 2 %, vol -5..+5 points by 1: 21 x 11
    for (int steps : {51, 101, 201}) {
        json g = grid;
        g["steps"] = steps;
        std::printf("21 x 11 spot x vol grid, %d steps (Leisen-Reimer + Richardson)\n", steps);
        report("european call", european_call(), g, runs);
        report("collar (2 legs, european)", structure("collar", {32, 42}, "european"), g, runs);
        report("seagull (3 legs, european)", structure("seagull", {30, 38, 44}, "european"), g, runs);
        report("seagull (3 legs, american)", structure("seagull", {30, 38, 44}, "american"), g, runs);
    }
    std::printf("21-row spot ladder, 101 steps\n");
    report("seagull (3 legs, american)", structure("seagull", {30, 38, 44}, "american"), json{{"kind", "spot"}}, runs);
    return 0;
}
