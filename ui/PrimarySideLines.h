// The results panel's rows for the primary side: the supply (what the fit was made on), the
// open-circuit quantities, efficiency, the peak-efficiency load and the series reactance, each
// as core computed it (core/PrimarySideAnalysis.h), with U.
#pragma once

#include "PrimarySideAnalysis.h"
#include "ResultsPanel.h"
#include "SupplyReferral.h"

#include <QList>

#include <optional>

namespace sagline {

QList<ResultLine> primarySideLines(const SupplyAssessment &supply, const std::optional<PrimarySideResult> &result);

} // namespace sagline
