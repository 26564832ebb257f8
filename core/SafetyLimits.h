// The hard limits of a sweep, checked on every measured pair: output VA above rated x
// overload factor, current above the rheostat's safe current, a meter reporting overload,
// and the primary fuse presumed open (secondary voltage collapsed). Pure C++.
#pragma once

#include <optional>
#include <string>

namespace sagline {

struct Plan;

enum class SafetyLimit { OutputVa, RheostatCurrent, MeterOverload, FuseOpen };
std::string toString(SafetyLimit limit); // "output-va", "rheostat-current", "meter-overload", "fuse-open"

struct SafetyLimits {
    double maxOutputVa = 0.0;             // rated VA x overload factor; <= 0 disables
    std::optional<double> maxCurrentA;    // rheostat safe current sqrt(P/R_total) (FACTS.md §9)
    // The output counts as collapsed below this fraction of the voltage expected at the step
    // (common practice: a healthy small transformer never sags by 90 %).
    double collapseFraction = 0.1;
};

SafetyLimits safetyLimitsFor(const Plan &plan);

struct SafetyPoint {
    double currentA = 0.0;          // measured secondary current, A RMS
    double voltageV = 0.0;          // measured secondary voltage, V RMS
    double expectedVoltageV = 0.0;  // the plan's predicted voltage at this step; <= 0: no check
    std::string overloadedRole;     // non-empty: that meter reported overload (values not valid)
};

struct SafetyTrip {
    SafetyLimit limit = SafetyLimit::OutputVa;
    double measured = 0.0;   // VA, A or V as the limit concerns; 0 for a meter overload
    double limitValue = 0.0; // the limit in the same unit
    std::string message;     // says which limit tripped and at what reading
};

// The first limit the point breaks, in this order: meter overload, fuse open, VA, current.
std::optional<SafetyTrip> checkSafety(const SafetyLimits &limits, const SafetyPoint &point);

} // namespace sagline
