// What the sweep controller needs from the live straight-line fit V = V0 - R·I, and the
// snapshot it hands to the UI and the CLI with every recorded point. The fit itself lives in
// core (LineFit, by the fit area); LineFitLiveFit adapts it.
#pragma once

#include <QString>

#include <optional>

namespace sagline {

struct LiveFitSnapshot {
    bool valid = false;                 // false below two usable points or on degenerate input
    int pointCount = 0;                 // points in the fit
    double seriesResistanceOhm = 0.0;   // R = -slope
    double seriesResistanceSeOhm = 0.0; // standard error of R (0 below three points)
    double noLoadVoltageV = 0.0;        // V0 = intercept
    double noLoadVoltageSeV = 0.0;
    double residualSdV = 0.0;
    QString status;                     // why it is not valid, for display
};

struct PredictionBand {
    double predictedV = 0.0;
    double lowV = 0.0;  // prediction interval for a new reading at the given current
    double highV = 0.0;
};

class LiveFit {
public:
    virtual ~LiveFit() = default;
    virtual void addPoint(double currentA, double voltageV) = 0;
    virtual LiveFitSnapshot snapshot() const = 0;
    // Prediction interval at `level` (e.g. 0.99) for a new reading at `currentA`; none until
    // the fit has enough points (three for a residual variance).
    virtual std::optional<PredictionBand> predict(double currentA, double level) const = 0;
};

} // namespace sagline
