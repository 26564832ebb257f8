#include "FitPresentation.h"

#include "ConformityDecision.h"
#include "ResultAnalysis.h"
#include "TypedValue.h"
#include "UiFormat.h"
#include "UncertaintyFormat.h"

#include <cmath>

namespace sagline {

namespace {

QString withU(const UncertainValue &value, const char *unit)
{
    return QString::fromStdString(formatWithUncertainty(value.value, value.expandedUncertainty.value_or(0.0), unit));
}

QString uNote(const UncertainValue &value, double k)
{
    return value.expandedUncertainty ? QObject::tr("± U, k = %1").arg(k) : QObject::tr("U needs 3 points");
}

// A typed value in `unit`, or nothing when blank; `error` gets the rule when unreadable.
std::optional<double> typed(const QString &text, Unit unit, const QString &field, QStringList &errors)
{
    QString error;
    const auto value = typedQuantity(text, unit, field, &error);
    if (!error.isEmpty())
        errors << error;
    return value;
}

void addBatchLines(const FitSummary &batch, std::size_t n, QList<ResultLine> &lines)
{
    if (!batch.ok() || batch.n != n)
        return; // the batch fit lags on very large sweeps; its lines return when it catches up
    if (batch.curvatureP) {
        const bool bends = *batch.curvatureP < 0.05;
        lines.append({QStringLiteral("curvature"), QObject::tr("Curvature check"),
                      bends ? QObject::tr("line bends") : QObject::tr("straight"),
                      QObject::tr("p = %1 for a quadratic term%2")
                          .arg(formatNumber(*batch.curvatureP, 2))
                          .arg(bends ? QObject::tr(": core saturation or winding heating?") : QString()),
                      bends});
    }
    lines.append({QStringLiteral("outliers"), QObject::tr("Outliers flagged"), QString::number(batch.outlierRows.size()),
                  QObject::tr("|studentized residual| > 3; excluded only with a reason"), !batch.outlierRows.empty()});
}

} // namespace

ResultsView resultsView(const ResultsInputs &in)
{
    ResultsView view;
    const LineFitResult fit = in.live->result();
    if (!fit.ok()) {
        view.lines.append({QStringLiteral("status"), QObject::tr("Fit"), QString::fromStdString(fit.message),
                           QObject::tr("needs two points at different currents"), true});
        return view;
    }
    QStringList problems;
    const FitSummary summary = summaryOfLiveFit(*in.live);
    AnalysisInput input;
    if (in.setup)
        input = analysisInputFor(in.setup->nameplate);
    if (in.verdict.constant)
        input.temperatureConstant = *in.verdict.constant;
    input.referenceTemperatureC = typed(in.verdict.referenceTemperature, Unit::Celsius,
                                        QStringLiteral("verdict.reference_temperature_c"), problems);
    auto winding = typed(in.details.windingTemperature, Unit::Celsius, QStringLiteral("session.winding_temperature_c"), problems);
    if (!winding)
        winding = typed(in.details.ambientTemperature, Unit::Celsius, QStringLiteral("session.ambient_temperature_c"), problems);
    input.windingTemperatureC = winding;
    const double k = input.coverageFactor;
    const AnalysisResult a = in.setup ? analyseFit(summary, input) : AnalysisResult{};

    auto &lines = view.lines;
    if (in.setup && a.ok()) {
        lines.append({QStringLiteral("series_resistance"), QObject::tr("Series resistance R (secondary)"),
                      withU(a.seriesResistanceOhm, "Ω"), uNote(a.seriesResistanceOhm, k)});
        if (a.referenceResistanceOhm && a.temperatureCorrection)
            lines.append({QStringLiteral("reference_resistance"),
                          QObject::tr("R at %1").arg(formatQuantity(*input.referenceTemperatureC, Unit::Celsius, 3)),
                          withU(*a.referenceResistanceOhm, "Ω"),
                          QString::fromStdString(describe(input.temperatureConstant))});
        else
            lines.append({QStringLiteral("reference_resistance"), QObject::tr("R at reference temperature"), QObject::tr("—"),
                          QObject::tr("give the winding (or ambient) and reference temperatures")});
        if (a.primaryResistanceOhm)
            lines.append({QStringLiteral("primary_resistance"), QObject::tr("R referred to the primary"),
                          withU(*a.primaryResistanceOhm, "Ω"), QObject::tr("× turns ratio²")});
        lines.append({QStringLiteral("no_load_voltage"), QObject::tr("No-load voltage V0"), withU(a.noLoadVoltageV, "V"),
                      uNote(a.noLoadVoltageV, k)});
        lines.append({QStringLiteral("full_load_voltage"), QObject::tr("Voltage at rated current"),
                      withU(a.fullLoadVoltageV, "V"),
                      QObject::tr("at %1").arg(formatQuantity(input.ratedCurrentA, Unit::Ampere, 3))});
        lines.append({QStringLiteral("regulation"), QObject::tr("Regulation"), withU(a.regulationPercent, "%"),
                      QObject::tr("%1 base; nameplate %2")
                          .arg(QString::fromStdString(toString(a.regulationBase)))
                          .arg(nameplateRegulationPercent(in.setup->nameplate)
                                   ? formatQuantity(*nameplateRegulationPercent(in.setup->nameplate), Unit::Percent, 3)
                                   : QObject::tr("not given"))});
        lines.append({QStringLiteral("copper_loss"), QObject::tr("Copper loss at rated current"), withU(a.copperLossW, "W"),
                      QObject::tr("I² R")});
    } else {
        // No nameplate to analyse against: the fit alone.
        lines.append({QStringLiteral("series_resistance"), QObject::tr("Series resistance R (secondary)"),
                      QString::fromStdString(formatWithUncertainty(fit.seriesResistanceOhm(), k * fit.slopeSe.value_or(0.0), "Ω")),
                      QObject::tr("± U, k = %1").arg(k)});
        lines.append({QStringLiteral("no_load_voltage"), QObject::tr("No-load voltage V0"),
                      QString::fromStdString(formatWithUncertainty(fit.noLoadVoltageV(), k * fit.interceptSe.value_or(0.0), "V")),
                      QObject::tr("± U, k = %1").arg(k)});
        for (const auto &error : a.errors)
            problems << QString::fromStdString(error.message());
    }
    if (in.plan)
        lines.append({QStringLiteral("series_resistance_planned"), QObject::tr("R expected from the nameplate"),
                      formatQuantity(in.plan->seriesResistanceOhm, Unit::Ohm), QObject::tr("planner's estimate")});
    if (fit.residualSd)
        lines.append({QStringLiteral("residual_sd"), QObject::tr("Residual SD"),
                      QString::fromStdString(formatWithUncertainty(*fit.residualSd, 0.0, "V")), QObject::tr("scatter about the line")});
    if (fit.rSquared)
        lines.append({QStringLiteral("r_squared"), QObject::tr("R²"), QString::number(*fit.rSquared, 'f', 6), QString()});
    lines.append({QStringLiteral("points"), QObject::tr("Points in the fit"), QString::number(fit.n),
                  QObject::tr("every recorded point not excluded")});
    if (in.batch)
        addBatchLines(*in.batch, fit.n, lines);

    // The verdict: measured regulation against the limit, by the chosen ILAC-G8 rule.
    if (in.setup && a.ok()) {
        auto limit = typed(in.verdict.regulationLimit, Unit::Percent, QStringLiteral("verdict.regulation_limit_percent"), problems);
        if (!limit)
            limit = nameplateRegulationPercent(in.setup->nameplate);
        if (limit && a.regulationPercent.expandedUncertainty) {
            const ConformityDecision d = decideAgainstUpperLimit(a.regulationPercent.value, *a.regulationPercent.expandedUncertainty,
                                                                 *limit, in.verdict.rule);
            if (d.ok) {
                view.state = d.outcome == ConformityOutcome::Pass   ? VerdictState::Pass
                             : d.outcome == ConformityOutcome::Fail ? VerdictState::Fail
                                                                    : VerdictState::Undecided;
                const QString word = d.outcome == ConformityOutcome::Pass   ? QObject::tr("PASS")
                                     : d.outcome == ConformityOutcome::Fail ? QObject::tr("FAIL")
                                                                            : QObject::tr("CANNOT DECIDE");
                view.verdictText = QObject::tr("%1: regulation %2 against a limit of %3")
                                       .arg(word, withU(a.regulationPercent, "%"), formatQuantity(*limit, Unit::Percent, 3));
                view.verdictRule = QString::fromStdString(d.ruleName) + QStringLiteral(". ")
                                   + QString::fromStdString(d.explanation);
            } else {
                problems << QStringLiteral("verdict: ") + QString::fromStdString(d.error);
            }
        }
    }
    for (const QString &problem : std::as_const(problems))
        lines.append({QStringLiteral("problem"), QObject::tr("Cannot use"), problem.section(QLatin1Char(':'), 0, 0),
                      problem.mid(problem.indexOf(QLatin1Char(':')) + 1).trimmed(), true});
    return view;
}

FitOverlay fitOverlay(const LineFit &live, const std::vector<double> &grid, std::optional<double> nextCurrentA)
{
    FitOverlay overlay;
    if (!live.result().ok())
        return overlay;
    const std::vector<LinePrediction> band = live.predictAll(grid, 0.95);
    for (std::size_t i = 0; i < grid.size(); ++i) {
        const double current = grid[i];
        const LinePrediction &p = band[i];
        if (i == 0 || i + 1 == grid.size()) // a straight line needs its two ends only
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
