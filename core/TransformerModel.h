// A physical model of a small single-phase transformer on a bench, for the virtual bench: the
// approximate equivalent circuit of the textbooks, solved with phasors. A supply (EMF with its
// own series impedance, so it sags under load) feeds the primary terminals; across them the
// shunt branch (core-loss resistance Rc = V1²/P0, so core loss ∝ V1², and magnetizing reactance
// Xm = V1/Im at the rated supply); then the ideal ratio and the series branch referred to the
// secondary (resistance R and leakage reactance X) into a resistive load. Copper heating
// (first-order thermal model) raises R by the copper (or aluminium) temperature coefficient.
// Pure C++; time is advanced explicitly by the caller.
#pragma once

#include "Setup.h"

#include <optional>

namespace sagline {

struct TransformerParameters {
    double primaryVoltageV = 230.0;        // applied supply, V RMS
    double turnsRatio = 10.0;              // V1 / V2 at no load
    double seriesResistanceOhm = 1.0;      // referred to the secondary, at referenceTemperatureC
    double referenceTemperatureC = 20.0;   // temperature at which seriesResistanceOhm holds
    // R(T) = R_ref (T_k + T) / (T_k + T_ref). T_k = 234.5 °C for copper, 225 °C for aluminium
    // (IEEE C57.12.90 / UL temperature-test clause; FACTS.md §3).
    double temperatureConstantC = 234.5;
    double magnetizingCurrentA = 0.0;      // primary magnetizing current, A RMS, at primaryVoltageV
    double coreLossW = 0.0;                // no-load (core) loss at primaryVoltageV, W; scales with V1²
    double leakageReactanceOhm = 0.0;      // series (leakage) reactance referred to the secondary, Ω
    double supplyResistanceOhm = 0.0;      // the supply's own series resistance, Ω (0: a stiff supply)
    double supplyReactanceOhm = 0.0;       // the supply's own series reactance, Ω
    double thermalTimeConstantS = 1200.0;  // copper heating time constant, s (common practice: tens of minutes)
    double thermalResistanceKPerW = 10.0;  // steady copper rise per watt of copper loss, K/W
    double ambientC = 20.0;                // ambient and starting copper temperature, °C

    double noLoadVoltageV() const { return primaryVoltageV / turnsRatio; }
};

// Defaults for the virtual bench where a nameplate says nothing (common practice, from memory):
// no-load loss as a share of rated VA, 5 % for small laminated cores, 1.5 % for toroids, 3 %
// otherwise; leakage reactance a quarter of the series resistance (in small mains transformers
// the winding resistance dominates the short-circuit impedance).
double defaultCoreLossFraction(Construction construction);
inline constexpr double defaultLeakageReactanceToResistance = 0.25;

// Parameters that reproduce a setup's nameplate: no-load voltage, the series resistance the
// planner derives, magnetizing current = fraction x rated primary current, and a thermal
// resistance giving `ratedRiseK` of steady copper rise at rated copper loss.
// Core loss and leakage reactance from the defaults above.
TransformerParameters transformerParametersFor(const Setup &setup, double magnetizingFraction, double ratedRiseK = 40.0);

struct TransformerState {
    double secondaryVoltageV = 0.0;   // at the terminals, V RMS
    double secondaryCurrentA = 0.0;   // A RMS
    double primaryCurrentA = 0.0;     // A RMS, drawn from the supply
    double primaryVoltageV = 0.0;     // at the primary terminals (the supply less its own drop), V RMS
    double primaryPowerW = 0.0;       // active power into the primary terminals, W
    double primaryReactivePowerVar = 0.0; // reactive power into the primary terminals, var (magnitude)
    double primaryPowerFactor = 1.0;  // P1 / (V1·I1); 1 when nothing is drawn
    double coreLossW = 0.0;           // V1²/Rc at the present terminal voltage, W
    double seriesResistanceOhm = 0.0; // at the present copper temperature
    double copperTemperatureC = 0.0;
    double copperLossW = 0.0;         // I2² R
    bool supplied = true;             // false once the primary is disconnected (fuse open)
};

class TransformerModel {
public:
    explicit TransformerModel(const TransformerParameters &parameters);

    // nullopt = open circuit. A resistance <= 0 is treated as a dead short of 1 mΩ.
    void setLoadResistance(std::optional<double> ohm);
    std::optional<double> loadResistance() const { return m_loadOhm; }
    void setSupplied(bool supplied); // false: primary disconnected, the output collapses
    // Integrates the copper temperature over `seconds` (steps of at most τ/50).
    void advance(double seconds);
    TransformerState state() const;
    const TransformerParameters &parameters() const { return m_parameters; }
    double resistanceAt(double temperatureC) const;

private:
    TransformerParameters m_parameters;
    std::optional<double> m_loadOhm;
    double m_copperC = 20.0;
    bool m_supplied = true;
};

} // namespace sagline
