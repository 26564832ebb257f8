// Which readings the printed report lists. A session of a few hundred readings is printed in
// full; a larger one (long logging runs reach 100 000) prints its first and last rows and every
// reading a reviewer must see (excluded, flagged as a problem, an outlier, or not fitted), and
// says how many were left out and where the full list is. The CSV export and the session file
// always hold every reading.
#pragma once

#include <cstddef>
#include <vector>

namespace sagline {

struct SessionSummary;

struct ReadingRowLimits {
    std::size_t printAllUpTo = 250;    // at most this many readings: all of them (about 5 pages)
    std::size_t head = 50;             // otherwise the first ...
    std::size_t tail = 50;             // ... and the last rows,
    std::size_t maxNoteworthy = 1000;  // and up to this many noteworthy readings between them
};

struct ReadingRowSelection {
    std::vector<std::size_t> rows;        // indices into summary.readings, ascending
    std::size_t notPrinted = 0;           // readings left out
    std::size_t noteworthyNotPrinted = 0; // of those, noteworthy ones beyond maxNoteworthy
    bool complete() const { return notPrinted == 0; }
};

// Excluded, not fitted (e.g. overload), an outlier of the fit, or flagged unstable / outside
// the prediction / overload / not-a-number. "typed in" and "simulated" describe the source,
// not a problem, and do not count.
bool isNoteworthyReading(const SessionSummary &summary, std::size_t row);

ReadingRowSelection selectReportRows(const SessionSummary &summary, const ReadingRowLimits &limits = {});

} // namespace sagline
