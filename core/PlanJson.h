// The plan as the JSON object of DESIGN.md (`sagline-cli plan --json`, stored in sessions).
#pragma once

#include "Planner.h"

#include <string>

namespace sagline {

// One JSON object with every DESIGN.md key (numbers in SI units, null where none applies),
// plus explanatory notes on how the primary current and the fuse outlook were estimated.
std::string planToJson(const Plan &plan, int indent = 2);

} // namespace sagline
