// Hedgeleaf numerics: the work meter (see work_meter.hpp).
#include "numerics/work_meter.hpp"

#include "contract/errors.hpp"

#include <cmath>

namespace hedgeleaf {

namespace {
struct meter_state {
    double budget = 0;
    double used = 0;
    std::string field;
    bool live = false;
};
thread_local meter_state meter;
}  // namespace

std::string in_millions(double node_updates) { return format_number(std::round(node_updates / 1e6)) + " million"; }

work_meter::work_meter(double budget, std::string field) {
    meter = meter_state{budget, 0, std::move(field), std::isfinite(budget)};
}

work_meter::~work_meter() { meter = meter_state{}; }

void charge_work(double node_updates) {
    if (!meter.live) return;
    meter.used += node_updates;
    if (meter.used > meter.budget) {
        throw work_exhausted(meter.field, "the request stopped after about " + in_millions(meter.used) +
                                              " lattice node updates, more than the " + in_millions(meter.budget) +
                                              " the page runs at once (a few seconds); use fewer steps, or the "
                                              "hedgeleaf command-line tool, which has no such limit");
    }
}

}  // namespace hedgeleaf
