#include "TransformerModel.h"

#include <algorithm>
#include <cmath>

namespace sagline {

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
    const double v0 = m_parameters.noLoadVoltageV();
    if (m_loadOhm) {
        s.secondaryCurrentA = v0 / (*m_loadOhm + s.seriesResistanceOhm);
        s.secondaryVoltageV = s.secondaryCurrentA * *m_loadOhm;
    } else {
        s.secondaryVoltageV = v0;
    }
    s.copperLossW = s.secondaryCurrentA * s.secondaryCurrentA * s.seriesResistanceOhm;
    const double referred = s.secondaryCurrentA / m_parameters.turnsRatio;
    s.primaryCurrentA = std::hypot(referred, m_parameters.magnetizingCurrentA);
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
