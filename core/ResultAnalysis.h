// What an engineer signs off, derived from a fit of V = V0 - R·I: regulation at rated current,
// copper loss, R referred to the primary and to a reference temperature, each with its standard
// and expanded uncertainty propagated from the fit's covariance (GUM, JCGM 100:2008, 5.1.2,
// first-order, with the correlation of V0 and R).
#pragma once

#include "FieldError.h"
#include "FitSummary.h"
#include "Setup.h"
#include "TemperatureCorrection.h"

#include <optional>
#include <string>

namespace sagline {

// Which voltage regulation is referred to (FACTS.md §4).
enum class RegulationBase {
    FullLoad, // (V0 - V_fl)/V_fl · 100: the textbook definition and IEC 61558-1's base
    NoLoad,   // (V0 - V_fl)/V0 · 100: used in some texts
};

std::string toString(RegulationBase base); // "full-load", "no-load"

struct AnalysisInput {
    double ratedCurrentA = 0.0;                    // I_rated, secondary, A (> 0), taken as exact
    RegulationBase regulationBase = RegulationBase::FullLoad;
    std::optional<double> turnsRatio;              // a = V1/V2 (no-load), for R referred to the primary
    std::optional<double> windingTemperatureC;     // T_m, the winding's temperature during the sweep, °C
    double uWindingTemperatureC = 0.0;             // standard uncertainty of T_m, °C
    std::optional<double> referenceTemperatureC;   // T_ref, °C (e.g. 75)
    TemperatureConstant temperatureConstant = TemperatureConstant::CopperIeee;
    double coverageFactor = 2.0;                   // k for expanded uncertainties (GUM 6.2)
};

// A result with its uncertainty; both uncertainties are absent when the fit has none (n = 2).
struct UncertainValue {
    double value = 0.0;
    std::optional<double> standardUncertainty;     // u, same unit as value
    std::optional<double> expandedUncertainty;     // U = k·u
};

struct AnalysisResult {
    FieldErrors errors;                            // empty when ok; fields named as in AnalysisInput
    double coverageFactor = 2.0;
    UncertainValue seriesResistanceOhm;            // R, referred to the secondary, Ω
    UncertainValue noLoadVoltageV;                 // V0, V
    UncertainValue fullLoadVoltageV;               // V_fl = V0 - R·I_rated, V
    UncertainValue regulationPercent;              // on regulationBase, %
    RegulationBase regulationBase = RegulationBase::FullLoad;
    UncertainValue copperLossW;                    // I_rated²·R, W
    std::optional<UncertainValue> primaryResistanceOhm;   // a²·R, Ω (when turnsRatio is given)
    std::optional<UncertainValue> referenceResistanceOhm; // R at T_ref, Ω (when both temperatures are given)
    std::optional<TemperatureCorrection> temperatureCorrection; // factor and T_k convention used

    bool ok() const { return errors.empty(); }
};

// From the nameplate: I_rated = S/V2 (full-load), a = V1/V2nl, T_k from the winding material
// (copper: IEEE C57.12.90's 234.5 °C unless the caller changes it). Temperatures stay empty.
AnalysisInput analysisInputFor(const Nameplate &nameplate);
// The nameplate's regulation in % of the full-load voltage: regulationPercent, or from the
// no-load voltage (V2nl - V2)/V2·100. Empty when neither is usable.
std::optional<double> nameplateRegulationPercent(const Nameplate &nameplate);

// The fit must be ok. The uncertainties come from FitSummary::analysis*Se() and
// analysisCovariance() (OLS as fitted; WLS and York enlarged by sqrt(MSWD) when above 1).
AnalysisResult analyseFit(const FitSummary &fit, const AnalysisInput &input);

} // namespace sagline
