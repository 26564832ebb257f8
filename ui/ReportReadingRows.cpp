#include "ReportReadingRows.h"

#include "SessionSummary.h"

namespace sagline {

bool isNoteworthyReading(const SessionSummary &summary, std::size_t row)
{
    const Reading &reading = summary.readings[row];
    constexpr std::uint32_t sourceFlags = flagManual | flagSimulated;
    if (reading.excluded || (reading.flags & ~sourceFlags) != 0)
        return true;
    if (!summary.fit.ok())
        return false; // without a fit nothing is "not fitted" or an outlier in particular
    const std::optional<PointFit> point = summary.fit.points.atRow(row);
    return !point || !point->used || point->outlier;
}

ReadingRowSelection selectReportRows(const SessionSummary &summary, const ReadingRowLimits &limits)
{
    ReadingRowSelection selection;
    const std::size_t n = summary.readings.size();
    if (n <= limits.printAllUpTo || n <= limits.head + limits.tail) {
        selection.rows.reserve(n);
        for (std::size_t row = 0; row < n; ++row)
            selection.rows.push_back(row);
        return selection;
    }
    std::size_t noteworthy = 0;
    for (std::size_t row = 0; row < n; ++row) {
        const bool edge = row < limits.head || row >= n - limits.tail;
        if (edge) {
            selection.rows.push_back(row);
            continue;
        }
        if (isNoteworthyReading(summary, row)) {
            if (noteworthy < limits.maxNoteworthy) {
                selection.rows.push_back(row);
                ++noteworthy;
                continue;
            }
            ++selection.noteworthyNotPrinted;
        }
        ++selection.notPrinted;
    }
    return selection;
}

} // namespace sagline
