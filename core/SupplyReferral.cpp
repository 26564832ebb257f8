#include "SupplyReferral.h"

#include "NumberFormat.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace sagline {

namespace {

bool isUsed(const Reading &reading)
{
    return !reading.excluded && (reading.flags & (flagOverload | flagNotANumber)) == 0 && std::isfinite(reading.voltageV)
           && std::isfinite(reading.currentA);
}

// "230 V", "229.8 V": up to 4 significant digits without trailing zeros.
std::string volts(double value)
{
    char text[32];
    std::snprintf(text, sizeof text, "%.4g V", value);
    return text;
}

bool hasSupplyVoltage(const Reading &reading)
{
    return reading.primary.voltageV && *reading.primary.voltageV > 0.0;
}

} // namespace

std::string toString(FitVoltages voltages)
{
    return voltages == FitVoltages::Referred ? "referred" : "raw";
}

SupplyAssessment assessSupply(const std::vector<Reading> &readings, double ratedPrimaryVoltageV, FitVoltages wanted,
                              double tolerancePercent, const std::optional<MeterSpec> &primaryVoltmeter)
{
    SupplyAssessment out;
    out.ratedPrimaryVoltageV = ratedPrimaryVoltageV;
    out.tolerancePercent = tolerancePercent;
    for (const Reading &reading : readings) {
        if (!isUsed(reading))
            continue;
        ++out.readingsUsed;
        if (!hasSupplyVoltage(reading))
            continue;
        ++out.readingsWithVoltage;
        const double v = *reading.primary.voltageV;
        if (reading.primary.uVoltageV && std::isfinite(*reading.primary.uVoltageV) && *reading.primary.uVoltageV >= 0.0) {
            const double relative = *reading.primary.uVoltageV / v * 100.0;
            out.referralGainUPercent = std::max(out.referralGainUPercent.value_or(0.0), relative);
        }
        out.lowestV = out.lowestV ? std::min(*out.lowestV, v) : v;
        out.highestV = out.highestV ? std::max(*out.highestV, v) : v;
    }
    const std::string rated = volts(ratedPrimaryVoltageV);
    if (out.readingsWithVoltage == 0 || !(ratedPrimaryVoltageV > 0.0)) {
        out.fitVoltages = FitVoltages::Raw;
        out.referralGainUPercent.reset();
        out.statement = "no primary voltage was measured: the supply is assumed to have held its rated " + rated +
                        " throughout, so any sag of the supply under load is inside the fitted R";
        return out;
    }
    out.driftPercent = (*out.highestV - *out.lowestV) / ratedPrimaryVoltageV * 100.0;
    out.drifted = *out.driftPercent > tolerancePercent;
    out.fitVoltages = wanted;
    const std::string range = "the supply read " + volts(*out.lowestV) + " to " + volts(*out.highestV) + " (" +
                              formatSignificant(*out.driftPercent, 2) +
                              " % of rated, tolerance " + formatSignificant(tolerancePercent, 2) + " %)";
    if (wanted == FitVoltages::Referred)
        out.statement = "fit on the readings referred to the rated primary " + rated + " (V2 and I2 × " + rated + "/V1); " + range;
    else
        out.statement = "fit on the readings as read (not referred to the rated primary " + rated + "); " + range;
    if (out.readingsWithVoltage < out.readingsUsed)
        out.statement += "; " + std::to_string(out.readingsUsed - out.readingsWithVoltage) + " of " +
                         std::to_string(out.readingsUsed) + " readings have no primary voltage and are used as read";
    if (out.drifted)
        out.statement += "; the supply drifted beyond the tolerance during the sweep";
    if (wanted == FitVoltages::Referred && primaryVoltmeter) {
        // The setup's specification replaces the readings' stated u: its gain alone is common.
        out.referralGainUPercent = primaryVoltmeter->gainPercentOfReading / std::sqrt(3.0);
        out.referralGainFromSetup = true;
    }
    if (wanted != FitVoltages::Referred)
        out.referralGainUPercent.reset();
    else if (out.referralGainFromSetup && !(*out.referralGainUPercent > 0.0))
        out.statement += "; the setup's primary voltmeter states no gain error, so none is in the budgets";
    else if (!out.referralGainUPercent)
        out.statement += "; no reading states the primary voltmeter's uncertainty, so its gain error (which scales V0 "
                         "through the referral) is not in the budgets";
    return out;
}

std::vector<Reading> referToRatedSupply(const std::vector<Reading> &readings, double ratedPrimaryVoltageV)
{
    std::vector<Reading> referred = readings;
    if (!(ratedPrimaryVoltageV > 0.0) || !std::isfinite(ratedPrimaryVoltageV))
        return referred;
    for (Reading &reading : referred) {
        if (!hasSupplyVoltage(reading))
            continue;
        const double factor = ratedPrimaryVoltageV / *reading.primary.voltageV;
        reading.voltageV *= factor;
        reading.currentA *= factor;
        if (reading.uVoltageV)
            *reading.uVoltageV *= factor;
        if (reading.uCurrentA)
            *reading.uCurrentA *= factor;
    }
    return referred;
}

ReadingColumns columnsToFit(const std::vector<Reading> &readings, FitVoltages voltages, double ratedPrimaryVoltageV)
{
    ReadingColumns columns;
    columns.reserve(readings.size());
    const bool refer = voltages == FitVoltages::Referred && ratedPrimaryVoltageV > 0.0
                       && std::isfinite(ratedPrimaryVoltageV);
    for (std::size_t i = 0; i < readings.size(); ++i) {
        // Readings are ~300 bytes apart: ask for the line a few dozen ahead (as fitReadings does).
        if (i + 32 < readings.size()) {
            __builtin_prefetch(&readings[i + 32]);
            if (refer) // V1 lies on another line of the reading
                __builtin_prefetch(&readings[i + 32].primary.voltageV);
        }
        const Reading &reading = readings[i];
        // The same product referToRatedSupply forms (x·1 is x, so unreferred rows are as read).
        columns.append(reading, refer && hasSupplyVoltage(reading) ? ratedPrimaryVoltageV / *reading.primary.voltageV
                                                                   : 1.0);
    }
    return columns;
}

} // namespace sagline
