// A physical model of a small single-phase transformer on a bench, for the virtual bench:
// ideal ratio + series resistance (referred to the secondary) + magnetizing current, with
// copper heating (first-order thermal model) raising the resistance by the copper (or
// aluminium) temperature coefficient. Pure C++; time is advanced explicitly by the caller.
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
    double thermalTimeConstantS = 1200.0;  // copper heating time constant, s (common practice: tens of minutes)
    double thermalResistanceKPerW = 10.0;  // steady copper rise per watt of copper loss, K/W
    double ambientC = 20.0;                // ambient and starting copper temperature, °C

    double noLoadVoltageV() const { return primaryVoltageV / turnsRatio; }
};

// Parameters that reproduce a setup's nameplate: no-load voltage, the series resistance the
// planner derives, magnetizing current = fraction x rated primary current, and a thermal
// resistance giving `ratedRiseK` of steady copper rise at rated copper loss.
TransformerParameters transformerParametersFor(const Setup &setup, double magnetizingFraction, double ratedRiseK = 40.0);

struct TransformerState {
    double secondaryVoltageV = 0.0;   // at the terminals, V RMS
    double secondaryCurrentA = 0.0;   // A RMS
    double primaryCurrentA = 0.0;     // A RMS: referred load current and magnetizing current in quadrature
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
