#include "LineFitLiveFit.h"

namespace sagline {

void LineFitLiveFit::addPoint(double currentA, double voltageV)
{
    m_fit.add(currentA, voltageV);
}

LiveFitSnapshot LineFitLiveFit::snapshot() const
{
    const LineFitResult result = m_fit.result();
    LiveFitSnapshot snapshot;
    snapshot.pointCount = static_cast<int>(result.n);
    snapshot.valid = result.ok();
    if (!result.ok()) {
        snapshot.status = QString::fromStdString(result.message);
        return snapshot;
    }
    snapshot.seriesResistanceOhm = result.seriesResistanceOhm();
    snapshot.noLoadVoltageV = result.noLoadVoltageV();
    snapshot.seriesResistanceSeOhm = result.slopeSe.value_or(0.0);
    snapshot.noLoadVoltageSeV = result.interceptSe.value_or(0.0);
    snapshot.residualSdV = result.residualSd.value_or(0.0);
    return snapshot;
}

std::optional<PredictionBand> LineFitLiveFit::predict(double currentA, double level) const
{
    if (!m_fit.result().ok())
        return std::nullopt;
    const LinePrediction prediction = m_fit.predict(currentA, level);
    if (!prediction.prediction)
        return std::nullopt;
    return PredictionBand{prediction.value, prediction.prediction->low, prediction.prediction->high};
}

} // namespace sagline
