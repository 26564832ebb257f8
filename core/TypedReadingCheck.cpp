#include "TypedReadingCheck.h"

#include "NumberFormat.h"

#include <cmath>
#include <cstdio>
#include <cstdlib>

namespace sagline {

namespace {

// "typed A for mA?" when `ratio` is near a power of ten a person slips by.
std::string slipHint(double ratio, const char *unit)
{
    const std::string u = unit;
    const auto near = [&](double factor) { return ratio > factor / 3.0 && ratio < factor * 3.0; };
    if (near(1000.0))
        return " (typed " + u + " for m" + u + "?)";
    if (near(0.001))
        return " (typed m" + u + " for " + u + "?)";
    if (near(10.0) || near(0.1))
        return " (a slipped decimal point?)";
    return {};
}

// Two significant digits without padding: "1000", "10", "2.4".
std::string roughly(double value)
{
    char text[32];
    std::snprintf(text, sizeof text, "%.2g", value);
    const double rounded = std::strtod(text, nullptr);
    if (rounded >= 10.0)
        std::snprintf(text, sizeof text, "%.0f", rounded);
    return text;
}

std::string times(double ratio)
{
    if (ratio >= 1.0)
        return roughly(ratio) + " times";
    return "1/" + roughly(1.0 / ratio) + " of";
}

} // namespace

TypedCheck checkTypedReading(const TypedExpectation &expected, double currentA, double voltageV)
{
    TypedCheck check;
    const std::string step = "step " + std::to_string(expected.step);
    if (expected.currentA > 0.0) {
        const double ratio = currentA / expected.currentA;
        if (!(ratio >= 0.5 && ratio <= 1.5)) {
            check.needsConfirmation = true;
            check.field = "reading.current_a";
            check.message = "the current " + formatQuantity(currentA, "A") + " is "
                            + (currentA > 0.0 ? times(ratio) : std::string("far from")) + " the "
                            + formatQuantity(expected.currentA, "A") + " " + step + " expects"
                            + (currentA > 0.0 ? slipHint(ratio, "A") : std::string());
            return check;
        }
    } else if (expected.ratedCurrentA > 0.0 && currentA > 0.1 * expected.ratedCurrentA) {
        check.needsConfirmation = true;
        check.field = "reading.current_a";
        check.message = "the current " + formatQuantity(currentA, "A") + " at " + step
                        + ", the open circuit, where about 0 A is expected";
        return check;
    }
    if (expected.voltageInterval) {
        const auto [low, high] = *expected.voltageInterval;
        if (voltageV < low || voltageV > high) {
            const double middle = (low + high) / 2.0;
            check.needsConfirmation = true;
            check.field = "reading.voltage_v";
            check.message = "the voltage " + formatQuantity(voltageV, "V") + " is outside the " + formatQuantity(low, "V")
                            + " to " + formatQuantity(high, "V") + " the fit so far expects at that current"
                            + (middle > 0.0 && voltageV > 0.0 ? slipHint(voltageV / middle, "V") : std::string());
        }
        return check;
    }
    if (expected.predictedVoltageV > 0.0) {
        const double ratio = voltageV / expected.predictedVoltageV;
        if (!(ratio >= 0.8 && ratio <= 1.25)) {
            check.needsConfirmation = true;
            check.field = "reading.voltage_v";
            check.message = "the voltage " + formatQuantity(voltageV, "V") + " is "
                            + (voltageV > 0.0 ? times(ratio) : std::string("far from")) + " the about "
                            + formatQuantity(expected.predictedVoltageV, "V") + " " + step + " expects"
                            + (voltageV > 0.0 ? slipHint(ratio, "V") : std::string());
        }
    }
    return check;
}

} // namespace sagline
