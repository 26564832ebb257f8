// The table `sagline-cli compare` prints: one section per design (its sessions, the spread of
// R, the far-from-batch rule and the individuals control chart), then the batch's counts.
#pragma once

#include "SessionComparison.h"

#include <ostream>
#include <vector>

namespace sagline::cli {

void printComparison(const std::vector<SessionRow> &rows, const BatchStatistics &stats, const ComparisonOptions &options,
                     std::ostream &out);

} // namespace sagline::cli
