// What the primary-side readings say beside the secondary fit: the open-circuit test at step 0
// (no-load loss P0, current I0, power factor, the shunt branch Rc and Xm), losses and efficiency
// at every step (input P1, output P2 = V2·I2 into a resistive load, the loss split into core and
// copper loss and the unexplained remainder as a balance check), efficiency at rated load, the
// load of peak efficiency (copper loss = core loss, I = sqrt(P0/R)), the series (leakage)
// reactance X = (Q1 - Q0)/I2² referred to the secondary, and the regulation predicted at a stated
// power factor, ΔV ≈ I(R cos φ ± X sin φ). Formulas: core/TransformerFormulas.h.
//
// Uncertainties (JCGM 100:2008, combined in core/UncertaintyBudget.h): each reading's stated
// standard uncertainty is a Type B component, rectangular (a meter specification, GUM 4.3.7);
// results from the fit (R, V0) carry the fit's own budget (core/FitBudget.h) with the extra
// components appended. For X, the reactive-power readings' errors are taken as fully correlated
// across steps (one meter, one range: the conservative sum) and the scatter about the line
// through the origin adds a Type A component (n - 1 dof).
#pragma once

#include "FieldError.h"
#include "FitSummary.h"
#include "Reading.h"
#include "ResultAnalysis.h"
#include "SupplyReferral.h"
#include "UncertaintyBudget.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

// The power factor regulation is predicted at when none is chosen: 0.8 lagging, the usual
// figure for rating regulation (common practice).
inline constexpr double defaultRegulationPowerFactor = 0.8;
// The largest current share of the rated secondary current still taken as "open circuit" when
// the readings carry no step numbers (common practice: the load's own draw is negligible).
inline constexpr double openCircuitCurrentShare = 0.01;

struct PrimarySideInput {
    double ratedPrimaryVoltageV = 0.0;     // V1,rated (> 0)
    double ratedPrimaryCurrentA = 0.0;     // S/V1 (> 0)
    double ratedSecondaryCurrentA = 0.0;   // S/V2 (> 0)
    double regulationPowerFactor = defaultRegulationPowerFactor; // cos φ, 0 < pf ≤ 1
    bool leading = false;                  // the load's current leads (capacitive)
    RegulationBase regulationBase = RegulationBase::FullLoad;
};

// The open-circuit (no-load) point: the step-0 reading at (about) rated voltage.
struct OpenCircuitResult {
    std::int64_t readingId = 0;
    double voltageV = 0.0;                      // V1 at the point (measured, else rated)
    bool voltageMeasured = false;
    std::optional<UncertainValue> noLoadLossW;  // P0 = P1 at no load, referred to rated V1 (∝ V²)
    std::optional<UncertainValue> noLoadCurrentA;       // I0
    std::optional<UncertainValue> noLoadCurrentPercent; // I0 / I1,rated · 100
    std::optional<UncertainValue> noLoadPowerFactor;    // P0 / (V1·I0)
    std::optional<UncertainValue> noLoadReactivePowerVar; // Q0
    std::optional<UncertainValue> coreLossResistanceOhm;  // Rc = V1²/P0, primary side
    std::optional<UncertainValue> magnetizingReactanceOhm; // Xm = V1²/Q0, primary side
};

// One loaded reading's loss balance.
struct StepLosses {
    std::int64_t readingId = 0;
    int step = -1;
    double currentA = 0.0;                 // I2, A
    UncertainValue inputPowerW;            // P1
    UncertainValue outputPowerW;           // P2 = V2·I2
    UncertainValue totalLossW;             // P1 - P2
    UncertainValue coreLossW;              // P0·(V1/V1,oc)²
    std::optional<UncertainValue> copperLossW; // R·I2² (with a fit)
    std::optional<UncertainValue> remainderW;  // P1 - P2 - core - copper: the balance check
    UncertainValue efficiencyPercent;      // P2/P1 · 100
    std::optional<double> reactivePowerVar; // Q1, when it can be had
};

struct PrimarySideResult {
    FieldErrors errors;                    // inputs that could not be used (field and rule)
    std::vector<std::string> warnings;     // results shown but to be read with care
    std::vector<std::string> notes;        // what was assumed
    bool hasPowerMeter = false;            // some reading carries P1
    std::optional<OpenCircuitResult> openCircuit;
    std::vector<StepLosses> steps;         // loaded readings with P1, in reading order
    std::optional<UncertainValue> efficiencyAtRatedPercent;   // model η at rated secondary current
    std::optional<UncertainValue> maxEfficiencyCurrentA;      // sqrt(P0/R), secondary, A
    std::optional<UncertainValue> maxEfficiencyPercent;       // model η there
    std::optional<UncertainValue> seriesReactanceOhm;         // X, referred to the secondary
    bool seriesReactanceResolved = false;                     // |X| above its expanded uncertainty
    std::optional<UncertainValue> regulationAtPowerFactorPercent; // at input pf, lagging/leading
    double regulationPowerFactor = defaultRegulationPowerFactor;
    bool leading = false;

    bool hasResults() const { return openCircuit.has_value() || !steps.empty(); }
};

// `analysis` is the secondary analysis (R, V0 and their budgets) when there is one; `fit` the
// fit it came from (needed with `analysis`). Readings: the session's, raw (not referred).
PrimarySideResult analysePrimarySide(const std::vector<Reading> &readings, const FitSummary *fit,
                                     const AnalysisInput *analysisInput, const PrimarySideInput &input);

// The model's efficiency and loss split against load current, for the window's chart: at each of
// `points` currents from 0 to `maxCurrentA`, η = P2/(P2 + P0 + R·I²) with P2 = (V0 - R·I)·I, the
// core loss P0 (referred to rated V1) and the copper loss R·I². Empty without P0 or a usable fit.
struct EfficiencyCurvePoint {
    double currentA = 0.0;
    double efficiencyPercent = 0.0;
    double coreLossW = 0.0;
    double copperLossW = 0.0;
};
std::vector<EfficiencyCurvePoint> efficiencyCurve(const PrimarySideResult &result, const FitSummary &fit,
                                                  double maxCurrentA, int points = 100);

// From the nameplate: V1, S/V1, S/V2 and the defaults above.
PrimarySideInput primarySideInputFor(const Nameplate &nameplate);

} // namespace sagline
