#include "FitPresentation.h"

#include "ConformityAssessment.h"
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

// "U (k = 2.08, 95 %)", or why there is none.
QString uNote(const UncertainValue &value)
{
    return value.expandedUncertainty ? QString::fromStdString(expandedUncertaintyLabel(value)) : QObject::tr("U needs 3 points");
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
    const OutlierScreening &screen = batch.outlierScreening;
    if (screen.screened)
        lines.append({QStringLiteral("outliers"), QObject::tr("Outliers flagged"), QString::number(batch.outlierRows.size()),
                      QObject::tr("%1; critical value %2; shown, never applied. Source: %3")
                          .arg(QString::fromStdString(screen.rule), formatNumber(*screen.criticalValue, 3),
                               QString::fromStdString(screen.source)),
                      !batch.outlierRows.empty()});
    else
        lines.append({QStringLiteral("outliers"), QObject::tr("Outliers flagged"), QObject::tr("—"),
                      QString::fromStdString(screen.reason)});
}

// R and V0 of a fit without a nameplate (no rated current to analyse at).
void addLineResults(const FitSummary &summary, const Setup *setup, ResultsView &view)
{
    const LineResults line = lineResults(summary, setup ? setup->meters : std::nullopt);
    view.lines.append({QStringLiteral("series_resistance"), QObject::tr("Series resistance R (secondary)"),
                       withU(line.seriesResistanceOhm, "Ω"), uNote(line.seriesResistanceOhm)});
    view.lines.append({QStringLiteral("no_load_voltage"), QObject::tr("No-load voltage V0"), withU(line.noLoadVoltageV, "V"),
                       uNote(line.noLoadVoltageV)});
    view.budgets = budgetTables(line);
}

void addAnalysisLines(const AnalysisResult &a, std::optional<double> plate, ResultsView &view)
{
    auto &lines = view.lines;
    lines.append({QStringLiteral("series_resistance"), QObject::tr("Series resistance R (secondary)"),
                  withU(a.seriesResistanceOhm, "Ω"), uNote(a.seriesResistanceOhm)});
    if (a.primaryResistanceOhm)
        lines.append({QStringLiteral("primary_resistance"), QObject::tr("R referred to the primary"),
                      withU(*a.primaryResistanceOhm, "Ω"), QObject::tr("× turns ratio²")});
    lines.append({QStringLiteral("no_load_voltage"), QObject::tr("No-load voltage V0"), withU(a.noLoadVoltageV, "V"),
                  uNote(a.noLoadVoltageV)});
    lines.append({QStringLiteral("full_load_voltage"), QObject::tr("Voltage at rated current"),
                  withU(a.fullLoadVoltageV, "V"), uNote(a.fullLoadVoltageV)});
    lines.append({QStringLiteral("regulation"), QObject::tr("Regulation"), withU(a.regulationPercent, "%"),
                  QObject::tr("%1; %2 base; nameplate %3")
                      .arg(uNote(a.regulationPercent), QString::fromStdString(toString(a.regulationBase)),
                           plate ? formatQuantity(*plate, Unit::Percent, 3) : QObject::tr("not given"))});
    lines.append({QStringLiteral("copper_loss"), QObject::tr("Copper loss at rated current"), withU(a.copperLossW, "W"),
                  QObject::tr("I² R")});
    if (a.referenceResistanceOhm && a.temperatureCorrection && a.referenceTemperatureC) {
        const QString at = formatQuantity(*a.referenceTemperatureC, Unit::Celsius, 3);
        lines.append({QStringLiteral("reference_resistance"), QObject::tr("R at %1").arg(at),
                      withU(*a.referenceResistanceOhm, "Ω"),
                      QObject::tr("%1; %2").arg(uNote(*a.referenceResistanceOhm),
                                                QString::fromStdString(a.temperatureCorrection->convention))});
        if (a.referredRegulationPercent)
            lines.append({QStringLiteral("reference_regulation"), QObject::tr("Regulation at %1").arg(at),
                          withU(*a.referredRegulationPercent, "%"), uNote(*a.referredRegulationPercent)});
        if (a.referredCopperLossW)
            lines.append({QStringLiteral("reference_copper_loss"), QObject::tr("Copper loss at %1").arg(at),
                          withU(*a.referredCopperLossW, "W"), QObject::tr("R scaled, V0 unchanged")});
    } else {
        lines.append({QStringLiteral("reference_resistance"), QObject::tr("R at reference temperature"), QObject::tr("—"),
                      QObject::tr("give the winding (or ambient) and reference temperatures")});
    }
    lines.append({QStringLiteral("uncertainty_basis"), QObject::tr("Uncertainties include"),
                  a.metersKnown ? QObject::tr("meters + scatter") : QObject::tr("scatter only"),
                  QString::fromStdString(a.uncertaintyBasis), !a.metersKnown});
    view.budgets = budgetTables(a);
}

// Which readings the results above were fitted on (the supply's statement as the note) and,
// on a referred fit, R of the readings as measured, so the supply's own share stays visible.
void addFitBasisLines(bool referred, const SupplyAssessment &supply, const LineFit &live, const Setup *setup,
                      QList<ResultLine> &lines)
{
    // The value column does not wrap: a short word there, the whole statement in the note.
    lines.append({QStringLiteral("fit_basis"), QObject::tr("Readings fitted"),
                  referred ? QObject::tr("referred") : QObject::tr("as measured"),
                  (referred ? QObject::tr("Referred to rated primary voltage: ") : QObject::tr("As measured: "))
                      + QString::fromStdString(supply.statement)
                      + (referred ? QObject::tr("; the chart shows the readings as measured") : QString()),
                  supply.drifted});
    if (!referred)
        return;
    const LineResults raw = lineResults(summaryOfLiveFit(live), setup ? setup->meters : std::nullopt);
    lines.append({QStringLiteral("series_resistance_as_measured"), QObject::tr("R as measured (not referred)"),
                  withU(raw.seriesResistanceOhm, "Ω"),
                  QObject::tr("%1; includes the supply's own impedance").arg(uNote(raw.seriesResistanceOhm))});
}

