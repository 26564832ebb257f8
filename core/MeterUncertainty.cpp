#include "MeterUncertainty.h"

#include "Distributions.h"

#include <cmath>

namespace sagline {

MeterUncertainty meterUncertainty(const MeterAccuracy &accuracy, double reading)
{
    MeterUncertainty result;
    const auto bad = [](double v) { return !std::isfinite(v) || v < 0.0; };
    if (bad(accuracy.percentOfReading) || bad(accuracy.counts) || bad(accuracy.countValue)) {
        result.error = "the accuracy specification needs finite, non-negative percent, counts and count value";
        return result;
    }
    if (!std::isfinite(reading)) {
        result.error = "the reading is not a finite number";
        return result;
    }
    result.halfWidth = accuracy.percentOfReading / 100.0 * std::fabs(reading) + accuracy.counts * accuracy.countValue;
    if (!(result.halfWidth > 0.0)) {
        result.error = "the accuracy specification gives zero uncertainty for this reading; give counts and a count value";
        return result;
    }
    double divisor = std::sqrt(3.0); // GUM (JCGM 100:2008) 4.3.7, rectangular limit
    if (accuracy.coverage == SpecCoverage::Normal95)
        divisor = normalQuantile(0.975); // 1.95996
    else if (accuracy.coverage == SpecCoverage::Normal99)
        divisor = normalQuantile(0.995); // 2.57583
    result.standardUncertainty = result.halfWidth / divisor;
    result.ok = true;
    return result;
}

double resolutionUncertainty(double step)
{
    return std::isfinite(step) && step > 0.0 ? step / std::sqrt(12.0) : 0.0;
}

std::optional<std::string> applyMeterUncertainty(std::vector<Reading> &readings, const MeterAccuracy &voltmeter,
                                                 const MeterAccuracy &ammeter, bool keepExisting)
{
    for (std::size_t row = 0; row < readings.size(); ++row) {
        Reading &r = readings[row];
        if (!keepExisting || !r.uVoltageV) {
            const MeterUncertainty u = meterUncertainty(voltmeter, r.voltageV);
            if (!u.ok)
                return "row " + std::to_string(row) + ", voltage: " + u.error;
            r.uVoltageV = u.standardUncertainty;
        }
        if (!keepExisting || !r.uCurrentA) {
            const MeterUncertainty u = meterUncertainty(ammeter, r.currentA);
            if (!u.ok)
                return "row " + std::to_string(row) + ", current: " + u.error;
            r.uCurrentA = u.standardUncertainty;
        }
    }
    return std::nullopt;
}

} // namespace sagline
