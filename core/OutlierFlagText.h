// The words beside one outlier flag: the point's statistic against the critical value, the rule
// and its published source, and that the flag is shown, never applied. The window's readings
// table shows it as the flag's tooltip; the report's readings table states the rule under it.
#pragma once

#include "FitSummary.h"

#include <cstddef>
#include <string>

namespace sagline {

// For fit.points[row] flagged as an outlier; "" when the row is not flagged.
std::string outlierFlagText(const FitSummary &fit, std::size_t row);

// What marked an outlier in this fit, for the footnote of a readings table that shows the
// studentized residuals: the statistic the screen compared and its critical value, or why it
// did not screen. (Never a fixed threshold: the critical value grows with n, Bonferroni.)
std::string outlierScreenFootnote(const FitSummary &fit);

} // namespace sagline
