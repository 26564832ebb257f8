#include "TemperatureCorrection.h"

#include "NumberFormat.h"

#include <cmath>

namespace sagline {

double temperatureConstantC(TemperatureConstant constant)
{
    switch (constant) {
    case TemperatureConstant::CopperIeee: return 234.5; // IEEE C57.12.90 (FACTS.md §3)
    case TemperatureConstant::CopperIec: return 235.0;  // IEC 60076-1 (FACTS.md §3)
    case TemperatureConstant::Aluminium: return 225.0;  // IEEE C57.12.90, IEC 60076 (FACTS.md §3)
    }
    return 234.5;
}

std::string toString(TemperatureConstant constant)
{
    switch (constant) {
    case TemperatureConstant::CopperIeee: return "copper-ieee";
    case TemperatureConstant::CopperIec: return "copper-iec";
    case TemperatureConstant::Aluminium: return "aluminium";
    }
    return "copper-ieee";
}

std::optional<TemperatureConstant> temperatureConstantFromString(std::string_view text)
{
    for (auto c : {TemperatureConstant::CopperIeee, TemperatureConstant::CopperIec, TemperatureConstant::Aluminium})
        if (text == toString(c))
            return c;
    return std::nullopt;
}

std::string describe(TemperatureConstant constant)
{
    switch (constant) {
    case TemperatureConstant::CopperIeee: return "copper, T_k = 234.5 °C (IEEE C57.12.90)";
    case TemperatureConstant::CopperIec: return "copper, T_k = 235 °C (IEC 60076-1)";
    case TemperatureConstant::Aluminium: return "aluminium, T_k = 225 °C (IEEE C57.12.90, IEC 60076)";
    }
    return "";
}

TemperatureCorrection correctToReference(double resistanceOhm, double measuredC, double referenceC,
                                         TemperatureConstant constant)
{
    TemperatureCorrection result;
    result.constantC = temperatureConstantC(constant);
    result.convention = describe(constant);
    if (!std::isfinite(resistanceOhm) || !std::isfinite(measuredC) || !std::isfinite(referenceC)) {
        result.error = "resistance and temperatures must be finite numbers";
        return result;
    }
    if (!(result.constantC + measuredC > 0.0) || !(result.constantC + referenceC > 0.0)) {
        result.error = "temperatures must be above -" + formatSignificant(result.constantC, 4)
                       + " °C, where the linear resistance law reaches zero";
        return result;
    }
    result.factor = (result.constantC + referenceC) / (result.constantC + measuredC);
    result.resistanceOhm = resistanceOhm * result.factor;
    result.ok = true;
    return result;
}

} // namespace sagline
