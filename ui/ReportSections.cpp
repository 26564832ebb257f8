// Title block, results and verdict, nameplate and plan of the session report; the whole report
// in its printed order, and the PDF page set-up every report shares.
#include "ReportSections.h"

#include "ReportCanvas.h"
#include "ReportText.h"
#include "ReportWriter.h"
#include "SessionSummary.h"

#include <QFileInfo>
#include <QPageLayout>
#include <QPdfWriter>

namespace sagline {

using namespace reporttext;

void drawTitleBlock(ReportCanvas &canvas, const SessionSummary &summary, const ReportOptions &options)
{
    const SessionInfo &info = summary.info;
    canvas.title(QStringLiteral("Transformer load test report"),
                 QStringLiteral("Unit %1  ·  operator %2  ·  session started %3  ·  report made %4")
                     .arg(q(info.unitSerial), q(info.operatorName), readableUtc(info.createdUtc),
                          readableUtc(options.generatedUtc.toStdString())));
    const auto ambient = summary.latestTemperatureC(TemperatureKind::Ambient);
    const auto winding = summary.latestTemperatureC(TemperatureKind::Winding);
    if (summary.isSimulated())
        canvas.framedText(QStringLiteral("SIMULATED"),
                          QStringLiteral("The readings come from the virtual bench (a simulated transformer and meters), not "
                                         "from a measurement. Every page says so."));
    QStringList recorders;
    for (const Actor &actor : summary.recorders.distinct) {
        const QString who = whoDid(actor.person, actor.osAccount);
        if (!recorders.contains(who))
            recorders.append(who);
    }
    canvas.keyValues({
        {QStringLiteral("Unit serial number"), q(info.unitSerial)},
        {QStringLiteral("Operator"), q(info.operatorName)},
        {QStringLiteral("Session file"), breakable(QFileInfo(q(summary.path)).fileName())},
        {QStringLiteral("Created by"), whoDid(info.createdBy.person, info.createdBy.osAccount)},
        {QStringLiteral("Readings recorded by"), recorders.isEmpty() ? QStringLiteral("—") : recorders.join(QStringLiteral("; "))},
        {QStringLiteral("Completeness"), summary.progress.isComplete()
                                             ? QStringLiteral("complete (%1 of %2 steps)")
                                                   .arg(summary.progress.recordedSteps)
                                                   .arg(summary.progress.plannedSteps)
                                             : q(summary.progress.label())},
        {QStringLiteral("Sign-off"), q(summary.seal.summary())},
        {QStringLiteral("Recorded by"), q(info.softwareVersion) + QStringLiteral(" (schema %1)").arg(info.schemaVersion)},
        {QStringLiteral("Readings"), QStringLiteral("%1 recorded, %2 excluded, %3 used in the fit")
                                         .arg(summary.readings.size())
                                         .arg(summary.excludedCount())
                                         .arg(summary.fit.n)},
        {QStringLiteral("Temperatures"), QStringLiteral("ambient %1, winding %2")
                                             .arg(quantity(ambient, "°C", 3), quantity(winding, "°C", 3))},
    });
    if (!summary.notice.empty())
        canvas.paragraph(QStringLiteral("Note: ") + q(summary.notice), 8.0, false, true);
    if (summary.instruments.empty()) {
        canvas.paragraph(QStringLiteral("Instruments: none recorded (readings typed in or imported)."), 8.5);
        return;
    }
    QList<QStringList> rows;
    for (const InstrumentRecord &instrument : summary.instruments)
        rows.append({q(instrument.role), q(instrument.identity), q(instrument.accuracy)});
    canvas.skip(4.0);
    canvas.table({{QStringLiteral("Instrument role"), 0.16},
                  {QStringLiteral("Identity (*IDN?)"), 0.42},
                  {QStringLiteral("Accuracy specification"), 0.42}},
                 rows);
}

namespace {

// The results at the reference temperature (R scaled, V0 unchanged), when referred.
void addReferredRows(QList<QPair<QString, QString>> &rows, const SessionSummary &summary, const AnalysisResult &a)
{
    if (!a.referenceResistanceOhm || !a.temperatureCorrection || !a.referenceTemperatureC) {
        rows.append({QStringLiteral("R at a reference temperature"), QStringLiteral("not computed: no winding temperature recorded")});
        return;
    }
    const QString at = QStringLiteral("at %1 °C%2").arg(*a.referenceTemperatureC).arg(summary.referenceTemperatureDefaulted
                                                                                          ? QStringLiteral(" (default)")
                                                                                          : QString());
    rows.append({QStringLiteral("R %1").arg(at),
                 withU(*a.referenceResistanceOhm, "Ω") + QStringLiteral("; winding at %1; %2")
                                                             .arg(quantity(summary.latestTemperatureC(TemperatureKind::Winding), "°C", 3),
                                                                  q(a.temperatureCorrection->convention))});
    if (a.referredRegulationPercent)
        rows.append({QStringLiteral("Regulation %1").arg(at), withU(*a.referredRegulationPercent, "%")});
    if (a.referredFullLoadVoltageV)
        rows.append({QStringLiteral("Full-load voltage %1").arg(at), withU(*a.referredFullLoadVoltageV, "V")});
    if (a.referredCopperLossW)
        rows.append({QStringLiteral("Copper loss %1").arg(at), withU(*a.referredCopperLossW, "W")});
}

void drawVerdict(ReportCanvas &canvas, const SessionSummary &summary)
{
    canvas.heading(QStringLiteral("Verdict"));
    // Which choices judged this session and where each came from, so a reader can tell a
    // printed verdict from one judged otherwise on screen.
    canvas.paragraph(QStringLiteral("Judged with: %1.").arg(q(describeSettingsUsed(summary))), 8.0);
    for (const std::string &notice : summary.recordedSettings.notices)
        canvas.paragraph(q(notice), 8.0, true);
    if (!summary.progress.isComplete()) {
        // A sweep that ended before its last step gets no verdict, least of all a pass.
        canvas.framedText(QStringLiteral("%1: NO VERDICT").arg(q(summary.progress.label()).toUpper()),
                          QStringLiteral("Not every planned step was recorded, so the session is not judged; the results "
                                         "above are from the points that were. Resume the session to record the rest."));
        return;
    }
    if (!summary.verdict) {
        canvas.framedText(QStringLiteral("NO VERDICT"), q(summary.analysisProblem));
        return;
    }
    const SpecificationVerdict &v = *summary.verdict;
    QStringList details;
    for (const ConformityDecision &d : v.limits) {
        QString line = q(d.ok ? outcomeWords(d.outcome) + ": " + d.explanation : d.error);
        if (d.conformanceProbability)
            line += QStringLiteral(" Probability of conformity %1 (JCGM 106:2012).")
                        .arg(q(conformanceProbabilityText(*d.conformanceProbability)));
        details << line;
    }
    details << QStringLiteral("Limits: %1.").arg(q(v.limitsSource));
    if (!v.limits.empty())
        details << QStringLiteral("Decision rule: %1; %2.")
                       .arg(q(v.ruleName), v.atReferenceTemperature ? QStringLiteral("judged at the reference temperature")
                                                                    : QStringLiteral("judged as measured"));
    canvas.framedText(q(outcomeWords(v.outcome)) + QStringLiteral("  —  ") + q(v.explanation), details.join(QLatin1Char(' ')));
}

} // namespace

void drawResultsAndVerdict(ReportCanvas &canvas, const SessionSummary &summary)
{
    canvas.heading(QStringLiteral("Results"));
    const FitSummary &fit = summary.fit;
    if (!fit.ok()) {
        canvas.paragraph(QStringLiteral("No fit: %1").arg(q(fit.message)), 9.0, true);
        return;
    }
    QList<QPair<QString, QString>> rows;
    if (const auto &a = summary.analysis) {
        rows = {
            {QStringLiteral("Series resistance R (secondary)"), withU(a->seriesResistanceOhm, "Ω")},
            {QStringLiteral("No-load voltage V0"), withU(a->noLoadVoltageV, "V")},
            {QStringLiteral("Full-load voltage at rated current"), withU(a->fullLoadVoltageV, "V")},
            {QStringLiteral("Regulation (%1 base)").arg(q(toString(a->regulationBase))), withU(a->regulationPercent, "%")},
            {QStringLiteral("Copper loss at rated current"), withU(a->copperLossW, "W")},
        };
        if (a->primaryResistanceOhm)
            rows.append({QStringLiteral("R referred to the primary"), withU(*a->primaryResistanceOhm, "Ω")});
        addReferredRows(rows, summary, *a);
    } else {
        rows = {{QStringLiteral("Series resistance R"), q(formatQuantity(fit.seriesResistanceOhm(), "Ω"))},
                {QStringLiteral("No-load voltage V0"), q(formatQuantity(fit.noLoadVoltageV(), "V"))},
                {QStringLiteral("Analysis"), q(summary.analysisProblem)}};
    }
    canvas.keyValues(rows, 1);
    QString fitLine = QStringLiteral("Fit: V = V0 − R·I by %1 on %2 points; R² = %3; residual SD %4")
                          .arg(q(toString(fit.method)).toUpper())
                          .arg(fit.n)
                          .arg(fit.rSquared ? q(formatSignificant(*fit.rSquared, 7)) : QStringLiteral("—"),
                               quantity(fit.residualSdV, "V", 3));
    if (fit.curvatureP)
        fitLine += QStringLiteral("; curvature check p = %1%2")
                       .arg(q(formatSignificant(*fit.curvatureP, 2)),
                            *fit.curvatureP < 0.05 ? QStringLiteral(" (the line bends: saturation or heating?)") : QString());
    fitLine += QStringLiteral("; outlier screen: %1")
                   .arg(fit.outlierScreening.screened
                            ? QStringLiteral("%1 flagged (%2; critical value %3; %4)")
                                  .arg(fit.outlierRows.size())
                                  .arg(q(fit.outlierScreening.rule), q(formatSignificant(*fit.outlierScreening.criticalValue, 3)),
                                       q(fit.outlierScreening.source))
                            : q(fit.outlierScreening.reason));
    fitLine += QStringLiteral(". U: expanded uncertainty at 95 % coverage, k = U/u of each result's budget: t95(ν_eff) "
                              "(GUM, JCGM 100:2008, G.4) unless a rectangular meter limit dominates. ");
    if (summary.analysis)
        fitLine += QStringLiteral("Uncertainties: %1.").arg(q(summary.analysis->uncertaintyBasis));
    canvas.paragraph(fitLine, 8.0);
    drawVerdict(canvas, summary);
}

void drawNameplateAndPlan(ReportCanvas &canvas, const SessionSummary &summary)
{
    canvas.heading(QStringLiteral("Nameplate and bench"));
    if (!summary.setup) {
        canvas.paragraph(QStringLiteral("The stored setup could not be read: ") + q(summary.setupProblem), 9.0, true);
    } else {
        const Nameplate &n = summary.setup->nameplate;
        const Bench &b = summary.setup->bench;
        canvas.keyValues({
            {QStringLiteral("Rated power"), q(formatQuantity(n.ratedPowerVa, "VA"))},
            {QStringLiteral("Primary voltage, frequency"), q(formatQuantity(n.primaryVoltageV, "V")) + QStringLiteral(", ") +
                                                               q(formatQuantity(n.frequencyHz, "Hz"))},
            {QStringLiteral("Secondary, full load"), q(formatQuantity(n.secondaryVoltageV, "V"))},
            {QStringLiteral("Secondary, no load"), n.secondaryNoLoadVoltageV ? q(formatQuantity(*n.secondaryNoLoadVoltageV, "V"))
                                                                             : QStringLiteral("from regulation")},
            {QStringLiteral("Regulation on the nameplate"), n.regulationPercent ? q(formatSignificant(*n.regulationPercent, 3)) + " %"
                                                                                : QStringLiteral("from the voltages")},
            {QStringLiteral("Construction, winding"), q(toString(n.construction)) + QStringLiteral(", ") + q(toString(n.windingMaterial))},
            {QStringLiteral("Load steps, dwell"), QStringLiteral("%1 steps to %2 % of rated current, %3 each")
                                                      .arg(b.steps)
                                                      .arg(b.topFraction * 100.0)
                                                      .arg(q(formatQuantity(b.dwellS, "s", 3)))},
            {QStringLiteral("Primary fuse fitted"), b.fuse ? q(formatQuantity(b.fuse->ratingA, "A", 3)) + " " + q(toString(b.fuse->type))
                                                           : QStringLiteral("not given")},
        });
    }
    const StoredPlan &plan = summary.plan;
    if (!plan.present || !plan.problem.empty()) {
        canvas.paragraph(plan.present ? QStringLiteral("Plan: ") + q(plan.problem) : QStringLiteral("No plan stored with this session."), 8.5);
        return;
    }
    canvas.paragraph(QStringLiteral("Plan as computed when the session was made: rated secondary current %1, estimated series "
                                    "resistance %2, recommended primary fuse %3 %4.")
                         .arg(quantity(plan.ratedSecondaryCurrentA, "A"), quantity(plan.seriesResistanceOhm, "Ω"),
                              quantity(plan.recommendedFuseA, "A", 3), q(plan.recommendedFuseType)),
                     8.5);
    QList<QStringList> rows;
    for (const StoredPlanStep &step : plan.steps)
        rows.append({QString::number(step.index), fixed(step.currentA, 3), fixed(step.predictedVoltageV, 3),
                     step.loadResistanceOhm ? fixed(*step.loadResistanceOhm, 2) : QStringLiteral("open"), fixed(step.outputVa, 2),
                     q(step.fuseOutlook)});
    const auto right = Qt::AlignRight;
    canvas.table({{QStringLiteral("Step"), 0.08, right},
                  {QStringLiteral("Current (A)"), 0.16, right},
                  {QStringLiteral("Predicted V (V)"), 0.18, right},
                  {QStringLiteral("Load (Ω)"), 0.16, right},
                  {QStringLiteral("Output (VA)"), 0.16, right},
                  {QStringLiteral("Fuse outlook"), 0.26}},
                 rows);
    for (const std::string &warning : plan.warnings)
        canvas.paragraph(QStringLiteral("Plan warning: ") + q(warning), 8.0, false, true);
}

void drawSessionReport(ReportCanvas &canvas, const SessionSummary &summary, const ReportOptions &options)
{
    canvas.setPageMark(summary.isSimulated() ? QStringLiteral("SIMULATED (virtual bench)") : QString());
    drawTitleBlock(canvas, summary, options);
    drawResultsAndVerdict(canvas, summary);
    drawPrimarySide(canvas, summary);
    drawUncertaintyBudget(canvas, summary);
    drawCharts(canvas, summary);
    drawNameplateAndPlan(canvas, summary);
    drawReadingsTable(canvas, summary);
    drawRecordsAndSignOff(canvas, summary); // the mark stays for the last page's footer
}

void setUpReportPdf(QPdfWriter &writer, const ReportOptions &options)
{
    writer.setPageSize(QPageSize(options.pageSize));
    writer.setPageMargins(QMarginsF(18, 18, 18, 16), QPageLayout::Millimeter);
    writer.setResolution(600);
    writer.setCreator(options.producedBy);
}

} // namespace sagline
