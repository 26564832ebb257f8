// The plain-language texts a sweep gives the operator for a plan step: what to set, what to
// expect, and what to check again when a step starts over (after a lost link or a pause).
// Pure functions of the plan step, so the desktop app, the CLI and the tests word them alike.
#pragma once

#include "Planner.h"

#include <QString>

namespace sagline {

// "set the load to about 82 Ω; expect about 11.9 V and 145 mA" (open circuit: "disconnect the
// load (open circuit); ...").
QString stepInstruction(const PlanStep &step);

// The step's load checked again after `why` ("link restored", "resumed"): a programmable load
// is set again by the program ("why: setting the load again to about 15.2 Ω for step 3; ..."),
// a load set by hand is checked by the operator, who confirms ("why: check the load is still
// at about 15.2 Ω for step 3, then confirm; ...").
QString recheckInstruction(const PlanStep &step, const QString &why, bool programmableLoad);

} // namespace sagline
