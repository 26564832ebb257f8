// What an engineer signs off, derived from a fit of V = V0 - R·I: regulation at rated current,
// copper loss, R referred to the primary and to a reference temperature (and, there, the
// regulation, full-load voltage and copper loss it implies), each with an uncertainty budget
// (core/UncertaintyBudget.h, JCGM 100:2008):
// - the readings' random error, once, through the fit's own geometry: Type A from the residual
//   scatter (n - 2 dof), floored by the resolution (δ/sqrt(12), GUM F.2.2.1); for WLS and York
//   the stated per-reading uncertainties (enlarged by sqrt(MSWD) when above 1);
// - each meter's gain and offset as systematic errors common to all its readings (GUM 5.2),
//   rectangular, propagated through each result's own sensitivity, so the voltmeter's gain
//   cancels in regulation as it does physically;
// - the winding temperature's uncertainty into every result referred to the reference
//   temperature.
#pragma once

#include "FieldError.h"
#include "FitSummary.h"
#include "Setup.h"
#include "TemperatureCorrection.h"
#include "UncertaintyBudget.h"

#include <optional>
#include <string>

namespace sagline {

// Which voltage regulation is referred to (FACTS.md §4).
enum class RegulationBase {
    FullLoad, // (V0 - V_fl)/V_fl · 100: the textbook definition and IEC 61558-1's base
    NoLoad,   // (V0 - V_fl)/V0 · 100: used in some texts
};

std::string toString(RegulationBase base); // "full-load", "no-load"

// u(T_m) when the setup does not state it: a thermometer on the outside of a winding against the
// winding's mean temperature (common practice).
inline constexpr double defaultWindingTemperatureUncertaintyC = 2.0;

struct AnalysisInput {
    double ratedCurrentA = 0.0;                    // I_rated, secondary, A (> 0), taken as exact
    RegulationBase regulationBase = RegulationBase::FullLoad;
    std::optional<double> turnsRatio;              // a = V1/V2 (no-load), for R referred to the primary
    std::optional<double> windingTemperatureC;     // T_m, the winding's temperature during the sweep, °C
    double uWindingTemperatureC = defaultWindingTemperatureUncertaintyC; // standard uncertainty of T_m, °C
    bool windingTemperatureUncertaintyDefaulted = true; // u(T_m) is the default, not stated
    std::optional<double> referenceTemperatureC;   // T_ref, °C (e.g. 75)
    TemperatureConstant temperatureConstant = TemperatureConstant::CopperIeee;
    std::optional<MeterSpecs> meters;              // absent: the uncertainty is the scatter's only
    // The fit was made on readings referred to the rated primary (SupplyReferral.h): the standard
    // uncertainty of the primary voltmeter's common gain, % of reading (SupplyAssessment's).
    std::optional<double> referralGainUPercent;
};

struct AnalysisResult {
    FieldErrors errors;                            // empty when ok; fields named as in AnalysisInput
    bool metersKnown = false;                      // the budgets include the meters' specifications
    std::string uncertaintyBasis;                  // one sentence: what the uncertainties include
    UncertainValue seriesResistanceOhm;            // R, referred to the secondary, Ω
    UncertainValue noLoadVoltageV;                 // V0, V
    UncertainValue fullLoadVoltageV;               // V_fl = V0 - R·I_rated, V
    UncertainValue regulationPercent;              // on regulationBase, %
    RegulationBase regulationBase = RegulationBase::FullLoad;
    UncertainValue copperLossW;                    // I_rated²·R, W
    std::optional<UncertainValue> primaryResistanceOhm;   // a²·R, Ω (when turnsRatio is given)
    // At the reference temperature (when both temperatures are given): R scaled by the factor
    // (T_k + T_ref)/(T_k + T_m), V0 unchanged.
    std::optional<UncertainValue> referenceResistanceOhm; // R at T_ref, Ω
    std::optional<UncertainValue> referredFullLoadVoltageV;
    std::optional<UncertainValue> referredRegulationPercent;
    std::optional<UncertainValue> referredCopperLossW;
    std::optional<TemperatureCorrection> temperatureCorrection; // factor and T_k convention used
    std::optional<double> referenceTemperatureC;

    bool ok() const { return errors.empty(); }
};

// From the nameplate: I_rated = S/V2 (full-load), a = V1/V2nl, T_k from the winding material
// (copper: IEEE C57.12.90's 234.5 °C unless the caller changes it). Temperatures stay empty.
AnalysisInput analysisInputFor(const Nameplate &nameplate);
// As above, with the setup's meter specifications and u(T_m) when it states them.
AnalysisInput analysisInputFor(const Setup &setup);
// The nameplate's regulation in % of the full-load voltage: regulationPercent, or from the
// no-load voltage (V2nl - V2)/V2·100. Empty when neither is usable.
std::optional<double> nameplateRegulationPercent(const Nameplate &nameplate);

// The fit must be ok; a fit of 2 points gives values without uncertainties.
AnalysisResult analyseFit(const FitSummary &fit, const AnalysisInput &input);

// R and V0 alone with their budgets, for a fit without a nameplate (no rated current).
struct LineResults {
    UncertainValue seriesResistanceOhm;
    UncertainValue noLoadVoltageV;
    std::string uncertaintyBasis;
};
LineResults lineResults(const FitSummary &fit, const std::optional<MeterSpecs> &meters);

} // namespace sagline
