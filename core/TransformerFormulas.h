// The transformer formulas the planner uses, each in one place with its source.
// Model: ideal transformer plus a series resistance referred to the secondary (V = V0 - R*I).
#pragma once

#include <algorithm>
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

// --- The primary side and the equivalent circuit (open-circuit and load readings) ---
// Source for the circuit relations below: the open-circuit and short-circuit tests as every
// electrical machines textbook gives them (checked against S. J. Chapman, "Electric Machinery
// Fundamentals", the section on determining the equivalent-circuit values, from memory).

// Reactive power from apparent and active power: Q = sqrt((V·I)² - P²), 0 when P ≥ V·I
// (meter error at unity power factor).
inline double reactivePower(double voltageV, double currentA, double activePowerW)
{
    const double s = voltageV * currentA;
    return s > activePowerW ? std::sqrt(s * s - activePowerW * activePowerW) : 0.0;
}

// Reactive power from active power and power factor: Q = P·tan(arccos(pf)) = P·sqrt(1 - pf²)/pf.
inline double reactivePowerFromPowerFactor(double activePowerW, double powerFactor)
{
    return activePowerW * std::sqrt(std::max(0.0, 1.0 - powerFactor * powerFactor)) / powerFactor;
}

// Shunt branch from the open-circuit test at voltage V: core-loss resistance Rc = V²/P0 and
// magnetizing reactance Xm = V²/Q0 (parallel elements across the supply).
inline double coreLossResistance(double voltageV, double noLoadLossW) { return voltageV * voltageV / noLoadLossW; }
inline double magnetizingReactance(double voltageV, double noLoadReactivePowerVar)
{
    return voltageV * voltageV / noLoadReactivePowerVar;
}

// Series branch from reactive power: the leakage reactance takes X·I² of reactive power beyond
// what the shunt branch draws, X = (Q1 - Q0) / I² (referred to the side whose current is I).
inline double seriesReactance(double reactivePowerVar, double noLoadReactivePowerVar, double currentA)
{
    return (reactivePowerVar - noLoadReactivePowerVar) / (currentA * currentA);
}

// Core loss scales with the square of the applied voltage (flux ∝ V at fixed frequency, loss ∝
// B² near the working point: common practice): P(V) = P0·(V/V0)².
inline double coreLossAt(double noLoadLossW, double noLoadVoltageV, double voltageV)
{
    const double ratio = voltageV / noLoadVoltageV;
    return noLoadLossW * ratio * ratio;
}

// The load current at which efficiency peaks: where the copper loss R·I² equals the constant
// core loss P0, I = sqrt(P0/R) (the maximum-efficiency condition of the textbooks, which holds
// the terminal voltage constant; with V = V0 - R·I the true peak sits slightly lower).
inline double maxEfficiencyCurrent(double noLoadLossW, double seriesResistanceOhm)
{
    return std::sqrt(noLoadLossW / seriesResistanceOhm);
}

// Efficiency of the model at secondary current I into a resistive load: output P2 = (V0 - R·I)·I,
// input P2 + P0 + R·I².
inline double modelEfficiency(double noLoadVoltageV, double seriesResistanceOhm, double noLoadLossW, double currentA)
{
    const double output = (noLoadVoltageV - seriesResistanceOhm * currentA) * currentA;
    return output / (output + noLoadLossW + seriesResistanceOhm * currentA * currentA);
}

// The approximate voltage drop of the textbooks at a load of power factor cos φ:
// ΔV ≈ I·(R·cos φ + X·sin φ) lagging, I·(R·cos φ - X·sin φ) leading (the phasor diagram with the
// quadrature term neglected).
inline double approximateVoltageDrop(double currentA, double seriesResistanceOhm, double seriesReactanceOhm,
                                     double powerFactor, bool leading)
{
    const double sine = std::sqrt(std::max(0.0, 1.0 - powerFactor * powerFactor));
    return currentA * (seriesResistanceOhm * powerFactor + (leading ? -1.0 : 1.0) * seriesReactanceOhm * sine);
}

} // namespace sagline::formulas
