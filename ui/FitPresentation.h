// Turns core's results into what the panels show: result lines with units and uncertainties,
// the chart's fit overlay (line and band evaluated by core on the chart's grid), and the
// next-step expectation. Every number is computed by core; this file only chooses wording
// and layout.
#pragma once

#include "FitSummary.h"
#include "LineFit.h"
#include "Planner.h"
#include "ResultsPanel.h"
#include "VoltageCurrentChart.h"

#include <QList>

namespace sagline {

// The lines of the results panel from the live fit and the latest full summary.
QList<ResultLine> resultLines(const LineFit &live, const FitSummary &summary, const Plan *plan);
// The fitted line and its 95 % confidence band on `grid`, and the prediction at the next step.
FitOverlay fitOverlay(const LineFit &live, const std::vector<double> &grid, std::optional<double> nextCurrentA);
// Chart limits from the plan (the unsafe region, rated lines, expected voltage span).
ChartLimits chartLimits(const Plan &plan, double ratedVa);

} // namespace sagline
