// The controller's live fit, backed by core's LineFit (ordinary least squares, O(1) per point).
#pragma once

#include "LineFit.h"
#include "LiveFit.h"

namespace sagline {

class LineFitLiveFit final : public LiveFit {
public:
    void addPoint(double currentA, double voltageV) override;
    LiveFitSnapshot snapshot() const override;
    std::optional<PredictionBand> predict(double currentA, double level) const override;
    const LineFit &lineFit() const { return m_fit; }

private:
    LineFit m_fit;
};

} // namespace sagline
