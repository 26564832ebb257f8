#include "FitPresentation.h"

#include "UiFormat.h"

#include <cmath>

namespace sagline {

namespace {

// Expanded uncertainty with coverage factor k = 2 (GUM, JCGM 100:2008, 6.2.1 and 6.3.3).
constexpr double coverageFactor = 2.0;

} // namespace

QList<ResultLine> resultLines(const LineFit &live, const FitSummary &summary, const Plan *plan)
{
    QList<ResultLine> lines;
    const LineFitResult fit = live.result();
    if (!fit.ok()) {
        lines.append({QStringLiteral("status"), QObject::tr("Fit"), QString::fromStdString(fit.message),
                      QObject::tr("needs two points at different currents"), true});
        return lines;
    }
    const auto expanded = [](const std::optional<double> &se) { return se ? coverageFactor * *se : 0.0; };
    lines.append({QStringLiteral("series_resistance"), QObject::tr("Series resistance R (secondary)"),
                  formatWithUncertainty(fit.seriesResistanceOhm(), expanded(fit.slopeSe), Unit::Ohm),
                  fit.slopeSe ? QObject::tr("± U, k = 2") : QObject::tr("U needs 3 points")});
    if (plan) {
        lines.append({QStringLiteral("series_resistance_planned"), QObject::tr("R expected from nameplate"),
                      formatQuantity(plan->seriesResistanceOhm, Unit::Ohm), QObject::tr("planner's estimate")});
    }
    lines.append({QStringLiteral("no_load_voltage"), QObject::tr("No-load voltage V0"),
                  formatWithUncertainty(fit.noLoadVoltageV(), expanded(fit.interceptSe), Unit::Volt),
                  QObject::tr("± U, k = 2")});
    if (plan && plan->ratedSecondaryCurrentA > 0.0) {
        const LinePrediction full = live.predict(plan->ratedSecondaryCurrentA);
        lines.append({QStringLiteral("full_load_voltage"), QObject::tr("Voltage at rated current"),
                      formatWithUncertainty(full.value, full.standardError ? coverageFactor * *full.standardError : 0.0, Unit::Volt),
                      QObject::tr("at %1").arg(formatQuantity(plan->ratedSecondaryCurrentA, Unit::Ampere, 3))});
    }
    if (fit.residualSd)
        lines.append({QStringLiteral("residual_sd"), QObject::tr("Residual SD"),
                      formatQuantity(*fit.residualSd * 1000.0, Unit::None, 3) + QStringLiteral(" mV"), QString()});
    if (fit.rSquared)
        lines.append({QStringLiteral("r_squared"), QObject::tr("R²"), QString::number(*fit.rSquared, 'f', 6), QString()});
    lines.append({QStringLiteral("points"), QObject::tr("Points in the fit"), QString::number(fit.n),
                  QObject::tr("every recorded point not excluded")});
    if (summary.ok() && summary.n == fit.n) {
        if (summary.curvatureP) {
            const bool bends = *summary.curvatureP < 0.05;
            lines.append({QStringLiteral("curvature"), QObject::tr("Curvature check"),
                          bends ? QObject::tr("line bends") : QObject::tr("straight"),
                          QObject::tr("p = %1 for a quadratic term%2")
                              .arg(formatNumber(*summary.curvatureP, 2))
                              .arg(bends ? QObject::tr(": saturation or heating?") : QString()),
                          bends});
        }
        if (!summary.outlierRows.empty())
            lines.append({QStringLiteral("outliers"), QObject::tr("Outliers flagged"),
                          QString::number(summary.outlierRows.size()),
                          QObject::tr("|studentized residual| > 3; exclude only with a reason"), true});
    }
    return lines;
}

FitOverlay fitOverlay(const LineFit &live, const std::vector<double> &grid, std::optional<double> nextCurrentA)
{
    FitOverlay overlay;
    if (!live.result().ok())
        return overlay;
    for (double current : grid) {
        const LinePrediction p = live.predict(current, 0.95);
        overlay.line.append(QPointF(current, p.value));
        if (p.confidence) {
            overlay.bandUpper.append(QPointF(current, p.confidence->high));
            overlay.bandLower.append(QPointF(current, p.confidence->low));
        }
    }
    if (nextCurrentA) {
        const LinePrediction p = live.predict(*nextCurrentA, 0.95);
        if (p.prediction) {
            overlay.predicted = QPointF(*nextCurrentA, p.value);
            overlay.predictionLowV = p.prediction->low;
            overlay.predictionHighV = p.prediction->high;
        }
    }
    return overlay;
}

ChartLimits chartLimits(const Plan &plan, double ratedVa)
{
    ChartLimits limits;
    limits.ratedCurrentA = plan.ratedSecondaryCurrentA;
    limits.ratedVa = ratedVa;
    limits.hardStopVa = plan.overloadLimitVa;
    limits.rheostatSafeCurrentA = plan.rheostatSafeCurrentA;
    for (const auto &step : plan.steps) {
        if (step.fuseOutlook != FuseOutlook::Holds) {
            limits.fuseRiskCurrentA = step.currentA;
            break;
        }
    }
    if (!plan.steps.empty()) {
        limits.plannedTopCurrentA = plan.steps.back().currentA;
        limits.expectedTopV = plan.steps.back().predictedVoltageV;
    }
    limits.expectedNoLoadV = plan.noLoadVoltageV;
    return limits;
}

} // namespace sagline
