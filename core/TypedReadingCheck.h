// A second look at a reading typed in by hand, before it is recorded: a value far from what the
// step expects (417 typed for 0.417 A, 196 for 19.6 V) is shown with the expected value and
// recorded only once the person confirms it (then flagged "confirmed"). Nothing is refused
// here: the hard limits do that.
#pragma once

#include <optional>
#include <string>

namespace sagline {

struct TypedExpectation {
    int step = 0;
    double currentA = 0.0;          // the plan's current for the step, A (0 at the open-circuit step)
    double ratedCurrentA = 0.0;     // rated secondary current, A
    double predictedVoltageV = 0.0; // the plan's voltage for the step, V
    // The live fit's prediction interval for the voltage at the typed current, when the fit has
    // enough points to give one.
    std::optional<std::pair<double, double>> voltageInterval;
};

struct TypedCheck {
    bool needsConfirmation = false;
    std::string field;   // "reading.current_a" or "reading.voltage_v": the first value that needs a look
    std::string message; // what was typed, what was expected, and a likely slip ("typed A for mA?")
};

// Current: outside 0.5 to 1.5 times the step's current (common practice for a hand-set load), or
// above 10 % of the rated current at the open-circuit step. Voltage: outside the prediction
// interval when there is one, else outside 0.8 to 1.25 times the plan's voltage (common
// practice). A factor near 10 or 1000 is named as a likely slip of the decimal point or unit.
TypedCheck checkTypedReading(const TypedExpectation &expected, double currentA, double voltageV);

} // namespace sagline
