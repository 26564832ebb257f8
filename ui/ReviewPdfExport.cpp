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

void drawSummaryPage(ReportCanvas &canvas, const std::vector<const SessionRow *> &rows, const BatchStatistics &stats,
                     const ComparisonOptions &options, const ReportOptions &reportOptions)
{
    canvas.title(QObject::tr("Review of %n session(s)", "", static_cast<int>(rows.size())),
                 QObject::tr("Produced %1 by %2").arg(reportOptions.generatedUtc, reportOptions.producedBy));
    canvas.heading(QObject::tr("Batch statistics"));
    const QString basis = stats.atReferenceTemperature
                              ? QObject::tr("at %1 °C").arg(options.figures.referenceTemperatureC)
                              : QObject::tr("as measured (a session has no winding temperature)");
    auto ohm = [](const std::optional<double> &v) { return v ? qs(formatQuantity(*v, "Ω")) : QStringLiteral("—"); };
    canvas.keyValues({{QObject::tr("Sessions"), QString::number(stats.sessions)},
                      {QObject::tr("Unreadable"), QString::number(stats.unreadable)},
                      {QObject::tr("R compared"), basis},
                      {QObject::tr("Units in R statistics"), QString::number(stats.resistanceCount)},
                      {QObject::tr("Mean R"), ohm(stats.meanOhm)},
                      {QObject::tr("Standard deviation of R"), ohm(stats.sdOhm)},
                      {QObject::tr("Median R"), ohm(stats.medianOhm)},
                      {QObject::tr("MAD of R"), ohm(stats.madOhm)},
                      {QObject::tr("Verdicts"), qs(verdictCountsText(stats))},
                      {QObject::tr("Review"), QObject::tr("accepted %1, rejected %2, retest %3, not reviewed %4, "
                                                          "changed after sign-off %5")
                                                  .arg(stats.accepted).arg(stats.rejected).arg(stats.retest).arg(stats.notReviewed)
                                                  .arg(stats.changedAfterSignOff)}});
    canvas.paragraph(QObject::tr("Far from the batch: %1.").arg(qs(stats.ruleNote)));
    canvas.heading(QObject::tr("Sessions"));
    QList<QStringList> table;
    for (std::size_t i = 0; i < rows.size(); ++i) {
        const SessionRow &row = *rows[i];
        if (!row.opened) {
            table.append({QFileInfo(qs(row.path)).fileName(), QObject::tr("cannot be opened: %1").arg(qs(row.problem)), "", "", "", "", ""});
            continue;
        }
        const SessionFigures &f = row.figures;
        const bool far = std::find(stats.farFromBatch.begin(), stats.farFromBatch.end(), i) != stats.farFromBatch.end();
        table.append({qs(row.unitSerial), qs(row.createdUtc.substr(0, 10)), withU(f.ok, f.resistanceOhm, f.resistanceUOhm, f.resistanceK, "Ω"),
                      withU(f.resistanceRefOhm.has_value(), f.resistanceRefOhm.value_or(0.0), f.resistanceRefUOhm,
                            f.resistanceRefK, "Ω"),
                      withU(f.regulationPercent.has_value(), f.regulationPercent.value_or(0.0), f.regulationUPercent,
                            f.regulationK, "%"),
                      qs(f.verdictText())
                          + (far ? (stats.screeningOnly ? QObject::tr(" · far from batch (screening only)")
                                                        : QObject::tr(" · far from batch"))
                                 : QString()),
                      qs(row.reviewState())});
    }
    canvas.table({{QObject::tr("Unit"), 0.15}, {QObject::tr("Date (UTC)"), 0.12},
                  {QObject::tr("R ± U"), 0.16, Qt::AlignRight},
                  {QObject::tr("R at %1 °C ± U").arg(options.figures.referenceTemperatureC), 0.16, Qt::AlignRight},
                  {QObject::tr("Regulation ± U"), 0.15, Qt::AlignRight}, {QObject::tr("Verdict"), 0.14},
                  {QObject::tr("Review"), 0.12}},
                 table);
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
