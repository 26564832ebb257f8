#include "ReadingPlausibility.h"

#include "NumberFormat.h"

#include <cmath>
#include <string>

namespace sagline {

namespace {

double noLoadVoltageOf(const Nameplate &plate)
{
    if (plate.secondaryNoLoadVoltageV)
        return *plate.secondaryNoLoadVoltageV;
    return plate.secondaryVoltageV * (1.0 + plate.regulationPercent.value_or(0.0) / 100.0);
}

std::string placeOf(std::size_t row, const std::vector<int> &lineNumbers, const char *column)
{
    const std::string where = row < lineNumbers.size() ? "line " + std::to_string(lineNumbers[row])
                                                       : "reading " + std::to_string(row + 1);
    return where + ", column " + column;
}

constexpr const char *slipHint = ": a slip of the decimal point or the unit? Correct it, or mark the row excluded "
                                 "(column excluded = yes) so it is kept out of the fit";

} // namespace

FieldErrors implausibleReadings(const std::vector<Reading> &readings, const std::vector<int> &lineNumbers,
                                const Setup &setup)
{
    FieldErrors errors;
    const Nameplate &plate = setup.nameplate;
    const double limitVa = plate.ratedPowerVa * setup.bench.overloadFactor;
    const double noLoadV = noLoadVoltageOf(plate);
    for (std::size_t row = 0; row < readings.size(); ++row) {
        const Reading &r = readings[row];
        if (r.excluded || !std::isfinite(r.currentA) || !std::isfinite(r.voltageV))
            continue; // kept out of the fit already; non-numbers are the CSV reader's to refuse
        if (noLoadV > 0.0 && std::abs(r.voltageV) > implausibleBeyondFactor * noLoadV) {
            errors.push_back({placeOf(row, lineNumbers, "voltage_v"),
                              formatQuantity(r.voltageV, "V") + " is more than " + formatSignificant(implausibleBeyondFactor, 1)
                                  + " times the nameplate's no-load voltage " + formatQuantity(noLoadV, "V") + slipHint});
            continue;
        }
        const double va = std::abs(r.currentA * r.voltageV);
        if (limitVa > 0.0 && va > implausibleBeyondFactor * limitVa)
            errors.push_back({placeOf(row, lineNumbers, "current_a"),
                              formatQuantity(r.currentA, "A") + " at " + formatQuantity(r.voltageV, "V") + " is "
                                  + formatQuantity(va, "VA") + ", more than " + formatSignificant(implausibleBeyondFactor, 1)
                                  + " times the sweep's hard limit " + formatQuantity(limitVa, "VA") + " (rated "
                                  + formatQuantity(plate.ratedPowerVa, "VA") + " x overload factor "
                                  + formatSignificant(setup.bench.overloadFactor, 3) + ")" + slipHint});
    }
    return errors;
}

} // namespace sagline
