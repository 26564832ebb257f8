// The words beside one outlier flag: the point's statistic against the critical value, the rule
// and its published source, and that the flag is shown, never applied. The window's readings
// table shows it as the flag's tooltip.
#pragma once

#include "FitSummary.h"

#include <cstddef>
#include <string>

namespace sagline {

// For fit.points[row] flagged as an outlier; "" when the row is not flagged.
std::string outlierFlagText(const FitSummary &fit, std::size_t row);

} // namespace sagline