void setVerdict(const SpecificationVerdict &v, ResultsView &view)
{
    view.state = verdictStateOf(v.outcome);
    QStringList details;
    for (const ConformityDecision &d : v.limits) {
        QString line = QString::fromStdString(d.ok ? d.explanation : d.error);
        if (d.conformanceProbability)
            line += QObject::tr(" Probability of conformity %1.")
                        .arg(QString::fromStdString(conformanceProbabilityText(*d.conformanceProbability)));
        details << line;
    }
    view.verdictText = QString::fromStdString(outcomeWords(v.outcome));
    if (v.limits.size() == 1)
        view.verdictText += QStringLiteral(": ") + QString::fromStdString(v.limits.front().quantity);
    else if (v.limits.empty())
        view.verdictText += QObject::tr(": no limit stated");
    details << QString::fromStdString(v.explanation);
    details << QObject::tr("Limits: %1.").arg(QString::fromStdString(v.limitsSource));
    if (!v.limits.empty())
        details << QString::fromStdString(v.ruleName) + (v.atReferenceTemperature ? QObject::tr("; judged at the reference temperature.")
                                                                                  : QObject::tr("; judged as measured."));
    view.verdictRule = details.join(QLatin1Char('\n'));
}

} // namespace

ResultsView assessmentView(const Assessment &assessment)
{
    ResultsView view;
    if (!assessment.analysis.ok())
        return view;
    addAnalysisLines(assessment.analysis, assessment.verdict.nameplateRegulationPercent, view);
    setVerdict(assessment.verdict, view);
    return view;
}

ResultsView resultsView(const ResultsInputs &in)
{
    ResultsView view;
    const LineFitResult fit = in.live->result();
    if (!fit.ok()) {
        // The value column holds short values (it does not wrap); the reason goes in the note.
        view.lines.append({QStringLiteral("status"), QObject::tr("Fit"), QObject::tr("not yet"),
                           QObject::tr("%1; it needs two points at different currents").arg(QString::fromStdString(fit.message)),
                           true});
        return view;
    }
    QStringList problems;
    const bool referred = in.referred && in.referred->ok() && in.supply && in.supply->fitVoltages == FitVoltages::Referred;
    const FitSummary summary = referred ? *in.referred : summaryOfLiveFit(*in.live);
    AssessmentOptions options;
    options.rule = in.verdict.rule;
    options.temperatureConstant = in.verdict.constant;
    options.referenceTemperatureC = typed(in.verdict.referenceTemperature, Unit::Celsius,
                                          QStringLiteral("verdict.reference_temperature_c"), problems);
    auto winding = typed(in.details.windingTemperature, Unit::Celsius, QStringLiteral("session.winding_temperature_c"), problems);
    if (!winding)
        winding = typed(in.details.ambientTemperature, Unit::Celsius, QStringLiteral("session.ambient_temperature_c"), problems);
    options.windingTemperatureC = winding;
    QString limitProblem;
    if (const auto limit = typedRegulationLimit(in.verdict.regulationLimit, QStringLiteral("verdict.regulation_limit_percent"),
                                                &limitProblem))
        options.regulationLimit = *limit;
    if (!limitProblem.isEmpty())
        problems << limitProblem;

    if (referred)
        options.referralGainUPercent = in.supply->referralGainUPercent;
    std::optional<Assessment> assessment;
    if (in.setup)
        assessment = assessFit(summary, *in.setup, options);
    if (assessment && assessment->analysis.ok()) {
        addAnalysisLines(assessment->analysis, assessment->verdict.nameplateRegulationPercent, view);
    } else {
        addLineResults(summary, in.setup, view); // no nameplate to analyse against: the fit alone
        if (assessment)
            for (const auto &error : assessment->analysis.errors)
                problems << QString::fromStdString(error.message());
    }
    auto &lines = view.lines;
    if (in.supply)
        addFitBasisLines(referred, *in.supply, *in.live, in.setup, lines);
    if (in.plan)
        lines.append({QStringLiteral("series_resistance_planned"), QObject::tr("R expected from the nameplate"),
                      formatQuantity(in.plan->seriesResistanceOhm, Unit::Ohm), QObject::tr("planner's estimate")});
    if (summary.residualSdV)
        lines.append({QStringLiteral("residual_sd"), QObject::tr("Residual SD"),
                      QString::fromStdString(formatWithUncertainty(*summary.residualSdV, 0.0, "V")),
                      QObject::tr("scatter about the line")});
    if (summary.rSquared)
        lines.append({QStringLiteral("r_squared"), QObject::tr("R²"), QString::number(*summary.rSquared, 'f', 6), QString()});
    lines.append({QStringLiteral("points"), QObject::tr("Points in the fit"), QString::number(summary.n),
                  QObject::tr("every recorded point not excluded")});
    if (referred)
        addBatchLines(*in.referred, summary.n, lines); // the referred fit is whole: its screen is current
    else if (in.batch)
        addBatchLines(*in.batch, fit.n, lines);

    // The verdict against the specification's limits, by the chosen ILAC-G8 rule.
    if (assessment && assessment->analysis.ok())
        setVerdict(assessment->verdict, view);
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
