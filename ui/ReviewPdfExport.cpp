#include "ReviewPdfExport.h"

#include "NumberFormat.h"
#include "OutputFile.h"
#include "ReportCanvas.h"
#include "ReportSections.h"
#include "SessionSummary.h"
#include "UncertaintyFormat.h"

#include <QBuffer>
#include <QFile>
#include <QFileInfo>
#include <QPainter>
#include <QPdfWriter>

namespace sagline {

namespace {

QString qs(const std::string &s) { return QString::fromStdString(s); }

QString withU(bool ok, double value, const std::optional<double> &u, const std::optional<double> &k, const char *unit)
{
    return ok ? qs(formatWithCoverage(value, u, k, unit)) : QStringLiteral("—");
}

// The primary side's efficiency at rated load or no-load loss, as the review table shows them.
QString primaryWithU(const std::optional<UncertainValue> &value, const char *unit)
{
    return value ? withU(true, value->value, value->expandedUncertainty, value->coverageFactor, unit) : QStringLiteral("—");
}

QString ohm(const std::optional<double> &v) { return v ? qs(formatQuantity(*v, "Ω")) : QStringLiteral("—"); }

QString fileName(const SessionRow &row) { return QFileInfo(qs(row.path)).fileName(); }

// "2026-12-01 09:00" from the stored UTC time.
QString startedText(const std::string &utc)
{
    return utc.size() >= 16 && utc[10] == 'T' ? qs(utc.substr(0, 10) + " " + utc.substr(11, 5)) : qs(utc);
}

// The review table's primary-side columns, as a table of their own under the design's (the
// summary table has no room left for two more columns): only when some unit of the design had its
// mains side read; a dash where a unit did not.
void drawPrimarySide(ReportCanvas &canvas, const DesignStatistics &design, const std::vector<const SessionRow *> &rows)
{
    QList<QStringList> table;
    bool any = false;
    for (std::size_t i : design.rows) {
        const SessionRow &row = *rows[i];
        any = any || row.primarySide.has_value();
        table.append({fileName(row), qs(row.unitSerial), primaryWithU(row.efficiencyAtRated(), "%"),
                      primaryWithU(row.noLoadLoss(), "W")});
    }
    if (!any)
        return;
    canvas.paragraph(QObject::tr("Primary side (mains meters read): efficiency at rated load from the model V = V0 - R·I "
                                 "with the no-load loss, and the no-load (core) loss at the rated primary voltage."),
                     8.0);
    canvas.table({{QObject::tr("File"), 0.28}, {QObject::tr("Unit"), 0.18},
                  {QObject::tr("η at rated ± U"), 0.27, Qt::AlignRight},
                  {QObject::tr("No-load loss ± U"), 0.27, Qt::AlignRight}},
                 table);
}

void drawDesign(ReportCanvas &canvas, const DesignStatistics &design, const std::vector<const SessionRow *> &rows,
                const BatchStatistics &stats, const ComparisonOptions &options)
{
    canvas.heading(QObject::tr("Design: %1").arg(qs(design.design)));
    const IndividualsChart &chart = design.chart;
    canvas.keyValues({{QObject::tr("Sessions"), QString::number(design.rows.size())},
                      {QObject::tr("Units in R statistics"), qs(unitsInStatisticsText(design))},
                      {QObject::tr("Mean R"), ohm(design.meanOhm)},
                      {QObject::tr("Standard deviation of R"), ohm(design.sdOhm)},
                      {QObject::tr("Median R"), ohm(design.medianOhm)},
                      {QObject::tr("Control limits (individuals chart)"),
                       chart.hasLimits() ? QObject::tr("%1 to %2, centre %3; %n unit(s) outside", "",
                                                       static_cast<int>(chart.outside.size()))
                                               .arg(ohm(chart.lower), ohm(chart.upper), ohm(chart.centre))
                                         : qs(chart.note)}});
    canvas.paragraph(QObject::tr("Far from the batch (this design only): %1.").arg(qs(design.ruleNote)), 8.0);
    QList<QStringList> table;
    for (std::size_t i : design.rows) {
        const SessionRow &row = *rows[i];
        const SessionFigures &f = row.figures;
        const bool far = stats.isFarFromBatch(i);
        table.append({fileName(row), qs(row.unitSerial), startedText(row.createdUtc),
                      withU(f.ok, f.resistanceOhm, f.resistanceUOhm, f.resistanceK, "Ω"),
                      withU(f.resistanceRefOhm.has_value(), f.resistanceRefOhm.value_or(0.0), f.resistanceRefUOhm,
                            f.resistanceRefK, "Ω"),
                      withU(f.regulationPercent.has_value(), f.regulationPercent.value_or(0.0), f.regulationUPercent,
                            f.regulationK, "%"),
                      qs(row.verdictWords())
                          + (far ? (design.screeningOnly ? QObject::tr(" · far from batch (screening only)")
                                                         : QObject::tr(" · far from batch"))
                                 : QString()),
                      qs(row.reviewState())});
    }
    canvas.table({{QObject::tr("File"), 0.16}, {QObject::tr("Unit"), 0.1}, {QObject::tr("Started (UTC)"), 0.12},
                  {QObject::tr("R ± U"), 0.12, Qt::AlignRight},
                  {QObject::tr("R at %1 °C ± U").arg(options.figures.referenceTemperatureC), 0.13, Qt::AlignRight},
                  {QObject::tr("Regulation ± U"), 0.11, Qt::AlignRight}, {QObject::tr("Verdict"), 0.14},
                  {QObject::tr("Reviewer's decision"), 0.12}},
                 table);
    drawPrimarySide(canvas, design, rows);
}

// Every safety stop and every session that ended early, by name: a lab lead must not have to
// open each report to find them.
void drawStopsAndIncomplete(ReportCanvas &canvas, const std::vector<const SessionRow *> &rows)
{
    QList<QStringList> stops;
    QList<QStringList> incomplete;
    for (const SessionRow *row : rows) {
        if (!row->opened)
            continue;
        for (const SafetyStopRecord &stop : row->safetyStops)
            stops.append({fileName(*row), qs(row->unitSerial), startedText(stop.timeUtc),
                          stop.step >= 0 ? QString::number(stop.step) : QStringLiteral("—"), qs(stop.rule), qs(stop.message)});
        if (!row->progress.isComplete())
            incomplete.append({fileName(*row), qs(row->unitSerial), startedText(row->createdUtc), qs(row->progress.label())});
    }
    canvas.heading(QObject::tr("Safety stops (%n)", "", static_cast<int>(stops.size())));
    if (stops.isEmpty())
        canvas.paragraph(QObject::tr("No session was stopped by a safety limit."));
    else
        canvas.table({{QObject::tr("File"), 0.17}, {QObject::tr("Unit"), 0.11}, {QObject::tr("Time (UTC)"), 0.13},
                      {QObject::tr("Step"), 0.06, Qt::AlignRight}, {QObject::tr("Limit"), 0.14}, {QObject::tr("What happened"), 0.39}},
                     stops);
    canvas.heading(QObject::tr("Incomplete sessions (%n): no verdict", "", static_cast<int>(incomplete.size())));
    if (incomplete.isEmpty())
        canvas.paragraph(QObject::tr("Every session recorded all its planned steps."));
    else
        canvas.table({{QObject::tr("File"), 0.2}, {QObject::tr("Unit"), 0.13}, {QObject::tr("Started (UTC)"), 0.15},
                      {QObject::tr("How far it got"), 0.52}},
                     incomplete);
}

void drawSummaryPage(ReportCanvas &canvas, const std::vector<const SessionRow *> &rows, const BatchStatistics &stats,
                     const ComparisonOptions &options, const ReportOptions &reportOptions)
{
    canvas.title(QObject::tr("Review of %n session(s)", "", static_cast<int>(rows.size())),
                 QObject::tr("Produced %1 by %2").arg(reportOptions.generatedUtc, reportOptions.producedBy));
    canvas.heading(QObject::tr("Summary"));
    const QString basis = stats.atReferenceTemperature
                              ? QObject::tr("at %1 °C").arg(options.figures.referenceTemperatureC)
                              : QObject::tr("as measured (a session has no winding temperature)");
    canvas.keyValues({{QObject::tr("Sessions"), QString::number(stats.sessions)},
                      {QObject::tr("Designs"), QString::number(stats.designs.size())},
                      {QObject::tr("Unreadable"), QString::number(stats.unreadable)},
                      {QObject::tr("Safety stops"), QObject::tr("in %n session(s)", "", static_cast<int>(stats.safetyStopped))},
                      {QObject::tr("Incomplete (no verdict)"), QString::number(stats.incomplete)},
                      {QObject::tr("R compared"), basis},
                      {QObject::tr("Verdicts"), qs(verdictCountsText(stats))},
                      {QObject::tr("Reviewer's decisions"), QObject::tr("accepted %1, rejected %2, retest %3, unreviewed %4, "
                                                                        "changed after sign-off %5")
                                                                .arg(stats.accepted).arg(stats.rejected).arg(stats.retest)
                                                                .arg(stats.notReviewed).arg(stats.changedAfterSignOff)}});
    if (stats.designs.size() > 1)
        canvas.paragraph(QObject::tr("Statistics, far-from-batch marks and control limits are taken within each design, "
                                     "never across designs."));
    drawStopsAndIncomplete(canvas, rows);
    for (const DesignStatistics &design : stats.designs)
        drawDesign(canvas, design, rows, stats, options);
    QStringList unreadable;
    for (const SessionRow *row : rows)
        if (!row->opened)
            unreadable << QObject::tr("%1: cannot be opened: %2").arg(fileName(*row), qs(row->problem));
    if (!unreadable.isEmpty()) {
        canvas.heading(QObject::tr("Not compared"));
        canvas.paragraph(unreadable.join(QLatin1Char('\n')));
    }
    canvas.paragraph(QObject::tr("U: expanded uncertainties at 95 % coverage with the k of each result's own budget, k = U/u: "
                                 "t95(ν_eff) (GUM G.4) unless a rectangular meter limit dominates. Each session's full "
                                 "report follows, with its budget."),
                     8.0, false, true);
}

// Lays the whole document out; returns the number of pages, 0 if painting failed.
int render(QPdfWriter &writer, const std::vector<const SessionRow *> &rows, const std::vector<SessionSummary> &summaries,
           const ComparisonOptions &options, const ReportOptions &reportOptions, int totalPages)
{
    setUpReportPdf(writer, reportOptions);
    writer.setTitle(QObject::tr("Review of %n load-test session(s)", "", static_cast<int>(rows.size())));
    QPainter painter;
    if (!painter.begin(&writer))
        return 0;
    painter.setRenderHint(QPainter::Antialiasing);
    ReportCanvas canvas(writer, painter, QObject::tr("Review · %1").arg(reportOptions.producedBy), totalPages);
    const BatchStatistics stats = summarizeBatch(rows);
    drawSummaryPage(canvas, rows, stats, options, reportOptions);
    for (const SessionSummary &summary : summaries) {
        canvas.newPage();
        drawSessionReport(canvas, summary, reportOptions);
    }
    canvas.finish();
    const int pages = canvas.pageNumber();
    return painter.end() ? pages : 0;
}

} // namespace

QString writeReviewPdf(const std::vector<const SessionRow *> &rows, const ComparisonOptions &options,
                       const QString &pdfPath, const ReportOptions &reportOptions)
{
    ReviewOptions review;
    review.method = options.method;
    // What the reviewer left open comes from each session's analysis-settings record.
    if (options.ruleChosen)
        review.rule = options.figures.rule;
    if (options.limitChosen)
        review.regulationLimit = options.figures.regulationLimit;
    review.referenceTemperatureC = options.figures.referenceTemperatureC;
    std::vector<SessionSummary> summaries;
    for (const SessionRow *row : rows) {
        if (!row->opened)
            continue;
        auto summary = loadSessionSummary(row->path, review);
        if (summary.ok())
            summaries.push_back(std::move(summary.value));
    }
    return writePdfFile(pdfPath, [&](QPdfWriter &writer, int totalPages) {
        return render(writer, rows, summaries, options, reportOptions, totalPages);
    });
}

} // namespace sagline
