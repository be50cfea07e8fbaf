// Hedgeleaf dispatch: the table of commands, each described once.
//
// A command is four typed steps: read its settings from the document (commands/),
// estimate its work for the page's budget and run it (analytics/), write its
// result (commands/). The table names them, the field its work size is set by and
// its help line; the CLI (usage, did-you-mean), the module (commands()), the fuzz
// target and the vocabulary list commands from it.
#pragma once

#include "analytics/work_estimate.hpp"
#include "commands/json_read.hpp"

#include <string>
#include <vector>

namespace hedgeleaf {

/// One command. `estimate` and `execute` close over the command's typed steps
/// (command_table.cpp, `steps<read, estimate, run, write>`).
struct command_descriptor {
    std::string name;        ///< as typed: hedgeleaf <name> FILE
    std::string help;        ///< one line for the CLI's usage
    std::string work_field;  ///< the input that sets the size of its work, named by budget messages
    /// The work estimate of the command on a document (reads its trade and settings).
    work_estimate (*estimate)(const json& document);
    /// Read the trade and settings, hold the run to `budget` node updates (estimate first,
    /// then the work meter), run, write the result.
    json (*execute)(const command_descriptor& self, const json& document, double budget);
};

/// Every command, in name order.
const std::vector<command_descriptor>& command_table();

/// The command called `name`; throws input_error (with a did-you-mean) when there is none.
const command_descriptor& find_command(const std::string& name);

}  // namespace hedgeleaf
