// The figures a lab lead compares across sessions, taken from the fit engine and its analysis
// (core/FitSummary.h, core/ResultAnalysis.h, core/ConformityDecision.h): nothing is fitted or
// propagated here, this only picks the inputs a saved session provides (nameplate, recorded
// winding temperature) and the review's options, and keeps what the comparison table shows.
#pragma once

#include "ConformityAssessment.h"
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
    DecisionRule rule = DecisionRule::NonBinary;
    RegulationLimitChoice regulationLimit; // default: the setup's specification (none: not judged)
    bool judgeAtReferenceTemperature = false; // true once the reference temperature was chosen
    std::optional<double> referralGainUPercent; // on a fit of referred readings: SupplyAssessment's
};

struct SessionFigures {
    bool ok = false;                             // a fit and an analysis at rated current
    std::string message;                         // why not (the fit's or the analysis's message)
    double resistanceOhm = 0.0;                  // R = -slope, at the measured temperature, Ω
    std::optional<double> resistanceUOhm;        // expanded (95 %, k = t95(ν_eff) of its own budget)
    std::optional<double> resistanceK;           // that k (each U has its own)
    double noLoadVoltageV = 0.0;                 // V0
    std::optional<double> noLoadVoltageUV;       // expanded
    std::optional<double> noLoadVoltageK;
    std::optional<double> windingTemperatureC;   // temperature R was measured at
    double referenceTemperatureC = 75.0;
    double temperatureConstantC = 234.5;         // T_k used
    std::optional<double> resistanceRefOhm;      // R at the reference temperature
    std::optional<double> resistanceRefUOhm;     // expanded
    std::optional<double> resistanceRefK;
    double ratedCurrentA = 0.0;                  // rated VA / rated secondary voltage
    std::optional<double> regulationPercent;     // (V0 - V_fl)/V_fl × 100 at rated current
    std::optional<double> regulationUPercent;    // expanded
    std::optional<double> regulationK;
    std::optional<double> regulationLimitPercent;// the regulation limit judged against, if any
    std::optional<ConformityOutcome> verdict;    // absent: no analysis; not-judged without limits
    std::optional<double> conformanceProbability; // the lowest of the judged limits', 0..1
    DecisionRule rule = DecisionRule::NonBinary;
    std::string ruleName;                        // the decision's own rule text, e.g. "ILAC-G8:09/2019 ..."
    std::string limitsSource;                    // where the limits came from
    bool metersKnown = false;                    // the uncertainties include the meters' specifications
    Assessment assessment;                       // everything behind these figures (budgets, limits)

    std::string verdictText() const;             // "pass", ..., "not-judged", or "n/a" without analysis
};

// `windingTemperatureC` absent: no R at the reference temperature.
SessionFigures computeSessionFigures(const FitSummary &fit, const Setup &setup,
                                     std::optional<double> windingTemperatureC, const FigureOptions &options);

} // namespace sagline
