// The transformer formulas the planner uses, each in one place with its source.
// Model: ideal transformer plus a series resistance referred to the secondary (V = V0 - R*I).
#pragma once

#include <cmath>

namespace sagline::formulas {

// Rated current from apparent power: I = S / V.
inline double ratedCurrent(double ratedPowerVa, double voltageV) { return ratedPowerVa / voltageV; }

// Turns ratio as the voltage ratio at no load: a = V1 / V2nl.
inline double turnsRatio(double primaryVoltageV, double secondaryNoLoadVoltageV)
{
    return primaryVoltageV / secondaryNoLoadVoltageV;
}

// Voltage regulation with the full-load voltage as the base, the textbook definition
// (electric-machines texts; FACTS.md §4): VR% = (V_nl - V_fl) / V_fl * 100.
inline double regulationPercent(double noLoadVoltageV, double fullLoadVoltageV)
{
    return (noLoadVoltageV - fullLoadVoltageV) / fullLoadVoltageV * 100.0;
}

// The same definition solved for the no-load voltage: V_nl = V_fl * (1 + VR%/100).
inline double noLoadVoltageFromRegulation(double fullLoadVoltageV, double regulationPercentValue)
{
    return fullLoadVoltageV * (1.0 + regulationPercentValue / 100.0);
}

// Series resistance referred to the secondary from the resistive-load voltage drop at rated
// current: R = (V_nl - V_fl) / I_rated.
inline double seriesResistance(double noLoadVoltageV, double fullLoadVoltageV, double ratedSecondaryCurrentA)
{
    return (noLoadVoltageV - fullLoadVoltageV) / ratedSecondaryCurrentA;
}

// Terminal voltage of the model at secondary current I: V = V_nl - R*I.
inline double terminalVoltage(double noLoadVoltageV, double seriesResistanceOhm, double currentA)
{
    return noLoadVoltageV - seriesResistanceOhm * currentA;
}

// Copper loss in the series resistance: P = I^2 R.
inline double copperLoss(double currentA, double seriesResistanceOhm) { return currentA * currentA * seriesResistanceOhm; }

// Estimated primary current: the load current referred to the primary (I2 / a, in phase with
// the voltage for a resistive load) and the magnetizing current (lagging the voltage by about
// 90 degrees) add as phasors in quadrature: I1 = sqrt((I2/a)^2 + Im^2). Core-loss current and
// leakage reactance are neglected; good to a few percent for small units.
inline double primaryCurrent(double secondaryCurrentA, double turnsRatioValue, double magnetizingCurrentA)
{
    return std::hypot(secondaryCurrentA / turnsRatioValue, magnetizingCurrentA);
}

// A wire-wound rheostat dissipates only in the engaged part of its track, so the allowed power
// scales with the engaged fraction and the safe current is the same at every setting:
// I_max = sqrt(P_rated / R_total) (common practice; FACTS.md §9).
inline double rheostatSafeCurrent(double powerRatingW, double totalResistanceOhm)
{
    return std::sqrt(powerRatingW / totalResistanceOhm);
}

} // namespace sagline::formulas
