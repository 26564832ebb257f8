// The combined review PDF: a summary page (batch statistics, the far-from-batch rule and the
// comparison table), then each session's full report, drawn with the report's own sections
// (ReportSections.h, by the report area) in one document with one page count.
#pragma once

#include "ReportWriter.h"
#include "SessionComparison.h"

#include <QString>

#include <vector>

namespace sagline {

// Writes `pdfPath`; returns "" or the reason it failed. Sessions that cannot be opened are
// listed on the summary page only.
QString writeReviewPdf(const std::vector<const SessionRow *> &rows, const ComparisonOptions &options,
                       const QString &pdfPath, const ReportOptions &reportOptions);

} // namespace sagline
