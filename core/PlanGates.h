// Gates before any current flows. Plausibility: a nameplate whose values cannot describe a
// mains transformer of that rating (a secondary typed in mV, a regulation no VA class allows,
// rated currents beyond the bench) is refused, naming the field. Unsafe steps: a plan step the
// rheostat or the primary fuse cannot take; such a plan is not accepted or run unless cut to
// its safe steps or overridden explicitly (the override is recorded with the session).
#pragma once

#include "FieldError.h"
#include "Setup.h"

#include <string>
#include <vector>

namespace sagline {

struct Plan;

// Regulation bound: 100 %, the largest limit IEC 61558-1 Table 2 allows any VA class
// (FACTS.md §4, from memory).
inline constexpr double maxPlausibleRegulationPercent = 100.0;
// Turns ratio V1/V2 of a mains transformer between 1/10 (step-up) and 200 (common practice:
// 230 V to about 1.2 V); outside it a voltage was almost surely typed in the wrong unit.
inline constexpr double maxPlausibleStepDownRatio = 200.0;
inline constexpr double maxPlausibleStepUpRatio = 10.0;
// The most current the bench carries: 100 A, the largest primary fuse rating the setup takes
// (bench.fuse.rating_a) and beyond hand-set rheostats and bench meters (common practice).
inline constexpr double maxBenchCurrentA = 100.0;

// The refusals for a nameplate, each naming the field; empty when plausible. `noLoadVoltageV`
// is the given or derived V2nl.
FieldErrors nameplatePlausibilityErrors(const Nameplate &plate, double noLoadVoltageV);

struct UnsafeStep {
    int index = 0;                    // plan step index
    std::vector<std::string> reasons; // "current 1.25 A above the rheostat's safe 1 A", ...
};

// The steps the rheostat (current or setting) or the fitted primary fuse (outlook "opens")
// cannot take, in plan order.
std::vector<UnsafeStep> unsafeSteps(const Plan &plan);
// "steps 5 to 12: current above the rheostat's safe 0.707 A; step 12: the primary fuse opens".
std::string describeUnsafeSteps(const std::vector<UnsafeStep> &steps);
// The plan without its unsafe steps, with a warning naming what was removed.
Plan truncatedToSafe(const Plan &plan);

} // namespace sagline
