#include "ReportWriter.h"

#include "OutputFile.h"
#include "ReportCanvas.h"
#include "ReportSections.h"
#include "ReportText.h"
#include "SessionSummary.h"

#include <QFileInfo>
#include <QPainter>
#include <QPdfWriter>

namespace sagline {

namespace {

// Lays the whole report out on `writer`; returns the number of pages, 0 if painting failed.
int render(QPdfWriter &writer, const SessionSummary &summary, const ReportOptions &options, int totalPages)
{
    setUpReportPdf(writer, options);
    writer.setTitle(QStringLiteral("Load test report, unit %1").arg(QString::fromStdString(summary.info.unitSerial)));
    QPainter painter;
    if (!painter.begin(&writer))
        return 0;
    painter.setRenderHint(QPainter::Antialiasing);
    const QString footer = QStringLiteral("Unit %1 · %2 · %3")
                               .arg(QString::fromStdString(summary.info.unitSerial),
                                    reporttext::breakable(QFileInfo(QString::fromStdString(summary.path)).fileName()),
                                    options.producedBy);
    ReportCanvas canvas(writer, painter, footer, totalPages);
    drawSessionReport(canvas, summary, options);
    canvas.finish();
    const int pages = canvas.pageNumber();
    return painter.end() ? pages : 0;
}

} // namespace

QString writeSessionReport(const SessionSummary &summary, const QString &pdfPath, const ReportOptions &options)
{
    if (options.pageSize != QPageSize::A4 && options.pageSize != QPageSize::Letter)
        return QStringLiteral("page size: A4 or Letter");
    return writePdfFile(pdfPath, [&](QPdfWriter &writer, int totalPages) { return render(writer, summary, options, totalPages); });
}

} // namespace sagline
