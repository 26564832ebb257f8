// The figures a lab lead compares across sessions, derived from the fit engine's FitSummary
// (core/FitSummary.h; no fit is computed here): R and V0 with expanded uncertainties, R at a
// reference temperature, regulation at rated current with its uncertainty propagated from the
// fit's covariance, and a conformity verdict against the nameplate regulation under a decision
// rule of ILAC-G8:09/2019.
#pragma once

#include "FitSummary.h"
#include "Setup.h"

#include <optional>
#include <string>

namespace sagline {

// Which temperature constant T_k is used for copper (aluminium is 225 °C in both).
enum class TemperatureConvention {
    Iec,  // 235 °C for copper, IEC 60076-1 (FACTS.md §3)
    Ieee, // 234.5 °C for copper, IEEE C57.12.90 (FACTS.md §3)
};
std::string toString(TemperatureConvention convention); // "iec", "ieee"
// T_k in °C for the winding material under the convention.
double temperatureConstantC(WindingMaterial material, TemperatureConvention convention);

enum class DecisionRule {
    SimpleAcceptance,  // ILAC-G8:09/2019 §4.2.1: pass if the result is within the limit (w = 0)
    GuardedAcceptance, // ILAC-G8:09/2019 §4.2.2 with guard band w = U: pass below TL - U, fail above TL + U, else undecided
};
std::string toString(DecisionRule rule); // "simple-acceptance", "guarded-acceptance"
std::string describe(DecisionRule rule); // one sentence with the source, for reports

enum class Conformity { Pass, Fail, Undecided, NotAvailable };
std::string toString(Conformity conformity); // "pass", "fail", "undecided", "n/a"

struct FigureOptions {
    double referenceTemperatureC = 75.0;  // IEC 60076-1 reference for liquid-immersed units (from memory, FACTS.md §3)
    TemperatureConvention convention = TemperatureConvention::Iec;
    DecisionRule rule = DecisionRule::GuardedAcceptance;
    double coverageFactor = 2.0;          // k for expanded uncertainties (GUM 2.3.6; about 95 %)
    std::optional<double> regulationLimitPercent; // absent: the nameplate's regulation
};

struct SessionFigures {
    bool ok = false;
    std::string message;                         // why there are no figures (the fit's message)
    double resistanceOhm = 0.0;                  // R = -slope, at the measured temperature, Ω
    std::optional<double> resistanceUOhm;        // expanded, k = coverageFactor
    double noLoadVoltageV = 0.0;                 // V0
    std::optional<double> noLoadVoltageUV;       // expanded
    std::optional<double> windingTemperatureC;   // temperature R was measured at
    double referenceTemperatureC = 75.0;
    double temperatureConstantC = 235.0;         // T_k used
    std::optional<double> resistanceRefOhm;      // R at the reference temperature
    std::optional<double> resistanceRefUOhm;     // expanded; the temperature's own uncertainty is not included
    double ratedCurrentA = 0.0;                  // rated VA / rated secondary voltage
    std::optional<double> regulationPercent;     // (V0 - V_fl)/V_fl × 100, V_fl = V0 - R·I_rated
    std::optional<double> regulationUPercent;    // expanded
    std::optional<double> regulationLimitPercent;// the tolerance limit it was judged against
    Conformity verdict = Conformity::NotAvailable;
    DecisionRule rule = DecisionRule::GuardedAcceptance;
};

// `windingTemperatureC` absent: no R at the reference temperature. The nameplate gives rated
// current and, through regulation_percent or secondary_no_load_voltage_v, the limit.
SessionFigures computeSessionFigures(const FitSummary &fit, const Setup &setup,
                                     std::optional<double> windingTemperatureC, const FigureOptions &options);

// Regulation (percent of the full-load voltage) and its standard uncertainty from R, V0, their
// standard uncertainties and covariance cov(R, V0), at current I (first-order propagation, GUM 5.1.2).
struct RegulationEstimate {
    bool ok = false;
    double percent = 0.0;
    double standardUncertaintyPercent = 0.0;
};
RegulationEstimate regulationAt(double resistanceOhm, double noLoadVoltageV, double currentA, double uResistance,
                                double uNoLoadVoltage, double covResistanceNoLoad);

// The verdict of `value` ± `expandedU` against an upper tolerance limit.
Conformity judgeUpperLimit(double value, double expandedU, double limit, DecisionRule rule);

} // namespace sagline
