// The secondary fit assumes the supply held still. When the primary voltage was measured with
// a reading, the reading is referred to the rated primary voltage: with k = V1,rated/V1, V2·k
// and I2·k, the point the same resistive load would give at the rated supply (the circuit is
// linear, so its load line scales with the supply; scaling V2 alone would also scale the R·I2
// drop by k and leave R biased by the sag). A supply that sags under load then adds nothing of
// its own impedance to the fitted R. The referred readings are what the fit uses by default;
// the raw ones stay available. Pure C++.
#pragma once

#include "FitSummary.h"
#include "Reading.h"
#include "Setup.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

// How far the supply may move during a sweep before it is flagged: 2 % of rated (common
// practice; about what a stiff laboratory supply holds from no load to full load).
inline constexpr double defaultSupplyDriftTolerancePercent = 2.0;

// Which secondary voltages a fit was made on.
enum class FitVoltages {
    Referred, // V2·V1,rated/V1 where V1 was measured (the default)
    Raw,      // as read
};
std::string toString(FitVoltages voltages); // "referred", "raw"

struct SupplyAssessment {
    double ratedPrimaryVoltageV = 0.0;
    std::size_t readingsWithVoltage = 0;     // used readings that carry V1
    std::size_t readingsUsed = 0;            // used readings (included, with values)
    std::optional<double> lowestV;           // V1 over the used readings
    std::optional<double> highestV;
    std::optional<double> driftPercent;      // (highest - lowest) / rated · 100
    double tolerancePercent = defaultSupplyDriftTolerancePercent;
    bool drifted = false;                    // driftPercent above the tolerance
    FitVoltages fitVoltages = FitVoltages::Raw; // what the fit is made on
    // On a referred fit: the standard uncertainty of the primary voltmeter's gain, % of reading.
    // From the setup's `meters.primary_voltmeter` when given (its gain limit / sqrt(3), GUM
    // 4.3.7); otherwise the largest stated u(V1)/V1 of the used readings (the role's accuracy
    // rule, gain and counts, treated as common to every reading: GUM 5.2; conservative by the
    // counts). Empty on a raw fit or when neither is known (the statement then says so).
    std::optional<double> referralGainUPercent;
    bool referralGainFromSetup = false;      // referralGainUPercent came from the setup's meters
    std::string statement;                   // one sentence for every output
};

// Looks at the supply over the included readings. `wanted` Referred gives Referred only when
// some reading carries V1; without a primary voltmeter the statement says the supply is
// assumed to have held its rated value. `primaryVoltmeter`: the setup's, when given.
SupplyAssessment assessSupply(const std::vector<Reading> &readings, double ratedPrimaryVoltageV, FitVoltages wanted,
                              double tolerancePercent = defaultSupplyDriftTolerancePercent,
                              const std::optional<MeterSpec> &primaryVoltmeter = std::nullopt);

// The setup's primary voltmeter, when its `meters` section gives one.
inline std::optional<MeterSpec> primaryVoltmeterOf(const std::optional<MeterSpecs> &meters)
{
    return meters ? meters->primaryVoltmeter : std::nullopt;
}

// The readings with each secondary voltage and current (and their u) scaled by V1,rated/V1 where
// V1 was read (above zero); others unchanged. Same order and size, so fit rows still index the
// originals.
std::vector<Reading> referToRatedSupply(const std::vector<Reading> &readings, double ratedPrimaryVoltageV);

// What the fit reads of the readings, as columns: referred to the rated supply as above when
// `voltages` is Referred, as read when Raw. One pass and 33 bytes a reading, where
// referToRatedSupply copies every reading whole (about 300 bytes each): what every product path
// hands fitReadings. The same numbers as fitReadings of the readings (or of the referred ones).
ReadingColumns columnsToFit(const std::vector<Reading> &readings, FitVoltages voltages, double ratedPrimaryVoltageV);

} // namespace sagline
