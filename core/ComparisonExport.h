// The comparison table as data: CSV (one row per session, SI units in the column names) and
// one JSON object (sessions plus batch statistics), shared by `sagline-cli compare` and the
// review workspace's export. Numbers are written with 10 significant digits; absent values are
// empty CSV fields and JSON null, never NaN.
#pragma once

#include "CsvField.h" // csvField was declared here first; its callers still find it here
#include "SessionComparison.h"

#include <string>
#include <vector>

namespace sagline {

// The CSV header's column names, in order.
std::vector<std::string> comparisonCsvColumns();

// Header plus one line per row; `stats` must be summarizeBatch(rows) (gives robust z and flags).
std::string comparisonCsv(const std::vector<SessionRow> &rows, const BatchStatistics &stats);

// {"sessions": [...], "batch": {...}} with the same fields as the CSV, plus sign-off history
// and safety-stop details.
std::string comparisonJson(const std::vector<SessionRow> &rows, const BatchStatistics &stats,
                           const ComparisonOptions &options);

} // namespace sagline
