// Hedgeleaf commands: the profile command's JSON in and out.
#pragma once

#include "analytics/profile.hpp"
#include "commands/json_read.hpp"

namespace hedgeleaf {

/// Read and check the trade's optional `profile` section.
profile_settings read_profile_settings(const json& document, const trade& t);
/// Rows, break-evens, the extremes of the P&L at expiry, the notes.
json write_profile_result(const trade& t, const profile_settings& settings, const profile_result& result);

}  // namespace hedgeleaf
