// Hedgeleaf benchmark: how often the printed error bound covers the true error.
//
// coverage_bench reference FILE   compute the independent references of the American and
//                                 Bermudan cases (bench/reference_lattice.hpp and
//                                 reference_quadrature.hpp; about five minutes) and write FILE
// coverage_bench FILE             price every case with every method, extrapolation on and
//                                 off, and print per method x option type x setting how many
//                                 times |premium - reference| <= error_estimate
//
// The seeded random set (SplitMix64): calls, puts and digitals, European, American and
// Bermudan (exercise dates at multiples of T/J for J in 2..12, which fall on the reference's
// steps), spot 70-130 against strike 100, volatility 10-60 %, rate -1 to 10 %, carry 0-10 %,
// expiry 0.1-3 years, lattice steps log-uniform from 30 to 2,000. References: the closed form
// for European options (numerics/closed_form.hpp); for American ones BBSR on 50,000 and
// 100,000 steps (its own error: the same on 25,000 and 50,000, printed); for Bermudan ones
// integration over log spot between the exercise dates on 8,001 points (its own error: the
// same on 4,001 points, printed).
#include "bench_common.hpp"
#include "numerics/closed_form.hpp"
#include "numerics/lattice_price.hpp"
#include "option_set.hpp"
#include "reference_lattice.hpp"
#include "reference_quadrature.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

using namespace hedgeleaf;
using namespace hedgeleaf::bench;

namespace {

constexpr std::uint64_t coverage_seed = 20270113;
constexpr int cases_per_family = 150;
constexpr int reference_steps = 50000;  // BBSR on 50,000 and 100,000 steps (American)
constexpr int check_steps = 25000;
constexpr int reference_points = 8001;  // integration grid (Bermudan)
constexpr int check_points = 4001;

struct family {
    const char* name;
    payoff_kind type;
    exercise_style exercise;
};
const family families[] = {
    {"call eu", payoff_kind::call, exercise_style::european},
    {"put eu", payoff_kind::put, exercise_style::european},
    {"call am", payoff_kind::call, exercise_style::american},
    {"put am", payoff_kind::put, exercise_style::american},
    {"call berm", payoff_kind::call, exercise_style::bermudan},
    {"put berm", payoff_kind::put, exercise_style::bermudan},
    {"dcall eu", payoff_kind::digital_call, exercise_style::european},
    {"dput eu", payoff_kind::digital_put, exercise_style::european},
};
constexpr int family_count = sizeof(families) / sizeof(families[0]);
const lattice_method methods[] = {lattice_method::crr, lattice_method::jarrow_rudd, lattice_method::tian,
                                  lattice_method::leisen_reimer};

struct test_case {
    int kind = 0;  // index into families
    double spot = 0, volatility = 0, rate = 0, carry = 0, expiry = 0;
    int dates = 0;  // Bermudan: exercise at k T / dates, k = 1 .. dates - 1
    int steps = 0;
    double reference = 0, check = 0;

