// The sweep planner: from a setup (nameplate + bench) to a safe, fully computed load sweep.
// Formulas live in TransformerFormulas.h; fuse and protection tables in FuseStandards.h.
#pragma once

#include "FieldError.h"
#include "Setup.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

enum class FuseOutlook { Holds, MayOpen, Opens };
std::string toString(FuseOutlook outlook); // "holds", "may-open", "opens"

struct PlanStep {
    int index = 0;                              // k = 0..N; 0 is the open-circuit point
    double currentA = 0.0;                      // I_k = k/N * top_fraction * I2rated, A
    double predictedVoltageV = 0.0;             // V2nl - R*I_k, V
    std::optional<double> loadResistanceOhm;    // V/I to set on the load; none at k = 0
    double loadPowerW = 0.0;                    // V*I in the load, W
    double outputVa = 0.0;                      // V*I at the secondary terminals, VA
    double copperLossW = 0.0;                   // I²R referred to the secondary, W
    double primaryCurrentA = 0.0;               // estimated primary current, A
    double vaMargin = 0.0;                      // rated VA - output VA
    bool rheostatOk = true;                     // current within the rheostat's safe current and setting within its track
    FuseOutlook fuseOutlook = FuseOutlook::Holds; // for the fitted fuse at primaryCurrentA
};

struct RecommendedFuse {
    double ratingA = 0.0;  // smallest IEC 60127 R10 rating >= factor * I1rated
    FuseType type = FuseType::TimeLag;
    double factor = 0.0;   // the multiplier used
};

struct Plan {
    double ratedSecondaryCurrentA = 0.0;        // S/V2
    double ratedPrimaryCurrentA = 0.0;          // S/V1
    double noLoadVoltageV = 0.0;                // V2nl (given or derived from regulation)
    double turnsRatio = 0.0;                    // V1/V2nl
    double seriesResistanceOhm = 0.0;           // (V2nl - V2)/I2rated, referred to the secondary
    double regulationPercent = 0.0;             // (V2nl - V2)/V2 * 100
    double magnetizingFraction = 0.0;           // of rated primary current, used in primaryCurrentA
    RecommendedFuse recommendedFuse;
    double maxPrimaryProtectionA = 0.0;         // NEC 450.3(B) primary-only ceiling
    FuseSpec outlookFuse;                       // the fuse the outlook is for: fitted, or the recommended one
    bool outlookFuseIsFitted = false;           // false: bench.fuse was absent
    std::optional<double> rheostatSafeCurrentA; // sqrt(P/R_total) when a rheostat is given
    double overloadLimitVa = 0.0;               // rated VA * overload factor
    double totalTimeS = 0.0;                    // steps * dwell
    std::vector<std::string> defaultsUsed;      // setup-file names of defaulted fields
    std::vector<std::string> warnings;          // each says what to change
    std::vector<PlanStep> steps;
};

struct PlanResult {
    std::optional<Plan> plan; // set when errors is empty
    FieldErrors errors;       // refusals, each naming the field and what to change
};

PlanResult makePlan(const Setup &setup);

} // namespace sagline
