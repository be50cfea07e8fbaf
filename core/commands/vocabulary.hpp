// Hedgeleaf commands: the engine's vocabulary and limits as one JSON object.
//
// Built from contract/limits.hpp and the structure table, so the page (through the
// module's vocabulary()), the CLI (hedgeleaf --vocabulary) and the tests read the
// same words and bounds the readers enforce:
//   "lists":  word lists, e.g. "lattice_methods": ["crr", ...]; "structure_shapes":
//             [{"name": "collar", "strikes": 2}, ...]
//   "limits": limits that belong to no one field, e.g. "document_bytes": 1048576
//   "fields": per field of the trade document (JSON path, "[]" for every element of a
//             list) the JSON Schema keywords that hold for it: type, minimum, maximum,
//             exclusiveMinimum, minItems, maxItems, maxLength, enum, default.
// dispatch/dispatch.hpp's vocabulary() adds the engine version and the commands.
#pragma once

#include "commands/json_read.hpp"

namespace hedgeleaf {

/// {"lists": ..., "limits": ..., "fields": ...} (see above).
json vocabulary_json();

}  // namespace hedgeleaf
