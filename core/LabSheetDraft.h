// A first lab sheet made from a setup, for a supervisor to edit (`sagline-cli labsheet new`):
// the setup as given, locks taken from it (the plan fixed, the load limit at the plan's top
// step, the fuse of the bench or else the recommended one, readings typed in), and
// instructions that list the plan's steps with the current to set and the voltage to expect,
// plus the usual cautions. Nothing is invented: every number comes from the planner.
#pragma once

#include "FieldError.h"
#include "LabSheet.h"

#include <optional>
#include <string>

namespace sagline {

struct LabSheetDraft {
    std::optional<LabSheet> sheet;  // set when errors is empty
    FieldErrors errors;             // the setup's refusals, each naming the field ("setup.bench.steps")
};

// `title` empty: "Load test of a <design>".
LabSheetDraft draftLabSheet(const Setup &setup, const std::string &title);

} // namespace sagline
