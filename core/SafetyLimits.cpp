#include "SafetyLimits.h"

#include "Planner.h"

#include <cmath>
#include <cstdio>

namespace sagline {

namespace {

std::string number(double value)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.4g", value);
    return buffer;
}

} // namespace

std::string toString(SafetyLimit limit)
{
    switch (limit) {
    case SafetyLimit::OutputVa: return "output-va";
    case SafetyLimit::RheostatCurrent: return "rheostat-current";
    case SafetyLimit::MeterOverload: return "meter-overload";
    case SafetyLimit::FuseOpen: return "fuse-open";
    }
    return "unknown";
}

SafetyLimits safetyLimitsFor(const Plan &plan)
{
    SafetyLimits limits;
    limits.maxOutputVa = plan.overloadLimitVa;
    limits.maxCurrentA = plan.rheostatSafeCurrentA;
    return limits;
}

std::optional<SafetyTrip> checkSafety(const SafetyLimits &limits, const SafetyPoint &point)
{
    SafetyTrip trip;
    if (!point.overloadedRole.empty()) {
        trip.limit = SafetyLimit::MeterOverload;
        trip.message = "the " + point.overloadedRole
                       + " reports overload (reading beyond its range): stop and check the range and the wiring";
        return trip;
    }
    if (point.expectedVoltageV > 0.0 && point.voltageV < limits.collapseFraction * point.expectedVoltageV) {
        trip.limit = SafetyLimit::FuseOpen;
        trip.measured = point.voltageV;
        trip.limitValue = limits.collapseFraction * point.expectedVoltageV;
        trip.message = "secondary voltage collapsed to " + number(point.voltageV) + " V (expected about "
                       + number(point.expectedVoltageV)
                       + " V): the primary fuse is presumed open, or the supply is off";
        return trip;
    }
    const double va = std::fabs(point.voltageV * point.currentA);
    if (limits.maxOutputVa > 0.0 && va > limits.maxOutputVa) {
        trip.limit = SafetyLimit::OutputVa;
        trip.measured = va;
        trip.limitValue = limits.maxOutputVa;
        trip.message = "output " + number(va) + " VA (" + number(point.voltageV) + " V x " + number(point.currentA)
                       + " A) is above the limit of " + number(limits.maxOutputVa) + " VA (rated VA x overload factor)";
        return trip;
    }
    if (limits.maxCurrentA && std::fabs(point.currentA) > *limits.maxCurrentA) {
        trip.limit = SafetyLimit::RheostatCurrent;
        trip.measured = std::fabs(point.currentA);
        trip.limitValue = *limits.maxCurrentA;
        trip.message = "current " + number(point.currentA) + " A is above the rheostat's safe current of "
                       + number(*limits.maxCurrentA) + " A (sqrt(P rated / R total))";
        return trip;
    }
    return std::nullopt;
}

} // namespace sagline
