// The figures a lab lead compares across sessions, taken from the fit engine and its analysis
// (core/FitSummary.h, core/ResultAnalysis.h, core/ConformityDecision.h): nothing is fitted or
// propagated here, this only picks the inputs a saved session provides (nameplate, recorded
// winding temperature) and the review's options, and keeps what the comparison table shows.
#pragma once

#include "ConformityDecision.h"
#include "FitSummary.h"
#include "ResultAnalysis.h"
#include "Setup.h"

#include <optional>
#include <string>

namespace sagline {

struct FigureOptions {
    double referenceTemperatureC = 75.0;  // IEC 60076-1 reference for liquid-immersed units (from memory, FACTS.md §3)
    // T_k for copper windings: IEEE C57.12.90's 234.5 °C (the analysis default) or IEC 60076-1's 235 °C.
    // Aluminium windings always use 225 °C.
    TemperatureConstant copperConstant = TemperatureConstant::CopperIeee;
    DecisionRule rule = DecisionRule::GuardedAcceptance;
    double coverageFactor = 2.0;          // k for expanded uncertainties (GUM 6.2; about 95 %)
    std::optional<double> regulationLimitPercent; // absent: the nameplate's regulation
};

struct SessionFigures {
    bool ok = false;                             // a fit and an analysis at rated current
    std::string message;                         // why not (the fit's or the analysis's message)
    double resistanceOhm = 0.0;                  // R = -slope, at the measured temperature, Ω
    std::optional<double> resistanceUOhm;        // expanded, k = coverageFactor
    double noLoadVoltageV = 0.0;                 // V0
    std::optional<double> noLoadVoltageUV;       // expanded
    std::optional<double> windingTemperatureC;   // temperature R was measured at
    double referenceTemperatureC = 75.0;
    double temperatureConstantC = 234.5;         // T_k used
    std::optional<double> resistanceRefOhm;      // R at the reference temperature
    std::optional<double> resistanceRefUOhm;     // expanded
    double ratedCurrentA = 0.0;                  // rated VA / rated secondary voltage
    std::optional<double> regulationPercent;     // (V0 - V_fl)/V_fl × 100 at rated current
    std::optional<double> regulationUPercent;    // expanded
    std::optional<double> regulationLimitPercent;// the tolerance limit it was judged against
    std::optional<ConformityOutcome> verdict;    // absent: no regulation or no limit
    DecisionRule rule = DecisionRule::GuardedAcceptance;
    std::string ruleName;                        // the decision's own rule text, e.g. "ILAC-G8:09/2019 ..."

    std::string verdictText() const;             // "pass", "fail", "cannot-decide", or "n/a"
};

// `windingTemperatureC` absent: no R at the reference temperature.
SessionFigures computeSessionFigures(const FitSummary &fit, const Setup &setup,
                                     std::optional<double> windingTemperatureC, const FigureOptions &options);

} // namespace sagline
