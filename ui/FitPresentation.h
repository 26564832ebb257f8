// Turns core's results into what the panels show: result lines with units and expanded
// uncertainties, the verdict with its decision rule, the chart's fit overlay (line and band
// evaluated by core on the chart's grid) and the chart's limits from the plan. Every number is
// computed by core (LineFit, FitSummary, analyseFit, decideAgainstUpperLimit); this file only
// chooses what to show and how to word it.
#pragma once

#include "BudgetTable.h"
#include "ConformityAssessment.h"
#include "FitSummary.h"
#include "LineFit.h"
#include "Planner.h"
#include "ResultsPanel.h"
#include "SetupForm.h"
#include "SupplyReferral.h"
#include "VoltageCurrentChart.h"

#include <QList>

namespace sagline {

struct ResultsInputs {
    const LineFit *live = nullptr;      // every point not excluded, updated per point
    const FitSummary *batch = nullptr;  // residuals, outliers, curvature (may lag on huge sweeps)
    const Setup *setup = nullptr;
    const Plan *plan = nullptr;
    VerdictSettings verdict;
    SessionDetails details;             // temperatures as typed
    // When readings carry the primary voltage: core's fit of the readings referred to the rated
    // primary (fitReadings of columnsToFit's referred columns, as `sagline-cli fit` and the
    // report make it) and the supply's assessment. The results then come from that fit, and the
    // live fit of the readings as measured (the chart's line) is shown beside it as "R as measured".
    const FitSummary *referred = nullptr;
    const SupplyAssessment *supply = nullptr;
};

struct ResultsView {
    QList<ResultLine> lines;
    VerdictState state = VerdictState::None;
    QString verdictText;
    QString verdictRule;
    std::vector<BudgetTable> budgets; // every result's uncertainty budget (the budget table)
};

ResultsView resultsView(const ResultsInputs &inputs);
// The result lines, verdict and budgets of an assessment alone (the review's detail view).
ResultsView assessmentView(const Assessment &assessment);
// The fitted line and its 95 % confidence band on `grid`, and the prediction at the next step.
FitOverlay fitOverlay(const LineFit &live, const std::vector<double> &grid, std::optional<double> nextCurrentA);
// Chart limits from the plan (the unsafe region, rated lines, expected voltage span).
ChartLimits chartLimits(const Plan &plan, double ratedVa);

} // namespace sagline