    market_data market() const { return flat_market(spot, volatility, rate, carry); }
    option_leg leg() const {
        const family& f = families[kind];
        option_leg leg = single_leg(f.type, 100, expiry, f.exercise);
        for (int k = 1; k < dates; ++k) leg.exercise_years.push_back(k * expiry / dates);
        return leg;
    }
};

std::vector<test_case> make_cases() {
    splitmix64 rng(coverage_seed);
    const int choices[] = {2, 3, 4, 6, 12};
    std::vector<test_case> out;
    for (int f = 0; f < family_count; ++f)
        for (int i = 0; i < cases_per_family; ++i) {
            test_case c;
            c.kind = f;
            c.spot = rng.uniform(70, 130);
            c.volatility = rng.uniform(0.10, 0.60);
            c.rate = rng.uniform(-0.01, 0.10);
            c.carry = rng.uniform(0.0, 0.10);
            c.expiry = rng.uniform(0.1, 3.0);
            c.dates = choices[static_cast<int>(rng.uniform(0, 5))];
            if (families[f].exercise != exercise_style::bermudan) c.dates = 0;
            c.steps = static_cast<int>(std::exp(rng.uniform(std::log(30.0), std::log(2000.0))));
            out.push_back(c);
        }
    return out;
}

bool needs_lattice_reference(const test_case& c) { return families[c.kind].exercise != exercise_style::european; }

int make_reference(const std::string& path) {
    std::vector<test_case> cases = make_cases();
    const double start = now_seconds();
    std::ofstream out(path);
    out << "case,reference,check\n";
    int done = 0;
    for (std::size_t i = 0; i < cases.size(); ++i) {
        test_case& c = cases[i];
        if (!needs_lattice_reference(c)) continue;
        if (families[c.kind].exercise == exercise_style::american) {
            c.reference = bbsr_price(c.market(), c.leg(), reference_steps);
            c.check = bbsr_price(c.market(), c.leg(), check_steps);
        } else {
            c.reference = bermudan_by_quadrature(c.market(), c.leg(), reference_points);
            c.check = bermudan_by_quadrature(c.market(), c.leg(), check_points);
        }
        char line[128];
        std::snprintf(line, sizeof line, "%zu,%.17g,%.17g\n", i, c.reference, c.check);
        out << line;
        if (++done % 50 == 0) std::fprintf(stderr, "%d references (%.0f s)\n", done, now_seconds() - start);
    }
    std::fprintf(stderr, "wrote %s\n", path.c_str());
    return 0;
}

void read_reference(const std::string& path, std::vector<test_case>& cases) {
    std::ifstream in(path);
    if (!in) throw std::runtime_error("cannot open " + path);
    std::string line;
    std::getline(in, line);
    while (std::getline(in, line)) {
        std::istringstream row(line);
        std::size_t i = 0;
        char comma = 0;
        double reference = 0, check = 0;
        row >> i >> comma >> reference >> comma >> check;
        if (!row || i >= cases.size()) throw std::runtime_error(path + ": bad row: " + line);
        cases[i].reference = reference;
        cases[i].check = check;
    }
}

struct tally {
    int covered = 0, total = 0;
    double worst_miss = 0;      // largest |error| / bound among the cases not covered
    std::vector<double> slack;  // bound / |error|, for the median
};

void print_table(const std::vector<test_case>& cases) {
    std::printf("Coverage of the error bound: cases with |premium - reference| <= error_estimate, of %d per cell\n",
                cases_per_family);
    std::printf("(median bound / |error| in brackets: how far the bound is above the error)\n\n");
    std::printf("%-14s %-6s", "method", "extrap");
    for (const family& f : families) std::printf(" %15s", f.name);
    std::printf("\n");
    int cells = 0, cells_met = 0;
    double least = 1;
    for (const lattice_method method : methods)
        for (const bool extrapolate : {true, false}) {
            std::printf("%-14s %-6s", to_string(method).c_str(), extrapolate ? "on" : "off");
            for (int f = 0; f < family_count; ++f) {
                tally t;
                for (const test_case& c : cases) {
                    if (c.kind != f) continue;
                    const lattice_price p = price_leg(c.market(), c.leg(), {method, c.steps, extrapolate},
                                                      bumped_greeks::off, error_bound::on);
                    const double reference =
                        needs_lattice_reference(c) ? c.reference : closed_form(c.market(), c.leg()).premium;
                    const double error = std::fabs(p.premium - reference);
                    ++t.total;
                    if (error <= p.error_estimate)
                        ++t.covered;
                    else
                        t.worst_miss = std::max(t.worst_miss, error / p.error_estimate);
                    if (error > 0) t.slack.push_back(p.error_estimate / error);
                }
                std::sort(t.slack.begin(), t.slack.end());
                const double median = t.slack.empty() ? 0 : t.slack[t.slack.size() / 2];
                const double share = static_cast<double>(t.covered) / t.total;
                ++cells;
                if (share >= 0.95) ++cells_met;
                least = std::min(least, share);
                char cell[32];
                std::snprintf(cell, sizeof cell, "%d (%.0fx)", t.covered, median);
                std::printf(" %15s", cell);
            }
            std::printf("\n");
        }
    std::printf("\ncells at or above 19 in 20: %d of %d; lowest coverage %.1f %%\n", cells_met, cells, 100 * least);
}

void print_reference_accuracy(const std::vector<test_case>& cases) {
    for (const exercise_style style : {exercise_style::american, exercise_style::bermudan}) {
        double sum = 0, worst = 0;
        int n = 0;
        for (const test_case& c : cases) {
            if (families[c.kind].exercise != style) continue;
            const double e = std::fabs(c.reference - c.check);
            sum += e * e;
            worst = std::max(worst, e);
            ++n;
        }
        if (style == exercise_style::american)
            std::printf("American reference, BBSR %d/%d steps, against BBSR %d/%d steps (%d cases): ", reference_steps,
                        2 * reference_steps, check_steps, 2 * check_steps, n);
        else
            std::printf("Bermudan reference, integration on %d points, against %d points (%d cases): ",
                        reference_points, check_points, n);
        std::printf("RMS %.1e, worst %.1e\n", std::sqrt(sum / n), worst);
    }
    std::printf("\n");
}

}  // namespace

int main(int argc, char** argv) {
    if (argc == 3 && std::string(argv[1]) == "reference") return make_reference(argv[2]);
    if (argc != 2) {
        std::fprintf(stderr, "usage: coverage_bench reference FILE | coverage_bench FILE\n");
        return 2;
    }
    std::vector<test_case> cases = make_cases();
    read_reference(argv[1], cases);
    print_reference_accuracy(cases);
    print_table(cases);
    return 0;
}
