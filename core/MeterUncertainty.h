// Standard uncertainty of a meter reading from the maker's accuracy specification
// ±(p % of reading + n counts), GUM Type B evaluation (JCGM 100:2008).
#pragma once

#include "Reading.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

// How the maker states the specification limit.
enum class SpecCoverage {
    Rectangular, // no other information: a limit of half-width a, u = a/sqrt(3) (GUM 4.3.7)
    Normal95,    // the limit covers 95 % of a normal distribution: u = a/1.960
    Normal99,    // the limit covers 99 % of a normal distribution: u = a/2.576
};

struct MeterAccuracy {
    double percentOfReading = 0.0;   // p, % of the reading
    double counts = 0.0;             // n, least-significant digits
    double countValue = 0.0;         // the value of one count on the range in use, V or A
    SpecCoverage coverage = SpecCoverage::Rectangular;
};

struct MeterUncertainty {
    bool ok = false;
    std::string error;               // the rule broken when !ok
    double halfWidth = 0.0;          // a = p/100·|reading| + n·countValue, in the reading's unit
    double standardUncertainty = 0.0; // u, same unit
};

// u of one reading. Errors: a negative or non-finite spec item or reading, or a spec that gives
// a = 0 (a zero uncertainty would give that point infinite weight).
MeterUncertainty meterUncertainty(const MeterAccuracy &accuracy, double reading);

// u of a display resolution step δ alone, δ/sqrt(12) (GUM F.2.2.1), for meters whose
// specification does not already include it. δ >= 0.
double resolutionUncertainty(double step);

// Sets u_voltage_v and u_current_a of every reading from the two meters' specifications,
// keeping values already present when keepExisting. Returns the first error ("row N: ...")
// or nothing when all went well.
std::optional<std::string> applyMeterUncertainty(std::vector<Reading> &readings, const MeterAccuracy &voltmeter,
                                                 const MeterAccuracy &ammeter, bool keepExisting = true);

} // namespace sagline
