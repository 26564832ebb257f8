// What the virtual bench really is, printed after a simulated run so a fit can be checked
// against it: the transformer's parameters and, derived from them with core's formulas, the
// no-load loss, series reactance, efficiency at rated load and its peak.
#pragma once

#include <ostream>

namespace sagline {
class VirtualBench;
}

namespace sagline::cli {

// `ratedSecondaryCurrentA` from the nameplate (S/V2); the analyser's gain errors only when
// `analyserAttached` (run --sim-primary-meter).
void printVirtualBenchTruth(VirtualBench &bench, double ratedSecondaryCurrentA, bool analyserAttached, std::ostream &out);

} // namespace sagline::cli
