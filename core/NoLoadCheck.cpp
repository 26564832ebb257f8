#include "NoLoadCheck.h"

#include "NumberFormat.h"

#include <cmath>

namespace sagline {

std::optional<std::string> noLoadQuestion(double expectedV, double measuredV, double tolerancePercent)
{
    if (!std::isfinite(expectedV) || !std::isfinite(measuredV) || !(expectedV > 0.0) || !(tolerancePercent >= 0.0))
        return std::nullopt;
    const double deviationPercent = (measuredV - expectedV) / expectedV * 100.0;
    if (std::abs(deviationPercent) <= tolerancePercent)
        return std::nullopt;
    return "the no-load reading is " + formatQuantity(measuredV, "V") + " where the nameplate gives " +
           formatQuantity(expectedV, "V") + " (" + (deviationPercent > 0 ? "+" : "") + formatSignificant(deviationPercent, 3) +
           " %, more than ±" + formatSignificant(tolerancePercent, 2) + " %): check the tap, the winding and the meter's range";
}

} // namespace sagline
