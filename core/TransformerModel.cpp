#include "TransformerModel.h"

#include <algorithm>
#include <cmath>
#include <complex>

namespace sagline {

double defaultCoreLossFraction(Construction construction)
{
    switch (construction) {
    case Construction::Laminated: return 0.05;
    case Construction::Toroidal: return 0.015;
    case Construction::Other: return 0.03;
    }
    return 0.03;
}

TransformerParameters transformerParametersFor(const Setup &setup, double magnetizingFraction, double ratedRiseK)
{
    const Nameplate &n = setup.nameplate;
    TransformerParameters p;
    const double v2fl = n.secondaryVoltageV;
    double v2nl = n.secondaryNoLoadVoltageV.value_or(0.0);
    if (v2nl <= 0.0)
        v2nl = v2fl * (1.0 + n.regulationPercent.value_or(10.0) / 100.0);
    const double i2rated = n.ratedPowerVa / v2fl;
    p.primaryVoltageV = n.primaryVoltageV;
    p.turnsRatio = n.primaryVoltageV / v2nl;
    p.seriesResistanceOhm = (v2nl - v2fl) / i2rated;
    p.temperatureConstantC = n.windingMaterial == WindingMaterial::Aluminium ? 225.0 : 234.5;
    p.magnetizingCurrentA = magnetizingFraction * n.ratedPowerVa / n.primaryVoltageV;
    p.coreLossW = defaultCoreLossFraction(n.construction) * n.ratedPowerVa;
    p.leakageReactanceOhm = defaultLeakageReactanceToResistance * p.seriesResistanceOhm;
    const double ratedLoss = i2rated * i2rated * p.seriesResistanceOhm;
    p.thermalResistanceKPerW = ratedLoss > 0.0 ? ratedRiseK / ratedLoss : 0.0;
    return p;
}

TransformerModel::TransformerModel(const TransformerParameters &parameters)
    : m_parameters(parameters), m_copperC(parameters.ambientC)
{
}

void TransformerModel::setLoadResistance(std::optional<double> ohm)
{
    if (ohm && !(*ohm > 1e-3))
        ohm = 1e-3;
    m_loadOhm = ohm;
}

void TransformerModel::setSupplied(bool supplied)
{
    m_supplied = supplied;
}

double TransformerModel::resistanceAt(double temperatureC) const
{
    const double tk = m_parameters.temperatureConstantC;
    return m_parameters.seriesResistanceOhm * (tk + temperatureC) / (tk + m_parameters.referenceTemperatureC);
}

TransformerState TransformerModel::state() const
{
    TransformerState s;
    s.copperTemperatureC = m_copperC;
    s.seriesResistanceOhm = resistanceAt(m_copperC);
    s.supplied = m_supplied;
    if (!m_supplied)
        return s;
    using Complex = std::complex<double>;
    const TransformerParameters &p = m_parameters;
    const double a = p.turnsRatio;
    // The shunt branch across the primary terminals, fixed by the readings at the rated supply.
    Complex shunt(0.0, 0.0);
    if (p.coreLossW > 0.0)
        shunt += 1.0 / (p.primaryVoltageV * p.primaryVoltageV / p.coreLossW);
    if (p.magnetizingCurrentA > 0.0)
        shunt += 1.0 / Complex(0.0, p.primaryVoltageV / p.magnetizingCurrentA);
    // The series branch and load, referred to the primary (a²·Z).
    const Complex series(s.seriesResistanceOhm + (m_loadOhm ? *m_loadOhm : 0.0), p.leakageReactanceOhm);
    const Complex admittance = shunt + (m_loadOhm ? 1.0 / (a * a * series) : Complex(0.0, 0.0));
    const Complex supply(p.supplyResistanceOhm, p.supplyReactanceOhm);
    Complex v1(p.primaryVoltageV, 0.0);
    Complex i1(0.0, 0.0);
    if (std::abs(admittance) > 0.0) {
        const Complex inner = 1.0 / admittance;
        i1 = p.primaryVoltageV / (supply + inner);
        v1 = i1 * inner;
    }
    if (m_loadOhm) {
        const Complex i2 = (v1 / a) / series;
        s.secondaryCurrentA = std::abs(i2);
        s.secondaryVoltageV = s.secondaryCurrentA * *m_loadOhm;
    } else {
        s.secondaryVoltageV = std::abs(v1) / a;
    }
    s.copperLossW = s.secondaryCurrentA * s.secondaryCurrentA * s.seriesResistanceOhm;
    const Complex power = v1 * std::conj(i1);
    s.primaryVoltageV = std::abs(v1);
    s.primaryCurrentA = std::abs(i1);
    s.primaryPowerW = power.real();
    s.primaryReactivePowerVar = std::abs(power.imag());
    const double apparent = s.primaryVoltageV * s.primaryCurrentA;
    s.primaryPowerFactor = apparent > 0.0 ? std::min(1.0, s.primaryPowerW / apparent) : 1.0;
    s.coreLossW = p.coreLossW * std::norm(v1) / (p.primaryVoltageV * p.primaryVoltageV);
    return s;
}

void TransformerModel::advance(double seconds)
{
    const double tau = m_parameters.thermalTimeConstantS;
    if (!(seconds > 0.0) || !(tau > 0.0))
        return;
    const double maxStep = tau / 50.0;
    while (seconds > 0.0) {
        const double dt = std::min(seconds, maxStep);
        // Exact first-order step toward the steady temperature for the present loss.
        const double steady = m_parameters.ambientC + m_parameters.thermalResistanceKPerW * state().copperLossW;
        m_copperC = steady + (m_copperC - steady) * std::exp(-dt / tau);
        seconds -= dt;
    }
}

} // namespace sagline
